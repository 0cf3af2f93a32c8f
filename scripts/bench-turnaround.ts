// Turnaround statistics against a large database:  npm run bench:turnaround
// Against DATABASE_URL's database holding generated applications (scripts/generate-queue.ts).
// For a 90-day and a 365-day period ending today it times the two period queries and the whole
// computation GET /api/stats/turnaround runs (both queries, calendar, targets, turnaround()),
// sequentially, and prints p50/p95 in this process (rows decoded included) with the plan MariaDB
// used for each query: ANALYZE runs the statement, so rows read, pages and server ms are measured.
//
//   DATABASE_URL (required)  BENCH_RUNS (30 per case, after 3 warm-up runs)
import { drizzle } from "drizzle-orm/mysql2";
import { createPool, type Db } from "@/db/client";
import { listApprovalsBetween, listCyclesDecidedBetween } from "@/db/queries/queue";
import * as schema from "@/db/schema";
import { dayInZone, endOfDayInZone, shiftDays, startOfDayInZone, type Day } from "@/lib/review-clock";
import { departmentTurnaround } from "@/lib/review-clock/server";

const url = process.env.DATABASE_URL;
const runs = Number(process.env.BENCH_RUNS ?? 30);
if (!url) throw new Error("DATABASE_URL is not set: point it at a database filled by scripts/generate-queue.ts");
if (!Number.isInteger(runs) || runs < 1 || runs > 1000) throw new Error(`BENCH_RUNS must be a whole number 1–1000, got ${process.env.BENCH_RUNS}`);

const pool = createPool({ url, connectionLimit: 4 });
// A second handle on the same pool that remembers its statements, so the plan shown is the one
// of the exact SQL the query functions send.
let captured: { sql: string; params: unknown[] }[] = [];
const database: Db = drizzle(pool, { schema, mode: "default" });
const recording: Db = drizzle(pool, { schema, mode: "default", logger: { logQuery: (sql, params) => captured.push({ sql, params }) } });

/** What the route handler runs after parsing and sign-in (app/api/stats/turnaround/route.ts). */
const routeComputation = (from: Day, to: Day) => departmentTurnaround(database, from, to);

function percentile(sorted: number[], p: number): number {
  const rank = Math.ceil((p / 100) * sorted.length) - 1; // nearest-rank method
  return sorted[Math.min(sorted.length - 1, Math.max(0, rank))]!;
}

async function time(fn: () => Promise<unknown>) {
  for (let i = 0; i < 3; i++) await fn();
  const ms: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    await fn();
    ms.push(performance.now() - t0);
  }
  ms.sort((a, b) => a - b);
  return { "p50 ms": +percentile(ms, 50).toFixed(1), "p95 ms": +percentile(ms, 95).toFixed(1) };
}

interface PlanTable {
  access_type: string;
  key?: string;
  rows: number;
  r_rows: number;
  r_engine_stats?: { pages_accessed?: number };
}

/** The plan of the exact statement `query` sends, and MariaDB's own time for it (median of 5 ANALYZE runs). */
async function plan(query: (d: Db) => Promise<unknown>) {
  captured = [];
  await query(recording);
  const [stmt] = captured;
  if (!stmt) throw new Error("the query function sent no statement");
  const samples: { ms: number; t: PlanTable }[] = [];
  for (let i = 0; i < 5; i++) {
    const [rows] = await pool.query(`ANALYZE FORMAT=JSON ${stmt.sql}`, stmt.params);
    const json = JSON.parse(String((rows as Record<string, unknown>[])[0]?.ANALYZE)) as { query_block: { r_total_time_ms: number; nested_loop?: { table: PlanTable }[] } };
    const t = json.query_block.nested_loop?.[0]?.table;
    if (!t) throw new Error(`unexpected plan shape for: ${stmt.sql}`);
    samples.push({ ms: json.query_block.r_total_time_ms, t });
  }
  samples.sort((a, b) => a.ms - b.ms);
  const { ms, t } = samples[2]!;
  return { plan: `${t.access_type} ${t.key ?? "(no index)"}`, "est. rows": t.rows, "rows read": t.r_rows, pages: t.r_engine_stats?.pages_accessed ?? NaN, "server ms": +ms.toFixed(1) };
}

try {
  const [[counts]] = (await pool.query("SELECT (SELECT COUNT(*) FROM applications) AS apps, (SELECT COUNT(*) FROM review_cycles) AS cycles")) as unknown as [[{ apps: number; cycles: number }]];
  console.log(`[bench] ${counts.apps} applications, ${counts.cycles} review cycles; ${runs} runs per case`);
  const to = dayInZone(new Date());
  const results: Record<string, unknown>[] = [];
  for (const days of [90, 365]) {
    const from = shiftDays(to, -(days - 1));
    const start = startOfDayInZone(from);
    const end = endOfDayInZone(to);
    const cases: [string, (d: Db) => Promise<unknown[]>][] = [
      ["listCyclesDecidedBetween", (d) => listCyclesDecidedBetween(d, start, end)],
      ["listApprovalsBetween", (d) => listApprovalsBetween(d, start, end)],
    ];
    for (const [name, q] of cases) {
      const n = (await q(database)).length;
      results.push({ period: `${days} days`, case: name, "rows out": n, ...(await time(() => q(database))), ...(await plan(q)) });
    }
    const t = await routeComputation(from, to);
    results.push({ period: `${days} days`, case: "route computation", "rows out": t.decidedCycles + t.approvals.count, ...(await time(() => routeComputation(from, to))) });
  }
  console.table(results);
} finally {
  await pool.end();
}
