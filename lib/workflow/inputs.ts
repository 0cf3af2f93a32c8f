// Input checks per event. The caller has parsed with zod already; these run again because
// the workflow must hold on its own (a missing reason is refused here, not only in a form).

import { WorkflowError } from "@/lib/workflow/errors";
import type { ParsedInputs } from "@/lib/workflow/events";
import type { ApplicationFacts } from "@/lib/workflow/facts";

function invalid(message: string): never {
  throw new WorkflowError("invalid_input", message);
}

function field(raw: unknown, name: string): unknown {
  return typeof raw === "object" && raw !== null ? (raw as Record<string, unknown>)[name] : undefined;
}

function isUserId(value: unknown): value is number {
  return typeof value === "number" && Number.isInteger(value) && value > 0;
}

export function noInput(): Record<string, never> {
  return {};
}

export function parseReturnReasons(raw: unknown): ParsedInputs["return_incomplete"] {
  const reasons = field(raw, "reasons");
  if (!Array.isArray(reasons) || reasons.length === 0) {
    invalid("Give at least one reason for returning the application as incomplete.");
  }
  return {
    reasons: reasons.map((reason: unknown, i) => {
      const text = typeof reason === "string" ? reason.trim() : "";
      return text === "" ? invalid(`Reason ${i + 1} is empty.`) : text;
    }),
  };
}

export function parseAccept(raw: unknown): ParsedInputs["accept"] {
  const examinerId = field(raw, "examinerId");
  if (!isUserId(examinerId)) invalid("Choose the plans examiner to assign.");
  return { examinerId };
}

export function parseReassign(raw: unknown, facts: ApplicationFacts): ParsedInputs["reassign"] {
  const examinerId = field(raw, "examinerId");
  if (!isUserId(examinerId)) invalid("Choose the plans examiner to assign.");
  if (examinerId === facts.assignedExaminerId) invalid("The review is already assigned to that examiner.");
  const reason = field(raw, "reason");
  const text = typeof reason === "string" ? reason.trim() : "";
  if (text === "") invalid("Give a reason for the reassignment.");
  return { examinerId, reason: text };
}

export function parseConditions(
  raw: unknown,
  facts: ApplicationFacts,
): ParsedInputs["approve_with_conditions"] {
  const conditions = field(raw, "conditions");
  if (!Array.isArray(conditions) || conditions.length === 0) {
    invalid("List at least one condition of approval.");
  }
  const openIds = new Set(facts.openComments.map((c) => c.id));
  return {
    conditions: conditions.map((condition: unknown, i) => {
      const text = field(condition, "text");
      const trimmed = typeof text === "string" ? text.trim() : "";
      if (trimmed === "") invalid(`Condition ${i + 1} is empty.`);
      const carries = field(condition, "carriesCommentId") ?? null;
      if (carries !== null && !(typeof carries === "number" && openIds.has(carries))) {
        invalid(`Condition ${i + 1} carries a comment that is not open.`);
      }
      return { text: trimmed, carriesCommentId: carries };
    }),
  };
}

export function parseWithdraw(raw: unknown): ParsedInputs["withdraw"] {
  const reason = field(raw, "reason") ?? null;
  if (reason !== null && typeof reason !== "string") invalid("The reason for withdrawing must be text.");
  const text = reason?.trim() ?? "";
  return { reason: text === "" ? null : text };
}
