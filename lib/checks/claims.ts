import { z } from "zod";
import { CREEP_INTERPRETATIONS, IBC_2021_TABLE_1604_3, type CreepInterpretation } from "@/lib/solver";
import { MATERIALS } from "@/lib/solver/model-schema";

// What the examiner checks against: the Table 1604.3 row, the creep reading of D + L, the
// claimed deflections. Shared by the beam form, the table editor and the CSV schedule.

export const LOAD_CASES = ["D", "L", "Lr", "S", "W"] as const;
export type LoadCase = (typeof LOAD_CASES)[number];

export const LOAD_CASE_LABELS: Record<LoadCase, string> = {
  D: "D — dead",
  L: "L — floor live",
  Lr: "Lr — roof live",
  S: "S — snow",
  W: "W — wind (C&C)",
};

/** Combination names a claim may use (lib/solver/model-format.md). */
export const CLAIM_COMBOS = ["L", "Lr", "S", "W", "D+L", "D+Lr"] as const;
export type ClaimCombo = (typeof CLAIM_COMBOS)[number];

export const LIMIT_ROWS = IBC_2021_TABLE_1604_3.rows.map((r) => ({ id: r.id, label: r.label, live: r.live, snowWind: r.snowWind, total: r.total }));
export const LIMIT_ROW_IDS = LIMIT_ROWS.map((r) => r.id) as [string, ...string[]];
export const LIMITS_SOURCE = IBC_2021_TABLE_1604_3.source;

/** "L/360 (L) · L/240 (D + L)": the limits of one row as the table prints them. */
export function rowLimits(id: string): string {
  const r = LIMIT_ROWS.find((x) => x.id === id);
  if (!r) return "";
  const parts: string[] = [];
  if (r.live) parts.push(`l/${r.live} live`);
  if (r.snowWind) parts.push(`l/${r.snowWind} snow or wind`);
  if (r.total) parts.push(`l/${r.total} D + L`);
  return parts.join(" · ");
}

export const CREEP_LABELS: Record<CreepInterpretation, string> = {
  "ibc-footnote-d": "IBC Table 1604.3 footnote d (creep part: 0.5 D dry wood, 1.0 D other wood, 0 steel)",
  "nds-3.5.2": "NDS 2018 §3.5.2 (K_cr × Δ_D: 1.5 dry, 2.0 wet/panels/CLT)",
  immediate: "Full immediate Δ_D + Δ_L",
};

export const creepSchema = z.enum(CREEP_INTERPRETATIONS as unknown as [CreepInterpretation, ...CreepInterpretation[]], {
  error: "Choose how creep enters D + L.",
});

export const checkMaterialSchema = z.enum(MATERIALS, { error: "Choose the material class for creep." });

/** Options stored with a check, as `solve` reads them; `limits` names the table edition. */
export const checkOptionsSchema = z.object({
  creep: creepSchema.default("ibc-footnote-d"),
  limits: z.literal(LIMITS_SOURCE, { error: `The limits table available is ${LIMITS_SOURCE}.` }).default(LIMITS_SOURCE),
});

export type CheckOptions = z.infer<typeof checkOptionsSchema>;
export const DEFAULT_OPTIONS: CheckOptions = { creep: "ibc-footnote-d", limits: LIMITS_SOURCE };
