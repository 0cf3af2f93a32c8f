import { describe, expect, it } from "vitest";

import { ACTIONS, can, checkAccess, type Action, type ApplicationResource, type State } from "@/lib/workflow";
import { ACTORS, ACTOR_KEYS, ALL_STATES, EXAMINER_ID, OWNER_ID, type ActorKey } from "@/tests/unit/workflow/workflow-fixtures";

// Access rules from issue 4 and the lead's assignment (product rules, not code): applicants
// see only their own files and upload or edit only while they hold them; technicians see
// everything filed; examiners what is assigned to them, commenting only in review;
// supervisors every filed application; the administrator users and the captured mailbox.
// Supervisors acting as examiners: common practice, no source.

const ALL: readonly State[] = ALL_STATES;
const NONE: readonly State[] = [];
const FILED: readonly State[] = ALL_STATES.filter((s) => s !== "draft");
const APPLICANT_HOLDS: readonly State[] = ["draft", "returned_incomplete", "corrections_issued"];
const IN_REVIEW: readonly State[] = ["in_review"];
const CORRECTIONS: readonly State[] = ["corrections_issued"];

/** "yes"/"no": an action on no application; a list: the states in which it is allowed. */
type Expect = "yes" | "no" | readonly State[];

// Columns: owner, otherApplicant, technician, examiner (assigned), otherExaminer, supervisor, admin.
const row = (...cells: [Expect, Expect, Expect, Expect, Expect, Expect, Expect]): Record<ActorKey, Expect> => ({
  owner: cells[0],
  otherApplicant: cells[1],
  technician: cells[2],
  examiner: cells[3],
  otherExaminer: cells[4],
  supervisor: cells[5],
  admin: cells[6],
});

const EXPECTED: Record<Action, Record<ActorKey, Expect>> = {
  //                                owner            other  technician examiner    other  supervisor admin
  "application.create":     row("yes",           "yes", "no",      "no",       "no",  "no",      "no"),
  "application.view":       row(ALL,             NONE,  FILED,     ALL,        NONE,  FILED,     NONE),
  "application.edit_draft": row(APPLICANT_HOLDS, NONE,  NONE,      NONE,       NONE,  NONE,      NONE),
  "document.upload":        row(APPLICANT_HOLDS, NONE,  NONE,      NONE,       NONE,  NONE,      NONE),
  "document.download":      row(ALL,             NONE,  FILED,     ALL,        NONE,  FILED,     NONE),
  "comment.create":         row(NONE,            NONE,  NONE,      IN_REVIEW,  NONE,  IN_REVIEW, NONE),
  "comment.respond":        row(CORRECTIONS,     NONE,  NONE,      NONE,       NONE,  NONE,      NONE),
  "comment.resolve":        row(NONE,            NONE,  NONE,      IN_REVIEW,  NONE,  IN_REVIEW, NONE),
  "check.run":              row(NONE,            NONE,  NONE,      ALL,        NONE,  FILED,     NONE),
  "check.save":             row(NONE,            NONE,  NONE,      IN_REVIEW,  NONE,  IN_REVIEW, NONE),
  "queue.view":             row("no",            "no",  "yes",     "yes",      "yes", "yes",     "no"),
  "users.manage":           row("no",            "no",  "no",      "no",       "no",  "no",      "yes"),
  "mailbox.view":           row("no",            "no",  "no",      "no",       "no",  "no",      "yes"),
  "audit.view":             row("no",            "no",  "no",      "no",       "no",  "yes",     "no"),
};

// The examiner is written into every state here so the rule is tested on ownership alone.
const resource = (state: State): ApplicationResource => ({ state, applicantId: OWNER_ID, assignedExaminerId: EXAMINER_ID });

describe("permissions", () => {
  it("cover exactly the actions expected", () => {
    expect([...ACTIONS].sort()).toEqual(Object.keys(EXPECTED).sort());
  });

  const cases = ACTIONS.flatMap((action) => ACTOR_KEYS.map((key) => [action, key] as const));

  it.each(cases)("%s by %s", (action, key) => {
    const want = EXPECTED[action][key];
    const actor = ACTORS[key];
    const got = ALL_STATES.filter((state) => can(actor, action, resource(state)));
    if (want === "yes" || want === "no") {
      expect(can(actor, action)).toBe(want === "yes");
      expect(got).toEqual(want === "yes" ? ALL_STATES : []);
    } else {
      expect(got).toEqual(want);
      // Without the application to look at, a rule about applications fails closed.
      expect(can(actor, action)).toBe(false);
    }
  });

  it("an examiner sees nothing of an application not yet assigned", () => {
    const unassigned: ApplicationResource = { state: "submitted", applicantId: OWNER_ID, assignedExaminerId: null };
    expect(can(ACTORS.examiner, "application.view", unassigned)).toBe(false);
    expect(can(ACTORS.technician, "application.view", unassigned)).toBe(true);
  });
});

describe("checkAccess: 404 for not yours, 403 for yours but not now", () => {
  it("another applicant gets not_found for every application action in every state", () => {
    const applicationActions = ACTIONS.filter((a) => Array.isArray(EXPECTED[a].owner));
    for (const action of applicationActions) {
      for (const state of ALL_STATES) {
        expect([action, state, checkAccess(ACTORS.otherApplicant, action, resource(state))]).toEqual([action, state, "not_found"]);
      }
    }
  });

  it.each([
    ["owner", "document.upload", "in_review", "forbidden"],
    ["owner", "document.upload", "corrections_issued", "allowed"],
    ["owner", "comment.respond", "resubmitted", "forbidden"],
    ["examiner", "comment.create", "corrections_issued", "forbidden"],
    ["otherExaminer", "comment.create", "in_review", "not_found"],
    ["technician", "application.view", "draft", "not_found"],
    ["supervisor", "application.view", "draft", "not_found"],
    ["admin", "application.view", "in_review", "not_found"],
    ["admin", "document.download", "approved", "not_found"],
  ] as const)("%s asking %s in %s → %s", (key, action, state, answer) => {
    expect(checkAccess(ACTORS[key], action, resource(state))).toBe(answer);
  });

  it("a refused action on no application is forbidden, not hidden", () => {
    expect(checkAccess(ACTORS.technician, "users.manage")).toBe("forbidden");
    expect(checkAccess(ACTORS.admin, "users.manage")).toBe("allowed");
  });
});
