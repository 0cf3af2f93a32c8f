"use server";

import { signOut } from "@/lib/auth/config";
import { refuseForgedAction } from "@/lib/security/action-guard";

export async function signOutAction(): Promise<void> {
  if (await refuseForgedAction("signOutAction")) return;
  await signOut({ redirectTo: "/sign-in" });
}
