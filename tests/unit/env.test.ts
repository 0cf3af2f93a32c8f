import { describe, expect, it } from "vitest";
import { parseEnv } from "@/lib/env";

const good = {
  DATABASE_URL: "mysql://u:p@127.0.0.1:3307/spanproof",
  AUTH_SECRET: "x".repeat(40),
  APP_URL: "http://127.0.0.1:3000",
};

describe("environment", () => {
  it("accepts a complete environment and fills defaults", () => {
    const e = parseEnv(good);
    expect(e.SMTP_PORT).toBe(2525);
    expect(e.DEMO_MODE).toBe(false);
  });
  it("names each missing or bad variable", () => {
    expect(() => parseEnv({ ...good, DATABASE_URL: undefined })).toThrow(/DATABASE_URL: is required/);
    expect(() => parseEnv({ ...good, AUTH_SECRET: "short" })).toThrow(/AUTH_SECRET: must be at least 32 characters/);
    expect(() => parseEnv({ ...good, SMTP_PORT: "seventy" })).toThrow(/SMTP_PORT/);
    expect(() => parseEnv({ ...good, DEMO_MODE: "yes" })).toThrow(/DEMO_MODE: must be "true" or "false"/);
    expect(() => parseEnv({ ...good, DATABASE_URL: "postgres://x" })).toThrow(/DATABASE_URL: must look like mysql:/);
  });
});
