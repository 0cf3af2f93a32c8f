// The states an application passes through, and who holds the file in each.
//
// `holder` answers the question departments get asked most ("who had it?"): days with the
// department vs. days with the applicant. The review clock runs only while the department
// holds the file *after* intake accepted it; the completeness screen comes before the clock
// (common practice, no source). Clock effects of every transition follow from this table.

export const STATES = [
  "draft",
  "submitted",
  "returned_incomplete",
  "in_review",
  "corrections_issued",
  "resubmitted",
  "approved",
  "approved_with_conditions",
  "withdrawn",
] as const;

export type State = (typeof STATES)[number];

export type Holder = "applicant" | "department" | "closed";

export interface StateInfo {
  label: string;
  holder: Holder;
  /** true while the review clock runs (days counted against the department) */
  reviewClock: boolean;
  /** no event leaves a final state */
  final: boolean;
}

export const STATE_INFO: Record<State, StateInfo> = {
  draft:                    { label: "Draft",                    holder: "applicant",  reviewClock: false, final: false },
  submitted:                { label: "Submitted for intake",     holder: "department", reviewClock: false, final: false },
  returned_incomplete:      { label: "Returned as incomplete",   holder: "applicant",  reviewClock: false, final: false },
  in_review:                { label: "In plan review",           holder: "department", reviewClock: true,  final: false },
  corrections_issued:       { label: "Corrections issued",       holder: "applicant",  reviewClock: false, final: false },
  resubmitted:              { label: "Resubmitted",              holder: "department", reviewClock: true,  final: false },
  approved:                 { label: "Approved",                 holder: "closed",     reviewClock: false, final: true },
  approved_with_conditions: { label: "Approved with conditions", holder: "closed",     reviewClock: false, final: true },
  withdrawn:                { label: "Withdrawn",                holder: "closed",     reviewClock: false, final: true },
};

export const FINAL_STATES: readonly State[] = STATES.filter((s) => STATE_INFO[s].final);

/** States in which the applicant holds the file: the only time they may upload or edit. */
export const APPLICANT_SIDE_STATES: readonly State[] = STATES.filter(
  (s) => STATE_INFO[s].holder === "applicant",
);

export function stateLabel(state: State): string {
  return STATE_INFO[state].label;
}

export function isState(value: unknown): value is State {
  return typeof value === "string" && (STATES as readonly string[]).includes(value);
}
