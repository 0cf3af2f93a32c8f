// Queue API latency under a bounded loopback load:  npm run bench:queue
// Against a running production server (next start) whose database holds the generated
// applications (scripts/generate-queue.ts). Signs in as the supervising examiner, then for each
// case sends REQUESTS requests from CONCURRENCY parallel clients and prints p50/p95/p99.
//
//   BENCH_URL (http://127.0.0.1:3000)  BENCH_EMAIL / BENCH_PASSWORD (the demo supervisor)
//   BENCH_REQUESTS (300)  BENCH_CONCURRENCY (10)  BENCH_DEEP_PAGES (200: the deep cursor is that many pages in)
import { signInOverHttp } from "./http-session";

const base = (process.env.BENCH_URL ?? "http://127.0.0.1:3000").replace(/\/$/, "");
const email = process.env.BENCH_EMAIL ?? "supervisor@larkspurfalls.example";
const password = process.env.BENCH_PASSWORD ?? "spanproof-demo";
const requests = Number(process.env.BENCH_REQUESTS ?? 300);
const concurrency = Number(process.env.BENCH_CONCURRENCY ?? 10);
const deepPages = Number(process.env.BENCH_DEEP_PAGES ?? 200);
const GOAL_P95_MS = 100;

let session = "";
const cookie = () => session;

async function signIn() {
  session = await signInOverHttp(base, email, password);
  const me = await fetch(`${base}/api/me`, { headers: { cookie: cookie() } });
  if (!me.ok) throw new Error(`sign-in as ${email} failed (${me.status}); is the demo seeded and the server running at ${base}?`);
}

interface Page {
  rows: { id: number }[];
  nextCursor: string | null;
  total: { n: number; capped: boolean } | null;
}

async function get<T>(path: string): Promise<T> {
  const res = await fetch(`${base}${path}`, { headers: { cookie: cookie() } });
  if (!res.ok) throw new Error(`${path} → ${res.status}: ${(await res.text()).slice(0, 200)}`);
  return (await res.json()) as T;
}

function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return NaN;
  const rank = Math.ceil((p / 100) * sorted.length) - 1; // nearest-rank method
  return sorted[Math.min(sorted.length - 1, Math.max(0, rank))]!;
}

async function load(path: string, total = requests) {
  const times: number[] = [];
  let errors = 0;
  let next = 0;
  const started = performance.now();
  async function client() {
    while (next < total) {
      next++;
      const t0 = performance.now();
      try {
        const res = await fetch(`${base}${path}`, { headers: { cookie: cookie() } });
        const body = (await res.json()) as Partial<Page>;
        if (!res.ok || (path.startsWith("/api/queue") && !Array.isArray(body.rows))) errors++;
      } catch {
        errors++;
      }
      times.push(performance.now() - t0);
    }
  }
  await Promise.all(Array.from({ length: concurrency }, client));
  const wall = performance.now() - started;
  times.sort((a, b) => a - b);
  return { n: times.length, errors, p50: percentile(times, 50), p95: percentile(times, 95), p99: percentile(times, 99), max: times.at(-1) ?? NaN, rps: (times.length / wall) * 1000 };
}

await signIn();
const first = await get<Page>("/api/queue?limit=50");
console.log(`[bench] ${first.total?.capped ? "more than " : ""}${first.total?.n} open reviews in the queue; walking ${deepPages} pages for the deep cursor…`);
let cursor = first.nextCursor;
let depth = 1;
for (; depth < deepPages && cursor; depth++) cursor = (await get<Page>(`/api/queue?limit=50&cursor=${cursor}`)).nextCursor;
const examiners = (await get<{ examiners: { id: number; name: string; openReviews: number }[] }>("/api/examiners")).examiners;
const busiest = [...examiners].sort((a, b) => b.openReviews - a.openReviews)[0];
if (!busiest) throw new Error("no examiners");

// [name, path, requests]: the unindexed sort gets fewer requests so it does not crowd the machine.
const cases: [string, string, number?][] = [
  // The floor every signed-in request pays (session decode + user re-read + framework): not the queue's.
  ["baseline: GET /api/me", "/api/me"],
  ["first page (due, asc)", "/api/queue?limit=50"],
  [`deep page (cursor after ${depth * 50} rows)`, `/api/queue?limit=50${cursor ? `&cursor=${cursor}` : ""}`],
  [`filtered: ${busiest.name}, overdue`, `/api/queue?limit=50&examinerId=${busiest.id}&due=overdue`],
  ["filtered: resubmitted, due this week", "/api/queue?limit=50&state=resubmitted&due=this_week"],
  ["first page by number", "/api/queue?limit=50&sort=number"],
  ["first page by received", "/api/queue?limit=50&sort=received", requests],
];

// Warm-up: JIT, connection pool, buffer pool.
for (const [, path] of cases) for (let i = 0; i < 3; i++) await get(path);

const results: Record<string, unknown>[] = [];
for (const [name, path, n] of cases) {
  const r = await load(path, n);
  results.push({
    case: name,
    requests: r.n,
    errors: r.errors,
    "p50 ms": +r.p50.toFixed(1),
    "p95 ms": +r.p95.toFixed(1),
    "p99 ms": +r.p99.toFixed(1),
    "max ms": +r.max.toFixed(1),
    "req/s": +r.rps.toFixed(0),
    [`p95 < ${GOAL_P95_MS} ms`]: r.p95 < GOAL_P95_MS ? "yes" : "NO",
  });
}
console.log(`[bench] ${base}, ${concurrency} concurrent clients, ${requests} requests per case, page of 50`);
console.table(results);
