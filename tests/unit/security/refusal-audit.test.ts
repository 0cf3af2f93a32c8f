import { describe, expect, it, vi } from "vitest";
import { REFUSAL_ACTION, markWritten, recordRefusal, refusalAudit, refusalTag, tagRefusal, wasWritten, withRequestTarget, currentRequestTarget } from "@/lib/security/refusal-audit";

const base = { method: "PATCH", path: "/api/applications/12/comments/7", actor: { id: 4, role: "applicant" }, reason: "not_visible" as const, status: 404, ip: "203.0.113.9" };

describe("the refusal audit row", () => {
  it("says who, what and why, and nothing from the request body", () => {
    const row = refusalAudit({ ...base, message: "That application was not found." });
    expect(row).toEqual({
      actor: { id: 4, role: "applicant" },
      action: REFUSAL_ACTION,
      entityType: "route",
      entityId: "PATCH /api/applications/12/comments/7",
      summary: "Refused (404, not_visible): PATCH /api/applications/12/comments/7",
      detail: { method: "PATCH", path: "/api/applications/12/comments/7", status: 404, reason: "not_visible", message: "That application was not found." },
      ip: "203.0.113.9",
    });
  });

  it("fits the entity column (64 characters) and marks server actions", () => {
    const long = refusalAudit({ ...base, path: `/api/${"x".repeat(200)}` });
    expect(long.entityId).toHaveLength(64);
    expect(refusalAudit({ ...base, method: "POST", path: "action saveFeeScheduleAction" }).entityType).toBe("server_action");
  });

  it("keeps a deactivated session's account id when the actor is no longer known", () => {
    expect(refusalAudit({ ...base, actor: null, reason: "session_ended", status: 401, sessionUserId: 31 }).detail).toMatchObject({ sessionUserId: 31, reason: "session_ended" });
  });
});

describe("recording", () => {
  it("never throws when the write fails, and says so in the log", async () => {
    const log = vi.spyOn(console, "error").mockImplementation(() => {});
    const ok = await recordRefusal(
      () => {
        throw new Error("no database here");
      },
      base,
      async () => {
        throw new Error("audit_events is read-only");
      },
    );
    expect(ok).toBe(false);
    expect(log).toHaveBeenCalledWith("[audit] could not record a refused request", "PATCH", "/api/applications/12/comments/7", "not_visible", "audit_events is read-only");
    log.mockRestore();
  });

  it("hands the row to the writer", async () => {
    const rows: unknown[] = [];
    expect(await recordRefusal(() => { throw new Error("unused"); }, base, async (r) => void rows.push(r))).toBe(true);
    expect(rows).toEqual([refusalAudit(base)]);
  });
});

describe("marks on errors", () => {
  it("tags an error with its reason and remembers one already written", () => {
    const e = new Error("x");
    expect(refusalTag(e)).toBeUndefined();
    expect(tagRefusal(e, "forbidden")).toBe(e);
    expect(refusalTag(e)).toBe("forbidden");
    expect(wasWritten(e)).toBe(false);
    markWritten(e);
    expect(wasWritten(e)).toBe(true);
    expect(wasWritten("not an object")).toBe(false);
  });

  it("carries the request target through awaits, and only inside", async () => {
    expect(currentRequestTarget()).toBeUndefined();
    const seen = await withRequestTarget({ method: "GET", path: "/api/me" }, async () => {
      await new Promise((r) => setTimeout(r, 1));
      return currentRequestTarget();
    });
    expect(seen).toEqual({ method: "GET", path: "/api/me" });
    expect(currentRequestTarget()).toBeUndefined();
  });
});
