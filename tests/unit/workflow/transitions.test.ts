import { describe, expect, it } from "vitest";

import { EVENTS, STATES, STATE_INFO, type Role, type State, type WorkflowEvent } from "@/lib/workflow";
import {
  ACTORS,
  ACTOR_KEYS,
  ALL_EVENTS,
  ALL_STATES,
  EXAMINER_ID,
  NEW_EXAMINER_ID,
  OWNER_ID,
  attempt,
  comment,
  deepFreeze,
  passingFacts,
  validInput,
  type ActorKey,
} from "@/tests/unit/workflow/workflow-fixtures";

// Expectations written out by hand from the department's road as issue 4 describes it:
// intake screen → review → corrections ↔ resubmittal → approval (with or without
// conditions); withdrawal from anywhere not yet closed (common practice, no source).
const X = "-";

// Target state of each event from each state, for an actor who may fire it.
// Columns follow ALL_EVENTS: submit, return_incomplete, accept, issue_corrections, resubmit,
// begin_review, approve, approve_with_conditions, withdraw, reassign.
const NEXT: Record<State, readonly string[]> = {
  draft:                    ["submitted", X, X, X, X, X, X, X, "withdrawn", X],
  submitted:                [X, "returned_incomplete", "in_review", X, X, X, X, X, "withdrawn", X],
  returned_incomplete:      ["submitted", X, X, X, X, X, X, X, "withdrawn", X],
  in_review:                [X, X, X, "corrections_issued", X, X, "approved", "approved_with_conditions", "withdrawn", "in_review"],
  corrections_issued:       [X, X, X, X, "resubmitted", X, X, X, "withdrawn", X],
  resubmitted:              [X, X, X, X, X, "in_review", X, X, "withdrawn", "resubmitted"],
  approved:                 [X, X, X, X, X, X, X, X, X, X],
  approved_with_conditions: [X, X, X, X, X, X, X, X, X, X],
  withdrawn:                [X, X, X, X, X, X, X, X, X, X],
};

// Which roles may fire each event. A supervising examiner may sign off any review as its
// examiner (common practice, no source); the permit technician runs intake.
const FIRED_BY: Record<WorkflowEvent, readonly Role[]> = {
  submit: ["applicant"],
  return_incomplete: ["technician"],
  accept: ["technician"],
  issue_corrections: ["examiner", "supervisor"],
  resubmit: ["applicant"],
  begin_review: ["examiner", "supervisor"],
  approve: ["examiner", "supervisor"],
  approve_with_conditions: ["examiner", "supervisor"],
  withdraw: ["applicant"],
  reassign: ["supervisor"],
};

function target(state: State, event: WorkflowEvent): string {
  const column = ALL_EVENTS.indexOf(event);
  const value = NEXT[state][column];
  if (value === undefined) throw new Error(`no column for ${event}`);
  return value;
}

type Expected = { to: string } | { code: string; reason?: string };

function expected(state: State, event: WorkflowEvent, key: ActorKey): Expected {
  const actor = ACTORS[key];
  const facts = passingFacts(state, event);
  if (!FIRED_BY[event].includes(actor.role)) return { code: "forbidden", reason: "role" };
  // Only the owner acts as applicant; only the assigned examiner acts as examiner.
  if (actor.role === "applicant" && actor.id !== OWNER_ID) return { code: "forbidden", reason: "not_owner" };
  if (actor.role === "examiner" && facts.assignedExaminerId !== actor.id) return { code: "forbidden", reason: "not_assigned" };
  const to = target(state, event);
  return to === X ? { code: "invalid_transition" } : { to };
}

describe("workflow vocabulary", () => {
  it("has exactly the states and events the expectations cover", () => {
    expect([...STATES]).toEqual([...ALL_STATES]);
    expect([...EVENTS]).toEqual([...ALL_EVENTS]);
  });

  it("marks approved, approved with conditions and withdrawn as the only final states", () => {
    const finals = ALL_STATES.filter((s) => STATE_INFO[s].final);
    expect(finals).toEqual(["approved", "approved_with_conditions", "withdrawn"]);
  });

  // The review clock counts days with the department after intake; it stops while the
  // applicant holds the file (common practice, no source; published turnaround targets
  // count agency days only).
  it.each([
    ["draft", "applicant", false],
    ["submitted", "department", false],
    ["returned_incomplete", "applicant", false],
    ["in_review", "department", true],
    ["corrections_issued", "applicant", false],
    ["resubmitted", "department", true],
    ["approved", "closed", false],
    ["approved_with_conditions", "closed", false],
    ["withdrawn", "closed", false],
  ] as const)("%s is held by the %s side, review clock running: %s", (state, holder, clock) => {
    expect(STATE_INFO[state].holder).toBe(holder);
    expect(STATE_INFO[state].reviewClock).toBe(clock);
  });
});

const COMBINATIONS = ALL_STATES.flatMap((state) =>
  ALL_EVENTS.flatMap((event) => ACTOR_KEYS.map((key) => [state, event, key] as const)),
);

describe("every (state, event, actor)", () => {
  it("covers 9 states × 10 events × 7 actors", () => {
    expect(COMBINATIONS).toHaveLength(9 * 10 * 7);
  });

  it.each(COMBINATIONS)("%s × %s × %s", (state, event, key) => {
    const facts = deepFreeze(passingFacts(state, event));
    const outcome = attempt(ACTORS[key], facts, event, validInput(event, facts));
    const want = expected(state, event, key);
    if ("to" in want) {
      expect(outcome.ok ? { to: outcome.result.to, from: outcome.result.from } : outcome).toEqual({ to: want.to, from: state });
    } else {
      expect(outcome.ok ? outcome.result : { code: outcome.code, reason: outcome.reason }).toEqual({
        code: want.code,
        reason: want.reason,
      });
    }
  });
});

// The effects owed by each allowed (from state, event), written out by hand.
// Notices: who must act next or must stop; clock and cycle as in the vocabulary tests.
interface EffectsExpected {
  audit: string;
  notices: string[];
  clock: "start" | "stop" | null;
  cycle: number | null;
  assignment: { examinerId: number; previousExaminerId: number | null } | null;
}

const to = (template: string, kind: string, id?: number) => `${template} → ${kind}${id === undefined ? "" : ` #${id}`}`;
const SUBMIT: EffectsExpected = {
  audit: "application.submitted",
  notices: [to("intake.receipt", "applicant", OWNER_ID), to("intake.new_submission", "technicians")],
  clock: null,
  cycle: null,
  assignment: null,
};
const withdrawn = (notices: string[], clock: "stop" | null): EffectsExpected => ({
  audit: "application.withdrawn",
  notices,
  clock,
  cycle: null,
  assignment: null,
});
const TELL_EXAMINER_WITHDRAWN = [to("application.withdrawn", "assigned_examiner", EXAMINER_ID)];
const REASSIGNED: EffectsExpected = {
  audit: "review.reassigned",
  notices: [to("review.assigned", "assigned_examiner", NEW_EXAMINER_ID), to("review.reassigned_away", "previous_examiner", EXAMINER_ID)],
  clock: null,
  cycle: null,
  assignment: { examinerId: NEW_EXAMINER_ID, previousExaminerId: EXAMINER_ID },
};

const EFFECTS: Record<string, EffectsExpected> = {
  "draft submit": SUBMIT,
  "returned_incomplete submit": SUBMIT,
  "submitted return_incomplete": {
    audit: "application.returned_incomplete",
    notices: [to("intake.returned_incomplete", "applicant", OWNER_ID)],
    clock: null,
    cycle: null,
    assignment: null,
  },
  "submitted accept": {
    audit: "application.accepted",
    notices: [to("intake.accepted", "applicant", OWNER_ID), to("review.assigned", "assigned_examiner", EXAMINER_ID)],
    clock: "start",
    cycle: 1,
    assignment: { examinerId: EXAMINER_ID, previousExaminerId: null },
  },
  "in_review issue_corrections": {
    audit: "review.corrections_issued",
    notices: [to("review.corrections_issued", "applicant", OWNER_ID)],
    clock: "stop",
    cycle: null,
    assignment: null,
  },
  "corrections_issued resubmit": {
    audit: "application.resubmitted",
    notices: [to("review.resubmitted", "assigned_examiner", EXAMINER_ID)],
    clock: "start",
    cycle: 2,
    assignment: null,
  },
  "resubmitted begin_review": { audit: "review.begun", notices: [], clock: null, cycle: null, assignment: null },
  "in_review approve": {
    audit: "review.approved",
    notices: [to("review.approved", "applicant", OWNER_ID)],
    clock: "stop",
    cycle: null,
    assignment: null,
  },
  "in_review approve_with_conditions": {
    audit: "review.approved_with_conditions",
    notices: [to("review.approved_with_conditions", "applicant", OWNER_ID)],
    clock: "stop",
    cycle: null,
    assignment: null,
  },
  "draft withdraw": withdrawn([], null),
  "submitted withdraw": withdrawn([to("application.withdrawn", "technicians")], null),
  "returned_incomplete withdraw": withdrawn([], null),
  "in_review withdraw": withdrawn(TELL_EXAMINER_WITHDRAWN, "stop"),
  "corrections_issued withdraw": withdrawn(TELL_EXAMINER_WITHDRAWN, null),
  "resubmitted withdraw": withdrawn(TELL_EXAMINER_WITHDRAWN, "stop"),
  "in_review reassign": REASSIGNED,
  "resubmitted reassign": REASSIGNED,
};

const ALLOWED_PAIRS = ALL_STATES.flatMap((state) =>
  ALL_EVENTS.filter((event) => target(state, event) !== X).map((event) => [state, event] as const),
);

/** The first actor key whose role may fire the event (as owner / assigned examiner). */
function firer(event: WorkflowEvent): ActorKey {
  const role = FIRED_BY[event][0];
  const key = ACTOR_KEYS.find((k) => ACTORS[k].role === role && k !== "otherApplicant" && k !== "otherExaminer");
  if (key === undefined) throw new Error(`no actor for ${event}`);
  return key;
}

describe("effects owed by each transition", () => {
  it("has an expectation for each of the 17 allowed (state, event) pairs", () => {
    expect(ALLOWED_PAIRS.map(([s, e]) => `${s} ${e}`).sort()).toEqual(Object.keys(EFFECTS).sort());
    expect(ALLOWED_PAIRS).toHaveLength(17);
  });

  it.each(ALLOWED_PAIRS)("%s × %s", (state, event) => {
    const facts = passingFacts(state, event);
    const outcome = attempt(ACTORS[firer(event)], facts, event, validInput(event, facts));
    if (!outcome.ok) throw new Error(outcome.message);
    const { effects } = outcome.result;
    expect({
      audit: effects.audit.type,
      notices: effects.notices.map((n) => to(n.template, n.to, n.userId ?? undefined)),
      clock: effects.clock,
      cycle: effects.cycle?.start ?? null,
      assignment: effects.assignment,
    }).toEqual(EFFECTS[`${state} ${event}`]);
    expect(effects.audit.summary.length).toBeGreaterThan(10);
  });
});

describe("audit summaries", () => {
  it("quote the technician's reasons for returning the file", () => {
    // IBC 2021 §105.3.1: a refusal is stated in writing with its reasons (from memory).
    const facts = passingFacts("submitted", "return_incomplete");
    const outcome = attempt(ACTORS.technician, facts, "return_incomplete", {
      reasons: [" No seal on sheet S-1 ", "Design loads per IBC 1603 missing from the drawings"],
    });
    if (!outcome.ok) throw new Error(outcome.message);
    expect(outcome.result.effects.audit.summary).toContain("No seal on sheet S-1; Design loads per IBC 1603 missing");
    expect(outcome.result.input).toEqual({
      reasons: ["No seal on sheet S-1", "Design loads per IBC 1603 missing from the drawings"],
    });
  });

  it("list the conditions of approval", () => {
    const facts = passingFacts("in_review", "approve_with_conditions");
    const outcome = attempt(ACTORS.examiner, facts, "approve_with_conditions", {
      conditions: [{ text: "Deferred submittal: stair stringer calculations" }, { text: "Special inspection of epoxy anchors" }],
    });
    if (!outcome.ok) throw new Error(outcome.message);
    expect(outcome.result.effects.audit.summary).toContain("2 conditions");
    expect(outcome.result.effects.audit.summary).toContain("stair stringer calculations; Special inspection of epoxy anchors");
  });

  it("say so when a supervising examiner signs off someone else's review", () => {
    const facts = passingFacts("in_review", "approve");
    const bySupervisor = attempt(ACTORS.supervisor, facts, "approve", undefined);
    const byExaminer = attempt(ACTORS.examiner, facts, "approve", undefined);
    if (!bySupervisor.ok || !byExaminer.ok) throw new Error("approval refused");
    expect(bySupervisor.result.effects.audit.summary).toContain("supervising examiner");
    expect(byExaminer.result.effects.audit.summary).not.toContain("supervising examiner");
  });

  it("keep the internal reason for a reassignment out of the summary applicants read", () => {
    const facts = passingFacts("in_review", "reassign");
    const outcome = attempt(ACTORS.supervisor, facts, "reassign", { examinerId: 207, reason: "Examiner on leave" });
    if (!outcome.ok) throw new Error(outcome.message);
    expect(outcome.result.effects.audit.summary).not.toContain("Examiner on leave");
    expect(outcome.result.input).toMatchObject({ reason: "Examiner on leave" });
    expect(outcome.result.to).toBe("in_review");
  });
});

describe("ownership", () => {
  const applicantEvents = ALL_EVENTS.filter((e) => FIRED_BY[e].includes("applicant"));
  const examinerEvents = ALL_EVENTS.filter((e) => FIRED_BY[e].includes("examiner"));

  it.each(ALL_STATES.flatMap((s) => applicantEvents.map((e) => [s, e] as const)))(
    "another applicant is refused %s × %s before the state is even considered",
    (state, event) => {
      const facts = passingFacts(state, event);
      const outcome = attempt(ACTORS.otherApplicant, facts, event, validInput(event, facts));
      expect(outcome.ok ? "moved" : [outcome.code, outcome.reason]).toEqual(["forbidden", "not_owner"]);
    },
  );

  it.each(ALL_STATES.flatMap((s) => examinerEvents.map((e) => [s, e] as const)))(
    "an examiner not assigned is refused %s × %s",
    (state, event) => {
      const facts = { ...passingFacts(state, event), assignedExaminerId: EXAMINER_ID };
      const outcome = attempt(ACTORS.otherExaminer, facts, event, validInput(event, facts));
      expect(outcome.ok ? "moved" : [outcome.code, outcome.reason]).toEqual(["forbidden", "not_assigned"]);
    },
  );

  it("an examiner cannot act on an application nobody is assigned to yet", () => {
    const facts = { ...passingFacts("in_review", "approve"), assignedExaminerId: null };
    const outcome = attempt(ACTORS.examiner, facts, "approve", undefined);
    expect(outcome.ok ? "moved" : outcome.reason).toBe("not_assigned");
  });
});

describe("order of checks", () => {
  it("role before state: a technician asking to approve a draft is forbidden", () => {
    const outcome = attempt(ACTORS.technician, passingFacts("draft", "approve"), "approve", undefined);
    expect(outcome.ok ? "moved" : [outcome.code, outcome.message]).toEqual([
      "forbidden",
      '"Approve" is not open to the permit technician role.',
    ]);
  });

  it("state before input: returning a file in review says the state, not the missing reasons", () => {
    const outcome = attempt(ACTORS.technician, passingFacts("in_review", "return_incomplete"), "return_incomplete", undefined);
    expect(outcome.ok ? "moved" : [outcome.code, outcome.message]).toEqual([
      "invalid_transition",
      '"Return as incomplete" is not possible from "In plan review".',
    ]);
  });

  it("input before guard: empty conditions are bad input even with comments left open", () => {
    const facts = { ...passingFacts("in_review", "approve_with_conditions"), openComments: [comment(12, 4, true)] };
    const outcome = attempt(ACTORS.examiner, facts, "approve_with_conditions", { conditions: [] });
    expect(outcome.ok ? "moved" : outcome.code).toBe("invalid_input");
  });
});

describe("cycles", () => {
  it("a resubmittal in cycle 3 starts cycle 4", () => {
    const facts = { ...passingFacts("corrections_issued", "resubmit"), cycle: 3 };
    const outcome = attempt(ACTORS.owner, facts, "resubmit", undefined);
    expect(outcome.ok ? outcome.result.effects.cycle : outcome.message).toEqual({ start: 4 });
  });

  it("a file returned as incomplete and submitted again is still accepted into cycle 1", () => {
    const resubmitted = attempt(ACTORS.owner, passingFacts("returned_incomplete", "submit"), "submit", undefined);
    expect(resubmitted.ok ? resubmitted.result.effects.cycle : resubmitted.message).toBeNull();
    const accepted = attempt(ACTORS.technician, passingFacts("submitted", "accept"), "accept", { examinerId: 205 });
    expect(accepted.ok ? accepted.result.effects.cycle : accepted.message).toEqual({ start: 1 });
  });
});

describe("purity", () => {
  it("leaves the facts untouched and answers the same twice", () => {
    const facts = deepFreeze({ ...passingFacts("in_review", "issue_corrections"), openComments: [comment(1, 1, false)] });
    const first = attempt(ACTORS.examiner, facts, "issue_corrections", undefined);
    const second = attempt(ACTORS.examiner, facts, "issue_corrections", undefined);
    expect(first).toEqual(second);
    expect(facts.state).toBe("in_review");
  });
});
