import { z } from "zod";
import { parseQuantity, type QuantityKind } from "@/lib/solver/units";

// The unit choices the check forms offer. The model file takes any unit the solver parses;
// the forms only need a short select per quantity. Conversions are exact from the defined
// inch and pound (NIST SP 811).

export const LENGTH_UNITS = ["ft", "in", "m", "mm"] as const;
export const DIMENSION_UNITS = ["in", "mm"] as const;
export const DEFLECTION_UNITS = ["in", "mm"] as const;
export const FORCE_UNITS = ["lbf", "kip", "N", "kN"] as const;
export const LINE_LOAD_UNITS = ["plf", "klf", "N/m", "kN/m"] as const;
export const AREA_LOAD_UNITS = ["psf", "kPa"] as const;
export const MODULUS_UNITS = ["psi", "ksi", "MPa", "GPa"] as const;
export const INERTIA_UNITS = ["in^4", "mm^4", "m^4"] as const;
export const AREA_UNITS = ["in^2", "mm^2"] as const;

export type LengthUnit = (typeof LENGTH_UNITS)[number];
export type DimensionUnit = (typeof DIMENSION_UNITS)[number];
export type ForceUnit = (typeof FORCE_UNITS)[number];
export type LineLoadUnit = (typeof LINE_LOAD_UNITS)[number];
export type AreaLoadUnit = (typeof AREA_LOAD_UNITS)[number];
export type ModulusUnit = (typeof MODULUS_UNITS)[number];
export type InertiaUnit = (typeof INERTIA_UNITS)[number];
export type AreaUnit = (typeof AREA_UNITS)[number];

/** How a unit is shown to people (the model file keeps the solver's spelling). */
export const UNIT_LABELS: Record<string, string> = {
  "in^4": "in⁴",
  "mm^4": "mm⁴",
  "m^4": "m⁴",
  "in^2": "in²",
  "mm^2": "mm²",
  lbf: "lb",
};

export const unitLabel = (u: string): string => UNIT_LABELS[u] ?? u;

const NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

/** A number as typed in a form field (strings, so an empty field is a message, not NaN). */
export const numberText = (what: string) =>
  z
    .string({ error: `Enter the ${what}.` })
    .trim()
    .min(1, { error: `Enter the ${what}.` })
    .regex(NUMBER, { error: `The ${what} must be a number, e.g. 16 or 0.25.` });

export const positiveText = (what: string) =>
  numberText(what).refine((v) => Number(v) > 0, { error: `The ${what} must be greater than zero.` });

export const nonNegativeText = (what: string) =>
  numberText(what).refine((v) => Number(v) >= 0, { error: `The ${what} must not be negative.` });

/** An optional number: empty means "not given". */
export const optionalNumberText = (what: string) =>
  z
    .string()
    .trim()
    .refine((v) => v === "" || NUMBER.test(v), { error: `The ${what} must be a number, e.g. 16 or 0.25.` })
    .optional();

export const isBlank = (v: string | undefined | null): boolean => v === undefined || v === null || v.trim() === "";

/** A number for a model-file string: 12 significant digits, no float noise such as 5.999999999999. */
export function tidy(value: number): string {
  if (!Number.isFinite(value)) return String(value);
  if (value === 0) return "0";
  return String(Number(value.toPrecision(12)));
}

/** "16" + "ft" → "16 ft", the model file's quantity form. */
export function q(value: number | string, unit: string): string {
  return `${typeof value === "number" ? tidy(value) : value.trim()} ${unit}`;
}

/** SI value of a quantity string, or null when it does not parse as the expected kind. */
export function toSi(text: string, kind: QuantityKind): number | null {
  const r = parseQuantity(text, kind);
  return r.ok ? r.si : null;
}

/** SI size of one `unit` of the given kind (m per ft, Pa per psi, …). */
export function siPerUnit(unit: string, kind: QuantityKind): number {
  const r = parseQuantity(`1 ${unit}`, kind);
  if (!r.ok) throw new Error(`internal: ${unit} is not ${kind}`);
  return r.si;
}

/** Converts a value between two units of one kind. */
export function convert(value: number, from: string, to: string, kind: QuantityKind): number {
  return (value * siPerUnit(from, kind)) / siPerUnit(to, kind);
}

/**
 * Feet-and-inches as calcs write them: 16'-0", 15'-6", 15' 6", 12'-4 1/2", 9'. Returns feet,
 * or null when the text is not that form. Common practice, no source.
 */
export function parseFeetInches(text: string): number | null {
  const t = text.trim().replace(/[’′]/g, "'").replace(/[”″]/g, '"').replace(/''/g, '"');
  const m = /^(\d+(?:\.\d+)?)\s*'\s*(?:-?\s*(\d+(?:\.\d+)?)?(?:\s+(\d+)\/(\d+))?\s*"?)?$/.exec(t);
  if (!m) return null;
  const feet = Number(m[1]);
  let inches = m[2] ? Number(m[2]) : 0;
  if (m[3] && m[4]) {
    const den = Number(m[4]);
    if (den === 0) return null;
    inches += Number(m[3]) / den;
  }
  if (inches >= 12) return null;
  return feet + inches / 12;
}

/** Fractions the trade writes for lumber and glulam: 5-1/8, 3 1/2, 1/2, 11.25. */
export function parseMixedNumber(text: string): number | null {
  const t = text.trim();
  let m = /^(\d+)[-\s](\d+)\/(\d+)$/.exec(t);
  if (m) return Number(m[3]) === 0 ? null : Number(m[1]) + Number(m[2]) / Number(m[3]);
  m = /^(\d+)\/(\d+)$/.exec(t);
  if (m) return Number(m[2]) === 0 ? null : Number(m[1]) / Number(m[2]);
  return NUMBER.test(t) ? Number(t) : null;
}

// ---- display: every result in the unit the model used and the other system beside it

const IN = 0.0254;
const FT = 0.3048;
const LBF = 4.4482216152605;

export function fmt(value: number, digits = 3): string {
  if (!Number.isFinite(value)) return value > 0 ? "∞" : "—";
  if (value === 0) return "0";
  const a = Math.abs(value);
  if (a >= 10 ** digits) return Math.round(value).toLocaleString("en-US");
  return Number(value.toPrecision(digits)).toLocaleString("en-US", { maximumFractionDigits: 8 });
}

/** A displacement in m as "0.266 in (6.77 mm)" or "6.77 mm (0.266 in)". */
export function bothLengths(m: number, primary: "in" | "mm" = "in", digits = 3): string {
  const inch = `${fmt(m / IN, digits)} in`;
  const mm = `${fmt(m * 1000, digits)} mm`;
  return primary === "in" ? `${inch} (${mm})` : `${mm} (${inch})`;
}

/** A span in m as "16 ft (4.877 m)". */
export function bothSpans(m: number, primary: "ft" | "m" = "ft"): string {
  const ft = `${fmt(m / FT, 4)} ft`;
  const mm = `${fmt(m, 4)} m`;
  return primary === "ft" ? `${ft} (${mm})` : `${mm} (${ft})`;
}

export function bothForces(n: number, primary: "kip" | "kN" = "kip"): string {
  const kip = `${fmt(n / (1000 * LBF))} kip`;
  const kn = `${fmt(n / 1000)} kN`;
  return primary === "kip" ? `${kip} (${kn})` : `${kn} (${kip})`;
}

export function bothMoments(nm: number, primary: "kip" | "kN" = "kip"): string {
  const kipft = `${fmt(nm / (1000 * LBF * FT))} kip·ft`;
  const knm = `${fmt(nm / 1000)} kN·m`;
  return primary === "kip" ? `${kipft} (${knm})` : `${knm} (${kipft})`;
}

/** Whether a result reads in US customary first (its displacement unit is in). */
export function isUs(displayUnit: string): boolean {
  return displayUnit === "in";
}
