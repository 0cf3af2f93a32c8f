import { z } from "zod";

// Review targets in business days. Published targets are typically 10–15 business days for a
// first review and 5–10 for later ones (several departments' published targets; see
// /work/shared/domain.md "Turnaround"). The defaults sit at the quick end of those ranges.
export const REVIEW_TARGETS_KEY = "review_targets";

export const reviewTargetsSchema = z.object({
  firstReviewDays: z.number({ error: "Enter a whole number of business days." }).int("Enter a whole number of business days.").min(1, "At least 1 business day.").max(60, "At most 60 business days."),
  resubmittalDays: z.number({ error: "Enter a whole number of business days." }).int("Enter a whole number of business days.").min(1, "At least 1 business day.").max(60, "At most 60 business days."),
});

export type ReviewTargets = z.infer<typeof reviewTargetsSchema>;

export const DEFAULT_REVIEW_TARGETS: ReviewTargets = { firstReviewDays: 10, resubmittalDays: 5 };

export type CycleKind = "first_review" | "resubmittal";

/** Cycle 1 is the first review; every later cycle reviews a resubmittal. */
export function cycleKind(cycleNumber: number): CycleKind {
  return cycleNumber <= 1 ? "first_review" : "resubmittal";
}

export function targetDays(cycleNumber: number, targets: ReviewTargets): number {
  return cycleKind(cycleNumber) === "first_review" ? targets.firstReviewDays : targets.resubmittalDays;
}

/** Whatever the settings row holds, a usable set of targets (a bad row falls back to the defaults, field by field). */
export function parseReviewTargets(value: unknown): ReviewTargets {
  const v = (value ?? {}) as Record<string, unknown>;
  const first = reviewTargetsSchema.shape.firstReviewDays.safeParse(v.firstReviewDays);
  const resub = reviewTargetsSchema.shape.resubmittalDays.safeParse(v.resubmittalDays);
  return {
    firstReviewDays: first.success ? first.data : DEFAULT_REVIEW_TARGETS.firstReviewDays,
    resubmittalDays: resub.success ? resub.data : DEFAULT_REVIEW_TARGETS.resubmittalDays,
  };
}
