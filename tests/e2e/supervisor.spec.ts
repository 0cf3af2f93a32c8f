import { expect, test, type APIRequestContext, type Page } from "@playwright/test";
import { DEMO_USERS } from "@/db/demo-accounts";
import { demoUser, MAILBOX, signIn, signOut, type CapturedMail } from "./support";

// The supervising examiner's journey: find the overdue reviews, move two of them to another
// plans examiner with a reason, and both examiners hear about it by e-mail. Runs on the seeded
// demo department (a year of history with overdue reviews).
test.describe.configure({ mode: "serial" });

const supervisor = demoUser("supervisor");
const examiners = DEMO_USERS.filter((u) => u.role === "examiner");

/**
 * Like support.waitForMail, but only mail received after `since`: the receiver keeps earlier
 * runs' messages, and a reseeded demo reuses the same application numbers.
 */
async function waitForNewMail(request: APIRequestContext, to: string, subject: RegExp, since: string, timeoutMs = 15_000): Promise<CapturedMail> {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    const list = (await (await request.get(`${MAILBOX}?to=${encodeURIComponent(to)}`)).json()) as (CapturedMail & { receivedAt: string })[];
    const hit = list.find((m) => m.receivedAt >= since && subject.test(m.subject));
    if (hit) return hit;
    await new Promise((r) => setTimeout(r, 300));
  }
  throw new Error(`no e-mail to ${to} matching ${subject} since ${since} within ${timeoutMs} ms`);
}

/** Page object for the queue. */
function queue(page: Page) {
  const rows = page.locator("table:has(caption:text('Open reviews')) tbody tr");
  return {
    rows,
    /** Sets a filter and waits until the table shows the server's answer to it. */
    async filter(label: "Due date" | "Plans examiner" | "Status", value: string, param: string) {
      const waitFor = page.waitForResponse((r) => r.url().includes("/api/queue?") && new URL(r.url()).searchParams.get(param) === value && r.status() === 200);
      await page.getByRole("group", { name: "Filters" }).getByLabel(label).selectOption(value);
      const body = (await (await waitFor).json()) as { rows: { number: string }[] };
      const first = body.rows[0];
      if (first) await expect(rows.first().getByRole("link").first()).toHaveText(first.number);
      await expect(rows).toHaveCount(Math.max(1, body.rows.length));
    },
    /** number and examiner of each row shown */
    async listed() {
      const out: { number: string; examiner: string; clock: string | null }[] = [];
      for (const r of await rows.all()) {
        out.push({
          number: (await r.getByRole("link").first().innerText()).trim(),
          examiner: (await r.locator("td").nth(2).innerText()).trim(),
          clock: await r.locator("[data-clock]").getAttribute("data-clock"),
        });
      }
      return out;
    },
  };
}

test("the supervisor filters the overdue reviews and reassigns two; both examiners are e-mailed", async ({ page, request }) => {
  const since = new Date().toISOString();
  await signIn(page, supervisor.email, supervisor.password);
  await expect(page.getByRole("heading", { level: 1, name: "Queue" })).toBeVisible();
  const q = queue(page);
  await expect(q.rows.first()).toBeVisible();

  await q.filter("Due date", "overdue", "due");
  await expect(page).toHaveURL(/due=overdue/);
  const overdue = await q.listed();
  expect(overdue.length).toBeGreaterThanOrEqual(2);
  for (const r of overdue) expect(r.clock, r.number).toBe("overdue");
  await expect(page.getByTestId("days-overdue").first()).toHaveText(/^\d+$/);

  // Two overdue reviews held by the same examiner move to another one.
  const from = examiners.find((e) => overdue.filter((r) => r.examiner === e.name).length >= 2);
  expect(from, `an examiner with two overdue reviews among ${JSON.stringify(overdue)}`).toBeTruthy();
  const to = examiners.find((e) => e.email !== from!.email)!;
  const examinerSelect = page.getByRole("group", { name: "Filters" }).getByLabel("Plans examiner");
  const fromValue = await examinerSelect.locator("option", { hasText: from!.name }).getAttribute("value");
  await q.filter("Plans examiner", fromValue!, "examinerId");
  const mine = await q.listed();
  expect(mine.every((r) => r.examiner === from!.name && r.clock === "overdue")).toBe(true);
  const moving = mine.slice(0, 2).map((r) => r.number);
  expect(moving).toHaveLength(2);

  for (const number of moving) await page.getByRole("checkbox", { name: `Select ${number}` }).check();
  await expect(page.getByText("2 selected")).toBeVisible();
  await page.getByRole("button", { name: "Reassign selected" }).click();
  const dialog = page.getByRole("dialog", { name: "Reassign 2 reviews" });
  const examinerField = dialog.getByLabel("Plans examiner");
  const option = examinerField.locator("option", { hasText: to.name });
  await expect(option).toHaveText(new RegExp(`^${to.name} \\(\\d+ open\\)$`)); // each examiner's current load
  await examinerField.selectOption((await option.getAttribute("value"))!);
  await dialog.getByLabel("Reason for the move").fill(`${from!.name} is at a code hearing this week; keeping both reviews on time.`);
  await dialog.getByRole("button", { name: "Reassign", exact: true }).click();

  const results = dialog.getByRole("list", { name: "Reassignment results" });
  for (const number of moving) await expect(results.getByText(number)).toBeVisible();
  await expect(results.getByText(`now with ${to.name}`)).toHaveCount(2);
  await dialog.getByRole("button", { name: "Done" }).click();
  await expect(page.getByText(`2 reviews reassigned to ${to.name}.`)).toBeVisible();

  // The moved reviews leave the first examiner's overdue list.
  await expect(q.rows.filter({ hasText: moving[0]! })).toHaveCount(0);
  await expect(q.rows.filter({ hasText: moving[1]! })).toHaveCount(0);

  for (const number of moving) {
    const away = await waitForNewMail(request, from!.email, new RegExp(`^${number} was reassigned$`), since);
    expect(away.text).toContain(`now with ${to.name}`);
    expect(away.text).not.toContain("code hearing");
    const assigned = await waitForNewMail(request, to.email, new RegExp(`^Assigned to you: ${number}`), since);
    expect(assigned.text).not.toContain("code hearing");
  }
  await signOut(page);
});

test("an examiner or an applicant calling the reassign route gets 403", async ({ page, baseURL }) => {
  for (const role of ["examiner", "applicant"] as const) {
    const u = demoUser(role);
    await signIn(page, u.email, u.password);
    await expect(page.getByTestId("user-role")).toBeVisible();
    // Same-origin, well-formed: the refusal is the role's, not the cross-site check's.
    const res = await page.request.post("/api/queue/reassign", {
      headers: { origin: baseURL! },
      data: { applicationIds: [1], examinerId: 1, reason: "Taking it myself." },
    });
    expect(res.status(), role).toBe(403);
    expect(await res.json()).toEqual({ error: { code: "forbidden", message: "Your role does not allow this." } });
    await signOut(page);
  }
});
