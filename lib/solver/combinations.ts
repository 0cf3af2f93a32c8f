import type { LimitRow, LimitsTable } from "@/lib/solver/limits-ibc-2021";
import type { Material, ParsedCheck } from "@/lib/solver/parse-checks";
import type { ParsedLoad } from "@/lib/solver/types";

/**
 * How the long-term (creep) part of the dead-load deflection enters the D + L check:
 * - "ibc-footnote-d": IBC 2021 Table 1604.3 footnote d — 0.5 D for dry lumber, glulam,
 *   I-joists and SCL; 1.0 D for other moisture conditions, CLT and wood panels; 0 for steel
 *   (footnote g);
 * - "nds-3.5.2": NDS 2018 §3.5.2, Δ_T = K_cr·Δ_LT + Δ_ST with K_cr = 1.5 (seasoned lumber,
 *   glulam, I-joists, SCL, dry service) or 2.0 (panels, CLT, unseasoned or wet service);
 * - "immediate": the full immediate Δ_D + Δ_L that many examiners still check (common
 *   practice, no source).
 */
export type CreepInterpretation = "ibc-footnote-d" | "nds-3.5.2" | "immediate";

export const CREEP_INTERPRETATIONS: readonly CreepInterpretation[] = ["ibc-footnote-d", "nds-3.5.2", "immediate"];

export interface CreepChoice {
  /** factor on the dead-load case in the D + L combination */
  factor: number;
  basis: string;
}

const DRY_WOOD: readonly Material[] = ["sawn-dry", "glulam", "i-joist", "scl"];
const OTHER_WOOD: readonly Material[] = ["sawn-wet", "clt", "panel"];

export function creepFactor(interpretation: CreepInterpretation, material: Material): CreepChoice {
  if (interpretation === "immediate") return { factor: 1, basis: "full immediate dead-load deflection (no creep reduction)" };
  if (interpretation === "nds-3.5.2") {
    if (DRY_WOOD.includes(material)) return { factor: 1.5, basis: "NDS 2018 §3.5.2: K_cr = 1.5 (dry service)" };
    if (OTHER_WOOD.includes(material)) return { factor: 2, basis: "NDS 2018 §3.5.2: K_cr = 2.0 (panels, CLT, unseasoned or wet)" };
    return { factor: 1, basis: `NDS 2018 §3.5.2 covers wood only; ${material}: immediate dead-load deflection, K_cr = 1` };
  }
  if (DRY_WOOD.includes(material)) return { factor: 0.5, basis: "IBC 2021 Table 1604.3 footnote d: creep part = immediate Δ under 0.5 D" };
  if (OTHER_WOOD.includes(material)) return { factor: 1, basis: "IBC 2021 Table 1604.3 footnote d: creep part = immediate Δ under 1.0 D" };
  if (material === "steel") return { factor: 0, basis: "IBC 2021 Table 1604.3 footnote g: creep part zero for steel" };
  return {
    factor: 1,
    basis: `IBC 2021 Table 1604.3 footnote d gives no creep estimate for ${material}; immediate Δ under 1.0 D used`,
  };
}

export type LimitColumn = "live" | "snowWind" | "total";

export interface ComboSpec {
  /** "L", "Lr", "S", "W", "D+L", "D+Lr" */
  name: string;
  column: LimitColumn;
  /** n of the limit l/n */
  denominator: number;
  /** load case → factor */
  factors: Record<string, number>;
  basis: string;
}

/** The serviceability combinations of one check, for the load cases the model has. */
export function combosForCheck(
  check: ParsedCheck,
  row: LimitRow,
  table: LimitsTable,
  cases: ReadonlySet<string>,
  interpretation: CreepInterpretation,
): ComboSpec[] {
  const out: ComboSpec[] = [];
  const lives = ["L", "Lr"].filter((c) => cases.has(c));
  if (row.live !== undefined) {
    for (const c of lives) out.push({ name: c, column: "live", denominator: row.live, factors: { [c]: 1 }, basis: `${c} alone` });
  }
  if (row.snowWind !== undefined) {
    if (cases.has("S") && !row.windOnly) out.push({ name: "S", column: "snowWind", denominator: row.snowWind, factors: { S: 1 }, basis: "S alone" });
    if (cases.has("W")) {
      out.push({
        name: "W",
        column: "snowWind",
        denominator: row.snowWind,
        factors: { W: table.windFactor },
        basis: `${table.windFactor} × W (footnote f)`,
      });
    }
  }
  if (row.total !== undefined) {
    const creep = row.immediateTotal
      ? { factor: 1, basis: "total load: full immediate dead-load deflection" }
      : creepFactor(interpretation, check.material);
    for (const c of lives) {
      const factors: Record<string, number> = { [c]: 1 };
      if (creep.factor !== 0 && cases.has("D")) factors.D = creep.factor;
      out.push({ name: `D+${c}`, column: "total", denominator: row.total, factors, basis: `${creep.factor} × D + ${c}; ${creep.basis}` });
    }
  }
  return out;
}

/** A canonical key for a set of factors, so equal combinations share one load set. */
export function factorKey(factors: Record<string, number>): string {
  return Object.keys(factors)
    .filter((k) => factors[k] !== 0)
    .sort()
    .map((k) => `${k}:${factors[k]}`)
    .join("|");
}

function scaled(load: ParsedLoad, f: number): ParsedLoad {
  switch (load.type) {
    case "node":
      return { ...load, Fx: f * load.Fx, Fy: f * load.Fy, M: f * load.M };
    case "line":
      return { ...load, wa: f * load.wa, wb: f * load.wb };
    case "point":
      return { ...load, P: f * load.P };
    case "moment":
      return { ...load, M: f * load.M };
    case "thermal":
      return { ...load, dT: f * load.dT };
    case "misfit":
      return { ...load, delta: f * load.delta };
    case "settlement":
      return { ...load, dx: f * load.dx, dy: f * load.dy };
  }
}

/** The loads of a combination: each load of a listed case, scaled by the case's factor. */
export function combinationLoads(loads: readonly ParsedLoad[], factors: Record<string, number>): ParsedLoad[] {
  const out: ParsedLoad[] = [];
  for (const l of loads) {
    const f = factors[l.case];
    if (f === undefined || f === 0) continue;
    out.push(f === 1 ? l : scaled(l, f));
  }
  return out;
}
