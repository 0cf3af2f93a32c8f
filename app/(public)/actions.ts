"use server";

import { AuthError } from "next-auth";
import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { db } from "@/db/client";
import { signIn } from "@/lib/auth/config";
import { clientIp } from "@/lib/auth/request-ip";
import { AppError } from "@/lib/errors";
import { refuseForgedAction } from "@/lib/security/action-guard";
import { requestPasswordReset, setPasswordWithToken } from "@/lib/users/service";
import { newPasswordSchema, resetRequestSchema, signInSchema } from "@/lib/validations/auth";

export interface FormState {
  error?: string;
  fields?: Record<string, string>;
  done?: boolean;
}

const GENERIC = "That e-mail address and password do not match an active account.";

export async function signInAction(_prev: FormState, form: FormData): Promise<FormState> {
  const refused = await refuseForgedAction("signInAction");
  if (refused) return { error: refused };
  const parsed = signInSchema.safeParse({ email: form.get("email"), password: form.get("password") });
  if (!parsed.success) return { error: GENERIC };
  try {
    await signIn("credentials", { email: parsed.data.email, password: parsed.data.password, redirectTo: "/" });
  } catch (e) {
    if (e instanceof AuthError) {
      const code = (e as AuthError & { code?: string }).code;
      return { error: code === "throttled" ? "Too many failed attempts. Wait 15 minutes and try again, or reset your password." : GENERIC };
    }
    throw e;
  }
  return {};
}

export async function requestResetAction(_prev: FormState, form: FormData): Promise<FormState> {
  const refused = await refuseForgedAction("requestResetAction");
  if (refused) return { error: refused };
  const parsed = resetRequestSchema.safeParse({ email: form.get("email") });
  if (!parsed.success) return { fields: { email: parsed.error.issues[0]?.message ?? "Enter your e-mail address." } };
  await requestPasswordReset(db(), parsed.data.email, clientIp(await headers()));
  return { done: true };
}

async function setPassword(purpose: "invite" | "reset", form: FormData): Promise<FormState> {
  const parsed = newPasswordSchema.safeParse({ token: form.get("token"), password: form.get("password"), confirm: form.get("confirm") });
  if (!parsed.success) {
    const fields: Record<string, string> = {};
    for (const i of parsed.error.issues) fields[String(i.path[0] ?? "_")] ??= i.message;
    return { fields, error: fields.token };
  }
  try {
    await setPasswordWithToken(db(), purpose, parsed.data.token, parsed.data.password, clientIp(await headers()));
  } catch (e) {
    if (e instanceof AppError) return { error: e.message };
    throw e;
  }
  redirect(`/sign-in?${purpose === "invite" ? "welcome" : "reset"}=1`);
}

export async function acceptInviteAction(_prev: FormState, form: FormData): Promise<FormState> {
  const refused = await refuseForgedAction("acceptInviteAction");
  if (refused) return { error: refused };
  return setPassword("invite", form);
}

export async function resetPasswordAction(_prev: FormState, form: FormData): Promise<FormState> {
  const refused = await refuseForgedAction("resetPasswordAction");
  if (refused) return { error: refused };
  return setPassword("reset", form);
}
