import "server-only";
import type { Db } from "@/db/client";
import { recordAudit } from "@/db/queries/audit";
import { countRecentFailures, getUserForSignIn, recordLoginAttempt, type SessionUser } from "@/db/queries/users";
import { dummyHash, verifyPassword } from "./password";

// Throttle: per account 5 failures, per address 20 failures, in 15 minutes (ASVS 6.1.1).
export const THROTTLE = { windowMs: 15 * 60_000, perAccount: 5, perAddress: 20 };

export type CredentialResult =
  | { ok: true; user: SessionUser & { sessionVersion: number } }
  | { ok: false; reason: "invalid" | "throttled" };

/** The one place that decides a sign-in. Every attempt is counted and audited. */
export async function verifyCredentials(database: Db, email: string, password: string, ip: string): Promise<CredentialResult> {
  const f = await countRecentFailures(database, email, ip, THROTTLE.windowMs);
  if (f.byEmail >= THROTTLE.perAccount || f.byIp >= THROTTLE.perAddress) {
    await recordAudit(database, {
      actor: null,
      action: "auth.sign_in_throttled",
      entityType: "user",
      entityId: email,
      summary: `Sign-in refused: too many failed attempts for ${email} or from ${ip}`,
      ip,
    });
    return { ok: false, reason: "throttled" };
  }
  const row = await getUserForSignIn(database, email);
  const hash = row?.passwordHash ?? (await dummyHash());
  const matches = await verifyPassword(password, hash);
  const ok = Boolean(row && row.passwordHash && matches && row.status === "active");
  await recordLoginAttempt(database, email, ip, ok);
  await recordAudit(database, {
    actor: ok && row ? { id: row.id, role: row.role } : null,
    action: ok ? "auth.sign_in" : "auth.sign_in_failed",
    entityType: "user",
    entityId: row ? row.id : email,
    summary: ok ? `${email} signed in` : `Failed sign-in for ${email}`,
    ip,
  });
  if (!ok || !row) return { ok: false, reason: "invalid" };
  return {
    ok: true,
    user: { id: row.id, email: row.email, name: row.name, role: row.role, firmId: row.firmId, sessionVersion: row.sessionVersion },
  };
}
