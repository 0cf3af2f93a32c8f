// A private MariaDB instance for a system test (scripts/db.sh with its own data directory and
// port), which the test may kill -9 and restart. Never the shared test instance.
import { execFile } from "node:child_process";
import { readFile } from "node:fs/promises";
import { promisify } from "node:util";
import { databaseUrl } from "./app";

const run = promisify(execFile);

export interface PrivateDb {
  port: number;
  url: (database: string) => string;
  /** starts it (crash recovery after a kill); resolves once it answers, with the time taken in ms */
  start: () => Promise<number>;
  /** SIGKILL to mariadbd; resolves once the process is dead (a zombie counts), with its pid */
  kill9: () => Promise<number>;
  stop: () => Promise<void>;
  pid: () => Promise<number>;
  errorLog: () => Promise<string>;
}

/** A process that has exited but not been reaped yet is a zombie: dead for our purposes. */
export async function isAlive(pid: number): Promise<boolean> {
  try {
    process.kill(pid, 0);
  } catch {
    return false;
  }
  const stat = await readFile(`/proc/${pid}/stat`, "utf8").catch(() => "");
  // Field 3 (after the parenthesised command name) is the state letter.
  const state = stat.slice(stat.lastIndexOf(")") + 2, stat.lastIndexOf(")") + 3);
  return state !== "" && state !== "Z" && state !== "X";
}

export function privateDb(o: { dir: string; port: number; name: string }): PrivateDb {
  if (!/^spanproof_\w+$/.test(o.name)) throw new Error(`private database name ${o.name} must start with spanproof_`);
  const env = { ...process.env, DB_DIR: o.dir, DB_PORT: String(o.port), DB_NAME: o.name, DB_TEST_NAME: `${o.name}_test` };
  const pid = async () => {
    const text = await readFile(`${o.dir}/mysqld.pid`, "utf8").catch(() => "");
    const n = Number(text.trim());
    if (!Number.isInteger(n) || n <= 0) throw new Error(`no pid in ${o.dir}/mysqld.pid (is the instance running?)`);
    return n;
  };
  const errorLog = async () => (await readFile(`${o.dir}/mysqld.err`, "utf8").catch(() => "")).split("\n").slice(-30).join("\n");
  return {
    port: o.port,
    url: (database) => databaseUrl(database, o.port),
    pid,
    errorLog,
    async start() {
      const t0 = performance.now();
      try {
        await run("scripts/db.sh", ["start"], { env, timeout: 120_000 });
      } catch (e) {
        const x = e as { stdout?: string; stderr?: string; message: string };
        throw new Error(`scripts/db.sh start (${o.dir}, port ${o.port}) failed: ${x.message}\n${x.stdout ?? ""}${x.stderr ?? ""}\n${await errorLog()}`);
      }
      return Math.round(performance.now() - t0);
    },
    async kill9() {
      const p = await pid();
      process.kill(p, "SIGKILL");
      const until = Date.now() + 10_000;
      while (await isAlive(p)) {
        if (Date.now() > until) throw new Error(`mariadbd ${p} still alive 10 s after SIGKILL`);
        await new Promise((r) => setTimeout(r, 10));
      }
      return p;
    },
    async stop() {
      await run("scripts/db.sh", ["stop"], { env, timeout: 60_000 });
    },
  };
}
