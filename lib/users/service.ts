import "server-only";
import { and, eq, isNull } from "drizzle-orm";
import { type Db, withTransaction } from "@/db/client";
import { recordAudit } from "@/db/queries/audit";
import { enqueueMail } from "@/db/queries/outbox";
import { findUsableToken, getUserById } from "@/db/queries/users";
import { authTokens, users } from "@/db/schema";
import { hashPassword } from "@/lib/auth/password";
import { INVITE_TTL_MS, RESET_TTL_MS, hashToken, newToken } from "@/lib/auth/tokens";
import { env } from "@/lib/env";
import { AppError, notFound, staleVersion } from "@/lib/errors";
import { inviteMail, resetMail } from "@/lib/mail/templates";
import { ROLE_LABELS, type Role } from "@/lib/workflow/roles";
import type { SessionUser } from "@/db/queries/users";

type Actor = Pick<SessionUser, "id" | "role" | "name">;

function isDuplicate(e: unknown): boolean {
  const code = (e as { code?: string; cause?: { code?: string } }).code ?? (e as { cause?: { code?: string } }).cause?.code;
  return code === "ER_DUP_ENTRY";
}

export async function inviteUser(
  database: Db,
  actor: Actor,
  input: { email: string; name: string; role: Role; firmId?: number; title?: string },
  ip?: string,
): Promise<{ id: number }> {
  const { token, hash } = newToken();
  try {
    return await withTransaction(database, async (tx) => {
      const [created] = await tx
        .insert(users)
        .values({ email: input.email, name: input.name, role: input.role, status: "invited", firmId: input.firmId ?? null, title: input.title ?? "" })
        .$returningId();
      if (!created) throw new AppError("internal", "The account could not be created.");
      await tx.insert(authTokens).values({
        userId: created.id,
        purpose: "invite",
        tokenHash: hash,
        expiresAt: new Date(Date.now() + INVITE_TTL_MS),
        createdBy: actor.id,
      });
      const mail = inviteMail({
        name: input.name,
        roleLabel: ROLE_LABELS[input.role].toLowerCase(),
        link: `${env().APP_URL}/invite/${token}`,
        invitedBy: actor.name,
      });
      await enqueueMail(tx, [{ dedupeKey: `invite:${hash}`, template: "invite", to: { address: input.email, name: input.name }, ...mail }]);
      await recordAudit(tx, {
        actor,
        action: "user.invited",
        entityType: "user",
        entityId: created.id,
        summary: `Invited ${input.email} as ${ROLE_LABELS[input.role]}`,
        ip,
      });
      return { id: created.id };
    });
  } catch (e) {
    if (isDuplicate(e)) throw new AppError("conflict", "A user with that e-mail address already exists.", { email: "Already in use." });
    throw e;
  }
}

export async function updateUser(
  database: Db,
  actor: Actor,
  id: number,
  change: { version: number; role?: Role; status?: "active" | "deactivated" },
  ip?: string,
): Promise<void> {
  if (id === actor.id) throw new AppError("forbidden", "You cannot change your own role or deactivate yourself.");
  await withTransaction(database, async (tx) => {
    const before = await getUserById(tx, id);
    if (!before) throw notFound("That user");
    if (change.status === "active" && before.status === "invited") {
      throw new AppError("invalid_input", "An invited user becomes active by accepting the invitation.");
    }
    const r = await tx
      .update(users)
      .set({
        ...(change.role ? { role: change.role } : {}),
        ...(change.status ? { status: change.status } : {}),
        sessionVersion: before.sessionVersion + 1,
        version: before.version + 1,
        updatedAt: new Date(),
      })
      .where(and(eq(users.id, id), eq(users.version, change.version)));
    if (r[0].affectedRows !== 1) throw staleVersion();
    const parts = [
      change.role && change.role !== before.role ? `role ${before.role} → ${change.role}` : null,
      change.status && change.status !== before.status ? `status ${before.status} → ${change.status}` : null,
    ].filter(Boolean);
    await recordAudit(tx, {
      actor,
      action: change.status === "deactivated" ? "user.deactivated" : "user.updated",
      entityType: "user",
      entityId: id,
      summary: `${before.email}: ${parts.join(", ") || "no change"}; existing sessions ended`,
      ip,
    });
  });
}

/** Always answers the same way, whether or not the address has an account. */
export async function requestPasswordReset(database: Db, email: string, ip?: string): Promise<void> {
  const [u] = await database.select().from(users).where(eq(users.email, email)).limit(1);
  if (!u || u.status !== "active") {
    await recordAudit(database, { actor: null, action: "auth.reset_requested_unknown", entityType: "user", entityId: email, summary: `Reset asked for ${email} (no active account)`, ip });
    return;
  }
  const { token, hash } = newToken();
  await withTransaction(database, async (tx) => {
    await tx.insert(authTokens).values({ userId: u.id, purpose: "reset", tokenHash: hash, expiresAt: new Date(Date.now() + RESET_TTL_MS) });
    const mail = resetMail({ name: u.name, link: `${env().APP_URL}/reset/${token}` });
    await enqueueMail(tx, [{ dedupeKey: `reset:${hash}`, template: "reset", to: { address: u.email, name: u.name }, ...mail }]);
    await recordAudit(tx, { actor: null, action: "auth.reset_requested", entityType: "user", entityId: u.id, summary: `Password reset link sent to ${u.email}`, ip });
  });
}

/** Invitation acceptance and password reset both end here: one-time token → new password. */
export async function setPasswordWithToken(
  database: Db,
  purpose: "invite" | "reset",
  token: string,
  password: string,
  ip?: string,
): Promise<{ email: string }> {
  const passwordHash = await hashPassword(password);
  return withTransaction(database, async (tx) => {
    const t = await findUsableToken(tx, hashToken(token), purpose);
    if (!t) throw new AppError("invalid_input", "This link has expired or was already used. Ask for a new one.");
    const used = await tx
      .update(authTokens)
      .set({ usedAt: new Date() })
      .where(and(eq(authTokens.id, t.id), isNull(authTokens.usedAt)));
    if (used[0].affectedRows !== 1) throw new AppError("conflict", "This link was just used.");
    const u = await getUserById(tx, t.userId);
    if (!u || u.status === "deactivated") throw new AppError("invalid_input", "This account is not active.");
    await tx
      .update(users)
      .set({ passwordHash, status: "active", sessionVersion: u.sessionVersion + 1, version: u.version + 1, updatedAt: new Date() })
      .where(eq(users.id, u.id));
    await recordAudit(tx, {
      actor: { id: u.id, role: u.role },
      action: purpose === "invite" ? "user.invitation_accepted" : "auth.password_reset",
      entityType: "user",
      entityId: u.id,
      summary: purpose === "invite" ? `${u.email} accepted the invitation and set a password` : `${u.email} reset the password`,
      ip,
    });
    return { email: u.email };
  });
}
