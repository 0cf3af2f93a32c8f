import { describe, expect, it } from "vitest";
import { ZodError } from "zod";
import { errorResponse } from "@/lib/api/handler";
import { AppError } from "@/lib/errors";

// What the driver throws when the server is down or restarting (mysql2 error codes).
const refused = Object.assign(new Error("connect ECONNREFUSED 127.0.0.1:3307"), { code: "ECONNREFUSED", errno: -111 });
const lost = Object.assign(new Error("Connection lost: The server closed the connection."), { code: "PROTOCOL_CONNECTION_LOST" });
const wrapped = (cause: Error) => Object.assign(new Error("Failed query: select 1"), { cause });

async function body(r: Response) {
  return JSON.stringify(await r.json());
}

describe("errorResponse", () => {
  it("answers 503 with Retry-After when the database cannot be reached, wrapped or not", async () => {
    for (const e of [refused, lost, wrapped(refused), wrapped(wrapped(lost))]) {
      const r = errorResponse(e);
      expect(r.status).toBe(503);
      expect(r.headers.get("retry-after")).toBe("5");
      const b = await body(r);
      expect(b).toContain('"code":"unavailable"');
      // Never the driver's text or the SQL it was running.
      expect(b).not.toMatch(/ECONNREFUSED|select 1|127\.0\.0\.1/);
    }
  });

  it("answers 500 with a generic message for anything unexpected, without its text", async () => {
    const r = errorResponse(new Error("Failed query: select * from users where id = ?\nat Object.<anonymous> (/app/lib/x.ts:1:1)"));
    expect(r.status).toBe(500);
    expect(await body(r)).not.toMatch(/select|users|\.ts:|at Object/);
  });

  it("keeps the app's own errors and field messages", async () => {
    expect(errorResponse(new AppError("forbidden", "You cannot do that on this application now.")).status).toBe(403);
    const z = new ZodError([{ code: "custom", path: ["span"], message: "Enter the span with its unit, e.g. 16 ft", input: "" }]);
    const r = errorResponse(z);
    expect(r.status).toBe(422);
    expect(await body(r)).toContain("Enter the span with its unit");
  });
});
