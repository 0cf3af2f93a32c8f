// Applies the committed migrations in drizzle/ as the owner account (MIGRATION_DATABASE_URL, else
// DATABASE_URL). When the app connects as a different account (DATABASE_URL), that account then
// gets table-level grants: read-write on its tables, read and append only on the audit trail.
import { drizzle } from "drizzle-orm/mysql2";
import { migrate } from "drizzle-orm/mysql2/migrator";
import mysql from "mysql2/promise";
import { accountFromUrl, grantAppAccess } from "@/db/grants";
import { parseEnv } from "@/lib/env";

const appUrl = process.env.DATABASE_URL;
const ownerUrl = process.env.MIGRATION_DATABASE_URL || appUrl;
if (!appUrl || !ownerUrl) {
  console.error("[migrate] DATABASE_URL is not set");
  process.exit(1);
}
parseEnv({ ...process.env });
const conn = await mysql.createConnection({ uri: ownerUrl, multipleStatements: true }).catch((e: Error) => {
  console.error(`[migrate] cannot connect to ${new URL(ownerUrl).host}${new URL(ownerUrl).pathname}: ${e.message}`);
  process.exit(1);
});
try {
  await migrate(drizzle(conn), { migrationsFolder: "drizzle" });
  console.log(`[migrate] ${new URL(ownerUrl).pathname.slice(1)} is up to date`);
  const app = accountFromUrl(appUrl);
  if (app.user !== accountFromUrl(ownerUrl).user) {
    const granted = await grantAppAccess(conn, app);
    const appendOnly = granted.filter((g) => !g.privileges.includes("UPDATE")).map((g) => g.table);
    console.log(`[migrate] ${app.user} may use ${granted.length} tables; append-only: ${appendOnly.join(", ")}`);
  }
} catch (e) {
  console.error("[migrate] failed:", e instanceof Error ? e.message : e);
  process.exitCode = 1;
} finally {
  await conn.end();
}
