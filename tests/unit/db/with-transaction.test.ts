import { describe, expect, it, vi } from "vitest";
import { isUnreachable, parseHosts, retryableErrno, transactionRetries, withTransaction, type Db } from "@/db/client";
import { parseEnv } from "@/lib/env";

// What mysql2 raises, wrapped the way drizzle wraps it (DrizzleQueryError keeps the driver error as cause).
function mysqlError(errno: number, code: string, message: string): Error {
  const driver = Object.assign(new Error(message), { errno, code, sqlState: "40001" });
  return new Error(`Failed query: commit`, { cause: driver });
}
const deadlock = () => mysqlError(1213, "ER_LOCK_DEADLOCK", "Deadlock found when trying to get lock; try restarting transaction");

/** A database whose transaction() runs fn, then fails with the next planned error, if any. */
function fakeDb(plan: Array<Error | null>) {
  let calls = 0;
  const database = {
    transaction: async (fn: (tx: unknown) => Promise<unknown>) => {
      const failure = plan[calls++] ?? null;
      const out = await fn({ attempt: calls });
      if (failure) throw failure; // as at COMMIT, where Galera reports a certification failure
      return out;
    },
  };
  return { database: database as unknown as Pick<Db, "transaction">, calls: () => calls };
}

describe("withTransaction", () => {
  it("runs the whole function again after two deadlocks and returns the third run's result", async () => {
    const { database, calls } = fakeDb([deadlock(), deadlock()]);
    const retries: number[] = [];
    let runs = 0;
    const out = await withTransaction(database, async () => `run ${++runs}`, { baseDelayMs: 0, onRetry: (n) => retries.push(n) });
    expect(out).toBe("run 3");
    expect(calls()).toBe(3);
    expect(retries).toEqual([1, 2]);
  });

  it("gives up after the bounded number of attempts with the original error", async () => {
    const errors = [deadlock(), deadlock(), deadlock(), deadlock(), deadlock()];
    const { database, calls } = fakeDb(errors);
    const before = { ...transactionRetries };
    const failure = withTransaction(database, async () => "never", { attempts: 3, baseDelayMs: 0 });
    await expect(failure).rejects.toBe(errors[2]);
    expect(calls()).toBe(3);
    expect(transactionRetries).toEqual({ retried: before.retried + 2, gaveUp: before.gaveUp + 1 });
  });

  it("defaults to four attempts", async () => {
    const { database, calls } = fakeDb(Array.from({ length: 9 }, deadlock));
    await expect(withTransaction(database, async () => 1, { baseDelayMs: 0 })).rejects.toThrow(/Failed query: commit/);
    expect(calls()).toBe(4);
  });

  it("retries a lock wait timeout (1205) too", async () => {
    const { database, calls } = fakeDb([mysqlError(1205, "ER_LOCK_WAIT_TIMEOUT", "Lock wait timeout exceeded")]);
    expect(await withTransaction(database, async () => "ok", { baseDelayMs: 0 })).toBe("ok");
    expect(calls()).toBe(2);
  });

  it("does not retry other errors: a duplicate key or an application error goes straight out", async () => {
    const dup = mysqlError(1062, "ER_DUP_ENTRY", "Duplicate entry");
    const first = fakeDb([dup]);
    await expect(withTransaction(first.database, async () => 1, { baseDelayMs: 0 })).rejects.toBe(dup);
    expect(first.calls()).toBe(1);

    const second = fakeDb([]);
    const conflict = new Error("That application changed meanwhile");
    await expect(
      withTransaction(second.database, async () => {
        throw conflict;
      }),
    ).rejects.toBe(conflict);
    expect(second.calls()).toBe(1);
  });

  it("waits longer before each further attempt (jittered exponential backoff)", async () => {
    // The delays asked of setTimeout, not wall-clock gaps: a loaded machine's timers fire late or,
    // measured from a stale loop clock, a little early, which says nothing about the backoff.
    const { database } = fakeDb([deadlock(), deadlock(), deadlock()]);
    const asked: number[] = [];
    const realSetTimeout = globalThis.setTimeout;
    const timer = vi.spyOn(globalThis, "setTimeout").mockImplementation(((fn: () => void, ms?: number) => {
      asked.push(ms ?? 0);
      return realSetTimeout(fn, 0);
    }) as typeof setTimeout);
    const jitter = vi.spyOn(Math, "random").mockReturnValueOnce(0).mockReturnValueOnce(0.5).mockReturnValueOnce(0.999);
    try {
      expect(await withTransaction(database, async () => "done", { baseDelayMs: 20 })).toBe("done");
    } finally {
      timer.mockRestore();
      jitter.mockRestore();
    }
    // 0.5–1.5 × 20, 40, 80 ms, at the jitter drawn: lowest, middle, highest.
    expect(asked).toHaveLength(3);
    expect(asked[0]).toBeCloseTo(10, 6);
    expect(asked[1]).toBeCloseTo(40, 6);
    expect(asked[2]).toBeCloseTo(80 * 1.499, 6);
  });
});

describe("database errors", () => {
  it("finds the errno of a retryable error through drizzle's wrapper", () => {
    expect(retryableErrno(deadlock())).toBe(1213);
    expect(retryableErrno(mysqlError(1062, "ER_DUP_ENTRY", "dup"))).toBeUndefined();
    expect(retryableErrno(new Error("plain"))).toBeUndefined();
  });

  it("knows a node that cannot serve from one that refused a statement", () => {
    expect(isUnreachable(Object.assign(new Error("connect ECONNREFUSED"), { code: "ECONNREFUSED" }))).toBe(true);
    expect(isUnreachable(Object.assign(new Error("WSREP has not yet prepared node"), { errno: 1047, code: "ER_UNKNOWN_COM_ERROR" }))).toBe(true);
    expect(isUnreachable(Object.assign(new Error("Duplicate entry"), { errno: 1062, code: "ER_DUP_ENTRY" }))).toBe(false);
  });
});

describe("several database hosts", () => {
  const good = { DATABASE_URL: "mysql://u:p@127.0.0.1:3307/spanproof", AUTH_SECRET: "x".repeat(40), APP_URL: "http://127.0.0.1:3000" };

  it("reads DATABASE_HOSTS in order of preference", () => {
    const e = parseEnv({ ...good, DATABASE_HOSTS: "127.0.0.1:3431, db-2.internal:3432,10.0.0.3:3433" });
    expect(parseHosts(e.DATABASE_HOSTS!)).toEqual([
      { host: "127.0.0.1", port: 3431 },
      { host: "db-2.internal", port: 3432 },
      { host: "10.0.0.3", port: 3433 },
    ]);
    expect(parseEnv(good).DATABASE_HOSTS).toBeUndefined();
  });

  it("names DATABASE_HOSTS and DATABASE_CLUSTER when they are malformed", () => {
    expect(() => parseEnv({ ...good, DATABASE_HOSTS: "127.0.0.1" })).toThrow(/DATABASE_HOSTS: must list host:port pairs separated by commas/);
    expect(() => parseEnv({ ...good, DATABASE_HOSTS: "127.0.0.1:3431;127.0.0.1:3432" })).toThrow(/DATABASE_HOSTS/);
    expect(() => parseEnv({ ...good, DATABASE_CLUSTER: "mesh" })).toThrow(/DATABASE_CLUSTER: must be "galera", "auto" or "none"/);
    expect(() => parseEnv({ ...good, OUTBOX_LEASE_SEC: "0" })).toThrow(/OUTBOX_LEASE_SEC/);
  });
});
