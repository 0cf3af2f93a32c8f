import { describe, expect, it } from "vitest";

import { availableActions, transition, type ApplicationFacts } from "@/lib/workflow";
import {
  ACTORS,
  ACTOR_KEYS,
  ALL_EVENTS,
  ALL_STATES,
  EXAMINER_ID,
  OWNER_ID,
  attempt,
  comment,
  validInput,
} from "@/tests/unit/workflow/workflow-fixtures";

// The buttons on screen and the server must agree (style rule 7): a button is shown exactly
// when transition() would get past role, ownership and state, and enabled exactly when it
// would succeed with proper input; a disabled one carries the guard's message.

const COMMENT_SETS = {
  none: [],
  oneUnanswered: [comment(21, 1, false)],
  oneAnswered: [comment(21, 1, true)],
  mixed: [comment(21, 1, true), comment(22, 2, false)],
} as const;

const CASES = ALL_STATES.flatMap((state) =>
  ACTOR_KEYS.flatMap((key) =>
    (Object.keys(COMMENT_SETS) as (keyof typeof COMMENT_SETS)[]).flatMap((comments) =>
      [EXAMINER_ID, null].map((examiner) => [state, key, comments, examiner] as const),
    ),
  ),
);

describe("availableActions agrees with transition", () => {
  it.each(CASES)("%s × %s × comments %s × examiner %s", (state, key, comments, examiner) => {
    const facts: ApplicationFacts = {
      state,
      applicantId: OWNER_ID,
      assignedExaminerId: examiner,
      cycle: examiner === null ? 0 : 1,
      openComments: COMMENT_SETS[comments],
      unpaidFee: null,
    };
    const actor = ACTORS[key];
    const shown = new Map(availableActions(actor, facts).map((a) => [a.event, a]));

    for (const event of ALL_EVENTS) {
      const outcome = attempt(actor, facts, event, validInput(event, facts));
      const action = shown.get(event);
      if (outcome.ok) {
        expect({ event, allowed: action?.allowed, blockedBy: action?.blockedBy }).toEqual({ event, allowed: true });
      } else if (outcome.code === "guard_failed") {
        expect({ event, allowed: action?.allowed, blockedBy: action?.blockedBy }).toEqual({
          event,
          allowed: false,
          blockedBy: outcome.message,
        });
      } else {
        expect({ event, code: outcome.code, shown: action !== undefined }).toEqual({ event, code: outcome.code, shown: false });
      }
    }
  });

  it("lists each event once, in table order", () => {
    const facts: ApplicationFacts = {
      state: "in_review",
      applicantId: OWNER_ID,
      assignedExaminerId: EXAMINER_ID,
      cycle: 1,
      openComments: [],
      unpaidFee: null,
    };
    expect(availableActions(ACTORS.supervisor, facts).map((a) => a.event)).toEqual([
      "issue_corrections",
      "approve",
      "approve_with_conditions",
      "reassign",
    ]);
  });
});

// What each person sees on the application page, written out by hand.
describe("the buttons people see", () => {
  const facts = (state: ApplicationFacts["state"], openComments: ApplicationFacts["openComments"] = []): ApplicationFacts => ({
    state,
    applicantId: OWNER_ID,
    assignedExaminerId: ["draft", "submitted", "returned_incomplete"].includes(state) ? null : EXAMINER_ID,
    cycle: 1,
    openComments,
    unpaidFee: null,
  });
  const summary = (key: keyof typeof ACTORS, f: ApplicationFacts) =>
    availableActions(ACTORS[key], f).map((a) => (a.allowed ? a.event : `${a.event} (disabled: ${a.blockedBy})`));

  it("the applicant with corrections to answer: resubmit is disabled and says why", () => {
    expect(summary("owner", facts("corrections_issued", [comment(3, 3, false)]))).toEqual([
      "resubmit (disabled: Respond to every open comment before resubmitting: comment 3 has no response.)",
      "withdraw",
    ]);
  });

  it("the applicant with a draft", () => {
    expect(summary("owner", facts("draft"))).toEqual(["submit", "withdraw"]);
  });

  it("the technician at intake, who must give reasons or pick an examiner", () => {
    const actions = availableActions(ACTORS.technician, facts("submitted"));
    expect(actions.map((a) => [a.event, a.requires])).toEqual([
      ["return_incomplete", ["reasons"]],
      ["accept", ["examinerId"]],
    ]);
  });

  it("the assigned examiner with one open comment", () => {
    expect(summary("examiner", facts("in_review", [comment(9, 1, false)]))).toEqual([
      "issue_corrections",
      "approve (disabled: Resolve every open comment before approving: comment 1 is still open. To approve with open comments, approve with conditions and carry each one as a condition.)",
      "approve_with_conditions",
    ]);
  });

  it("the assigned examiner with an empty list: corrections disabled, approval open", () => {
    expect(summary("examiner", facts("in_review"))).toEqual([
      "issue_corrections (disabled: Write at least one correction comment before issuing corrections.)",
      "approve",
      "approve_with_conditions",
    ]);
  });

  it("the examiner when the resubmittal arrives", () => {
    expect(summary("examiner", facts("resubmitted"))).toEqual(["begin_review"]);
  });

  // Where the department reviews only after payment, the fee is the first thing named.
  const WAITS = "Plan review waits for the fee: invoice INV-26-00031 ($1,021.94) is not paid yet, and this department reviews only after payment.";
  const unpaid = (f: ApplicationFacts): ApplicationFacts => ({ ...f, unpaidFee: { invoiceNumber: "INV-26-00031", totalCents: 102_194 } });

  it("the examiner while the fee is unpaid: every review step disabled with the invoice and amount", () => {
    expect(summary("examiner", unpaid(facts("in_review", [comment(9, 1, false)])))).toEqual([
      `issue_corrections (disabled: ${WAITS})`,
      `approve (disabled: ${WAITS})`,
      `approve_with_conditions (disabled: ${WAITS})`,
    ]);
    expect(summary("examiner", unpaid(facts("resubmitted")))).toEqual([`begin_review (disabled: ${WAITS})`]);
  });

  it("an unpaid fee holds no one else up: the applicant may withdraw or resubmit, the supervisor reassign", () => {
    expect(summary("owner", unpaid(facts("in_review")))).toEqual(["withdraw"]);
    expect(summary("owner", unpaid(facts("corrections_issued", [comment(3, 3, true)])))).toEqual(["resubmit", "withdraw"]);
    expect(summary("supervisor", unpaid(facts("in_review"))).filter((a) => !a.includes("disabled"))).toEqual(["reassign"]);
  });

  it("the server refuses a review step while the fee is unpaid, naming the invoice", () => {
    expect(() => transition(ACTORS.examiner, unpaid(facts("in_review")), "approve")).toThrow(WAITS);
    expect(() => transition(ACTORS.examiner, unpaid(facts("in_review")), "approve_with_conditions", { conditions: [{ text: "Deferred submittal: truss drawings." }] })).toThrow(WAITS);
    expect(transition(ACTORS.examiner, facts("in_review"), "approve").to).toBe("approved");
  });

  it("nobody else sees a button on someone else's file, and no one on a closed file", () => {
    for (const state of ALL_STATES) {
      expect(summary("otherApplicant", facts(state))).toEqual([]);
      expect(summary("otherExaminer", facts(state))).toEqual([]);
      expect(summary("admin", facts(state))).toEqual([]);
    }
    for (const key of ACTOR_KEYS) {
      expect(summary(key, facts("approved"))).toEqual([]);
      expect(summary(key, facts("approved_with_conditions"))).toEqual([]);
      expect(summary(key, facts("withdrawn"))).toEqual([]);
    }
  });
});
