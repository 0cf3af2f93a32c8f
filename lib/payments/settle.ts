import "server-only";
import type { Db, Tx } from "@/db/client";
import { recordAudit } from "@/db/queries/audit";
import {
  findEventAboutPayment,
  getReviewCycle,
  getUserContact,
  linkPaymentEvent,
  startCycleClock,
  updateInvoiceIfVersion,
  type InvoiceRow,
} from "@/db/queries/invoices";
import { enqueueMail } from "@/db/queries/outbox";
import type { Application } from "@/db/schema";
import { env } from "@/lib/env";
import { AppError } from "@/lib/errors";
import { FEE_MAIL_TEMPLATES, receiptMail, refundMail, type InvoiceMailContext } from "@/lib/fees/mail";
import { formatCents } from "@/lib/fees/money";
import { dayInZone, formatDayLong } from "@/lib/review-clock";
import { dueDateFor } from "@/lib/review-clock/server";
import { refundPayment, providerMessage } from "./provider";

// What a confirmed payment, a refusal, an expiry or a refund does to an invoice. Each function
// runs inside the caller's transaction with the application and the invoice rows locked (in
// that order), changes an invoice only forward (open → paid → refunded; open → void) and says
// what it did. Work that must wait for the commit (a call to the provider) goes to `after`.

export type AfterCommit = (database: Db) => Promise<void>;

export type PaymentOutcome =
  | "paid"
  | "already_paid"
  | "paid_then_refunded"
  | "second_payment_refunded"
  | "closed_invoice_payment_refunded"
  | "amount_mismatch";

export interface PaymentFacts {
  sessionId: string | null;
  paymentId: string;
  amountCents: number | null;
  currency: string | null;
  /** how we learned of it: the provider's signed event, or asking the provider on the applicant's return */
  via: "webhook" | "return";
}

type AppRow = Application;

const payer = (app: AppRow) => ({ id: app.applicantId, role: "applicant" });

export function invoiceLink(invoiceId: number): string {
  return `${env().APP_URL}/invoices/${invoiceId}`;
}

export async function invoiceMailContext(tx: Tx, inv: InvoiceRow, app: AppRow): Promise<(InvoiceMailContext & { to: { address: string; name: string } }) | null> {
  const u = await getUserContact(tx, app.applicantId);
  if (!u || u.status !== "active") return null;
  return {
    to: { address: u.email, name: u.name },
    recipientName: u.name,
    applicationNumber: app.number ?? `#${app.id}`,
    siteAddress: app.siteAddress,
    invoiceNumber: inv.number ?? `#${inv.id}`,
    lines: inv.lineItems,
    totalCents: inv.totalCents,
    link: invoiceLink(inv.id),
  };
}

/** A confirmed payment for this invoice. Idempotent: the same payment twice changes nothing. */
export async function applyPayment(tx: Tx, inv: InvoiceRow, app: AppRow, pay: PaymentFacts, now: Date, after: AfterCommit[]): Promise<PaymentOutcome> {
  if (inv.status === "paid" && inv.providerPaymentId === pay.paymentId) return "already_paid";
  if (inv.status === "refunded" && inv.providerPaymentId === pay.paymentId) return "already_paid";

  if (inv.status !== "open") {
    // Paid twice (two tabs), or paid after the invoice was voided: give that money back.
    const second = inv.status === "paid";
    await recordAudit(tx, {
      actor: payer(app),
      action: second ? "invoice.second_payment" : "invoice.payment_after_close",
      entityType: "invoice",
      entityId: inv.id,
      applicationId: app.id,
      summary: second
        ? `A second payment of ${formatCents(pay.amountCents ?? inv.totalCents)} arrived for ${inv.number}, which was already paid; it is refunded automatically.`
        : `A payment of ${formatCents(pay.amountCents ?? inv.totalCents)} arrived for ${inv.number}, which is ${inv.status}; it is refunded automatically.`,
      detail: { paymentId: pay.paymentId, sessionId: pay.sessionId, via: pay.via },
    });
    after.push(refundStrayPayment(inv, app, pay.paymentId));
    return second ? "second_payment_refunded" : "closed_invoice_payment_refunded";
  }

  if ((pay.amountCents !== null && pay.amountCents !== inv.totalCents) || (pay.currency !== null && pay.currency !== inv.currency)) {
    // Never expected (the amount comes from our own session); recorded and left for a person.
    await recordAudit(tx, {
      actor: null,
      action: "invoice.amount_mismatch",
      entityType: "invoice",
      entityId: inv.id,
      applicationId: app.id,
      summary: `A payment of ${pay.amountCents ?? "?"} ${pay.currency ?? ""} does not match ${inv.number} (${formatCents(inv.totalCents)}); the invoice stays open for staff to check.`,
      detail: { ...pay },
    });
    return "amount_mismatch";
  }

  // A refund of this very payment delivered before the payment event (out of order).
  const earlierRefund = await findEventAboutPayment(tx, "charge.refunded", pay.paymentId);
  const ok = await updateInvoiceIfVersion(tx, inv.id, inv.version, {
    status: earlierRefund ? "refunded" : "paid",
    paidAt: now,
    closedAt: earlierRefund ? now : null,
    providerPaymentId: pay.paymentId,
    providerSessionId: pay.sessionId ?? inv.providerSessionId,
  });
  if (!ok) throw new AppError("conflict", "The invoice changed while the payment was being recorded.");
  await recordAudit(tx, {
    actor: payer(app),
    action: "invoice.paid",
    entityType: "invoice",
    entityId: inv.id,
    applicationId: app.id,
    summary: `${inv.number} paid online: ${formatCents(inv.totalCents)} (payment ${pay.paymentId}).`,
    detail: { paymentId: pay.paymentId, sessionId: pay.sessionId, via: pay.via },
  });
  if (earlierRefund) {
    await linkPaymentEvent(tx, earlierRefund.id, inv.id);
    await recordAudit(tx, {
      actor: null,
      action: "invoice.refunded",
      entityType: "invoice",
      entityId: inv.id,
      applicationId: app.id,
      summary: `${inv.number} refunded: the provider reported the refund of payment ${pay.paymentId} before the payment itself.`,
      detail: { paymentId: pay.paymentId, eventId: earlierRefund.providerEventId },
    });
    return "paid_then_refunded";
  }

  await afterPaid(tx, inv, app, now, { paymentReference: pay.paymentId });
  return "paid";
}

/** What any payment of an open invoice owes, however it was taken: the held clock started, the receipt sent. */
async function afterPaid(tx: Tx, inv: InvoiceRow, app: AppRow, now: Date, how: { paymentReference: string; paidBy?: string }): Promise<void> {
  const reviewDueAt = await startHeldClock(tx, inv, app, now);
  const ctx = await invoiceMailContext(tx, inv, app);
  if (ctx) {
    const m = receiptMail({ ...ctx, paidAt: now, reviewDueAt, cycle: inv.cycle, ...how });
    await enqueueMail(tx, [{ dedupeKey: `invoice:${inv.id}:receipt`, template: FEE_MAIL_TEMPLATES.receipt, to: ctx.to, applicationId: app.id, ...m }]);
  }
}

export const COUNTER_METHODS = { cheque: "cheque", cash: "cash", card_terminal: "card at the counter terminal" } as const;
export type CounterMethod = keyof typeof COUNTER_METHODS;

/** "by cheque no. 1042", "in cash, receipt R-2291": how a counter payment reads on the receipt. */
export function counterPaidBy(method: CounterMethod, reference: string): string {
  if (method === "cheque") return `by cheque no. ${reference}, at the department's counter`;
  if (method === "cash") return `in cash at the department's counter, counter receipt ${reference}`;
  return `by card at the department's counter terminal, slip ${reference}`;
}

/**
 * A payment taken at the counter and recorded by staff: the invoice is paid as by an online
 * payment (audit line, receipt, the held review clock started). Only an open invoice; a checkout
 * left open meanwhile and paid later is refunded as a second payment (applyPayment).
 */
export async function applyCounterPayment(
  tx: Tx,
  inv: InvoiceRow,
  app: AppRow,
  c: { method: CounterMethod; reference: string; recordedBy: { id: number; role: string; name: string }; ip?: string },
  now: Date,
): Promise<void> {
  if (inv.status !== "open") throw new AppError("conflict", inv.status === "paid" ? "This invoice is already paid." : `This invoice is ${inv.status}; there is nothing to pay.`);
  const ok = await updateInvoiceIfVersion(tx, inv.id, inv.version, {
    status: "paid",
    paidAt: now,
    counterPayment: { method: c.method, reference: c.reference, recordedById: c.recordedBy.id, recordedBy: c.recordedBy.name },
  });
  if (!ok) throw new AppError("conflict", "The invoice changed while the payment was being recorded.");
  const paidBy = counterPaidBy(c.method, c.reference);
  await recordAudit(tx, {
    actor: { id: c.recordedBy.id, role: c.recordedBy.role },
    action: "invoice.paid_at_counter",
    entityType: "invoice",
    entityId: inv.id,
    applicationId: app.id,
    summary: `${inv.number} paid ${paidBy}: ${formatCents(inv.totalCents)}, recorded by ${c.recordedBy.name}.`,
    detail: { method: c.method, reference: c.reference },
    ip: c.ip,
  });
  await afterPaid(tx, inv, app, now, { paymentReference: c.reference, paidBy });
}

/**
 * Where the department requires payment before review, acceptance leaves cycle 1 (and a charged
 * resubmittal its cycle) without a due date; the payment starts it: received now, due by the
 * target counted from today.
 */
async function startHeldClock(tx: Tx, inv: InvoiceRow, app: AppRow, now: Date): Promise<Date | null> {
  if (app.cycle !== inv.cycle || (app.state !== "in_review" && app.state !== "resubmitted")) return null;
  const cycle = await getReviewCycle(tx, app.id, inv.cycle);
  if (!cycle || cycle.dueAt || cycle.decidedAt) return null;
  const due = await dueDateFor(tx, now, inv.cycle);
  if (!(await startCycleClock(tx, app.id, inv.cycle, now, due))) return null;
  await recordAudit(tx, {
    actor: null,
    action: "review.clock_started",
    entityType: "application",
    entityId: app.id,
    applicationId: app.id,
    summary: `${inv.purpose === "resubmittal" ? "Resubmittal fee" : "Plan-review fee"} paid: the review clock for cycle ${inv.cycle} started, due ${formatDayLong(dayInZone(due))}.`,
    detail: { invoiceId: inv.id, receivedAt: now.toISOString(), dueAt: due.toISOString() },
  });
  return due;
}

/** A refused card or a failed attempt. The invoice stays open; nothing else changes. */
export async function recordDecline(tx: Tx, inv: InvoiceRow, app: AppRow, message: string | null): Promise<"declined" | "stale_decline"> {
  // An attempt that failed before a later one succeeded, delivered late: history only.
  if (inv.status !== "open") return "stale_decline";
  await recordAudit(tx, {
    actor: payer(app),
    action: "invoice.payment_declined",
    entityType: "invoice",
    entityId: inv.id,
    applicationId: app.id,
    summary: `Online payment for ${inv.number} was declined${message ? ` (${message.replace(/\.$/, "")})` : ""}; the invoice stays open.`,
  });
  return "declined";
}

/** A checkout left unpaid until the provider closed it. The invoice stays open and can be paid again. */
export async function recordExpiry(tx: Tx, inv: InvoiceRow, app: AppRow, sessionId: string): Promise<"expired" | "stale_expiry"> {
  if (inv.status !== "open" || inv.providerSessionId !== sessionId) return "stale_expiry";
  await updateInvoiceIfVersion(tx, inv.id, inv.version, { providerSessionId: null });
  await recordAudit(tx, {
    actor: null,
    action: "invoice.checkout_expired",
    entityType: "invoice",
    entityId: inv.id,
    applicationId: app.id,
    summary: `The online checkout for ${inv.number} expired without payment; the invoice stays open.`,
    detail: { sessionId },
  });
  return "expired";
}

/** The provider reports a refund (ours, or one made at the provider). */
export async function applyRefundReport(
  tx: Tx,
  inv: InvoiceRow,
  app: AppRow,
  charge: { paymentId: string; amountCents: number; refundedCents: number; refundId: string | null },
  now: Date,
): Promise<"refunded" | "already_refunded" | "partial_refund" | "refund_before_payment" | "other_payment"> {
  if (inv.status === "refunded") return "already_refunded";
  if (inv.status === "open" || !inv.providerPaymentId) return "refund_before_payment";
  if (inv.providerPaymentId !== charge.paymentId) return "other_payment";
  if (charge.refundedCents < charge.amountCents) {
    await recordAudit(tx, {
      actor: null,
      action: "invoice.partial_refund",
      entityType: "invoice",
      entityId: inv.id,
      applicationId: app.id,
      summary: `${formatCents(charge.refundedCents)} of ${formatCents(charge.amountCents)} refunded on ${inv.number} at the provider; the invoice stays paid.`,
    });
    return "partial_refund";
  }
  await markRefunded(tx, inv, app, charge.refundId ?? charge.paymentId, now, null, "The provider reported the refund.");
  return "refunded";
}

/** Paid → refunded, with the audit line and the applicant's notice. */
export async function markRefunded(
  tx: Tx,
  inv: InvoiceRow,
  app: AppRow,
  refundId: string,
  now: Date,
  actor: { id: number; role: string } | null,
  why: string,
): Promise<boolean> {
  if (inv.status !== "paid") return false;
  const ok = await updateInvoiceIfVersion(tx, inv.id, inv.version, { status: "refunded", closedAt: now });
  if (!ok) throw new AppError("conflict", "The invoice changed while the refund was being recorded.");
  await recordAudit(tx, {
    actor,
    action: "invoice.refunded",
    entityType: "invoice",
    entityId: inv.id,
    applicationId: app.id,
    summary: `${inv.number} refunded in full: ${formatCents(inv.totalCents)} (refund ${refundId}). ${why}`,
    detail: { refundId, paymentId: inv.providerPaymentId },
  });
  const ctx = await invoiceMailContext(tx, inv, app);
  if (ctx) {
    const m = refundMail({ ...ctx, refundReference: refundId });
    await enqueueMail(tx, [{ dedupeKey: `invoice:${inv.id}:refund`, template: FEE_MAIL_TEMPLATES.refunded, to: ctx.to, applicationId: app.id, ...m }]);
  }
  return true;
}

function refundStrayPayment(inv: InvoiceRow, app: AppRow, paymentId: string): AfterCommit {
  return async (database) => {
    let summary: string;
    let action: string;
    try {
      const r = await refundPayment(paymentId, inv.id);
      action = "invoice.stray_payment_refunded";
      summary = `Payment ${paymentId} on ${inv.number} refunded (refund ${r.id}).`;
    } catch (e) {
      action = "invoice.refund_failed";
      summary = `Payment ${paymentId} on ${inv.number} could not be refunded automatically: ${providerMessage(e)} Refund it at the provider.`;
      console.error("[payments] refund of a stray payment failed", paymentId, e instanceof Error ? e.message : e);
    }
    await recordAudit(database, { actor: null, action, entityType: "invoice", entityId: inv.id, applicationId: app.id, summary, detail: { paymentId } });
  };
}
