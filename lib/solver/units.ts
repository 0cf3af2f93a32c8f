import { all, create, type FactoryFunctionMap, type Unit } from "mathjs";

// A private mathjs instance: registering trade units must not leak into other users of mathjs.
const math = create(all as FactoryFunctionMap);

// mathjs ships "kip" (4448.2216 N) and "psi" (6894.75729276459 Pa) rounded; the exact values
// follow from the defined inch and pound (NIST SP 811: lbf = 4.4482216152605 N), so that a
// model in kip, ksi or psi gives the same SI answer as one in lbf and in.
math.createUnit({ kip: "1000 lbf", psi: "1 lbf/in^2" }, { override: true });
math.createUnit({
  kipf: "1 kip",
  ksi: "1 kip/in^2",
  ksf: "1 kip/ft^2",
  psf: "1 lbf/ft^2",
  plf: "1 lbf/ft",
  klf: "1 kip/ft",
});

export type QuantityKind =
  | "length"
  | "force"
  | "modulus"
  | "area"
  | "inertia"
  | "lineLoad"
  | "moment"
  | "temperatureChange"
  | "expansion";

interface KindInfo {
  si: string;
  noun: string;
}

const KINDS: Record<QuantityKind, KindInfo> = {
  length: { si: "m", noun: "a length" },
  force: { si: "N", noun: "a force" },
  modulus: { si: "Pa", noun: "a modulus (force per area)" },
  area: { si: "m^2", noun: "an area" },
  inertia: { si: "m^4", noun: "a second moment of area" },
  lineLoad: { si: "N/m", noun: "a force per length" },
  moment: { si: "N m", noun: "a moment" },
  temperatureChange: { si: "K", noun: "a temperature change" },
  expansion: { si: "K^-1", noun: "a coefficient of thermal expansion (1/temperature)" },
};

const reference = new Map<QuantityKind, Unit>(
  (Object.keys(KINDS) as QuantityKind[]).map((k) => [k, math.unit(1, KINDS[k].si)]),
);

export type QuantityResult = { ok: true; si: number; unit: string } | { ok: false; message: string };

const NUMBER_THEN_UNIT = /^\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*?)\s*$/;

const cache = new Map<string, QuantityResult>();

function parseUnit(value: number, unitText: string): Unit {
  // mathjs cannot read a leading "1/" ("6.5e-6 1/degF"), so divide explicitly.
  const reciprocal = /^1\s*\/\s*(.+)$/.exec(unitText);
  if (reciprocal?.[1]) return math.divide(value, math.unit(1, reciprocal[1])) as unknown as Unit;
  return math.unit(value, unitText);
}

function convert(text: string, kind: QuantityKind): QuantityResult {
  const match = NUMBER_THEN_UNIT.exec(text);
  if (!match?.[1]) return { ok: false, message: `"${text}" is not a number with a unit` };
  const value = Number(match[1]);
  const unitText = match[2] ?? "";
  if (!Number.isFinite(value)) return { ok: false, message: `"${text}" is not a number with a unit` };
  if (unitText === "") return { ok: false, message: `"${text}" has no unit` };
  let u: Unit;
  try {
    u = parseUnit(value, unitText);
  } catch {
    return { ok: false, message: `unit "${unitText}" is not known` };
  }
  const ref = reference.get(kind);
  if (!ref || !u.equalBase(ref)) return { ok: false, message: `unit "${unitText}" is not ${KINDS[kind].noun}` };
  let si: number;
  if (kind === "temperatureChange") {
    // A change, not a reading: 40 degF of change is 40 × 5/9 K, so remove the scale's offset.
    si = u.toNumber("K") - math.unit(0, unitText).toNumber("K");
  } else {
    si = u.toNumber(KINDS[kind].si);
  }
  if (!Number.isFinite(si)) return { ok: false, message: `"${text}" is not a finite quantity` };
  return { ok: true, si, unit: unitText };
}

/** Converts "16 ft" to SI (here 4.8768 m), checking the dimension against the expected kind. */
export function parseQuantity(text: string, kind: QuantityKind): QuantityResult {
  const key = `${kind}\u0000${text}`;
  const hit = cache.get(key);
  if (hit) return hit;
  const result = convert(text, kind);
  if (cache.size > 50_000) cache.clear();
  cache.set(key, result);
  return result;
}

/** SI value of 1 `unit` of length (m), or undefined if the unit is unknown or not a length. */
export function metresPerUnit(unit: string): number | undefined {
  const r = parseQuantity(`1 ${unit}`, "length");
  return r.ok ? r.si : undefined;
}

/**
 * Displacement unit echoed for a model whose lengths are in `lengthUnit`:
 * engineers give spans in ft and deflections in in, spans in m and deflections in mm.
 */
export function displacementUnitFor(lengthUnit: string): string {
  const perUnit = metresPerUnit(lengthUnit);
  if (perUnit === undefined) return "m";
  // US customary lengths are whole numbers of inches (ft = 12 in, yd = 36 in); metric are not.
  const inches = perUnit / 0.0254;
  return Math.round(inches) >= 1 && Math.abs(inches - Math.round(inches)) < 1e-9 ? "in" : "mm";
}

/** Short human form of a number: 6 significant digits, no trailing zeros. */
export function formatNumber(value: number, digits = 6): string {
  if (value === 0 || !Number.isFinite(value)) return String(value === 0 ? 0 : value);
  const s = Number(value.toPrecision(digits));
  return String(s);
}
