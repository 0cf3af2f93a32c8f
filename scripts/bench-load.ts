// Mixed signed-in load on loopback:  npm run bench:load -- [--url URL] [--duration S] [--users N]
// Against a running Spanproof with the demo data (bash scripts/start.sh). N virtual users, each
// signed in as one of the demo accounts (technician, both examiners, supervisor, two applicants),
// loop over a weighted mix: list their work, open an application, read a byte range of a sheet
// as the PDF viewer does, post a draft correction comment (and remove it again, so repeated runs
// leave the record as it was), run a deflection check. Prints count, errors, req/s and latency
// percentiles per request type; exits 1 if any request failed.
import { readFileSync } from "node:fs";
import path from "node:path";
import { parseArgs } from "node:util";
import { signInOverHttp } from "./http-session";

const USAGE = "usage: npm run bench:load -- [--url http://127.0.0.1:3000] [--duration 180] [--users 20] [--password spanproof-demo]";

function options() {
  let parsed;
  try {
    parsed = parseArgs({
      options: {
        url: { type: "string", default: process.env.BENCH_URL ?? "http://127.0.0.1:3000" },
        duration: { type: "string", default: "180" },
        users: { type: "string", default: "20" },
        password: { type: "string", default: process.env.BENCH_PASSWORD ?? "spanproof-demo" },
        help: { type: "boolean", default: false },
      },
    }).values;
  } catch (e) {
    throw new Error(`${(e as Error).message}\n${USAGE}`);
  }
  if (parsed.help) {
    console.log(USAGE);
    process.exit(0);
  }
  const duration = Number(parsed.duration);
  const users = Number(parsed.users);
  if (!Number.isFinite(duration) || duration < 5 || duration > 3600) throw new Error(`--duration must be seconds between 5 and 3600, got "${parsed.duration}"\n${USAGE}`);
  if (!Number.isInteger(users) || users < 1 || users > 500) throw new Error(`--users must be a whole number between 1 and 500, got "${parsed.users}"\n${USAGE}`);
  let url: URL;
  try {
    url = new URL(parsed.url!);
  } catch {
    throw new Error(`--url must be the app's base URL, e.g. http://127.0.0.1:3000, got "${parsed.url}"\n${USAGE}`);
  }
  return { base: url.origin, duration, users, password: parsed.password! };
}

type Role = "technician" | "examiner" | "supervisor" | "applicant";
const ACCOUNTS: { email: string; role: Role }[] = [
  { email: "examiner@larkspurfalls.example", role: "examiner" },
  { email: "owen@corbelfinch.example", role: "applicant" },
  { email: "tech@larkspurfalls.example", role: "technician" },
  { email: "supervisor@larkspurfalls.example", role: "supervisor" },
  { email: "examiner2@larkspurfalls.example", role: "examiner" },
  { email: "lena@tamarackbuilders.example", role: "applicant" },
];

const TYPES = ["list", "open application", "view sheet", "post comment", "remove comment", "run check"] as const;
type RequestType = (typeof TYPES)[number];
// Share of each user's requests (remove comment follows every post comment, so it is not drawn).
const WEIGHTS: [Exclude<RequestType, "remove comment">, number][] = [
  ["list", 30],
  ["open application", 30],
  ["view sheet", 20],
  ["post comment", 10],
  ["run check", 10],
];
const MARK = "[load benchmark]";
const RANGE_BYTES = 65_536; // one range request of the viewer (pdf.js asks for 64 KiB chunks)

const CHECK_MODEL = JSON.parse(readFileSync(path.join(import.meta.dirname, "../lib/solver/examples/glulam-beam-gb1.model.json"), "utf8")) as unknown;

interface Doc {
  id: number;
  byteSize: number;
}

interface User {
  email: string;
  role: Role;
  cookie: string;
  /** applications this user may open */
  apps: number[];
  docs: Doc[];
  /** in-review applications this user may comment on */
  targets: number[];
}

class BenchError extends Error {}

async function signIn(base: string, email: string, password: string): Promise<string> {
  try {
    return await signInOverHttp(base, email, password);
  } catch (e) {
    throw new BenchError(`${(e as Error).message}: is the demo seeded (db/seed.ts) and the password right?`);
  }
}

async function json<T>(base: string, cookie: string, p: string): Promise<T> {
  const res = await fetch(`${base}${p}`, { headers: { cookie } });
  if (!res.ok) throw new BenchError(`GET ${p} → ${res.status}: ${(await res.text()).slice(0, 200)}`);
  return (await res.json()) as T;
}

const LIST_PATH: Record<Role, string[]> = {
  applicant: ["/api/applications?scope=mine&pageSize=25"],
  technician: ["/api/applications?scope=intake&pageSize=25", "/api/applications?scope=all&pageSize=25"],
  examiner: ["/api/applications?scope=reviews&pageSize=25"],
  supervisor: ["/api/queue?limit=50", "/api/applications?scope=all&pageSize=25"],
};

type ApplicationDetail = {
  application: { id: number; state: string };
  documents: { id: number; byteSize: number; kind: string }[];
  permissions: { comment: boolean };
};

/** What each account can reach, found through the API the way the pages find it. */
async function discover(base: string, email: string, role: Role, cookie: string): Promise<Omit<User, "email" | "role" | "cookie">> {
  const ids = new Set<number>();
  for (const p of LIST_PATH[role]) {
    const page = await json<{ rows: { id: number }[] }>(base, cookie, p.startsWith("/api/queue") ? p : p.replace("pageSize=25", "pageSize=100"));
    for (const r of page.rows) ids.add(r.id);
  }
  const apps = [...ids];
  const docs: Doc[] = [];
  const targets: number[] = [];
  // The detail of the first 40 tells which carry PDFs (the demo set's drawings and calcs) and which take comments.
  for (const id of apps.slice(0, 40)) {
    const d = await json<ApplicationDetail>(base, cookie, `/api/applications/${id}`);
    for (const doc of d.documents) if (doc.kind !== "member_model" && doc.byteSize > 0) docs.push({ id: doc.id, byteSize: doc.byteSize });
    if (role !== "applicant" && d.application.state === "in_review" && d.permissions.comment) targets.push(id);
  }
  return { apps, docs, targets };
}

interface Sample {
  type: RequestType;
  ms: number;
  ok: boolean;
}

const samples: Sample[] = [];
const failures = new Map<string, number>();

async function timed(type: RequestType, fn: () => Promise<string | null>): Promise<void> {
  const t0 = performance.now();
  let problem: string | null;
  try {
    problem = await fn();
  } catch (e) {
    problem = e instanceof Error ? `${e.message} ${String((e as { cause?: unknown }).cause ?? "")}`.trim() : String(e);
  }
  samples.push({ type, ms: performance.now() - t0, ok: problem === null });
  if (problem !== null) {
    const key = `${type}: ${problem.slice(0, 240)}`;
    failures.set(key, (failures.get(key) ?? 0) + 1);
  }
}

const pick = <T>(xs: readonly T[]): T => xs[Math.floor(Math.random() * xs.length)]!;

function draw(u: User): Exclude<RequestType, "remove comment"> {
  const open = WEIGHTS.filter(([t]) => (t !== "post comment" || u.targets.length > 0) && (t !== "view sheet" || u.docs.length > 0));
  let r = Math.random() * open.reduce((s, [, w]) => s + w, 0);
  for (const [t, w] of open) if ((r -= w) < 0) return t;
  return open[0]![0];
}

// One draft comment at a time per application: an examiner does not type into one file from
// two sessions at once, and concurrent numbering is not what this measures.
const busy = new Set<number>();

async function step(base: string, u: User): Promise<void> {
  const headers = { cookie: u.cookie };
  let type = draw(u);
  const target = type === "post comment" ? u.targets.find((t) => !busy.has(t)) : undefined;
  if (type === "post comment" && target === undefined) type = "open application";
  switch (type) {
    case "list":
      return timed("list", async () => {
        const res = await fetch(`${base}${pick(LIST_PATH[u.role])}`, { headers });
        const body = (await res.json()) as { rows?: unknown };
        return res.status === 200 && Array.isArray(body.rows) ? null : `HTTP ${res.status} ${JSON.stringify(body).slice(0, 200)}`;
      });
    case "open application":
      return timed("open application", async () => {
        const id = pick(u.apps);
        const res = await fetch(`${base}/api/applications/${id}`, { headers });
        const body = (await res.json()) as Partial<ApplicationDetail>;
        return res.status === 200 && body.application?.id === id ? null : `HTTP ${res.status} for application ${id}`;
      });
    case "view sheet":
      return timed("view sheet", async () => {
        const doc = pick(u.docs);
        const start = Math.floor(Math.random() * Math.max(1, doc.byteSize / RANGE_BYTES)) * RANGE_BYTES;
        const end = Math.min(doc.byteSize, start + RANGE_BYTES) - 1;
        const res = await fetch(`${base}/api/documents/${doc.id}/file`, { headers: { ...headers, range: `bytes=${start}-${end}` } });
        const bytes = (await res.arrayBuffer()).byteLength;
        const expected = `bytes ${start}-${end}/${doc.byteSize}`;
        return res.status === 206 && bytes === end - start + 1 && res.headers.get("content-range") === expected
          ? null
          : `HTTP ${res.status}, ${bytes} bytes, content-range ${res.headers.get("content-range")} (expected 206, ${expected})`;
      });
    case "post comment": {
      const id = target!;
      busy.add(id);
      try {
        let commentId: number | undefined;
        await timed("post comment", async () => {
          const res = await fetch(`${base}/api/applications/${id}/comments`, {
            method: "POST",
            headers: { ...headers, origin: base, "content-type": "application/json" },
            body: JSON.stringify({ discipline: "Structural", codeSection: "IBC 1604.3", codeEdition: "2021 IBC", body: `${MARK} Provide the D+L deflection check against L/240.` }),
          });
          const body = (await res.json()) as { comment?: { id: number } };
          commentId = body.comment?.id;
          return res.status === 201 && commentId ? null : `HTTP ${res.status} ${JSON.stringify(body).slice(0, 200)}`;
        });
        if (commentId) await removeComment(base, u.cookie, id, commentId);
      } finally {
        busy.delete(id);
      }
      return;
    }
    case "run check":
      return timed("run check", async () => {
        const res = await fetch(`${base}/api/checks/run`, {
          method: "POST",
          headers: { ...headers, origin: base, "content-type": "application/json" },
          body: JSON.stringify({ source: { form: "model", model: CHECK_MODEL } }),
        });
        const body = (await res.json()) as { result?: unknown; verdict?: unknown };
        return res.status === 200 && body.result && body.verdict ? null : `HTTP ${res.status} ${JSON.stringify(body).slice(0, 200)}`;
      });
  }
}

function removeComment(base: string, cookie: string, applicationId: number, commentId: number): Promise<void> {
  return timed("remove comment", async () => {
    const res = await fetch(`${base}/api/applications/${applicationId}/comments/${commentId}`, { method: "DELETE", headers: { cookie, origin: base } });
    await res.arrayBuffer();
    return res.status === 200 ? null : `HTTP ${res.status} removing comment ${commentId}`;
  });
}

/** Drafts a run that was stopped half-way left behind (marked by their text). */
async function sweep(base: string, users: User[]): Promise<number> {
  let removed = 0;
  const seen = new Set<number>();
  for (const u of users) {
    for (const id of u.targets) {
      if (seen.has(id)) continue;
      seen.add(id);
      const d = await json<{ comments: { id: number; status: string; body: string }[] }>(base, u.cookie, `/api/applications/${id}`);
      for (const c of d.comments) {
        if (c.status !== "draft" || !c.body.startsWith(MARK)) continue;
        const res = await fetch(`${base}/api/applications/${id}/comments/${c.id}`, { method: "DELETE", headers: { cookie: u.cookie, origin: base } });
        if (res.ok) removed++;
      }
    }
  }
  return removed;
}

function percentile(sorted: readonly number[], p: number): number {
  if (sorted.length === 0) return NaN;
  const rank = Math.ceil((p / 100) * sorted.length) - 1; // nearest-rank method
  return sorted[Math.min(sorted.length - 1, Math.max(0, rank))]!;
}

async function main() {
  const o = options();
  const ping = await fetch(`${o.base}/sign-in`).catch((e: Error) => {
    throw new BenchError(`no Spanproof answers at ${o.base} (${e.message}); start one with bash scripts/start.sh or pass --url`);
  });
  if (ping.status >= 500) throw new BenchError(`${o.base}/sign-in answered ${ping.status}`);

  // One sign-in (one session) per virtual user; reachable records looked up once per account.
  const found = new Map<string, Omit<User, "email" | "role" | "cookie">>();
  const users: User[] = [];
  for (let i = 0; i < o.users; i++) {
    const a = ACCOUNTS[i % ACCOUNTS.length]!;
    const cookie = await signIn(o.base, a.email, o.password);
    if (!found.has(a.email)) found.set(a.email, await discover(o.base, a.email, a.role, cookie));
    const reach = found.get(a.email)!;
    if (reach.apps.length === 0) throw new BenchError(`${a.email} sees no applications: seed the demo data first (db/seed.ts)`);
    users.push({ email: a.email, role: a.role, cookie, ...reach });
  }
  const targets = new Set(users.flatMap((u) => u.targets));
  if (targets.size === 0) throw new BenchError("no application in review takes a comment from the demo examiners: seed the demo data (db/seed.ts)");
  const leftovers = await sweep(o.base, users);
  console.log(
    `[bench] ${o.base}: ${o.users} users (${[...found.keys()].length} accounts), ${o.duration} s; ` +
      `${new Set(users.flatMap((u) => u.apps)).size} applications, ${new Set(users.flatMap((u) => u.docs.map((d) => d.id))).size} PDFs, ` +
      `${targets.size} in review for comments${leftovers ? `; removed ${leftovers} drafts an earlier run left` : ""}`,
  );

  // Warm-up (JIT, pools): one round per user, not counted.
  await Promise.all(users.map((u) => step(o.base, u)));
  samples.length = 0;
  failures.clear();

  const started = performance.now();
  const until = started + o.duration * 1000;
  await Promise.all(
    users.map(async (u) => {
      while (performance.now() < until) await step(o.base, u);
    }),
  );
  const wall = (performance.now() - started) / 1000;
  const afterwards = await sweep(o.base, users);

  const rows = TYPES.map((type) => {
    const mine = samples.filter((s) => s.type === type);
    const times = mine.map((s) => s.ms).sort((a, b) => a - b);
    return {
      type,
      count: mine.length,
      errors: mine.filter((s) => !s.ok).length,
      "req/s": +(mine.length / wall).toFixed(1),
      "p50 ms": +percentile(times, 50).toFixed(1),
      "p95 ms": +percentile(times, 95).toFixed(1),
      "p99 ms": +percentile(times, 99).toFixed(1),
      "max ms": +(times.at(-1) ?? NaN).toFixed(1),
    };
  });
  const errors = samples.filter((s) => !s.ok).length;
  console.table(rows);
  console.log(
    `[bench] ${samples.length} requests in ${wall.toFixed(1)} s = ${(samples.length / wall).toFixed(1)} req/s; ` +
      `errors ${errors} (${((errors / Math.max(1, samples.length)) * 100).toFixed(3)} %)${afterwards ? `; ${afterwards} benchmark drafts were left and removed` : ""}`,
  );
  if (errors || afterwards) {
    for (const [k, n] of [...failures].sort((a, b) => b[1] - a[1]).slice(0, 10)) console.error(`[bench] ${n} × ${k}`);
    process.exitCode = 1;
  }
}

main().catch((e: unknown) => {
  console.error(`[bench] ${e instanceof BenchError || (e instanceof Error && e.message.includes(USAGE)) ? e.message : e instanceof Error ? e.stack : String(e)}`);
  process.exitCode = 1;
});
