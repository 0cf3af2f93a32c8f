// Who may do what outside the transitions: viewing, uploading, commenting, checking, the
// queues, user administration. One row per action; a role not listed in a row may not do it.
//
//   always         allowed; no application involved (creating one, the queues, user admin)
//   own(...)       the applicant's own applications
//   assigned(...)  applications assigned to this examiner
//   filed(...)     any application past draft: a draft is not yet filed with the department
//   (...) lists the states in which the action is open; none listed means every state.
//
// Decisions:
// - An applicant who asks for someone else's application is answered 404: checkAccess()
//   returns "not_found" whenever the actor may not even view it.
// - Applicants upload and edit only while they hold the file (STATE_INFO.holder).
// - Examiners comment and save checks only in review, so a correction list, once issued,
//   stays as the applicant received it.
// - Supervisors see every filed application, not drafts (see "filed"), and may comment,
//   resolve and save checks on any review as its examiner.
// - Administrators manage accounts and read the captured mailbox of the local mail receiver;
//   they see no application content: their job is people and mail delivery, not plans.
// - The department-wide audit log is for supervisors; an application's own timeline comes
//   with application.view.

import type { ApplicationResource, Actor } from "@/lib/workflow/facts";
import type { Role } from "@/lib/workflow/roles";
import { APPLICANT_SIDE_STATES, type State } from "@/lib/workflow/states";

export const ACTIONS = [
  "application.create",
  "application.view",
  "application.edit_draft",
  "document.upload",
  "document.download",
  "comment.create",
  "comment.respond",
  "comment.resolve",
  "check.run",
  "check.save",
  "queue.view",
  "users.manage",
  "mailbox.view",
  "audit.view",
] as const;

export type Action = (typeof ACTIONS)[number];

export type Scope = "own" | "assigned" | "filed";

export type PermissionRule = "always" | { on: Scope; while: readonly State[] | null };

const always = "always";
const own = (...states: readonly State[]): PermissionRule => ({ on: "own", while: states.length ? states : null });
const assigned = (...states: readonly State[]): PermissionRule => ({ on: "assigned", while: states.length ? states : null });
const filed = (...states: readonly State[]): PermissionRule => ({ on: "filed", while: states.length ? states : null });

export const PERMISSIONS: Record<Action, Partial<Record<Role, PermissionRule>>> = {
  "application.create":     { applicant: always },
  "application.view":       { applicant: own(), technician: filed(), examiner: assigned(), supervisor: filed() },
  "application.edit_draft": { applicant: own(...APPLICANT_SIDE_STATES) },
  "document.upload":        { applicant: own(...APPLICANT_SIDE_STATES) },
  "document.download":      { applicant: own(), technician: filed(), examiner: assigned(), supervisor: filed() },
  "comment.create":         { examiner: assigned("in_review"), supervisor: filed("in_review") },
  "comment.respond":        { applicant: own("corrections_issued") },
  "comment.resolve":        { examiner: assigned("in_review"), supervisor: filed("in_review") },
  "check.run":              { examiner: assigned(), supervisor: filed() },
  "check.save":             { examiner: assigned("in_review"), supervisor: filed("in_review") },
  "queue.view":             { technician: always, examiner: always, supervisor: always },
  "users.manage":           { admin: always },
  "mailbox.view":           { admin: always },
  "audit.view":             { supervisor: always },
};

function inScope(scope: Scope, actor: Actor, resource: ApplicationResource): boolean {
  switch (scope) {
    case "own":
      return resource.applicantId === actor.id;
    case "assigned":
      return resource.assignedExaminerId === actor.id;
    case "filed":
      return resource.state !== "draft";
  }
}

/**
 * May this actor do this, on this application? Rules about applications need the resource;
 * without one they answer false (fail closed).
 */
export function can(actor: Actor, action: Action, resource?: ApplicationResource): boolean {
  const rule = PERMISSIONS[action][actor.role];
  if (rule === undefined) return false;
  if (rule === "always") return true;
  if (resource === undefined) return false;
  if (!inScope(rule.on, actor, resource)) return false;
  return rule.while === null || rule.while.includes(resource.state);
}

/**
 * The answer the caller sends: "not_found" (404) when the actor may not even view the
 * application, so its existence is not revealed; "forbidden" (403) when they may view it
 * but not do this.
 */
export function checkAccess(
  actor: Actor,
  action: Action,
  resource?: ApplicationResource,
): "allowed" | "forbidden" | "not_found" {
  if (can(actor, action, resource)) return "allowed";
  if (resource !== undefined && !can(actor, "application.view", resource)) return "not_found";
  return "forbidden";
}
