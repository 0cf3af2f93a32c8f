// Racing one approval through several app instances: prepare applications an examiner can
// approve, send the same approve event (same expected version) to every instance at once, and
// check that each race has exactly one winner, one audit line, one outbox row and one e-mail.
// Instances may share one MariaDB or sit on different nodes of a cluster: only URLs go in.
import { and, eq, inArray, sql } from "drizzle-orm";
import { drizzle } from "drizzle-orm/mysql2";
import mysql from "mysql2/promise";
import type { Db } from "@/db/client";
import * as schema from "@/db/schema";
import { auditEvents, documents, outbox, users } from "@/db/schema";
import { createApplication, fireEvent } from "@/lib/applications/service";
import { hashPassword } from "@/lib/auth/password";
import { messageIdFor } from "@/lib/mail/transport";

export interface RaceAccount {
  id: number;
  email: string;
  password: string;
}

export interface PreparedApproval {
  applicationId: number;
  /** the version the approve event must name */
  version: number;
}

export interface PreparedApprovals {
  apps: PreparedApproval[];
  /** the plans examiner every application is assigned to: sign in as this account to race */
  examiner: RaceAccount;
  applicant: RaceAccount;
  /** preparation transactions InnoDB chose as deadlock victims and that were run again */
  deadlocksRetried: number;
  ms: number;
}

/** Runs fn over items with at most `limit` in flight; results keep the input order. */
export async function mapLimit<T, R>(items: readonly T[], limit: number, fn: (item: T, index: number) => Promise<R>): Promise<R[]> {
  const out = new Array<R>(items.length);
  let next = 0;
  async function lane() {
    while (next < items.length) {
      const i = next++;
      out[i] = await fn(items[i]!, i);
    }
  }
  await Promise.all(Array.from({ length: Math.max(1, Math.min(limit, items.length)) }, lane));
  return out;
}

/** Nearest-rank percentile of an ascending list. */
export function percentile(sorted: readonly number[], p: number): number {
  if (sorted.length === 0) return NaN;
  const rank = Math.ceil((p / 100) * sorted.length) - 1;
  return sorted[Math.min(sorted.length - 1, Math.max(0, rank))]!;
}

function isDeadlock(e: unknown): boolean {
  for (let c: unknown = e; c; c = (c as { cause?: unknown }).cause) {
    if ((c as { code?: string }).code === "ER_LOCK_DEADLOCK" || (c as { errno?: number }).errno === 1213) return true;
  }
  return false;
}

/**
 * InnoDB picks deadlock victims among concurrent submits and accepts of *different*
 * applications (the assignments update takes gap locks; on a near-empty table nearly every
 * batch collides). A victim's transaction rolled back whole, so running it again is safe;
 * whatever the service's own retries leave over is retried here and counted for the report.
 */
async function retryDeadlock<T>(fn: () => Promise<T>, retried: { n: number }): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await fn();
    } catch (e) {
      if (!isDeadlock(e) || attempt >= 10) throw e;
      retried.n++;
      await new Promise((r) => setTimeout(r, 5 * attempt + Math.random() * 20));
    }
  }
}

// The service layer reads lib/env once; outside the app nothing may have set it.
function defaultServiceEnv(databaseUrl: string) {
  process.env.DATABASE_URL ??= databaseUrl;
  process.env.AUTH_SECRET ??= "test-secret-not-for-production-0123456789abcdef";
  process.env.APP_URL ??= "http://127.0.0.1:1";
}

function openDb(databaseUrl: string, connections: number): { database: Db; pool: mysql.Pool } {
  const pool = mysql.createPool({ uri: databaseUrl, connectionLimit: connections, timezone: "Z", supportBigNumbers: true });
  return { database: drizzle(pool, { schema, mode: "default" }), pool };
}

async function makeAccount(database: Db, role: "applicant" | "technician" | "examiner", tag: string, passwordHash: string, password: string) {
  const email = `race-${tag}-${role}@larkspurfalls.example`;
  const name = { applicant: "Race Applicant", technician: "Race Technician", examiner: "Race Examiner" }[role];
  const [row] = await database.insert(users).values({ email, name: `${name} ${tag}`, role, status: "active", passwordHash }).$returningId();
  if (!row) throw new Error(`could not create the ${role} account for the race`);
  return { id: row.id, email, password, actor: { id: row.id, role, name, firmId: null } };
}

/**
 * Makes `count` applications in review, assigned to a new examiner, through the same service
 * functions the app uses (create, submit, accept: state, cycle, audit, invoice and outbox in
 * their transactions), `concurrency` at a time. Only the drawing-set row is written directly:
 * submit needs one to exist, and the race never reads the file. The preparation notices are
 * marked sent unless `keepPreparationMail`, so the relay afterwards carries only the race's mail.
 */
export async function prepareApprovals(o: {
  databaseUrl: string;
  count: number;
  concurrency?: number;
  password?: string;
  /** distinguishes the accounts when one database is prepared more than once */
  tag?: string;
  keepPreparationMail?: boolean;
}): Promise<PreparedApprovals> {
  if (!Number.isInteger(o.count) || o.count < 1) throw new Error(`prepareApprovals: count must be a positive whole number, got ${o.count}`);
  const started = performance.now();
  const concurrency = o.concurrency ?? 8;
  const password = o.password ?? "race-password-0123";
  const tag = o.tag ?? Date.now().toString(36);
  defaultServiceEnv(o.databaseUrl);
  const { database, pool } = openDb(o.databaseUrl, concurrency + 2);
  try {
    const hash = await hashPassword(password);
    const applicant = await makeAccount(database, "applicant", tag, hash, password);
    const technician = await makeAccount(database, "technician", tag, hash, password);
    const examiner = await makeAccount(database, "examiner", tag, hash, password);
    const indexes = Array.from({ length: o.count }, (_, i) => i);
    const deadlocks = { n: 0 };

    const created = await mapLimit(indexes, concurrency, (i) =>
      retryDeadlock(() => createApplication(database, applicant.actor, {
        workDescription: `Race approval ${i + 1}: covered porch with a glulam header`,
        siteAddress: `${100 + i} Millrace Avenue`,
        parcelNumber: `300-${String(Math.floor(i / 1000)).padStart(3, "0")}-${String(i % 1000).padStart(3, "0")}`,
        occupancyGroup: "R-3",
        constructionType: "VB",
        valuation: 2_500_000,
        dporName: "Race Applicant, PE",
        dporLicence: "PE-00000",
      }), deadlocks),
    );
    const ids = created.map((c) => c.id);
    for (let i = 0; i < ids.length; i += 500) {
      await database.insert(documents).values(
        ids.slice(i, i + 500).map((applicationId) => ({
          applicationId,
          cycle: 1,
          kind: "drawings" as const,
          originalName: "race-drawings.pdf",
          contentType: "application/pdf",
          byteSize: 1,
          sha256: "0".repeat(64),
          pageCount: 1,
          storageKey: `race/${applicationId}.pdf`,
          uploadedBy: applicant.id,
        })),
      );
    }
    const submitted = await mapLimit(ids, concurrency, (id) => retryDeadlock(() => fireEvent(database, applicant.actor, id, "submit", 1), deadlocks));
    const accepted = await mapLimit(ids, concurrency, (id, i) =>
      retryDeadlock(() => fireEvent(database, technician.actor, id, "accept", submitted[i]!.version, { examinerId: examiner.id }), deadlocks),
    );
    for (const [i, a] of accepted.entries()) {
      if (a.state !== "in_review") throw new Error(`application ${ids[i]} is ${a.state} after accept, not in_review`);
    }
    if (!o.keepPreparationMail) {
      for (let i = 0; i < ids.length; i += 500) {
        await database
          .update(outbox)
          .set({ status: "sent", sentAt: new Date() })
          .where(and(inArray(outbox.applicationId, ids.slice(i, i + 500)), eq(outbox.status, "pending")));
      }
    }
    return {
      apps: ids.map((applicationId, i) => ({ applicationId, version: accepted[i]!.version })),
      examiner: { id: examiner.id, email: examiner.email, password },
      applicant: { id: applicant.id, email: applicant.email, password },
      deadlocksRetried: deadlocks.n,
      ms: performance.now() - started,
    };
  } finally {
    await pool.end();
  }
}

export interface RaceAttempt {
  instance: string;
  status: number;
  /** response body (JSON when it parses), kept for failure messages */
  body: unknown;
  /** from the race's start to this response, ms */
  ms: number;
}

export interface RaceOutcome {
  applicationId: number;
  version: number;
  attempts: RaceAttempt[];
  /** from the race's start until every instance answered, ms */
  ms: number;
}

export interface RaceRun {
  outcomes: RaceOutcome[];
  wallMs: number;
}

async function attempt(instance: string, cookie: string, app: PreparedApproval, event: string, t0: number): Promise<RaceAttempt> {
  try {
    const res = await fetch(`${instance}/api/applications/${app.applicationId}/events`, {
      method: "POST",
      redirect: "manual",
      headers: { cookie, origin: instance, "content-type": "application/json" },
      body: JSON.stringify({ event, version: app.version }),
    });
    const text = await res.text();
    let body: unknown = text;
    try {
      body = JSON.parse(text);
    } catch {
      // not JSON: keep the text for the report
    }
    return { instance, status: res.status, body, ms: performance.now() - t0 };
  } catch (e) {
    // A refused or reset connection is an outcome too (status 0), never a thrown test.
    return { instance, status: 0, body: e instanceof Error ? `${e.message} ${String(e.cause ?? "")}` : String(e), ms: performance.now() - t0 };
  }
}

/**
 * For each application, the same event with the same expected version to every instance at
 * once (which one is sent first rotates); `concurrency` races run side by side. The session
 * cookie must be valid on all of them.
 */
export async function raceApprovals(o: { instances: readonly string[]; cookie: string; apps: readonly PreparedApproval[]; concurrency?: number; event?: "approve" }): Promise<RaceRun> {
  if (o.instances.length < 2) throw new Error(`raceApprovals needs at least two instances, got ${o.instances.length}`);
  const event = o.event ?? "approve";
  const started = performance.now();
  const n = o.instances.length;
  const outcomes = await mapLimit(o.apps, o.concurrency ?? 8, async (app, i) => {
    // Who is sent first rotates, so no instance gets a head start in every race.
    const order = o.instances.map((_, k) => o.instances[(k + i) % n]!);
    const t0 = performance.now();
    const attempts = await Promise.all(order.map((url) => attempt(url, o.cookie, app, event, t0)));
    return { applicationId: app.applicationId, version: app.version, attempts, ms: performance.now() - t0 };
  });
  return { outcomes, wallMs: performance.now() - started };
}

export interface RaceReport {
  races: number;
  /** races won per instance URL */
  wins: Record<string, number>;
  /** one line per broken expectation, with the response body or the counts found */
  failures: string[];
  latency: { p50: number; p95: number; max: number };
  /** how long after the race start the loser's 409 came, after the winner's answer, ms (p50) */
  loserLagP50: number;
  mail: { expected: number; approvalMails: number; duplicateMessageIds: number; total: number } | null;
}

const SUCCESS = (s: number) => s >= 200 && s < 300;

function describe(a: RaceAttempt): string {
  const body = typeof a.body === "string" ? a.body : JSON.stringify(a.body);
  return `${a.instance} → ${a.status} ${body.slice(0, 300)}`;
}

/**
 * Checks the outcomes over HTTP, in the database and in the mailbox: per application exactly
 * one 2xx and every other answer 409; exactly one approval audit line and one approval outbox
 * row; after the relay has drained those rows (within drainTimeoutMs), the mailbox holds no
 * Message-ID twice and exactly one approval mail per application.
 */
export async function verifyRaces(o: {
  databaseUrl: string;
  run: RaceRun;
  /** the mail receiver's HTTP base, e.g. http://127.0.0.1:2680; omit to skip the mailbox */
  mailboxUrl?: string;
  drainTimeoutMs?: number;
  auditAction?: string;
  template?: string;
}): Promise<RaceReport> {
  const auditAction = o.auditAction ?? "review.approved";
  const template = o.template ?? "review.approved";
  const failures: string[] = [];
  const wins: Record<string, number> = {};
  const lags: number[] = [];
  for (const r of o.run.outcomes) {
    const winners = r.attempts.filter((a) => SUCCESS(a.status));
    const others = r.attempts.filter((a) => !SUCCESS(a.status));
    if (winners.length !== 1) failures.push(`application ${r.applicationId}: ${winners.length} instances accepted the approval: ${r.attempts.map(describe).join(" | ")}`);
    for (const a of others) if (a.status !== 409) failures.push(`application ${r.applicationId}: expected 409 from the loser, got ${describe(a)}`);
    const w = winners[0];
    if (w) {
      wins[w.instance] = (wins[w.instance] ?? 0) + 1;
      const state = (w.body as { state?: unknown } | null)?.state;
      if (state !== "approved") failures.push(`application ${r.applicationId}: the winner answered state ${String(state)}: ${describe(w)}`);
      for (const a of others) lags.push(a.ms - w.ms);
    }
  }

  const ids = o.run.outcomes.map((r) => r.applicationId);
  const { database, pool } = openDb(o.databaseUrl, 2);
  let mail: RaceReport["mail"] = null;
  try {
    const perApp = async (table: typeof auditEvents | typeof outbox, where: ReturnType<typeof and>) => {
      const counts = new Map<number, number>();
      for (let i = 0; i < ids.length; i += 500) {
        const rows = await database
          .select({ app: table.applicationId, n: sql<number>`COUNT(*)` })
          .from(table)
          .where(and(inArray(table.applicationId, ids.slice(i, i + 500)), where))
          .groupBy(table.applicationId);
        for (const row of rows) counts.set(Number(row.app), Number(row.n));
      }
      return counts;
    };
    const audits = await perApp(auditEvents, eq(auditEvents.action, auditAction));
    const queued = await perApp(outbox, eq(outbox.template, template));
    for (const id of ids) {
      if ((audits.get(id) ?? 0) !== 1) failures.push(`application ${id}: ${audits.get(id) ?? 0} "${auditAction}" audit lines, expected 1`);
      if ((queued.get(id) ?? 0) !== 1) failures.push(`application ${id}: ${queued.get(id) ?? 0} "${template}" outbox rows, expected 1`);
    }

    if (o.mailboxUrl) {
      const rows = async () => {
        const out: { id: number; status: string }[] = [];
        for (let i = 0; i < ids.length; i += 500) {
          out.push(
            ...(await database
              .select({ id: outbox.id, status: outbox.status })
              .from(outbox)
              .where(and(inArray(outbox.applicationId, ids.slice(i, i + 500)), eq(outbox.template, template)))),
          );
        }
        return out;
      };
      const until = Date.now() + (o.drainTimeoutMs ?? 120_000);
      let approval = await rows();
      while (approval.some((r) => r.status === "pending") && Date.now() < until) {
        await new Promise((r) => setTimeout(r, 250));
        approval = await rows();
      }
      const pending = approval.filter((r) => r.status !== "sent");
      if (pending.length) failures.push(`${pending.length} approval mails not sent by the relay in time (first outbox ids ${pending.slice(0, 5).map((r) => `${r.id}:${r.status}`).join(", ")})`);

      const res = await fetch(`${o.mailboxUrl.replace(/\/$/, "")}/messages`);
      if (!res.ok) throw new Error(`mailbox ${o.mailboxUrl} answered ${res.status}`);
      const messages = (await res.json()) as { messageId: string }[];
      const seen = new Map<string, number>();
      for (const m of messages) seen.set(m.messageId, (seen.get(m.messageId) ?? 0) + 1);
      const dupes = [...seen].filter(([, n]) => n > 1);
      if (dupes.length) failures.push(`${dupes.length} Message-IDs received more than once, e.g. ${dupes.slice(0, 3).map(([id, n]) => `${id} ×${n}`).join(", ")}`);
      const approvalMails = approval.reduce((n, r) => n + (seen.get(messageIdFor(r.id)) ?? 0), 0);
      if (approvalMails !== ids.length) failures.push(`the mailbox holds ${approvalMails} approval mails, expected ${ids.length}`);
      mail = { expected: ids.length, approvalMails, duplicateMessageIds: dupes.length, total: messages.length };
    }
  } finally {
    await pool.end();
  }

  const times = o.run.outcomes.map((r) => r.ms).sort((a, b) => a - b);
  lags.sort((a, b) => a - b);
  return {
    races: o.run.outcomes.length,
    wins,
    failures,
    latency: { p50: percentile(times, 50), p95: percentile(times, 95), max: times.at(-1) ?? NaN },
    loserLagP50: percentile(lags, 50),
    mail,
  };
}
