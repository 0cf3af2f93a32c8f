import "server-only";
import type Stripe from "stripe";
import { paymentsClient } from "./client";

// The few provider calls the app makes besides checkout. Every POST carries an idempotency key
// derived from our own invoice id, so a retry (ours or the SDK's) refunds or expires once.

export interface ProviderRefund {
  id: string;
  status: string;
  amount: number;
}

/** Refunds a whole payment. Throws the SDK's error when the provider refuses or cannot be reached. */
export async function refundPayment(paymentIntentId: string, invoiceId: number): Promise<ProviderRefund> {
  const r = await paymentsClient().refunds.create(
    { payment_intent: paymentIntentId, reason: "requested_by_customer", metadata: { invoiceId: String(invoiceId) } },
    { idempotencyKey: `refund-invoice-${invoiceId}-${paymentIntentId}` },
  );
  return { id: r.id, status: r.status ?? "pending", amount: r.amount };
}

/** Closes an open checkout so nobody can pay a void invoice; false when it could not be closed. */
export async function expireCheckoutSession(sessionId: string): Promise<boolean> {
  try {
    const s = await paymentsClient().checkout.sessions.retrieve(sessionId);
    if (s.status !== "open") return true;
    await paymentsClient().checkout.sessions.expire(sessionId, {}, { idempotencyKey: `expire-${sessionId}` });
    return true;
  } catch (e) {
    console.error("[payments] could not expire checkout session", sessionId, e instanceof Error ? e.message : e);
    return false;
  }
}

export function paymentIdOf(ref: string | Stripe.PaymentIntent | null | undefined): string | null {
  if (!ref) return null;
  return typeof ref === "string" ? ref : ref.id;
}

/** A message safe to show: the provider's own wording for a refused card, a generic one otherwise. */
export function providerMessage(e: unknown): string {
  const err = e as { type?: string; message?: string };
  if (err?.type === "StripeConnectionError") return "The payment provider could not be reached.";
  if (typeof err?.message === "string" && err.message.length < 200) return err.message;
  return "The payment provider refused the request.";
}
