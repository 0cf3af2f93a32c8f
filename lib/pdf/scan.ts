import "server-only";
import { constants as zlibConstants, inflateSync } from "node:zlib";

// Byte-level checks made before pdfjs sees the file. Offsets and lengths are in bytes.

/** Readers accept the header anywhere in the first 1024 bytes (PDF Reference 1.7, implementation note 13, from memory). */
export const HEADER_WINDOW = 1024;
/** ...and `%%EOF` anywhere in the last 1024 bytes (same reference, implementation note 18, from memory). */
export const EOF_WINDOW = 1024;
/** Browsers sniff at most this many leading bytes (WHATWG MIME Sniffing, "resource header", 1445 bytes, from memory). */
export const SNIFF_WINDOW = 1445;

const HEADER = [0x25, 0x50, 0x44, 0x46, 0x2d]; // "%PDF-"

function asBuffer(bytes: Uint8Array): Buffer {
  return Buffer.isBuffer(bytes) ? bytes : Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
}

/** Offset of `%PDF-` within the header window, or null: a renamed PNG, HTML or Word file has none. */
export function findPdfHeader(bytes: Uint8Array): number | null {
  const limit = Math.min(bytes.length - HEADER.length, HEADER_WINDOW - 1);
  outer: for (let i = 0; i <= limit; i++) {
    for (let k = 0; k < HEADER.length; k++) {
      if (bytes[i + k] !== HEADER[k]) continue outer;
    }
    return i;
  }
  return null;
}

/**
 * The tail a reader starts from: `startxref <offset> %%EOF` with `%%EOF` in the last 1024 bytes and
 * the offset inside the file. A download or copy cut short loses exactly this.
 * Returns the byte offset just past the last `%%EOF`, or null.
 */
export function findEofTail(bytes: Uint8Array): number | null {
  // startxref, a 10-digit offset and whitespace fit in well under 64 bytes before %%EOF.
  const from = Math.max(0, bytes.length - EOF_WINDOW - 64);
  const tail = asBuffer(bytes).subarray(from).toString("latin1");
  const re = /startxref\s+(\d{1,15})\s+%%EOF/g;
  let last: RegExpExecArray | null = null;
  for (let m = re.exec(tail); m; m = re.exec(tail)) last = m;
  if (!last || last[1] === undefined) return null;
  const end = from + last.index + last[0].length;
  if (bytes.length - (end - 5) > EOF_WINDOW) return null;
  if (Number(last[1]) >= bytes.length) return null;
  return end;
}

// Tags that make a browser render the bytes as a page. Whole words only, so XMP packets
// (`<x:xmpmeta>`, `<rdf:RDF>`) and binary noise do not match.
const HTML_MARKUP =
  /<(?:(?:!doctype\s+html|html|head|body|script|iframe|frameset|svg|object|embed|img|meta|style|link|form|title|div)[\s>/]|a\s+href\s*=)/i;

export function containsHtmlMarkup(bytes: Uint8Array): boolean {
  return HTML_MARKUP.test(asBuffer(bytes).toString("latin1"));
}

export interface ObjectNameScan {
  /** `/Encrypt` in a trailer or cross-reference stream dictionary. */
  encrypt: boolean;
  /** `/JS` or `/JavaScript` as a name (after `#xx` decoding) in any dictionary outside stream bodies. */
  javascript: boolean;
  /** HTML tags inside `%` comments, where polyglots hide their markup. */
  htmlInComments: boolean;
}

const Ch = {
  Nul: 0x00,
  Tab: 0x09,
  Lf: 0x0a,
  Ff: 0x0c,
  Cr: 0x0d,
  Space: 0x20,
  Hash: 0x23,
  Percent: 0x25,
  LParen: 0x28,
  RParen: 0x29,
  Slash: 0x2f,
  Lt: 0x3c,
  Gt: 0x3e,
  LBracket: 0x5b,
  RBracket: 0x5d,
  LBrace: 0x7b,
  RBrace: 0x7d,
  Backslash: 0x5c,
} as const;

function isWhite(c: number): boolean {
  return c === Ch.Space || c === Ch.Lf || c === Ch.Cr || c === Ch.Tab || c === Ch.Ff || c === Ch.Nul;
}

function isDelimiter(c: number): boolean {
  return (
    c === Ch.LParen ||
    c === Ch.RParen ||
    c === Ch.Lt ||
    c === Ch.Gt ||
    c === Ch.LBracket ||
    c === Ch.RBracket ||
    c === Ch.LBrace ||
    c === Ch.RBrace ||
    c === Ch.Slash ||
    c === Ch.Percent
  );
}

function hexValue(c: number): number {
  if (c >= 0x30 && c <= 0x39) return c - 0x30;
  if (c >= 0x41 && c <= 0x46) return c - 0x37;
  if (c >= 0x61 && c <= 0x66) return c - 0x57;
  return -1;
}

/** Name bytes after the slash, with `#xx` escapes decoded (`/J#61vaScript` is `/JavaScript`). */
function decodeName(bytes: Uint8Array, start: number, end: number): string {
  let out = "";
  for (let i = start; i < end; i++) {
    const c = bytes[i] ?? 0;
    if (c === Ch.Hash && i + 2 < end) {
      const hi = hexValue(bytes[i + 1] ?? 0);
      const lo = hexValue(bytes[i + 2] ?? 0);
      if (hi >= 0 && lo >= 0) {
        out += String.fromCharCode(hi * 16 + lo);
        i += 2;
        continue;
      }
    }
    out += String.fromCharCode(c);
  }
  return out;
}

/**
 * Walks the file's object syntax outside stream bodies (ISO 32000-1 §7.2–7.3 lexical rules:
 * comments, literal and hex strings, names) looking for the names that mean encryption or
 * JavaScript. Stream bodies are skipped to `endstream` unread, so compressed bytes cannot
 * produce false hits — except object streams (§7.5.7, `/Type /ObjStm`, Flate only), which
 * hold ordinary objects and are inflated and walked too, up to `maxInflatedBytes` in all.
 * pdfjs is asked as well, for what this misses.
 */
const OTHER_FILTERS = new Set(["ASCIIHexDecode", "ASCII85Decode", "LZWDecode", "RunLengthDecode", "AHx", "A85", "LZW", "RL"]);

export interface ScanOptions {
  /** Offset to start at (the header), bytes. */
  start?: number;
  /** Budget for inflating object streams, bytes in total. */
  maxInflatedBytes?: number;
}

export function scanObjectNames(bytes: Uint8Array, options: ScanOptions = {}): ObjectNameScan {
  const found: ObjectNameScan = { encrypt: false, javascript: false, htmlInComments: false };
  let budget = options.maxInflatedBytes ?? 64_000_000;
  const inflateObjectStream = (data: Uint8Array): void => {
    if (budget <= 0) return;
    try {
      const inner = inflateSync(data, { finishFlush: zlibConstants.Z_SYNC_FLUSH, maxOutputLength: budget });
      budget -= inner.length;
      const sub = walk(inner, 0, found, null);
      found.encrypt ||= sub.encrypt;
      found.javascript ||= sub.javascript;
      found.htmlInComments ||= sub.htmlInComments;
    } catch {
      // Unreadable or over budget: pdfjs judges the file.
    }
  };
  return walk(bytes, options.start ?? 0, found, inflateObjectStream);
}

function walk(
  bytes: Uint8Array,
  start: number,
  found: ObjectNameScan,
  onObjectStream: ((data: Uint8Array) => void) | null,
): ObjectNameScan {
  const buf = asBuffer(bytes);
  const n = bytes.length;
  // Names seen since the last `obj` keyword: the dictionary a following `stream` belongs to.
  let objectNames: string[] = [];
  let i = start;
  while (i < n) {
    const c = bytes[i] ?? 0;
    if (isWhite(c)) {
      i++;
    } else if (c === Ch.Percent) {
      let j = i + 1;
      while (j < n && bytes[j] !== Ch.Lf && bytes[j] !== Ch.Cr) j++;
      if (!found.htmlInComments && j - i > 5 && containsHtmlMarkup(bytes.subarray(i, j))) found.htmlInComments = true;
      i = j;
    } else if (c === Ch.LParen) {
      let depth = 1;
      let j = i + 1;
      while (j < n && depth > 0) {
        const d = bytes[j];
        if (d === Ch.Backslash) j++;
        else if (d === Ch.LParen) depth++;
        else if (d === Ch.RParen) depth--;
        j++;
      }
      i = j;
    } else if (c === Ch.Lt) {
      if (bytes[i + 1] === Ch.Lt) {
        i += 2;
      } else {
        const close = buf.indexOf(Ch.Gt, i + 1);
        i = close < 0 ? n : close + 1;
      }
    } else if (c === Ch.Slash) {
      let j = i + 1;
      while (j < n && !isWhite(bytes[j] ?? 0) && !isDelimiter(bytes[j] ?? 0)) j++;
      const name = decodeName(bytes, i + 1, j);
      if (objectNames.length < 64) objectNames.push(name);
      if (name === "Encrypt") found.encrypt = true;
      else if (name === "JS" || name === "JavaScript") found.javascript = true;
      i = j;
    } else if (isDelimiter(c)) {
      i++;
    } else {
      let j = i + 1;
      while (j < n && !isWhite(bytes[j] ?? 0) && !isDelimiter(bytes[j] ?? 0)) j++;
      const word = j - i <= 6 ? buf.toString("latin1", i, j) : "";
      // "stream" as a whole keyword (not the tail of "endstream") opens raw bytes.
      if (word === "stream") {
        const end = buf.indexOf("endstream", j, "latin1");
        if (
          onObjectStream &&
          end > 0 &&
          objectNames.includes("ObjStm") &&
          objectNames.includes("FlateDecode") &&
          !objectNames.some((nm) => OTHER_FILTERS.has(nm))
        ) {
          let dataStart = j;
          if (bytes[dataStart] === Ch.Cr) dataStart++;
          if (bytes[dataStart] === Ch.Lf) dataStart++;
          onObjectStream(bytes.subarray(dataStart, end));
        }
        i = end < 0 ? n : end + 9;
      } else {
        if (word === "obj" || word === "endobj") objectNames = [];
        i = j;
      }
    }
  }
  return found;
}
