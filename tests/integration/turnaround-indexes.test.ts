import { drizzle } from "drizzle-orm/mysql2";
import { beforeEach, describe, expect, it } from "vitest";
import { db, pool, type Db } from "@/db/client";
import { listApprovalsBetween, listCyclesDecidedBetween } from "@/db/queries/queue";
import * as schema from "@/db/schema";
import { dayInZone, endOfDayInZone, shiftDays, startOfDayInZone } from "@/lib/review-clock";
import { generateQueue } from "@/scripts/generate-queue";
import { makeUser, resetDb } from "./db-helpers";

beforeEach(async () => {
  await resetDb();
});

// Records the statements the query functions send, so the plan checked is that of the exact SQL.
let sent: { sql: string; params: unknown[] }[] = [];
const recording = (): Db => drizzle(pool(), { schema, mode: "default", logger: { logQuery: (sql, params) => sent.push({ sql, params }) } });

interface PlanRow {
  table: string;
  type: string;
  key: string | null;
  r_rows: number | null;
  Extra: string | null;
}

async function analyze(run: (d: Db) => Promise<unknown>): Promise<PlanRow[]> {
  sent = [];
  await run(recording());
  expect(sent, "one statement").toHaveLength(1);
  const [rows] = await pool().query(`ANALYZE ${sent[0]!.sql}`, sent[0]!.params);
  return rows as PlanRow[];
}

describe("turnaround statistics at scale use their indexes", () => {
  it("reads a 90-day and a 365-day period off covering indexes, never a table scan", async () => {
    await makeUser("applicant");
    await makeUser("examiner");
    const now = new Date("2026-12-02T18:00:00Z");
    await generateQueue(db(), 20_000, { now });
    const to = dayInZone(now);
    for (const days of [90, 365]) {
      const start = startOfDayInZone(shiftDays(to, -(days - 1)));
      const end = endOfDayInZone(to);
      const cases: [string, (d: Db) => Promise<unknown>, string][] = [
        ["cycles", (d) => listCyclesDecidedBetween(d, start, end), "review_cycles_decided_idx"],
        ["approvals", (d) => listApprovalsBetween(d, start, end), "applications_decided_idx"],
      ];
      for (const [name, run, index] of cases) {
        const returned = ((await run(db())) as unknown[]).length;
        expect(returned, `${days} days, ${name}: the generated data has decisions in the period`).toBeGreaterThan(100);
        const [p, ...more] = await analyze(run);
        const where = `${days} days, ${name}: ${JSON.stringify(p)}`;
        expect(more, where).toHaveLength(0);
        expect(p!.type, where).toBe("range");
        expect(p!.key, where).toBe(index);
        // "Using index": every selected column comes from the index, no row lookups; a column
        // added to the select without the index losing this is what sends a year back to a scan.
        expect(p!.Extra ?? "", where).toMatch(/Using index(?! condition)/);
        // Reads only the rows in the period (the index is on decided_at), not the table.
        expect(Number(p!.r_rows), where).toBe(returned);
      }
    }
  });
});
