// The access matrix, called over HTTP: every row of lib/security/access-matrix.ts as every
// actor against a production build, with the first firm's objects in the paths (and swapped
// into the other firm's paths and bodies). Denied cells must change nothing and each leave one
// access.refused audit row; state-changing cells are replayed with forged headers and must
// change nothing at all. Every response body is scanned for stack traces, SQL and paths.
import { readFileSync } from "node:fs";
import path from "node:path";
import type { Server } from "node:http";
import mysql from "mysql2/promise";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { forbidden, unauthenticated } from "@/lib/errors";
import { FORGED_ACTION_MESSAGE } from "@/lib/security/action-guard";
import { ACCESS_ACTORS, ACTION_MATRIX, ROUTE_MATRIX, actionKey, isAllowed, routeKey, type AccessActor, type ActionRow, type RouteRow } from "@/lib/security/access-matrix";
import { REFUSAL_ACTION } from "@/lib/security/refusal-audit";
import { inventory, matrixGaps } from "@/lib/security/route-inventory";
import { COMMENT, FB3_MODEL, APPLICATION_INPUT, buildFixtures, mailCapture, type AccessFixtures } from "./support/access-fixtures";
import { freshDatabase, port, startApp, type Proc } from "./support/app";

const DB_NAME = "spanproof_sys_access";
const DIST = process.env.NEXT_DIST_DIR ?? ".next";

interface Call {
  path: string;
  body?: unknown;
  /** a raw upload body instead of JSON */
  raw?: { body: string; contentType: string; name: string };
}

// How each row is called. Bodies pass validation where the route validates before it
// authorizes, so the authorization check is what answers; where it can, an allowed call is
// stopped right after authorization (a stale version, a sheet that is not there) so the
// fixtures stay as built.
type Spec = (actor: AccessActor, fx: AccessFixtures) => Call;
const NO_SHEET = 999_999_999;
const A = (fx: AccessFixtures) => `/api/applications/${fx.a.review.id}`;
const CALLS: Record<string, Spec> = {
  "GET /api/applications": () => ({ path: "/api/applications" }),
  "POST /api/applications": () => ({ path: "/api/applications", body: APPLICATION_INPUT }),
  "GET /api/applications/[id]": (_, fx) => ({ path: A(fx) }),
  "PATCH /api/applications/[id]": (_, fx) => ({ path: `/api/applications/${fx.a.draft.id}`, body: { ...APPLICATION_INPUT, version: fx.a.draft.version + 100 } }),
  "GET /api/applications/[id]/audit": (_, fx) => ({ path: `${A(fx)}/audit` }),
  "GET /api/applications/[id]/checks": (_, fx) => ({ path: `${A(fx)}/checks` }),
  "POST /api/applications/[id]/checks": (actor, fx) => ({
    path: `${A(fx)}/checks`,
    body: { source: { form: "model", model: FB3_MODEL }, options: {}, purpose: actor === "owner" || actor === "other_applicant" ? "precheck" : "review", memberMark: "FB-3", sheetId: NO_SHEET },
  }),
  "GET /api/applications/[id]/checks/suggestions": (_, fx) => ({ path: `${A(fx)}/checks/suggestions?documentId=${fx.a.review.calcId}` }),
  "GET /api/applications/[id]/checks/[checkId]": (_, fx) => ({ path: `/api/applications/${fx.a.corrections.id}/checks/${fx.a.corrections.checkId}` }),
  "POST /api/applications/[id]/checks/[checkId]/rerun": (_, fx) => ({ path: `/api/applications/${fx.a.corrections.id}/checks/${fx.a.corrections.checkId}/rerun` }),
  "POST /api/applications/[id]/checks/[checkId]/comment": (_, fx) => ({ path: `${A(fx)}/checks/${fx.a.review.checkId}/comment` }),
  "POST /api/applications/[id]/comments": (_, fx) => ({ path: `${A(fx)}/comments`, body: COMMENT }),
  "PATCH /api/applications/[id]/comments/[commentId]": (_, fx) => ({ path: `${A(fx)}/comments/${fx.a.review.commentId}`, body: { version: 999, body: "Show the deflection of FB-3 under live load." } }),
  "DELETE /api/applications/[id]/comments/[commentId]": (actor, fx) => ({
    path: `${A(fx)}/comments/${actor === "examiner" ? fx.a.review.spareComments[0] : actor === "supervisor" ? fx.a.review.spareComments[1] : fx.a.review.commentId}`,
  }),
  "PUT /api/applications/[id]/comments/[commentId]/response": (_, fx) => ({ path: `/api/applications/${fx.a.corrections.id}/comments/${fx.a.corrections.commentId}/response`, body: { body: "FB-3 is now a 5-1/8 × 13-1/2 glulam; see S-201." } }),
  "POST /api/applications/[id]/comments/[commentId]/verdict": (_, fx) => ({ path: `${A(fx)}/comments/${fx.a.review.commentId}/verdict`, body: { verdict: "resolved" } }),
  "POST /api/applications/[id]/documents": (_, fx) => ({ path: `/api/applications/${fx.a.draft.id}/documents?kind=drawings`, raw: { body: "not a PDF", contentType: "application/pdf", name: "s-201.pdf" } }),
  "POST /api/applications/[id]/events": (_, fx) => ({ path: `${A(fx)}/events`, body: { event: "withdraw", version: 999 } }),
  "GET /api/applications/[id]/invoices": (_, fx) => ({ path: `${A(fx)}/invoices` }),
  "POST /api/applications/[id]/invoices": (_, fx) => ({ path: `${A(fx)}/invoices`, body: { purpose: "resubmittal" } }),
  "GET /api/applications/[id]/member-models": (_, fx) => ({ path: `${A(fx)}/member-models` }),
  "POST /api/applications/[id]/member-models": (_, fx) => ({ path: `/api/applications/${fx.a.draft.id}/member-models`, raw: { body: "{ not json", contentType: "application/json", name: "fb-4.json" } }),
  "GET /api/applications/[id]/member-models/[documentId]": (_, fx) => ({ path: `${A(fx)}/member-models/${fx.a.review.modelId}` }),
  "GET /api/auth/[...nextauth]": () => ({ path: "/api/auth/session" }),
  "POST /api/auth/[...nextauth]": () => ({ path: "/api/auth/signout", body: {} }),
  "POST /api/checks/batch": () => ({ path: "/api/checks/batch", body: { csv: "" } }),
  "POST /api/checks/run": () => ({ path: "/api/checks/run", body: { source: { form: "model", model: {} } } }),
  "GET /api/documents/[id]/file": (_, fx) => ({ path: `/api/documents/${fx.a.review.drawingsId}/file` }),
  "GET /api/examiners": () => ({ path: "/api/examiners" }),
  "GET /api/invoices": () => ({ path: "/api/invoices" }),
  "GET /api/invoices/[id]": (_, fx) => ({ path: `/api/invoices/${fx.a.review.invoiceId}` }),
  "POST /api/invoices/[id]/checkout": (_, fx) => ({ path: `/api/invoices/${fx.a.review.invoiceId}/checkout` }),
  "POST /api/invoices/[id]/confirm": (_, fx) => ({ path: `/api/invoices/${fx.a.review.invoiceId}/confirm`, body: { sessionId: "cs_test_unknown_session" } }),
  "POST /api/invoices/[id]/refund": (_, fx) => ({ path: `/api/invoices/${fx.a.review.invoiceId}/refund` }),
  // An empty reference: staff get 422 and the fixture's invoice stays open for the other rows.
  "POST /api/invoices/[id]/counter-payment": (_, fx) => ({ path: `/api/invoices/${fx.a.review.invoiceId}/counter-payment`, body: { method: "cheque", reference: "" } }),
  "GET /api/mailbox": () => ({ path: "/api/mailbox" }),
  "GET /api/me": () => ({ path: "/api/me" }),
  "POST /api/payments/webhook": () => ({ path: "/api/payments/webhook", body: { type: "checkout.session.completed" } }),
  "GET /api/queue": () => ({ path: "/api/queue" }),
  "POST /api/queue/reassign": (_, fx) => ({ path: "/api/queue/reassign", body: { applicationIds: [fx.a.review.id], examinerId: fx.users.examiner, reason: "Balancing the desk before the holidays." } }),
  "POST /api/settings/holidays": () => ({ path: "/api/settings/holidays", body: { day: "2031-11-28", name: "Harvest closure" } }),
  "DELETE /api/settings/holidays/[day]": (_, fx) => ({ path: `/api/settings/holidays/${fx.holiday}` }),
  "GET /api/settings/review-clock": () => ({ path: "/api/settings/review-clock" }),
  "PUT /api/settings/review-clock": () => ({ path: "/api/settings/review-clock", body: { firstReviewDays: 10, resubmittalDays: 5 } }),
  "GET /api/stats/turnaround": () => ({ path: "/api/stats/turnaround" }),
  "GET /api/stats/workload": () => ({ path: "/api/stats/workload" }),
  "GET /api/users": () => ({ path: "/api/users" }),
  "POST /api/users": () => ({ path: "/api/users", body: { email: "new.technician@larkspurfalls.example", name: "New Technician", role: "technician" } }),
  "PATCH /api/users/[id]": (_, fx) => ({ path: `/api/users/${fx.users.deactivated}`, body: { version: 999, role: "examiner" } }),
};

// The first firm's ids in the other firm's own paths and bodies: the answer must be the one a
// made-up id gets, so it tells nothing about the first firm's objects.
const SWAPS: { name: string; method: string; call: (fx: AccessFixtures, id: number) => Call; realId: (fx: AccessFixtures) => number }[] = [
  { name: "check id under own application", method: "GET", call: (fx, id) => ({ path: `/api/applications/${fx.b.draftId}/checks/${id}` }), realId: (fx) => fx.a.corrections.checkId },
  { name: "member model id under own application", method: "GET", call: (fx, id) => ({ path: `/api/applications/${fx.b.draftId}/member-models/${id}` }), realId: (fx) => fx.a.review.modelId },
  { name: "calc document id in the query", method: "GET", call: (fx, id) => ({ path: `/api/applications/${fx.b.draftId}/checks/suggestions?documentId=${id}` }), realId: (fx) => fx.a.review.calcId },
  {
    name: "calc document id in a pre-check body",
    method: "POST",
    call: (fx, id) => ({ path: `/api/applications/${fx.b.draftId}/checks`, body: { source: { form: "model", model: FB3_MODEL }, options: {}, purpose: "precheck", memberMark: "FB-3", calcDocumentId: id } }),
    realId: (fx) => fx.a.review.calcId,
  },
  { name: "comment id under own application", method: "PATCH", call: (fx, id) => ({ path: `/api/applications/${fx.b.draftId}/comments/${id}`, body: { version: 1, body: "Replaced by the other applicant." } }), realId: (fx) => fx.a.review.commentId },
  { name: "document id for download", method: "GET", call: (_fx, id) => ({ path: `/api/documents/${id}/file` }), realId: (fx) => fx.a.review.calcId },
];

const MISSING_ID = 987_654_321;

// ---- what a response may never contain (ASVS 16.5.1)
const LEAKS: [string, RegExp][] = [
  ["stack trace", /\bat .+\(.+:\d+:\d+\)/],
  ["stack trace", /\n\s+at [\w.<>]+ /],
  ["SQL", /\b(SELECT|INSERT|UPDATE|DELETE) .*\b(FROM|INTO|SET)\b/],
  ["SQL", /\bSELECT \w/],
  ["SQL", /\bINSERT \w/],
  ["driver error", /\bER_[A-Z_]+/],
  ["driver error", /sqlMessage/],
  ["server path", /node_modules/],
];

let app: (Proc & { url: string }) | undefined;
let mail: Server | undefined;
let databaseUrl = "";
let fx: AccessFixtures;
let conn: mysql.Connection;
let scanned = 0;
const leaks: string[] = [];

function scan(what: string, body: string) {
  scanned++;
  for (const [kind, re] of LEAKS) if (re.test(body)) leaks.push(`${what}: ${kind} in ${JSON.stringify(body.slice(0, 300))}`);
}

function cookieOf(actor: AccessActor): string | undefined {
  return actor === "signed_out" ? undefined : fx.cookies[actor];
}

async function send(method: string, call: Call, cookie: string | undefined, headers: Record<string, string | null> = {}) {
  const base = app!.url;
  const h: Record<string, string> = { origin: base };
  if (cookie) h.cookie = cookie;
  let body: string | undefined;
  if (call.raw) {
    h["content-type"] = call.raw.contentType;
    h["x-file-name"] = encodeURIComponent(call.raw.name);
    body = call.raw.body;
  } else if (call.body !== undefined) {
    h["content-type"] = "application/json";
    body = JSON.stringify(call.body);
  }
  for (const [k, v] of Object.entries(headers)) {
    if (v === null) delete h[k];
    else h[k] = v;
  }
  const res = await fetch(`${base}${call.path}`, { method, headers: h, body, redirect: "manual" });
  const text = await res.text();
  scan(`${method} ${call.path}`, text);
  return { status: res.status, text };
}

// ---- state: every table's checksum, and audit rows other than refusals
async function snapshot(): Promise<Record<string, string>> {
  const [tables] = await conn.query<mysql.RowDataPacket[]>("SELECT table_name AS t FROM information_schema.tables WHERE table_schema = DATABASE() ORDER BY table_name");
  const names = tables.map((r) => String(r.t)).filter((t) => t !== "audit_events");
  const [sums] = await conn.query<mysql.RowDataPacket[]>(`CHECKSUM TABLE ${names.map((n) => `\`${n}\``).join(", ")}`);
  const out: Record<string, string> = {};
  for (const s of sums) out[String(s.Table)] = String(s.Checksum);
  const [audit] = await conn.query<mysql.RowDataPacket[]>("SELECT COUNT(*) AS n, COALESCE(MAX(id), 0) AS m FROM audit_events WHERE action <> ?", [REFUSAL_ACTION]);
  out.audit_events_other = `${audit[0]!.n}`;
  return out;
}

function changed(before: Record<string, string>, after: Record<string, string>): string[] {
  return Object.keys({ ...before, ...after }).filter((k) => before[k] !== after[k]);
}

async function refusals(): Promise<number> {
  const [r] = await conn.query<mysql.RowDataPacket[]>("SELECT COUNT(*) AS n FROM audit_events WHERE action = ?", [REFUSAL_ACTION]);
  return Number(r[0]!.n);
}

// ---- server actions, called the way the browser's runtime calls them
interface ManifestEntry {
  workers: Record<string, unknown>;
  filename?: string;
  exportedName?: string;
}

function actionIds(): Map<string, { id: string; page: string }> {
  const file = path.join(DIST, "server", "server-reference-manifest.json");
  const manifest = JSON.parse(readFileSync(file, "utf8")) as { node: Record<string, ManifestEntry> };
  const out = new Map<string, { id: string; page: string }>();
  for (const [id, e] of Object.entries(manifest.node)) {
    if (!e.filename || !e.exportedName) continue;
    const worker = Object.keys(e.workers).sort((a, b) => a.length - b.length)[0] ?? "";
    // app/(public)/reset/[token]/page → /reset/x: any concrete path of the page will do.
    const page = `/${worker.replace(/^app\//, "").replace(/\/page$/, "").split("/").filter((s) => !/^\(.*\)$/.test(s)).map((s) => (/^\[.*\]$/.test(s) ? "x" : s)).join("/")}`;
    out.set(`${e.filename}#${e.exportedName}`, { id, page });
  }
  return out;
}

const FORM_ACTIONS = new Set(["signInAction", "requestResetAction", "acceptInviteAction", "resetPasswordAction"]);

function actionBody(row: ActionRow): { body: FormData | string; contentType?: string } {
  if (FORM_ACTIONS.has(row.name)) {
    // React's reply encoding: argument 0 is the previous form state, argument 1 the form ($K1 → fields prefixed "1_").
    const f = new FormData();
    f.append("0", JSON.stringify([{}, "$K1"]));
    f.append("1_email", "nobody@larkspurfalls.example");
    f.append("1_password", "not the password");
    f.append("1_token", "not-a-token");
    f.append("1_confirm", "not the password");
    return { body: f };
  }
  if (row.name === "saveFeeScheduleAction") return { body: JSON.stringify([{ revision: "not a schedule" }]), contentType: "text/plain;charset=UTF-8" };
  return { body: "[]", contentType: "text/plain;charset=UTF-8" };
}

async function callAction(row: ActionRow, actor: AccessActor, headers: Record<string, string | null> = {}) {
  const ref = actionIds().get(actionKey(row));
  if (!ref) throw new Error(`server action ${actionKey(row)} is not in the build's server-reference manifest`);
  const base = app!.url;
  const { body, contentType } = actionBody(row);
  // Signed out still carries a session-shaped cookie, so proxy.ts's convenience redirect does not answer for the action.
  const h: Record<string, string> = { origin: base, "next-action": ref.id, accept: "text/x-component", cookie: cookieOf(actor) ?? "authjs.session-token=not-a-session" };
  if (contentType) h["content-type"] = contentType;
  for (const [k, v] of Object.entries(headers)) {
    if (v === null) delete h[k];
    else h[k] = v;
  }
  const res = await fetch(`${base}${ref.page}`, { method: "POST", headers: h, body, redirect: "manual" });
  const text = await res.text();
  scan(`action ${row.name} as ${actor}`, text);
  return { status: res.status, text };
}

const DENIED_MESSAGES = [unauthenticated().message, forbidden().message];

beforeAll(async () => {
  databaseUrl = await freshDatabase(DB_NAME);
  mail = await mailCapture(port(2));
  app = await startApp({ port: port(0), databaseUrl, smtpPort: port(1), env: { MAIL_CAPTURE_URL: `http://127.0.0.1:${port(2)}`, PAYMENTS_API_URL: `http://127.0.0.1:${port(3)}` } });
  conn = await mysql.createConnection({ uri: databaseUrl });
  fx = await buildFixtures(app.url, databaseUrl);
});

afterAll(async () => {
  await conn?.end();
  await app?.stop();
  await new Promise<void>((r) => (mail ? mail.close(() => r()) : r()));
});

describe("access matrix over HTTP", () => {
  it("matches the source and the build: every route, method and action has a row, every row a route", () => {
    expect(matrixGaps(inventory(process.cwd()))).toEqual([]);
    const built = actionIds();
    for (const row of ACTION_MATRIX) expect(built.has(actionKey(row)), `${actionKey(row)} in the build's manifest`).toBe(true);
    for (const key of built.keys()) expect(ACTION_MATRIX.map(actionKey), `${key} in the matrix`).toContain(key);
    for (const row of ROUTE_MATRIX) expect(CALLS[routeKey(row)], `a call for ${routeKey(row)}`).toBeDefined();
  });

  it("answers every cell as the matrix says, refused cells change nothing and each leave one audit row", async () => {
    const wrong: string[] = [];
    let cells = 0;
    let denied = 0;
    const startRefusals = await refusals();
    const order = (actors: readonly AccessActor[], row: { allow: RouteRow["allow"] }) => [...actors.filter((a) => !isAllowed(row.allow, a)), ...actors.filter((a) => isAllowed(row.allow, a))];
    for (const row of ROUTE_MATRIX) {
      const key = routeKey(row);
      const spec = CALLS[key]!;
      let before = await snapshot();
      let denying = true;
      for (const actor of order(ACCESS_ACTORS, row)) {
        const allow = isAllowed(row.allow, actor);
        if (allow && denying) {
          const after = await snapshot();
          const diff = changed(before, after);
          if (diff.length) wrong.push(`${key}: refused calls changed ${diff.join(", ")}`);
          denying = false;
        }
        const call = spec(actor, fx);
        const r = await send(row.method, call, cookieOf(actor));
        cells++;
        const cell = `${key} as ${actor} → ${r.status} ${r.text.slice(0, 160)}`;
        if (row.allow === "public") {
          if (r.status >= 500 || r.status === 401 || r.status === 403) wrong.push(`public ${cell}`);
        } else if (allow) {
          if (!(r.status < 300 || r.status === 409 || r.status === 422)) wrong.push(`expected allowed: ${cell}`);
        } else {
          denied++;
          // Another applicant passes the role check wherever the owner does, so the object check must answer, with 404.
          const want = actor === "signed_out" || actor === "deactivated" ? [401] : actor === "other_applicant" && row.scope !== "none" && isAllowed(row.allow, "owner") ? [404] : [403, 404];
          if (!want.includes(r.status)) wrong.push(`expected ${want.join("/")}: ${cell}`);
        }
      }
      if (denying) {
        const diff = changed(before, await snapshot());
        if (diff.length) wrong.push(`${key}: refused calls changed ${diff.join(", ")}`);
      }
      before = {};
    }
    for (const row of ACTION_MATRIX) {
      if (row.name === "signOutAction") continue; // last, below: it ends the session cookie it is sent with
      for (const actor of ACCESS_ACTORS) {
        const allow = isAllowed(row.allow, actor);
        const before = allow ? null : await snapshot();
        const r = await callAction(row, actor);
        cells++;
        const refusedText = DENIED_MESSAGES.some((m) => r.text.includes(m));
        const cell = `action ${row.name} as ${actor} → ${r.status} ${r.text.slice(0, 200)}`;
        if (r.status >= 500) wrong.push(`server error: ${cell}`);
        // Allowed: the action ran and answered (200), or finished with its redirect (303); a 404 would mean Next never found it.
        else if (allow && (refusedText || (r.status !== 200 && r.status !== 303))) wrong.push(`expected allowed: ${cell}`);
        else if (!allow) {
          denied++;
          if (!refusedText) wrong.push(`expected refused: ${cell}`);
          const diff = changed(before!, await snapshot());
          if (diff.length) wrong.push(`${cell}: changed ${diff.join(", ")}`);
        }
      }
    }
    const refusalRows = (await refusals()) - startRefusals;
    console.log(`[access-matrix] ${cells} cells (${denied} refused), ${refusalRows} access.refused audit rows`);
    expect(wrong).toEqual([]);
    expect(refusalRows).toBe(denied);
  });

  it("answers another applicant's ids in its own paths, queries and bodies exactly as it answers ids that do not exist", async () => {
    const wrong: string[] = [];
    const before = await snapshot();
    for (const s of SWAPS) {
      const real = await send(s.method, s.call(fx, s.realId(fx)), fx.cookies.other_applicant);
      const made = await send(s.method, s.call(fx, MISSING_ID), fx.cookies.other_applicant);
      const norm = (t: string) => t.replaceAll(String(s.realId(fx)), "ID").replaceAll(String(MISSING_ID), "ID");
      if (real.status < 400 || real.status >= 500) wrong.push(`${s.name}: ${real.status} ${real.text.slice(0, 160)}`);
      if (real.status !== made.status || norm(real.text) !== norm(made.text)) wrong.push(`${s.name}: ${real.status} ${real.text.slice(0, 120)} ≠ made-up id ${made.status} ${made.text.slice(0, 120)}`);
    }
    console.log(`[access-matrix] ${SWAPS.length} id swaps into the other applicant's own paths and bodies`);
    expect(wrong).toEqual([]);
    expect(changed(before, await snapshot())).toEqual([]);
  });

  it("changes nothing when a state-changing call carries the middleware header, a foreign Origin, no Origin or Sec-Fetch-Site: cross-site", async () => {
    const forged: [string, Record<string, string | null>][] = [
      ["x-middleware-subrequest: middleware", { "x-middleware-subrequest": "middleware" }],
      ["x-middleware-subrequest: src/middleware", { "x-middleware-subrequest": "src/middleware" }],
      ["x-middleware-subrequest: proxy", { "x-middleware-subrequest": "proxy" }],
      ["x-middleware-subrequest ×5", { "x-middleware-subrequest": "middleware:middleware:middleware:middleware:middleware" }],
      ["foreign Origin", { origin: "https://larkspur-falls-permits.example" }],
      ["no Origin", { origin: null }],
      ["no Origin, Sec-Fetch-Site: cross-site", { origin: null, "sec-fetch-site": "cross-site" }],
    ];
    const wrong: string[] = [];
    const before = await snapshot();
    const startRefusals = await refusals();
    let replays = 0;
    let audited = 0;
    for (const row of ROUTE_MATRIX.filter((r) => r.writes)) {
      const actors = ACCESS_ACTORS.filter((a) => isAllowed(row.allow, a) && a !== "deactivated");
      for (const actor of actors.length ? actors : (["signed_out"] as const)) {
        for (const [label, headers] of forged) {
          const r = await send(row.method, CALLS[routeKey(row)]!(actor, fx), cookieOf(actor), headers);
          replays++;
          // The webhook answers to its signature alone; every other route refuses the request outright.
          if (row.path === "/api/payments/webhook") {
            if (r.status < 400 || r.status >= 500) wrong.push(`${routeKey(row)} as ${actor} with ${label} → ${r.status}`);
          } else {
            audited++;
            if (r.status !== 403) wrong.push(`${routeKey(row)} as ${actor} with ${label} → ${r.status} ${r.text.slice(0, 120)}`);
          }
        }
      }
    }
    for (const row of ACTION_MATRIX.filter((r) => r.writes)) {
      const actor: AccessActor = row.allow === "public" ? "signed_out" : row.allow[0]!;
      for (const [label, headers] of forged) {
        const r = await callAction(row, actor, headers);
        replays++;
        // Next itself turns away a foreign Origin before the action runs; the rest reach our guard.
        if (label === "foreign Origin") {
          if (r.status < 400) wrong.push(`action ${row.name} with ${label} → ${r.status} ${r.text.slice(0, 160)}`);
        } else {
          audited++;
          if (!r.text.includes(FORGED_ACTION_MESSAGE)) wrong.push(`action ${row.name} with ${label} → ${r.status} ${r.text.slice(0, 160)}`);
        }
      }
    }
    const diff = changed(before, await snapshot());
    const rows = (await refusals()) - startRefusals;
    console.log(`[access-matrix] ${replays} forged replays, ${diff.length} tables changed, ${rows} refusal rows`);
    expect(wrong).toEqual([]);
    expect(diff).toEqual([]);
    expect(rows).toBe(audited);
  });

  it("signs out for every actor, and no response of the whole run carried a stack trace, SQL or a server path", async () => {
    const row = ACTION_MATRIX.find((r) => r.name === "signOutAction")!;
    for (const actor of ACCESS_ACTORS) {
      const r = await callAction(row, actor);
      expect([200, 303], `${actor}: ${r.status} ${r.text.slice(0, 200)}`).toContain(r.status);
    }
    console.log(`[access-matrix] ${scanned} response bodies scanned`);
    expect(scanned).toBeGreaterThan(400);
    expect(leaks).toEqual([]);
  });
});
