import { expect, test } from "@playwright/test";
import { demoUser, signIn } from "./support";

// Served files: authorized per request, never sniffed or run, byte ranges for the viewer.
test("a drawing set is served safely, in ranges, and only to those who may see it", async ({ browser }) => {
  const owen = demoUser("applicant");
  const ctx = await browser.newContext();
  const page = await ctx.newPage();
  await signIn(page, owen.email, owen.password);
  const list = await (await page.request.get("/api/applications?scope=mine&sort=number&dir=asc")).json();
  const withDocs = list.rows.find((r: { state: string }) => r.state !== "draft");
  const view = await (await page.request.get(`/api/applications/${withDocs.id}`)).json();
  const doc = view.documents[0];

  const whole = await page.request.get(doc.url);
  expect(whole.status()).toBe(200);
  expect(whole.headers()["content-type"]).toBe("application/pdf");
  expect(whole.headers()["x-content-type-options"]).toBe("nosniff");
  expect(whole.headers()["content-security-policy"]).toContain("sandbox");
  expect(whole.headers()["content-disposition"]).toMatch(/^inline; filename="structural-drawings\.pdf"; filename\*=UTF-8''/);
  const bytes = await whole.body();
  expect(bytes.length).toBe(doc.byteSize);
  expect(bytes.subarray(0, 5).toString("latin1")).toBe("%PDF-");

  const part = await page.request.get(doc.url, { headers: { range: "bytes=0-1023" } });
  expect(part.status()).toBe(206);
  expect(part.headers()["content-range"]).toBe(`bytes 0-1023/${doc.byteSize}`);
  expect((await part.body()).equals(bytes.subarray(0, 1024))).toBe(true);
  expect((await page.request.get(`${doc.url}?download=1`)).headers()["content-disposition"]).toMatch(/^attachment;/);

  // Another applicant, and a signed-out caller, learn nothing.
  const lena = demoUser("applicant", 1);
  const other = await browser.newContext();
  const p2 = await other.newPage();
  await signIn(p2, lena.email, lena.password);
  expect((await p2.request.get(doc.url)).status()).toBe(404);
  expect((await p2.request.get(`/api/applications/${withDocs.id}`)).status()).toBe(404);
  const anon = await browser.newContext();
  expect((await anon.request.get(doc.url)).status()).toBe(401);
  await Promise.all([ctx.close(), other.close(), anon.close()]);
});

test("department staff export an application's audit trail as CSV; the applicant cannot", async ({ browser }) => {
  const examiner = demoUser("examiner");
  const ctx = await browser.newContext();
  const page = await ctx.newPage();
  await signIn(page, examiner.email, examiner.password);
  const list = await (await page.request.get("/api/applications?scope=reviews&sort=number&dir=asc")).json();
  const app = list.rows[0];
  await page.goto(`/applications/${app.id}`);
  const [download] = await Promise.all([page.waitForEvent("download"), page.getByRole("link", { name: "Export audit trail (CSV)" }).click()]);
  expect(download.suggestedFilename()).toBe(`${app.number}-audit.csv`);
  const res = await page.request.get(`/api/applications/${app.id}/audit`);
  expect(res.headers()["content-type"]).toContain("text/csv");
  const lines = (await res.text()).trim().split("\r\n");
  expect(lines[0]).toBe("when (UTC),action,summary,by,role");
  expect(lines.some((l) => l.includes("application.accepted"))).toBe(true);

  const owen = demoUser("applicant");
  const other = await browser.newContext();
  const p2 = await other.newPage();
  await signIn(p2, owen.email, owen.password);
  expect((await p2.request.get(`/api/applications/${app.id}/audit`)).status()).toBe(403);
  await Promise.all([ctx.close(), other.close()]);
});
