import type { PageText } from "@/lib/pdf/sheets";
import { LUMBER, glulamE } from "@/lib/checks/materials";
import { parseFeetInches, parseMixedNumber, type LengthUnit } from "@/lib/checks/quantities";
import { dressedOf, findWShape } from "@/lib/checks/sections";
import type { LoadCase } from "@/lib/checks/claims";

// Reads the text layer of a calculation package for the numbers an examiner would otherwise
// re-type: spans, tributary widths, loads, sizes, E, I and claimed deflections. Every find is a
// suggestion shown beside the form; nothing goes into the form without a click. The notation
// is the calc writer's, so the patterns follow common practice (no source).

export type Suggestion =
  | { kind: "span"; value: { length: number; unit: LengthUnit } }
  | { kind: "trib"; value: { length: number; unit: LengthUnit } }
  | { kind: "line-load"; value: { case: LoadCase | null; w: number; unit: "plf" | "klf" | "kN/m" } }
  | { kind: "point-load"; value: { case: LoadCase | null; P: number; unit: "lbf" | "kip" | "kN" } }
  | { kind: "area-load"; value: { case: LoadCase | null; q: number; unit: "psf" | "kPa" } }
  | { kind: "section"; value: { source: "sawn"; nominal: string; plies: number } | { source: "wshape"; designation: string } | { source: "rect"; b: number; d: number; unit: "in" | "mm" } }
  | { kind: "material"; value: { source: "glulam"; stressClass: string } | { source: "lumber"; lumber: string } }
  | { kind: "E"; value: { E: number; unit: "psi" | "ksi" | "MPa" | "GPa" } }
  | { kind: "I"; value: { I: number; unit: "in^4" | "mm^4" } }
  | { kind: "deflection"; value: { combo: "L" | "D+L" | "S" | "W" | "Lr" | null; delta: number; unit: "in" | "mm"; limit: number | null } };

export type SuggestionKind = Suggestion["kind"];

export type Found = Suggestion & {
  id: string;
  page: number;
  /** the member mark the line belongs to (the last mark at the start of a line above it), or null */
  mark: string | null;
  /** the words as found, and the whole line for context */
  text: string;
  line: string;
  label: string;
};

const NUM = String.raw`\d+(?:,\d{3})*(?:\.\d+)?|\.\d+`;
const FTIN = String.raw`\d+(?:\.\d+)?\s*'\s*-?\s*\d+(?:\.\d+)?(?:\s+\d+\/\d+)?\s*"|\d+(?:\.\d+)?\s*'(?![\s-]*\d)`;
const METRIC = String.raw`\d+(?:\.\d+)?\s*(?:ft|m|mm)\b`;
const LENGTH = `(?:${FTIN}|${METRIC})`;

const num = (s: string) => Number(s.replace(/,/g, ""));

function readLength(text: string): { length: number; unit: LengthUnit } | null {
  const t = text.trim();
  const ftin = parseFeetInches(t);
  if (ftin !== null) return { length: Number(ftin.toPrecision(10)), unit: "ft" };
  const m = /^(\d+(?:\.\d+)?)\s*(ft|m|mm|in)$/.exec(t);
  return m?.[1] && m[2] ? { length: Number(m[1]), unit: m[2] as LengthUnit } : null;
}

function caseOf(tag: string | undefined): LoadCase | null {
  const t = (tag ?? "").toUpperCase();
  if (t === "D" || t === "DL") return "D";
  if (t === "L" || t === "LL") return "L";
  if (t === "LR") return "Lr";
  if (t === "S" || t === "SL") return "S";
  if (t === "W" || t === "WL") return "W";
  return null;
}

/** The load case named by the words just before a value: "dead 12 psf", "roof live 20 psf". */
function caseBefore(line: string, index: number): LoadCase | null {
  const before = line.slice(Math.max(0, index - 28), index).toLowerCase();
  const hits: [number, LoadCase][] = [];
  const look = (re: RegExp, c: LoadCase) => {
    let m: RegExpExecArray | null;
    const g = new RegExp(re.source, "g");
    while ((m = g.exec(before))) hits.push([m.index, c]);
  };
  look(/roof\s+live|\blr\b/, "Lr");
  look(/(?<!roof\s)live|\bll\b/, "L");
  look(/dead|\bdl\b/, "D");
  look(/snow|\bsl\b/, "S");
  look(/wind/, "W");
  hits.sort((a, b) => b[0] - a[0]);
  return hits[0]?.[1] ?? null;
}

const MARK = /^([A-Z]{1,3}-?\d{1,3}[A-Z]?)(?=\s|$|:)/;

function normalize(s: string): string {
  return s
    .replace(/[’′]/g, "'")
    .replace(/[“”″]/g, '"')
    .replace(/×/g, "x")
    .replace(/∆/g, "Δ")
    .replace(/\s+/g, " ")
    .trim();
}

function labelOf(s: Suggestion): string {
  switch (s.kind) {
    case "span":
      return `Span ${s.value.length} ${s.value.unit}`;
    case "trib":
      return `Tributary width ${s.value.length} ${s.value.unit}`;
    case "line-load":
      return `Line load ${s.value.case ?? "?"} ${s.value.w} ${s.value.unit}`;
    case "point-load":
      return `Point load ${s.value.case ?? "?"} ${s.value.P} ${s.value.unit}`;
    case "area-load":
      return `Area load ${s.value.case ?? "?"} ${s.value.q} ${s.value.unit}`;
    case "section":
      return s.value.source === "sawn"
        ? `Section ${s.value.plies > 1 ? `${s.value.plies}-` : ""}${s.value.nominal}`
        : s.value.source === "wshape"
          ? `Section ${s.value.designation}`
          : `Section ${s.value.b} × ${s.value.d} ${s.value.unit}`;
    case "material":
      if (s.value.source === "glulam") return `Glulam ${s.value.stressClass}`;
      {
        const id = s.value.lumber;
        const l = LUMBER.find((x) => x.id === id);
        return `Lumber ${l?.species ?? ""} ${l?.grade ?? ""}`;
      }
    case "E":
      return `E = ${s.value.E.toLocaleString("en-US")} ${s.value.unit}`;
    case "I":
      return `I = ${s.value.I} ${s.value.unit}`;
    case "deflection":
      return `Claimed Δ${s.value.combo ? ` (${s.value.combo})` : ""} ${s.value.delta} ${s.value.unit}${s.value.limit ? ` vs L/${s.value.limit}` : ""}`;
  }
}

const LUMBER_WORDS: [RegExp, string][] = [
  [/\b(?:DF-?L|Douglas\s+Fir-Larch)\s*(?:No\.?\s*|#)2\b/i, "dfl-2"],
  [/\b(?:DF-?L|Douglas\s+Fir-Larch)\s*(?:No\.?\s*|#)1\b/i, "dfl-1"],
  [/\b(?:DF-?L|Douglas\s+Fir-Larch)\s*(?:SS|Sel(?:ect)?\.?\s*Str(?:uctural)?)\b/i, "dfl-ss"],
  [/\b(?:HF|Hem-Fir)\s*(?:No\.?\s*|#)2\b/i, "hf-2"],
  [/\b(?:SPF|Spruce-Pine-Fir)\s*(?:No\.?\s*|#)2\b/i, "spf-2"],
  [/\b(?:SYP|SP|Southern\s+Pine)\s*(?:No\.?\s*|#)2\b/i, "sp-2"],
];

/** Everything suggestible in one line of calc text. */
export function scanLine(raw: string): { suggestion: Suggestion; text: string }[] {
  const line = normalize(raw);
  const out: { suggestion: Suggestion; text: string; at: number }[] = [];
  const push = (suggestion: Suggestion, text: string, at: number) => out.push({ suggestion, text, at });
  let m: RegExpExecArray | null;

  const span = new RegExp(String.raw`\b(?:span(?:\s+L)?|L)\s*[=:]?\s*(${LENGTH})`, "gi");
  while ((m = span.exec(line))) {
    if (/^L\b/i.test(m[0]) && !/=/.test(m[0])) continue; // a bare "L 16 ft" is not a span statement
    const v = readLength(m[1] ?? "");
    if (v) push({ kind: "span", value: v }, m[0], m.index);
  }
  const trib = new RegExp(String.raw`\btrib(?:utary)?(?:\s+width)?\s*[=:]?\s*(${LENGTH}|\d+(?:\.\d+)?\s*(?:"|in\b))`, "gi");
  while ((m = trib.exec(line))) {
    const t = (m[1] ?? "").trim();
    const inches = /^(\d+(?:\.\d+)?)\s*(?:"|in)$/.exec(t);
    const v = inches?.[1] ? { length: Number(inches[1]), unit: "in" as const } : readLength(t);
    if (v) push({ kind: "trib", value: v }, m[0], m.index);
  }
  const spacing = /@\s*(\d+(?:\.\d+)?)\s*(?:"|in\.?)\s*o\.?\s*c\.?/gi;
  while ((m = spacing.exec(line))) push({ kind: "trib", value: { length: Number(m[1]), unit: "in" } }, m[0], m.index);

  const wload = new RegExp(String.raw`\bw\s*_?\s*(DL|LL|TL|Lr|D|L|S|W)?\s*=\s*(${NUM})\s*(plf|klf|lb\/ft|#\/ft|k\/ft|kN\/m)`, "gi");
  while ((m = wload.exec(line))) {
    const u = (m[3] ?? "").toLowerCase();
    const unit = u === "klf" || u === "k/ft" ? "klf" : u === "kn/m" ? "kN/m" : "plf";
    push({ kind: "line-load", value: { case: caseOf(m[1]), w: num(m[2] ?? "0"), unit } }, m[0], m.index);
  }
  const pload = new RegExp(String.raw`\bP\s*_?\s*(DL|LL|D|L|Lr|S)?\s*=\s*(${NUM})\s*(kips?|k|lbs?|#|kN)\b`, "gi");
  while ((m = pload.exec(line))) {
    const u = (m[3] ?? "").toLowerCase();
    const unit = u.startsWith("k") && u !== "kn" ? "kip" : u === "kn" ? "kN" : "lbf";
    push({ kind: "point-load", value: { case: caseOf(m[1]), P: num(m[2] ?? "0"), unit } }, m[0], m.index);
  }
  const area = new RegExp(String.raw`(${NUM})\s*(psf|kPa)\b`, "gi");
  while ((m = area.exec(line))) {
    push({ kind: "area-load", value: { case: caseBefore(line, m.index), q: num(m[1] ?? "0"), unit: (m[2] ?? "").toLowerCase() === "kpa" ? "kPa" : "psf" } }, m[0], m.index);
  }

  const wshape = /\bW\s?(\d{1,2})\s*x\s*(\d{1,3})\b/gi;
  while ((m = wshape.exec(line))) {
    const w = findWShape(`W${m[1]}x${m[2]}`);
    if (w) push({ kind: "section", value: { source: "wshape", designation: w.designation } }, m[0], m.index);
  }
  const rect = /(?<![\w/-])(\d+-\d\/\d|\d+\s\d\/\d|\d+\.\d+)\s*x\s*(\d+-\d\/\d|\d+(?:\.\d+)?)(?!\s*(?:in\^|mm\^))/gi;
  const taken: [number, number][] = [];
  while ((m = rect.exec(line))) {
    const b = parseMixedNumber((m[1] ?? "").replace(" ", "-"));
    const d = parseMixedNumber(m[2] ?? "");
    if (b && d) {
      push({ kind: "section", value: { source: "rect", b, d, unit: "in" } }, m[0], m.index);
      taken.push([m.index, m.index + m[0].length]);
    }
  }
  const sawn = /(?<![\w./-])(?:\((\d)\)\s*|(\d)\s*-\s*)?(\d{1,2})\s*x\s*(\d{1,2})(?![\w./-])/gi;
  while ((m = sawn.exec(line))) {
    const at = m.index;
    if (taken.some(([a, b]) => at >= a && at < b)) continue;
    if (/W\s?$/i.test(line.slice(Math.max(0, at - 2), at))) continue;
    const nominal = `${m[3]}x${m[4]}`;
    if (!dressedOf(nominal)) continue;
    push({ kind: "section", value: { source: "sawn", nominal, plies: Number(m[1] ?? m[2] ?? "1") } }, m[0], at);
  }

  const stress = /\b(\d{2}F-\d\.\dE)\b/gi;
  while ((m = stress.exec(line))) if (glulamE(m[1] ?? "") !== null) push({ kind: "material", value: { source: "glulam", stressClass: (m[1] ?? "").toUpperCase() } }, m[0], m.index);
  for (const [re, id] of LUMBER_WORDS) {
    const hit = re.exec(line);
    if (hit) push({ kind: "material", value: { source: "lumber", lumber: id } }, hit[0], hit.index);
  }

  const modulus = new RegExp(String.raw`\bE\s*=\s*(${NUM}(?:[eE][+-]?\d+)?)\s*(psi|ksi|MPa|GPa)\b`, "g");
  while ((m = modulus.exec(line))) push({ kind: "E", value: { E: num(m[1] ?? "0"), unit: (m[2] ?? "psi") as "psi" } }, m[0], m.index);
  const inertia = new RegExp(String.raw`\bI\s*(?:x|xx)?\s*=\s*(${NUM})\s*(in\^?4|in4|mm\^?4|mm4)`, "g");
  while ((m = inertia.exec(line))) push({ kind: "I", value: { I: num(m[1] ?? "0"), unit: (m[2] ?? "").startsWith("mm") ? "mm^4" : "in^4" } }, m[0], m.index);

  const defl = new RegExp(String.raw`(?:Δ|delta|defl(?:ection)?|\bD)\s*_?\s*(LL|TL|Lr|D\+L|L|T|S|W)?\s*=\s*(${NUM})\s*(in\b|mm\b|")\s*(?:(?:<|≤|<=)\s*[Ll]\s*\/\s*(\d{2,3}))?`, "gi");
  while ((m = defl.exec(line))) {
    const tag = (m[1] ?? "").toUpperCase();
    const limit = m[4] ? Number(m[4]) : null;
    const combo = tag === "L" || tag === "LL" ? "L" : tag === "TL" || tag === "T" || tag === "D+L" ? "D+L" : tag === "S" ? "S" : tag === "W" ? "W" : tag === "LR" ? "Lr" : limit === 360 ? "L" : limit === 240 ? "D+L" : null;
    push({ kind: "deflection", value: { combo, delta: num(m[2] ?? "0"), unit: m[3] === "mm" ? "mm" : "in", limit } }, m[0], m.index);
  }
  return out.sort((a, b) => a.at - b.at).map(({ suggestion, text }) => ({ suggestion, text }));
}

/** Lines of a page's text layer: items on one baseline (within a third of the font size), left to right. */
export function linesOf(page: PageText): string[] {
  const items = [...page.items].sort((a, b) => a.y - b.y || a.x - b.x);
  const lines: { y: number; size: number; parts: { x: number; s: string }[] }[] = [];
  for (const it of items) {
    const last = lines[lines.length - 1];
    if (last && Math.abs(it.y - last.y) <= Math.max(1, last.size / 3)) last.parts.push({ x: it.x, s: it.str });
    else lines.push({ y: it.y, size: it.fontSize || 10, parts: [{ x: it.x, s: it.str }] });
  }
  return lines.map((l) =>
    l.parts
      .sort((a, b) => a.x - b.x)
      .map((p) => p.s)
      .join(" ")
      .replace(/\s+/g, " ")
      .trim(),
  ).filter((l) => l !== "");
}

/** Every suggestion in a calculation package, page by page, each tied to the member mark above it. */
export function scanCalcText(pages: { page: number; lines: string[] }[]): Found[] {
  const out: Found[] = [];
  for (const p of pages) {
    let mark: string | null = null;
    p.lines.forEach((raw, li) => {
      const line = normalize(raw);
      const mm = MARK.exec(line);
      if (mm?.[1] && !/^(?:[LUW]\d|S-?\d{3})/.test(mm[1])) mark = mm[1];
      scanLine(line).forEach(({ suggestion, text }, k) => {
        out.push({ ...suggestion, id: `p${p.page}-l${li}-${k}`, page: p.page, mark, text, line, label: labelOf(suggestion) } as Found);
      });
    });
  }
  return out;
}
