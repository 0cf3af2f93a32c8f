// Two production app servers from one build on two ports, one database, the same secrets:
// sessions and server actions move freely between them, and the same approval raced through
// both 1,000 times has exactly one winner each time and sends exactly one e-mail.
import { readFileSync } from "node:fs";
import path from "node:path";
import { drizzle } from "drizzle-orm/mysql2";
import mysql from "mysql2/promise";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "@/db/client";
import { getSetting } from "@/db/queries/settings";
import * as schema from "@/db/schema";
import { users } from "@/db/schema";
import { hashPassword } from "@/lib/auth/password";
import { DEMO_FEE_SCHEDULE, FEE_SCHEDULE_KEY, feeScheduleSchema, type FeeScheduleInput } from "@/lib/fees/schedule";
import { startMailReceiver, type Receiver } from "@/lib/mail/receiver";
import { api, freshDatabase, port, signIn, startApp, startWorker, type Proc } from "./support/app";
import { prepareApprovals, raceApprovals, verifyRaces } from "./support/race";

const DB_NAME = "spanproof_sys_race";
const RACES = Number(process.env.RACE_COUNT ?? 1000);
const ADMIN = { email: "race-admin@larkspurfalls.example", password: "race-admin-password-01" };

let url: string;
let receiver: Receiver;
let a: Proc & { url: string };
let b: Proc & { url: string };
const workers: Proc[] = [];
const suiteStarted = performance.now();

function actionId(file: string, exportedName: string): string {
  const dist = process.env.NEXT_DIST_DIR ?? ".next";
  const manifest = JSON.parse(readFileSync(path.join(dist, "server", "server-reference-manifest.json"), "utf8")) as {
    node: Record<string, { filename?: string; exportedName?: string }>;
  };
  const hit = Object.entries(manifest.node).find(([, v]) => v.filename === file && v.exportedName === exportedName);
  if (!hit) throw new Error(`${exportedName} of ${file} is not in ${dist}/server/server-reference-manifest.json: build first (NEXT_DIST_DIR=${dist} npm run build)`);
  return hit[0];
}

async function withDb<T>(fn: (database: Db) => Promise<T>): Promise<T> {
  const pool = mysql.createPool({ uri: url, connectionLimit: 1, timezone: "Z" });
  try {
    return await fn(drizzle(pool, { schema, mode: "default" }));
  } finally {
    await pool.end();
  }
}

beforeAll(async () => {
  url = await freshDatabase(DB_NAME);
  const passwordHash = await hashPassword(ADMIN.password);
  await withDb((d) => d.insert(users).values({ email: ADMIN.email, name: "Race Administrator", role: "admin", status: "active", passwordHash }));
  receiver = await startMailReceiver({ smtpPort: port(12), httpPort: port(13) });
  [a, b] = await Promise.all([
    startApp({ port: port(10), databaseUrl: url, smtpPort: port(12) }),
    startApp({ port: port(11), databaseUrl: url, smtpPort: port(12) }),
  ]);
  // Two relays on one outbox: the row claim must keep them from sending anything twice.
  workers.push(...(await Promise.all([15, 16].map((o) => startWorker({ databaseUrl: url, smtpPort: port(12), healthPort: port(o) })))));
});

afterAll(async () => {
  await Promise.all([a?.stop(), b?.stop(), ...workers.map((w) => w.stop())]);
  await receiver?.close();
  console.log(`[two-instances] file wall time ${((performance.now() - suiteStarted) / 1000).toFixed(1)} s`);
});

describe("two app instances on one database", () => {
  it("accepts a session cookie from instance A on instance B", async () => {
    const cookie = await signIn(a.url, ADMIN.email, ADMIN.password);
    const me = await api(b.url, cookie, "GET", "/api/me");
    expect(me.status).toBe(200);
    expect((me.json as { user: { email: string } }).user.email).toBe(ADMIN.email);
    // Control: B answers 401 without it, so the 200 above came from A's cookie.
    expect((await api(b.url, "", "GET", "/api/me")).status).toBe(401);
  });

  it("runs a server action rendered by instance A when it is posted to instance B", async () => {
    const cookie = await signIn(a.url, ADMIN.email, ADMIN.password);
    const saveId = actionId("app/(workspace)/admin/fees/actions.ts", "saveFeeScheduleAction");
    const signOutId = actionId("app/(workspace)/actions.ts", "signOutAction");
    const page = await fetch(`${a.url}/admin/fees`, { headers: { cookie }, redirect: "manual" });
    expect(page.status).toBe(200);
    const html = await page.text();
    // A hands the browser both ids: the save action as a client prop, sign-out as a form field.
    expect(html).toContain(saveId);
    const rendered = /name="\$ACTION_ID_([0-9a-f]+)"/.exec(html)?.[1];
    expect(rendered).toBe(signOutId);

    const label = "Larkspur Falls schedule saved through instance B";
    const { currency, brackets, planReviewBasisPoints, fixedFees, resubmittal } = DEMO_FEE_SCHEDULE;
    const input: FeeScheduleInput = { label, currency, brackets, planReviewBasisPoints, fixedFees, resubmittal };
    const res = await fetch(`${b.url}/admin/fees`, {
      method: "POST",
      redirect: "manual",
      headers: { cookie, origin: b.url, "next-action": saveId, accept: "text/x-component", "content-type": "text/plain;charset=UTF-8" },
      body: JSON.stringify([input]),
    });
    const flight = await res.text();
    expect(res.status, flight.slice(0, 500)).toBe(200);
    expect(flight).toContain('"ok":true');
    const stored = feeScheduleSchema.parse(await withDb((d) => getSetting(d, FEE_SCHEDULE_KEY)));
    expect(stored.label).toBe(label);
    expect(stored.revision).toBe(DEMO_FEE_SCHEDULE.revision + 1);

    // The no-JavaScript form post of A's sign-out button, sent to B: signed out, back to sign-in.
    const form = new FormData();
    form.set(`$ACTION_ID_${rendered}`, "");
    const out = await fetch(`${b.url}/admin/fees`, { method: "POST", redirect: "manual", headers: { cookie, origin: b.url }, body: form });
    expect(out.status).toBe(303);
    expect(new URL(out.headers.get("location") ?? "", b.url).pathname).toBe("/sign-in");
    const cleared = out.headers.getSetCookie().find((c) => c.includes("session-token="));
    expect(cleared, out.headers.getSetCookie().join("\n")).toMatch(/session-token=;|Max-Age=0|Expires=Thu, 01 Jan 1970/i);
  });

  it(`races ${RACES} approvals through both instances: one winner each, no duplicate e-mail`, async () => {
    const prepared = await prepareApprovals({ databaseUrl: url, count: RACES });
    console.log(`[two-instances] prepared ${RACES} applications in review in ${(prepared.ms / 1000).toFixed(1)} s (${prepared.deadlocksRetried} deadlock victims retried)`);
    const cookie = await signIn(a.url, prepared.examiner.email, prepared.examiner.password);
    const run = await raceApprovals({ instances: [a.url, b.url], cookie, apps: prepared.apps, concurrency: 8 });
    const report = await verifyRaces({ databaseUrl: url, run, mailboxUrl: `http://127.0.0.1:${port(13)}`, drainTimeoutMs: 120_000 });
    console.log(
      `[two-instances] ${report.races} races in ${(run.wallMs / 1000).toFixed(1)} s: wins A ${report.wins[a.url] ?? 0}, B ${report.wins[b.url] ?? 0}; ` +
        `race latency p50 ${report.latency.p50.toFixed(1)} ms, p95 ${report.latency.p95.toFixed(1)} ms, max ${report.latency.max.toFixed(1)} ms; ` +
        `loser's 409 after the winner p50 ${report.loserLagP50.toFixed(1)} ms; ` +
        `mail: ${report.mail?.approvalMails} approval mails of ${report.mail?.expected} expected, ${report.mail?.duplicateMessageIds} duplicate Message-IDs, ${report.mail?.total} captured; ` +
        `sent per relay (from their logs): ${workers.map((w) => [...w.output().matchAll(/\[worker\] sent (\d+)/g)].reduce((n, m) => n + Number(m[1]), 0)).join(" + ")}`,
    );
    // A relay that sent nothing says why in its own output.
    const relayOutput = () => workers.map((w, i) => `--- worker ${i + 1}\n${w.output().slice(-1500)}`).join("\n");
    expect(report.failures.slice(0, 20), report.mail?.approvalMails === RACES ? undefined : relayOutput()).toEqual([]);
    expect(report.races).toBe(RACES);
    expect((report.wins[a.url] ?? 0) + (report.wins[b.url] ?? 0)).toBe(RACES);
    // Both instances must actually take part: a race one side never wins is no race.
    expect(report.wins[a.url] ?? 0).toBeGreaterThan(0);
    expect(report.wins[b.url] ?? 0).toBeGreaterThan(0);
    expect(report.mail).toMatchObject({ expected: RACES, approvalMails: RACES, duplicateMessageIds: 0 });
  });
});
