// The audit trail is a legal record: the app's own database account can read it and add to it,
// and the database refuses it anything else. The code has no path that changes a recorded event.
import { readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";
import mysql from "mysql2/promise";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { accountFromUrl, grantAppAccess } from "@/db/grants";

const ownerUrl = process.env.DATABASE_URL!;
// The app account that scripts/db.sh creates; same instance and database as the owner's URL.
const appUrl = (() => {
  const u = new URL(ownerUrl);
  u.username = process.env.DB_APP_USER ?? "spanproof_app";
  u.password = process.env.DB_APP_PASSWORD ?? "spanproof-app-local";
  return u.toString();
})();

let owner: mysql.Connection;
let app: mysql.Connection;

beforeAll(async () => {
  owner = await mysql.createConnection({ uri: ownerUrl });
  const granted = await grantAppAccess(owner, accountFromUrl(appUrl));
  expect(granted.find((g) => g.table === "audit_events")?.privileges).toBe("SELECT, INSERT");
  app = await mysql.createConnection({ uri: appUrl });
});
afterAll(async () => {
  await app?.end();
  await owner?.end();
});

async function errno(p: Promise<unknown>): Promise<number | undefined> {
  try {
    await p;
    return undefined;
  } catch (e) {
    return (e as { errno?: number }).errno;
  }
}

// MariaDB error 1142 ER_TABLEACCESS_DENIED_ERROR: "<command> command denied to user … for table …"
// (MariaDB Knowledge Base, "MariaDB Error Codes").
const DENIED = 1142;

describe("audit trail, append-only by privilege", () => {
  it("lets the app account append and read", async () => {
    const [r] = await app.query<mysql.ResultSetHeader>(
      "INSERT INTO audit_events (action, entity_type, entity_id, summary) VALUES ('test.append', 'test', '1', 'appended by the app account')",
    );
    const [rows] = await app.query<mysql.RowDataPacket[]>("SELECT summary FROM audit_events WHERE id = ?", [r.insertId]);
    expect(rows[0]?.summary).toBe("appended by the app account");
  });

  it("refuses the app account UPDATE, DELETE and TRUNCATE of audit events", async () => {
    expect(await errno(app.query("UPDATE audit_events SET summary = 'rewritten'"))).toBe(DENIED);
    expect(await errno(app.query("DELETE FROM audit_events"))).toBe(DENIED);
    expect(await errno(app.query("TRUNCATE TABLE audit_events"))).toBe(DENIED);
    expect(await errno(app.query("DROP TABLE audit_events"))).toBe(DENIED);
    const [rows] = await owner.query<mysql.RowDataPacket[]>("SELECT COUNT(*) AS n FROM audit_events WHERE summary = 'rewritten'");
    expect(Number(rows[0]?.n)).toBe(0);
  });

  it("still lets the app account change its working tables", async () => {
    // A no-op update: the privilege is checked even when no row matches.
    expect(await errno(app.query("UPDATE applications SET version = version WHERE id = -1"))).toBeUndefined();
    expect(await errno(app.query("DELETE FROM login_attempts WHERE id = -1"))).toBeUndefined();
  });

  it("gives the app account no access to the migration bookkeeping", async () => {
    expect(await errno(app.query("SELECT * FROM __drizzle_migrations"))).toBe(DENIED);
  });
});

describe("audit trail, append-only in code", () => {
  // Every source folder the app, worker and scripts are built from.
  const roots = ["app", "lib", "db", "scripts", "components"];
  const walk = (dir: string): string[] =>
    readdirSync(dir).flatMap((f) => {
      const p = path.join(dir, f);
      return statSync(p).isDirectory() ? walk(p) : /\.(ts|tsx|mjs)$/.test(p) ? [p] : [];
    });
  const files = roots.flatMap(walk);

  it("has no update or delete of audit events anywhere", () => {
    expect(files.length).toBeGreaterThan(50);
    const offenders = files.filter((f) => {
      const s = readFileSync(f, "utf8");
      return /\.(update|delete)\(\s*auditEvents\b/.test(s) || /\b(UPDATE|DELETE\s+FROM|TRUNCATE(\s+TABLE)?)\s+`?audit_events\b/i.test(s);
    });
    expect(offenders).toEqual([]);
  });
});
