import { describe, expect, it } from "vitest";
import { parseEnv } from "@/lib/env";

const good = {
  DATABASE_URL: "mysql://u:p@127.0.0.1:3307/spanproof",
  AUTH_SECRET: "x".repeat(40),
  APP_URL: "http://127.0.0.1:3000",
};

describe("payment settings in the environment", () => {
  it("defaults to the local fake of the provider, and to review starting at acceptance", () => {
    const e = parseEnv(good);
    expect(e.PAYMENTS_API_URL).toBe("http://127.0.0.1:12111");
    expect(e.STRIPE_SECRET_KEY).toMatch(/^sk_test_/);
    expect(e.STRIPE_WEBHOOK_SECRET).toMatch(/^whsec_/);
    expect(e.PAYMENT_REQUIRED_BEFORE_REVIEW).toBe(false);
    expect(parseEnv({ ...good, PAYMENT_REQUIRED_BEFORE_REVIEW: "true" }).PAYMENT_REQUIRED_BEFORE_REVIEW).toBe(true);
  });

  it("names each bad value", () => {
    expect(() => parseEnv({ ...good, PAYMENT_REQUIRED_BEFORE_REVIEW: "yes" })).toThrow(/PAYMENT_REQUIRED_BEFORE_REVIEW: must be "true" or "false"/);
    expect(() => parseEnv({ ...good, STRIPE_SECRET_KEY: "pk_test_abcdefgh" })).toThrow(/STRIPE_SECRET_KEY: must look like sk_test_/);
    expect(() => parseEnv({ ...good, STRIPE_WEBHOOK_SECRET: "secret" })).toThrow(/STRIPE_WEBHOOK_SECRET: must look like whsec_/);
    expect(() => parseEnv({ ...good, PAYMENTS_API_URL: "not a url" })).toThrow(/PAYMENTS_API_URL: must be the payment provider's base URL/);
  });
});
