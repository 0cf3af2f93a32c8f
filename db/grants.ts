// The app's database account gets exactly what the app does: read and write its tables, and
// for the audit trail only read and append. Run after every migration, by the owner account,
// so new tables are covered too. Table-level grants are the only way: MariaDB has no partial
// revoke of a database-wide grant.
import type mysql from "mysql2/promise";

/** Tables the app may only read and append to: legal records. */
export const APPEND_ONLY_TABLES = ["audit_events"] as const;
// Bookkeeping of the migration tool: the app never touches it.
const OWNER_ONLY_TABLES = ["__drizzle_migrations"];

export interface AppAccount {
  user: string;
  host: string;
}

export function accountFromUrl(url: string): AppAccount {
  return { user: decodeURIComponent(new URL(url).username), host: "127.0.0.1" };
}

const ident = (s: string) => {
  if (!/^[\w$]+$/.test(s)) throw new Error(`unexpected character in the identifier ${JSON.stringify(s)}`);
  return `\`${s}\``;
};

/** Grants on every table of the connection's current database; returns what was granted. */
export async function grantAppAccess(conn: mysql.Connection, account: AppAccount): Promise<{ table: string; privileges: string }[]> {
  const [rows] = await conn.query<mysql.RowDataPacket[]>(
    "SELECT table_name AS t FROM information_schema.tables WHERE table_schema = DATABASE() AND table_type = 'BASE TABLE' ORDER BY table_name",
  );
  const [[dbRow]] = await conn.query<mysql.RowDataPacket[]>("SELECT DATABASE() AS d");
  const database = ident(String(dbRow!.d));
  const who = `${conn.escape(account.user)}@${conn.escape(account.host)}`;
  const out: { table: string; privileges: string }[] = [];
  for (const r of rows) {
    const table = String(r.t);
    if (OWNER_ONLY_TABLES.includes(table)) continue;
    const privileges = (APPEND_ONLY_TABLES as readonly string[]).includes(table) ? "SELECT, INSERT" : "SELECT, INSERT, UPDATE, DELETE";
    // A table that was read-write before (or a hand-made grant) must lose UPDATE and DELETE.
    if (privileges === "SELECT, INSERT") {
      try {
        await conn.query(`REVOKE ALL PRIVILEGES ON ${database}.${ident(table)} FROM ${who}`);
      } catch (e) {
        // 1147: there was no grant on that table yet.
        if ((e as { errno?: number }).errno !== 1147) throw e;
      }
    }
    await conn.query(`GRANT ${privileges} ON ${database}.${ident(table)} TO ${who}`);
    out.push({ table, privileges });
  }
  return out;
}
