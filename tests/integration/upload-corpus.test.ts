// Upload attack corpus: every hostile or broken file the intake must refuse, next to the good
// files it must keep, run through the real service, database and disk storage in one pass.
import { createHash } from "node:crypto";
import { readdir, readFile } from "node:fs/promises";
import path from "node:path";
import { deflateSync } from "node:zlib";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { documents, sheets } from "@/db/schema";
import { UPLOAD_LIMITS, uploadDocument, type DocumentKind } from "@/lib/applications/documents";
import { createApplication } from "@/lib/applications/service";
import { AppError } from "@/lib/errors";
import type { StorageBody } from "@/lib/storage/storage";
import {
  makeBrokenPageTreePdf,
  makeCalcPackage,
  makeCorruptPdf,
  makeDrawingSet,
  makeEmptyFile,
  makeEncryptedPdf,
  makeEscapedJavaScriptPdf,
  makeJavaScriptPdf,
  makeManyPages,
  makeMentionsOnlyPdf,
  makeOpenAtFirstSheetPdf,
  makePolyglot,
  makeRenamedHtml,
  makeRenamedPng,
  makeTruncatedPdf,
} from "../fixtures/pdf/make";
import { makeUser, resetDb } from "./db-helpers";

const input = {
  workDescription: "Tenant improvement with a new steel moment frame at the storefront",
  siteAddress: "88 Millrace Road, Larkspur Falls",
  parcelNumber: "114-305-12",
  occupancyGroup: "B" as const,
  constructionType: "IIB" as const,
  valuation: 31_500_000,
  dporName: "Mara Finch, SE",
  dporLicence: "SE-20877",
};

const latin1 = (s: string): Uint8Array => Uint8Array.from(s, (c) => c.charCodeAt(0) & 0xff);

function concat(...parts: Uint8Array[]): Uint8Array {
  const out = new Uint8Array(parts.reduce((n, p) => n + p.length, 0));
  let at = 0;
  for (const p of parts) {
    out.set(p, at);
    at += p.length;
  }
  return out;
}

// Inflated size of the bomb's content stream, bytes; deflate packs zeros about 1000:1
// (RFC 1951 maximum ratio is 1032:1, from memory), so the file stays near 20 kB.
const BOMB_INFLATED_BYTES = 20 * 1024 * 1024;

/**
 * A one-page PDF whose page content is a FlateDecode stream of 20 MiB of zeros (NUL is white
 * space in a content stream, PDF 32000-1 §7.2.2 Table 1, from memory): valid, tiny on disk,
 * large once inflated. Classic cross-reference table, PDF 32000-1 §7.5.4.
 */
function makeDeflateBombPdf(): Uint8Array {
  const packed = deflateSync(Buffer.alloc(BOMB_INFLATED_BYTES), { level: 9 });
  const objects: Uint8Array[] = [
    latin1("<< /Type /Catalog /Pages 2 0 R >>"),
    latin1("<< /Type /Pages /Kids [3 0 R] /Count 1 >>"),
    latin1("<< /Type /Page /Parent 2 0 R /MediaBox [0 0 612 792] /Contents 4 0 R >>"),
    concat(latin1(`<< /Filter /FlateDecode /Length ${packed.length} >>\nstream\n`), packed, latin1("\nendstream")),
  ];
  const parts: Uint8Array[] = [latin1("%PDF-1.4\n%\xe2\xe3\xcf\xd3\n")];
  let offset = parts[0]!.length;
  const offsets: number[] = [];
  objects.forEach((body, k) => {
    offsets.push(offset);
    const bytes = concat(latin1(`${k + 1} 0 obj\n`), body, latin1("\nendobj\n"));
    parts.push(bytes);
    offset += bytes.length;
  });
  parts.push(
    latin1(
      `xref\n0 ${objects.length + 1}\n0000000000 65535 f \n` +
        offsets.map((o) => `${String(o).padStart(10, "0")} 00000 n \n`).join("") +
        `trailer\n<< /Size ${objects.length + 1} /Root 1 0 R >>\nstartxref\n${offset}\n%%EOF\n`,
    ),
  );
  return concat(...parts);
}

// One byte past the limit in whole MiB chunks: 61 × 1 MiB > 60 MiB.
const OVERSIZE_CHUNKS = UPLOAD_LIMITS.maxBytes / (1024 * 1024) + 1;
async function* overSizeStream(): AsyncIterable<Uint8Array> {
  const chunk = new Uint8Array(1024 * 1024);
  for (let i = 0; i < OVERSIZE_CHUNKS; i++) yield chunk;
}

/** A valid one-page drawing set, distinct per call so the duplicate check never fires. */
const oneSheet = (number: string, title: string) => makeDrawingSet({ sheets: [{ number, title }] });

type Outcome =
  | { refused: RegExp }
  | {
      accepted: true;
      /** Pages in the file as built, i.e. sheet rows expected. */
      pages: number;
      /** Name the document row must keep. */
      displayName: string;
    };

interface Row {
  label: string;
  kind?: DocumentKind;
  fileName: string;
  body: () => Promise<StorageBody> | StorageBody;
  expect: Outcome;
}

const NOT_PDF = /is not a PDF/;
const ENCRYPTED = /password-protected or encrypted/;
const SCRIPT = /contains JavaScript/;
const POLYGLOT = /mixes a PDF with web page code/;
const NAME_PATH = /contains a folder path/;
const NAME_CONTROL = /hidden control characters/;

const corpus: Row[] = [
  // ---- Content: wrong type ---------------------------------------------------------------
  // PNG signature 89 50 4E 47 (ISO/IEC 15948 §5.2), no %PDF- header (PDF 32000-1 §7.5.2).
  { label: "PNG renamed to .pdf", fileName: "foundation-plan.pdf", body: makeRenamedPng, expect: { refused: NOT_PDF } },
  // Plain HTML starts with "<!DOCTYPE", no %PDF- header anywhere.
  { label: "HTML page renamed to .pdf", fileName: "foundation-plan.pdf", body: makeRenamedHtml, expect: { refused: NOT_PDF } },
  // Zero bytes: nothing to inspect.
  { label: "empty file", fileName: "empty.pdf", body: makeEmptyFile, expect: { refused: /The file is empty/ } },
  // ---- Content: damaged ------------------------------------------------------------------
  // Cut at 60 %: no %%EOF marker in the tail (PDF 32000-1 §7.5.5).
  { label: "truncated at 60 %", fileName: "cut-short.pdf", body: () => makeTruncatedPdf(), expect: { refused: /PDF is incomplete/ } },
  // Header and %%EOF intact but the body is random bytes: no objects to read.
  { label: "corrupt body", fileName: "garbage.pdf", body: makeCorruptPdf, expect: { refused: /damaged and cannot be read/ } },
  // Page tree points at an object that does not exist: no page can be read.
  { label: "broken page tree", fileName: "no-pages.pdf", body: makeBrokenPageTreePdf, expect: { refused: /damaged and cannot be read/ } },
  // ---- Content: encrypted ----------------------------------------------------------------
  // Owner password only: readers open it silently (PDF 32000-1 §7.6.3.3), still refused for its /Encrypt.
  { label: "encrypted, empty user password", fileName: "secured.pdf", body: () => makeEncryptedPdf(), expect: { refused: ENCRYPTED } },
  // User password set: cannot be opened at all without it.
  { label: "encrypted, user password", fileName: "locked.pdf", body: () => makeEncryptedPdf({ userPassword: "riverbend" }), expect: { refused: ENCRYPTED } },
  // ---- Content: JavaScript (PDF 32000-1 §12.6.4.16) --------------------------------------
  // Catalog /OpenAction runs on open (§12.3.2.2 via Table 28).
  { label: "JavaScript in /OpenAction", fileName: "js-open.pdf", body: () => makeJavaScriptPdf("open-action"), expect: { refused: SCRIPT } },
  // Same, with the action dictionary as a plain object rather than inside an object stream.
  { label: "JavaScript in /OpenAction, no object streams", fileName: "js-open-plain.pdf", body: () => makeJavaScriptPdf("open-action", { objectStreams: false }), expect: { refused: SCRIPT } },
  // Document-level scripts in the /Names /JavaScript tree (§7.7.4 Table 31).
  { label: "JavaScript in the names tree", fileName: "js-names.pdf", body: () => makeJavaScriptPdf("names"), expect: { refused: SCRIPT } },
  // Page additional-actions /AA /O (§12.6.3 Table 197 in 32000-1, from memory).
  { label: "JavaScript in a page /AA", fileName: "js-page.pdf", body: () => makeJavaScriptPdf("page-action"), expect: { refused: SCRIPT } },
  // Link annotation /A action (§12.5.6.5).
  { label: "JavaScript in a link annotation", fileName: "js-link.pdf", body: () => makeJavaScriptPdf("link"), expect: { refused: SCRIPT } },
  // Link annotation, no object streams: the /JS name sits in plain bytes.
  { label: "JavaScript in a link annotation, no object streams", fileName: "js-link-plain.pdf", body: () => makeJavaScriptPdf("link", { objectStreams: false }), expect: { refused: SCRIPT } },
  // /J#61vaScript and /J#53 are /JavaScript and /JS once #xx escapes are read (§7.3.5).
  { label: "JavaScript under #xx-escaped names", fileName: "js-escaped.pdf", body: makeEscapedJavaScriptPdf, expect: { refused: SCRIPT } },
  // ---- Content: polyglots ----------------------------------------------------------------
  // Markup before the header, inside the 1024 bytes readers search for %PDF- (§7.5.2 implementation note, from memory).
  { label: "polyglot: HTML before the header", fileName: "poly-first.pdf", body: () => makePolyglot("html-first"), expect: { refused: POLYGLOT } },
  // Markup hidden in a % comment line after the header.
  { label: "polyglot: HTML in a comment", fileName: "poly-comment.pdf", body: () => makePolyglot("comment"), expect: { refused: POLYGLOT } },
  // Markup appended after %%EOF.
  { label: "polyglot: HTML after %%EOF", fileName: "poly-trailing.pdf", body: () => makePolyglot("trailing"), expect: { refused: POLYGLOT } },
  // ---- Content: resource limits ----------------------------------------------------------
  // One page over the documented per-file limit.
  {
    label: `page count ${UPLOAD_LIMITS.maxPages + 1}`,
    fileName: "too-many-pages.pdf",
    body: () => makeManyPages(UPLOAD_LIMITS.maxPages + 1),
    expect: { refused: new RegExp(`has ${UPLOAD_LIMITS.maxPages + 1} pages; the limit is ${UPLOAD_LIMITS.maxPages}`) },
  },
  // Streamed past the byte limit: refused while streaming, the temp file removed.
  { label: `streamed ${OVERSIZE_CHUNKS} MiB`, fileName: "huge.pdf", body: overSizeStream, expect: { refused: /larger than the .* limit/ } },
  // A valid page of 20 MiB of white space once inflated: a legal file, kept as its ~20 kB of bytes.
  { label: "deflate bomb (20 MiB of zeros)", fileName: "bomb.pdf", body: makeDeflateBombPdf, expect: { accepted: true, pages: 1, displayName: "bomb.pdf" } },
  // ---- Names: the bytes are a good PDF, the name is not ---------------------------------
  // Path separators would let a name climb out of a folder if it were ever used as one.
  { label: "name ../x.pdf", fileName: "../x.pdf", body: () => oneSheet("S-901", "NAME TEST A"), expect: { refused: NAME_PATH } },
  { label: "name ..\\x.pdf", fileName: "..\\x.pdf", body: () => oneSheet("S-901", "NAME TEST A"), expect: { refused: NAME_PATH } },
  // %2e%2e%2f is "../" once percent-decoded (RFC 3986 §2.1).
  { label: "name %2e%2e%2fx.pdf", fileName: "%2e%2e%2fx.pdf", body: () => oneSheet("S-901", "NAME TEST A"), expect: { refused: NAME_PATH } },
  // Double-encoded: %252e → %2e → "."; %255c → %5c → "\".
  { label: "name %252e%252e%255cx.pdf", fileName: "%252e%252e%255cx.pdf", body: () => oneSheet("S-901", "NAME TEST A"), expect: { refused: NAME_PATH } },
  // NUL ends a C string: "plan\0.exe.pdf" could be cut to "plan".
  { label: "name with NUL", fileName: "plan\u0000.pdf", body: () => oneSheet("S-901", "NAME TEST A"), expect: { refused: NAME_CONTROL } },
  // Percent-encoded NUL, decoded before the check.
  { label: "name with %00", fileName: "plan%00.pdf", body: () => oneSheet("S-901", "NAME TEST A"), expect: { refused: NAME_CONTROL } },
  // CR/LF would split a Content-Disposition header or a log line.
  { label: "name with CR/LF", fileName: "plan\r\nSet-Cookie: x.pdf", body: () => oneSheet("S-901", "NAME TEST A"), expect: { refused: NAME_CONTROL } },
  // U+202E RIGHT-TO-LEFT OVERRIDE shows "S-101\u202Efdp.exe.pdf" reversed (Unicode UAX #9, from memory).
  { label: "name with RTL override", fileName: "S-101\u202Eexe.pdf", body: () => oneSheet("S-901", "NAME TEST A"), expect: { refused: NAME_CONTROL } },
  // 500 characters against the documented 180 limit.
  { label: "500-character name", fileName: `${"S".repeat(496)}.pdf`, body: () => oneSheet("S-901", "NAME TEST A"), expect: { refused: /longer than 180 characters/ } },
  // A name not ending in .pdf.
  { label: "name ending .exe", fileName: "S-101.pdf.exe", body: () => oneSheet("S-901", "NAME TEST A"), expect: { refused: /must end in \.pdf/ } },
  // ---- Accepted --------------------------------------------------------------------------
  { label: "plain two-sheet drawing set", fileName: "riverbend-structural.pdf", body: () => makeDrawingSet({ sheets: [{ number: "S-101", title: "FOUNDATION PLAN" }, { number: "S-201", title: "SECOND FLOOR FRAMING PLAN" }] }), expect: { accepted: true, pages: 2, displayName: "riverbend-structural.pdf" } },
  { label: "calculation package", kind: "calculations", fileName: "calcs.pdf", body: () => makeCalcPackage({ pages: [["MF-1 drift check"], ["MF-1 panel zone"]] }), expect: { accepted: true, pages: 2, displayName: "calcs.pdf" } },
  // Text and strings that mention /JS, /Encrypt, /JavaScript are not names: no script, no encryption.
  { label: "mentions /JavaScript only in text", fileName: "notes-on-scripts.pdf", body: makeMentionsOnlyPdf, expect: { accepted: true, pages: 1, displayName: "notes-on-scripts.pdf" } },
  // An /OpenAction that is a destination, not a script (PDF 32000-1 §12.3.2.2, /Fit).
  { label: "harmless /OpenAction destination", fileName: "open-at-s101.pdf", body: makeOpenAtFirstSheetPdf, expect: { accepted: true, pages: 1, displayName: "open-at-s101.pdf" } },
  // Decomposed "c + U+0327, a + U+0303" (NFD, as macOS file names come) stored precomposed
  // U+00E7, U+00E3 (Unicode UAX #15 canonical composition).
  { label: "NFD name stored as NFC", fileName: "Fundac\u0327a\u0303o S-102.pdf", body: () => oneSheet("S-102", "FOUNDATION DETAILS"), expect: { accepted: true, pages: 1, displayName: "Funda\u00e7\u00e3o S-102.pdf" } },
  // Hangul jamo ᄀ + ᅡ (U+1100 U+1161) compose to 가 U+AC00 (UAX #15).
  { label: "Hangul jamo name stored composed", fileName: "\u1100\u1161 S-103.pdf", body: () => oneSheet("S-103", "PILE SCHEDULE"), expect: { accepted: true, pages: 1, displayName: "\uac00 S-103.pdf" } },
  // CJK is already NFC: kept as sent.
  { label: "Japanese name", fileName: "構造図 S-202.pdf", body: () => oneSheet("S-202", "ROOF FRAMING"), expect: { accepted: true, pages: 1, displayName: "構造図 S-202.pdf" } },
  // Percent-encoded spaces are decoded; runs of white space collapse, ends trimmed.
  { label: "percent-encoded and spaced name", fileName: "  Riverbend%20Commons   S-301.pdf ", body: () => oneSheet("S-301", "SHEAR WALL ELEVATIONS"), expect: { accepted: true, pages: 1, displayName: "Riverbend Commons S-301.pdf" } },
];

const storageDir = () => path.resolve(process.env.STORAGE_DIR!);

async function walk(dir: string): Promise<string[]> {
  const out: string[] = [];
  for (const e of await readdir(dir, { withFileTypes: true }).catch(() => [])) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) out.push(...(await walk(p)));
    else out.push(p);
  }
  return out;
}

/** Stored objects by storage key, and whatever sits in the temp folder. */
async function storageContents(): Promise<{ objects: string[]; temp: string[] }> {
  const root = storageDir();
  const tempDir = path.join(root, ".tmp");
  const all = (await walk(root)).map((p) => path.relative(root, p).split(path.sep).join("/"));
  return {
    objects: all.filter((k) => !k.startsWith(".tmp/")).sort(),
    temp: (await walk(tempDir)).map((p) => path.relative(root, p)).sort(),
  };
}

const sha256 = (bytes: Uint8Array) => createHash("sha256").update(bytes).digest("hex");

describe("upload attack corpus", () => {
  beforeAll(resetDb);

  it("refuses every hostile file with its own message, keeps the good ones and nothing else", { timeout: 60_000 }, async () => {
    expect(corpus.length).toBeGreaterThanOrEqual(20);
    const applicant = { ...(await makeUser("applicant")), firmId: null };
    const app = await createApplication(db(), applicant, input);
    const before = await storageContents();

    const accepted: { row: Row; id: number; size: number | null }[] = [];
    const mismatches: string[] = [];
    for (const row of corpus) {
      const body = await row.body();
      const size = body instanceof Uint8Array ? body.length : null;
      const result = await uploadDocument(db(), applicant, app.id, row.kind ?? "drawings", row.fileName, body).then(
        (r) => ({ ok: true as const, r }),
        (e: unknown) => ({ ok: false as const, e }),
      );
      if ("refused" in row.expect) {
        if (result.ok) mismatches.push(`${row.label}: accepted, expected refused ${row.expect.refused}`);
        else if (!(result.e instanceof AppError)) mismatches.push(`${row.label}: threw ${String(result.e)}`);
        else if (!row.expect.refused.test(result.e.message)) mismatches.push(`${row.label}: refused with “${result.e.message}”, expected ${row.expect.refused}`);
      } else if (!result.ok) {
        mismatches.push(`${row.label}: refused with “${result.e instanceof Error ? result.e.message : String(result.e)}”, expected accepted`);
      } else {
        if (result.r.pageCount !== row.expect.pages) mismatches.push(`${row.label}: ${result.r.pageCount} pages, expected ${row.expect.pages}`);
        accepted.push({ row, id: result.r.id, size });
      }
    }
    expect(mismatches).toEqual([]);

    const expectedAccepted = corpus.filter((r) => "accepted" in r.expect);
    const expectedSheets = expectedAccepted.reduce((n, r) => n + ("accepted" in r.expect ? r.expect.pages : 0), 0);
    const docRows = await db().select().from(documents);
    expect(docRows).toHaveLength(expectedAccepted.length);
    expect(await db().select().from(sheets)).toHaveLength(expectedSheets);

    for (const a of accepted) {
      const doc = docRows.find((d) => d.id === a.id);
      expect(doc, a.row.label).toBeDefined();
      if (!doc || !("accepted" in a.row.expect)) continue;
      expect(doc.originalName, a.row.label).toBe(a.row.expect.displayName);
      // The file is kept as sent: never the inflated form, never more than was uploaded.
      if (a.size !== null) expect(doc.byteSize, a.row.label).toBe(a.size);
    }

    const after = await storageContents();
    // Exactly one new object per accepted document; nothing that was there went away.
    const added = after.objects.filter((k) => !before.objects.includes(k));
    expect(added.sort()).toEqual(docRows.map((d) => d.storageKey).sort());
    expect(after.objects.filter((k) => before.objects.includes(k))).toEqual(before.objects);
    // Temp folder empty (or absent): no .part file from a refused or oversize upload.
    expect(after.temp.filter((p) => p.endsWith(".part"))).toEqual([]);
    expect(after.temp).toEqual([]);
    for (const d of docRows) {
      const bytes = await readFile(path.join(storageDir(), ...d.storageKey.split("/")));
      expect(sha256(bytes), d.originalName).toBe(d.sha256);
      expect(bytes.length, d.originalName).toBe(d.byteSize);
    }

    console.info(`[upload-corpus] ${corpus.length} files tried, ${corpus.length - accepted.length} refused, ${accepted.length} accepted`);
  });
});
