import { z } from "zod";

// The fee schedule as data. Its shape follows the valuation tables many local schedules use
// (IBC 2021 §109.2 leaves the schedule to the jurisdiction; the form "$X for the first $A plus
// $Y for each additional $1,000 or fraction thereof" is that of UBC 1997 Table 1-A, from
// memory), a plan-review fee as a share of the permit fee (65 % in UBC 1997 §108.3, from
// memory), and a fixed fee for each review cycle beyond the ones the plan-review fee covers
// (common practice, no source). All amounts are integer cents; percentages are basis points.

export const FEE_SCHEDULE_KEY = "fee_schedule";

/** Upper limit for any amount here: ten billion dollars, in cents (keeps products far inside 2^53). */
export const MAX_CENTS = 1_000_000_000_000;

const cents = (what: string) =>
  z
    .number({ error: `Enter ${what} in dollars and cents.` })
    .int(`${what[0]!.toUpperCase()}${what.slice(1)} must be whole cents.`)
    .min(0, `${what[0]!.toUpperCase()}${what.slice(1)} cannot be negative.`)
    .max(MAX_CENTS, `${what[0]!.toUpperCase()}${what.slice(1)} is too large.`);

/**
 * One valuation bracket. It covers valuations above the previous bracket's `upToCents` (0 for
 * the first) up to and including its own `upToCents` (null: no upper limit, last bracket only).
 * Fee = baseCents + perStepCents × ⌈(valuation − lower limit) / stepCents⌉; stepCents 0 means a
 * flat fee ("each additional $1,000 or fraction thereof" is stepCents 100 000).
 */
export const bracketSchema = z
  .object({
    upToCents: cents("the upper limit of the bracket").min(1, "The upper limit must be more than zero.").nullable(),
    baseCents: cents("the base fee"),
    stepCents: cents("the step size"),
    perStepCents: cents("the fee per step"),
  })
  .refine((b) => b.perStepCents === 0 || b.stepCents > 0, { message: "A fee per step needs a step size (e.g. $1,000.00).", path: ["stepCents"] });

export type FeeBracket = z.infer<typeof bracketSchema>;

export const fixedFeeSchema = z.object({
  code: z.string().regex(/^[a-z][a-z0-9_]{1,30}$/, "A short code in lower case, e.g. records_fee."),
  label: z.string().trim().min(3, "Name the fee.").max(80),
  amountCents: cents("the amount").min(1, "A fixed fee must be more than zero."),
});

/** What an administrator edits; the server adds the version when it saves. */
export const feeScheduleInputSchema = z
  .object({
    label: z.string().trim().min(3, "Give the schedule a name.").max(160),
    currency: z.literal("usd"),
    brackets: z.array(bracketSchema).min(1, "At least one valuation bracket.").max(30, "At most 30 brackets."),
    /** Plan-review fee as a share of the permit fee, in basis points (6 500 = 65 %). */
    planReviewBasisPoints: z.number().int("Whole basis points.").min(0, "Cannot be negative.").max(100_000, "At most 1,000 %."),
    /** Charged with the plan-review fee at intake acceptance. */
    fixedFees: z.array(fixedFeeSchema).max(10),
    resubmittal: z.object({
      /** review cycles the plan-review fee covers (cycle 1 is the first review) */
      includedCycles: z.number().int().min(1, "The plan-review fee covers at least the first review.").max(20),
      /** charged for each review cycle after those */
      feeCents: cents("the resubmittal fee"),
    }),
  })
  .superRefine((s, ctx) => {
    s.brackets.forEach((b, i) => {
      const last = i === s.brackets.length - 1;
      if (b.upToCents === null && !last) ctx.addIssue({ code: "custom", message: "Only the last bracket may be open-ended.", path: ["brackets", i, "upToCents"] });
      if (b.upToCents !== null && last) ctx.addIssue({ code: "custom", message: "The last bracket must be open-ended (no upper limit), so every valuation has a fee.", path: ["brackets", i, "upToCents"] });
      const prev = i > 0 ? s.brackets[i - 1]!.upToCents : 0;
      if (b.upToCents !== null && prev !== null && b.upToCents <= prev) {
        ctx.addIssue({ code: "custom", message: "Upper limits must increase from one bracket to the next.", path: ["brackets", i, "upToCents"] });
      }
    });
    const codes = new Set<string>();
    s.fixedFees.forEach((f, i) => {
      if (codes.has(f.code) || f.code === "plan_review" || f.code === "resubmittal") {
        ctx.addIssue({ code: "custom", message: "Each fee needs its own code.", path: ["fixedFees", i, "code"] });
      }
      codes.add(f.code);
    });
  });

export type FeeScheduleInput = z.infer<typeof feeScheduleInputSchema>;

export const feeScheduleSchema = z.intersection(
  feeScheduleInputSchema,
  z.object({
    /** stored on every invoice, so an old invoice always says which schedule priced it */
    version: z.string().min(1).max(40),
    revision: z.number().int().min(1),
  }),
);

export type FeeSchedule = z.infer<typeof feeScheduleSchema>;

export const DEMO_SCHEDULE_LABEL = "Invented demo schedule: not an adopted fee resolution of any city";

/**
 * The demo department's schedule. Invented numbers in the usual shape; each bracket's base is
 * the previous bracket's fee at its upper limit, so the fee never jumps at an edge.
 */
export const DEMO_FEE_SCHEDULE: FeeSchedule = {
  version: "LF-FEES-r1",
  revision: 1,
  label: DEMO_SCHEDULE_LABEL,
  currency: "usd",
  brackets: [
    { upToCents: 200_000, baseCents: 6_000, stepCents: 0, perStepCents: 0 }, // up to $2,000: $60.00
    { upToCents: 2_500_000, baseCents: 6_000, stepCents: 100_000, perStepCents: 1_250 }, // + $12.50 per $1,000 → $347.50 at $25,000
    { upToCents: 10_000_000, baseCents: 34_750, stepCents: 100_000, perStepCents: 900 }, // + $9.00 per $1,000 → $1,022.50 at $100,000
    { upToCents: 50_000_000, baseCents: 102_250, stepCents: 100_000, perStepCents: 625 }, // + $6.25 per $1,000 → $3,522.50 at $500,000
    { upToCents: 100_000_000, baseCents: 352_250, stepCents: 100_000, perStepCents: 500 }, // + $5.00 per $1,000 → $6,022.50 at $1,000,000
    { upToCents: null, baseCents: 602_250, stepCents: 100_000, perStepCents: 350 }, // + $3.50 per $1,000 above $1,000,000
  ],
  planReviewBasisPoints: 6_500,
  fixedFees: [{ code: "records_fee", label: "Digital plan-review records fee", amountCents: 1_200 }],
  resubmittal: { includedCycles: 3, feeCents: 18_000 },
};

/** A stored schedule, or the demo schedule when none was saved or the row is unreadable. */
export function parseFeeSchedule(value: unknown): FeeSchedule {
  const parsed = feeScheduleSchema.safeParse(value);
  return parsed.success ? parsed.data : DEMO_FEE_SCHEDULE;
}

/** The version string a saved revision gets: the department prefix and the revision number. */
export function versionFor(revision: number): string {
  return `LF-FEES-r${revision}`;
}
