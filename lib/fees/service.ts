import "server-only";
import { z } from "zod";
import { type Db, type Tx, withTransaction } from "@/db/client";
import { getApplicationRow, toResource } from "@/db/queries/applications";
import { recordAudit } from "@/db/queries/audit";
import {
  getInvoice,
  getUserContact,
  insertInvoiceOnce,
  listInvoices,
  listInvoicesForApplication,
  listPaymentEventsForInvoice,
  lockApplicationRow,
  lockInvoice,
  lockLiveInvoicesForApplication,
  reviewWorkExists,
  updateInvoiceIfVersion,
  type InvoiceRow,
  type InvoiceStatus,
} from "@/db/queries/invoices";
import { enqueueMail } from "@/db/queries/outbox";
import { getSetting, putSetting } from "@/db/queries/settings";
import type { SessionUser } from "@/db/queries/users";
import type { Application } from "@/db/schema";
import { env } from "@/lib/env";
import { AppError, forbidden, notFound } from "@/lib/errors";
import { expireCheckoutSession, providerMessage, refundPayment } from "@/lib/payments/provider";
import { applyCounterPayment, COUNTER_METHODS, invoiceMailContext, markRefunded, type CounterMethod } from "@/lib/payments/settle";
import { checkAccess } from "@/lib/workflow";
import { bracketJumps, quoteResubmittalFee, quoteReviewFee, type FeeQuote } from "./compute";
import { FEE_MAIL_TEMPLATES, invoiceIssuedMail, voidMail } from "./mail";
import { formatBasisPoints, formatCents } from "./money";
import { FEE_SCHEDULE_KEY, parseFeeSchedule, versionFor, type FeeSchedule, type FeeScheduleInput } from "./schedule";

type Actor = Pick<SessionUser, "id" | "role">;
type AppRow = Application;

export const INVOICE_PURPOSES = { plan_review: "Plan-review fee", resubmittal: "Resubmittal review fee" } as const;
export type InvoicePurpose = keyof typeof INVOICE_PURPOSES;

// ---- the schedule -----------------------------------------------------------------------

/** The department's fee schedule; the invented demo schedule until an administrator saves one. */
export async function getFeeSchedule(database: Db | Tx): Promise<FeeSchedule> {
  return parseFeeSchedule(await getSetting(database, FEE_SCHEDULE_KEY));
}

/** A new revision of the schedule. Invoices already issued keep the amounts and version they were issued with. */
export async function saveFeeSchedule(database: Db, actor: Actor, input: FeeScheduleInput, ip?: string): Promise<FeeSchedule> {
  if (actor.role !== "admin") throw forbidden("Only an administrator changes the fee schedule.");
  return withTransaction(database, async (tx) => {
    const before = await getFeeSchedule(tx);
    const revision = before.revision + 1;
    const next: FeeSchedule = { ...input, revision, version: versionFor(revision) };
    await putSetting(tx, FEE_SCHEDULE_KEY, next, actor.id);
    const jumps = bracketJumps(next);
    await recordAudit(tx, {
      actor,
      action: "settings.fee_schedule",
      entityType: "settings",
      entityId: FEE_SCHEDULE_KEY,
      summary: `Fee schedule ${next.version} saved: ${next.brackets.length} valuation brackets, plan-review fee ${formatBasisPoints(next.planReviewBasisPoints)} of the permit fee, ${formatCents(next.resubmittal.feeCents)} per review cycle after ${next.resubmittal.includedCycles}.${jumps.length ? ` ${jumps.length} step(s) at bracket edges.` : ""}`,
      detail: { before, after: next },
      ip,
    });
    return next;
  });
}

// ---- invoices the workflow issues and closes ---------------------------------------------

async function issueInvoice(tx: Tx, app: AppRow, purpose: InvoicePurpose, cycle: number, quote: FeeQuote, now: Date, actor: Actor | null, ip?: string): Promise<number | null> {
  const { id, created } = await insertInvoiceOnce(
    tx,
    { applicationId: app.id, purpose, cycle, totalCents: quote.totalCents, currency: "usd", lineItems: quote.lineItems, scheduleVersion: quote.scheduleVersion },
    now,
  );
  if (!created) return null;
  const inv = (await getInvoice(tx, id))!;
  await recordAudit(tx, {
    actor,
    action: "invoice.issued",
    entityType: "invoice",
    entityId: id,
    applicationId: app.id,
    summary: `${inv.number} issued: ${INVOICE_PURPOSES[purpose].toLowerCase()} ${formatCents(quote.totalCents)} (fee schedule ${quote.scheduleVersion}).`,
    detail: { lineItems: quote.lineItems, cycle },
    ip,
  });
  const ctx = await invoiceMailContext(tx, inv, app);
  if (ctx) {
    const m = invoiceIssuedMail({ ...ctx, purpose, paymentRequiredBeforeReview: env().PAYMENT_REQUIRED_BEFORE_REVIEW });
    await enqueueMail(tx, [{ dedupeKey: `invoice:${id}:issued`, template: FEE_MAIL_TEMPLATES.issued, to: ctx.to, applicationId: app.id, ...m }]);
  }
  return id;
}

/**
 * Called by the workflow inside the `accept` transaction: the plan-review fee for the
 * application's valuation under the current schedule, as an open invoice with its arithmetic,
 * an audit line and the invoice e-mail to the applicant. Once per application.
 */
export async function createReviewInvoice(tx: Tx, row: AppRow, now: Date): Promise<number | null> {
  const schedule = await getFeeSchedule(tx);
  return issueInvoice(tx, row, "plan_review", 1, quoteReviewFee(schedule, row.valuationCents), now, null);
}

/** The fixed fee owed for reviewing `cycle` under the current schedule; null within the cycles the plan-review fee covers. */
export async function resubmittalFeeFor(tx: Tx, cycle: number): Promise<FeeQuote | null> {
  return quoteResubmittalFee(await getFeeSchedule(tx), cycle);
}

/**
 * Called by the workflow inside the `resubmit` transaction when the new cycle is beyond the
 * covered ones: the resubmittal fee as an open invoice, an audit line and the invoice e-mail.
 * Once per cycle (a staff member may have charged it already).
 */
export async function createResubmittalInvoiceAtResubmit(tx: Tx, row: AppRow, cycle: number, quote: FeeQuote, now: Date): Promise<number | null> {
  return issueInvoice(tx, { ...row, cycle }, "resubmittal", cycle, quote, now, null);
}

/** The fixed fee for reviewing the current cycle, when it is beyond the cycles the plan-review fee covers. */
export async function createResubmittalInvoice(database: Db, actor: Actor, applicationId: number, ip?: string): Promise<{ id: number }> {
  if (actor.role !== "technician" && actor.role !== "supervisor") throw forbidden("Permit technicians and supervisors issue fee invoices.");
  return withTransaction(database, async (tx) => {
    const app = await lockApplicationRow(tx, applicationId);
    if (!app || checkAccess(actor, "application.view", toResource(app)) === "not_found") throw notFound("That application");
    if (app.state !== "resubmitted" && app.state !== "in_review") throw new AppError("conflict", "A resubmittal fee is charged while a resubmitted cycle is with the department.");
    const quote = quoteResubmittalFee(await getFeeSchedule(tx), app.cycle);
    if (!quote) throw new AppError("unprocessable", `Review cycle ${app.cycle} is covered by the plan-review fee; there is no resubmittal fee to charge.`);
    const id = await issueInvoice(tx, app, "resubmittal", app.cycle, quote, new Date(), actor, ip);
    if (!id) throw new AppError("conflict", `Cycle ${app.cycle} already has its resubmittal fee invoice.`);
    return { id };
  });
}

/**
 * Called by the workflow inside the `withdraw` transaction. Before the examiner has begun on
 * the invoice's cycle, an open invoice is voided and a paid one refunded in full; once review
 * has begun, the fee stands (common practice, no source). A refund the provider refuses is
 * recorded and left for staff to retry; it never blocks the withdrawal.
 */
export async function voidOrRefundOnWithdraw(tx: Tx, row: AppRow): Promise<void> {
  const now = new Date();
  const applicant = { id: row.applicantId, role: "applicant" };
  for (const inv of await lockLiveInvoicesForApplication(tx, row.id)) {
    if (await reviewWorkExists(tx, row.id, inv.cycle)) {
      await recordAudit(tx, {
        actor: null,
        action: "invoice.kept_on_withdrawal",
        entityType: "invoice",
        entityId: inv.id,
        applicationId: row.id,
        summary: `${inv.number} stays ${inv.status}: plan review of cycle ${inv.cycle} had begun before the withdrawal.`,
      });
      continue;
    }
    if (inv.status === "open") {
      if (!(await updateInvoiceIfVersion(tx, inv.id, inv.version, { status: "void", closedAt: now }))) throw new AppError("conflict", "An invoice changed meanwhile. Reload and try again.");
      // Close the checkout too; should someone still pay it, the webhook refunds that payment.
      if (inv.providerSessionId) await expireCheckoutSession(inv.providerSessionId);
      await recordAudit(tx, {
        actor: applicant,
        action: "invoice.voided",
        entityType: "invoice",
        entityId: inv.id,
        applicationId: row.id,
        summary: `${inv.number} void (${formatCents(inv.totalCents)}): the application was withdrawn before the fee was paid.`,
      });
      const ctx = await invoiceMailContext(tx, inv, row);
      if (ctx) await enqueueMail(tx, [{ dedupeKey: `invoice:${inv.id}:void`, template: FEE_MAIL_TEMPLATES.voided, to: ctx.to, applicationId: row.id, ...voidMail(ctx) }]);
      continue;
    }
    await refundPaidInvoice(tx, inv, row, now, applicant, "The application was withdrawn before plan review began.");
  }
}

async function refundPaidInvoice(tx: Tx, inv: InvoiceRow, app: AppRow, now: Date, actor: { id: number; role: string }, why: string): Promise<boolean> {
  if (!inv.providerPaymentId) return false;
  try {
    const r = await refundPayment(inv.providerPaymentId, inv.id);
    return await markRefunded(tx, inv, app, r.id, now, actor, why);
  } catch (e) {
    if (e instanceof AppError) throw e;
    await recordAudit(tx, {
      actor: null,
      action: "invoice.refund_failed",
      entityType: "invoice",
      entityId: inv.id,
      applicationId: app.id,
      summary: `The refund of ${inv.number} could not be issued (${providerMessage(e)}); staff can retry it from the invoice.`,
    });
    console.error("[fees] refund failed", inv.id, e instanceof Error ? e.message : e);
    return false;
  }
}

/** The invoice and its application, locked in the order settlement uses (application, then invoice). */
async function lockInvoiceForStaff(tx: Tx, actor: Actor, invoiceId: number): Promise<{ app: AppRow; inv: InvoiceRow }> {
  const peek = await getInvoice(tx, invoiceId);
  if (!peek) throw notFound("That invoice");
  const app = await lockApplicationRow(tx, peek.applicationId);
  const inv = await lockInvoice(tx, invoiceId);
  if (!app || !inv || checkAccess(actor, "application.view", toResource(app)) === "not_found") throw notFound("That invoice");
  return { app, inv };
}

export const counterPaymentSchema = z.object({
  method: z.enum(Object.keys(COUNTER_METHODS) as [CounterMethod, ...CounterMethod[]], { error: "Choose cheque, cash or card at the counter terminal." }),
  reference: z
    .string({ error: "Enter the cheque number or the counter receipt number." })
    .trim()
    .min(1, "Enter the cheque number or the counter receipt number.")
    .max(60, "At most 60 characters.")
    .regex(/^[\p{L}\p{N} ./#-]+$/u, "Letters, digits, spaces and . / # - only."),
});

/**
 * A payment taken at the department's counter (cheque, cash, card terminal), recorded by a
 * permit technician or supervisor against an open invoice: paid as if online, with its receipt.
 */
export async function recordCounterPayment(database: Db, actor: Actor, invoiceId: number, raw: unknown, ip?: string): Promise<{ status: InvoiceStatus }> {
  if (actor.role !== "technician" && actor.role !== "supervisor") throw forbidden("Permit technicians and supervisors record payments taken at the counter.");
  const input = counterPaymentSchema.parse(raw);
  return withTransaction(database, async (tx) => {
    const { app, inv } = await lockInvoiceForStaff(tx, actor, invoiceId);
    const who = await getUserContact(tx, actor.id);
    await applyCounterPayment(tx, inv, app, { ...input, recordedBy: { id: actor.id, role: actor.role, name: who?.name ?? `#${actor.id}` }, ip }, new Date());
    return { status: "paid" as const };
  });
}

/** Staff retry of a refund the provider refused at withdrawal. */
export async function retryRefund(database: Db, actor: Actor, invoiceId: number): Promise<{ status: InvoiceStatus }> {
  if (actor.role !== "technician" && actor.role !== "supervisor") throw forbidden("Permit technicians and supervisors issue refunds.");
  return withTransaction(database, async (tx) => {
    const { app, inv } = await lockInvoiceForStaff(tx, actor, invoiceId);
    const reason = refundRefusal(inv, app, await reviewWorkExists(tx, app.id, inv.cycle));
    if (reason) throw new AppError("conflict", reason);
    const ok = await refundPaidInvoice(tx, inv, app, new Date(), actor, "Refund issued by staff after the withdrawal.");
    if (!ok) throw new AppError("unprocessable", "The payment provider did not issue the refund; it is noted on the application. Try again later.");
    return { status: "refunded" as const };
  });
}

function refundRefusal(inv: InvoiceRow, app: AppRow, reviewBegun: boolean): string | null {
  if (inv.status !== "paid") return `Only a paid invoice can be refunded; this one is ${inv.status}.`;
  if (app.state !== "withdrawn") return "Fees are refunded when an application is withdrawn before review begins.";
  if (reviewBegun) return "Plan review had begun before the withdrawal, so the fee stands.";
  return null;
}

// ---- what the screens and the API show ---------------------------------------------------

export function publicInvoice(inv: InvoiceRow) {
  return {
    id: inv.id,
    number: inv.number,
    purpose: inv.purpose,
    purposeLabel: INVOICE_PURPOSES[inv.purpose as InvoicePurpose] ?? inv.purpose,
    cycle: inv.cycle,
    status: inv.status,
    totalCents: inv.totalCents,
    currency: inv.currency,
    lineItems: inv.lineItems,
    scheduleVersion: inv.scheduleVersion,
    createdAt: inv.createdAt,
    paidAt: inv.paidAt,
    closedAt: inv.closedAt,
    paymentReference: inv.providerPaymentId ?? inv.counterPayment?.reference ?? null,
    counterPayment: inv.counterPayment ? { method: inv.counterPayment.method, methodLabel: COUNTER_METHODS[inv.counterPayment.method], recordedBy: inv.counterPayment.recordedBy } : null,
  };
}

export type PublicInvoice = ReturnType<typeof publicInvoice>;

async function viewable(database: Db | Tx, actor: Actor, applicationId: number): Promise<AppRow> {
  const app = await getApplicationRow(database, applicationId);
  if (!app || checkAccess(actor, "application.view", toResource(app)) === "not_found") throw notFound("That application");
  return app;
}

/** The invoices of one application, for its workspace. */
export async function applicationInvoices(database: Db, actor: Actor, applicationId: number) {
  const app = await viewable(database, actor, applicationId);
  const rows = await listInvoicesForApplication(database, app.id);
  const schedule = await getFeeSchedule(database);
  const resubmittal = app.cycle > 0 ? quoteResubmittalFee(schedule, app.cycle) : null;
  const staff = actor.role === "technician" || actor.role === "supervisor";
  const invoiced = rows.some((r) => r.purpose === "resubmittal" && r.cycle === app.cycle);
  return {
    invoices: rows.map(publicInvoice),
    paymentRequiredBeforeReview: env().PAYMENT_REQUIRED_BEFORE_REVIEW,
    canPay: actor.role === "applicant" && actor.id === app.applicantId,
    resubmittalFee:
      staff && resubmittal && !invoiced && (app.state === "resubmitted" || app.state === "in_review")
        ? { cycle: app.cycle, totalCents: resubmittal.totalCents, basis: resubmittal.lineItems[0]!.basis }
        : null,
  };
}

/** One invoice with what happened to its payment attempts, for the invoice page. */
export async function invoiceDetail(database: Db, actor: Actor, invoiceId: number) {
  const inv = await getInvoice(database, invoiceId);
  if (!inv) throw notFound("That invoice");
  const app = await viewable(database, actor, inv.applicationId).catch(() => {
    throw notFound("That invoice");
  });
  const events = await listPaymentEventsForInvoice(database, inv.id);
  const last = [...events].reverse().find((e) => ["payment_intent.payment_failed", "checkout.session.expired", "checkout.session.completed", "charge.refunded"].includes(e.type));
  const lastError = last?.type === "payment_intent.payment_failed" ? ((last.payload as { data?: { object?: { last_payment_error?: { message?: string } } } }).data?.object?.last_payment_error?.message ?? null) : null;
  const staff = actor.role === "technician" || actor.role === "supervisor";
  return {
    invoice: publicInvoice(inv),
    application: { id: app.id, number: app.number, siteAddress: app.siteAddress, state: app.state },
    lastAttempt: last && inv.status === "open" ? { type: last.type, at: last.receivedAt, message: lastError } : null,
    canPay: actor.role === "applicant" && actor.id === app.applicantId && inv.status === "open",
    canRefund: staff && refundRefusal(inv, app, await reviewWorkExists(database, app.id, inv.cycle)) === null,
    canRecordCounterPayment: staff && inv.status === "open",
    paymentRequiredBeforeReview: env().PAYMENT_REQUIRED_BEFORE_REVIEW,
  };
}

/** Applicants see their own invoices; permit technicians and supervisors see every invoice. */
export async function invoicesFor(database: Db, actor: Actor, status?: InvoiceStatus) {
  if (actor.role === "applicant") return listInvoices(database, { applicantId: actor.id, status });
  if (actor.role === "technician" || actor.role === "supervisor") return listInvoices(database, { status });
  throw forbidden("Invoices are for applicants, permit technicians and supervisors.");
}
