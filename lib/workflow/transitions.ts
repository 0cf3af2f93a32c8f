// The review workflow as one table. Read it top-down: each row is one event — where it may
// start, where it ends, who may fire it, what must hold first, and what it owes (audit line,
// e-mails, review cycle). `transition()` executes a row; `availableActions()` asks the same
// rows which buttons to show. The server and the screen never decide on their own.

import { WorkflowError, type ForbiddenReason } from "@/lib/workflow/errors";
import type { Notice, NoticeTemplate, RecipientKind, TransitionEffects } from "@/lib/workflow/effects";
import {
  EVENTS,
  EVENT_LABELS,
  EVENT_REQUIRES,
  type EventInputs,
  type InputField,
  type ParsedInputs,
  type WorkflowEvent,
} from "@/lib/workflow/events";
import type { Actor, ApplicationFacts } from "@/lib/workflow/facts";
import {
  everyOpenCommentAnswered,
  everyOpenCommentCarried,
  feePaid,
  firstBlocking,
  hasOpenComment,
  noOpenComments,
} from "@/lib/workflow/guards";
import {
  noInput,
  parseAccept,
  parseConditions,
  parseReassign,
  parseReturnReasons,
  parseWithdraw,
} from "@/lib/workflow/inputs";
import { ROLE_LABELS, type Role } from "@/lib/workflow/roles";
import { STATES, STATE_INFO, stateLabel, type State } from "@/lib/workflow/states";

/**
 * Beyond the role, whose application it must be. Technicians work the whole intake queue.
 * A supervising examiner may act on any review as its examiner (signing off is part of the
 * job: common practice, no source); the audit line says so when they do. The administrator
 * appears in no row's `by`, so fires no event.
 */
export const ACTS_ON: Record<Role, "own_application" | "assigned_review" | "any_application"> = {
  applicant: "own_application",
  technician: "any_application",
  examiner: "assigned_review",
  supervisor: "any_application",
  admin: "any_application",
};

interface NoticeRule {
  template: NoticeTemplate;
  to: RecipientKind;
  /** send only when leaving one of these states */
  onlyFrom?: readonly State[];
}

interface SummaryContext<E extends WorkflowEvent> {
  actor: Actor;
  facts: ApplicationFacts;
  input: ParsedInputs[E];
}

interface RuleHead {
  from: readonly State[];
  /** null: the state does not change */
  to: State | null;
  by: readonly Role[];
  /** checked on the facts alone, so a disabled button can say why */
  guard?: (facts: ApplicationFacts) => string | null;
}

export interface TransitionRule<E extends WorkflowEvent> extends RuleHead {
  input: (raw: unknown, facts: ApplicationFacts) => ParsedInputs[E];
  /** checked against what was entered, where the rule depends on it */
  inputGuard?: (facts: ApplicationFacts, input: ParsedInputs[E]) => string | null;
  startsCycle?: true;
  assigns?: (input: ParsedInputs[E]) => number;
  audit: { type: string; summary: (context: SummaryContext<E>) => string };
  notify: readonly NoticeRule[];
}

const NOT_FINAL: readonly State[] = STATES.filter((s) => !STATE_INFO[s].final);

export const TRANSITIONS: { readonly [E in WorkflowEvent]: TransitionRule<E> } = {
  submit: {
    from: ["draft", "returned_incomplete"],
    to: "submitted",
    by: ["applicant"],
    input: noInput,
    audit: {
      type: "application.submitted",
      summary: ({ facts }) =>
        facts.state === "returned_incomplete"
          ? "Submitted again for intake after being returned as incomplete."
          : "Submitted for intake.",
    },
    notify: [
      { template: "intake.receipt", to: "applicant" },
      { template: "intake.new_submission", to: "technicians" },
    ],
  },

  // A refusal is in writing with its reasons (IBC 2021 §105.3.1; from memory).
  return_incomplete: {
    from: ["submitted"],
    to: "returned_incomplete",
    by: ["technician"],
    input: parseReturnReasons,
    audit: {
      type: "application.returned_incomplete",
      summary: ({ input }) => `Returned as incomplete: ${input.reasons.join("; ")}`,
    },
    notify: [{ template: "intake.returned_incomplete", to: "applicant" }],
  },

  accept: {
    from: ["submitted"],
    to: "in_review",
    by: ["technician"],
    input: parseAccept,
    startsCycle: true,
    assigns: (input) => input.examinerId,
    audit: {
      type: "application.accepted",
      summary: ({ facts, input }) =>
        `Accepted for plan review and assigned to plans examiner #${input.examinerId}; review cycle ${facts.cycle + 1} started.`,
    },
    notify: [
      { template: "intake.accepted", to: "applicant" },
      { template: "review.assigned", to: "assigned_examiner" },
    ],
  },

  issue_corrections: {
    from: ["in_review"],
    to: "corrections_issued",
    by: ["examiner", "supervisor"],
    guard: firstBlocking(feePaid, hasOpenComment),
    input: noInput,
    audit: {
      type: "review.corrections_issued",
      summary: ({ actor, facts }) =>
        `Corrections issued in review cycle ${facts.cycle}: ${count(facts.openComments.length, "open comment")}${onBehalf(actor, facts)}.`,
    },
    notify: [{ template: "review.corrections_issued", to: "applicant" }],
  },

  resubmit: {
    from: ["corrections_issued"],
    to: "resubmitted",
    by: ["applicant"],
    guard: everyOpenCommentAnswered,
    input: noInput,
    startsCycle: true,
    audit: {
      type: "application.resubmitted",
      summary: ({ facts }) =>
        `Resubmitted with responses to ${count(facts.openComments.length, "comment")}; review cycle ${facts.cycle + 1} started.`,
    },
    notify: [{ template: "review.resubmitted", to: "assigned_examiner" }],
  },

  begin_review: {
    from: ["resubmitted"],
    to: "in_review",
    by: ["examiner", "supervisor"],
    guard: feePaid,
    input: noInput,
    audit: {
      type: "review.begun",
      summary: ({ actor, facts }) => `Review of cycle ${facts.cycle} begun${onBehalf(actor, facts)}.`,
    },
    // The examiner who begins is the one who acts next: no notice to themselves.
    notify: [],
  },

  approve: {
    from: ["in_review"],
    to: "approved",
    by: ["examiner", "supervisor"],
    guard: firstBlocking(feePaid, noOpenComments),
    input: noInput,
    audit: {
      type: "review.approved",
      summary: ({ actor, facts }) => `Approved in review cycle ${facts.cycle}${onBehalf(actor, facts)}.`,
    },
    notify: [{ template: "review.approved", to: "applicant" }],
  },

  // Conditions and deferred submittals are listed with the approval (IBC 2021 §107.3.4.1; from memory).
  approve_with_conditions: {
    from: ["in_review"],
    to: "approved_with_conditions",
    by: ["examiner", "supervisor"],
    guard: feePaid,
    input: parseConditions,
    inputGuard: everyOpenCommentCarried,
    audit: {
      type: "review.approved_with_conditions",
      summary: ({ actor, facts, input }) =>
        `Approved with ${count(input.conditions.length, "condition")} in review cycle ${facts.cycle}${onBehalf(actor, facts)}: ` +
        input.conditions.map((c) => c.text).join("; "),
    },
    notify: [{ template: "review.approved_with_conditions", to: "applicant" }],
  },

  withdraw: {
    from: NOT_FINAL,
    to: "withdrawn",
    by: ["applicant"],
    input: parseWithdraw,
    audit: {
      type: "application.withdrawn",
      summary: ({ facts, input }) =>
        `Withdrawn by the applicant from "${stateLabel(facts.state)}"` + (input.reason ? `: ${input.reason}` : "."),
    },
    // Whoever in the department holds or last held the file; drafts concern no one.
    notify: [
      { template: "application.withdrawn", to: "technicians", onlyFrom: ["submitted"] },
      { template: "application.withdrawn", to: "assigned_examiner", onlyFrom: ["in_review", "corrections_issued", "resubmitted"] },
    ],
  },

  reassign: {
    from: ["in_review", "resubmitted"],
    to: null,
    by: ["supervisor"],
    input: parseReassign,
    assigns: (input) => input.examinerId,
    audit: {
      type: "review.reassigned",
      // The reason is internal (kept in the audit detail): applicants see this summary.
      summary: ({ facts, input }) =>
        `Review reassigned from plans examiner #${facts.assignedExaminerId ?? "none"} to plans examiner #${input.examinerId}.`,
    },
    notify: [
      { template: "review.assigned", to: "assigned_examiner" },
      { template: "review.reassigned_away", to: "previous_examiner" },
    ],
  },
};

function count(n: number, noun: string): string {
  return `${n} ${noun}${n === 1 ? "" : "s"}`;
}

function onBehalf(actor: Actor, facts: ApplicationFacts): string {
  return actor.role === "supervisor" && actor.id !== facts.assignedExaminerId
    ? " by a supervising examiner"
    : "";
}

/** Role, ownership and state, in that order: a stranger learns nothing about the state. */
function refusal(actor: Actor, facts: ApplicationFacts, event: WorkflowEvent, rule: RuleHead): WorkflowError | null {
  const label = EVENT_LABELS[event];
  if (!rule.by.includes(actor.role)) {
    return forbidden(`"${label}" is not open to the ${ROLE_LABELS[actor.role].toLowerCase()} role.`, "role");
  }
  const scope = ACTS_ON[actor.role];
  if (scope === "own_application" && facts.applicantId !== actor.id) {
    return forbidden("This application belongs to another applicant.", "not_owner");
  }
  if (scope === "assigned_review" && facts.assignedExaminerId !== actor.id) {
    return forbidden("This application is not assigned to you for review.", "not_assigned");
  }
  if (!rule.from.includes(facts.state)) {
    return new WorkflowError("invalid_transition", `"${label}" is not possible from "${stateLabel(facts.state)}".`);
  }
  return null;
}

function forbidden(message: string, reason: ForbiddenReason): WorkflowError {
  return new WorkflowError("forbidden", message, reason);
}

function clockEffect(from: State, to: State): TransitionEffects["clock"] {
  const before = STATE_INFO[from].reviewClock;
  const after = STATE_INFO[to].reviewClock;
  if (before === after) return null;
  return after ? "start" : "stop";
}

function resolveNotices(
  rules: readonly NoticeRule[],
  facts: ApplicationFacts,
  examinerAfter: number | null,
): Notice[] {
  const notices: Notice[] = [];
  for (const rule of rules) {
    if (rule.onlyFrom && !rule.onlyFrom.includes(facts.state)) continue;
    const userId =
      rule.to === "applicant"
        ? facts.applicantId
        : rule.to === "assigned_examiner"
          ? examinerAfter
          : rule.to === "previous_examiner"
            ? facts.assignedExaminerId
            : null;
    const isPerson = rule.to === "applicant" || rule.to === "assigned_examiner" || rule.to === "previous_examiner";
    if (isPerson && userId === null) continue;
    notices.push({ template: rule.template, to: rule.to, userId });
  }
  return notices;
}

export interface TransitionResult<E extends WorkflowEvent> {
  event: E;
  from: State;
  /** equal to `from` for events that change no state (reassign) */
  to: State;
  /** the input as checked: trimmed, optional parts explicit */
  input: ParsedInputs[E];
  effects: TransitionEffects;
}

/**
 * Decide one event. Throws WorkflowError: forbidden, invalid_transition, invalid_input or
 * guard_failed, checked in that order. Pure: `facts` is not modified.
 */
export function transition<E extends WorkflowEvent>(
  actor: Actor,
  facts: ApplicationFacts,
  event: E,
  input?: EventInputs[E],
): TransitionResult<E> {
  const rule: TransitionRule<E> = TRANSITIONS[event];
  const refused = refusal(actor, facts, event, rule);
  if (refused) throw refused;

  const parsed = rule.input(input, facts);
  const blocked = rule.guard?.(facts) ?? rule.inputGuard?.(facts, parsed) ?? null;
  if (blocked !== null) throw new WorkflowError("guard_failed", blocked);

  const to = rule.to ?? facts.state;
  const assignedTo = rule.assigns?.(parsed);
  const examinerAfter = assignedTo ?? facts.assignedExaminerId;
  return {
    event,
    from: facts.state,
    to,
    input: parsed,
    effects: {
      audit: { type: rule.audit.type, summary: rule.audit.summary({ actor, facts, input: parsed }) },
      notices: resolveNotices(rule.notify, facts, examinerAfter),
      clock: clockEffect(facts.state, to),
      cycle: rule.startsCycle ? { start: facts.cycle + 1 } : null,
      assignment:
        assignedTo === undefined ? null : { examinerId: assignedTo, previousExaminerId: facts.assignedExaminerId },
    },
  };
}

export interface AvailableAction {
  event: WorkflowEvent;
  label: string;
  /** false: show the button disabled with `blockedBy` */
  allowed: boolean;
  blockedBy?: string;
  /** input to collect before calling transition() */
  requires: readonly InputField[];
}

/**
 * The events this actor could fire now, in table order: role, ownership and state allow them.
 * Guards on the facts are reported, not filtered, so the screen can say what is missing.
 * Checks on the input itself (reasons, conditions) happen when transition() is called.
 */
export function availableActions(actor: Actor, facts: ApplicationFacts): AvailableAction[] {
  const actions: AvailableAction[] = [];
  for (const event of EVENTS) {
    const rule: RuleHead = TRANSITIONS[event];
    if (refusal(actor, facts, event, rule)) continue;
    const blockedBy = rule.guard?.(facts) ?? null;
    actions.push({
      event,
      label: EVENT_LABELS[event],
      allowed: blockedBy === null,
      ...(blockedBy === null ? {} : { blockedBy }),
      requires: EVENT_REQUIRES[event],
    });
  }
  return actions;
}
