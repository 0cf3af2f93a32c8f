import "server-only";
import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { cache } from "react";
import { db } from "@/db/client";
import { getActiveSessionUser, type SessionUser } from "@/db/queries/users";
import { forbidden, unauthenticated, type AppError } from "@/lib/errors";
import { currentRequestTarget, markWritten, recordRefusal, type RefusalReason, type RequestTarget } from "@/lib/security/refusal-audit";
import type { Role } from "@/lib/workflow/roles";
import { auth } from "./config";
import { clientIp } from "./request-ip";

export type { SessionUser };

/**
 * The signed-in user, re-read from the database on every request: a deactivated account or a
 * role change (both bump session_version) ends every older session at its next request.
 */
const sessionState = cache(async (): Promise<{ uid: number | null; user: SessionUser | null }> => {
  const session = await auth();
  if (!session?.uid) return { uid: null, user: null };
  return { uid: session.uid, user: await getActiveSessionUser(db(), session.uid, session.sv) };
});

export const currentUser = cache(async (): Promise<SessionUser | null> => (await sessionState()).user);

/** Method and path for the audit row: set by route(); a server action is named by its id. */
async function requestTarget(): Promise<RequestTarget> {
  const t = currentRequestTarget();
  if (t) return t;
  try {
    const h = await headers();
    const action = h.get("next-action");
    return { method: "POST", path: action ? `action ${action.slice(0, 60)}` : "page", ip: clientIp(h) };
  } catch {
    return { method: "-", path: "outside a request" };
  }
}

async function refuse(e: AppError, reason: RefusalReason, actor: SessionUser | null, sessionUserId?: number): Promise<never> {
  await recordRefusal(db, {
    ...(await requestTarget()),
    actor: actor ? { id: actor.id, role: actor.role } : null,
    reason,
    status: e.status,
    ...(sessionUserId !== undefined ? { sessionUserId } : {}),
  });
  markWritten(e);
  throw e;
}

export async function requireUser(): Promise<SessionUser> {
  const { uid, user } = await sessionState();
  if (!user) return refuse(unauthenticated(), uid === null ? "signed_out" : "session_ended", null, uid ?? undefined);
  return user;
}

export async function requireRole(...roles: Role[]): Promise<SessionUser> {
  const u = await requireUser();
  if (!roles.includes(u.role)) return refuse(forbidden(), "role", u);
  return u;
}

/** For pages: send signed-out visitors to sign-in instead of throwing. */
export async function requirePageUser(...roles: Role[]): Promise<SessionUser> {
  const u = await currentUser();
  if (!u) redirect("/sign-in");
  // Wrong role on a page: back to their own home (the API answers 403 instead).
  if (roles.length && !roles.includes(u.role)) redirect(HOME_BY_ROLE[u.role]);
  return u;
}

export const HOME_BY_ROLE: Record<Role, string> = {
  applicant: "/applications",
  technician: "/intake",
  examiner: "/reviews",
  supervisor: "/queue",
  admin: "/admin/users",
};
