import "server-only";
import { redirect } from "next/navigation";
import { cache } from "react";
import { db } from "@/db/client";
import { getActiveSessionUser, type SessionUser } from "@/db/queries/users";
import { forbidden, unauthenticated } from "@/lib/errors";
import type { Role } from "@/lib/workflow/roles";
import { auth } from "./config";

export type { SessionUser };

/**
 * The signed-in user, re-read from the database on every request: a deactivated account or a
 * role change (both bump session_version) ends every older session at its next request.
 */
export const currentUser = cache(async (): Promise<SessionUser | null> => {
  const session = await auth();
  if (!session?.uid) return null;
  return getActiveSessionUser(db(), session.uid, session.sv);
});

export async function requireUser(): Promise<SessionUser> {
  const u = await currentUser();
  if (!u) throw unauthenticated();
  return u;
}

export async function requireRole(...roles: Role[]): Promise<SessionUser> {
  const u = await requireUser();
  if (!roles.includes(u.role)) throw forbidden();
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
