// Runs the local fake of the payment provider until stopped: its API and hosted checkout on
// PAYMENTS_PORT (loopback), signed webhooks to PAYMENTS_WEBHOOK_URL.
import { startFakeProvider } from "@/lib/payments/fake-provider";
import { runLocalFake } from "./run-local-fake";

const port = Number(process.env.PAYMENTS_PORT ?? 12111);
const webhookUrl = process.env.PAYMENTS_WEBHOOK_URL ?? `${process.env.APP_URL ?? "http://127.0.0.1:3000"}/api/payments/webhook`;
const secretKey = process.env.STRIPE_SECRET_KEY ?? "sk_test_spanproof_local_fake";
const webhookSecret = process.env.STRIPE_WEBHOOK_SECRET ?? "whsec_spanproof_local_fake";

await runLocalFake("payments", "PAYMENTS_PORT", async () => {
  const fake = await startFakeProvider({ port, secretKey, webhookSecret, webhookUrl });
  console.log(`[payments] local fake provider at ${fake.url} (hosted checkout at ${fake.url}/pay/…), webhooks to ${webhookUrl}`);
  return fake;
});
