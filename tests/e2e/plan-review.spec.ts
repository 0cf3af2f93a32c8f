import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { expect, test, type Page } from "@playwright/test";
import { makeCalcPackage, makeDrawingSet } from "@/tests/fixtures/pdf/make";
import { demoUser, signIn, signOut, waitForMail } from "./support";

// The whole road in a browser, one person after another, with the e-mail each step owes.
test.describe.configure({ mode: "serial" });

const dir = mkdtempSync(path.join(tmpdir(), "spanproof-e2e-"));
const applicant = demoUser("applicant");
const tech = demoUser("technician");
const examiner = demoUser("examiner");
let appUrl = "";
let number = "";

async function files() {
  const drawings = path.join(dir, "riverbend-structural.pdf");
  const calcs = path.join(dir, "riverbend-calcs.pdf");
  const revised = path.join(dir, "S-201-rev1.pdf");
  writeFileSync(drawings, await makeDrawingSet({ sheets: [{ number: "S-101", title: "FOUNDATION PLAN" }, { number: "S-201", title: "SECOND FLOOR FRAMING PLAN" }] }));
  writeFileSync(calcs, await makeCalcPackage({ pages: [["FB-3  Span 16'-0\"  wL = 240 plf", "DL = 0.21 in < L/360 = 0.53 in"]] }));
  writeFileSync(revised, await makeDrawingSet({ sheets: [{ number: "S-201", title: "SECOND FLOOR FRAMING PLAN", notes: ["REV 1: FB-3 UPSIZED TO 5-1/8 x 13-1/2 GLULAM"] }] }));
  return { drawings, calcs, revised };
}

async function upload(page: Page, kind: "Drawing set" | "Calculation package", file: string) {
  await page.getByLabel("Document type").selectOption({ label: kind });
  await page.getByLabel("Choose PDF files to upload").setInputFiles(file);
  await expect(page.getByRole("list", { name: "Uploads" }).getByText("Uploaded").first()).toBeVisible();
}

async function act(page: Page, button: string, confirm?: string) {
  await page.getByRole("group", { name: "Actions on this application" }).getByRole("button", { name: button, exact: true }).click();
  if (confirm) await page.getByRole("dialog").getByRole("button", { name: confirm, exact: true }).click();
}

test("applicant files an application with a drawing set and calculations", async ({ page, request }) => {
  const f = await files();
  await signIn(page, applicant.email, applicant.password);
  await page.getByRole("link", { name: "New application" }).first().click();
  await page.getByLabel("Description of work").fill("Second-floor addition over existing garage, glulam floor beam FB-3");
  await page.getByLabel("Site address").fill("77 Millwright Court, Larkspur Falls");
  await page.getByLabel("Parcel number").fill("119-402-18");
  await page.getByLabel("Occupancy group").selectOption("R-3");
  await page.getByLabel("Construction type").selectOption("VB");
  await page.getByLabel("Valuation (US dollars)").fill("185,000");
  await page.getByLabel("Name").fill("Owen Corbel, PE");
  await page.getByLabel("Licence number").fill("PE-40211");
  await page.getByRole("button", { name: "Save draft and add documents" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "77 Millwright Court, Larkspur Falls" })).toBeVisible();
  appUrl = page.url();
  number = (await page.locator("header p.num").first().innerText()).trim();
  expect(number).toMatch(/^LFB-\d{2}-\d{5}$/);

  await upload(page, "Drawing set", f.drawings);
  await expect(page.getByRole("cell", { name: "riverbend-structural.pdf" })).toBeVisible();
  await act(page, "Submit for intake");
  await expect(page.getByText("Submitted for intake").first()).toBeVisible();
  await waitForMail(request, applicant.email, new RegExp(`${number} received`));
  await waitForMail(request, tech.email, new RegExp(`Intake: ${number}`));
  await signOut(page);
});

test("technician returns it as incomplete; the applicant adds the calculations and submits again", async ({ page, request }) => {
  const f = await files();
  await signIn(page, tech.email, tech.password);
  await page.goto(appUrl);
  await act(page, "Return as incomplete");
  const dialog = page.getByRole("dialog");
  for (const item of ["Drawing set uploaded and legible", "Design loads and data shown on the drawings (IBC 1603)", "Seal, signature and licence of the design professional present"]) {
    await dialog.getByLabel(item).check();
  }
  await dialog.getByRole("button", { name: "Return as incomplete" }).click();
  await expect(page.getByText("Returned as incomplete").first()).toBeVisible();
  const returned = await waitForMail(request, applicant.email, new RegExp(`${number} returned as incomplete`));
  expect(returned.text).toContain("structural calculation package included");
  await signOut(page);

  await signIn(page, applicant.email, applicant.password);
  await page.goto(appUrl);
  await expect(page.getByRole("status").filter({ hasText: "Returned as incomplete" })).toContainText("Missing: structural calculation package included");
  await upload(page, "Calculation package", f.calcs);
  await act(page, "Submit for intake");
  await expect(page.getByText("Submitted for intake").first()).toBeVisible();
  await signOut(page);
});

test("technician accepts and assigns a plans examiner, who is told", async ({ page, request }) => {
  await signIn(page, tech.email, tech.password);
  await page.getByRole("link", { name: number }).click();
  await act(page, "Accept for review");
  const dialog = page.getByRole("dialog");
  for (const box of await dialog.getByRole("checkbox").all()) await box.check();
  const select = dialog.getByLabel("Plans examiner");
  await expect(select.locator("option", { hasText: examiner.name })).toHaveCount(1);
  await select.selectOption((await select.locator("option", { hasText: examiner.name }).getAttribute("value"))!);
  await dialog.getByRole("button", { name: "Accept for review" }).click();
  await expect(page.getByText("In plan review").first()).toBeVisible();
  await waitForMail(request, applicant.email, new RegExp(`${number} accepted for plan review`));
  await waitForMail(request, examiner.email, new RegExp(`Assigned to you: ${number}`));
  await signOut(page);
});

// The test department reviews only after payment (playwright.config.ts).
test("review steps wait for the plan-review fee; the applicant pays it online and they unlock", async ({ page, request }) => {
  await signIn(page, examiner.email, examiner.password);
  await page.goto(appUrl);
  const actions = page.getByRole("group", { name: "Actions on this application" });
  await expect(actions.getByRole("button", { name: "Approve", exact: true })).toBeDisabled();
  await expect(actions.getByRole("button", { name: "Issue corrections", exact: true })).toBeDisabled();
  await expect(page.getByText(/Plan review waits for the fee: invoice INV-\d{2}-\d{5} \(\$[\d,.]+\) is not paid yet/).first()).toBeVisible();
  await signOut(page);

  await signIn(page, applicant.email, applicant.password);
  await page.goto(appUrl);
  await page.getByRole("region", { name: "Fees" }).getByRole("button", { name: "Pay online" }).click();
  await page.waitForURL(/\/pay\/cs_test_/);
  await page.getByRole("button", { name: /^Pay \$[\d,.]+$/ }).click();
  await page.waitForURL(/checkout=success/);
  await expect(page.locator("[data-invoice-status]")).toHaveAttribute("data-invoice-status", "paid");
  await waitForMail(request, applicant.email, new RegExp(`^Receipt: INV-\\d{2}-\\d{5} paid, .* — ${number}$`));
  await signOut(page);

  await signIn(page, examiner.email, examiner.password);
  await page.goto(appUrl);
  await expect(actions.getByRole("button", { name: "Approve", exact: true })).toBeEnabled();
  await expect(page.getByText("Plan review waits for the fee")).toHaveCount(0);
  await signOut(page);
});

test("plans examiner pins a comment on a sheet and issues corrections; the applicant is told", async ({ page, request }) => {
  await signIn(page, examiner.email, examiner.password);
  await page.getByRole("link", { name: number }).click();
  const viewer = page.getByRole("region", { name: "Sheets viewer" });
  await viewer.getByLabel("Go to sheet").selectOption({ label: "S-201 — SECOND FLOOR FRAMING PLAN" });
  const canvas = viewer.locator('canvas[data-state="rendered"]:visible').first();
  await expect(canvas).toBeVisible();
  await viewer.getByRole("button", { name: "Place comment pin" }).click();
  // A raw mouse click does not scroll: bring the sheet into view first (the page above it grows
  // with the review clock's table once the fee is paid).
  await canvas.scrollIntoViewIfNeeded();
  const box = (await canvas.boundingBox())!;
  await page.mouse.click(box.x + box.width * 0.4, box.y + box.height * 0.5);

  const form = page.getByRole("form", { name: "New correction comment" });
  await expect(form.getByText("Pinned on")).toContainText("S-201");
  await form.getByLabel("Code section").fill("IBC 1604.3");
  await form.getByLabel("Comment").fill("FB-3: show the total-load deflection check against L/240 for floor members, with creep per footnote d.");
  await form.getByRole("button", { name: "Add comment" }).click();
  await expect(page.getByRole("listitem", { name: "Comment 1" })).toContainText("Draft — not yet issued");
  await expect(viewer.getByRole("button", { name: "Comment 1, draft" })).toBeVisible();

  await act(page, "Issue corrections", "Issue corrections");
  await expect(page.getByText("Corrections issued").first()).toBeVisible();
  const mail = await waitForMail(request, applicant.email, new RegExp(`${number}: correction comments issued`));
  expect(mail.text).toContain("1 open comment");
  // The printable letter lists the comment with its sheet and code section.
  await page.getByRole("link", { name: "Correction letter (printable)" }).click();
  await expect(page.getByRole("heading", { name: "Plan review correction list" })).toBeVisible();
  await expect(page.getByRole("row", { name: /S-201 IBC 1604.3/ })).toBeVisible();
  await signOut(page);
});

test("applicant sees the pin, answers the comment, uploads a revised sheet and resubmits", async ({ page, request }) => {
  const f = await files();
  await signIn(page, applicant.email, applicant.password);
  await page.goto(appUrl);
  const comment = page.getByRole("listitem", { name: "Comment 1" });
  await expect(comment).toContainText("Open");
  await comment.getByRole("button", { name: /1\./ }).click();
  await expect(page.getByRole("region", { name: "Sheets viewer" }).getByRole("button", { name: "Comment 1, open" })).toBeVisible();
  // The workflow guard shows before anything is sent: every open comment needs a response.
  await expect(page.getByRole("group", { name: "Actions on this application" }).getByRole("button", { name: "Resubmit", exact: true })).toBeDisabled();
  await expect(page.getByText("Respond to every open comment before resubmitting")).toBeVisible();

  const answer = page.getByRole("form", { name: "Response to comment 1" });
  await answer.getByLabel("Your response").fill("Total-load check added; FB-3 upsized to 5-1/8 x 13-1/2 glulam.");
  await answer.getByLabel("Where the change is").fill("Sheet S-201 rev 1");
  await answer.getByRole("button", { name: "Save response" }).click();
  await expect(comment).toContainText("Sheet S-201 rev 1");
  await upload(page, "Drawing set", f.revised);
  await act(page, "Resubmit", "Resubmit");
  await expect(page.getByText("Resubmitted").first()).toBeVisible();
  await waitForMail(request, examiner.email, new RegExp(`Resubmittal: ${number}`));
  await signOut(page);
});

test("plans examiner compares the revised sheet, resolves the comment and approves with a condition", async ({ page, request }) => {
  await signIn(page, examiner.email, examiner.password);
  await page.goto(appUrl);
  await act(page, "Begin review");
  await expect(page.getByText("In plan review").first()).toBeVisible();
  const viewer = page.getByRole("region", { name: "Sheets viewer" });
  await viewer.getByLabel("Go to sheet").selectOption({ label: "S-201 — SECOND FLOOR FRAMING PLAN" });
  await viewer.getByRole("button", { name: "Compare with cycle 1" }).click();
  await expect(viewer.getByRole("region", { name: /^Cycle 1: Sheet S-201/ })).toBeVisible();

  const comment = page.getByRole("listitem", { name: "Comment 1" });
  await comment.getByRole("button", { name: "Mark resolved" }).click();
  await expect(comment).toContainText("Resolved");
  await act(page, "Approve with conditions");
  await page.getByRole("dialog").getByLabel("Conditions of approval (one per line)").fill("Deferred submittal: glulam supplier's certificate for FB-3 before framing inspection.");
  await page.getByRole("dialog").getByRole("button", { name: "Approve with conditions" }).click();
  await expect(page.getByText("Approved with conditions").first()).toBeVisible();
  const mail = await waitForMail(request, applicant.email, new RegExp(`${number} approved with conditions`));
  expect(mail.text).toContain("glulam supplier's certificate for FB-3");
});
