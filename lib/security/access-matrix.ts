// The access matrix: the table of record for who may call what. One row per route handler
// (path pattern + HTTP method) and per server action (module + export name). Plain data, no
// framework or database imports, so a reviewer can read it as a table. tests/unit/security
// fails when a route, method or action exists without a row here (or a row names nothing),
// and tests/system/access-matrix.test.ts calls every row as every actor over HTTP.

/** Who calls. "owner" and "other_applicant" are applicants of two different firms; the object is always the owner's. */
export const ACCESS_ACTORS = [
  "signed_out",
  "owner",
  "other_applicant",
  "technician",
  "examiner",
  "supervisor",
  "admin",
  "deactivated",
] as const;
export type AccessActor = (typeof ACCESS_ACTORS)[number];

/** The object a row's ids point at; "none" for rows without one. */
export type ObjectScope = "application" | "document" | "check" | "comment" | "invoice" | "user" | "none";

/** The application state a row is read in (where the answer depends on it); "any" where it does not. */
export type RowState = "draft" | "in_review" | "corrections_issued" | "any";

/**
 * "public": no session needed; the row's own check (a CSRF token, a provider signature, a
 * one-time token) is the gate, and every actor gets the same answer.
 */
export type Allowed = readonly AccessActor[] | "public";

export type HttpMethod = "GET" | "POST" | "PUT" | "PATCH" | "DELETE";

export interface RouteRow {
  method: HttpMethod;
  /** as the file path under app/, e.g. /api/applications/[id]/checks/[checkId] */
  path: string;
  scope: ObjectScope;
  state: RowState;
  allow: Allowed;
  /** whether a successful call writes anything (replayed with forged headers by the system test) */
  writes: boolean;
  why: string;
}

export interface ActionRow {
  /** the file under app/ that exports it */
  module: string;
  name: string;
  scope: ObjectScope;
  allow: Allowed;
  writes: boolean;
  why: string;
}

// "examiner" on a row with an application means the plans examiner assigned to it.
const STAFF = ["technician", "examiner", "supervisor"] as const;
const VIEWERS = ["owner", ...STAFF] as const;
const APPLICANTS = ["owner", "other_applicant"] as const;
const REVIEWERS = ["examiner", "supervisor"] as const;
const SIGNED_IN = ["owner", "other_applicant", ...STAFF, "admin"] as const;
const RUNNERS = ["owner", "other_applicant", ...STAFF] as const;

const A = "/api/applications/[id]";

export const ROUTE_MATRIX: readonly RouteRow[] = [
  { method: "GET", path: "/api/applications", scope: "none", state: "any", allow: [...APPLICANTS, ...STAFF], writes: false, why: "each role's own list; applicants see their own filings only" },
  { method: "POST", path: "/api/applications", scope: "none", state: "any", allow: APPLICANTS, writes: true, why: "only applicants file" },
  { method: "GET", path: A, scope: "application", state: "in_review", allow: VIEWERS, writes: false, why: "application.view" },
  { method: "PATCH", path: A, scope: "application", state: "draft", allow: ["owner"], writes: true, why: "application.edit_draft: the applicant, while the file is with them" },
  { method: "GET", path: `${A}/audit`, scope: "application", state: "in_review", allow: STAFF, writes: false, why: "department staff who may view the file export its history" },
  { method: "GET", path: `${A}/checks`, scope: "application", state: "in_review", allow: VIEWERS, writes: false, why: "applicants see their pre-checks and issued review checks; staff follow application.view" },
  { method: "POST", path: `${A}/checks`, scope: "application", state: "in_review", allow: ["owner", ...REVIEWERS], writes: true, why: "applicant pre-checks (any state); check.save for the review: assigned examiner, supervisor" },
  { method: "GET", path: `${A}/checks/suggestions`, scope: "application", state: "in_review", allow: ["owner", ...REVIEWERS], writes: false, why: "starting points for a check, so check.run (or the applicant's pre-check); technicians do not run checks" },
  { method: "GET", path: `${A}/checks/[checkId]`, scope: "check", state: "corrections_issued", allow: VIEWERS, writes: false, why: "a review check is the applicant's to see once its comment is issued" },
  { method: "POST", path: `${A}/checks/[checkId]/rerun`, scope: "check", state: "corrections_issued", allow: VIEWERS, writes: false, why: "anyone who may see the check may re-solve it; nothing is stored" },
  { method: "POST", path: `${A}/checks/[checkId]/comment`, scope: "check", state: "in_review", allow: REVIEWERS, writes: true, why: "comment.create from a failing check; the applicant does not see a draft-stage review check" },
  { method: "POST", path: `${A}/comments`, scope: "application", state: "in_review", allow: REVIEWERS, writes: true, why: "comment.create: assigned examiner or supervisor, in review" },
  { method: "PATCH", path: `${A}/comments/[commentId]`, scope: "comment", state: "in_review", allow: REVIEWERS, writes: true, why: "draft comments are edited by who may create them" },
  { method: "DELETE", path: `${A}/comments/[commentId]`, scope: "comment", state: "in_review", allow: REVIEWERS, writes: true, why: "draft comments only; issued ones stay on the record" },
  { method: "PUT", path: `${A}/comments/[commentId]/response`, scope: "comment", state: "corrections_issued", allow: ["owner"], writes: true, why: "comment.respond: the applicant, while corrections are issued" },
  { method: "POST", path: `${A}/comments/[commentId]/verdict`, scope: "comment", state: "in_review", allow: REVIEWERS, writes: true, why: "comment.resolve: assigned examiner or supervisor, in review" },
  { method: "POST", path: `${A}/documents`, scope: "application", state: "draft", allow: ["owner"], writes: true, why: "document.upload: the applicant, while the file is with them" },
  { method: "POST", path: `${A}/events`, scope: "application", state: "in_review", allow: VIEWERS, writes: true, why: "who may view may ask; each event's roles are in lib/workflow/transitions.ts (tested per state × event × role)" },
  { method: "GET", path: `${A}/invoices`, scope: "application", state: "in_review", allow: VIEWERS, writes: false, why: "the application's invoices, for who may view it" },
  { method: "POST", path: `${A}/invoices`, scope: "application", state: "in_review", allow: ["technician", "supervisor"], writes: true, why: "staff charge a resubmittal fee" },
  { method: "GET", path: `${A}/member-models`, scope: "application", state: "in_review", allow: VIEWERS, writes: false, why: "application.view" },
  { method: "POST", path: `${A}/member-models`, scope: "application", state: "draft", allow: ["owner"], writes: true, why: "document.upload" },
  { method: "GET", path: `${A}/member-models/[documentId]`, scope: "document", state: "in_review", allow: VIEWERS, writes: false, why: "application.view" },
  { method: "GET", path: "/api/auth/[...nextauth]", scope: "none", state: "any", allow: "public", writes: false, why: "Auth.js: session, CSRF token, providers" },
  { method: "POST", path: "/api/auth/[...nextauth]", scope: "none", state: "any", allow: "public", writes: true, why: "Auth.js sign-in and sign-out; its CSRF token and our Origin check are the gate" },
  { method: "POST", path: "/api/checks/batch", scope: "none", state: "any", allow: RUNNERS, writes: false, why: "the checker for applicants and staff; nothing is stored" },
  { method: "POST", path: "/api/checks/run", scope: "none", state: "any", allow: RUNNERS, writes: false, why: "the checker for applicants and staff; nothing is stored" },
  { method: "GET", path: "/api/documents/[id]/file", scope: "document", state: "in_review", allow: VIEWERS, writes: false, why: "document.download" },
  { method: "GET", path: "/api/examiners", scope: "none", state: "any", allow: ["technician", "supervisor"], writes: false, why: "who assign reviews choose from it" },
  { method: "GET", path: "/api/invoices", scope: "none", state: "any", allow: ["owner", "other_applicant", "technician", "supervisor"], writes: false, why: "applicants their own; technicians and supervisors every invoice" },
  { method: "GET", path: "/api/invoices/[id]", scope: "invoice", state: "in_review", allow: VIEWERS, writes: false, why: "who may view the application" },
  { method: "POST", path: "/api/invoices/[id]/checkout", scope: "invoice", state: "in_review", allow: ["owner"], writes: true, why: "only the applicant pays online" },
  { method: "POST", path: "/api/invoices/[id]/confirm", scope: "invoice", state: "in_review", allow: VIEWERS, writes: true, why: "asks the provider how a checkout ended; settles only what the provider says" },
  { method: "POST", path: "/api/invoices/[id]/refund", scope: "invoice", state: "in_review", allow: ["technician", "supervisor"], writes: true, why: "staff retry a refused refund" },
  { method: "POST", path: "/api/invoices/[id]/counter-payment", scope: "invoice", state: "in_review", allow: ["technician", "supervisor"], writes: true, why: "staff record a payment taken at the counter" },
  { method: "GET", path: "/api/mailbox", scope: "none", state: "any", allow: ["admin"], writes: false, why: "demo mail receiver, administrator only" },
  { method: "GET", path: "/api/me", scope: "none", state: "any", allow: SIGNED_IN, writes: false, why: "any active account" },
  { method: "POST", path: "/api/payments/webhook", scope: "none", state: "any", allow: "public", writes: true, why: "the provider's signature over the raw body is the authentication" },
  { method: "GET", path: "/api/queue", scope: "none", state: "any", allow: ["supervisor"], writes: false, why: "the supervising examiner's desk" },
  { method: "POST", path: "/api/queue/reassign", scope: "none", state: "any", allow: ["supervisor"], writes: true, why: "reassignment is the supervisor's" },
  { method: "POST", path: "/api/settings/holidays", scope: "none", state: "any", allow: ["admin"], writes: true, why: "the review clock's calendar" },
  { method: "DELETE", path: "/api/settings/holidays/[day]", scope: "none", state: "any", allow: ["admin"], writes: true, why: "the review clock's calendar" },
  { method: "GET", path: "/api/settings/review-clock", scope: "none", state: "any", allow: ["admin", "supervisor"], writes: false, why: "supervisors read the targets, the administrator sets them" },
  { method: "PUT", path: "/api/settings/review-clock", scope: "none", state: "any", allow: ["admin"], writes: true, why: "the administrator sets review targets" },
  { method: "GET", path: "/api/stats/turnaround", scope: "none", state: "any", allow: ["supervisor"], writes: false, why: "department statistics" },
  { method: "GET", path: "/api/stats/workload", scope: "none", state: "any", allow: ["supervisor"], writes: false, why: "department statistics" },
  { method: "GET", path: "/api/users", scope: "none", state: "any", allow: ["admin"], writes: false, why: "users.manage" },
  { method: "POST", path: "/api/users", scope: "none", state: "any", allow: ["admin"], writes: true, why: "users.manage: invitations" },
  { method: "PATCH", path: "/api/users/[id]", scope: "user", state: "any", allow: ["admin"], writes: true, why: "users.manage: role and deactivation (never one's own)" },
];

export const ACTION_MATRIX: readonly ActionRow[] = [
  { module: "app/(public)/actions.ts", name: "signInAction", scope: "none", allow: "public", writes: true, why: "credentials are the gate; throttled per account and address" },
  { module: "app/(public)/actions.ts", name: "requestResetAction", scope: "none", allow: "public", writes: true, why: "same answer whether or not the address has an account" },
  { module: "app/(public)/actions.ts", name: "acceptInviteAction", scope: "none", allow: "public", writes: true, why: "the one-time invitation token is the gate" },
  { module: "app/(public)/actions.ts", name: "resetPasswordAction", scope: "none", allow: "public", writes: true, why: "the one-time reset token is the gate" },
  { module: "app/(workspace)/actions.ts", name: "signOutAction", scope: "none", allow: "public", writes: false, why: "anyone may end their own session" },
  { module: "app/(workspace)/admin/fees/actions.ts", name: "saveFeeScheduleAction", scope: "none", allow: ["admin"], writes: true, why: "the administrator revises the fee schedule" },
];

export const routeKey = (r: Pick<RouteRow, "method" | "path">) => `${r.method} ${r.path}`;
export const actionKey = (r: Pick<ActionRow, "module" | "name">) => `${r.module}#${r.name}`;

export function isAllowed(allow: Allowed, actor: AccessActor): boolean {
  return allow === "public" || allow.includes(actor);
}

/** "/api/applications/[id]/checks/[checkId]" → a matcher for concrete paths, with the parameter names. */
export function compilePattern(path: string): { re: RegExp; params: string[] } {
  const params: string[] = [];
  const src = path
    .split("/")
    .map((seg) => {
      const catchAll = /^\[\.\.\.(\w+)\]$/.exec(seg);
      if (catchAll) {
        params.push(catchAll[1]!);
        return "(.+)";
      }
      const one = /^\[(\w+)\]$/.exec(seg);
      if (one) {
        params.push(one[1]!);
        return "([^/]+)";
      }
      return seg.replace(/[.*+?^${}()|\\]/g, "\\$&");
    })
    .join("/");
  return { re: new RegExp(`^${src}$`), params };
}

const COMPILED = ROUTE_MATRIX.map((r) => ({ row: r, ...compilePattern(r.path) }));

/** The row for a concrete request, with its path parameters; static segments win over parameters. */
export function matchRoute(method: string, pathname: string): { row: RouteRow; params: Record<string, string> } | null {
  const hits = COMPILED.filter((c) => c.row.method === method && c.re.test(pathname));
  hits.sort((a, b) => a.params.length - b.params.length);
  const hit = hits[0];
  if (!hit) return null;
  const m = hit.re.exec(pathname)!;
  return { row: hit.row, params: Object.fromEntries(hit.params.map((p, i) => [p, decodeURIComponent(m[i + 1] ?? "")])) };
}

/** Which object each path parameter names, for telling "not yours" from "not there". */
export const PARAM_OBJECTS: Record<string, Exclude<ObjectScope, "none" | "user"> | undefined> = {
  id: undefined, // depends on the route: see paramObject()
  checkId: "check",
  commentId: "comment",
  documentId: "document",
};

export function paramObject(path: string, param: string): Exclude<ObjectScope, "none"> | null {
  if (param === "id") {
    if (path.startsWith("/api/applications/")) return "application";
    if (path.startsWith("/api/documents/")) return "document";
    if (path.startsWith("/api/invoices/")) return "invoice";
    if (path.startsWith("/api/users/")) return "user";
    return null;
  }
  return PARAM_OBJECTS[param] ?? null;
}
