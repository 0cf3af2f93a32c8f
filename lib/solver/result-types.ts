import type { ClaimVerdict, LimitVerdict } from "@/lib/solver/claims";
import type { CreepInterpretation, LimitColumn } from "@/lib/solver/combinations";
import type { EnergyCheck } from "@/lib/solver/energy";
import type { Material } from "@/lib/solver/parse-checks";
import type { Dof, StructureKind } from "@/lib/solver/types";
import type { MemberTerm, SupportTerm } from "@/lib/solver/unit-load";

/**
 * What `solve` returns: plain JSON (no Maps, no class instances). Suffixes give units:
 * _m metres, _rad radians, _N newtons, _Nm newton-metres, _J joules; `value_si` is m or rad
 * as `unit_si` says; `*_display` values are in `unit_display` (in for ft/in models, mm for
 * metric ones). Forces follow the beam convention of lib/solver/equilibrium.ts.
 */

/** A value computed by virtual work beside the independent stiffness value. */
export interface CrossChecked {
  stiffness_si: number | null;
  /** |a − b| / max(|a|, |b|, floor); null when the stiffness side did not run */
  rel_diff: number | null;
  disagreement: boolean;
}

export interface FindItemResult extends CrossChecked {
  label: string;
  dof: Dof;
  value_si: number;
  unit_si: "m" | "rad";
  value_display: number;
  unit_display: string;
  /** the unit-load method's own terms: per member, and −Σ r·s per settled support */
  terms: MemberTerm[];
  support_terms: SupportTerm[];
}

export interface ReactionResult {
  node: string;
  /** null where the dof is not held */
  Fx_N: number | null;
  Fy_N: number | null;
  M_Nm: number | null;
  stiffness: { Fx_N: number | null; Fy_N: number | null; M_Nm: number | null } | null;
  rel_diff: number | null;
  disagreement: boolean;
}

export interface EndForces {
  N_N: number;
  V_N: number;
  M_Nm: number;
}

export interface Station {
  x_m: number;
  ux_m: number;
  uy_m: number;
  rz_rad: number;
  N_N: number;
  V_N: number;
  M_Nm: number;
}

export interface MemberResult {
  id: string;
  length_m: number;
  /** internal forces just inside each end (x = 0⁺ and x = L⁻) */
  end_forces: { start: EndForces; end: EndForces };
  /** largest displacement across the member (local y, m) and where, from its first end */
  extreme: CrossChecked & {
    deflection_m: number;
    deflection_display: number;
    unit_display: string;
    x_m: number;
    x_over_length: number;
  };
  stations: Station[];
}

export interface CombinationResult {
  name: string;
  factors: Record<string, number>;
  find: (CrossChecked & { label: string; dof: Dof; value_si: number; terms: MemberTerm[]; support_terms: SupportTerm[] })[];
}

export interface CheckComboResult extends CrossChecked {
  name: string;
  column: LimitColumn;
  basis: string;
  factors: Record<string, number>;
  verdict: LimitVerdict & { delta_display: number; allowable_display: number; unit_display: string };
  /** where the governing deflection occurs (member checks) */
  where: { member: string; x_m: number } | null;
  claim: ClaimVerdict | null;
}

export interface CheckResult {
  id: string;
  row: string;
  row_label: string;
  members: string[];
  at: { label: string; dof: Dof } | null;
  span_m: number;
  cantilever: boolean;
  material: Material;
  combos: CheckComboResult[];
}

export interface CrossCheckSummary {
  available: boolean;
  method: string;
  tolerance: number;
  compared: number;
  max_rel_diff: number;
  disagreements: string[];
  error?: string;
}

export interface SolveResult {
  solver_version: string;
  title: string;
  kind: StructureKind;
  units: { si: Record<string, string>; display: { length: string; displacement: string; metres_per_displacement_unit: number } };
  method: {
    name: string;
    virtual_system: string;
    integration: string;
    degree_of_indeterminacy: number;
    redundants: string[];
    reciprocity: { asymmetry: number; path_difference: number; tolerance: number };
    stations_source: string;
  };
  find: FindItemResult[];
  energy: EnergyCheck;
  reactions: ReactionResult[];
  members: MemberResult[];
  combinations: CombinationResult[];
  checks: CheckResult[];
  cross_check: CrossCheckSummary;
  creep: { interpretation: CreepInterpretation; description: string };
  limits: { source: string; notes: string[] };
  assumptions: string[];
  not_covered: string[];
}
