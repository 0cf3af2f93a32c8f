import type { LoadSet } from "@/lib/solver/analysis";
import { solveStiffness, type StiffnessCaseResult } from "@/lib/solver/stiffness";
import type { ParsedModel } from "@/lib/solver/types";

export const CROSS_CHECK_TOLERANCE = 1e-6;

/**
 * Values below this fraction of the largest value of their kind (in the same structure) are
 * compared in absolute terms against that fraction: a reaction that should be zero comes out
 * of a stiffness solution as roundoff of order cond(K)·ε times the loads, not as zero.
 */
export const FLOOR_FRACTION = 1e-3;

/** The independent direct stiffness solution of the same load sets, or why it is missing. */
export function runStiffness(model: ParsedModel, sets: readonly LoadSet[]): { results: StiffnessCaseResult[] } | { error: string } {
  try {
    return { results: solveStiffness(model, sets.map((s) => s.loads)) };
  } catch (e) {
    return { error: e instanceof Error ? `${e.name}: ${e.message}` : String(e) };
  }
}

/**
 * Relative difference |a − b| / max(|a|, |b|, floor). The floor (same unit as a and b) keeps
 * values that should be zero from reading as large relative errors: FLOOR_FRACTION of the
 * largest value of the same kind.
 */
export function relDiff(a: number, b: number, floor: number): number {
  const scale = Math.max(Math.abs(a), Math.abs(b), floor);
  return scale === 0 ? 0 : Math.abs(a - b) / scale;
}

export class Comparator {
  compared = 0;
  maxRel = 0;
  readonly disagreements: string[] = [];

  constructor(readonly tolerance: number) {}

  compare(label: string, a: number, b: number, floor: number): { rel_diff: number; disagreement: boolean } {
    const r = Number.isFinite(b) ? relDiff(a, b, floor) : Number.POSITIVE_INFINITY;
    this.compared++;
    if (r > this.maxRel) this.maxRel = r;
    const disagreement = !(r <= this.tolerance);
    if (disagreement) this.disagreements.push(`${label}: virtual work ${a}, stiffness ${b} (relative difference ${r})`);
    return { rel_diff: r, disagreement };
  }
}
