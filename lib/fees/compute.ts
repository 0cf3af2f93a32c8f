// Fee arithmetic in integer cents. Pure: no clock, no I/O. Every amount is a safe integer of
// cents; the one product that can be fractional (a percentage of the permit fee) is computed
// exactly with BigInt and rounded half up to the cent (common practice, no source).
import { formatBasisPoints, formatCents, formatExactCents } from "./money";
import { MAX_CENTS, type FeeBracket, type FeeSchedule } from "./schedule";

export class FeeInputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "FeeInputError";
  }
}

export interface FeeLine {
  code: string;
  label: string;
  amountCents: number;
  /** the arithmetic behind the amount, in words a person can check by hand */
  basis: string;
}

export interface FeeQuote {
  scheduleVersion: string;
  lineItems: FeeLine[];
  totalCents: number;
}

export interface PermitFee {
  cents: number;
  /** 0-based position of the bracket in the schedule */
  bracketIndex: number;
  bracket: FeeBracket;
  /** the bracket covers valuations above this, in cents */
  lowerCents: number;
  /** steps of stepCents above the lower limit, a part step counting as a whole one */
  steps: number;
  basis: string;
}

function assertValuation(valuationCents: number): void {
  if (!Number.isSafeInteger(valuationCents) || valuationCents <= 0) {
    throw new FeeInputError(`The valuation must be a whole number of cents greater than zero; got ${valuationCents}.`);
  }
  if (valuationCents > MAX_CENTS) throw new FeeInputError(`The valuation ${formatCents(valuationCents)} is beyond what the fee schedule handles.`);
}

/** "up to $2,000.00", "$2,000.01 to $25,000.00", "over $1,000,000.00" */
export function bracketRangeText(lowerCents: number, upToCents: number | null): string {
  if (upToCents === null) return `over ${formatCents(lowerCents)}`;
  if (lowerCents === 0) return `up to ${formatCents(upToCents)}`;
  return `${formatCents(lowerCents + 1)} to ${formatCents(upToCents)}`;
}

/** The bracket a valuation falls in: above the previous upper limit, up to and including its own. */
export function findBracket(schedule: Pick<FeeSchedule, "brackets">, valuationCents: number): { index: number; lowerCents: number } {
  assertValuation(valuationCents);
  let lower = 0;
  for (let i = 0; i < schedule.brackets.length; i++) {
    const b = schedule.brackets[i]!;
    if (b.upToCents === null || valuationCents <= b.upToCents) return { index: i, lowerCents: lower };
    lower = b.upToCents;
  }
  throw new FeeInputError(`The valuation ${formatCents(valuationCents)} is above the last bracket of the schedule, which has an upper limit of ${formatCents(lower)}.`);
}

/** ⌈a / b⌉ for non-negative safe integers, without floating point. */
function ceilDiv(a: number, b: number): number {
  return Math.floor((a + b - 1) / b);
}

export function permitFee(schedule: Pick<FeeSchedule, "brackets">, valuationCents: number): PermitFee {
  const { index, lowerCents } = findBracket(schedule, valuationCents);
  const bracket = schedule.brackets[index]!;
  const steps = bracket.stepCents > 0 ? ceilDiv(valuationCents - lowerCents, bracket.stepCents) : 0;
  const cents = bracket.baseCents + steps * bracket.perStepCents;
  if (!Number.isSafeInteger(cents)) throw new FeeInputError("The permit fee is too large to compute in whole cents.");
  const range = bracketRangeText(lowerCents, bracket.upToCents);
  const basis =
    bracket.stepCents === 0 || bracket.perStepCents === 0
      ? `valuation ${formatCents(valuationCents)}, bracket ${range}: flat ${formatCents(bracket.baseCents)}`
      : `valuation ${formatCents(valuationCents)}, bracket ${range}: ${formatCents(bracket.baseCents)} for the first ${formatCents(lowerCents)} plus ${steps} × ${formatCents(bracket.perStepCents)} for each additional ${formatCents(bracket.stepCents)} or fraction = ${formatCents(cents)}`;
  return { cents, bracketIndex: index, bracket, lowerCents, steps, basis };
}

/** n / d rounded half up (away from zero for the positive amounts used here). */
export function roundHalfUp(n: bigint, d: bigint): bigint {
  if (d <= 0n) throw new RangeError("The divisor must be positive.");
  if (n < 0n) return -roundHalfUp(-n, d);
  return (2n * n + d) / (2n * d);
}

/** basisPoints / 10 000 of an amount, exactly, then rounded half up to the cent. */
export function shareOf(cents: number, basisPoints: number): { cents: number; exact: string; rounded: boolean } {
  if (!Number.isSafeInteger(cents) || !Number.isSafeInteger(basisPoints) || basisPoints < 0) {
    throw new FeeInputError("A share needs whole cents and whole, non-negative basis points.");
  }
  const n = BigInt(cents) * BigInt(basisPoints);
  const r = roundHalfUp(n, 10_000n);
  return { cents: Number(r), exact: formatExactCents(n, 10_000n), rounded: n % 10_000n !== 0n };
}

function total(lines: FeeLine[]): number {
  const t = lines.reduce((s, l) => s + l.amountCents, 0);
  if (!Number.isSafeInteger(t)) throw new FeeInputError("The invoice total is too large to compute in whole cents.");
  return t;
}

/**
 * The fee charged when intake accepts an application: the plan-review fee (a share of the
 * building permit fee for the valuation) and the schedule's fixed fees, each line with its
 * arithmetic.
 */
export function quoteReviewFee(schedule: FeeSchedule, valuationCents: number): FeeQuote & { permitFeeCents: number } {
  const permit = permitFee(schedule, valuationCents);
  const share = shareOf(permit.cents, schedule.planReviewBasisPoints);
  const pct = formatBasisPoints(schedule.planReviewBasisPoints);
  const shareText = share.rounded
    ? `${pct} × ${formatCents(permit.cents)} = ${share.exact}, rounded half up to ${formatCents(share.cents)}`
    : `${pct} × ${formatCents(permit.cents)} = ${formatCents(share.cents)}`;
  const lines: FeeLine[] = [
    {
      code: "plan_review",
      label: "Plan-review fee",
      amountCents: share.cents,
      basis: `Building permit fee: ${permit.basis}. Plan-review fee: ${shareText}.`,
    },
    ...schedule.fixedFees.map((f) => ({ code: f.code, label: f.label, amountCents: f.amountCents, basis: `Fixed fee per application: ${formatCents(f.amountCents)}.` })),
  ];
  return { scheduleVersion: schedule.version, lineItems: lines, totalCents: total(lines), permitFeeCents: permit.cents };
}

/** The fee for reviewing cycle `cycle`, or null when the plan-review fee already covers it (or the fee is zero). */
export function quoteResubmittalFee(schedule: FeeSchedule, cycle: number): FeeQuote | null {
  if (!Number.isSafeInteger(cycle) || cycle < 1) throw new FeeInputError(`A review cycle is a whole number from 1; got ${cycle}.`);
  const { includedCycles, feeCents } = schedule.resubmittal;
  if (cycle <= includedCycles || feeCents === 0) return null;
  const lines: FeeLine[] = [
    {
      code: "resubmittal",
      label: `Review of resubmittal, cycle ${cycle}`,
      amountCents: feeCents,
      basis: `Fixed fee of ${formatCents(feeCents)} for each review cycle after the first ${includedCycles}, which the plan-review fee covers; this is cycle ${cycle}.`,
    },
  ];
  return { scheduleVersion: schedule.version, lineItems: lines, totalCents: total(lines) };
}

/**
 * Places where the fee jumps at a bracket edge: the next bracket's base differs from this
 * bracket's fee at its upper limit. Shown to the administrator; not an error (some published
 * schedules have such steps).
 */
export function bracketJumps(schedule: Pick<FeeSchedule, "brackets">): string[] {
  const out: string[] = [];
  let lower = 0;
  for (let i = 0; i + 1 < schedule.brackets.length; i++) {
    const b = schedule.brackets[i]!;
    if (b.upToCents === null) break;
    const steps = b.stepCents > 0 ? ceilDiv(b.upToCents - lower, b.stepCents) : 0;
    const atTop = b.baseCents + steps * b.perStepCents;
    const next = schedule.brackets[i + 1]!;
    if (next.baseCents !== atTop) {
      out.push(
        `Bracket ${i + 1} ends at ${formatCents(atTop)} (valuation ${formatCents(b.upToCents)}); bracket ${i + 2} starts from a base of ${formatCents(next.baseCents)}.`,
      );
    }
    lower = b.upToCents;
  }
  return out;
}
