// Actors and application facts shared by the workflow tests. Ids are arbitrary: 101 owns the
// application, 201 is its assigned examiner; the others are strangers to it.

import {
  transition,
  WorkflowError,
  type Actor,
  type ApplicationFacts,
  type OpenComment,
  type Role,
  type State,
  type TransitionResult,
  type WorkflowEvent,
} from "@/lib/workflow";

export const ACTORS = {
  owner: { id: 101, role: "applicant" },
  otherApplicant: { id: 102, role: "applicant" },
  technician: { id: 301, role: "technician" },
  examiner: { id: 201, role: "examiner" },
  otherExaminer: { id: 202, role: "examiner" },
  supervisor: { id: 401, role: "supervisor" },
  admin: { id: 501, role: "admin" },
} as const satisfies Record<string, Actor & { role: Role }>;

export type ActorKey = keyof typeof ACTORS;
export const ACTOR_KEYS = Object.keys(ACTORS) as ActorKey[];

export const OWNER_ID = 101;
export const EXAMINER_ID = 201;
/** the examiner a reassignment moves the review to */
export const NEW_EXAMINER_ID = 203;

// Written out here rather than imported, so a state or event added to the module without
// a matching expectation makes the tests fail.
export const ALL_STATES = [
  "draft",
  "submitted",
  "returned_incomplete",
  "in_review",
  "corrections_issued",
  "resubmitted",
  "approved",
  "approved_with_conditions",
  "withdrawn",
] as const satisfies readonly State[];

export const ALL_EVENTS = [
  "submit",
  "return_incomplete",
  "accept",
  "issue_corrections",
  "resubmit",
  "begin_review",
  "approve",
  "approve_with_conditions",
  "withdraw",
  "reassign",
] as const satisfies readonly WorkflowEvent[];

/** States before intake accepted the application: no examiner, cycle 0. */
const BEFORE_REVIEW: readonly State[] = ["draft", "submitted", "returned_incomplete"];

export function comment(id: number, number: number, answered: boolean): OpenComment {
  return { id, number, answered };
}

/** Realistic facts for a state, with open comments chosen so the event's guard passes. */
export function passingFacts(state: State, event: WorkflowEvent): ApplicationFacts {
  const reviewed = !BEFORE_REVIEW.includes(state);
  const openComments =
    event === "issue_corrections"
      ? [comment(11, 1, false)]
      : event === "resubmit"
        ? [comment(11, 1, true)]
        : [];
  return {
    state,
    applicantId: OWNER_ID,
    assignedExaminerId: reviewed ? EXAMINER_ID : null,
    cycle: reviewed ? 1 : 0,
    openComments,
    unpaidFee: null,
  };
}

/** A valid input for each event; approval with conditions carries every open comment. */
export function validInput(event: WorkflowEvent, facts: ApplicationFacts): unknown {
  switch (event) {
    case "return_incomplete":
      return { reasons: ["Calculation package for the roof framing is missing"] };
    case "accept":
      return { examinerId: EXAMINER_ID };
    case "reassign":
      return { examinerId: NEW_EXAMINER_ID, reason: "Balancing the structural queue" };
    case "approve_with_conditions":
      return {
        conditions: [
          { text: "Deferred submittal: pre-engineered roof truss drawings before framing inspection" },
          ...facts.openComments.map((c) => ({ text: `Comment ${c.number} to be satisfied in the field`, carriesCommentId: c.id })),
        ],
      };
    case "withdraw":
      return { reason: "Owner postponed the project" };
    default:
      return undefined;
  }
}

export function deepFreeze<T>(value: T): T {
  if (typeof value === "object" && value !== null) {
    for (const inner of Object.values(value)) deepFreeze(inner);
    Object.freeze(value);
  }
  return value;
}

export type Outcome =
  | { ok: true; result: TransitionResult<WorkflowEvent> }
  | { ok: false; code: string; reason: string | undefined; message: string };

/** Run transition() and report its result or its WorkflowError as data. */
export function attempt(actor: Actor, facts: ApplicationFacts, event: WorkflowEvent, input: unknown): Outcome {
  try {
    // Inputs here are deliberately untyped: the module must refuse bad ones at run time too.
    return { ok: true, result: transition(actor, facts, event, input as never) };
  } catch (error) {
    if (!(error instanceof WorkflowError)) throw error;
    return { ok: false, code: error.code, reason: error.reason, message: error.message };
  }
}
