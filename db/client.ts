import "server-only";
import { drizzle, type MySql2Database } from "drizzle-orm/mysql2";
import mysql from "mysql2/promise";
import { env } from "@/lib/env";
import * as schema from "./schema";

export type Db = MySql2Database<typeof schema>;

// One pool per process, cached on globalThis so dev-server reloads do not leak connections.
const g = globalThis as unknown as { __spanproofPool?: mysql.Pool; __spanproofDb?: Db };

export function pool(): mysql.Pool {
  g.__spanproofPool ??= mysql.createPool({
    uri: env().DATABASE_URL,
    connectionLimit: 20,
    waitForConnections: true,
    timezone: "Z",
    dateStrings: false,
    supportBigNumbers: true,
  });
  return g.__spanproofPool;
}

export function db(): Db {
  g.__spanproofDb ??= drizzle(pool(), { schema, mode: "default" });
  return g.__spanproofDb;
}

export type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];

export async function closeDb(): Promise<void> {
  const p = g.__spanproofPool;
  g.__spanproofPool = undefined;
  g.__spanproofDb = undefined;
  if (p) await p.end();
}
