import { afterAll, beforeAll, describe, expect, it } from "vitest";
import Stripe from "stripe";
import { parseProviderForm, startFakeProvider, type FakeProvider } from "@/lib/payments/fake-provider";

// The local fake must answer the provider's official SDK the way the SDK expects: these tests
// drive the fake only through the SDK (requests, responses, errors) and check its webhooks with
// the SDK's own constructEvent.

const KEY = "sk_test_unit_fake_0123456789";
const SECRET = "whsec_unit_fake_0123456789";
const received: { payload: string; signature: string }[] = [];
let fake: FakeProvider;
let stripe: Stripe;

beforeAll(async () => {
  // Any free port: a fixed or random one can collide with whatever else the machine runs.
  fake = await startFakeProvider({
    port: 0,
    secretKey: KEY,
    webhookSecret: SECRET,
    deliver: async (payload, signature) => {
      received.push({ payload, signature });
      return 200;
    },
  });
  stripe = new Stripe(KEY, { host: "127.0.0.1", port: fake.port, protocol: "http", maxNetworkRetries: 0, telemetry: false });
});
afterAll(() => fake.close());

const session = () =>
  stripe.checkout.sessions.create({
    mode: "payment",
    client_reference_id: "INV-26-00001",
    line_items: [
      { quantity: 1, price_data: { currency: "usd", unit_amount: 100_994, product_data: { name: "Plan-review fee" } } },
      { quantity: 1, price_data: { currency: "usd", unit_amount: 1_200, product_data: { name: "Records fee" } } },
    ],
    metadata: { invoiceId: "1" },
    payment_intent_data: { metadata: { invoiceId: "1" } },
    success_url: "http://127.0.0.1:1/ok?session_id={CHECKOUT_SESSION_ID}",
    cancel_url: "http://127.0.0.1:1/cancel",
  });

describe("the local fake of the payment provider", () => {
  it("parses the SDK's bracketed form encoding", () => {
    expect(parseProviderForm("line_items[0][price_data][unit_amount]=5&line_items[1][quantity]=2&metadata[invoiceId]=7&mode=payment")).toEqual({
      line_items: [{ price_data: { unit_amount: "5" } }, { quantity: "2" }],
      metadata: { invoiceId: "7" },
      mode: "payment",
    });
  });

  it("creates and returns a checkout session through the SDK", async () => {
    const s = await session();
    expect(s).toMatchObject({ object: "checkout.session", status: "open", payment_status: "unpaid", amount_total: 102_194, currency: "usd", metadata: { invoiceId: "1" } });
    expect(s.url).toBe(`${fake.url}/pay/${s.id}`);
    expect(s.success_url).toContain(`session_id=${s.id}`);
    expect((await stripe.checkout.sessions.retrieve(s.id)).id).toBe(s.id);
  });

  it("signs its webhooks so that the SDK's constructEvent accepts them, and only with the right secret", async () => {
    await fake.idle();
    received.length = 0;
    const s = await session();
    await fake.pay(s.id);
    expect(received.map((r) => JSON.parse(r.payload).type)).toEqual(["payment_intent.succeeded", "checkout.session.completed"]);
    const last = received.at(-1)!;
    const event = stripe.webhooks.constructEvent(last.payload, last.signature, SECRET);
    expect(event.type).toBe("checkout.session.completed");
    expect(event.data.object).toMatchObject({ id: s.id, status: "complete", payment_status: "paid", amount_total: 102_194 });
    expect(() => stripe.webhooks.constructEvent(last.payload, last.signature, "whsec_someone_else_000000")).toThrow(Stripe.errors.StripeSignatureVerificationError);
    expect(() => stripe.webhooks.constructEvent(last.payload.replace("102194", "1"), last.signature, SECRET)).toThrow(Stripe.errors.StripeSignatureVerificationError);
  });

  it("refunds a paid session once; a second refund is refused with the provider's error", async () => {
    const s = await session();
    await fake.pay(s.id);
    const paid = await stripe.checkout.sessions.retrieve(s.id);
    const pi = String(paid.payment_intent);
    const r = await stripe.refunds.create({ payment_intent: pi }, { idempotencyKey: `k-${pi}` });
    expect(r).toMatchObject({ object: "refund", amount: 102_194, status: "succeeded", payment_intent: pi });
    // The same idempotency key answers the same refund, not a new one.
    expect((await stripe.refunds.create({ payment_intent: pi }, { idempotencyKey: `k-${pi}` })).id).toBe(r.id);
    await expect(stripe.refunds.create({ payment_intent: pi })).rejects.toMatchObject({ type: "StripeInvalidRequestError", code: "charge_already_refunded" });
  });

  it("expires an open session and refuses to expire a paid one", async () => {
    const open = await session();
    expect((await stripe.checkout.sessions.expire(open.id)).status).toBe("expired");
    const paid = await session();
    await fake.pay(paid.id);
    await expect(stripe.checkout.sessions.expire(paid.id)).rejects.toMatchObject({ type: "StripeInvalidRequestError" });
  });

  it("refuses a wrong API key the way the provider does (401)", async () => {
    const other = new Stripe("sk_test_wrong_key_000000", { host: "127.0.0.1", port: Number(new URL(fake.url).port), protocol: "http", maxNetworkRetries: 0, telemetry: false });
    await expect(other.checkout.sessions.retrieve("cs_x")).rejects.toMatchObject({ type: "StripeAuthenticationError", statusCode: 401 });
  });

  it("holds events and releases them in reverse, for out-of-order tests", async () => {
    // An earlier test's event (a refund, an expiry) follows its API answer: let it land first.
    await fake.idle();
    received.length = 0;
    fake.setMode({ delivery: "hold" });
    const s = await session();
    await fake.decline(s.id);
    await fake.pay(s.id);
    expect(received).toHaveLength(0);
    await fake.release("reverse");
    fake.setMode({ delivery: "before_redirect" });
    expect(received.map((r) => JSON.parse(r.payload).type)).toEqual(["checkout.session.completed", "payment_intent.succeeded", "payment_intent.payment_failed"]);
  });
});
