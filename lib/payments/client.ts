import "server-only";
import Stripe from "stripe";
import { env } from "@/lib/env";

// The payment provider's official SDK, pointed at PAYMENTS_API_URL (the local fake unless a
// deployment says otherwise). One client per process and key.
const g = globalThis as unknown as { __spanproofPayments?: { signature: string; client: Stripe } };

export function paymentsClient(): Stripe {
  const e = env();
  const signature = `${e.PAYMENTS_API_URL}|${e.STRIPE_SECRET_KEY}`;
  if (g.__spanproofPayments?.signature === signature) return g.__spanproofPayments.client;
  const url = new URL(e.PAYMENTS_API_URL);
  const protocol = url.protocol === "https:" ? "https" : "http";
  const client = new Stripe(e.STRIPE_SECRET_KEY, {
    host: url.hostname,
    port: url.port || (protocol === "https" ? 443 : 80),
    protocol,
    // One retry; every POST carries an idempotency key, so a retry never charges or refunds twice.
    maxNetworkRetries: 1,
    timeout: 10_000,
    telemetry: false,
  });
  g.__spanproofPayments = { signature, client };
  return client;
}

export function webhookSecret(): string {
  return env().STRIPE_WEBHOOK_SECRET;
}
