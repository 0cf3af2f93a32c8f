import { and, eq } from "drizzle-orm";
import { NextRequest } from "next/server";
import Stripe from "stripe";
import { afterAll, beforeEach, describe, expect, it, vi } from "vitest";
import { db } from "@/db/client";
import { listQueuePage } from "@/db/queries/queue";
import { applications, auditEvents, invoices, outbox, paymentEvents, reviewCycles } from "@/db/schema";
import { addComment, fireEvent, respondToComment } from "@/lib/applications/service";
import { DEMO_FEE_SCHEDULE } from "@/lib/fees";
import { invoiceDetail, recordCounterPayment, saveFeeSchedule } from "@/lib/fees/service";
import { dayInZone, makeCalendar } from "@/lib/review-clock";
import { presentQueueRow } from "@/lib/review-clock/queue-row";
import { startFakeProvider, type FakeProvider } from "@/lib/payments/fake-provider";
import { confirmCheckout, startCheckout } from "@/lib/payments/checkout";
import { makeUser, resetDb } from "./db-helpers";

// Payment online through the provider's official SDK, against the local fake on a loopback
// port; the fake's signed webhooks go through the real route handler. This department requires
// payment before review, so the review clock starts at payment.
const SECRET = "whsec_integration_payments_01";
vi.hoisted(() => {
  process.env.PAYMENT_REQUIRED_BEFORE_REVIEW = "true";
  process.env.STRIPE_SECRET_KEY = "sk_test_integration_payments_01";
  process.env.STRIPE_WEBHOOK_SECRET = "whsec_integration_payments_01";
});
// The fake listens on any free port; the app's SDK is pointed at it before the route loads.
const statuses: number[] = [];
const fake: FakeProvider = await startFakeProvider({
  port: 0,
  secretKey: process.env.STRIPE_SECRET_KEY!,
  webhookSecret: SECRET,
  deliver: async (payload, signature) => {
    const r = await postWebhook(payload, signature);
    statuses.push(r.status);
    return r.status;
  },
});
process.env.PAYMENTS_API_URL = fake.url;

const { POST: webhookRoute } = await import("@/app/api/payments/webhook/route");
const base = process.env.APP_URL ?? "http://127.0.0.1:3100";

async function postWebhook(payload: string, signature: string | null) {
  const res = await webhookRoute(
    new NextRequest(`${base}/api/payments/webhook`, { method: "POST", headers: { "content-type": "application/json", ...(signature ? { "stripe-signature": signature } : {}) }, body: payload }),
  );
  return { status: res.status, body: (await res.json()) as Record<string, unknown> };
}

afterAll(() => fake.close());

beforeEach(async () => {
  await fake.idle();
  await resetDb();
  fake.reset();
  statuses.length = 0;
});

let serial = 0;
/** An application waiting at intake, accepted through the real workflow (which issues the invoice). */
async function accepted(valuationCents = 18_500_000) {
  serial++;
  const applicant = { ...(await makeUser("applicant")), firmId: null };
  const tech = { ...(await makeUser("technician")), firmId: null };
  const examiner = { ...(await makeUser("examiner")), firmId: null };
  const [row] = await db()
    .insert(applications)
    .values({
      number: `LFB-PY-${String(serial).padStart(5, "0")}`,
      applicantId: applicant.id,
      state: "submitted",
      workDescription: "Second-story addition over the existing garage, glulam floor beams",
      siteAddress: `${20 + serial} Sorrel Court, Larkspur Falls`,
      parcelNumber: "117-330-09",
      occupancyGroup: "R-3",
      constructionType: "VB",
      valuationCents,
      dporName: "Owen Corbel, PE",
      dporLicence: "PE-40211",
      submittedAt: new Date(),
    })
    .$returningId();
  const id = row!.id;
  await fireEvent(db(), tech, id, "accept", 1, { examinerId: examiner.id });
  const [inv] = await db().select().from(invoices).where(eq(invoices.applicationId, id));
  return { id, applicant, tech, examiner, invoiceId: inv!.id };
}

const invoice = async (id: number) => (await db().select().from(invoices).where(eq(invoices.id, id)))[0]!;
const audits = async (action: string) => db().select().from(auditEvents).where(eq(auditEvents.action, action));
const mails = async (template: string) => db().select().from(outbox).where(eq(outbox.template, template));
const sessionOf = (url: string) => url.split("/pay/")[1]!;
const counts = async () => ({
  events: (await db().select().from(paymentEvents)).length,
  audits: (await db().select().from(auditEvents)).length,
  mails: (await db().select().from(outbox)).length,
});

describe("fee at acceptance, with payment required before review", () => {
  it("issues the invoice with its arithmetic and holds the review clock until payment", async () => {
    const a = await accepted();
    const inv = await invoice(a.invoiceId);
    // Demo schedule: $185,000 → $1,022.50 + 85 × $6.25 = $1,553.75 permit fee; 65 % = $1,009.9375
    // → $1,009.94; plus the $12.00 records fee = $1,021.94 (hand arithmetic).
    expect(inv).toMatchObject({ status: "open", purpose: "plan_review", cycle: 1, totalCents: 102_194, currency: "usd", scheduleVersion: "LF-FEES-r1" });
    expect(inv.number).toMatch(/^INV-\d{2}-\d{5}$/);
    expect(inv.lineItems.map((l) => [l.code, l.amountCents])).toEqual([["plan_review", 100_994], ["records_fee", 1_200]]);
    expect(inv.lineItems[0]!.basis).toContain("85 × $6.25");
    const [app] = await db().select().from(applications).where(eq(applications.id, a.id));
    expect(app).toMatchObject({ state: "in_review", cycle: 1, dueAt: null });
    const [cycle] = await db().select().from(reviewCycles).where(eq(reviewCycles.applicationId, a.id));
    expect(cycle?.dueAt).toBeNull();
    const [issued] = await mails("fees.invoice_issued");
    expect(issued).toMatchObject({ toAddress: a.applicant.email, applicationId: a.id });
    expect(issued!.textBody).toContain("the review clock starts on the day of payment");
    expect(issued!.textBody).toContain("Total: $1,021.94");
    expect(await audits("invoice.issued")).toHaveLength(1);
  });
});

describe("webhook", () => {
  it("valid → paid once: receipt e-mailed, review clock started at payment", async () => {
    const a = await accepted();
    const { url } = await startCheckout(db(), a.applicant, a.invoiceId);
    expect(url).toBe(`${fake.url}/pay/${sessionOf(url)}`);
    const before = new Date();
    await fake.pay(sessionOf(url));
    expect(statuses).toEqual([200, 200]); // payment_intent.succeeded (stored, no effect), checkout.session.completed

    const inv = await invoice(a.invoiceId);
    expect(inv.status).toBe("paid");
    expect(inv.providerPaymentId).toMatch(/^pi_/);
    expect(inv.paidAt!.getTime()).toBeGreaterThanOrEqual(before.getTime() - 5);
    expect(await audits("invoice.paid")).toHaveLength(1);
    const receipts = await mails("fees.receipt");
    expect(receipts).toHaveLength(1);
    expect(receipts[0]!.subject).toBe(`Receipt: ${inv.number} paid, $1,021.94 — LFB-PY-${String(serial).padStart(5, "0")}`);
    expect(receipts[0]!.textBody).toContain(`Payment reference: ${inv.providerPaymentId}`);
    expect(receipts[0]!.textBody).toContain("Plan review has started");

    // The clock counts from payment: cycle 1 received then, due 10 business days on (14–18 calendar days with weekends and holidays).
    const [cycle] = await db().select().from(reviewCycles).where(eq(reviewCycles.applicationId, a.id));
    expect(Math.abs(cycle!.receivedAt.getTime() - inv.paidAt!.getTime())).toBeLessThan(1000);
    const days = (cycle!.dueAt!.getTime() - inv.paidAt!.getTime()) / 86_400_000;
    expect(days).toBeGreaterThan(13);
    expect(days).toBeLessThan(19);
    const [app] = await db().select().from(applications).where(eq(applications.id, a.id));
    expect(app!.dueAt?.getTime()).toBe(cycle!.dueAt!.getTime());
    expect(await audits("review.clock_started")).toHaveLength(1);
  });

  it("replayed → no change (the event id is the idempotency key)", async () => {
    const a = await accepted();
    const { url } = await startCheckout(db(), a.applicant, a.invoiceId);
    await fake.pay(sessionOf(url));
    const paid = await invoice(a.invoiceId);
    const before = await counts();
    const completed = fake.events.find((e) => e.type === "checkout.session.completed")!;
    expect(await fake.resend(completed.id)).toBe(200);
    const raw = await postWebhook(completed.payload, Stripe.webhooks.generateTestHeaderString({ payload: completed.payload, secret: SECRET }));
    expect(raw).toEqual({ status: 200, body: { received: true, outcome: "duplicate", invoiceId: a.invoiceId } });
    expect(await invoice(a.invoiceId)).toEqual(paid);
    expect(await counts()).toEqual(before);
  });

  it("delivered twice at once by the provider → still paid once", async () => {
    const a = await accepted();
    fake.setMode({ duplicate: true });
    const { url } = await startCheckout(db(), a.applicant, a.invoiceId);
    await fake.pay(sessionOf(url));
    expect(statuses).toEqual([200, 200, 200, 200]);
    expect(await audits("invoice.paid")).toHaveLength(1);
    expect(await mails("fees.receipt")).toHaveLength(1);
    expect(await db().select().from(paymentEvents)).toHaveLength(2);
  });

  it("bad signature → 400, nothing changes", async () => {
    const a = await accepted();
    const { url } = await startCheckout(db(), a.applicant, a.invoiceId);
    fake.setMode({ delivery: "hold" });
    await fake.pay(sessionOf(url));
    const completed = fake.events.find((e) => e.type === "checkout.session.completed")!;
    const before = await counts();
    const invBefore = await invoice(a.invoiceId);

    const wrongSecret = Stripe.webhooks.generateTestHeaderString({ payload: completed.payload, secret: "whsec_someone_else_0000000" });
    const stale = Stripe.webhooks.generateTestHeaderString({ payload: completed.payload, secret: SECRET, timestamp: Math.floor(Date.now() / 1000) - 600 });
    const good = Stripe.webhooks.generateTestHeaderString({ payload: completed.payload, secret: SECRET });
    const tampered = completed.payload.replace('"amount_total":102194', '"amount_total":1');
    for (const [payload, sig] of [
      [completed.payload, wrongSecret],
      [completed.payload, stale], // older than the SDK's 300 s tolerance
      [tampered, good], // signed body changed
      [completed.payload, null], // no header at all
      [completed.payload, "t=1,v1=deadbeef"],
    ] as const) {
      const r = await postWebhook(payload, sig);
      expect(r.status).toBe(400);
      expect((r.body.error as { code: string }).code).toBe("invalid_signature");
    }
    expect(await counts()).toEqual(before);
    expect(await invoice(a.invoiceId)).toEqual(invBefore);
  });

  it("out of order: a decline delivered after the success leaves the invoice paid", async () => {
    const a = await accepted();
    const { url } = await startCheckout(db(), a.applicant, a.invoiceId);
    fake.setMode({ delivery: "hold" });
    await fake.decline(sessionOf(url)); // first attempt refused…
    await fake.pay(sessionOf(url)); // …second card accepted
    await fake.release("reverse"); // completed, succeeded, then the old payment_failed
    expect(statuses).toEqual([200, 200, 200]);
    expect((await invoice(a.invoiceId)).status).toBe("paid");
    expect(await audits("invoice.payment_declined")).toHaveLength(0);
    expect(await db().select().from(paymentEvents)).toHaveLength(3);
  });

  it("out of order: a refund reported before the payment ends refunded, not paid", async () => {
    const a = await accepted();
    const { url } = await startCheckout(db(), a.applicant, a.invoiceId);
    fake.setMode({ delivery: "hold" });
    await fake.pay(sessionOf(url));
    const pi = String(fake.sessions.get(sessionOf(url))!.payment_intent);
    const sdk = new Stripe(process.env.STRIPE_SECRET_KEY!, { host: "127.0.0.1", port: fake.port, protocol: "http", telemetry: false });
    await sdk.refunds.create({ payment_intent: pi }); // made at the provider, e.g. by its dashboard
    await fake.release("reverse"); // charge.refunded, completed, succeeded
    const inv = await invoice(a.invoiceId);
    expect(inv).toMatchObject({ status: "refunded", providerPaymentId: pi });
    expect(await audits("invoice.refunded")).toHaveLength(1);
    expect(await mails("fees.receipt")).toHaveLength(0);
  });

  it("webhook before the redirect: the return page finds it paid and changes nothing", async () => {
    const a = await accepted();
    const { url } = await startCheckout(db(), a.applicant, a.invoiceId);
    await fake.pay(sessionOf(url)); // delivered before the browser is sent back (the provider's usual order)
    const before = await counts();
    expect(await confirmCheckout(db(), a.applicant, a.invoiceId, sessionOf(url))).toEqual({ status: "paid", outcome: "already_paid" });
    expect(await counts()).toEqual(before);
  });

  it("redirect before the webhook: the return confirms with the provider; the late webhook changes nothing", async () => {
    const a = await accepted();
    const { url } = await startCheckout(db(), a.applicant, a.invoiceId);
    fake.setMode({ delivery: "hold" });
    await fake.pay(sessionOf(url));
    expect((await invoice(a.invoiceId)).status).toBe("open");
    expect(await confirmCheckout(db(), a.applicant, a.invoiceId, sessionOf(url))).toEqual({ status: "paid", outcome: "paid" });
    const [paidAudit] = await audits("invoice.paid");
    expect((paidAudit!.detail as { via: string }).via).toBe("return");
    await fake.release();
    expect(statuses).toEqual([200, 200]);
    expect(await audits("invoice.paid")).toHaveLength(1);
    expect(await mails("fees.receipt")).toHaveLength(1);
    const [completed] = await db().select().from(paymentEvents).where(eq(paymentEvents.type, "checkout.session.completed"));
    expect(completed?.invoiceId).toBe(a.invoiceId);
  });

  it("a second payment for an invoice already paid (two tabs) is refunded automatically", async () => {
    const a = await accepted();
    const { url } = await startCheckout(db(), a.applicant, a.invoiceId);
    // A second checkout for the same invoice, made outside the app's reuse of the open one.
    const sdk = new Stripe(process.env.STRIPE_SECRET_KEY!, { host: "127.0.0.1", port: fake.port, protocol: "http", telemetry: false });
    const inv0 = await invoice(a.invoiceId);
    const other = await sdk.checkout.sessions.create({
      mode: "payment",
      line_items: [{ quantity: 1, price_data: { currency: "usd", unit_amount: inv0.totalCents, product_data: { name: "again" } } }],
      metadata: { invoiceId: String(a.invoiceId) },
      success_url: `${base}/x`,
    });
    await fake.pay(sessionOf(url));
    await fake.pay(other.id);
    await fake.idle();
    const inv = await invoice(a.invoiceId);
    expect(inv.status).toBe("paid");
    expect(inv.providerSessionId).toBe(sessionOf(url));
    expect(await audits("invoice.second_payment")).toHaveLength(1);
    expect(await audits("invoice.stray_payment_refunded")).toHaveLength(1);
    const refunded = fake.events.filter((e) => e.type === "charge.refunded").map((e) => JSON.parse(e.payload).data.object.payment_intent);
    expect(refunded).toEqual([String(fake.sessions.get(other.id)!.payment_intent)]);
  });
});

describe("failure paths", () => {
  it("declined payment: the invoice stays open and says why", async () => {
    const a = await accepted();
    const { url } = await startCheckout(db(), a.applicant, a.invoiceId);
    await fake.decline(sessionOf(url));
    expect((await invoice(a.invoiceId)).status).toBe("open");
    const [declined] = await audits("invoice.payment_declined");
    expect(declined!.summary).toBe(`Online payment for ${(await invoice(a.invoiceId)).number} was declined (Your card was declined); the invoice stays open.`);
    const d = await invoiceDetail(db(), a.applicant, a.invoiceId);
    expect(d.lastAttempt).toMatchObject({ type: "payment_intent.payment_failed", message: "Your card was declined." });
    expect(d.canPay).toBe(true);
    // The clock is still held.
    const [app] = await db().select().from(applications).where(eq(applications.id, a.id));
    expect(app!.dueAt).toBeNull();
    // Trying again reuses the same open checkout.
    expect((await startCheckout(db(), a.applicant, a.invoiceId)).url).toBe(url);
  });

  it("abandoned checkout: when the provider expires it, the invoice stays open and a new checkout can start", async () => {
    const a = await accepted();
    const { url } = await startCheckout(db(), a.applicant, a.invoiceId);
    const sdk = new Stripe(process.env.STRIPE_SECRET_KEY!, { host: "127.0.0.1", port: fake.port, protocol: "http", telemetry: false });
    await sdk.checkout.sessions.expire(sessionOf(url)); // what the provider does after 24 hours
    await fake.idle(); // its event follows the API response
    const inv = await invoice(a.invoiceId);
    expect(inv).toMatchObject({ status: "open", providerSessionId: null });
    expect(await audits("invoice.checkout_expired")).toHaveLength(1);
    const again = await startCheckout(db(), a.applicant, a.invoiceId);
    expect(sessionOf(again.url)).not.toBe(sessionOf(url));
    expect((await invoice(a.invoiceId)).providerSessionId).toBe(sessionOf(again.url));
  });

  it("only the applicant pays; other people get 404 or 403 and no checkout starts", async () => {
    const a = await accepted();
    const stranger = { ...(await makeUser("applicant")), firmId: null };
    await expect(startCheckout(db(), stranger, a.invoiceId)).rejects.toMatchObject({ code: "not_found" });
    await expect(startCheckout(db(), a.examiner, a.invoiceId)).rejects.toMatchObject({ code: "forbidden" });
    await expect(invoiceDetail(db(), stranger, a.invoiceId)).rejects.toMatchObject({ code: "not_found" });
    expect((await invoice(a.invoiceId)).providerSessionId).toBeNull();
    const { url } = await startCheckout(db(), a.applicant, a.invoiceId);
    await fake.pay(sessionOf(url));
    await expect(startCheckout(db(), a.applicant, a.invoiceId)).rejects.toMatchObject({ code: "conflict", message: "This invoice is already paid." });
  });

  it("an event for no invoice of ours is stored and answered 200, changing nothing else", async () => {
    const e = fake.signed("checkout.session.completed", { id: "cs_test_nobody", object: "checkout.session", payment_status: "paid", metadata: {} });
    const r = await postWebhook(e.payload, e.signature);
    expect(r).toEqual({ status: 200, body: { received: true, outcome: "unmatched", invoiceId: null } });
    const rows = await db().select().from(paymentEvents).where(and(eq(paymentEvents.providerEventId, e.id)));
    expect(rows).toHaveLength(1);
    expect(await db().select().from(invoices)).toHaveLength(0);
  });
});

describe("review waits for the fee (this department reviews after payment)", () => {
  const appRow = async (id: number) => (await db().select().from(applications).where(eq(applications.id, id)))[0]!;
  const cycleRow = async (id: number, n: number) => (await db().select().from(reviewCycles).where(and(eq(reviewCycles.applicationId, id), eq(reviewCycles.number, n))))[0]!;
  const payOnline = async (applicant: Awaited<ReturnType<typeof accepted>>["applicant"], invoiceId: number) => {
    const { url } = await startCheckout(db(), applicant, invoiceId);
    await fake.pay(sessionOf(url));
  };
  const comment = (a: Awaited<ReturnType<typeof accepted>>, body: string) =>
    addComment(db(), a.examiner, a.id, { discipline: "Structural", codeSection: "IBC 1604.3", codeEdition: "2021 IBC", body });

  it("the examiner drafts comments but issues, approves or begins nothing until the fee is paid", async () => {
    const a = await accepted();
    const inv = await invoice(a.invoiceId);
    const c = await comment(a, "FB-3: show the total-load deflection check against L/240.");
    const waits = `Plan review waits for the fee: invoice ${inv.number} ($1,021.94) is not paid yet, and this department reviews only after payment.`;
    const before = await counts();
    const version = (await appRow(a.id)).version;
    await expect(fireEvent(db(), a.examiner, a.id, "issue_corrections", version)).rejects.toMatchObject({ code: "guard_failed", message: waits });
    await expect(fireEvent(db(), a.examiner, a.id, "approve_with_conditions", version, { conditions: [{ text: "Deferred submittal: beam hangers.", carriesCommentId: c.id }] })).rejects.toMatchObject({ code: "guard_failed", message: waits });
    // Refused whole: no state, audit line or e-mail.
    expect(await counts()).toEqual(before);
    expect(await appRow(a.id)).toMatchObject({ state: "in_review", version });

    await payOnline(a.applicant, a.invoiceId);
    await fireEvent(db(), a.examiner, a.id, "issue_corrections", (await appRow(a.id)).version);
    expect((await appRow(a.id)).state).toBe("corrections_issued");
  });

  it("a cheque taken at the counter, recorded by the technician, pays the fee: receipt, clock started, review unlocked", async () => {
    const a = await accepted();
    const inv0 = await invoice(a.invoiceId);
    // Refused whole: the applicant, an empty reference, an unknown method.
    await expect(recordCounterPayment(db(), a.applicant, a.invoiceId, { method: "cheque", reference: "1042" })).rejects.toMatchObject({ code: "forbidden" });
    await expect(recordCounterPayment(db(), a.tech, a.invoiceId, { method: "cheque", reference: "  " })).rejects.toThrow("Enter the cheque number or the counter receipt number.");
    await expect(recordCounterPayment(db(), a.tech, a.invoiceId, { method: "bitcoin", reference: "1042" })).rejects.toThrow("Choose cheque, cash or card at the counter terminal.");
    expect(await invoice(a.invoiceId)).toMatchObject({ status: "open", version: inv0.version });

    expect(await recordCounterPayment(db(), a.tech, a.invoiceId, { method: "cheque", reference: " 1042 " })).toEqual({ status: "paid" });
    const inv = await invoice(a.invoiceId);
    expect(inv).toMatchObject({ status: "paid", providerPaymentId: null, counterPayment: { method: "cheque", reference: "1042", recordedById: a.tech.id, recordedBy: a.tech.name } });
    const [audit] = await audits("invoice.paid_at_counter");
    expect(audit!.summary).toBe(`${inv.number} paid by cheque no. 1042, at the department's counter: $1,021.94, recorded by ${a.tech.name}.`);
    const [receipt] = await mails("fees.receipt");
    expect(receipt!.textBody).toContain("by cheque no. 1042, at the department's counter");
    expect(receipt!.textBody).toContain("Payment reference: 1042");
    expect(receipt!.textBody).toContain("Plan review has started");
    const [cycle] = await db().select().from(reviewCycles).where(eq(reviewCycles.applicationId, a.id));
    expect(cycle!.dueAt).not.toBeNull();
    // Paid once: a second recording and an online checkout are refused.
    await expect(recordCounterPayment(db(), a.tech, a.invoiceId, { method: "cash", reference: "R-7" })).rejects.toMatchObject({ code: "conflict", message: "This invoice is already paid." });
    await expect(startCheckout(db(), a.applicant, a.invoiceId)).rejects.toMatchObject({ code: "conflict" });
    expect((await invoiceDetail(db(), a.tech, a.invoiceId)).invoice.counterPayment).toEqual({ method: "cheque", methodLabel: "cheque", recordedBy: a.tech.name });
    await fireEvent(db(), a.examiner, a.id, "approve", (await appRow(a.id)).version);
    expect((await appRow(a.id)).state).toBe("approved");
  });

  it("the supervisor's queue says which reviews wait for their fee, not just that they have no due date", async () => {
    const a = await accepted();
    const row = async (feeBeforeReview: boolean) => {
      const now = new Date();
      const page = await listQueuePage(db(), { states: ["in_review"], now, weekEndsAt: now, sort: "number", dir: "asc", limit: 50 });
      const r = page.rows.find((x) => x.id === a.id)!;
      return presentQueueRow(r, dayInZone(now), makeCalendar(), { feeBeforeReview });
    };
    expect(await row(true)).toMatchObject({ waitingForFee: true, clock: { kind: "no_due_date" } });
    // A department that reviews first holds nothing for a fee.
    expect((await row(false)).waitingForFee).toBe(false);
    await payOnline(a.applicant, a.invoiceId);
    expect(await row(true)).toMatchObject({ waitingForFee: false, clock: { kind: "on_track" } });
  });

  it("a resubmittal beyond the covered cycles issues its own fee, and its clock and review wait for it", async () => {
    const a = await accepted();
    const admin = { ...(await makeUser("admin")), firmId: null };
    const { version: _v, revision: _r, ...schedule } = DEMO_FEE_SCHEDULE;
    await saveFeeSchedule(db(), admin, { ...schedule, resubmittal: { includedCycles: 1, feeCents: 18_000 } });
    await payOnline(a.applicant, a.invoiceId);
    const c = await comment(a, "Provide the D+L check for FB-3.");
    await fireEvent(db(), a.examiner, a.id, "issue_corrections", (await appRow(a.id)).version);
    await respondToComment(db(), a.applicant, a.id, c.id, { body: "Added on calc page 7.", changeReference: "Calc p. 7" });
    await fireEvent(db(), a.applicant, a.id, "resubmit", (await appRow(a.id)).version);

    const fee = (await db().select().from(invoices).where(and(eq(invoices.applicationId, a.id), eq(invoices.purpose, "resubmittal"))))[0]!;
    expect(fee).toMatchObject({ cycle: 2, status: "open", totalCents: 18_000, scheduleVersion: "LF-FEES-r2" });
    expect(fee.lineItems[0]!.basis).toBe("Fixed fee of $180.00 for each review cycle after the first 1, which the plan-review fee covers; this is cycle 2.");
    const issued = (await mails("fees.invoice_issued")).find((m) => m.subject.includes(fee.number!))!;
    expect(issued.subject).toBe(`LFB-PY-${String(serial).padStart(5, "0")}: resubmittal fee $180.00 — invoice ${fee.number}`);
    expect(issued.textBody).toContain("The review of your resubmittal begins when this fee is paid");
    expect(await appRow(a.id)).toMatchObject({ state: "resubmitted", cycle: 2, dueAt: null });
    expect((await cycleRow(a.id, 2)).dueAt).toBeNull();
    await expect(fireEvent(db(), a.examiner, a.id, "begin_review", (await appRow(a.id)).version)).rejects.toMatchObject({
      code: "guard_failed",
      message: `Plan review waits for the fee: invoice ${fee.number} ($180.00) is not paid yet, and this department reviews only after payment.`,
    });

    await payOnline(a.applicant, fee.id);
    const cycle2 = await cycleRow(a.id, 2);
    expect(cycle2.dueAt).not.toBeNull();
    expect((await appRow(a.id)).dueAt).toEqual(cycle2.dueAt);
    const started = (await audits("review.clock_started")).map((e) => e.summary);
    expect(started).toHaveLength(2);
    expect(started[1]).toMatch(/^Resubmittal fee paid: the review clock for cycle 2 started, due /);
    const receipt = (await mails("fees.receipt")).find((m) => m.subject.includes(fee.number!))!;
    expect(receipt.textBody).toContain("The review of your resubmittal (cycle 2) has started");
    await fireEvent(db(), a.examiner, a.id, "begin_review", (await appRow(a.id)).version);
    expect((await appRow(a.id)).state).toBe("in_review");
  });
});
