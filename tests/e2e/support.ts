import { expect, type APIRequestContext, type Page } from "@playwright/test";
import { DEMO_PASSWORD, DEMO_USERS } from "@/db/demo-accounts";
import type { Role } from "@/lib/workflow/roles";

export const MAILBOX = `http://127.0.0.1:${process.env.TEST_MAIL_HTTP_PORT ?? "2680"}/messages`;

/** The n-th demo account of a role (0 = the first listed in the README). */
export function demoUser(role: Role, n = 0) {
  const u = DEMO_USERS.filter((x) => x.role === role)[n];
  if (!u) throw new Error(`no demo ${role}`);
  return { ...u, password: DEMO_PASSWORD };
}

/** Page object for the sign-in screen. */
export async function signIn(page: Page, email: string, password: string, { expectSuccess = true } = {}) {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail address").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  // Wait for the session: the sign-in page redirects to the role's home once it is set.
  if (expectSuccess) await page.waitForURL((u) => !u.pathname.startsWith("/sign-in"));
}

export async function signOut(page: Page) {
  await page.getByRole("button", { name: "Sign out" }).click();
  await expect(page.getByRole("heading", { name: "Sign in" })).toBeVisible();
}

export interface CapturedMail {
  to: string[];
  subject: string;
  text: string;
  messageId: string;
}

/** Waits for a message to this address in the local receiver (the worker sends every ~0.3 s). */
export async function waitForMail(request: APIRequestContext, to: string, match: RegExp = /./, timeoutMs = 15_000): Promise<CapturedMail> {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    const res = await request.get(`${MAILBOX}?to=${encodeURIComponent(to)}`);
    const list = (await res.json()) as CapturedMail[];
    const hit = list.filter((m) => match.test(m.subject)).at(-1);
    if (hit) return hit;
    await new Promise((r) => setTimeout(r, 300));
  }
  throw new Error(`no e-mail to ${to} matching ${match} within ${timeoutMs} ms`);
}

export const uniqueEmail = (prefix: string) => `${prefix}-${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}@test.example`;
