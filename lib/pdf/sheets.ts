// Sheet number and title from a page's text layer. Pure: no pdfjs, no Node, usable in the browser.
// Coordinates are PDF points (1/72 in) in the displayed page (rotation applied), origin top-left,
// y growing downward; `y` is the text baseline.

export interface PositionedText {
  str: string;
  x: number;
  y: number;
  /** Advance width of the string, points. */
  width: number;
  /** Glyph height, points. */
  fontSize: number;
}

export interface PageText {
  /** 1-based page number. */
  page: number;
  width: number;
  height: number;
  items: PositionedText[];
}

export interface SheetIdentity {
  page: number;
  sheetNumber: string | null;
  title: string;
}

// US National CAD Standard sheet identifiers: a discipline designator (one letter, optionally a
// second modifier letter), an optional separator, then sheet type and sequence digits, maybe a
// decimal part and a suffix letter: S-201, A1.01, S2.1, G-001, FP-101, A-101A
// (common practice, no source). The first letter is limited to the NCS discipline letters.
const SHEET_NUMBER = /^([ABCDEFGHILMOPQRSTVWXZ][A-Z]?)([-.\u2010\u2011\u2013 ]?)(\d{1,3}(?:\.\d{1,3})?)([A-Z])?$/;
const SHEET_LABEL = /^(?:SHEET|SHT\.?|DRAWING|DWG\.?)\s*(?:NO\.?|NUMBER|NUM\.?|#)?\s*[:.#]?$/i;
const SHEET_LABEL_PREFIX = /^(?:SHEET|SHT\.?|DRAWING|DWG\.?)\s*(?:NO\.?|NUMBER|NUM\.?|#)?\s*[:.#]?\s+(\S.*)$/i;
const TITLE_LABEL = /^(?:SHEET\s+TITLE|DRAWING\s+TITLE|DWG\.?\s+TITLE|TITLE)\s*:?$/i;
const TITLE_LABEL_PREFIX = /^(?:SHEET\s+TITLE|DRAWING\s+TITLE|DWG\.?\s+TITLE)\s*:?\s+(\S.*)$/i;
// Field captions of a title block; their values are not sheet titles.
const FIELD_CAPTION =
  /^(?:PROJECT|PROJECT\s+NO\.?|JOB|JOB\s+NO\.?|DATE|SCALE|DRAWN(?:\s+BY)?|CHECKED(?:\s+BY)?|DESIGNED(?:\s+BY)?|APPROVED(?:\s+BY)?|REV(?:ISION)?S?|ISSUE[DS]?|SEAL|CLIENT|OWNER|ARCHITECT|ENGINEER|CONSULTANT|PERMIT|ADDRESS|NORTH|KEY\s+PLAN|NOT\s+FOR\s+CONSTRUCTION)\b/i;
const DATE_LIKE = /\b\d{1,4}[/.-]\d{1,2}[/.-]\d{1,4}\b/;
// Words that sheet titles are made of (common practice, no source).
const TITLE_WORDS =
  /\b(?:PLANS?|DETAILS?|SECTIONS?|ELEVATIONS?|NOTES|SCHEDULES?|FRAMING|FOUNDATION|ROOF|FLOOR|LEVEL|GENERAL|COVER|SITE|DIAGRAMS?|LEGENDS?|SPECIFICATIONS|INDEX|CALCULATIONS|LAYOUT|REFLECTED|ENLARGED|TYPICAL|SHEAR\s*WALL|HOLDOWN)\b/i;

export const MAX_TITLE_LENGTH = 200;

function normalize(s: string): string {
  return s.replace(/\s+/g, " ").trim();
}

/** The sheet identifier if the whole string is one (after trimming), else null. */
export function parseSheetNumber(s: string): string | null {
  const t = normalize(s);
  const m = SHEET_NUMBER.exec(t);
  if (!m) return null;
  // Keep the printed form; only the typographic dashes become "-" so S‑201 and S-201 compare equal.
  const sep = m[2] === "" || m[2] === "." || m[2] === " " ? (m[2] ?? "") : "-";
  return `${m[1]}${sep}${m[3]}${m[4] ?? ""}`;
}

function median(values: number[]): number {
  if (values.length === 0) return 0;
  const sorted = [...values].sort((a, b) => a - b);
  const mid = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? (sorted[mid] ?? 0) : ((sorted[mid - 1] ?? 0) + (sorted[mid] ?? 0)) / 2;
}

/** Median glyph height weighted by character count, so body text, not headings, sets the scale. */
function bodyFontSize(items: PositionedText[]): number {
  const sizes: number[] = [];
  for (const it of items) {
    const n = Math.min(normalize(it.str).length, 200);
    for (let k = 0; k < n; k++) sizes.push(it.fontSize);
  }
  return median(sizes) || 1;
}

function centre(it: PositionedText): { cx: number; cy: number } {
  return { cx: it.x + it.width / 2, cy: it.y - it.fontSize / 2 };
}

function distance(a: PositionedText, b: PositionedText): number {
  const p = centre(a);
  const q = centre(b);
  return Math.hypot(p.cx - q.cx, p.cy - q.cy);
}

// Title blocks sit along the bottom-right corner or as a strip down the right edge (common practice, no source).
function inTitleBlock(it: PositionedText, page: PageText): boolean {
  const { cx, cy } = centre(it);
  const rx = cx / page.width;
  const ry = cy / page.height;
  return (rx >= 0.6 && ry >= 0.65) || rx >= 0.82;
}

interface Candidate {
  item: PositionedText;
  number: string;
  score: number;
}

function findNumber(page: PageText, body: number): Candidate | null {
  const labels = page.items.filter((it) => SHEET_LABEL.test(normalize(it.str)));
  let best: Candidate | null = null;
  for (const item of page.items) {
    const text = normalize(item.str);
    let number = parseSheetNumber(text);
    let labelled = false;
    if (!number) {
      const m = SHEET_LABEL_PREFIX.exec(text);
      number = m?.[1] ? parseSheetNumber(m[1]) : null;
      labelled = number !== null;
    }
    if (!number) continue;
    // A caption such as "SHEET" or "SHEET NO." close above or to the left of the number.
    labelled ||= labels.some((l) => distance(l, item) <= Math.max(72, 6 * item.fontSize) && l.y <= item.y + item.fontSize);
    const inBlock = inTitleBlock(item, page);
    const relSize = item.fontSize / body;
    const eligible = labelled || (inBlock && relSize >= 1.2) || relSize >= 2;
    if (!eligible) continue;
    const { cx, cy } = centre(item);
    const score = (labelled ? 4 : 0) + (inBlock ? 2 : 0) + Math.min(relSize, 4) + cx / page.width + cy / page.height;
    if (!best || score > best.score) best = { item, number, score };
  }
  return best;
}

function isTitleLike(text: string): boolean {
  const letters = text.replace(/[^A-Za-z]/g, "");
  if (letters.length < 4) return false;
  const upper = letters.replace(/[^A-Z]/g, "").length;
  if (upper / letters.length < 0.6) return false;
  if (parseSheetNumber(text)) return false;
  if (SHEET_LABEL.test(text) || TITLE_LABEL.test(text) || FIELD_CAPTION.test(text)) return false;
  if (DATE_LIKE.test(text) || text.includes(":")) return false;
  return true;
}

/** A later line of a wrapped title may be short ("2", "& DETAILS") but is still no field or number. */
function isTitleContinuation(text: string): boolean {
  if (text === "" || parseSheetNumber(text)) return false;
  if (SHEET_LABEL.test(text) || TITLE_LABEL.test(text) || FIELD_CAPTION.test(text)) return false;
  if (DATE_LIKE.test(text) || text.includes(":")) return false;
  const letters = text.replace(/[^A-Za-z]/g, "");
  return letters.replace(/[^A-Z]/g, "").length >= 0.6 * letters.length;
}

/** Lines of the same size stacked under `first` (a title set on two or three lines). */
function stackLines(first: PositionedText, pool: PositionedText[]): string {
  const lines = [first];
  let last = first;
  for (;;) {
    const next = pool
      .filter(
        (it) =>
          !lines.includes(it) &&
          Math.abs(it.fontSize - first.fontSize) <= 0.1 * first.fontSize &&
          it.y > last.y &&
          it.y - last.y <= 1.6 * first.fontSize &&
          // Left-aligned or centred under the line above.
          (Math.abs(it.x - first.x) <= 2 * first.fontSize || Math.abs(centre(it).cx - centre(last).cx) <= 2 * first.fontSize) &&
          isTitleContinuation(normalize(it.str)),
      )
      .sort((a, b) => a.y - b.y)[0];
    if (!next || lines.length >= 3) break;
    lines.push(next);
    last = next;
  }
  return normalize(lines.map((l) => l.str).join(" ")).slice(0, MAX_TITLE_LENGTH);
}

function findTitle(page: PageText, body: number, anchor: PositionedText | null): string | null {
  for (const it of page.items) {
    const m = TITLE_LABEL_PREFIX.exec(normalize(it.str));
    if (m?.[1] && isTitleLike(normalize(m[1]))) return normalize(m[1]).slice(0, MAX_TITLE_LENGTH);
  }
  const titleLike = page.items.filter((it) => isTitleLike(normalize(it.str)));
  // A "SHEET TITLE" caption: its value is the title-like text on its line to the right, or the
  // first line below it.
  for (const label of page.items.filter((it) => TITLE_LABEL.test(normalize(it.str)))) {
    const value = titleLike
      .filter((it) => {
        const below = it.y > label.y && it.y - label.y <= 6 * Math.max(label.fontSize, it.fontSize);
        const right = Math.abs(it.y - label.y) <= label.fontSize && it.x > label.x;
        return (below || right) && Math.abs(it.x - label.x) <= page.width * 0.3;
      })
      .sort((a, b) => a.y - b.y || Math.abs(a.x - label.x) - Math.abs(b.x - label.x))[0];
    if (value) return stackLines(value, page.items);
  }
  if (!anchor) return null;
  // No caption: the title-like text nearest the sheet number, favouring words titles are made of
  // and sizes above body text; firm and project names lose on both counts in a typical block.
  const reach = Math.hypot(page.width, page.height) * 0.35;
  let best: { item: PositionedText; score: number } | null = null;
  for (const it of titleLike) {
    const d = distance(it, anchor);
    if (d > reach || it.fontSize < 0.9 * body) continue;
    const score = (TITLE_WORDS.test(it.str) ? 2 : 0) + Math.min(it.fontSize / body, 3) - (3 * d) / reach;
    if (!best || score > best.score) best = { item: it, score };
  }
  if (!best) return null;
  // Start from the top line of a stacked title.
  let top = best.item;
  for (;;) {
    const above = titleLike.find(
      (it) =>
        it !== top &&
        Math.abs(it.fontSize - top.fontSize) <= 0.1 * top.fontSize &&
        it.y < top.y &&
        top.y - it.y <= 1.6 * top.fontSize &&
        Math.abs(centre(it).cx - centre(top).cx) <= Math.max(top.width, it.width) / 2 + top.fontSize,
    );
    if (!above) break;
    top = above;
  }
  return stackLines(top, page.items);
}

/**
 * Heuristic, not a parser: the sheet number is the sheet-identifier-shaped text that is captioned
 * "SHEET", sits in the title-block corner, or is set well above body size — the highest scoring
 * wins; the title is the captioned "SHEET TITLE" value or the title-like text nearest the number.
 * Falls back to `sheetNumber: null` and "Page n".
 */
export function identifySheet(page: PageText): SheetIdentity {
  const items = page.items.filter((it) => normalize(it.str) !== "");
  const p = { ...page, items };
  const body = bodyFontSize(items);
  const number = findNumber(p, body);
  const title = findTitle(p, body, number?.item ?? null);
  return { page: page.page, sheetNumber: number?.number ?? null, title: title ?? `Page ${page.page}` };
}

/** Reading-order text of a page: items grouped into lines by baseline, lines top to bottom. */
export function pageTextLines(page: PageText): string[] {
  const items = page.items.filter((it) => it.str.trim() !== "").sort((a, b) => a.y - b.y || a.x - b.x);
  const lines: PositionedText[][] = [];
  for (const it of items) {
    const line = lines[lines.length - 1];
    const head = line?.[0];
    if (line && head && Math.abs(it.y - head.y) <= 0.5 * Math.max(head.fontSize, it.fontSize)) line.push(it);
    else lines.push([it]);
  }
  return lines.map((line) => {
    line.sort((a, b) => a.x - b.x);
    let out = "";
    let end = -Infinity;
    for (const it of line) {
      // Gap to the previous item's end, points: touching runs (a font change mid-word) join
      // directly, a word space gets a space, a column gap a tab.
      const gap = it.x - end;
      if (out !== "") out += gap < 0.15 * it.fontSize ? "" : gap > 3 * it.fontSize ? "\t" : " ";
      out += out === "" ? it.str.trimStart() : it.str;
      end = it.x + it.width;
    }
    return out.trimEnd();
  });
}
