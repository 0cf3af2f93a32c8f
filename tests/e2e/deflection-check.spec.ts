import { mkdirSync } from "node:fs";
import { expect, test, type Page } from "@playwright/test";
import { demoUser, signIn } from "./support";

// The examiner's journey: open a demo application in review, enter floor beam FB-3 from its
// calculation package (invented demo data: 5-1/8 × 12 24F-1.8E glulam, 16 ft, wD = 72 plf,
// 40 psf live over a 6 ft tributary width, claimed Δ_L = 0.21 in), run it, read the verdict and
// the diagrams, save, turn it into a correction comment and open the printable report.
test.describe.configure({ mode: "serial" });

const examiner = demoUser("examiner");
const SHOTS = process.env.CHECK_SHOTS_DIR;
if (SHOTS) mkdirSync(SHOTS, { recursive: true });
const shot = async (page: Page, name: string) => {
  if (SHOTS) await page.screenshot({ path: `${SHOTS}/${name}.png`, fullPage: true });
};

async function riverbend(page: Page): Promise<number> {
  const res = await page.request.get(`/api/applications?scope=reviews&q=${encodeURIComponent("1250 Alder Street")}&pageSize=50`);
  const list = (await res.json()) as { rows: { id: number; siteAddress: string; state: string }[] };
  const row = list.rows.find((r) => r.siteAddress === "1250 Alder Street" && r.state === "in_review");
  if (!row) throw new Error("the demo application at 1250 Alder Street (in review with the examiner) is missing: seed the demo data");
  return row.id;
}

test("an examiner checks FB-3 from the calc, saves it, makes it a correction comment and prints the report", async ({ page }) => {
  test.setTimeout(120_000);
  await signIn(page, examiner.email, examiner.password);
  const id = await riverbend(page);
  await page.goto(`/applications/${id}`);
  const checks = page.getByRole("region", { name: "Deflection checks" });
  await expect(checks).toBeVisible();
  await checks.getByRole("link", { name: "New deflection check" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "New deflection check" })).toBeVisible();

  // The member, where it is drawn, and where its calc is.
  await page.getByLabel("Member mark").fill("FB-3");
  await page.getByLabel("Sheet it appears on").selectOption({ label: "S-201 — SECOND FLOOR FRAMING PLAN (cycle 1)" });
  await page.getByLabel("Calc page").fill("2");

  // From the calc: the span, the section, the material.
  await page.getByLabel("Span 1 (ft)").fill("16");
  await page.getByLabel("Section from").selectOption("rect");
  await page.getByLabel("Width b", { exact: true }).fill("5.125");
  await page.getByLabel("Depth d", { exact: true }).fill("12");
  await expect(page.getByTestId("section-arithmetic")).toContainText("I = b·d³/12 = 5.125 × 12³ / 12 = 738");
  await page.getByLabel("Material", { exact: true }).selectOption("glulam");
  await page.getByLabel("Stress class").fill("24F-1.8E");
  await expect(page.getByTestId("material-arithmetic")).toContainText("Ex = 1,800,000 psi");

  // The live load through the tributary helper: 40 psf × 6 ft = 240 plf.
  const trib = page.getByRole("group", { name: "Tributary-width helper" });
  await trib.getByLabel("Load case").selectOption("L");
  await trib.getByLabel("Area load q", { exact: true }).fill("40");
  await trib.getByLabel("Tributary width", { exact: true }).fill("6");
  await expect(trib.getByTestId("tributary-arithmetic")).toHaveText("w = 40 psf × 6 ft = 240 plf");
  await trib.getByRole("button", { name: "Add as uniform L load" }).click();

  // The dead load and the claim come from the calc's text layer, each on a click.
  const suggestions = page.getByRole("region", { name: "From the calculation package" });
  await expect(suggestions.getByRole("button", { name: "Use Line load D 72 plf" })).toBeVisible();
  await suggestions.getByRole("button", { name: "Use Line load D 72 plf" }).click();
  await suggestions.getByRole("button", { name: /^Use Claimed Δ \(L\) 0\.21 in/ }).click();
  await expect(page.getByRole("status").filter({ hasText: "Dropped in" })).toContainText("claims");
  await expect(page.getByRole("list", { name: "Loads" }).getByRole("listitem")).toHaveCount(2);
  await shot(page, "01-beam-form");

  await page.getByRole("button", { name: "Run check" }).click();
  const result = page.getByTestId("check-result");
  await expect(result).toBeVisible();
  // Δ_L = 5wl⁴/384EI = 0.266 in (AISC Table 3-23, case 1) against l/360 = 0.533 in (IBC 2021 Table 1604.3, floor members)
  const live = result.getByRole("status", { name: "FB-3 L: Within limit" });
  await expect(live).toContainText("0.266 in (6.77 mm)");
  await expect(live).toContainText("l/360 = 0.533 in (13.5 mm)");
  await expect(live).toContainText("Claim does not hold");
  await expect(page.getByTestId("verdict-disputed").first()).toBeVisible();
  await expect(result.getByTestId("deflected-shape")).toContainText("Δmax");
  await expect(result.getByTestId("diagram-M")).toBeVisible();
  await expect(result.getByTestId("cautions")).toContainText("The engineer of record remains responsible");
  await expect(result.getByTestId("cross-check")).toContainText("the two methods agree");
  await expect(result.getByTestId("energy-balance")).toContainText("balanced");
  await shot(page, "02-result");

  await page.getByRole("button", { name: "Save check" }).click();
  await page.waitForURL(/\/checks\/\d+$/);
  await expect(page.getByRole("heading", { level: 1, name: "Deflection check of FB-3" })).toBeVisible();
  await page.getByRole("button", { name: "Re-run" }).click();
  await expect(page.getByTestId("rerun-outcome")).toContainText("every number is identical to the stored result");

  await page.getByRole("button", { name: "Make a correction comment" }).click();
  const drafted = page.getByRole("status").filter({ hasText: /Correction comment \d+ drafted/ });
  await expect(drafted).toBeVisible();
  const number = /Correction comment (\d+) drafted/.exec(await drafted.innerText())?.[1];
  await expect(page.getByText(/Made into correction comment/)).toBeVisible();
  await shot(page, "03-saved");

  await page.getByRole("link", { name: "Printable report" }).click();
  await expect(page.getByRole("heading", { level: 1, name: /Deflection check report — FB-3/ })).toBeVisible();
  await expect(page.getByRole("row", { name: /Plans examiner Henrik Alvarado/ })).toBeVisible();
  await expect(page.getByText("Inputs (the model file as stored)")).toBeVisible();
  await page.emulateMedia({ media: "print" });
  await expect(page.getByRole("button", { name: "Print report" })).toBeHidden();
  await expect(page.getByTestId("deflected-shape")).toBeVisible();
  await shot(page, "04-report-print");
  await page.emulateMedia({ media: "screen" });

  // The comment sits in the current cycle's draft list with the numbers and the code section.
  await page.goto(`/applications/${id}`);
  const comment = page.getByRole("listitem", { name: `Comment ${number}`, exact: true });
  await expect(comment).toContainText("independent deflection check");
  await expect(comment).toContainText("IBC 1604.3");
  await expect(comment).toContainText("0.266 in (6.77 mm)");
  await expect(comment).toContainText("Draft — not yet issued");
});
