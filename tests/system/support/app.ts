// System tests drive whole processes: production app servers, the worker, the mail receiver and
// private MariaDB instances. These helpers start and stop them and sign in over plain HTTP.
import { spawn, type ChildProcess } from "node:child_process";
import { drizzle } from "drizzle-orm/mysql2";
import { migrate } from "drizzle-orm/mysql2/migrator";
import mysql from "mysql2/promise";
import { signInOverHttp } from "../../../scripts/http-session";

/** The test MariaDB instance that scripts/test.sh starts (port 3308 unless TEST_DB_PORT moves it). */
export const TEST_DB_PORT = Number(process.env.DB_PORT ?? process.env.TEST_DB_PORT ?? 3308);
/** System tests take ports base + offset; SYSTEM_PORT_BASE moves them all (default 3400). */
export const port = (offset: number) => Number(process.env.SYSTEM_PORT_BASE ?? 3400) + offset;
const DB_USER = "spanproof";
const DB_PASSWORD = "spanproof-local";

export function databaseUrl(name: string, port = TEST_DB_PORT, host = "127.0.0.1"): string {
  return `mysql://${DB_USER}:${DB_PASSWORD}@${host}:${port}/${name}`;
}

/** Drops and recreates a database (name must start with spanproof_) and applies the migrations. */
export async function freshDatabase(name: string, port = TEST_DB_PORT): Promise<string> {
  if (!/^spanproof_\w+$/.test(name)) throw new Error(`test database name ${name} must start with spanproof_`);
  const admin = await mysql.createConnection({ host: "127.0.0.1", port, user: DB_USER, password: DB_PASSWORD });
  try {
    await admin.query(`DROP DATABASE IF EXISTS \`${name}\``);
    await admin.query(`CREATE DATABASE \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  } finally {
    await admin.end();
  }
  const url = databaseUrl(name, port);
  const conn = await mysql.createConnection({ uri: url, multipleStatements: true });
  try {
    await migrate(drizzle(conn), { migrationsFolder: "drizzle" });
  } finally {
    await conn.end();
  }
  return url;
}

export interface Proc {
  child: ChildProcess;
  /** Everything the process printed, for failure messages. */
  output: () => string;
  stop: (signal?: NodeJS.Signals) => Promise<void>;
}

export function startProcess(cmd: string, args: string[], env: Record<string, string | undefined>): Proc {
  const child = spawn(cmd, args, { env: { ...process.env, ...env }, stdio: ["ignore", "pipe", "pipe"] });
  let out = "";
  const keep = (b: Buffer) => {
    out = (out + b.toString()).slice(-20_000);
  };
  child.stdout?.on("data", keep);
  child.stderr?.on("data", keep);
  const exited = new Promise<void>((r) => child.once("exit", () => r()));
  return {
    child,
    output: () => out,
    stop: async (signal: NodeJS.Signals = "SIGTERM") => {
      if (child.exitCode === null && child.signalCode === null) child.kill(signal);
      await Promise.race([exited, new Promise((r) => setTimeout(r, 10_000))]);
      if (child.exitCode === null && child.signalCode === null) child.kill("SIGKILL");
    },
  };
}

export async function waitFor(url: string, what: string, proc?: Proc, timeoutMs = 90_000): Promise<void> {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    if (proc && proc.child.exitCode !== null) throw new Error(`${what} exited early:\n${proc.output()}`);
    try {
      const r = await fetch(url, { redirect: "manual" });
      if (r.status < 500) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`${what} did not answer at ${url} within ${timeoutMs} ms\n${proc?.output() ?? ""}`);
}

/** Settings every app process of a system test shares: the same secrets make instances interchangeable. */
export function appEnv(o: { databaseUrl: string; appUrl: string; smtpPort?: number; storageDir?: string }): Record<string, string> {
  return {
    NODE_ENV: "production",
    DATABASE_URL: o.databaseUrl,
    AUTH_SECRET: process.env.AUTH_SECRET ?? "test-secret-not-for-production-0123456789abcdef",
    APP_URL: o.appUrl,
    SMTP_HOST: "127.0.0.1",
    SMTP_PORT: String(o.smtpPort ?? 2525),
    STORAGE_DIR: o.storageDir ?? ".data/system-storage",
    DEMO_MODE: "true",
    PAYMENT_REQUIRED_BEFORE_REVIEW: "false",
  };
}

/**
 * One production server from the build in NEXT_DIST_DIR (default .next). Several may run from
 * one build: they share AUTH_SECRET, and NEXT_SERVER_ACTIONS_ENCRYPTION_KEY when the build set it.
 */
export async function startApp(o: { port: number; databaseUrl: string; smtpPort?: number; env?: Record<string, string> }): Promise<Proc & { url: string }> {
  const url = `http://127.0.0.1:${o.port}`;
  const proc = startProcess(
    process.execPath,
    ["node_modules/next/dist/bin/next", "start", "--hostname", "127.0.0.1", "--port", String(o.port)],
    { ...appEnv({ databaseUrl: o.databaseUrl, appUrl: url, smtpPort: o.smtpPort }), ...o.env },
  );
  await waitFor(`${url}/sign-in`, `app server on port ${o.port}`, proc);
  return { ...proc, url };
}

/**
 * The mail relay worker as its own process (so a test can kill it). tsx as a loader inside this
 * one node process, not its CLI, which would run the worker in a child that a kill misses.
 */
export async function startWorker(o: { databaseUrl: string; smtpPort: number; healthPort: number; env?: Record<string, string> }): Promise<Proc> {
  const proc = startProcess(
    process.execPath,
    ["--conditions=react-server", "--import", "tsx", "scripts/worker.ts"],
    {
      ...appEnv({ databaseUrl: o.databaseUrl, appUrl: "http://127.0.0.1:1", smtpPort: o.smtpPort }),
      WORKER_INTERVAL_MS: "200",
      WORKER_HEALTH_PORT: String(o.healthPort),
      ...o.env,
    },
  );
  await waitFor(`http://127.0.0.1:${o.healthPort}/`, "mail worker", proc, 30_000);
  return proc;
}

/** Signs in over HTTP; returns the Cookie header (valid on every instance sharing AUTH_SECRET). */
export const signIn = signInOverHttp;

/** JSON request with the session cookie and our own Origin (state-changing requests need it). */
export async function api(baseUrl: string, cookie: string, method: string, path: string, body?: unknown): Promise<{ status: number; json: unknown }> {
  const res = await fetch(`${baseUrl}${path}`, {
    method,
    redirect: "manual",
    headers: { cookie, origin: baseUrl, ...(body === undefined ? {} : { "content-type": "application/json" }) },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  return readAnswer(res);
}

/** Status and body, parsed as JSON where it is JSON, else the text. */
export async function readAnswer(res: Response): Promise<{ status: number; json: unknown }> {
  const text = await res.text();
  let json: unknown = text;
  try {
    json = JSON.parse(text);
  } catch {
    // not JSON: keep the text
  }
  return { status: res.status, json };
}
