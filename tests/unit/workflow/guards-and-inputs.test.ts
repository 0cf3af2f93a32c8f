import { describe, expect, it } from "vitest";

import { WorkflowError, transition, type ApplicationFacts, type WorkflowEvent } from "@/lib/workflow";
import {
  ACTORS,
  EXAMINER_ID,
  attempt,
  comment,
  passingFacts,
  type ActorKey,
} from "@/tests/unit/workflow/workflow-fixtures";

// Guards from issue 4: no correction list with zero open comments, no plain approval with
// open comments, an approval with conditions lists them; the response letter answers every
// comment by number (common practice, no source). Messages must name what is missing.

function refusal(key: ActorKey, facts: ApplicationFacts, event: WorkflowEvent, input?: unknown) {
  const outcome = attempt(ACTORS[key], facts, event, input);
  return outcome.ok ? `moved to ${outcome.result.to}` : { code: outcome.code, message: outcome.message };
}

const inReview = (openComments: ApplicationFacts["openComments"]): ApplicationFacts => ({
  ...passingFacts("in_review", "approve"),
  openComments,
});
const awaitingResponse = (openComments: ApplicationFacts["openComments"]): ApplicationFacts => ({
  ...passingFacts("corrections_issued", "resubmit"),
  openComments,
});

describe("guard: issue corrections", () => {
  it("refuses an empty correction list", () => {
    expect(refusal("examiner", inReview([]), "issue_corrections")).toEqual({
      code: "guard_failed",
      message: "Write at least one correction comment before issuing corrections.",
    });
  });

  it("counts a comment carried unresolved from an earlier cycle", () => {
    const facts = { ...inReview([comment(40, 2, true)]), cycle: 2 };
    expect(refusal("examiner", facts, "issue_corrections")).toBe("moved to corrections_issued");
  });
});

describe("guard: resubmit", () => {
  it("names the one comment without a response", () => {
    expect(refusal("owner", awaitingResponse([comment(1, 1, true), comment(3, 3, false)]), "resubmit")).toEqual({
      code: "guard_failed",
      message: "Respond to every open comment before resubmitting: comment 3 has no response.",
    });
  });

  it("names several in list order, whatever order they arrive in", () => {
    const facts = awaitingResponse([comment(7, 7, false), comment(2, 2, false), comment(4, 4, true), comment(5, 5, false)]);
    expect(refusal("owner", facts, "resubmit")).toEqual({
      code: "guard_failed",
      message: "Respond to every open comment before resubmitting: comments 2, 5 and 7 have no response.",
    });
  });

  it("uses 'and' for two", () => {
    const facts = awaitingResponse([comment(8, 8, false), comment(9, 9, false)]);
    expect(refusal("owner", facts, "resubmit")).toEqual({
      code: "guard_failed",
      message: "Respond to every open comment before resubmitting: comments 8 and 9 have no response.",
    });
  });

  it("lets the applicant resubmit once every comment is answered", () => {
    expect(refusal("owner", awaitingResponse([comment(1, 1, true), comment(2, 2, true)]), "resubmit")).toBe(
      "moved to resubmitted",
    );
  });
});

describe("guard: approve", () => {
  it("refuses a plain approval with a comment open, and points to approval with conditions", () => {
    expect(refusal("examiner", inReview([comment(14, 4, true)]), "approve")).toEqual({
      code: "guard_failed",
      message:
        "Resolve every open comment before approving: comment 4 is still open. " +
        "To approve with open comments, approve with conditions and carry each one as a condition.",
    });
  });

  it("names every open comment", () => {
    const refused = refusal("supervisor", inReview([comment(16, 6, false), comment(14, 4, true)]), "approve");
    expect(refused).toMatchObject({ code: "guard_failed" });
    expect(JSON.stringify(refused)).toContain("comments 4 and 6 are still open.");
  });
});

describe("guard: approve with conditions", () => {
  const open = [comment(14, 4, true), comment(16, 6, true)];

  it("refuses to let an open comment vanish: each must be carried by a condition", () => {
    const input = { conditions: [{ text: "Field-verify the header bearing length", carriesCommentId: 14 }] };
    expect(refusal("examiner", inReview(open), "approve_with_conditions", input)).toEqual({
      code: "guard_failed",
      message:
        "Carry every open comment as a condition, or resolve it, before approving with conditions: " +
        "comment 6 is still open and not carried by any condition.",
    });
  });

  it("accepts when every open comment is carried", () => {
    const input = {
      conditions: [
        { text: "Field-verify the header bearing length", carriesCommentId: 14 },
        { text: "Submit the hold-down schedule before framing inspection", carriesCommentId: 16 },
      ],
    };
    const result = transition(ACTORS.examiner, inReview(open), "approve_with_conditions", input);
    expect(result.input.conditions).toEqual([
      { text: "Field-verify the header bearing length", carriesCommentId: 14 },
      { text: "Submit the hold-down schedule before framing inspection", carriesCommentId: 16 },
    ]);
  });
});

describe("invalid input", () => {
  const submitted = passingFacts("submitted", "accept");
  const reviewing = passingFacts("in_review", "reassign");

  it.each([
    ["no input", undefined, "Give at least one reason for returning the application as incomplete."],
    ["no reasons", { reasons: [] }, "Give at least one reason for returning the application as incomplete."],
    ["reasons not a list", { reasons: "missing calcs" }, "Give at least one reason for returning the application as incomplete."],
    ["a blank reason", { reasons: ["Seal missing on S-2", "   "] }, "Reason 2 is empty."],
    ["a reason that is not text", { reasons: [42] }, "Reason 1 is empty."],
  ])("return as incomplete with %s", (_, input, message) => {
    expect(refusal("technician", submitted, "return_incomplete", input)).toEqual({ code: "invalid_input", message });
  });

  it.each([
    ["no input", undefined],
    ["no examiner", {}],
    ["examiner id 0", { examinerId: 0 }],
    ["a negative id", { examinerId: -3 }],
    ["a fractional id", { examinerId: 20.5 }],
    ["an id as text", { examinerId: "201" }],
  ])("accept with %s", (_, input) => {
    expect(refusal("technician", submitted, "accept", input)).toEqual({
      code: "invalid_input",
      message: "Choose the plans examiner to assign.",
    });
  });

  it.each([
    ["no examiner", { reason: "Workload" }, "Choose the plans examiner to assign."],
    ["the same examiner", { examinerId: EXAMINER_ID, reason: "Workload" }, "The review is already assigned to that examiner."],
    ["no reason", { examinerId: 209 }, "Give a reason for the reassignment."],
    ["a blank reason", { examinerId: 209, reason: "  " }, "Give a reason for the reassignment."],
  ])("reassign with %s", (_, input, message) => {
    expect(refusal("supervisor", reviewing, "reassign", input)).toEqual({ code: "invalid_input", message });
  });

  it.each([
    ["no input", undefined, "List at least one condition of approval."],
    ["no conditions", { conditions: [] }, "List at least one condition of approval."],
    ["a blank condition", { conditions: [{ text: "Deferred submittal: guardrail posts" }, { text: " " }] }, "Condition 2 is empty."],
    ["a condition without text", { conditions: [{}] }, "Condition 1 is empty."],
    ["a carried comment that is not open", { conditions: [{ text: "Verify", carriesCommentId: 99 }] }, "Condition 1 carries a comment that is not open."],
    ["a carried comment id as text", { conditions: [{ text: "Verify", carriesCommentId: "14" }] }, "Condition 1 carries a comment that is not open."],
  ])("approve with conditions with %s", (_, input, message) => {
    const facts = inReview([comment(14, 4, true)]);
    expect(refusal("examiner", facts, "approve_with_conditions", input)).toEqual({ code: "invalid_input", message });
  });

  it("withdraw with a reason that is not text", () => {
    expect(refusal("owner", passingFacts("draft", "withdraw"), "withdraw", { reason: 5 })).toEqual({
      code: "invalid_input",
      message: "The reason for withdrawing must be text.",
    });
  });

  it("withdraw takes no reason, or a blank one, as none", () => {
    const facts = passingFacts("draft", "withdraw");
    const none = attempt(ACTORS.owner, facts, "withdraw", undefined);
    const blank = attempt(ACTORS.owner, facts, "withdraw", { reason: "  " });
    expect([none.ok && none.result.input, blank.ok && blank.result.input]).toEqual([{ reason: null }, { reason: null }]);
  });
});

describe("WorkflowError", () => {
  it("is a real Error with its code, and the forbidden reason", () => {
    let caught: unknown;
    try {
      transition(ACTORS.otherApplicant, passingFacts("draft", "submit"), "submit");
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(WorkflowError);
    expect(caught).toBeInstanceOf(Error);
    expect(caught).toMatchObject({
      name: "WorkflowError",
      code: "forbidden",
      reason: "not_owner",
      message: "This application belongs to another applicant.",
    });
  });
});
