import { z } from "zod";
import { DIMENSION_UNITS, INERTIA_UNITS, AREA_UNITS, isBlank, optionalNumberText, q, tidy, type DimensionUnit } from "@/lib/checks/quantities";

// Section properties for the check forms: sawn lumber by nominal size, rectangles and
// I-shapes from their dimensions, a short list of wide-flange shapes, or I and A typed in.

export const SAWN_SOURCE =
  "Dressed sizes: PS 20 American Softwood Lumber Standard (dry); section properties: NDS 2018 Supplement Table 1B";
export const W_SOURCE = "AISC Steel Construction Manual, 15th ed., Table 1-1 (values from memory; verify against the Manual)";

/**
 * Minimum dressed dry size of a nominal dimension, in: 2, 3, 4 → 1½, 2½, 3½; 5 and 6 → 4½, 5½;
 * 8 and wider → nominal − ¾. Timbers (both nominal dimensions 5 in or more) dress to nominal − ½
 * (green). PS 20 / NDS Supplement Table 1B, from memory.
 */
export function dressedSize(nominal: number, timber: boolean): number {
  if (!Number.isInteger(nominal) || nominal < 2 || nominal > 24) throw new Error(`no dressed size for nominal ${nominal} in`);
  if (timber) return nominal - 0.5;
  if (nominal <= 7) return nominal - 0.5;
  return nominal - 0.75;
}

export interface SawnSize {
  nominal: string;
  /** dressed thickness and width, in */
  b: number;
  d: number;
  /** NDS Supplement Table 1B as printed: area in², Ixx in⁴ (from memory) */
  tableA: number;
  tableI: number;
}

/** Nominal "2x12" → dressed 1.5 × 11.25 in; timbers when both sides are 5 in or more. */
export function dressedOf(nominal: string): { b: number; d: number } | null {
  const m = /^\s*(\d{1,2})\s*[x×X]\s*(\d{1,2})\s*$/.exec(nominal);
  if (!m) return null;
  const t = Number(m[1]);
  const w = Number(m[2]);
  if (t < 2 || w < 2 || t > 12 || w > 16) return null;
  const timber = t >= 5 && w >= 5;
  return { b: dressedSize(t, timber), d: dressedSize(w, timber) };
}

// NDS 2018 Supplement Table 1B, "Section Properties of Standard Dressed (S4S) Sawn Lumber",
// X–X axis; values from memory, checked in the tests against b·d³/12.
const SAWN_TABLE: [string, number, number][] = [
  ["2x4", 5.25, 5.359],
  ["2x6", 8.25, 20.8],
  ["2x8", 10.88, 47.63],
  ["2x10", 13.88, 98.93],
  ["2x12", 16.88, 177.98],
  ["2x14", 19.88, 290.8],
  ["3x8", 18.13, 79.39],
  ["3x10", 23.13, 164.9],
  ["3x12", 28.13, 296.6],
  ["4x4", 12.25, 12.51],
  ["4x6", 19.25, 48.53],
  ["4x8", 25.38, 111.1],
  ["4x10", 32.38, 230.8],
  ["4x12", 39.38, 415.3],
  ["6x6", 30.25, 76.26],
  ["6x8", 41.25, 193.4],
  ["6x10", 52.25, 393.0],
  ["6x12", 63.25, 697.1],
  ["8x8", 56.25, 263.7],
  ["8x10", 71.25, 535.9],
  ["8x12", 86.25, 950.5],
];

export const SAWN_SIZES: SawnSize[] = SAWN_TABLE.map(([nominal, tableA, tableI]) => {
  const s = dressedOf(nominal);
  if (!s) throw new Error(`internal: ${nominal}`);
  return { nominal, ...s, tableA, tableI };
});

export interface WShape {
  designation: string;
  /** in² */
  A: number;
  /** depth, web thickness, flange width, flange thickness, in */
  d: number;
  tw: number;
  bf: number;
  tf: number;
  /** in⁴ */
  Ix: number;
}

// AISC Manual 15th ed., Table 1-1 (W-shapes: dimensions and properties), from memory.
export const W_SHAPES: WShape[] = [
  { designation: "W8x10", A: 2.96, d: 7.89, tw: 0.17, bf: 3.94, tf: 0.205, Ix: 30.8 },
  { designation: "W8x18", A: 5.26, d: 8.14, tw: 0.23, bf: 5.25, tf: 0.33, Ix: 61.9 },
  { designation: "W8x31", A: 9.13, d: 8.0, tw: 0.285, bf: 7.995, tf: 0.435, Ix: 110 },
  { designation: "W10x12", A: 3.54, d: 9.87, tw: 0.19, bf: 3.96, tf: 0.21, Ix: 53.8 },
  { designation: "W10x22", A: 6.49, d: 10.17, tw: 0.24, bf: 5.75, tf: 0.36, Ix: 118 },
  { designation: "W12x26", A: 7.65, d: 12.22, tw: 0.23, bf: 6.49, tf: 0.38, Ix: 204 },
  { designation: "W12x40", A: 11.7, d: 11.94, tw: 0.295, bf: 8.005, tf: 0.515, Ix: 307 },
  { designation: "W14x22", A: 6.49, d: 13.74, tw: 0.23, bf: 5.0, tf: 0.335, Ix: 199 },
  { designation: "W14x30", A: 8.85, d: 13.84, tw: 0.27, bf: 6.73, tf: 0.385, Ix: 291 },
  { designation: "W16x26", A: 7.68, d: 15.69, tw: 0.25, bf: 5.5, tf: 0.345, Ix: 301 },
  { designation: "W16x31", A: 9.13, d: 15.88, tw: 0.275, bf: 5.525, tf: 0.44, Ix: 375 },
  { designation: "W18x35", A: 10.3, d: 17.7, tw: 0.3, bf: 6.0, tf: 0.425, Ix: 510 },
  { designation: "W21x44", A: 13.0, d: 20.66, tw: 0.35, bf: 6.5, tf: 0.45, Ix: 843 },
  { designation: "W24x55", A: 16.2, d: 23.57, tw: 0.395, bf: 7.005, tf: 0.505, Ix: 1350 },
];

export function findWShape(designation: string): WShape | undefined {
  const key = designation.replace(/\s+/g, "").replace("×", "x").toUpperCase();
  return W_SHAPES.find((w) => w.designation.toUpperCase() === key);
}

/** Rectangle b × d: I = b·d³/12, A = b·d, shear area 5A/6 (form factor 6/5). */
export function rectangle(b: number, d: number) {
  const A = b * d;
  return { I: (b * d ** 3) / 12, A, Av: (5 * A) / 6 };
}

/**
 * Doubly symmetric I-shape from its plates (fillets ignored, so slightly below a rolled
 * shape's tabulated Ix): I = [bf·d³ − (bf − tw)(d − 2tf)³]/12; shear area d·tw (the web).
 */
export function iShape(d: number, bf: number, tf: number, tw: number) {
  const hw = d - 2 * tf;
  return { I: (bf * d ** 3 - (bf - tw) * hw ** 3) / 12, A: 2 * bf * tf + hw * tw, Av: d * tw };
}

// ---- the form's section input and what it resolves to

export const SECTION_SOURCES = ["sawn", "rect", "ishape", "wshape", "direct"] as const;
export type SectionSource = (typeof SECTION_SOURCES)[number];

export const SECTION_SOURCE_LABELS: Record<SectionSource, string> = {
  sawn: "Sawn lumber (nominal size)",
  rect: "Rectangle from dimensions (glulam, SCL, timber)",
  ishape: "I-shape from dimensions",
  wshape: "Steel wide-flange shape",
  direct: "I and A typed in",
};

export const sectionSchema = z
  .object({
    source: z.enum(SECTION_SOURCES, { error: "Choose where the section properties come from." }),
    nominal: z.string().optional(),
    plies: z.string().optional(),
    b: optionalNumberText("width b"),
    d: optionalNumberText("depth d"),
    bf: optionalNumberText("flange width bf"),
    tf: optionalNumberText("flange thickness tf"),
    tw: optionalNumberText("web thickness tw"),
    dimUnit: z.enum(DIMENSION_UNITS),
    designation: z.string().optional(),
    I: optionalNumberText("moment of inertia I"),
    iUnit: z.enum(INERTIA_UNITS),
    A: optionalNumberText("area A"),
    aUnit: z.enum(AREA_UNITS),
  })
  .superRefine((s, ctx) => {
    const need = (key: "b" | "d" | "bf" | "tf" | "tw" | "I", what: string) => {
      const v = s[key];
      if (isBlank(v)) ctx.addIssue({ code: "custom", path: [key], message: `Enter the ${what}.` });
      else if (!(Number(v) > 0)) ctx.addIssue({ code: "custom", path: [key], message: `The ${what} must be greater than zero.` });
    };
    if (s.source === "sawn") {
      if (!s.nominal || !dressedOf(s.nominal)) ctx.addIssue({ code: "custom", path: ["nominal"], message: "Choose a nominal size such as 2x12." });
      const plies = Number(s.plies ?? "1");
      if (!Number.isInteger(plies) || plies < 1 || plies > 4) ctx.addIssue({ code: "custom", path: ["plies"], message: "Plies: a whole number from 1 to 4." });
    } else if (s.source === "rect") {
      need("b", "width b");
      need("d", "depth d");
    } else if (s.source === "ishape") {
      need("d", "depth d");
      need("bf", "flange width bf");
      need("tf", "flange thickness tf");
      need("tw", "web thickness tw");
      if (Number(s.tf) * 2 >= Number(s.d)) ctx.addIssue({ code: "custom", path: ["tf"], message: "Two flanges are thicker than the depth d." });
      if (Number(s.tw) > Number(s.bf)) ctx.addIssue({ code: "custom", path: ["tw"], message: "The web is wider than the flange." });
    } else if (s.source === "wshape") {
      if (!s.designation || !findWShape(s.designation)) ctx.addIssue({ code: "custom", path: ["designation"], message: "Choose a shape from the list." });
    } else {
      need("I", "moment of inertia I");
      if (!isBlank(s.A) && !(Number(s.A) > 0)) ctx.addIssue({ code: "custom", path: ["A"], message: "The area A must be greater than zero." });
    }
  });

export type SectionInput = z.infer<typeof sectionSchema>;

export const DEFAULT_SECTION: SectionInput = {
  source: "sawn",
  nominal: "2x12",
  plies: "1",
  b: "",
  d: "",
  bf: "",
  tf: "",
  tw: "",
  dimUnit: "in",
  designation: "W12x26",
  I: "",
  iUnit: "in^4",
  A: "",
  aUnit: "in^2",
};

export interface ResolvedSection {
  /** model-file quantities */
  I: string;
  A?: string;
  /** effective shear area, when the shape gives one */
  Av?: string;
  /** e.g. "2x12 (1.5 × 11.25 in)" */
  label: string;
  /** "I = b·d³/12 = 1.5 × 11.25³ / 12 = 178 in⁴" */
  arithmetic: string;
  source: string;
  /** the material family the shape implies, for the creep default */
  family: "sawn" | "steel" | "other";
}

const dimLabel = (u: DimensionUnit) => u;

/** Section properties of a valid section input (run the schema first). */
export function resolveSection(s: SectionInput): ResolvedSection {
  const u = s.dimUnit;
  const u4 = u === "in" ? "in^4" : "mm^4";
  const u2 = u === "in" ? "in^2" : "mm^2";
  const r3 = (v: number) => Number(v.toPrecision(4)).toString();
  if (s.source === "sawn") {
    const size = dressedOf(s.nominal ?? "");
    if (!size) throw new Error("internal: section not validated");
    const plies = Number(s.plies || "1");
    const b = size.b * plies;
    const p = rectangle(b, size.d);
    const ply = plies > 1 ? `${plies}-ply ` : "";
    return {
      I: q(p.I, "in^4"),
      A: q(p.A, "in^2"),
      Av: q(p.Av, "in^2"),
      label: `${ply}${s.nominal} (dressed ${tidy(b)} × ${tidy(size.d)} in)`,
      arithmetic: `I = b·d³/12 = ${tidy(b)} × ${tidy(size.d)}³ / 12 = ${r3(p.I)} in⁴; A = ${r3(p.A)} in²`,
      source: SAWN_SOURCE,
      family: "sawn",
    };
  }
  if (s.source === "rect") {
    const b = Number(s.b);
    const d = Number(s.d);
    const p = rectangle(b, d);
    return {
      I: q(p.I, u4),
      A: q(p.A, u2),
      Av: q(p.Av, u2),
      label: `${tidy(b)} × ${tidy(d)} ${dimLabel(u)} rectangle`,
      arithmetic: `I = b·d³/12 = ${tidy(b)} × ${tidy(d)}³ / 12 = ${r3(p.I)} ${u}⁴; A = ${r3(p.A)} ${u}²`,
      source: "Rectangle: I = b·d³/12 (mechanics of materials)",
      family: "other",
    };
  }
  if (s.source === "ishape") {
    const d = Number(s.d);
    const bf = Number(s.bf);
    const tf = Number(s.tf);
    const tw = Number(s.tw);
    const p = iShape(d, bf, tf, tw);
    return {
      I: q(p.I, u4),
      A: q(p.A, u2),
      Av: q(p.Av, u2),
      label: `I-shape d ${tidy(d)}, bf ${tidy(bf)}, tf ${tidy(tf)}, tw ${tidy(tw)} ${u}`,
      arithmetic: `I = [bf·d³ − (bf − tw)(d − 2tf)³]/12 = ${r3(p.I)} ${u}⁴ (fillets ignored); A = ${r3(p.A)} ${u}²`,
      source: "I-shape from plates (mechanics of materials)",
      family: "other",
    };
  }
  if (s.source === "wshape") {
    const w = findWShape(s.designation ?? "");
    if (!w) throw new Error("internal: section not validated");
    return {
      I: q(w.Ix, "in^4"),
      A: q(w.A, "in^2"),
      Av: q(w.d * w.tw, "in^2"),
      label: `${w.designation} (Ix ${w.Ix} in⁴, A ${w.A} in²)`,
      arithmetic: `Ix = ${w.Ix} in⁴, A = ${w.A} in² as tabulated; shear area d·tw = ${r3(w.d * w.tw)} in²`,
      source: W_SOURCE,
      family: "steel",
    };
  }
  return {
    I: q(s.I ?? "", s.iUnit),
    ...(isBlank(s.A) ? {} : { A: q(s.A ?? "", s.aUnit) }),
    label: `I = ${s.I} ${s.iUnit}${isBlank(s.A) ? "" : `, A = ${s.A} ${s.aUnit}`}`,
    arithmetic: "as typed",
    source: "typed in by the examiner",
    family: "other",
  };
}
