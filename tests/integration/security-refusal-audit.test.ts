// Refused requests leave an audit row written outside the request's transaction: the refusal
// survives the rollback, and the handler's answer is the same whether or not the row is written.
import { eq } from "drizzle-orm";
import { NextRequest } from "next/server";
import { beforeEach, describe, expect, it, vi } from "vitest";
import { db } from "@/db/client";
import { auditEvents } from "@/db/schema";
import { route } from "@/lib/api/handler";
import { AppError, forbidden, notFound } from "@/lib/errors";
import { REFUSAL_ACTION, recordRefusal, tagRefusal } from "@/lib/security/refusal-audit";
import { resetDb } from "./db-helpers";

// No Auth.js outside Next: every caller here is signed out.
vi.mock("@/lib/auth/session", () => ({ currentUser: async () => null }));

const origin = () => new URL(process.env.APP_URL!).origin;
const refusals = () => db().select().from(auditEvents).where(eq(auditEvents.action, REFUSAL_ACTION));
const request = (method: string, path: string, headers: Record<string, string> = {}) => new NextRequest(`${origin()}${path}`, { method, headers });
const ctx = { params: Promise.resolve({}) };

beforeEach(async () => {
  await resetDb();
});

describe("refusal audit through route()", () => {
  it("records a refusal thrown inside a transaction that rolled back", async () => {
    const handler = route(async () =>
      db().transaction(async (tx) => {
        await tx.insert(auditEvents).values({ action: "should.roll.back", entityType: "x", entityId: "1", summary: "rolled back" });
        throw tagRefusal(notFound("That application"), "not_visible");
      }),
    );
    const res = await handler(request("POST", "/api/applications/5/comments", { origin: origin() }), ctx);
    expect(res.status).toBe(404);
    const rows = await refusals();
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ entityType: "route", entityId: "POST /api/applications/5/comments", detail: expect.objectContaining({ reason: "not_visible", status: 404 }) });
    expect(await db().select().from(auditEvents).where(eq(auditEvents.action, "should.roll.back"))).toHaveLength(0);
  });

  it("records every 403 once, and a plain 404 not at all", async () => {
    const refused = route(async () => {
      throw forbidden();
    });
    const missing = route(async () => {
      throw notFound("That invoice");
    });
    expect((await refused(request("GET", "/api/queue"), ctx)).status).toBe(403);
    expect((await missing(request("GET", "/api/invoices/77"), ctx)).status).toBe(404);
    const rows = await refusals();
    expect(rows.map((r) => [r.entityId, (r.detail as { reason: string }).reason])).toEqual([["GET /api/queue", "forbidden"]]);
  });

  it("refuses a forged or cross-site request before the handler runs, and records why", async () => {
    const ran = vi.fn(async () => new Response("ran"));
    const handler = route(ran);
    expect((await handler(request("POST", "/api/users", { origin: origin(), "x-middleware-subrequest": "middleware" }), ctx)).status).toBe(403);
    expect((await handler(request("POST", "/api/users", { origin: "https://elsewhere.example" }), ctx)).status).toBe(403);
    expect((await handler(request("POST", "/api/users"), ctx)).status).toBe(403);
    expect((await handler(request("POST", "/api/users", { "sec-fetch-site": "same-origin" }), ctx)).status).toBe(200);
    expect(ran).toHaveBeenCalledTimes(1);
    expect((await refusals()).map((r) => (r.detail as { reason: string }).reason)).toEqual(["internal_header", "cross_site", "cross_site"]);
  });

  it("answers the same when the audit row cannot be written", async () => {
    const log = vi.spyOn(console, "error").mockImplementation(() => {});
    const ok = await recordRefusal(
      () => {
        throw new AppError("internal", "pool closed");
      },
      { method: "GET", path: "/api/me", actor: null, reason: "signed_out", status: 401 },
    );
    expect(ok).toBe(false);
    expect(log).toHaveBeenCalled();
    log.mockRestore();
    expect(await refusals()).toHaveLength(0);
  });
});
