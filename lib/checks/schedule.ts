import Papa from "papaparse";
import { beamFormSchema, buildBeamModel, DEFAULT_BEAM, type BeamFormInput, type BuiltModel } from "@/lib/checks/beam-form";
import { LIMIT_ROW_IDS, LOAD_CASES } from "@/lib/checks/claims";
import { parseClaimsText } from "@/lib/checks/claims-text";
import { DEFAULT_MATERIAL } from "@/lib/checks/materials";
import { FORCE_UNITS, LENGTH_UNITS, LINE_LOAD_UNITS, MODULUS_UNITS, parseFeetInches, siPerUnit, tidy } from "@/lib/checks/quantities";
import { DEFAULT_SECTION, dressedOf, findWShape, type SectionInput } from "@/lib/checks/sections";
import { MATERIALS } from "@/lib/solver/model-schema";

// A member schedule as CSV: one simple beam, cantilever or fixed-end beam per row, checked in
// one batch. The header is exact (order free); the page documents each column with an example.

export const SCHEDULE_COLUMNS = [
  { name: "mark", required: true, help: "Member mark as on the plans", example: "FB-3" },
  { name: "span", required: true, help: 'Span with its unit: 16 ft, 4.88 m or 16\'-0"; a cantilever\'s length', example: "16 ft" },
  { name: "supports", required: true, help: "simple, cantilever, fixed-pinned or fixed-fixed", example: "simple" },
  {
    name: "loads",
    required: true,
    help: 'Loads separated by ";": case, value, unit; a point load adds "@" and its distance from the left end (the fixed end of a cantilever)',
    example: "D 72 plf; L 240 plf; L 1.5 kip @ 6 ft",
  },
  { name: "section", required: true, help: "Sawn nominal size (2x12, 2-2x12 for two plies), a W shape (W12x26), a rectangle with unit (5.125x12 in) or I typed (I=738 in^4)", example: "5.125x12 in" },
  { name: "E", required: true, help: "Modulus of elasticity with its unit", example: "1800 ksi" },
  { name: "claimed", required: true, help: 'Claimed deflections separated by ";": combination, value, unit (may be empty)', example: "L 0.21 in; D+L 0.30 in" },
  { name: "limit", required: true, help: "Row of IBC 2021 Table 1604.3", example: "floor" },
  { name: "material", required: false, help: "Material class for creep (sawn-dry, glulam, steel, …); default from the section", example: "glulam" },
] as const;

export const SCHEDULE_HEADER = SCHEDULE_COLUMNS.filter((c) => c.required)
  .map((c) => c.name)
  .join(",");

export const EXAMPLE_SCHEDULE_CSV = [
  `${SCHEDULE_HEADER},material`,
  'FB-3,16 ft,simple,D 72 plf; L 240 plf,5.125x12 in,1800 ksi,L 0.21 in,floor,glulam',
  "J-1,15'-6\",simple,D 16 plf; L 53.3 plf,2x12,1600 ksi,L 0.24 in,floor,sawn-dry",
  "B-7,20 ft,simple,D 0.35 klf; L 0.8 klf; L 4 kip @ 10 ft,W12x26,29000 ksi,L 0.45 in; D+L 0.62 in,floor,steel",
  "C-2,6 ft,cantilever,D 60 plf; L 200 plf,2-2x12,1600 ksi,,floor,",
].join("\n");

export const MAX_SCHEDULE_ROWS = 200;

export interface ScheduleRow {
  /** line in the file (the header is line 1) */
  line: number;
  mark: string;
  input: BeamFormInput;
  built: BuiltModel;
}

export interface ScheduleRowError {
  line: number;
  mark: string;
  column: string;
  message: string;
}

export type ScheduleParse =
  | { ok: true; rows: ScheduleRow[]; errors: ScheduleRowError[] }
  | { ok: false; message: string };

const SUPPORT_KINDS = ["simple", "cantilever", "fixed-pinned", "fixed-fixed"] as const;
type Supports = (typeof SUPPORT_KINDS)[number];

class CellError extends Error {
  constructor(
    readonly column: string,
    message: string,
  ) {
    super(message);
  }
}

const NUMBER_UNIT = /^\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(\S.*?)?\s*$/;

function lengthCell(text: string, column: string): { value: number; unit: (typeof LENGTH_UNITS)[number] } {
  const ftin = parseFeetInches(text);
  if (ftin !== null) return { value: ftin, unit: "ft" };
  const m = NUMBER_UNIT.exec(text);
  const unit = m?.[2];
  if (!m?.[1] || !unit || !(LENGTH_UNITS as readonly string[]).includes(unit)) {
    throw new CellError(column, `"${text}" is not a length with a unit such as "16 ft", "4.88 m" or 16'-0"`);
  }
  return { value: Number(m[1]), unit: unit as (typeof LENGTH_UNITS)[number] };
}

function parseLoads(text: string, spanUnit: string, length: number): BeamFormInput["loads"] {
  const loads: BeamFormInput["loads"] = [];
  const parts = text
    .split(";")
    .map((p) => p.trim())
    .filter((p) => p !== "");
  if (parts.length === 0) throw new CellError("loads", 'give at least one load, e.g. "D 72 plf; L 240 plf"');
  for (const part of parts) {
    const m = /^(\S+)\s+([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*([A-Za-z][^@\s]*)\s*(?:@\s*(.+))?$/.exec(part);
    if (!m?.[1] || !m[2] || !m[3]) throw new CellError("loads", `"${part}": write the case, the value and its unit, e.g. "L 240 plf" or "L 1.5 kip @ 6 ft"`);
    const kase = m[1];
    if (!(LOAD_CASES as readonly string[]).includes(kase)) throw new CellError("loads", `"${part}": the load case must be one of ${LOAD_CASES.join(", ")}`);
    const unit = m[3];
    const at = m[4];
    if (at === undefined) {
      if (!(LINE_LOAD_UNITS as readonly string[]).includes(unit)) {
        throw new CellError("loads", `"${part}": a uniform load needs a line-load unit (${LINE_LOAD_UNITS.join(", ")}); a point load needs "@" and its position`);
      }
      loads.push({ case: kase as (typeof LOAD_CASES)[number], type: "uniform", on: "all", w: m[2], unit });
    } else {
      if (!(FORCE_UNITS as readonly string[]).includes(unit)) throw new CellError("loads", `"${part}": a point load needs a force unit (${FORCE_UNITS.join(", ")})`);
      const pos = lengthCell(at.trim(), "loads");
      const x = (pos.value * siPerUnit(pos.unit, "length")) / siPerUnit(spanUnit, "length");
      if (x < 0 || x > length * (1 + 1e-9)) throw new CellError("loads", `"${part}": the position is beyond the span (${tidy(length)} ${spanUnit})`);
      loads.push({ case: kase as (typeof LOAD_CASES)[number], type: "point", on: "all", w: m[2], unit, at: tidy(x) });
    }
  }
  return loads;
}

function parseSection(text: string): { section: SectionInput; family: "sawn" | "steel" | "other" } {
  const t = text.trim();
  const plies = /^(\d)\s*-\s*(\d{1,2}\s*x\s*\d{1,2})$/i.exec(t);
  const nominal = plies?.[2] ?? t;
  if (dressedOf(nominal)) {
    return { section: { ...DEFAULT_SECTION, source: "sawn", nominal: nominal.replace(/\s+/g, "").toLowerCase(), plies: plies?.[1] ?? "1" }, family: "sawn" };
  }
  if (/^W\s*\d/i.test(t)) {
    const w = findWShape(t);
    if (!w) throw new CellError("section", `"${t}" is not in the wide-flange list (${["W8x10", "…", "W24x55"].join(" ")}); give I instead, e.g. "I=204 in^4"`);
    return { section: { ...DEFAULT_SECTION, source: "wshape", designation: w.designation }, family: "steel" };
  }
  const rect = /^([\d.]+)\s*[x×]\s*([\d.]+)\s*(in|mm)$/i.exec(t);
  if (rect?.[1] && rect[2] && rect[3]) {
    return { section: { ...DEFAULT_SECTION, source: "rect", b: rect[1], d: rect[2], dimUnit: rect[3].toLowerCase() as "in" | "mm" }, family: "other" };
  }
  const direct = /^I\s*=\s*([\d.]+(?:[eE][+-]?\d+)?)\s*(in\^4|mm\^4|m\^4)$/.exec(t);
  if (direct?.[1] && direct[2]) return { section: { ...DEFAULT_SECTION, source: "direct", I: direct[1], iUnit: direct[2] as SectionInput["iUnit"] }, family: "other" };
  throw new CellError("section", `"${t}" is not a section: use 2x12, 2-2x12, W12x26, 5.125x12 in or I=738 in^4`);
}

function rowInput(r: Record<string, string>): BeamFormInput {
  const span = lengthCell(r.span ?? "", "span");
  if (!(span.value > 0)) throw new CellError("span", "must be greater than zero");
  const supports = (r.supports ?? "").trim().toLowerCase();
  if (!(SUPPORT_KINDS as readonly string[]).includes(supports)) throw new CellError("supports", `"${r.supports}" must be one of ${SUPPORT_KINDS.join(", ")}`);
  const kind = supports as Supports;
  const loads = parseLoads(r.loads ?? "", span.unit, span.value);
  const { section, family } = parseSection(r.section ?? "");
  const e = NUMBER_UNIT.exec(r.E ?? "");
  if (!e?.[1] || !e[2] || !(MODULUS_UNITS as readonly string[]).includes(e[2])) throw new CellError("E", `"${r.E}" is not a modulus with a unit (${MODULUS_UNITS.join(", ")})`);
  if (!(Number(e[1]) > 0)) throw new CellError("E", "must be greater than zero");
  const claims = parseClaimsText(r.claimed ?? "");
  if (!claims.ok) throw new CellError("claimed", claims.message);
  const limit = (r.limit ?? "").trim();
  if (!(LIMIT_ROW_IDS as readonly string[]).includes(limit)) throw new CellError("limit", `"${limit}" is not a row of Table 1604.3; use one of ${LIMIT_ROW_IDS.join(", ")}`);
  const materialText = (r.material ?? "").trim();
  if (materialText !== "" && !(MATERIALS as readonly string[]).includes(materialText)) {
    throw new CellError("material", `"${materialText}" must be one of ${MATERIALS.join(", ")}`);
  }
  const creepMaterial = (materialText || (family === "sawn" ? "sawn-dry" : family === "steel" ? "steel" : "other")) as BeamFormInput["creepMaterial"];
  const cantilever = kind === "cantilever";
  const segment = cantilever ? "OR" : "S1";
  return {
    ...DEFAULT_BEAM,
    lengthUnit: span.unit,
    spans: cantilever ? [] : [{ length: tidy(span.value) }],
    overhangRight: cantilever ? tidy(span.value) : "",
    overhangLeft: "",
    supports: kind === "simple" ? ["pin", "roller"] : kind === "cantilever" ? ["fixed"] : kind === "fixed-pinned" ? ["fixed", "roller"] : ["fixed", "fixed"],
    section,
    material: { ...DEFAULT_MATERIAL, source: "direct", E: e[1], eUnit: e[2] as BeamFormInput["material"]["eUnit"] },
    loads,
    row: limit as BeamFormInput["row"],
    creepMaterial,
    claims: claims.claims.map((c) => {
      const m = NUMBER_UNIT.exec(c.delta);
      const unit = m?.[2] === "mm" ? "mm" : "in";
      const value = m?.[2] === "mm" || m?.[2] === "in" ? (m[1] ?? "") : tidy((Number(m?.[1]) * siPerUnit(m?.[2] ?? "in", "length")) / siPerUnit("in", "length"));
      return { segment, combo: c.combo as BeamFormInput["claims"][number]["combo"], delta: value, unit };
    }),
  };
}

/** Reads a schedule. A bad header refuses the file; a bad row is reported on its line and the others still run. */
export function parseSchedule(csv: string): ScheduleParse {
  const text = csv.replace(/^\uFEFF/, "");
  if (text.trim() === "") return { ok: false, message: `The schedule is empty: the first line must be the header ${SCHEDULE_HEADER}.` };
  const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: "greedy", transformHeader: (h) => h.trim() });
  const fields = parsed.meta.fields ?? [];
  const known = SCHEDULE_COLUMNS.map((c) => c.name) as string[];
  const unknown = fields.filter((f) => !known.includes(f));
  if (unknown.length) return { ok: false, message: `Unknown column${unknown.length > 1 ? "s" : ""} ${unknown.map((u) => `"${u}"`).join(", ")}. The header must be ${SCHEDULE_HEADER} (material optional).` };
  const missing = SCHEDULE_COLUMNS.filter((c) => c.required && !fields.includes(c.name)).map((c) => c.name);
  if (missing.length) return { ok: false, message: `Missing column${missing.length > 1 ? "s" : ""} ${missing.map((u) => `"${u}"`).join(", ")}. The header must be ${SCHEDULE_HEADER} (material optional).` };
  const dup = fields.find((f, i) => fields.indexOf(f) !== i);
  if (dup) return { ok: false, message: `Column "${dup}" appears twice.` };
  if (parsed.data.length === 0) return { ok: false, message: "The schedule has a header but no members." };
  if (parsed.data.length > MAX_SCHEDULE_ROWS) return { ok: false, message: `At most ${MAX_SCHEDULE_ROWS} members per schedule; this one has ${parsed.data.length}.` };

  const rows: ScheduleRow[] = [];
  const errors: ScheduleRowError[] = [];
  const seen = new Map<string, number>();
  // papaparse reports the row index of structural problems (a row with too many or too few fields).
  const broken = new Map<number, string>();
  for (const e of parsed.errors) if (e.row !== undefined) broken.set(e.row, e.code === "TooManyFields" ? "has more fields than the header" : e.code === "TooFewFields" ? "has fewer fields than the header" : e.message);
  parsed.data.forEach((r, i) => {
    const line = i + 2;
    const mark = (r.mark ?? "").trim();
    const fail = (column: string, message: string) => errors.push({ line, mark, column, message });
    const b = broken.get(i);
    if (b) return fail("", `line ${line} ${b}`);
    if (mark === "") return fail("mark", "give the member mark");
    const again = seen.get(mark);
    if (again !== undefined) return fail("mark", `"${mark}" is already on line ${again}`);
    seen.set(mark, line);
    try {
      const input = rowInput(r);
      const check = beamFormSchema.safeParse(input);
      if (!check.success) {
        const first = check.error.issues[0];
        return fail(String(first?.path[0] ?? ""), first?.message ?? "is not valid");
      }
      rows.push({ line, mark, input: check.data, built: buildBeamModel(check.data, { title: `${mark} (schedule line ${line})`, mark }) });
    } catch (e) {
      if (e instanceof CellError) return fail(e.column, e.message);
      throw e;
    }
  });
  return { ok: true, rows, errors };
}

/** "Line 3 (J-1), span: …" — how a row error reads on screen and in the API. */
export function formatRowError(e: ScheduleRowError): string {
  return `Line ${e.line}${e.mark ? ` (${e.mark})` : ""}${e.column ? `, ${e.column}` : ""}: ${e.message}`;
}
