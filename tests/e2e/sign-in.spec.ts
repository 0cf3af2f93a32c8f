import { expect, test } from "@playwright/test";
import { ROLE_LABELS, ROLES } from "@/lib/workflow/roles";
import { demoUser, signIn, signOut, uniqueEmail, waitForMail } from "./support";

const HOME_HEADING = {
  applicant: "My applications",
  technician: "Intake",
  examiner: "My reviews",
  supervisor: "Queue",
  admin: "Users",
} as const;

for (const role of ROLES) {
  test(`${role} signs in and lands on their home`, async ({ page }) => {
    const u = demoUser(role);
    await signIn(page, u.email, u.password);
    await expect(page.getByRole("heading", { level: 1, name: HOME_HEADING[role] })).toBeVisible();
    await expect(page.getByTestId("user-role")).toHaveText(ROLE_LABELS[role]);
    await expect(page.getByTestId("user-name")).toHaveText(u.name);
    await signOut(page);
  });
}

test("a wrong password gets the one generic message", async ({ page }) => {
  const u = demoUser("examiner");
  await signIn(page, u.email, "not the password", { expectSuccess: false });
  await expect(page.locator("form").getByRole("alert")).toHaveText("That e-mail address and password do not match an active account.");
  await signIn(page, "nobody@larkspurfalls.example", "not the password", { expectSuccess: false });
  await expect(page.locator("form").getByRole("alert")).toHaveText("That e-mail address and password do not match an active account.");
});

test("the API answers 401 signed out and 403 for the wrong role", async ({ page, request }) => {
  const anon = await request.get("/api/users");
  expect(anon.status()).toBe(401);
  expect(await anon.json()).toEqual({ error: { code: "unauthenticated", message: "Sign in to continue." } });
  const u = demoUser("applicant");
  await signIn(page, u.email, u.password);
  await expect(page.getByRole("heading", { level: 1, name: "My applications" })).toBeVisible();
  const denied = await page.request.get("/api/users");
  expect(denied.status()).toBe(403);
  expect((await denied.json()).error.code).toBe("forbidden");
  const me = await page.request.get("/api/me");
  expect((await me.json()).user.role).toBe("applicant");
});

test("admin invites a plans examiner, who sets a password from the e-mail and signs in; deactivation signs them out", async ({ page, browser, request }) => {
  const admin = demoUser("admin");
  const email = uniqueEmail("invitee");
  await signIn(page, admin.email, admin.password);
  await page.getByLabel("Name").fill("Tobias Wren");
  await page.getByLabel("E-mail address").fill(email);
  await page.getByLabel("Role", { exact: true }).selectOption("examiner");
  await page.getByRole("button", { name: "Send invitation" }).click();
  await expect(page.getByText(`Invitation sent to ${email}.`)).toBeVisible();
  await expect(page.getByRole("cell", { name: "Tobias Wren" })).toBeVisible();

  const mail = await waitForMail(request, email, /Spanproof account/);
  const link = mail.text.match(/https?:\/\/\S+\/invite\/[A-Za-z0-9_-]+/)?.[0];
  expect(link).toBeTruthy();

  const ctx = await browser.newContext();
  const invitee = await ctx.newPage();
  await invitee.goto(link!);
  await invitee.getByLabel("New password").fill("tobias wren plans 2026");
  await invitee.getByLabel("Repeat the password").fill("tobias wren plans 2026");
  await invitee.getByRole("button", { name: "Set password and finish" }).click();
  await expect(invitee.getByText("Your password is set.")).toBeVisible();
  await signIn(invitee, email, "tobias wren plans 2026");
  await expect(invitee.getByRole("heading", { level: 1, name: "My reviews" })).toBeVisible();

  // The admin deactivates the account; the invitee's next request finds the session dead.
  await page.reload();
  await page.getByRole("button", { name: "Deactivate Tobias Wren" }).click();
  await expect(page.getByText("Saved. That person's open sessions have ended.")).toBeVisible();
  await invitee.reload();
  await expect(invitee.getByRole("heading", { name: "Sign in" })).toBeVisible();
  expect((await invitee.request.get("/api/me")).status()).toBe(401);
  await ctx.close();
});
