import "server-only";
import type Stripe from "stripe";
import { type Db, type Tx, withTransaction } from "@/db/client";
import { findInvoiceIdByPayment, findInvoiceIdBySession, getInvoice, lockApplicationRow, lockInvoice, recordPaymentEventOnce } from "@/db/queries/invoices";
import { paymentsClient, webhookSecret } from "./client";
import { paymentIdOf } from "./provider";
import { applyPayment, applyRefundReport, recordDecline, recordExpiry, type AfterCommit } from "./settle";

// The provider's signed events. The signature is checked with the SDK's own constructEvent
// (HMAC-SHA256 over "timestamp.payload", five minutes' tolerance); the event id is the
// idempotency key, so a replayed or re-delivered event changes nothing.

export type WebhookOutcome = Awaited<ReturnType<typeof handlePaymentEvent>>["outcome"];

/** Throws the SDK's signature error when the payload was not signed with our webhook secret. */
export function verifyWebhook(payload: string, signature: string | null): Stripe.Event {
  if (!signature) throw new Error("No Stripe-Signature header.");
  return paymentsClient().webhooks.constructEvent(payload, signature, webhookSecret());
}

/** The whole webhook: verify, then handle. The route handler only maps this to a response. */
export async function receiveWebhook(database: Db, payload: string, signature: string | null): Promise<{ status: number; body: Record<string, unknown> }> {
  let event: Stripe.Event;
  try {
    event = verifyWebhook(payload, signature);
  } catch (e) {
    // Nothing is stored or changed for an unsigned or mis-signed request.
    return { status: 400, body: { error: { code: "invalid_signature", message: e instanceof Error ? e.message.split("\n")[0] : "Invalid signature." } } };
  }
  try {
    const r = await handlePaymentEvent(database, event);
    return { status: 200, body: { received: true, ...r } };
  } catch (e) {
    // A 5xx makes the provider deliver again later; the transaction left nothing behind.
    console.error("[payments] webhook handling failed", event.id, event.type, e);
    return { status: 500, body: { error: { code: "internal", message: "The event could not be processed; deliver it again." } } };
  }
}

interface Located {
  invoiceId: number | null;
}

/** Our invoice for an event: metadata we set on the session and payment, else the ids we stored. */
async function locateInvoice(tx: Tx, object: Record<string, unknown>): Promise<Located> {
  const meta = (object.metadata ?? {}) as Record<string, string | undefined>;
  const fromMeta = meta.invoiceId && /^\d{1,15}$/.test(meta.invoiceId) ? Number(meta.invoiceId) : null;
  if (fromMeta && (await getInvoice(tx, fromMeta))) return { invoiceId: fromMeta };
  if (object.object === "checkout.session" && typeof object.id === "string") {
    const id = await findInvoiceIdBySession(tx, object.id);
    if (id) return { invoiceId: id };
  }
  const paymentId = object.object === "payment_intent" ? (object.id as string) : paymentIdOf(object.payment_intent as string | null);
  if (paymentId) {
    const id = await findInvoiceIdByPayment(tx, paymentId);
    if (id) return { invoiceId: id };
  }
  return { invoiceId: null };
}

export async function handlePaymentEvent(database: Db, event: Stripe.Event, now = new Date()) {
  const after: AfterCommit[] = [];
  const result = await withTransaction(database, async (tx) => {
    const object = event.data.object as unknown as Record<string, unknown>;
    const { invoiceId } = await locateInvoice(tx, object);
    const fresh = await recordPaymentEventOnce(tx, { providerEventId: event.id, type: event.type, invoiceId, payload: event });
    if (fresh === "duplicate") return { outcome: "duplicate" as const, invoiceId };
    if (!invoiceId) return { outcome: "unmatched" as const, invoiceId };

    // Lock order everywhere: application, then invoice (the withdrawal takes them in that order too).
    const peek = await getInvoice(tx, invoiceId);
    const app = peek ? await lockApplicationRow(tx, peek.applicationId) : undefined;
    const inv = await lockInvoice(tx, invoiceId);
    if (!inv || !app) return { outcome: "unmatched" as const, invoiceId };

    switch (event.type) {
      case "checkout.session.completed":
      case "checkout.session.async_payment_succeeded": {
        const s = event.data.object;
        // Delayed methods complete the session before the money arrives; the async event follows.
        if (s.payment_status !== "paid") return { outcome: "awaiting_payment" as const, invoiceId };
        const paymentId = paymentIdOf(s.payment_intent) ?? s.id;
        const outcome = await applyPayment(tx, inv, app, { sessionId: s.id, paymentId, amountCents: s.amount_total, currency: s.currency, via: "webhook" }, now, after);
        return { outcome, invoiceId };
      }
      case "payment_intent.payment_failed": {
        const pi = event.data.object;
        return { outcome: await recordDecline(tx, inv, app, pi.last_payment_error?.message ?? null), invoiceId };
      }
      case "checkout.session.async_payment_failed":
        return { outcome: await recordDecline(tx, inv, app, "the bank did not confirm the payment"), invoiceId };
      case "checkout.session.expired":
        return { outcome: await recordExpiry(tx, inv, app, event.data.object.id), invoiceId };
      case "charge.refunded": {
        const c = event.data.object;
        const paymentId = paymentIdOf(c.payment_intent);
        if (!paymentId) return { outcome: "ignored" as const, invoiceId };
        const outcome = await applyRefundReport(tx, inv, app, { paymentId, amountCents: c.amount, refundedCents: c.amount_refunded, refundId: null }, now);
        return { outcome, invoiceId };
      }
      default:
        // Stored for the record (payment_intent.succeeded and the like); no effect of its own.
        return { outcome: "ignored" as const, invoiceId };
    }
  });
  for (const task of after) await task(database);
  return result;
}
