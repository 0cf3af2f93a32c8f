import "server-only";
import { and, asc, count, eq, gte, sql } from "drizzle-orm";
import type { Db, Tx } from "../client";
import { authTokens, firms, loginAttempts, users, type User } from "../schema";

/** What a session may know about its user. */
export interface SessionUser {
  id: number;
  email: string;
  name: string;
  role: User["role"];
  firmId: number | null;
}

const sessionColumns = {
  id: users.id,
  email: users.email,
  name: users.name,
  role: users.role,
  firmId: users.firmId,
  status: users.status,
  sessionVersion: users.sessionVersion,
};

export async function getUserForSignIn(database: Db, email: string) {
  const [row] = await database
    .select({ ...sessionColumns, passwordHash: users.passwordHash })
    .from(users)
    .where(eq(users.email, email))
    .limit(1);
  return row;
}

/** The user behind a session token, only while active and the token's version is current. */
export async function getActiveSessionUser(database: Db, id: number, sessionVersion: number): Promise<SessionUser | null> {
  const [row] = await database.select(sessionColumns).from(users).where(eq(users.id, id)).limit(1);
  if (!row || row.status !== "active" || row.sessionVersion !== sessionVersion) return null;
  return { id: row.id, email: row.email, name: row.name, role: row.role, firmId: row.firmId };
}

export async function listUsers(database: Db) {
  return database
    .select({
      id: users.id,
      email: users.email,
      name: users.name,
      role: users.role,
      status: users.status,
      title: users.title,
      firm: firms.name,
      version: users.version,
      createdAt: users.createdAt,
    })
    .from(users)
    .leftJoin(firms, eq(firms.id, users.firmId))
    .orderBy(asc(users.name));
}

export async function getUserById(database: Db | Tx, id: number) {
  const [row] = await database.select().from(users).where(eq(users.id, id)).limit(1);
  return row;
}

export async function listUsersByRole(database: Db | Tx, role: User["role"]) {
  return database
    .select({ id: users.id, email: users.email, name: users.name })
    .from(users)
    .where(and(eq(users.role, role), eq(users.status, "active")))
    .orderBy(asc(users.name));
}

export async function listFirms(database: Db) {
  return database.select({ id: firms.id, name: firms.name, kind: firms.kind }).from(firms).orderBy(asc(firms.name));
}

export async function recordLoginAttempt(database: Db, email: string, ip: string, success: boolean) {
  await database.insert(loginAttempts).values({ email, ip, success });
}

/** Failed attempts in the window, per account and per address: kept in the database so every instance agrees. */
export async function countRecentFailures(database: Db, email: string, ip: string, windowMs: number) {
  const since = new Date(Date.now() - windowMs);
  const [byEmail] = await database
    .select({ n: count() })
    .from(loginAttempts)
    .where(and(eq(loginAttempts.email, email), eq(loginAttempts.success, false), gte(loginAttempts.at, since)));
  const [byIp] = await database
    .select({ n: count() })
    .from(loginAttempts)
    .where(and(eq(loginAttempts.ip, ip), eq(loginAttempts.success, false), gte(loginAttempts.at, since)));
  return { byEmail: byEmail?.n ?? 0, byIp: byIp?.n ?? 0 };
}

export async function findUsableToken(database: Db | Tx, tokenHash: string, purpose: "invite" | "reset") {
  const [row] = await database
    .select({ id: authTokens.id, userId: authTokens.userId, expiresAt: authTokens.expiresAt, usedAt: authTokens.usedAt })
    .from(authTokens)
    .where(and(eq(authTokens.tokenHash, tokenHash), eq(authTokens.purpose, purpose)))
    .limit(1);
  if (!row || row.usedAt || row.expiresAt.getTime() < Date.now()) return null;
  return row;
}

export const bumpSessionVersion = sql`${users.sessionVersion} + 1`;
