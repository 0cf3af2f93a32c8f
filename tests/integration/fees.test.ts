import { eq } from "drizzle-orm";
import { NextRequest } from "next/server";
import { afterAll, beforeEach, describe, expect, it, vi } from "vitest";
import { db } from "@/db/client";
import { applications, auditEvents, comments, invoices, outbox, reviewCycles } from "@/db/schema";
import { addComment, fireEvent, judgeResponse, respondToComment } from "@/lib/applications/service";
import { DEMO_FEE_SCHEDULE } from "@/lib/fees";
import { getFeeSchedule, saveFeeSchedule } from "@/lib/fees/service";
import { startCheckout } from "@/lib/payments/checkout";
import { startFakeProvider, type FakeProvider } from "@/lib/payments/fake-provider";
import { receiveWebhook } from "@/lib/payments/webhook";
import { makeUser, resetDb } from "./db-helpers";

// Fees through the workflow: the invoice at acceptance, the schedule an administrator edits,
// void or refund on withdrawal, resubmittal fees, and who may see what through the real route
// handlers. This department lets review start before payment (the default).
vi.hoisted(() => {
  process.env.PAYMENT_REQUIRED_BEFORE_REVIEW = "false";
  process.env.STRIPE_SECRET_KEY = "sk_test_integration_fees_0001";
  process.env.STRIPE_WEBHOOK_SECRET = "whsec_integration_fees_0001";
});
// The fake listens on any free port; the app's SDK is pointed at it before the routes load.
const fake: FakeProvider = await startFakeProvider({
  port: 0,
  secretKey: process.env.STRIPE_SECRET_KEY!,
  webhookSecret: process.env.STRIPE_WEBHOOK_SECRET!,
  deliver: async (payload, signature) => (await receiveWebhook(db(), payload, signature)).status,
});
process.env.PAYMENTS_API_URL = fake.url;

const session = vi.hoisted(() => ({ uid: 0 }));
vi.mock("@/lib/auth/config", () => ({ auth: async () => (session.uid ? { uid: session.uid, sv: 1 } : null) }));
const invoicesRoute = await import("@/app/api/invoices/route");
const invoiceRoute = await import("@/app/api/invoices/[id]/route");
const checkoutRoute = await import("@/app/api/invoices/[id]/checkout/route");
const refundRoute = await import("@/app/api/invoices/[id]/refund/route");
const appInvoicesRoute = await import("@/app/api/applications/[id]/invoices/route");

const base = process.env.APP_URL ?? "http://127.0.0.1:3100";
async function call<P>(handler: (req: NextRequest, ctx: { params: Promise<P> }) => Promise<Response>, path: string, init: { method?: string; body?: unknown; origin?: boolean; params?: P } = {}) {
  const headers: Record<string, string> = { "content-type": "application/json" };
  if (init.origin !== false) headers.origin = base;
  const res = await handler(
    new NextRequest(`${base}${path}`, { method: init.method ?? "GET", headers, body: init.body === undefined ? undefined : JSON.stringify(init.body) }),
    { params: Promise.resolve(init.params ?? ({} as P)) },
  );
  return { status: res.status, body: (await res.json()) as Record<string, unknown> };
}

afterAll(() => fake.close());
beforeEach(async () => {
  await fake.idle();
  await resetDb();
  fake.reset();
  session.uid = 0;
});

let serial = 0;
async function people() {
  return {
    applicant: { ...(await makeUser("applicant")), firmId: null },
    tech: { ...(await makeUser("technician")), firmId: null },
    examiner: { ...(await makeUser("examiner")), firmId: null },
    supervisor: { ...(await makeUser("supervisor")), firmId: null },
    admin: { ...(await makeUser("admin")), firmId: null },
  };
}
type People = Awaited<ReturnType<typeof people>>;

async function submitted(p: People, valuationCents = 4_200_000) {
  serial++;
  const [row] = await db()
    .insert(applications)
    .values({
      number: `LFB-FE-${String(serial).padStart(5, "0")}`,
      applicantId: p.applicant.id,
      state: "submitted",
      workDescription: "Covered rear deck with cantilevered joists and a glulam beam",
      siteAddress: `${300 + serial} Kiln Road, Larkspur Falls`,
      parcelNumber: "112-045-61",
      occupancyGroup: "R-3",
      constructionType: "VB",
      valuationCents,
      dporName: "Owen Corbel, PE",
      dporLicence: "PE-40211",
      submittedAt: new Date(),
    })
    .$returningId();
  return row!.id;
}

const appRow = async (id: number) => (await db().select().from(applications).where(eq(applications.id, id)))[0]!;
const invoicesOf = async (id: number) => db().select().from(invoices).where(eq(invoices.applicationId, id));
const audits = async (action: string) => db().select().from(auditEvents).where(eq(auditEvents.action, action));
const mail = async (template: string) => db().select().from(outbox).where(eq(outbox.template, template));

async function accept(p: People, id: number) {
  await fireEvent(db(), p.tech, id, "accept", (await appRow(id)).version, { examinerId: p.examiner.id });
  return (await invoicesOf(id))[0]!;
}

async function pay(p: People, invoiceId: number) {
  const { url } = await startCheckout(db(), p.applicant, invoiceId);
  await fake.pay(url.split("/pay/")[1]!);
}

const withdraw = async (p: People, id: number) => fireEvent(db(), p.applicant, id, "withdraw", (await appRow(id)).version, { reason: "Owner postponed the project." });

describe("the fee at intake acceptance", () => {
  it("is computed from the valuation with the arithmetic shown; review starts at once (payment not required first)", async () => {
    const p = await people();
    const id = await submitted(p, 4_200_000);
    const inv = await accept(p, id);
    // $42,000 in the demo schedule: $347.50 + ⌈($42,000 − $25,000) / $1,000⌉ × $9.00 = $347.50 + 17 × $9.00 = $500.50;
    // 65 % = $325.325 → $325.33; + $12.00 records fee = $337.33 (hand arithmetic).
    expect(inv).toMatchObject({ status: "open", totalCents: 33_733, scheduleVersion: "LF-FEES-r1" });
    expect(inv.lineItems[0]!.basis).toBe(
      "Building permit fee: valuation $42,000.00, bracket $25,000.01 to $100,000.00: $347.50 for the first $25,000.00 plus 17 × $9.00 for each additional $1,000.00 or fraction = $500.50. Plan-review fee: 65% × $500.50 = $325.325, rounded half up to $325.33.",
    );
    expect((await appRow(id)).dueAt).not.toBeNull(); // the clock runs from acceptance here
    const [issued] = await mail("fees.invoice_issued");
    expect(issued!.textBody).toContain("the review itself goes ahead meanwhile");
    const [audit] = await audits("invoice.issued");
    expect(audit!.summary).toBe(`${inv.number} issued: plan-review fee $337.33 (fee schedule LF-FEES-r1).`);
    expect(audit!.applicationId).toBe(id);
  });

  it("uses the schedule the administrator saved; an invoice already issued keeps its amounts and version", async () => {
    const p = await people();
    const first = await accept(p, await submitted(p));
    const { version: _v, revision: _r, ...input } = DEMO_FEE_SCHEDULE;
    await expect(saveFeeSchedule(db(), p.tech, { ...input, planReviewBasisPoints: 8_000 })).rejects.toMatchObject({ code: "forbidden" });
    const saved = await saveFeeSchedule(db(), p.admin, { ...input, planReviewBasisPoints: 8_000, fixedFees: [] });
    expect(saved).toMatchObject({ version: "LF-FEES-r2", revision: 2, planReviewBasisPoints: 8_000 });
    expect(await getFeeSchedule(db())).toEqual(saved);
    const [audit] = await audits("settings.fee_schedule");
    expect(audit!.summary).toContain("Fee schedule LF-FEES-r2 saved: 6 valuation brackets, plan-review fee 80% of the permit fee");

    const second = await accept(p, await submitted(p));
    // $500.50 × 80 % = $400.40 exactly, no records fee any more (hand arithmetic).
    expect(second).toMatchObject({ totalCents: 40_040, scheduleVersion: "LF-FEES-r2" });
    expect((await db().select().from(invoices).where(eq(invoices.id, first.id)))[0]).toEqual(first);
  });
});

describe("withdrawal before review starts", () => {
  it("voids an open invoice, closes its checkout and tells the applicant", async () => {
    const p = await people();
    const id = await submitted(p);
    const inv = await accept(p, id);
    const { url } = await startCheckout(db(), p.applicant, inv.id);
    await withdraw(p, id);
    await fake.idle();
    const [after] = await invoicesOf(id);
    expect(after).toMatchObject({ status: "void" });
    expect(after!.closedAt).not.toBeNull();
    expect(fake.sessions.get(url.split("/pay/")[1]!)!.status).toBe("expired");
    expect((await mail("fees.voided"))[0]!.subject).toBe(`${inv.number} cancelled — LFB-FE-${String(serial).padStart(5, "0")} withdrawn`);
    expect((await audits("invoice.voided"))[0]!.summary).toContain("withdrawn before the fee was paid");
    await expect(startCheckout(db(), p.applicant, inv.id)).rejects.toMatchObject({ code: "conflict" });
  });

  it("refunds a paid invoice in full through the provider; the provider's refund event changes nothing more", async () => {
    const p = await people();
    const id = await submitted(p);
    const inv = await accept(p, id);
    await pay(p, inv.id);
    expect((await invoicesOf(id))[0]!.status).toBe("paid");
    await withdraw(p, id);
    await fake.idle();
    const [after] = await invoicesOf(id);
    expect(after!.status).toBe("refunded");
    const refundEvents = fake.events.filter((e) => e.type === "charge.refunded");
    expect(refundEvents).toHaveLength(1);
    expect(JSON.parse(refundEvents[0]!.payload).data.object).toMatchObject({ payment_intent: after!.providerPaymentId, amount_refunded: inv.totalCents, refunded: true });
    expect(refundEvents[0]!.deliveries).toEqual([200]);
    expect(await audits("invoice.refunded")).toHaveLength(1);
    expect((await mail("fees.refunded"))[0]!.textBody).toContain(`refunded in full: $337.33`);
  });

  it("keeps the fee once the examiner has begun on the cycle", async () => {
    const p = await people();
    const id = await submitted(p);
    const inv = await accept(p, id);
    await pay(p, inv.id);
    await db().insert(comments).values({ applicationId: id, number: 1, cycle: 1, discipline: "structural", codeSection: "IBC 1604.3", codeEdition: "2021", body: "Show the deflection check.", createdBy: p.examiner.id });
    await withdraw(p, id);
    expect((await invoicesOf(id))[0]!.status).toBe("paid");
    expect((await audits("invoice.kept_on_withdrawal"))[0]!.summary).toBe(`${inv.number} stays paid: plan review of cycle 1 had begun before the withdrawal.`);
    expect(fake.events.filter((e) => e.type === "charge.refunded")).toHaveLength(0);
  });

  it("a refund the provider cannot issue never blocks the withdrawal; staff retry it", async () => {
    const p = await people();
    const id = await submitted(p);
    const inv = await accept(p, id);
    await pay(p, inv.id);
    fake.setMode({ failRefunds: true });
    await withdraw(p, id);
    expect((await appRow(id)).state).toBe("withdrawn");
    expect((await invoicesOf(id))[0]!.status).toBe("paid");
    expect((await audits("invoice.refund_failed"))[0]!.summary).toContain("staff can retry it from the invoice");

    session.uid = p.applicant.id;
    expect((await call(refundRoute.POST, `/api/invoices/${inv.id}/refund`, { method: "POST", params: { id: String(inv.id) } })).status).toBe(403);
    session.uid = p.tech.id;
    const failed = await call(refundRoute.POST, `/api/invoices/${inv.id}/refund`, { method: "POST", params: { id: String(inv.id) } });
    expect(failed.status).toBe(422);
    fake.setMode({ failRefunds: false });
    const ok = await call(refundRoute.POST, `/api/invoices/${inv.id}/refund`, { method: "POST", params: { id: String(inv.id) } });
    expect(ok).toEqual({ status: 200, body: { status: "refunded" } });
    await fake.idle();
    expect((await invoicesOf(id))[0]!.status).toBe("refunded");
    expect(await audits("invoice.refunded")).toHaveLength(1);
  });
});

describe("resubmittal fees beyond the included cycles", () => {
  it("resubmitting into cycle 4 issues the fixed fee itself, once, and review goes on meanwhile", async () => {
    const p = await people();
    const id = await submitted(p);
    await accept(p, id);
    // Three rounds of corrections and resubmittal, through the workflow: cycles 2 and 3 are covered.
    for (let round = 1; round <= 3; round++) {
      const c = await addComment(db(), p.examiner, id, { discipline: "Structural", codeSection: "IBC 1604.3", codeEdition: "2021 IBC", body: `Round ${round}: show the D+L deflection check for FB-3.` });
      await fireEvent(db(), p.examiner, id, "issue_corrections", (await appRow(id)).version);
      await respondToComment(db(), p.applicant, id, c.id, { body: `Round ${round}: added.`, changeReference: `Calc p. ${round + 6}` });
      await fireEvent(db(), p.applicant, id, "resubmit", (await appRow(id)).version);
      const fees = (await invoicesOf(id)).filter((i) => i.purpose === "resubmittal");
      expect(fees.map((f) => f.cycle), `after resubmittal ${round}`).toEqual(round < 3 ? [] : [4]);
      if (round < 3) {
        await fireEvent(db(), p.examiner, id, "begin_review", (await appRow(id)).version);
        await judgeResponse(db(), p.examiner, id, c.id, "resolved");
      }
    }
    const fee = (await invoicesOf(id)).find((i) => i.purpose === "resubmittal")!;
    expect(fee).toMatchObject({ cycle: 4, status: "open", totalCents: DEMO_FEE_SCHEDULE.resubmittal.feeCents });
    const issued = (await mail("fees.invoice_issued")).filter((m) => m.subject.includes("resubmittal fee"));
    expect(issued).toHaveLength(1);
    expect(issued[0]!.textBody).toContain("Please pay it before the review is decided; the review itself goes ahead meanwhile.");
    const [audit] = (await audits("invoice.issued")).filter((e) => e.entityId === String(fee.id));
    expect(audit!.summary).toBe(`${fee.number} issued: resubmittal review fee $180.00 (fee schedule LF-FEES-r1).`);
    // This department does not wait for payment: cycle 4 has its due date and the examiner begins.
    expect((await appRow(id)).dueAt).not.toBeNull();
    await fireEvent(db(), p.examiner, id, "begin_review", (await appRow(id)).version);
    // Staff cannot charge it a second time.
    session.uid = p.tech.id;
    const again = await call(appInvoicesRoute.POST, `/api/applications/${id}/invoices`, { method: "POST", body: { purpose: "resubmittal" }, params: { id: String(id) } });
    expect(again).toMatchObject({ status: 409, body: { error: { message: "Cycle 4 already has its resubmittal fee invoice." } } });
  });

  it("staff charge the fixed fee for cycle 4, once; cycle 2 is covered", async () => {
    const p = await people();
    const id = await submitted(p);
    await accept(p, id);
    await db().update(applications).set({ state: "resubmitted", cycle: 2 }).where(eq(applications.id, id));
    session.uid = p.tech.id;
    const post = () => call(appInvoicesRoute.POST, `/api/applications/${id}/invoices`, { method: "POST", body: { purpose: "resubmittal" }, params: { id: String(id) } });
    expect(await post()).toMatchObject({ status: 422, body: { error: { message: "Review cycle 2 is covered by the plan-review fee; there is no resubmittal fee to charge." } } });

    await db().update(applications).set({ cycle: 4 }).where(eq(applications.id, id));
    await db().insert(reviewCycles).values({ applicationId: id, number: 4, examinerId: p.examiner.id, receivedAt: new Date() });
    const listed = await call(appInvoicesRoute.GET, `/api/applications/${id}/invoices`, { params: { id: String(id) } });
    expect(listed.body.resubmittalFee).toMatchObject({ cycle: 4, totalCents: DEMO_FEE_SCHEDULE.resubmittal.feeCents });
    expect((await post()).status).toBe(201);
    expect((await post()).status).toBe(409);
    const r = (await invoicesOf(id)).find((i) => i.purpose === "resubmittal")!;
    expect(r).toMatchObject({ cycle: 4, totalCents: 18_000, status: "open" });
    session.uid = p.applicant.id;
    expect((await post()).status).toBe(403);
  });
});

describe("who sees which invoices (route handlers)", () => {
  it("applicants see their own, staff see all, others get 403 or 404", async () => {
    const p = await people();
    const mine = await accept(p, await submitted(p));
    const other = { ...(await makeUser("applicant")), firmId: null };
    const theirs = await accept({ ...p, applicant: other }, await submitted({ ...p, applicant: other }));

    session.uid = p.applicant.id;
    const list = await call(invoicesRoute.GET, "/api/invoices");
    expect((list.body.invoices as { id: number }[]).map((i) => i.id)).toEqual([mine.id]);
    expect((await call(invoiceRoute.GET, `/api/invoices/${theirs.id}`, { params: { id: String(theirs.id) } })).status).toBe(404);
    const detail = await call(invoiceRoute.GET, `/api/invoices/${mine.id}`, { params: { id: String(mine.id) } });
    expect(detail.body).toMatchObject({ canPay: true, invoice: { id: mine.id, totalCents: mine.totalCents, lineItems: mine.lineItems } });

    session.uid = p.tech.id;
    const all = await call(invoicesRoute.GET, "/api/invoices?status=open");
    expect((all.body.invoices as { id: number }[]).map((i) => i.id).sort()).toEqual([mine.id, theirs.id].sort());
    expect((await call(invoiceRoute.GET, `/api/invoices/${mine.id}`, { params: { id: String(mine.id) } })).body).toMatchObject({ canPay: false });

    session.uid = p.examiner.id;
    expect((await call(invoicesRoute.GET, "/api/invoices")).status).toBe(403);
    session.uid = p.admin.id;
    expect((await call(invoiceRoute.GET, `/api/invoices/${mine.id}`, { params: { id: String(mine.id) } })).status).toBe(404);
    session.uid = 0;
    expect((await call(invoicesRoute.GET, "/api/invoices")).status).toBe(401);
  });

  it("starting a checkout is a state change: refused without our Origin, refused to staff", async () => {
    const p = await people();
    const inv = await accept(p, await submitted(p));
    session.uid = p.applicant.id;
    const args = { method: "POST", params: { id: String(inv.id) } };
    expect((await call(checkoutRoute.POST, `/api/invoices/${inv.id}/checkout`, { ...args, origin: false })).status).toBe(403);
    const ok = await call(checkoutRoute.POST, `/api/invoices/${inv.id}/checkout`, args);
    expect(ok.status).toBe(200);
    expect(String(ok.body.url)).toMatch(new RegExp(`^${fake.url}/pay/cs_test_`));
    session.uid = p.tech.id;
    expect((await call(checkoutRoute.POST, `/api/invoices/${inv.id}/checkout`, args)).status).toBe(403);
  });
});
