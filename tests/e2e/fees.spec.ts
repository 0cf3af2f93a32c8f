import { expect, test, type Page } from "@playwright/test";
import { makeDrawingSet } from "@/tests/fixtures/pdf/make";
import { demoUser, signIn, signOut, waitForMail } from "./support";

// Fees and online payment, one person after another: the technician accepts, the applicant's
// card is first refused and then accepted on the provider's (local fake) checkout, review
// starts with the payment, and the receipt arrives. The test department requires payment
// before review (playwright.config.ts).
test.describe.configure({ mode: "serial" });

const applicant = demoUser("applicant", 1); // Lena Marsh, Tamarack Builders
const tech = demoUser("technician");
const examiner = demoUser("examiner", 1);
const admin = demoUser("admin");
const supervisor = demoUser("supervisor");
let appId = 0;
let number = "";

// Screenshots for people reviewing the screens: FEES_SCREENSHOTS=1 writes them under test-results/.
async function shot(page: Page, name: string) {
  if (process.env.FEES_SCREENSHOTS) await page.screenshot({ path: `test-results/fees-${name}.png`, fullPage: true });
}

/** Page object: the provider's hosted checkout (the local fake). */
const checkout = {
  async expectAmount(page: Page, amount: string) {
    await expect(page.getByRole("heading", { name: `Pay ${amount}` })).toBeVisible();
  },
  decline: (page: Page) => page.getByRole("button", { name: "Decline (simulate a refused card)" }).click(),
  abandon: (page: Page) => page.getByRole("link", { name: "Cancel and return to the department" }).click(),
  pay: (page: Page, amount: string) => page.getByRole("button", { name: `Pay ${amount}` }).click(),
};

/** The technician accepts it with the whole checklist and assigns the examiner. */
async function acceptInBrowser(page: Page, id: number) {
  await page.goto(`/applications/${id}`);
  await page.getByRole("group", { name: "Actions on this application" }).getByRole("button", { name: "Accept for review", exact: true }).click();
  const dialog = page.getByRole("dialog");
  for (const box of await dialog.getByRole("checkbox").all()) await box.check();
  const select = dialog.getByLabel("Plans examiner");
  await select.selectOption((await select.locator("option", { hasText: examiner.name }).getAttribute("value"))!);
  await dialog.getByRole("button", { name: "Accept for review" }).click();
  await expect(page.getByText("In plan review").first()).toBeVisible();
}

/** The applicant files an application through the API with a drawing set and submits it; returns its id and number. */
async function fileThroughApi(page: Page, siteAddress: string): Promise<{ id: number; number: string }> {
  const origin = new URL(page.url()).origin;
  const headers = { origin, "content-type": "application/json" };
  const created = await page.request.post("/api/applications", {
    headers,
    data: {
      workDescription: "Second-story addition over the existing garage, glulam floor beams",
      siteAddress,
      parcelNumber: "120-311-04",
      occupancyGroup: "R-3",
      constructionType: "VB",
      valuation: "185,000",
      dporName: "Owen Corbel, PE",
      dporLicence: "PE-40211",
    },
  });
  expect(created.status()).toBe(201);
  const filed = (await created.json()).application as { id: number; number: string };
  const id = filed.id;
  const pdf = await makeDrawingSet({ sheets: [{ number: "S-101", title: "FOUNDATION PLAN" }, { number: "S-201", title: "SECOND FLOOR FRAMING PLAN" }] });
  const up = await page.request.post(`/api/applications/${id}/documents?kind=drawings`, {
    headers: { origin, "content-type": "application/pdf", "x-file-name": encodeURIComponent("foundry-row-structural.pdf") },
    data: Buffer.from(pdf),
  });
  expect(up.status()).toBe(201);
  const view = await (await page.request.get(`/api/applications/${id}`)).json();
  const sub = await page.request.post(`/api/applications/${id}/events`, { headers, data: { event: "submit", version: view.application.version } });
  expect(sub.status()).toBe(200);
  return filed;
}

test("the applicant files an application through the API and submits it", async ({ page }) => {
  await signIn(page, applicant.email, applicant.password);
  ({ id: appId, number } = await fileThroughApi(page, "18 Foundry Row, Larkspur Falls"));
});

test("the technician accepts; the fee is computed with its arithmetic and the review clock waits for payment", async ({ page, request }) => {
  await signIn(page, tech.email, tech.password);
  await acceptInBrowser(page, appId);

  const fees = page.getByRole("region", { name: "Fees" });
  await expect(fees).toContainText("Waiting for the plan-review fee");
  // Demo schedule, $185,000: $1,022.50 + 85 × $6.25 = $1,553.75 permit fee; 65 % → $1,009.94;
  // + $12.00 records fee = $1,021.94 (hand arithmetic).
  await expect(fees).toContainText("$1,021.94");
  await expect(fees.getByText("Unpaid")).toBeVisible();
  await expect(page.getByRole("region", { name: "Review clock" }).locator("[data-clock]").first()).toHaveAttribute("data-clock", "no_due_date");
  // Staff have no "Pay online".
  await expect(fees.getByRole("button", { name: "Pay online" })).toHaveCount(0);

  const mail = await waitForMail(request, applicant.email, new RegExp(`${number}: plan-review fee \\$1,021\\.94 — invoice INV-\\d{2}-\\d{5}`));
  expect(mail.text).toContain("85 × $6.25 for each additional $1,000.00 or fraction = $1,553.75");
  expect(mail.text).toContain("the review clock starts on the day of payment");
  await signOut(page);

  // The assigned examiner may read the sheets, but review steps wait for the fee and say so.
  await signIn(page, examiner.email, examiner.password);
  await page.goto(`/applications/${appId}`);
  const actions = page.getByRole("group", { name: "Actions on this application" });
  await expect(actions.getByRole("button", { name: "Approve", exact: true })).toBeDisabled();
  await expect(page.getByText(/Plan review waits for the fee: invoice INV-\d{2}-\d{5} \(\$1,021\.94\) is not paid yet/).first()).toBeVisible();
  await expect(page.getByRole("region", { name: "Fees" })).toContainText("review steps unlock, when the applicant pays it");
  await shot(page, "0-examiner-waits-for-fee");
  await signOut(page);

  // The supervisor's queue tells a review held for its fee from one missing a due date.
  await signIn(page, supervisor.email, supervisor.password);
  await expect(page.getByRole("heading", { level: 1, name: "Queue" })).toBeVisible();
  const row = page.locator("table:has(caption:text('Open reviews')) tbody tr").filter({ hasText: number });
  await expect(row.locator("[data-clock]")).toHaveText(/Waiting for fee/);
  await signOut(page);
});

test("walking away or a refused card leaves the invoice open with the reason; a second card pays it and review starts", async ({ page, request }) => {
  await signIn(page, applicant.email, applicant.password);
  await page.goto(`/applications/${appId}`);
  const fees = page.getByRole("region", { name: "Fees" });
  await expect(fees).toContainText("Plan review begins when you pay the plan-review fee");
  await fees.getByText("How the fee was worked out").click();
  await expect(fees.getByRole("table", { name: /Invoice INV-/ })).toContainText("65% × $1,553.75 = $1,009.9375, rounded half up to $1,009.94");
  await shot(page, "1-workspace-unpaid");

  await fees.getByRole("button", { name: "Pay online" }).click();
  await page.waitForURL(/\/pay\/cs_test_/);
  await checkout.expectAmount(page, "$1,021.94");
  await shot(page, "2-checkout");
  // Walking away from the checkout charges nothing and says so.
  await checkout.abandon(page);
  await page.waitForURL(/\/invoices\/\d+\?checkout=cancelled/);
  await expect(page.getByRole("status").filter({ hasText: "You left the checkout without paying" })).toContainText("Nothing was charged; the invoice is still open.");
  await page.getByRole("button", { name: "Pay online $1,021.94" }).click();
  await page.waitForURL(/\/pay\/cs_test_/);
  await checkout.decline(page);
  await page.waitForURL(/\/invoices\/\d+\?checkout=cancelled/);
  await expect(page.getByRole("alert").filter({ hasText: "Your payment was declined" })).toContainText("Your payment was declined: Your card was declined. Nothing was charged and the invoice is still open.");
  await expect(page.locator("[data-invoice-status]")).toHaveAttribute("data-invoice-status", "open");
  await expect(page.locator("[data-invoice-status]")).toContainText("Unpaid");
  await shot(page, "3-declined");

  await page.getByRole("button", { name: "Pay online $1,021.94" }).click();
  await page.waitForURL(/\/pay\/cs_test_/);
  await checkout.pay(page, "$1,021.94");
  await page.waitForURL(/\/invoices\/\d+\?checkout=success&session_id=cs_test_/);
  await expect(page.getByRole("status").filter({ hasText: "Payment received: $1,021.94" })).toContainText("Plan review has started");
  await expect(page.locator("[data-invoice-status]")).toHaveAttribute("data-invoice-status", "paid");
  await expect(page.locator("[data-invoice-status]")).toContainText("Paid");
  await expect(page.getByText(/^pi_test_/)).toBeVisible();
  await shot(page, "4-paid");

  await page.getByRole("link", { name: number }).click();
  const clock = page.getByRole("region", { name: "Review clock" });
  await expect(clock.locator("[data-clock]").first()).toHaveAttribute("data-clock", "on_track");
  await expect(clock).toContainText("Cycle 1 due");
  await expect(page.getByRole("region", { name: "Fees" }).locator("[data-invoice-status]")).toHaveAttribute("data-invoice-status", "paid");
  await shot(page, "5-review-started");

  const receipt = await waitForMail(request, applicant.email, /^Receipt: INV-\d{2}-\d{5} paid, \$1,021\.94/);
  expect(receipt.text).toContain(`application ${number}`);
  expect(receipt.text).toContain("Plan review has started: the review clock started on the day of payment, and the first review is due by");
  expect(receipt.text).toMatch(/Payment reference: pi_test_\w+/);
  await signOut(page);
});

test("staff see the paid invoice in the department's list; the administrator tries a valuation on the schedule", async ({ page }) => {
  await signIn(page, tech.email, tech.password);
  await page.getByRole("link", { name: "Invoices" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Invoices" })).toBeVisible();
  await page.getByLabel("Status").selectOption({ label: "Paid" });
  const row = page.getByRole("row").filter({ hasText: number });
  await expect(row).toContainText("$1,021.94");
  await expect(row).toContainText("Paid");
  await expect(row).toContainText("Tamarack Builders");
  await shot(page, "6-staff-list");
  await signOut(page);

  await signIn(page, admin.email, admin.password);
  await page.getByRole("link", { name: "Fee schedule" }).click();
  await expect(page.getByText("Invented demo schedule", { exact: false }).first()).toBeVisible();
  await page.getByLabel("Project valuation ($)").fill("100,000");
  // $1,022.50 at $100,000; 65 % = $664.625 → $664.63; + $12.00 = $676.63 (hand arithmetic).
  await expect(page.getByTestId("fee-preview").getByTestId("invoice-total")).toHaveText("$676.63");
  await page.getByLabel("Plan-review fee (% of the permit fee)").fill("abc");
  await page.getByRole("button", { name: "Save as a new revision" }).click();
  await expect(page.getByRole("alert").filter({ hasText: "Some fields need attention." })).toBeVisible();
  await expect(page.getByRole("alert").filter({ hasText: "Enter a percentage" })).toBeVisible();
  await shot(page, "7-admin-schedule");
});

test("a cheque paid at the counter: the technician records it, review starts and the applicant gets the receipt", async ({ page, request }) => {
  await signIn(page, applicant.email, applicant.password);
  const other = await fileThroughApi(page, "7 Tannery Lane, Larkspur Falls");
  await signOut(page);

  await signIn(page, tech.email, tech.password);
  await acceptInBrowser(page, other.id);
  await page.getByRole("region", { name: "Fees" }).getByRole("link", { name: /^INV-/ }).click();
  const form = page.getByRole("form", { name: "Payment taken at the counter" });
  // An empty number is refused, naming the field; nothing is recorded.
  await form.getByRole("button", { name: /^Record payment of \$/ }).click();
  await expect(form.getByRole("alert")).toHaveText("Enter the cheque number or the counter receipt number.");
  await expect(page.locator("[data-invoice-status]")).toHaveAttribute("data-invoice-status", "open");
  await form.getByLabel("Paid by").selectOption({ label: "Cheque" });
  await form.getByLabel("Cheque number").fill("2207");
  await form.getByRole("button", { name: /^Record payment of \$/ }).click();
  await expect(page.locator("[data-invoice-status]")).toHaveAttribute("data-invoice-status", "paid");
  await expect(page.getByText("Cheque, recorded by")).toBeVisible();
  await expect(form).toHaveCount(0);
  await shot(page, "8-counter-payment");
  await signOut(page);

  const receipt = await waitForMail(request, applicant.email, new RegExp(`^Receipt: INV-\\d{2}-\\d{5} paid, .* — ${other.number}$`));
  expect(receipt.text).toContain("by cheque no. 2207, at the department's counter");
  expect(receipt.text).toContain("Plan review has started");
});
