/**
 * Judging a deflection against its limit and a claimed value against the recomputed one.
 * Thresholds are common practice, not code (see /shared/domain.md): within ±5 % agree,
 * 5–15 % ask for the assumptions, beyond 15 % or a flipped pass/fail is a correction; a
 * result within 2 % of its limit is flagged for a person to look at. All configurable.
 */
export interface ClaimThresholds {
  /** relative difference up to which a claim agrees (0.05) */
  agree: number;
  /** relative difference up to which the examiner asks (0.15); beyond it is a correction */
  ask: number;
}

export const DEFAULT_CLAIM_THRESHOLDS: ClaimThresholds = { agree: 0.05, ask: 0.15 };
export const DEFAULT_NEAR_LIMIT = 0.02;

export interface LimitVerdict {
  /** m, magnitude */
  delta_m: number;
  /** m, l/n */
  allowable_m: number;
  /** the span used for the limit (cantilever: 2 × length), m */
  limit_span_m: number;
  limit: string;
  /** l/Δ, Infinity when Δ = 0 */
  span_over_delta: number;
  pass: boolean;
  near_limit: boolean;
}

export function limitVerdict(delta: number, limitSpan: number, denominator: number, nearLimit = DEFAULT_NEAR_LIMIT): LimitVerdict {
  const d = Math.abs(delta);
  const allowable = limitSpan / denominator;
  return {
    delta_m: d,
    allowable_m: allowable,
    limit_span_m: limitSpan,
    limit: `l/${denominator}`,
    span_over_delta: d === 0 ? Number.POSITIVE_INFINITY : limitSpan / d,
    pass: d <= allowable,
    near_limit: Math.abs(d / allowable - 1) <= nearLimit,
  };
}

export type ClaimVerdictKind = "agree" | "ask" | "correction";

export interface ClaimVerdict {
  combo: string;
  claimed_m: number;
  computed_m: number;
  /** (claimed − computed) / computed */
  difference: number;
  claimed_passes: boolean;
  computed_passes: boolean;
  flipped: boolean;
  verdict: ClaimVerdictKind;
  reason: string;
}

export function claimVerdict(
  combo: string,
  claimed: number,
  computed: number,
  allowable: number,
  thresholds: ClaimThresholds = DEFAULT_CLAIM_THRESHOLDS,
): ClaimVerdict {
  const c = Math.abs(claimed);
  const k = Math.abs(computed);
  const difference = k === 0 ? (c === 0 ? 0 : Number.POSITIVE_INFINITY) : (c - k) / k;
  const claimedPasses = c <= allowable;
  const computedPasses = k <= allowable;
  const flipped = claimedPasses !== computedPasses;
  const size = Math.abs(difference);
  let verdict: ClaimVerdictKind;
  let reason: string;
  const pct = (v: number): string => `${(100 * v).toFixed(1)} %`;
  if (flipped) {
    verdict = "correction";
    reason = `the claim ${claimedPasses ? "passes" : "fails"} the limit but the recomputed value ${computedPasses ? "passes" : "fails"}`;
  } else if (size <= thresholds.agree) {
    verdict = "agree";
    reason = `within ±${pct(thresholds.agree)}`;
  } else if (size <= thresholds.ask) {
    verdict = "ask";
    reason = `differs by ${pct(size)}, between ${pct(thresholds.agree)} and ${pct(thresholds.ask)}: ask for the assumptions`;
  } else {
    verdict = "correction";
    reason = `differs by ${Number.isFinite(size) ? pct(size) : "more than any threshold"}, beyond ${pct(thresholds.ask)}`;
  }
  return {
    combo,
    claimed_m: c,
    computed_m: k,
    difference,
    claimed_passes: claimedPasses,
    computed_passes: computedPasses,
    flipped,
    verdict,
    reason,
  };
}
