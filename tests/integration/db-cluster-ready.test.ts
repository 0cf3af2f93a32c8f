// What a Galera cluster needs from the schema and the pool, checked on the single test server.
import mysql from "mysql2/promise";
import { afterEach, describe, expect, it } from "vitest";
import { createPool } from "@/db/client";

const url = process.env.DATABASE_URL!;
const opened: mysql.Pool[] = [];
afterEach(async () => {
  await Promise.all(opened.splice(0).map((p) => p.end()));
});
const open = (o: Parameters<typeof createPool>[0]) => {
  const p = createPool(o);
  opened.push(p);
  return p;
};

/** A local port nobody listens on: bound, read, released. */
async function closedPort(): Promise<number> {
  const net = await import("node:net");
  return new Promise((resolve) => {
    const s = net.createServer().listen(0, "127.0.0.1", () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });
}

describe("schema on a cluster", () => {
  it("gives every table a primary key (Galera replicates rows by it)", async () => {
    const conn = await mysql.createConnection({ uri: url });
    try {
      const [tables] = await conn.query<mysql.RowDataPacket[]>(
        `SELECT t.table_name AS name,
                (SELECT COUNT(*) FROM information_schema.table_constraints c
                  WHERE c.table_schema = t.table_schema AND c.table_name = t.table_name AND c.constraint_type = 'PRIMARY KEY') AS pk
           FROM information_schema.tables t
          WHERE t.table_schema = DATABASE() AND t.table_type = 'BASE TABLE'`,
      );
      // The migrations create well over a dozen tables; an empty list would prove nothing.
      expect(tables.length).toBeGreaterThan(10);
      expect(tables.filter((t) => Number(t.pk) !== 1).map((t) => String(t.name))).toEqual([]);
      const [engines] = await conn.query<mysql.RowDataPacket[]>(
        "SELECT table_name AS name, engine FROM information_schema.tables WHERE table_schema = DATABASE() AND table_type = 'BASE TABLE' AND engine <> 'InnoDB'",
      );
      // Galera replicates InnoDB only.
      expect(engines.map((t) => `${String(t.name)} (${String(t.engine)})`)).toEqual([]);
    } finally {
      await conn.end();
    }
  });
});

describe("a pool over several hosts", () => {
  const server = new URL(url);
  const live = `${server.hostname}:${server.port}`;

  it("fails over to the next host when the first refuses connections, and stays there", async () => {
    const dead = await closedPort();
    const p = open({ url, hosts: `127.0.0.1:${dead},${live}`, connectionLimit: 3 });
    const ports = new Set<number>();
    for (let i = 0; i < 6; i++) {
      const [rows] = await p.query<mysql.RowDataPacket[]>("SELECT @@port AS port");
      ports.add(Number(rows[0]!.port));
    }
    expect([...ports]).toEqual([Number(server.port)]);
  });

  it("reports the last host's error when none can be reached", async () => {
    const [a, b] = [await closedPort(), await closedPort()];
    const p = open({ url, hosts: `127.0.0.1:${a},127.0.0.1:${b}`, connectionLimit: 1 });
    await expect(p.query("SELECT 1")).rejects.toMatchObject({ code: "ECONNREFUSED" });
  });

  it("leaves wsrep_sync_wait alone on a server that is not a Galera node (auto)", async () => {
    const p = open({ url, hosts: live, connectionLimit: 1 });
    const [rows] = await p.query<mysql.RowDataPacket[]>("SELECT @@wsrep_on AS wsrep_on, @@session.wsrep_sync_wait AS sync_wait");
    expect(rows[0]).toEqual({ wsrep_on: 0, sync_wait: 0 });
  });

  it("refuses a server that is not a ready Galera node when told it is a cluster", async () => {
    const p = open({ url, cluster: "galera", connectionLimit: 1 });
    await expect(p.query("SELECT 1")).rejects.toThrow(/Galera node is not ready/);
  });
});
