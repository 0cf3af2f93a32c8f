import "server-only";
import { drizzle, type MySql2Database } from "drizzle-orm/mysql2";
import mysql from "mysql2/promise";
import { env } from "@/lib/env";
import * as schema from "./schema";

export type Db = MySql2Database<typeof schema>;

// One pool per process, cached on globalThis so dev-server reloads do not leak connections.
const g = globalThis as unknown as { __spanproofPool?: mysql.Pool; __spanproofDb?: Db };

export interface DbHost {
  host: string;
  port: number;
}

/** "a:1,b:2" → hosts in order of preference (the format lib/env.ts validates for DATABASE_HOSTS). */
export function parseHosts(list: string): DbHost[] {
  return list
    .split(",")
    .map((s) => s.trim())
    .filter(Boolean)
    .map((s) => {
      const i = s.lastIndexOf(":");
      return { host: s.slice(0, i), port: Number(s.slice(i + 1)) };
    });
}

// Errors that mean "this node cannot serve us": refused or lost connections, and a Galera node
// that is up but not part of the primary component (1047 WSREP has not yet prepared node…).
const UNREACHABLE = new Set(["ECONNREFUSED", "ECONNRESET", "ETIMEDOUT", "EHOSTUNREACH", "PROTOCOL_CONNECTION_LOST", "ER_UNKNOWN_COM_ERROR"]);
export function isUnreachable(e: unknown): boolean {
  const err = e as { code?: string; errno?: number } | null;
  return !!err && (UNREACHABLE.has(err.code ?? "") || err.errno === 1047);
}

interface CoreConn {
  query: (sql: string, cb: (err: Error | null, rows?: unknown) => void) => void;
  destroy: () => void;
  __spanproofReady?: boolean;
}
interface CorePool {
  config: { connectionConfig: { host: string; port: number } };
  getConnection: (cb: (err: Error | null, conn?: CoreConn) => void) => void;
}

/**
 * Several hosts (DATABASE_HOSTS): the pool is pinned to one node at a time, so one app instance
 * is a single writer and reads its own writes on that node. A connection that cannot be made
 * moves the pin to the next host and tries again, once round the list; the pin stays where it
 * moved (no flapping back) until that node fails too.
 * On a Galera cluster every new connection sets wsrep_sync_wait=1: another instance may have
 * written on another node, and a read must see every write the cluster has committed before it;
 * and READ COMMITTED (see prepare).
 */
function installFailover(p: mysql.Pool, hosts: DbHost[], cluster: "galera" | "auto" | "none"): void {
  const core = (p as unknown as { pool: CorePool }).pool;
  const original = core.getConnection.bind(core);
  let current = 0;
  const pin = (i: number) => {
    current = i % Math.max(1, hosts.length);
    const h = hosts[current];
    if (h) Object.assign(core.config.connectionConfig, { host: h.host, port: h.port });
  };
  pin(0);
  const ask = (conn: CoreConn, sql: string) =>
    new Promise<Array<Record<string, unknown>>>((resolve, reject) =>
      conn.query(sql, (err, rows) => (err ? reject(err) : resolve((rows ?? []) as Array<Record<string, unknown>>))),
    );
  const prepare = async (conn: CoreConn): Promise<void> => {
    if (conn.__spanproofReady || cluster === "none") return;
    if (cluster === "auto") {
      const [row] = await ask(conn, "SELECT @@wsrep_on AS wsrep_on");
      if (Number(row?.wsrep_on ?? 0) !== 1) {
        conn.__spanproofReady = true;
        return;
      }
    }
    // A node cut off from the primary component accepts connections but refuses work: skip it.
    const [ready] = await ask(conn, "SHOW GLOBAL STATUS LIKE 'wsrep_ready'");
    if (ready?.Value !== "ON") throw Object.assign(new Error("Galera node is not ready (wsrep_ready OFF)"), { errno: 1047, code: "ER_UNKNOWN_COM_ERROR" });
    // READ COMMITTED: under REPEATABLE READ the gap locks of one node's transactions make the
    // write-sets another node applies abort them (error 1213) even on disjoint rows: with two
    // writing nodes 29 % of transitions had to be retried and 2.4 % failed after 4 attempts,
    // none under READ COMMITTED (npm run bench:cluster). State changes are guarded by conditional
    // updates, unique keys and explicit row locks, which behave the same at both levels.
    await ask(conn, "SET SESSION wsrep_sync_wait = 1, SESSION tx_isolation = 'READ-COMMITTED'");
    conn.__spanproofReady = true;
  };
  core.getConnection = (cb) => {
    const attempt = (tried: number) => {
      const at = current;
      original((err, conn) => {
        const retry = (e: Error) => {
          if (isUnreachable(e) && tried + 1 < hosts.length) {
            const h = hosts[at];
            if (at === current) pin(at + 1);
            console.warn(`[db] ${h?.host}:${h?.port} unreachable (${(e as { code?: string }).code ?? e.message}); using ${hosts[current]?.host}:${hosts[current]?.port}`);
            return attempt(tried + 1);
          }
          cb(e);
        };
        if (err || !conn) return retry(err ?? new Error("no connection"));
        prepare(conn).then(
          () => cb(null, conn),
          (e: Error) => {
            conn.destroy();
            retry(e);
          },
        );
      });
    };
    attempt(0);
  };
}

export interface PoolSettings {
  url: string;
  /** DATABASE_HOSTS: host:port list in order of preference. */
  hosts?: string;
  /** DATABASE_CLUSTER; default "auto" with hosts, else "none" (the plain pool of one server). */
  cluster?: "galera" | "auto" | "none";
  connectionLimit?: number;
}

export function createPool(o: PoolSettings): mysql.Pool {
  const p = mysql.createPool({
    uri: o.url,
    connectionLimit: o.connectionLimit ?? 20,
    waitForConnections: true,
    timezone: "Z",
    dateStrings: false,
    supportBigNumbers: true,
    // A dead node must not hold a request for the OS connect timeout.
    ...(o.hosts ? { connectTimeout: 3_000 } : {}),
  });
  const cluster = o.cluster ?? (o.hosts ? "auto" : "none");
  if (o.hosts || cluster !== "none") {
    const u = new URL(o.url);
    installFailover(p, o.hosts ? parseHosts(o.hosts) : [{ host: u.hostname, port: Number(u.port || 3306) }], cluster);
  }
  return p;
}

export function pool(): mysql.Pool {
  if (!g.__spanproofPool) {
    const e = env();
    g.__spanproofPool = createPool({ url: e.DATABASE_URL, hosts: e.DATABASE_HOSTS, cluster: e.DATABASE_CLUSTER });
  }
  return g.__spanproofPool;
}

export function db(): Db {
  g.__spanproofDb ??= drizzle(pool(), { schema, mode: "default" });
  return g.__spanproofDb;
}

export type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];

// 1213 ER_LOCK_DEADLOCK (also a Galera certification failure, raised at COMMIT), 1205 lock wait timeout.
const RETRYABLE = new Set([1213, 1205]);

/** The MySQL errno of an error or of one of its causes (drizzle wraps driver errors in DrizzleQueryError). */
export function retryableErrno(e: unknown): number | undefined {
  for (let cur: unknown = e, depth = 0; cur && depth < 5; cur = (cur as { cause?: unknown }).cause, depth++) {
    const errno = (cur as { errno?: unknown }).errno;
    if (typeof errno === "number" && RETRYABLE.has(errno)) return errno;
  }
  return undefined;
}

export interface RetryOptions {
  /** Attempts in all, the first included (default 4). */
  attempts?: number;
  /** Backoff before attempt n+1 is a random 0.5–1.5 × baseDelayMs × 2^(n-1), in ms (default 15). */
  baseDelayMs?: number;
  /** Told about each retry (tests, logs). */
  onRetry?: (attempt: number, error: unknown) => void;
}

/** Since the process started: transactions run again, and ones that still failed after the last attempt. */
export const transactionRetries = { retried: 0, gaveUp: 0 };

/**
 * Runs fn in one transaction and, on a deadlock, a Galera certification failure or a lock wait
 * timeout, runs the whole of it again (bounded; then the original error). fn must be safe to run
 * again: only database work inside, no mail sent, no file written, no outside call.
 */
export async function withTransaction<T>(database: Pick<Db, "transaction">, fn: (tx: Tx) => Promise<T>, o: RetryOptions = {}): Promise<T> {
  const attempts = Math.max(1, o.attempts ?? 4);
  const base = o.baseDelayMs ?? 15;
  for (let attempt = 1; ; attempt++) {
    try {
      return await database.transaction(fn);
    } catch (e) {
      if (retryableErrno(e) === undefined) throw e;
      if (attempt >= attempts) {
        transactionRetries.gaveUp++;
        throw e;
      }
      transactionRetries.retried++;
      o.onRetry?.(attempt, e);
      // Jitter: two losers of the same race should not collide again on the same tick.
      const delay = base * 2 ** (attempt - 1) * (0.5 + Math.random());
      if (delay > 0) await new Promise((r) => setTimeout(r, delay));
    }
  }
}

export async function closeDb(): Promise<void> {
  const p = g.__spanproofPool;
  g.__spanproofPool = undefined;
  g.__spanproofDb = undefined;
  if (p) await p.end();
}
