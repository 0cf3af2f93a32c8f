// What people do to an application, the words on the buttons, and what each event needs as input.

export const EVENTS = [
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
] as const;

export type WorkflowEvent = (typeof EVENTS)[number];

export const EVENT_LABELS: Record<WorkflowEvent, string> = {
  submit: "Submit for intake",
  return_incomplete: "Return as incomplete",
  accept: "Accept for review",
  issue_corrections: "Issue corrections",
  resubmit: "Resubmit",
  begin_review: "Begin review",
  approve: "Approve",
  approve_with_conditions: "Approve with conditions",
  withdraw: "Withdraw application",
  reassign: "Reassign examiner",
};

/** A condition of approval (IBC 2021 §107.3.4.1 lists deferred submittals; from memory). */
export interface ConditionInput {
  text: string;
  /** id of an open correction comment this condition carries, if any */
  carriesCommentId?: number | null;
}

/** Input each event takes, as the caller hands it over (already zod-parsed, checked again here). */
export interface EventInputs {
  submit: undefined;
  return_incomplete: { reasons: readonly string[] };
  accept: { examinerId: number };
  issue_corrections: undefined;
  resubmit: undefined;
  begin_review: undefined;
  approve: undefined;
  approve_with_conditions: { conditions: readonly ConditionInput[] };
  withdraw: { reason?: string | null } | undefined;
  reassign: { examinerId: number; reason: string };
}

/** Input after checking: strings trimmed, optional parts made explicit. */
export interface ParsedInputs {
  submit: Record<string, never>;
  return_incomplete: { reasons: string[] };
  accept: { examinerId: number };
  issue_corrections: Record<string, never>;
  resubmit: Record<string, never>;
  begin_review: Record<string, never>;
  approve: Record<string, never>;
  approve_with_conditions: { conditions: { text: string; carriesCommentId: number | null }[] };
  withdraw: { reason: string | null };
  reassign: { examinerId: number; reason: string };
}

export type InputField = "reasons" | "examinerId" | "conditions" | "reason";

/** Required input per event, so a button knows to open a dialog first. */
export const EVENT_REQUIRES: Record<WorkflowEvent, readonly InputField[]> = {
  submit: [],
  return_incomplete: ["reasons"],
  accept: ["examinerId"],
  issue_corrections: [],
  resubmit: [],
  begin_review: [],
  approve: [],
  approve_with_conditions: ["conditions"],
  withdraw: [],
  reassign: ["examinerId", "reason"],
};

export function isWorkflowEvent(value: unknown): value is WorkflowEvent {
  return typeof value === "string" && (EVENTS as readonly string[]).includes(value);
}
