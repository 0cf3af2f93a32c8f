// Spanproof on a three-node MariaDB Galera cluster (scripts/cluster.sh): the integration
// workflow tests against a node; a node killed with kill -9 in the middle of a burst of
// transitions (run here through the app's pool over all three hosts), then caught up
// incrementally, with every acknowledged transition on every node; two production app
// instances, each pinned to a different node, racing the same approvals; and at the end
// CHECKSUM TABLE equal everywhere and no e-mail sent twice by the two relays on two nodes.
import { spawn } from "node:child_process";
import { rm } from "node:fs/promises";
import { sql } from "drizzle-orm";
import mysql from "mysql2/promise";
import { afterAll, afterEach, beforeAll, describe, expect, it } from "vitest";
import { closeDb, createPool, db } from "@/db/client";
import { env } from "@/lib/env";
import { startMailReceiver, type Receiver } from "@/lib/mail/receiver";
import { messageIdFor } from "@/lib/mail/transport";
import { databaseUrl, freshDatabase, port, signIn, startApp, startProcess, startWorker, type Proc } from "./support/app";
import { Ledger, openDatabase, prepareFixture, randomInt, readLedger, runBurst, seededRandom, verifyLedger, type BurstFixture } from "./support/burst";
import { prepareApprovals, raceApprovals, verifyRaces } from "./support/race";

const RACES = Number(process.env.CLUSTER_RACE_COUNT ?? 500);
const KILL_ROUNDS = 3;
const SEED = Number(process.env.CLUSTER_SEED ?? Math.floor(Math.random() * 2 ** 31));
// SQL ports port(31..33), apps port(34..35), mail port(36..37), worker health port(38..39).
const SQL = [port(31), port(32), port(33)] as const;
// Galera's own ports (gcomm, and IST/state transfer at +1/+2) sit outside the system range.
const GCOMM = process.env.CLUSTER_GCOMM_PORTS ?? "4667,4677,4687";
const CLUSTER = { CLUSTER_DIR: `.data/system-cluster-${port(0)}`, CLUSTER_SQL_PORTS: SQL.join(","), CLUSTER_GCOMM_PORTS: GCOMM };
const NAME = "spanproof_cluster";
// The workflow, its fees and payments, the review-clock reminders and the mail relay.
const INTEGRATION_FILES = ["applications", "fees", "payments", "reminders", "outbox"].map((f) => `tests/integration/${f}.test.ts`);
const LEDGER = `.data/system-cluster-ledger-${port(0)}.jsonl`;
const STORAGE = `.data/system-cluster-storage-${port(0)}`;
/** Hosts in order of preference, starting at node `first` (1-based). */
const hostsFrom = (first: number) => [0, 1, 2].map((k) => `127.0.0.1:${SQL[(first - 1 + k) % 3]}`).join(",");
const nodeUrl = (n: number, name = NAME) => databaseUrl(name, SQL[n - 1]);

const t0 = performance.now();
const since = () => `${((performance.now() - t0) / 1000).toFixed(1)} s`;
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
let receiver: Receiver | undefined;
let a: (Proc & { url: string }) | undefined;
let b: (Proc & { url: string }) | undefined;
const workers: Proc[] = [];
// Until the set-up has finished, and after any failure: keep the node data for a look.
let failed = true;
// Wall-clock instants (ms) of the kills: a notice a relay had just handed to SMTP when its node
// died could not be marked sent, and is sent again once its claim runs out (the send window).
const killInstants: number[] = [];
const SEND_WINDOW_MS = 3_000;

/** scripts/cluster.sh with this test's ports and folder; rejects with its output on failure. */
function cluster(...args: string[]): Promise<string> {
  return new Promise((resolve, reject) => {
    const child = spawn("bash", ["scripts/cluster.sh", ...args], { env: { ...process.env, ...CLUSTER }, stdio: ["ignore", "pipe", "pipe"] });
    let out = "";
    child.stdout.on("data", (d: Buffer) => (out += d.toString()));
    child.stderr.on("data", (d: Buffer) => (out += d.toString()));
    child.on("exit", (code) => (code === 0 ? resolve(out) : reject(new Error(`scripts/cluster.sh ${args.join(" ")} exited ${code}:\n${out}`))));
  });
}

async function onNode<T>(n: number, fn: (c: mysql.Connection) => Promise<T>, name = NAME): Promise<T> {
  const c = await mysql.createConnection({ uri: nodeUrl(n, name) });
  try {
    // Read what the cluster has committed, not what this node has applied so far.
    await c.query("SET SESSION wsrep_sync_wait = 1");
    return await fn(c);
  } finally {
    await c.end();
  }
}

async function status(n: number, name: string): Promise<string> {
  return onNode(n, async (c) => {
    const [rows] = await c.query<mysql.RowDataPacket[]>("SHOW GLOBAL STATUS LIKE ?", [name]);
    return String(rows[0]?.Value ?? "");
  });
}

/** The port of the node this process's pool (db()) talks to; a connection the kill cut is tried again. */
async function poolPort(tries: number): Promise<{ port: number }> {
  for (let i = 1; ; i++) {
    try {
      const [[row]] = (await db().execute(sql`SELECT @@port AS port`)) as unknown as [[{ port: number }]];
      return row;
    } catch (e) {
      if (i >= tries) throw e;
    }
  }
}

/** Waits until every node has applied the same last write-set; returns the seqno per node. */
async function converged(): Promise<string[]> {
  let last: string[] = [];
  for (let i = 0; i < 100; i++) {
    last = await Promise.all([1, 2, 3].map((n) => status(n, "wsrep_last_committed")));
    if (new Set(last).size === 1) return last;
    await sleep(100);
  }
  return last;
}

/** CHECKSUM TABLE of every table, per node, once all nodes have applied the same last write-set. */
async function checksums(): Promise<{ byNode: Record<string, string>[]; lastCommitted: string[] }> {
  const lastCommitted = await converged();
  const byNode = await Promise.all(
    [1, 2, 3].map((n) =>
      onNode(n, async (c) => {
        const [tables] = await c.query<mysql.RowDataPacket[]>("SELECT table_name AS t FROM information_schema.tables WHERE table_schema = DATABASE() AND table_type = 'BASE TABLE' ORDER BY 1");
        const [rows] = await c.query<mysql.RowDataPacket[]>(`CHECKSUM TABLE ${tables.map((r) => `\`${String(r.t)}\``).join(", ")}`);
        return Object.fromEntries(rows.map((r) => [String(r.Table), String(r.Checksum)]));
      }),
    ),
  );
  return { byNode, lastCommitted };
}

async function waitForOutboxDrained(timeoutMs: number): Promise<{ sent: number; pending: number }> {
  const until = Date.now() + timeoutMs;
  let counts = { sent: 0, pending: -1 };
  while (Date.now() < until) {
    counts = await onNode(3, async (c) => {
      const [rows] = await c.query<mysql.RowDataPacket[]>("SELECT SUM(status = 'sent') AS sent, SUM(status <> 'sent') AS pending FROM outbox");
      return { sent: Number(rows[0]?.sent ?? 0), pending: Number(rows[0]?.pending ?? 0) };
    });
    if (counts.pending === 0) return counts;
    await sleep(500);
  }
  return counts;
}

const galera = (first: number) => ({ DATABASE_HOSTS: hostsFrom(first), DATABASE_CLUSTER: "galera", STORAGE_DIR: STORAGE });

/** Two relays on two nodes: claims certified cluster-wide, never the same message twice. */
async function startRelays(): Promise<void> {
  const relay = (first: number) => ({ ...galera(first), OUTBOX_LEASE_SEC: "15", WORKER_INTERVAL_MS: "50" });
  workers.push(
    await startWorker({ databaseUrl: nodeUrl(1), smtpPort: port(36), healthPort: port(38), env: relay(1) }),
    await startWorker({ databaseUrl: nodeUrl(3), smtpPort: port(36), healthPort: port(39), env: relay(3) }),
  );
}
async function stopRelays(): Promise<void> {
  await Promise.all(workers.splice(0).map((w) => w.stop()));
}

beforeAll(async () => {
  // A cluster left by an interrupted run: stop it (all nodes) and start from empty folders.
  await cluster("stop").catch(() => "");
  await rm(CLUSTER.CLUSTER_DIR, { recursive: true, force: true });
  await rm(LEDGER, { force: true });
  const out = await cluster("start");
  console.log(`[cluster] ${out.trim().split("\n").at(-1)} at ${since()}`);
  await freshDatabase(NAME, SQL[0]);
  // The service in this process (fixtures) talks to the cluster through the app's own pool.
  Object.assign(process.env, {
    DATABASE_URL: nodeUrl(1),
    DATABASE_HOSTS: hostsFrom(1),
    DATABASE_CLUSTER: "galera",
    APP_URL: "http://127.0.0.1:1",
    AUTH_SECRET: process.env.AUTH_SECRET ?? "cluster-test-secret-0123456789abcdef0123456789",
    STORAGE_DIR: STORAGE,
    PAYMENT_REQUIRED_BEFORE_REVIEW: "false",
  });
  if (env().DATABASE_HOSTS !== hostsFrom(1)) throw new Error("the service was configured before this test pointed it at the cluster");
  receiver = await startMailReceiver({ smtpPort: port(36), httpPort: port(37) });
  [a, b] = await Promise.all([
    startApp({ port: port(34), databaseUrl: nodeUrl(1), smtpPort: port(36), env: galera(1) }),
    startApp({ port: port(35), databaseUrl: nodeUrl(2), smtpPort: port(36), env: galera(2) }),
  ]);
  await startRelays();
  console.log(`[cluster] seed ${SEED}; apps on nodes 1 and 2, relays on nodes 1 and 3, ready at ${since()}`);
  failed = false;
});

afterEach(({ task }) => {
  if (task.result?.state === "fail") failed = true;
});

afterAll(async () => {
  await Promise.all([a?.stop(), b?.stop(), stopRelays()]);
  await receiver?.close();
  await closeDb();
  await cluster("stop").catch((e: Error) => console.error(e.message));
  // ≈ 700 MB of node data: kept only when something failed, with the ledger, for a look.
  if (!failed) await Promise.all([rm(CLUSTER.CLUSTER_DIR, { recursive: true, force: true }), rm(LEDGER, { force: true }), rm(STORAGE, { recursive: true, force: true }), rm(`${STORAGE}-it`, { recursive: true, force: true })]);
  console.log(`[cluster] whole file ${since()}${failed ? `; node data kept in ${CLUSTER.CLUSTER_DIR}` : ""}`);
});

describe("Spanproof on a three-node Galera cluster", () => {
  it("is a cluster: three Synced nodes, ids stepping by three, a pool that waits for the cluster on every read (READ COMMITTED)", async () => {
    for (const n of [1, 2, 3]) {
      expect(await status(n, "wsrep_cluster_size")).toBe("3");
      expect(await status(n, "wsrep_local_state_comment")).toBe("Synced");
    }
    const p = createPool({ url: nodeUrl(2), hosts: hostsFrom(2), connectionLimit: 1 });
    try {
      const [rows] = await p.query<mysql.RowDataPacket[]>(
        "SELECT @@port AS port, @@session.wsrep_sync_wait AS sync_wait, @@session.tx_isolation AS isolation, @@auto_increment_increment AS step",
      );
      expect(rows[0]).toEqual({ port: SQL[1], sync_wait: 1, isolation: "READ-COMMITTED", step: 3 });
    } finally {
      await p.end();
    }
  });

  it("passes the integration suite's workflow, fee, payment, reminder and outbox tests against node 1", async () => {
    // Their own database on the cluster: the integration suite empties its tables between tests.
    const url = await freshDatabase("spanproof_cluster_it", SQL[0]);
    const started = performance.now();
    const run = startProcess(
      process.execPath,
      ["node_modules/vitest/vitest.mjs", "run", "--project", "integration", ...INTEGRATION_FILES],
      // Owner account and hosts of the cluster only: nothing may reach the test instance's databases.
      { INTEGRATION_DATABASE_URL: url, DATABASE_HOSTS: hostsFrom(1), DATABASE_CLUSTER: "galera", MIGRATION_DATABASE_URL: undefined, INTEGRATION_STORAGE_DIR: `${STORAGE}-it` },
    );
    const code = await new Promise<number | null>((r) => run.child.once("exit", (c) => r(c)));
    const summary = run.output().split("\n").filter((l) => /Test Files|Tests |FAIL|✗|×/.test(l)).join("\n");
    console.log(`[cluster] integration tests on node 1 in ${((performance.now() - started) / 1000).toFixed(1)} s:\n${summary}`);
    expect(code, run.output().slice(-6000)).toBe(0);
    expect(run.output()).toMatch(new RegExp(`Test Files\\s+.*${INTEGRATION_FILES.length} passed`));
  });

  it(`keeps every acknowledged transition on every node through ${KILL_ROUNDS} kill -9 of a node mid-burst`, async () => {
    const fixture: BurstFixture = await prepareFixture(db(), { applications: 32, tag: "cluster" });
    const ledger = await Ledger.open(LEDGER);
    const random = seededRandom(SEED);
    const total = { attempted: 0, acknowledged: 0, inDoubt: 0, rejected: 0 };
    try {
      for (let round = 1; round <= KILL_ROUNDS; round++) {
        // Odd rounds kill the node this process's pool is pinned to (it must fail over), even
        // rounds another one (the pool's node stalls for the suspect timeout, then goes on).
        const at = await poolPort(1);
        const current = SQL.indexOf(Number(at.port) as (typeof SQL)[number]) + 1;
        const victim = round % 2 === 1 ? current : (current % 3) + 1;
        const lanes = randomInt(random, 6, 12);
        const killAfterMs = randomInt(random, 300, 900);
        const stop = new AbortController();
        // At most 30 transitions a lane: the relays must then send every notice (≈ 3 a transition) in the time the suite has.
        const burst = runBurst({ target: { database: db() }, fixture, ledger, round, lanes, signal: stop.signal, random, maxPerLane: 30 });
        await sleep(killAfterMs);
        await cluster("kill", String(victim));
        const killedAt = performance.now();
        killInstants.push(Date.now());
        if (victim === current) {
          // The pool's node is gone: its next connection must come from another node.
          const moved = await poolPort(3);
          expect(Number(moved.port)).not.toBe(SQL[victim - 1]);
          console.log(`[cluster] round ${round}: the pool failed over from node ${victim} to port ${moved.port} in ${(performance.now() - killedAt).toFixed(0)} ms`);
        }
        // The survivors stall for the suspect timeout (≈ 3–4 s), then go on without the victim.
        await sleep(5_000);
        stop.abort();
        const stats = await burst;
        const restart = await cluster("restart", String(victim));
        const caughtUp = /incremental state transfer|nothing to transfer/.test(restart);
        console.log(
          `[cluster] round ${round}: pool on node ${current}, node ${victim} killed after ${killAfterMs} ms, ${lanes} lanes; ${stats.attempted} attempted, ${stats.acknowledged} acknowledged, ` +
            `${stats.inDoubt} in doubt, ${stats.rejected} refused; p95 ${stats.latency.p95} ms, max ${stats.latency.max} ms; ` +
            `rejoined ${((performance.now() - killedAt) / 1000).toFixed(1)} s after the kill: ${restart.trim().split("\n").at(-1)}`,
        );
        expect(caughtUp, restart).toBe(true);
        total.attempted += stats.attempted;
        total.acknowledged += stats.acknowledged;
        total.inDoubt += stats.inDoubt;
        total.rejected += stats.rejected;

        const lines = await readLedger(ledger.file);
        for (const n of [1, 2, 3]) {
          const check = openDatabase(nodeUrl(n), 2);
          try {
            const report = await verifyLedger(check.database, fixture, lines);
            expect(report.problems, `node ${n} after round ${round}`).toEqual([]);
          } finally {
            await check.close();
          }
        }
      }
    } finally {
      await ledger.close();
    }
    console.log(`[cluster] ${KILL_ROUNDS} kills: ${total.attempted} transitions attempted, ${total.acknowledged} acknowledged, ${total.inDoubt} in doubt, ${total.rejected} refused`);
    expect(total.acknowledged).toBeGreaterThan(KILL_ROUNDS * 20);
  });

  it(`races ${RACES} approvals through two instances on two nodes: exactly one winner each, one e-mail each`, async () => {
    // The preparation marks its own notices sent in bulk; a relay claiming them on another node
    // at that moment would make that one statement lose certification. The relays rest meanwhile.
    await stopRelays();
    const prepared = await prepareApprovals({ databaseUrl: nodeUrl(1), count: RACES, tag: "cluster" });
    await startRelays();
    console.log(`[cluster] prepared ${RACES} applications in ${(prepared.ms / 1000).toFixed(1)} s (${prepared.deadlocksRetried} deadlocks retried) at ${since()}`);
    const cookie = await signIn(a!.url, prepared.examiner.email, prepared.examiner.password);
    const run = await raceApprovals({ instances: [a!.url, b!.url], cookie, apps: prepared.apps, concurrency: 8 });
    // verifyRaces reads through a plain pool: let node 3 apply every race's write-set first.
    await converged();
    const report = await verifyRaces({ databaseUrl: nodeUrl(3), run, mailboxUrl: `http://127.0.0.1:${port(37)}`, drainTimeoutMs: 240_000 });
    console.log(
      `[cluster] ${report.races} races in ${(run.wallMs / 1000).toFixed(1)} s: wins node-1 instance ${report.wins[a!.url] ?? 0}, node-2 instance ${report.wins[b!.url] ?? 0}; ` +
        `latency p50 ${report.latency.p50.toFixed(1)} ms, p95 ${report.latency.p95.toFixed(1)} ms, max ${report.latency.max.toFixed(1)} ms; ` +
        `mail ${report.mail?.approvalMails}/${report.mail?.expected}, ${report.mail?.duplicateMessageIds} duplicate Message-IDs`,
    );
    expect(report.failures.slice(0, 20)).toEqual([]);
    expect(report.races).toBe(RACES);
    expect((report.wins[a!.url] ?? 0) + (report.wins[b!.url] ?? 0)).toBe(RACES);
    expect(report.wins[a!.url] ?? 0).toBeGreaterThan(0);
    expect(report.wins[b!.url] ?? 0).toBeGreaterThan(0);
    expect(report.mail).toMatchObject({ expected: RACES, approvalMails: RACES, duplicateMessageIds: 0 });
  });

  it("ends with every notice sent once and the same data on all three nodes (CHECKSUM TABLE)", async () => {
    // Every queued notice sent, and sent once, except a notice in flight when its relay's node was
    // killed: that one at most twice, its first copy received within the send window of a kill.
    const drained = await waitForOutboxDrained(120_000);
    expect(drained.pending).toBe(0);
    await stopRelays();
    const sentIds = await onNode(2, async (c) => {
      // attempts > 0: sent by a relay (the race's preparation marks its own notices sent unsent).
      const [rows] = await c.query<mysql.RowDataPacket[]>("SELECT id FROM outbox WHERE status = 'sent' AND attempts > 0");
      return rows.map((r) => Number(r.id));
    });
    const seen = new Map<string, number[]>();
    for (const m of receiver!.messages) seen.set(m.messageId, [...(seen.get(m.messageId) ?? []), Date.parse(m.receivedAt)]);
    const dupes = [...seen].filter(([, at]) => at.length > 1);
    const missing = sentIds.filter((id) => !seen.has(messageIdFor(id)));
    const nearKill = (t: number) => killInstants.some((k) => t >= k - SEND_WINDOW_MS && t <= k + 500);
    const unexplained = dupes.filter(([, at]) => at.length > 2 || !nearKill(Math.min(...at)));
    console.log(
      `[cluster] ${sentIds.length} outbox rows sent, ${receiver!.messages.length} messages received, ${dupes.length} duplicate Message-IDs` +
        `${dupes.length ? ` (in flight at a kill: ${dupes.map(([id]) => id).join(", ")})` : ""}, ${missing.length} missing`,
    );
    expect(unexplained.map(([id, at]) => `${id} ×${at.length}, first at ${new Date(Math.min(...at)).toISOString()}`)).toEqual([]);
    // At most one in flight per relay per kill.
    expect(dupes.length).toBeLessThanOrEqual(2 * KILL_ROUNDS);
    expect(missing).toEqual([]);

    const sums = await checksums();
    expect(new Set(sums.lastCommitted).size, `wsrep_last_committed per node: ${sums.lastCommitted.join(", ")}`).toBe(1);
    expect(Object.keys(sums.byNode[0]!).length).toBeGreaterThan(10);
    expect(sums.byNode[1]).toEqual(sums.byNode[0]);
    expect(sums.byNode[2]).toEqual(sums.byNode[0]);
    console.log(`[cluster] CHECKSUM TABLE equal on all 3 nodes for ${Object.keys(sums.byNode[0]!).length} tables (last committed seqno ${sums.lastCommitted[0]}) at ${since()}`);
  });
});
