// Applies the committed migrations in drizzle/ to DATABASE_URL.
import { drizzle } from "drizzle-orm/mysql2";
import { migrate } from "drizzle-orm/mysql2/migrator";
import mysql from "mysql2/promise";
import { parseEnv } from "@/lib/env";

const url = process.env.DATABASE_URL;
if (!url) {
  console.error("[migrate] DATABASE_URL is not set");
  process.exit(1);
}
parseEnv({ ...process.env });
const conn = await mysql.createConnection({ uri: url, multipleStatements: true });
try {
  await migrate(drizzle(conn), { migrationsFolder: "drizzle" });
  console.log(`[migrate] ${new URL(url).pathname.slice(1)} is up to date`);
} catch (e) {
  console.error("[migrate] failed:", e instanceof Error ? e.message : e);
  process.exitCode = 1;
} finally {
  await conn.end();
}
