// D1: kill -9 of mariadbd in the middle of a burst of concurrent workflow transitions, 20 rounds.
// The transitions run in this process through the service (fireEvent) on the app's own pool
// (db/client.ts), which has to come back by itself after every restart. A client-side ledger,
// fsynced, records each transition's intent before it and its acknowledgement after COMMIT
// returned; after crash recovery the database must hold every acknowledged transition whole
// (state, audit, outbox, assignment, cycle, invoice) and any in-doubt one whole or not at all.
import { rm } from "node:fs/promises";
import mysql from "mysql2/promise";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb, db } from "@/db/client";
import { env } from "@/lib/env";
import { freshDatabase, port } from "./support/app";
import { checkDurability, Ledger, openDatabase, prepareFixture, randomInt, readLedger, runBurst, seededRandom, verifyLedger, type BurstFixture, type VerifyReport } from "./support/burst";
import { privateDb } from "./support/private-db";

const ROUNDS = 20;
// CRASH_SEED replays a run: lanes, kill moments and application order all come from it.
const SEED = Number(process.env.CRASH_SEED ?? Math.floor(Math.random() * 2 ** 31));
const NAME = "spanproof_crash";
const mdb = privateDb({ dir: ".data/crash-db", port: port(20), name: NAME });
const LEDGER = `.data/crash-ledger.jsonl`;

let url = "";
let fixture: BurstFixture;
let ledger: Ledger | undefined;
const t0 = performance.now();
const since = () => `${((performance.now() - t0) / 1000).toFixed(1)} s`;
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

beforeAll(async () => {
  const startMs = await mdb.start();
  url = await freshDatabase(NAME, mdb.port);
  // The service reads its settings from the environment: point all of it at the private instance.
  Object.assign(process.env, {
    DATABASE_URL: url,
    APP_URL: "http://127.0.0.1:1",
    AUTH_SECRET: process.env.AUTH_SECRET ?? "crash-test-secret-0123456789abcdef0123456789",
    STORAGE_DIR: ".data/crash-storage",
    PAYMENT_REQUIRED_BEFORE_REVIEW: "false",
  });
  if (env().DATABASE_URL !== url) throw new Error(`the service was already configured for ${env().DATABASE_URL}; refusing to write fixtures there`);
  fixture = await prepareFixture(db(), { applications: 32, tag: "crash" });
  await rm(LEDGER, { force: true });
  ledger = await Ledger.open(LEDGER);
  console.log(`[crash] seed ${SEED}; MariaDB on port ${mdb.port} up in ${startMs} ms; ${fixture.applications.length} applications ready at ${since()}`);
});

afterAll(async () => {
  await ledger?.close();
  await closeDb();
  await mdb.stop();
  console.log(`[crash] ledger kept in ${LEDGER}; whole file ${since()}`);
});

describe("crash safety of workflow transitions", () => {
  it("runs on a server whose settings make a commit durable", async () => {
    const d = await checkDurability(url);
    console.log(`[crash] durability: ${JSON.stringify(d.variables)}`);
    expect(d.problems).toEqual([]);
    expect(d.variables.innodb_flush_log_at_trx_commit).toBe("1");
  });

  it(`keeps every acknowledged transition whole through ${ROUNDS} kill -9 of mariadbd`, async () => {
    const random = seededRandom(SEED);
    const total = { attempted: 0, acknowledged: 0, inDoubt: 0, rejected: 0 };
    let last: VerifyReport = { applications: 0, applied: 0, acknowledged: 0, inDoubtApplied: 0, inDoubtAbsent: 0, rejected: 0, auditRows: 0, outboxRows: 0, problems: [] };
    for (let round = 1; round <= ROUNDS; round++) {
      const lanes = randomInt(random, 8, 32);
      const killAfterMs = randomInt(random, 250, 1200);
      const stop = new AbortController();
      const burst = runBurst({ target: { database: db() }, fixture, ledger: ledger!, round, lanes, signal: stop.signal, random });
      await sleep(killAfterMs);
      const pid = await mdb.kill9();
      stop.abort();
      const stats = await burst;
      const restartMs = await mdb.start();

      const check = openDatabase(url, 2);
      const report = await verifyLedger(check.database, fixture, await readLedger(ledger!.file)).finally(check.close);
      total.attempted += stats.attempted;
      total.acknowledged += stats.acknowledged;
      total.inDoubt += stats.inDoubt;
      total.rejected += stats.rejected;
      console.log(
        `[crash] round ${round}: ${lanes} lanes, mariadbd ${pid} killed at ${killAfterMs} ms; ` +
          `attempted ${stats.attempted}, acknowledged ${stats.acknowledged}, in doubt ${stats.inDoubt} ` +
          `(applied ${report.inDoubtApplied - last.inDoubtApplied}, absent ${report.inDoubtAbsent - last.inDoubtAbsent}), refused ${stats.rejected}; ` +
          `ack latency p50 ${stats.latency.p50} ms p95 ${stats.latency.p95} ms; recovery ${restartMs} ms; ` +
          `verified ${report.applied} transitions, ${report.auditRows} audit and ${report.outboxRows} outbox rows in all; ${report.problems.length} problems (${since()})`,
      );
      if (stats.errors.length) console.log(`[crash]   errors: ${stats.errors.join(" | ")}`);
      last = report;
      expect(report.problems, `round ${round} (seed ${SEED})`).toEqual([]);
      // The pool came back after the last restart: this round got transitions through before the kill.
      expect(stats.acknowledged, `round ${round}: nothing was acknowledged before the kill (seed ${SEED})`).toBeGreaterThan(0);
      // Nothing in this burst competes for an application, so nothing is refused.
      expect(stats.rejected, `round ${round}: ${stats.errors.join(" | ")}`).toBe(0);
    }
    console.log(
      `[crash] ${ROUNDS} rounds: attempted ${total.attempted}, acknowledged ${total.acknowledged}, in doubt ${total.inDoubt} ` +
        `(applied ${last.inDoubtApplied}, absent ${last.inDoubtAbsent}); database holds ${last.applied} transitions, all verified (${since()})`,
    );
    expect(last.acknowledged).toBe(total.acknowledged);
    // Every kill caught transitions in flight, otherwise the rounds proved nothing.
    expect(total.inDoubt).toBeGreaterThanOrEqual(ROUNDS);
    expect(last.inDoubtApplied + last.inDoubtAbsent).toBe(total.inDoubt);
  });

  it("would notice a lost acknowledgement, a half-applied transition and rows without a state change", async () => {
    const lines = await readLedger(LEDGER);
    const conn = await mysql.createConnection({ uri: url });
    try {
      const [rows] = await conn.query<mysql.RowDataPacket[]>("SELECT id, version FROM applications WHERE id IN (?)", [fixture.applications.map((a) => a.id)]);
      const moved = rows.filter((r) => Number(r.version) > fixture.baseline.applications[Number(r.id)]!.version).map((r) => ({ id: Number(r.id), version: Number(r.version) }));
      expect(moved.length, "applications that took transitions").toBeGreaterThanOrEqual(4);
      const [lost, half, silent, forged] = moved as [(typeof moved)[0], (typeof moved)[0], (typeof moved)[0], (typeof moved)[0]];
      // An acknowledgement the database does not have.
      const fake = [
        ...lines,
        { type: "intent" as const, id: "tamper", round: 99, lane: 0, applicationId: lost.id, event: "submit" as const, fromVersion: lost.version, input: null, at: Date.now() },
        { type: "result" as const, id: "tamper", outcome: "ack" as const, toVersion: lost.version + 1, at: Date.now() },
      ];
      // A transition missing one of its e-mails; a version step with no audit row; an audit row with no version step.
      await conn.query("DELETE FROM outbox WHERE application_id = ? ORDER BY id DESC LIMIT 1", [half.id]);
      await conn.query("UPDATE applications SET version = version + 1 WHERE id = ?", [silent.id]);
      await conn.query("INSERT INTO audit_events (action, entity_type, entity_id, application_id, summary) VALUES ('review.reassigned', 'application', ?, ?, 'Forged line.')", [String(forged.id), forged.id]);
      const check = openDatabase(url, 2);
      const report = await verifyLedger(check.database, fixture, fake).finally(check.close);
      const about = (id: number, text: string) => report.problems.some((p) => new RegExp(`application ${id}\\b`).test(p) && p.includes(text));
      expect(about(lost.id, "is missing"), report.problems.join("\n")).toBe(true);
      expect(about(half.id, "outbox rows"), report.problems.join("\n")).toBe(true);
      // Claimed by the in-doubt try from that version when there is one, by nothing otherwise.
      expect(about(silent.id, "audit rows []") || about(silent.id, "with no transition in the ledger"), report.problems.join("\n")).toBe(true);
      expect(about(forged.id, "without a state change"), report.problems.join("\n")).toBe(true);
    } finally {
      await conn.end();
    }
  });
});
