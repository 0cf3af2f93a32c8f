import { drizzle } from "drizzle-orm/mysql2";
import { migrate } from "drizzle-orm/mysql2/migrator";
import mysql from "mysql2/promise";
import { db } from "@/db/client";
import { applications, reviewCycles, users } from "@/db/schema";
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

let reviewSerial = 0;
/**
 * An open review as fireEvent leaves it once a cycle starts (the cycle's receipt and due date on
 * the application and its review cycle), with chosen dates, for the queue and reminder tests.
 */
export async function insertOpenReview(f: {
  numberPrefix: string;
  state?: "in_review" | "resubmitted" | "corrections_issued" | "approved";
  cycle?: number;
  examinerId: number | null;
  applicantId: number;
  receivedAt?: Date;
  dueAt?: Date | null;
}): Promise<number> {
  reviewSerial++;
  const cycle = f.cycle ?? (f.state === "resubmitted" ? 2 : 1);
  const received = f.receivedAt ?? new Date("2026-11-20T15:00:00Z");
  const [row] = await db()
    .insert(applications)
    .values({
      number: `${f.numberPrefix}-${String(reviewSerial).padStart(5, "0")}`,
      applicantId: f.applicantId,
      state: f.state ?? "in_review",
      cycle,
      workDescription: "Covered patio with a glulam beam",
      siteAddress: `${100 + reviewSerial} Lantern Way`,
      parcelNumber: "121-118-02",
      occupancyGroup: "R-3",
      constructionType: "VB",
      valuationCents: 4_200_000,
      dporName: "Owen Corbel, PE",
      dporLicence: "PE-40211",
      assignedExaminerId: f.examinerId,
      submittedAt: new Date(received.getTime() - 3 * 86_400_000),
      acceptedAt: received,
      receivedAt: received,
      dueAt: f.dueAt ?? null,
    })
    .$returningId();
  await db().insert(reviewCycles).values({ applicationId: row!.id, number: cycle, examinerId: f.examinerId, receivedAt: received, dueAt: f.dueAt ?? null });
  return row!.id;
}
