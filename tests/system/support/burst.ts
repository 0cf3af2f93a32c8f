// Crash-safety harness: prepared applications, a burst of concurrent workflow transitions, a
// client-side ledger that is fsynced before a transition counts as acknowledged, and a check of
// the database against that ledger (state, audit and outbox of every transition: all or nothing).
// Reusable against any MariaDB topology: pass a Db (or a URL) or the base URLs of app servers.
import { open, readFile, type FileHandle } from "node:fs/promises";
import path from "node:path";
import { and, asc, count, eq, gt, inArray, isNotNull, max } from "drizzle-orm";
import { drizzle } from "drizzle-orm/mysql2";
import mysql from "mysql2/promise";
import type { Db } from "@/db/client";
import * as schema from "@/db/schema";
import { applications, assignments, auditEvents, invoices, outbox, reviewCycles, users } from "@/db/schema";
import { uploadDocument } from "@/lib/applications/documents";
import { createApplication, fireEvent } from "@/lib/applications/service";
import { hashPassword } from "@/lib/auth/password";
import { AppError, type ErrorCode } from "@/lib/errors";
import { WorkflowError } from "@/lib/workflow/errors";
import type { Role } from "@/lib/workflow/roles";
import { makeDrawingSet } from "../../fixtures/pdf/make";
import { signIn } from "./app";

// ---- small tools ---------------------------------------------------------------------------

export { randomInt, seededRandom } from "@/lib/seeded-random";

/** A pool with the app's own settings (db/client.ts), for a database other than DATABASE_URL. */
export function openDatabase(url: string, connectionLimit = 20): { database: Db; close: () => Promise<void> } {
  const pool = mysql.createPool({ uri: url, connectionLimit, waitForConnections: true, timezone: "Z", dateStrings: false, supportBigNumbers: true });
  return { database: drizzle(pool, { schema, mode: "default" }), close: () => pool.end() };
}

/**
 * D4: the settings under which "acknowledged means durable" holds for a mariadbd crash
 * (innodb_flush_log_at_trx_commit=1, doublewrite on, sync_binlog=1 when the binlog is on).
 */
export async function checkDurability(url: string): Promise<{ variables: Record<string, string>; problems: string[] }> {
  const conn = await mysql.createConnection({ uri: url });
  try {
    const [rows] = await conn.query<mysql.RowDataPacket[]>(
      "SHOW GLOBAL VARIABLES WHERE Variable_name IN ('innodb_flush_log_at_trx_commit','innodb_doublewrite','log_bin','sync_binlog','version')",
    );
    const variables = Object.fromEntries(rows.map((r) => [String(r.Variable_name), String(r.Value)]));
    const problems: string[] = [];
    if (variables.innodb_flush_log_at_trx_commit !== "1") problems.push(`innodb_flush_log_at_trx_commit is ${variables.innodb_flush_log_at_trx_commit}, must be 1`);
    if (variables.innodb_doublewrite !== "ON" && variables.innodb_doublewrite !== "1") problems.push(`innodb_doublewrite is ${variables.innodb_doublewrite}, must be ON`);
    if (variables.log_bin === "ON" && variables.sync_binlog !== "1") problems.push(`the binary log is on with sync_binlog=${variables.sync_binlog}, must be 1`);
    return { variables, problems };
  } finally {
    await conn.end();
  }
}

// ---- fixture -------------------------------------------------------------------------------

export interface BurstPerson {
  id: number;
  role: Role;
  name: string;
  email: string;
  firmId: number | null;
  password: string;
}

export interface BurstApplication {
  id: number;
  /** accepted for review once a submission reaches this version; null: returned as incomplete forever */
  acceptAtVersion: number | null;
}

export interface BurstFixture {
  people: { applicant: BurstPerson; technicians: BurstPerson[]; examiners: [BurstPerson, BurstPerson]; supervisor: BurstPerson };
  applications: BurstApplication[];
  /** what the database held when the fixture was ready; verification counts only what came after */
  baseline: {
    ids: { audit: number; outbox: number; assignments: number; cycles: number; invoices: number };
    applications: Record<number, { version: number; state: string; assignedExaminerId: number | null }>;
  };
}

const PASSWORD = "crash-harness-passphrase";

const DRAFT = {
  workDescription: "Single-story wood-frame accessory dwelling with a glulam header over the garage door",
  parcelNumber: "207-114-31",
  occupancyGroup: "R-3" as const,
  constructionType: "VB" as const,
  valuation: 21_500_000,
  dporName: "Maren Finch, PE",
  dporLicence: "PE-51873",
};

async function makePerson(database: Db, role: Role, name: string, tag: string, hash: string): Promise<BurstPerson> {
  const email = `${role}-${tag}-${Math.random().toString(36).slice(2, 8)}@larkspurfalls.example`;
  const [row] = await database.insert(users).values({ email, name, role, status: "active", passwordHash: hash }).$returningId();
  if (!row) throw new Error(`could not create the ${role} ${name}`);
  return { id: row.id, role, name, email, firmId: null, password: PASSWORD };
}

async function maxId(database: Db, table: typeof auditEvents | typeof outbox | typeof assignments | typeof reviewCycles | typeof invoices): Promise<number> {
  const [r] = await database.select({ m: max(table.id) }).from(table);
  return Number(r?.m ?? 0);
}

/**
 * Users and `count` draft applications with a drawing set, made through the service functions.
 * One application in three is returned as incomplete on every submission; the others are
 * accepted early (version 4) or late (version 40) and then reassigned back and forth.
 * Needs DATABASE_URL, AUTH_SECRET, APP_URL and STORAGE_DIR in process.env (the service reads them).
 */
export async function prepareFixture(database: Db, o: { applications: number; tag?: string }): Promise<BurstFixture> {
  if (!Number.isInteger(o.applications) || o.applications < 1) throw new Error(`prepareFixture: applications must be a positive integer, got ${o.applications}`);
  const tag = o.tag ?? "burst";
  const hash = await hashPassword(PASSWORD);
  const applicant = await makePerson(database, "applicant", "Tamsin Quarry", tag, hash);
  const technicians = [await makePerson(database, "technician", "Ruth Alder", tag, hash), await makePerson(database, "technician", "Joel Marsh", tag, hash)];
  const examiners: [BurstPerson, BurstPerson] = [await makePerson(database, "examiner", "Ines Corbel", tag, hash), await makePerson(database, "examiner", "Dev Tamarack", tag, hash)];
  const supervisor = await makePerson(database, "supervisor", "Hollis Finch", tag, hash);
  const pdf = await makeDrawingSet({ sheets: [{ number: "S-101", title: "FOUNDATION PLAN" }] });
  const apps: BurstApplication[] = [];
  for (let k = 0; k < o.applications; k++) {
    const app = await createApplication(database, applicant, { ...DRAFT, siteAddress: `${100 + k} Larkspur Lane, Larkspur Falls` });
    await uploadDocument(database, applicant, app.id, "drawings", "structural-set.pdf", pdf);
    apps.push({ id: app.id, acceptAtVersion: k % 3 === 0 ? null : k % 3 === 1 ? 4 : 40 });
  }
  const rows = await database
    .select({ id: applications.id, version: applications.version, state: applications.state, assignedExaminerId: applications.assignedExaminerId })
    .from(applications)
    .where(inArray(applications.id, apps.map((a) => a.id)));
  return {
    people: { applicant, technicians, examiners, supervisor },
    applications: apps,
    baseline: {
      ids: {
        audit: await maxId(database, auditEvents),
        outbox: await maxId(database, outbox),
        assignments: await maxId(database, assignments),
        cycles: await maxId(database, reviewCycles),
        invoices: await maxId(database, invoices),
      },
      applications: Object.fromEntries(rows.map((r) => [r.id, { version: r.version, state: r.state, assignedExaminerId: r.assignedExaminerId }])),
    },
  };
}

// ---- the transitions the burst fires --------------------------------------------------------

export type BurstEvent = "submit" | "return_incomplete" | "accept" | "reassign";

interface AppState {
  state: string;
  version: number;
  assignedExaminerId: number | null;
}

interface Step {
  event: BurstEvent;
  actor: BurstPerson;
  input: Record<string, unknown> | undefined;
}

/** The next transition for an application in this state; `token` makes its input recognisable in the audit row. */
function nextStep(f: BurstFixture, app: BurstApplication, s: AppState, token: string, lane: number): Step | null {
  const p = f.people;
  switch (s.state) {
    case "draft":
    case "returned_incomplete":
      return { event: "submit", actor: p.applicant, input: undefined };
    case "submitted":
      if (app.acceptAtVersion !== null && s.version >= app.acceptAtVersion) return { event: "accept", actor: p.technicians[0]!, input: { examinerId: p.examiners[0].id } };
      return { event: "return_incomplete", actor: p.technicians[lane % p.technicians.length]!, input: { reasons: [`Sheet index does not list every sheet (${token})`] } };
    case "in_review": {
      const to = s.assignedExaminerId === p.examiners[0].id ? p.examiners[1] : p.examiners[0];
      return { event: "reassign", actor: p.supervisor, input: { examinerId: to.id, reason: `Workload balance (${token})` } };
    }
    default:
      return null;
  }
}

// ---- ledger ----------------------------------------------------------------------------------

export type Outcome = "ack" | "rejected" | "in_doubt";

export interface IntentLine {
  type: "intent";
  id: string;
  round: number;
  lane: number;
  applicationId: number;
  event: BurstEvent;
  fromVersion: number;
  input: Record<string, unknown> | null;
  at: number;
}

export interface ResultLine {
  type: "result";
  id: string;
  outcome: Outcome;
  toVersion?: number;
  error?: string;
  at: number;
}

export type LedgerLine = IntentLine | ResultLine;

/**
 * Append-only JSON lines. `append` resolves only once the line is on disk (fdatasync); lines
 * waiting at the same time share one write and one sync, so 32 lanes do not queue on the disk.
 */
export class Ledger {
  private waiting: { line: string; resolve: () => void; reject: (e: unknown) => void }[] = [];
  private flushing = false;

  private constructor(
    readonly file: string,
    private readonly handle: FileHandle,
  ) {}

  static async open(file: string): Promise<Ledger> {
    const handle = await open(file, "a");
    // The new directory entry must survive a crash too.
    const dir = await open(path.dirname(file), "r");
    try {
      await dir.sync();
    } finally {
      await dir.close();
    }
    return new Ledger(file, handle);
  }

  append(line: LedgerLine): Promise<void> {
    return new Promise((resolve, reject) => {
      this.waiting.push({ line: JSON.stringify(line) + "\n", resolve, reject });
      void this.flush();
    });
  }

  private async flush(): Promise<void> {
    if (this.flushing) return;
    this.flushing = true;
    try {
      while (this.waiting.length) {
        const batch = this.waiting.splice(0);
        try {
          await this.handle.write(batch.map((b) => b.line).join(""));
          await this.handle.datasync();
          for (const b of batch) b.resolve();
        } catch (e) {
          for (const b of batch) b.reject(e);
        }
      }
    } finally {
      this.flushing = false;
    }
  }

  async close(): Promise<void> {
    await this.handle.close();
  }
}

/** Reads a ledger; a torn last line (the client died while writing it) is ignored. */
export async function readLedger(file: string): Promise<LedgerLine[]> {
  const lines = (await readFile(file, "utf8")).split("\n");
  const out: LedgerLine[] = [];
  lines.forEach((l, i) => {
    if (!l.trim()) return;
    try {
      out.push(JSON.parse(l) as LedgerLine);
    } catch (e) {
      if (i < lines.length - 2) throw new Error(`ledger ${file} line ${i + 1} is not JSON: ${(e as Error).message}`);
    }
  });
  return out;
}

// ---- drivers: in this process or over HTTP -----------------------------------------------------

export type BurstTarget = { database: Db } | { databaseUrl: string } | { baseUrl: string | readonly string[] };

/** Thrown by a driver: `rejected` is a definite refusal (nothing written), `in_doubt` anything else. */
class FireError extends Error {
  constructor(
    readonly outcome: Exclude<Outcome, "ack">,
    message: string,
  ) {
    super(message);
  }
}

interface Driver {
  probe(lane: number, applicationId: number): Promise<AppState>;
  fire(lane: number, actor: BurstPerson, applicationId: number, event: BurstEvent, version: number, input: Record<string, unknown> | undefined): Promise<{ state: string; version: number }>;
}

// Business refusals roll back before anything is written; "internal" (and any code added later) may not.
const DEFINITE: ReadonlySet<ErrorCode> = new Set(["unauthenticated", "forbidden", "not_found", "invalid_input", "conflict", "unprocessable"]);

function classify(e: unknown): FireError {
  const cause = (e as { cause?: unknown }).cause;
  const text = e instanceof Error ? `${e.name}: ${e.message}${cause instanceof Error ? ` (${cause.message})` : ""}` : String(e);
  const message = text.replace(/\s+/g, " ").slice(0, 300);
  if (e instanceof WorkflowError) return new FireError("rejected", message);
  if (e instanceof AppError && DEFINITE.has(e.code)) return new FireError("rejected", message);
  const code = (e as { code?: unknown; cause?: { code?: unknown } }).cause?.code ?? (e as { code?: unknown }).code;
  return new FireError("in_doubt", typeof code === "string" ? `${code}: ${message}` : message);
}

const pools = new Map<string, { database: Db; close: () => Promise<void> }>();

/** Ends the pools runBurst opened for `{ databaseUrl }` targets. */
export async function closeBurstPools(): Promise<void> {
  const all = [...pools.values()];
  pools.clear();
  await Promise.all(all.map((p) => p.close()));
}

function databaseDriver(database: Db): Driver {
  return {
    async probe(_lane, applicationId) {
      const [row] = await database
        .select({ state: applications.state, version: applications.version, assignedExaminerId: applications.assignedExaminerId })
        .from(applications)
        .where(eq(applications.id, applicationId));
      if (!row) throw new Error(`application ${applicationId} of the fixture is not in the database`);
      return row;
    },
    async fire(_lane, actor, applicationId, event, version, input) {
      try {
        return await fireEvent(database, actor, applicationId, event, version, input as never);
      } catch (e) {
        throw classify(e);
      }
    },
  };
}

function httpDriver(baseUrls: readonly string[], fixture: BurstFixture): Driver {
  if (baseUrls.length === 0) throw new Error("runBurst: baseUrl lists no app server");
  const cookies = new Map<string, Promise<string>>();
  const base = (lane: number) => baseUrls[lane % baseUrls.length]!;
  const cookie = (url: string, p: BurstPerson) => {
    const key = `${url} ${p.email}`;
    let c = cookies.get(key);
    if (!c) {
      c = signIn(url, p.email, p.password);
      c.catch(() => cookies.delete(key));
      cookies.set(key, c);
    }
    return c;
  };
  return {
    // The applicant reads the state and version from the application's own view.
    async probe(lane, applicationId) {
      const url = base(lane);
      const res = await fetch(`${url}/api/applications/${applicationId}`, { headers: { cookie: await cookie(url, fixture.people.applicant) } });
      if (!res.ok) throw new Error(`GET /api/applications/${applicationId} at ${url}: HTTP ${res.status}`);
      const a = ((await res.json()) as { application: AppState }).application;
      return { state: a.state, version: a.version, assignedExaminerId: a.assignedExaminerId };
    },
    async fire(lane, actor, applicationId, event, version, input) {
      const url = base(lane);
      let res: Response;
      try {
        res = await fetch(`${url}/api/applications/${applicationId}/events`, {
          method: "POST",
          headers: { cookie: await cookie(url, actor), origin: url, "content-type": "application/json" },
          body: JSON.stringify({ event, version, input }),
        });
      } catch (e) {
        throw new FireError("in_doubt", `network: ${(e as Error).message}`);
      }
      const text = await res.text().catch(() => "");
      if (res.ok) return JSON.parse(text) as { state: string; version: number };
      // 4xx: refused before anything was written; 5xx or a cut connection: it may have committed.
      throw new FireError(res.status >= 400 && res.status < 500 && res.status !== 408 ? "rejected" : "in_doubt", `HTTP ${res.status}: ${text.slice(0, 200)}`);
    },
  };
}

function driverFor(target: BurstTarget, fixture: BurstFixture): Driver {
  if ("database" in target) return databaseDriver(target.database);
  if ("databaseUrl" in target) {
    let d = pools.get(target.databaseUrl);
    if (!d) {
      // One pool per URL for the whole run: it has to outlive the server restarts.
      d = openDatabase(target.databaseUrl);
      pools.set(target.databaseUrl, d);
    }
    return databaseDriver(d.database);
  }
  return httpDriver(typeof target.baseUrl === "string" ? [target.baseUrl] : target.baseUrl, fixture);
}

// ---- the burst ---------------------------------------------------------------------------------

export interface BurstOptions {
  target: BurstTarget;
  fixture: BurstFixture;
  ledger: Ledger;
  round: number;
  /** transitions in flight at once, each lane on its own application (at most the fixture's count) */
  lanes: number;
  /** lanes start no new transition once aborted (e.g. when the database has been killed) */
  signal?: AbortSignal;
  /** per lane; default: until the first failure or the signal */
  maxPerLane?: number;
  random?: () => number;
}

export interface BurstStats {
  round: number;
  lanes: number;
  attempted: number;
  acknowledged: number;
  rejected: number;
  inDoubt: number;
  /** wall time of the burst, ms */
  ms: number;
  /** acknowledged transitions, from the intent's fsync to the commit, ms */
  latency: { p50: number; p95: number; max: number };
  /** first error message of each kind, for the log */
  errors: string[];
}

/**
 * Fires transitions in `lanes` concurrent lanes. Each lane writes an intent (fsynced) before a
 * transition and its result after: `ack` only once the service returned, i.e. after COMMIT.
 * A lane stops at its first failure: what happened to that transition is for verifyLedger to find.
 */
export async function runBurst(o: BurstOptions): Promise<BurstStats> {
  if (!Number.isInteger(o.lanes) || o.lanes < 1 || o.lanes > o.fixture.applications.length) {
    throw new Error(`runBurst: lanes must be 1..${o.fixture.applications.length} (one application each), got ${o.lanes}`);
  }
  const random = o.random ?? Math.random;
  const driver = driverFor(o.target, o.fixture);
  const order = [...o.fixture.applications];
  for (let i = order.length - 1; i > 0; i--) {
    const j = Math.floor(random() * (i + 1));
    [order[i], order[j]] = [order[j]!, order[i]!];
  }
  const stats: BurstStats = { round: o.round, lanes: o.lanes, attempted: 0, acknowledged: 0, rejected: 0, inDoubt: 0, ms: 0, latency: { p50: 0, p95: 0, max: 0 }, errors: [] };
  const latencies: number[] = [];
  const note = (m: string) => {
    const kind = m.slice(0, 40);
    if (stats.errors.length < 8 && !stats.errors.some((e) => e.startsWith(kind))) stats.errors.push(m);
  };
  const t0 = performance.now();

  async function lane(n: number, app: BurstApplication): Promise<void> {
    let s: AppState;
    try {
      s = await driver.probe(n, app.id);
    } catch (e) {
      note(`probe: ${(e as Error).message}`);
      return;
    }
    for (let k = 0; !o.signal?.aborted && k < (o.maxPerLane ?? Infinity); k++) {
      const id = `r${o.round}.l${n}.t${k}`;
      const step = nextStep(o.fixture, app, s, id, n);
      if (!step) throw new Error(`application ${app.id} is in state ${s.state}, which the burst has no transition for`);
      await o.ledger.append({ type: "intent", id, round: o.round, lane: n, applicationId: app.id, event: step.event, fromVersion: s.version, input: step.input ?? null, at: Date.now() });
      stats.attempted++;
      const started = performance.now();
      try {
        const r = await driver.fire(n, step.actor, app.id, step.event, s.version, step.input);
        await o.ledger.append({ type: "result", id, outcome: "ack", toVersion: r.version, at: Date.now() });
        stats.acknowledged++;
        latencies.push(performance.now() - started);
        const examinerId = step.event === "accept" || step.event === "reassign" ? (step.input!.examinerId as number) : s.assignedExaminerId;
        s = { state: r.state, version: r.version, assignedExaminerId: examinerId };
      } catch (e) {
        const f = e instanceof FireError ? e : new FireError("in_doubt", String(e));
        await o.ledger.append({ type: "result", id, outcome: f.outcome, error: f.message, at: Date.now() });
        if (f.outcome === "rejected") stats.rejected++;
        else stats.inDoubt++;
        note(`${f.outcome}: ${f.message}`);
        return;
      }
    }
  }

  await Promise.all(order.slice(0, o.lanes).map((app, n) => lane(n, app)));
  stats.ms = Math.round(performance.now() - t0);
  latencies.sort((a, b) => a - b);
  const q = (p: number) => Math.round(latencies[Math.min(latencies.length - 1, Math.floor(p * latencies.length))] ?? 0);
  stats.latency = { p50: q(0.5), p95: q(0.95), max: Math.round(latencies.at(-1) ?? 0) };
  return stats;
}

// ---- verification --------------------------------------------------------------------------------

export interface VerifyReport {
  applications: number;
  /** transitions the database holds (version steps since the fixture) */
  applied: number;
  acknowledged: number;
  inDoubtApplied: number;
  inDoubtAbsent: number;
  rejected: number;
  auditRows: number;
  outboxRows: number;
  problems: string[];
}

// What each transition owes, by hand from the workflow table and the fee rules (one invoice at acceptance).
const AUDIT: Record<BurstEvent, string[]> = {
  submit: ["application.submitted"],
  return_incomplete: ["application.returned_incomplete"],
  accept: ["application.accepted", "invoice.issued"],
  reassign: ["review.reassigned"],
};
const STATE_AFTER: Record<BurstEvent, string | null> = { submit: "submitted", return_incomplete: "returned_incomplete", accept: "in_review", reassign: null };

function expectedMail(f: BurstFixture, event: BurstEvent, examinerBefore: number | null, examinerAfter: number | null): string[] {
  const email = (id: number | null) => [...f.people.examiners].find((e) => e.id === id)?.email ?? `(examiner #${id})`;
  const applicant = f.people.applicant.email;
  switch (event) {
    case "submit":
      return [`intake.receipt ${applicant}`, ...f.people.technicians.map((t) => `intake.new_submission ${t.email}`)];
    case "return_incomplete":
      return [`intake.returned_incomplete ${applicant}`];
    case "accept":
      return [`fees.invoice_issued ${applicant}`, `intake.accepted ${applicant}`, `review.assigned ${email(examinerAfter)}`];
    case "reassign":
      return [`review.assigned ${email(examinerAfter)}`, `review.reassigned_away ${email(examinerBefore)}`];
  }
}

const sameBag = (a: string[], b: string[]) => JSON.stringify([...a].sort()) === JSON.stringify([...b].sort());

/**
 * Checks the database against the ledger. For every application of the fixture: each version
 * step since the fixture is exactly one transition of the ledger (acknowledged or in doubt, never
 * refused), with its own audit rows, outbox rows, assignment, review cycle and invoice, and nothing
 * else; every acknowledged transition is among them; the state and examiner follow from the chain.
 */
export async function verifyLedger(database: Db, fixture: BurstFixture, lines: readonly LedgerLine[]): Promise<VerifyReport> {
  const report: VerifyReport = { applications: fixture.applications.length, applied: 0, acknowledged: 0, inDoubtApplied: 0, inDoubtAbsent: 0, rejected: 0, auditRows: 0, outboxRows: 0, problems: [] };
  const problem = (m: string) => {
    if (report.problems.length < 50) report.problems.push(m);
  };
  const results = new Map<string, ResultLine>();
  for (const l of lines) if (l.type === "result") results.set(l.id, l);
  const intents = new Map<number, IntentLine[]>();
  for (const l of lines) {
    if (l.type !== "intent") continue;
    const list = intents.get(l.applicationId) ?? [];
    list.push(l);
    intents.set(l.applicationId, list);
  }
  // An intent without a result: the client died before it heard back, so it is in doubt too.
  const outcome = (i: IntentLine): Outcome => results.get(i.id)?.outcome ?? "in_doubt";
  const describe = (i: IntentLine) => `${i.id} (${i.event} from v${i.fromVersion} of application ${i.applicationId})`;
  const b = fixture.baseline.ids;

  for (const app of fixture.applications) {
    const base = fixture.baseline.applications[app.id];
    if (!base) {
      problem(`application ${app.id} has no baseline in the fixture`);
      continue;
    }
    const [row] = await database.select().from(applications).where(eq(applications.id, app.id));
    if (!row) {
      problem(`application ${app.id} is gone`);
      continue;
    }
    const mine = intents.get(app.id) ?? [];
    for (const i of mine) {
      const r = results.get(i.id);
      if (r?.outcome === "ack") {
        report.acknowledged++;
        if (r.toVersion !== i.fromVersion + 1) problem(`${describe(i)} was acknowledged with version ${r.toVersion}, expected ${i.fromVersion + 1}`);
      }
      if (r?.outcome === "rejected") report.rejected++;
    }

    // The chain of applied transitions: for each version step the last intent that started from it.
    const chain: IntentLine[] = [];
    for (let v = base.version; v < row.version; v++) {
      const from = mine.filter((i) => i.fromVersion === v);
      const last = from.at(-1);
      if (!last) {
        problem(`application ${app.id} went from v${v} to v${v + 1} with no transition in the ledger`);
        break;
      }
      // Earlier tries from the same version did not take: the lane found the old version again.
      for (const earlier of from.slice(0, -1)) {
        if (outcome(earlier) === "ack") problem(`acknowledged ${describe(earlier)} is lost: a later transition started from the same version`);
        if (outcome(earlier) === "in_doubt") report.inDoubtAbsent++;
      }
      if (outcome(last) === "rejected") problem(`refused ${describe(last)} was applied`);
      if (outcome(last) === "in_doubt") report.inDoubtApplied++;
      chain.push(last);
    }
    for (const i of mine.filter((x) => x.fromVersion >= row.version)) {
      if (outcome(i) === "ack") problem(`acknowledged ${describe(i)} is missing: the application is at v${row.version}`);
      if (outcome(i) === "in_doubt") report.inDoubtAbsent++;
    }
    report.applied += chain.length;

    // What the chain owes, transition by transition.
    let state = base.state;
    let examiner = base.assignedExaminerId;
    const owed: { intent: IntentLine; audit: string[]; mail: string[] }[] = [];
    let assignmentsOwed = 0;
    let cyclesOwed = 0;
    let invoicesOwed = 0;
    for (const i of chain) {
      const after = i.event === "accept" || i.event === "reassign" ? Number(i.input?.examinerId) : examiner;
      owed.push({ intent: i, audit: AUDIT[i.event], mail: expectedMail(fixture, i.event, examiner, after) });
      if (i.event === "accept" || i.event === "reassign") assignmentsOwed++;
      if (i.event === "accept") {
        cyclesOwed++;
        invoicesOwed++;
      }
      state = STATE_AFTER[i.event] ?? state;
      examiner = after;
    }
    if (row.state !== state) problem(`application ${app.id} is "${row.state}" at v${row.version}; its transitions lead to "${state}"`);
    if (row.assignedExaminerId !== examiner) problem(`application ${app.id} is assigned to #${row.assignedExaminerId}; its transitions lead to #${examiner}`);

    // Rows of one application come from its transitions one after another, so id order is chain order.
    const audit = await database
      .select({ id: auditEvents.id, action: auditEvents.action, detail: auditEvents.detail })
      .from(auditEvents)
      .where(and(eq(auditEvents.applicationId, app.id), gt(auditEvents.id, b.audit)))
      .orderBy(asc(auditEvents.id));
    const mail = await database
      .select({ id: outbox.id, template: outbox.template, to: outbox.toAddress })
      .from(outbox)
      .where(and(eq(outbox.applicationId, app.id), gt(outbox.id, b.outbox)))
      .orderBy(asc(outbox.id));
    report.auditRows += audit.length;
    report.outboxRows += mail.length;
    let a = 0;
    let m = 0;
    for (const o of owed) {
      const got = audit.slice(a, a + o.audit.length);
      a += o.audit.length;
      if (!sameBag(got.map((g) => g.action), o.audit)) {
        problem(`${describe(o.intent)}: audit rows ${JSON.stringify(got.map((g) => g.action))}, expected ${JSON.stringify(o.audit)}`);
      } else {
        const own = got.find((g) => g.action === o.audit[0])!;
        const detail = (own.detail ?? {}) as { input?: Record<string, unknown> };
        // The refusal reason and the reassignment reason carry the intent's id: this row is that transition's.
        for (const [k, v] of Object.entries(o.intent.input ?? {})) {
          if (JSON.stringify(detail.input?.[k]) !== JSON.stringify(v)) problem(`${describe(o.intent)}: audit row ${own.id} has ${k}=${JSON.stringify(detail.input?.[k])}, the ledger ${JSON.stringify(v)}`);
        }
      }
      const sent = mail.slice(m, m + o.mail.length);
      m += o.mail.length;
      if (!sameBag(sent.map((s) => `${s.template} ${s.to}`), o.mail)) {
        problem(`${describe(o.intent)}: outbox rows ${JSON.stringify(sent.map((s) => `${s.template} ${s.to}`))}, expected ${JSON.stringify(o.mail)}`);
      }
    }
    if (audit.length > a) problem(`application ${app.id}: ${audit.length - a} audit row(s) without a state change: ${JSON.stringify(audit.slice(a).map((x) => x.action))}`);
    if (mail.length > m) problem(`application ${app.id}: ${mail.length - m} outbox row(s) without a state change: ${JSON.stringify(mail.slice(m).map((x) => x.template))}`);

    const counted = async (table: typeof assignments | typeof reviewCycles | typeof invoices, after: number) => {
      const [r] = await database.select({ n: count() }).from(table).where(and(eq(table.applicationId, app.id), gt(table.id, after)));
      return Number(r?.n ?? 0);
    };
    const got = { assignments: await counted(assignments, b.assignments), cycles: await counted(reviewCycles, b.cycles), invoices: await counted(invoices, b.invoices) };
    const want = { assignments: assignmentsOwed, cycles: cyclesOwed, invoices: invoicesOwed };
    if (JSON.stringify(got) !== JSON.stringify(want)) problem(`application ${app.id}: ${JSON.stringify(got)} written since the fixture, its transitions owe ${JSON.stringify(want)}`);
  }

  // No application outside the fixture was written to (sign-ins over HTTP audit too, about no application).
  const [strayAudit] = await database.select({ n: count() }).from(auditEvents).where(and(gt(auditEvents.id, b.audit), isNotNull(auditEvents.applicationId)));
  const [strayMail] = await database.select({ n: count() }).from(outbox).where(and(gt(outbox.id, b.outbox), isNotNull(outbox.applicationId)));
  const extraAudit = Number(strayAudit?.n ?? 0) - report.auditRows;
  const extraMail = Number(strayMail?.n ?? 0) - report.outboxRows;
  if (extraAudit !== 0) problem(`${extraAudit} audit row(s) about applications outside the fixture's ${fixture.applications.length}`);
  if (extraMail !== 0) problem(`${extraMail} outbox row(s) about applications outside the fixture`);
  return report;
}
