import "server-only";
import { eq, type SQL } from "drizzle-orm";
import type { MySqlColumn, MySqlTable } from "drizzle-orm/mysql-core";
import type { Db } from "@/db/client";
import { applications, comments, deflectionChecks, documents, invoices, users } from "@/db/schema";
import { matchRoute, paramObject, type ObjectScope } from "./access-matrix";

const TABLES: Record<Exclude<ObjectScope, "none">, { table: MySqlTable; id: MySqlColumn }> = {
  application: { table: applications, id: applications.id },
  document: { table: documents, id: documents.id },
  check: { table: deflectionChecks, id: deflectionChecks.id },
  comment: { table: comments, id: comments.id },
  invoice: { table: invoices, id: invoices.id },
  user: { table: users, id: users.id },
};

async function exists(database: Db, scope: Exclude<ObjectScope, "none">, id: number): Promise<boolean> {
  const t = TABLES[scope];
  const where: SQL = eq(t.id, id);
  const rows = await database.select({ id: t.id }).from(t.table).where(where).limit(1);
  return rows.length > 0;
}

/**
 * A 404 to a signed-in caller is a refused authorization ("not yours") when every object the
 * path names does exist; when one of them does not, it is a plain "not there".
 */
export async function pathNamesExistingObjects(database: Db, method: string, pathname: string): Promise<boolean> {
  const m = matchRoute(method, pathname);
  if (!m) return false;
  let named = 0;
  for (const [param, raw] of Object.entries(m.params)) {
    const scope = paramObject(m.row.path, param);
    if (!scope) continue;
    if (!/^\d{1,15}$/.test(raw)) return false;
    named++;
    if (!(await exists(database, scope, Number(raw)))) return false;
  }
  return named > 0;
}
