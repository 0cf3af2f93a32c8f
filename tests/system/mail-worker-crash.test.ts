// D3: the mail worker (scripts/worker.ts, its own process) is killed with SIGKILL several times
// while it relays the outbox to a sink that is slow to answer DATA, and restarted until the
// outbox is drained. The contract, whatever the claim mechanics: every row delivered at least
// once, to its own address; one more delivery for each kill that caught it in flight (a resend
// can itself be caught by a later kill), with the same Message-ID; none after a clean stop.
import { inArray } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "@/db/client";
import { enqueueMail } from "@/db/queries/outbox";
import { outbox } from "@/db/schema";
import { messageIdFor } from "@/lib/mail/transport";
import { freshDatabase, port, startWorker, type Proc } from "./support/app";
import { openDatabase, randomInt, seededRandom } from "./support/burst";
import { privateDb } from "./support/private-db";
import { killAll, killTree, processTree } from "./support/process-tree";
import { startSlowSink, type SlowSink } from "./support/smtp-slow";

const N = 200;
const KILLS = 6;
const SEED = Number(process.env.CRASH_SEED ?? Math.floor(Math.random() * 2 ** 31));
const mdb = privateDb({ dir: ".data/crash-db", port: port(20), name: "spanproof_crash" });
const SMTP_PORT = port(21);
const HEALTH_PORT = port(22);

let url = "";
let database: { database: Db; close: () => Promise<void> } | undefined;
let sink: SlowSink | undefined;
let worker: Proc | undefined;
const t0 = performance.now();
const since = () => `${((performance.now() - t0) / 1000).toFixed(1)} s`;
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

const startTimes: number[] = [];
// A killed worker's claim on the message it was sending runs out after this (s); then it is resent.
const LEASE_SEC = 3;

async function start(): Promise<Proc> {
  const t = performance.now();
  const w = await startWorker({ databaseUrl: url, smtpPort: SMTP_PORT, healthPort: HEALTH_PORT, env: { OUTBOX_LEASE_SEC: String(LEASE_SEC) } });
  startTimes.push(Math.round(performance.now() - t));
  return w;
}

async function until(what: string, ok: () => boolean | Promise<boolean>, timeoutMs: number): Promise<void> {
  const end = Date.now() + timeoutMs;
  while (!(await ok())) {
    if (Date.now() > end) throw new Error(`${what}: not within ${timeoutMs} ms\n${worker?.output().slice(-3000) ?? ""}`);
    await sleep(50);
  }
}

beforeAll(async () => {
  await mdb.start();
  url = await freshDatabase("spanproof_crash_mail", mdb.port);
  database = openDatabase(url, 2);
  const random = seededRandom(SEED + 1);
  sink = await startSlowSink({ port: SMTP_PORT, replyDelayMs: () => randomInt(random, 10, 40) });
});

afterAll(async () => {
  if (worker) await killTree(worker.child.pid!);
  await sink?.close();
  await database?.close();
  await mdb.stop();
  console.log(`[mail-crash] whole file ${since()}`);
});

describe("mail worker killed mid-send", () => {
  it(`delivers all ${N} messages at least once, resending only what was in flight at each of ${KILLS} kills`, async () => {
    const db = database!.database;
    const random = seededRandom(SEED);
    await enqueueMail(
      db,
      Array.from({ length: N }, (_, i) => ({
        dedupeKey: `crash-mail:${i}`,
        template: "crash.notice",
        to: { address: `holder-${i}@larkspurfalls.example`, name: `Permit holder ${i}` },
        subject: `Larkspur Falls permit notice ${i}`,
        text: `Notice ${i} for the permit holder at ${i} Quarry Lane.`,
      })),
    );
    const rows = await db.select({ id: outbox.id, to: outbox.toAddress, subject: outbox.subject }).from(outbox);
    expect(rows).toHaveLength(N);
    const byAddress = new Map(rows.map((r) => [r.to, r]));
    const sentAddresses = async () =>
      new Set((await db.select({ to: outbox.toAddress }).from(outbox).where(inArray(outbox.status, ["sent"]))).map((r) => r.to));

    const kills: { n: number; mode: string; pids: number[]; inFlight: string[] }[] = [];
    // Per address: how many kills caught one of its deliveries unacknowledged, and how many
    // deliveries it had at the last of those (so a delivery is counted at one kill only).
    const flights = new Map<string, number>();
    const countedUpTo = new Map<string, number>();
    const deliveryCounts = () => {
      const c = new Map<string, number>();
      for (const d of sink!.deliveries) for (const a of d.envelopeTo) c.set(a, (c.get(a) ?? 0) + 1);
      return c;
    };
    // Deliveries since the last count that are not marked sent: in flight at this moment.
    const newlyInFlight = (sent: Set<string>) =>
      [...deliveryCounts()].filter(([a, c]) => !sent.has(a) && c > (countedUpTo.get(a) ?? 0)).map(([a]) => a);
    worker = await start();
    for (let n = 1; n <= KILLS; n++) {
      // The tree (tsx and the worker it runs) is looked up first, so the kill itself is instant.
      const pids = await processTree(worker.child.pid!);
      const before = sink!.deliveries.length;
      const want = randomInt(random, 3, 20);
      await until(`worker ${n} delivering ${want} messages`, () => sink!.deliveries.length >= before + want, 60_000);
      // Half the kills land while the sink holds a kept message unanswered, half anywhere.
      const mode = n % 2 === 1 ? "awaiting 250" : "anywhere";
      if (mode === "awaiting 250") {
        const held = sink!.holdNextReply();
        const kept = await Promise.race([held.kept, sleep(20_000).then(() => null)]);
        expect(kept, "the worker sent nothing more").not.toBeNull();
        await killAll(pids);
        held.release();
      } else {
        await sleep(randomInt(random, 0, 80));
        await killAll(pids);
      }
      // Whatever the dead worker had fully written is parsed by now; it cannot send more.
      await sleep(300);
      const sent = await sentAddresses();
      const inFlight = newlyInFlight(sent);
      const counts = deliveryCounts();
      for (const a of inFlight) {
        flights.set(a, (flights.get(a) ?? 0) + 1);
        countedUpTo.set(a, counts.get(a)!);
      }
      kills.push({ n, mode, pids, inFlight });
      console.log(`[mail-crash] kill ${n} (${mode}) of pids ${pids.join(",")} after ${sink!.deliveries.length} deliveries: in flight ${JSON.stringify(inFlight)} (${since()})`);
      worker = await start();
    }

    // A clean stop (SIGTERM) finishes or abandons its message properly: nothing is left in flight.
    const beforeStop = sink!.deliveries.length + randomInt(random, 3, 10);
    await until("deliveries before the clean stop", () => sink!.deliveries.length >= beforeStop, 60_000);
    await worker.stop("SIGTERM");
    await sleep(300);
    const sentAtStop = await sentAddresses();
    const cleanInFlight = newlyInFlight(sentAtStop);
    console.log(`[mail-crash] clean stop after ${sink!.deliveries.length} deliveries: in flight ${JSON.stringify(cleanInFlight)}`);
    expect(cleanInFlight).toEqual([]);
    worker = await start();

    await until("outbox drained", async () => (await sentAddresses()).size === N, 180_000);
    // A resend of something already marked sent would arrive now.
    await sleep(1500);
    await worker.stop("SIGTERM");
    worker = undefined;

    const deliveries = sink!.deliveries;
    const problems: string[] = [];
    const perAddress = new Map<string, typeof deliveries>();
    for (const d of deliveries) {
      const to = d.envelopeTo.join(",");
      const row = byAddress.get(to);
      if (!row || d.envelopeTo.length !== 1) {
        problems.push(`delivery ${d.seq} went to ${to}, which no outbox row names`);
        continue;
      }
      if (d.messageId !== messageIdFor(row.id)) problems.push(`delivery ${d.seq} to ${to} carries Message-ID ${d.messageId}, its row's is ${messageIdFor(row.id)}`);
      if (d.headerTo.join(",") !== to) problems.push(`delivery ${d.seq}: envelope to ${to}, header To ${d.headerTo.join(",")}`);
      if (d.subject !== row.subject) problems.push(`delivery ${d.seq} to ${to} has the subject "${d.subject}" of another message`);
      perAddress.set(to, [...(perAddress.get(to) ?? []), d]);
    }
    for (const r of rows) if (!perAddress.has(r.to)) problems.push(`outbox row ${r.id} (${r.to}) was never delivered`);
    const duplicated = [...perAddress].filter(([, list]) => list.length > 1);
    const duplicates = duplicated.reduce((s, [, list]) => s + list.length - 1, 0);
    for (const [to, list] of perAddress) {
      const caught = flights.get(to) ?? 0;
      if (list.length !== 1 + caught) problems.push(`${to} was delivered ${list.length} times; kills caught it in flight ${caught} times`);
    }

    console.log(`[mail-crash] N ${N}, kills ${KILLS}, deliveries ${deliveries.length}, duplicates ${duplicates} (${duplicated.map(([a]) => a).join(", ")}), seed ${SEED}; worker start ${startTimes.join(", ")} ms (${since()})`);
    expect(problems).toEqual([]);
    expect(duplicates).toBeLessThanOrEqual(KILLS);
    expect(new Set(duplicated.map(([a]) => a))).toEqual(new Set(flights.keys()));
    // One worker sends one message at a time: at most one in flight per kill, and a kill while
    // the sink held a kept message unanswered always leaves exactly that one.
    for (const k of kills) expect(k.inFlight.length, `kill ${k.n}`).toBeLessThanOrEqual(1);
    for (const k of kills.filter((x) => x.mode === "awaiting 250")) expect(k.inFlight, `kill ${k.n}`).toHaveLength(1);
  });
});
