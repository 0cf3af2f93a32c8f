import { drizzle } from "drizzle-orm/mysql2";
import { migrate } from "drizzle-orm/mysql2/migrator";
import mysql from "mysql2/promise";
import { db } from "@/db/client";
import { users } from "@/db/schema";
import { hashPassword } from "@/lib/auth/password";
import type { Role } from "@/lib/workflow/roles";

let migrated = false;
export async function migrateTestDb(): Promise<void> {
  if (migrated) return;
  const conn = await mysql.createConnection({ uri: process.env.DATABASE_URL!, multipleStatements: true });
  try {
    await migrate(drizzle(conn), { migrationsFolder: "drizzle" });
  } finally {
    await conn.end();
  }
  migrated = true;
}

/** Empties every application table so each test starts from a known state. */
export async function resetDb(): Promise<void> {
  // One connection: FOREIGN_KEY_CHECKS is a session setting.
  const conn = await mysql.createConnection({ uri: process.env.DATABASE_URL! });
  try {
    const [rows] = await conn.query<mysql.RowDataPacket[]>(
      "SELECT table_name AS t FROM information_schema.tables WHERE table_schema = DATABASE() AND table_name <> '__drizzle_migrations'",
    );
    await conn.query("SET FOREIGN_KEY_CHECKS = 0");
    for (const r of rows) await conn.query(`TRUNCATE TABLE \`${String(r.t)}\``);
    await conn.query("SET FOREIGN_KEY_CHECKS = 1");
  } finally {
    await conn.end();
  }
}

let hash: string | undefined;
export async function makeUser(role: Role, email = `${role}-${Math.random().toString(36).slice(2, 8)}@test.example`, name = `Test ${role}`) {
  hash ??= await hashPassword("correct horse battery");
  const [row] = await db().insert(users).values({ email, name, role, status: "active", passwordHash: hash }).$returningId();
  return { id: row!.id, email, name, role, password: "correct horse battery" };
}
