import { mkdirSync, mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { expect, test, type Page } from "@playwright/test";
import { EXAMPLE_SCHEDULE_CSV } from "@/lib/checks/schedule";
import { demoUser, signIn } from "./support";

// The applicant's pre-check: before submitting, Owen Corbel uploads a member model file with
// his draft and runs it, then checks a CSV member schedule in one batch.
const owen = demoUser("applicant");
const dir = mkdtempSync(path.join(tmpdir(), "spanproof-precheck-"));
const SHOTS = process.env.CHECK_SHOTS_DIR;
if (SHOTS) mkdirSync(SHOTS, { recursive: true });
const shot = async (page: Page, name: string) => {
  if (SHOTS) await page.screenshot({ path: `${SHOTS}/${name}.png`, fullPage: true });
};

// Invented demo member: 2x10 DF-L No.2 joists at 16 in o.c., 14 ft, D 10 psf and L 40 psf.
// Δ_L = 5wl⁴/384EI with w = 53.33 plf, I = 98.93 in⁴, E = 1.6e6 psi is 0.291 in (AISC Table 3-23, case 1).
function memberModel(): string {
  const file = path.join(dir, `j2-joists-${Date.now()}.model.json`);
  writeFileSync(
    file,
    JSON.stringify({
      title: "Quarry Lane floor joists J-2 (demo)",
      description: `uploaded by the pre-check browser test at ${new Date().toISOString()}`,
      kind: "beam",
      nodes: { A: ["0 ft", "0 ft"], B: ["14 ft", "0 ft"] },
      members: { J2: { ends: ["A", "B"], E: "1600 ksi", I: "98.93 in^4", A: "13.875 in^2" } },
      supports: { A: "pin", B: "roller" },
      loads: [
        { member: "J2", w: "-13.33 plf", case: "D" },
        { member: "J2", w: "-53.33 plf", case: "L" },
      ],
      find: [{ node: "mid:J2", dof: "y" }],
      checks: [{ id: "J-2", member: "J2", row: "floor", material: "sawn-dry", claimed: [{ combo: "L", delta: "0.29 in" }] }],
    }),
  );
  return file;
}

async function quarryLane(page: Page): Promise<number> {
  const res = await page.request.get(`/api/applications?scope=mine&q=${encodeURIComponent("16 Quarry Lane")}&pageSize=50`);
  const list = (await res.json()) as { rows: { id: number; siteAddress: string; state: string }[] };
  const row = list.rows.find((r) => r.siteAddress === "16 Quarry Lane" && r.state === "draft");
  if (!row) throw new Error("the demo draft at 16 Quarry Lane is missing: seed the demo data");
  return row.id;
}

test("an applicant pre-checks a member model and a CSV schedule", async ({ page }) => {
  test.setTimeout(120_000);
  await signIn(page, owen.email, owen.password);
  const id = await quarryLane(page);
  await page.goto(`/applications/${id}`);
  await page.getByRole("region", { name: "Deflection checks" }).getByRole("link", { name: "Pre-check members" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Deflection pre-check" })).toBeVisible();

  // A member model beside the calc PDF, run through the same checker.
  await page.getByRole("tab", { name: "Member models" }).click();
  const file = memberModel();
  await page.getByLabel("Choose member model files").setInputFiles(file);
  await expect(page.getByRole("status").filter({ hasText: `Uploaded ${path.basename(file)}` })).toBeVisible();
  const models = page.getByRole("list", { name: "Member models" });
  await models.getByRole("button", { name: `Run ${path.basename(file)}` }).click();
  const result = page.getByTestId("check-result");
  const live = result.getByRole("status", { name: "J-2 L: Within limit" });
  await expect(live).toContainText("0.291 in");
  await expect(live).toContainText("Claim agrees");
  await shot(page, "05-precheck-model");
  await page.getByRole("button", { name: "Save pre-check" }).click();
  await page.waitForURL(/\/checks\/\d+$/);
  await expect(page.getByRole("heading", { level: 1, name: "Pre-check of J-2" })).toBeVisible();

  // A member schedule, checked in one batch.
  await page.goto(`/applications/${id}/checks/new`);
  await page.getByRole("tab", { name: "CSV schedule" }).click();
  await expect(page.getByText("mark,span,supports,loads,section,E,claimed,limit").first()).toBeVisible();
  const bad = path.join(dir, "bad-schedule.csv");
  writeFileSync(bad, "mark,span,deflection\nFB-3,16 ft,0.2 in\n");
  await page.getByLabel("Choose a member schedule (CSV)").setInputFiles(bad);
  await expect(page.getByRole("alert").filter({ hasText: 'Unknown column "deflection"' })).toBeVisible();
  const csv = path.join(dir, "member-schedule.csv");
  writeFileSync(csv, EXAMPLE_SCHEDULE_CSV);
  await page.getByLabel("Choose a member schedule (CSV)").setInputFiles(csv);
  await page.getByRole("button", { name: "Check the schedule (4 members)" }).click();
  const table = page.getByRole("table", { name: "Schedule verdicts" });
  await expect(table.getByRole("row")).toHaveCount(5);
  // B-7, a W12x26 over 20 ft under 0.8 klf + 4 kip live: 0.682 in > l/360 = 0.667 in
  await expect(table.getByRole("row", { name: /B-7/ })).toContainText("Exceeds limit");
  await expect(table.getByRole("row", { name: /FB-3/ })).toContainText("Claim does not hold");
  await expect(table.getByRole("row", { name: /C-2/ })).toContainText("Within limit");
  await shot(page, "06-precheck-schedule");
});
