import "server-only";
import { NextResponse, type NextRequest } from "next/server";
import { ZodError, type z } from "zod";
import { AppError, toErrorBody } from "@/lib/errors";
import { env } from "@/lib/env";
import { WorkflowError } from "@/lib/workflow/errors";

type Ctx<P> = { params: Promise<P> };

export function fieldErrors(e: ZodError): Record<string, string> {
  const out: Record<string, string> = {};
  for (const i of e.issues) {
    const k = i.path.join(".") || "_";
    out[k] ??= i.message;
  }
  return out;
}

/** Maps any thrown error to the one error shape; unknown errors are logged, never shown. */
export function errorResponse(e: unknown): NextResponse {
  if (e instanceof AppError) return NextResponse.json(toErrorBody(e), { status: e.status });
  if (e instanceof ZodError) {
    return NextResponse.json(
      { error: { code: "invalid_input", message: "Some fields need attention.", fields: fieldErrors(e) } },
      { status: 422 },
    );
  }
  if (e instanceof WorkflowError) {
    // "Not yours" looks like "not found".
    if (e.code === "forbidden" && e.reason === "not_owner") {
      return NextResponse.json({ error: { code: "not_found", message: "That application was not found." } }, { status: 404 });
    }
    const status = { forbidden: 403, invalid_transition: 409, guard_failed: 422, invalid_input: 422 }[e.code];
    return NextResponse.json({ error: { code: e.code, message: e.message } }, { status });
  }
  console.error("[api] unexpected error", e);
  return NextResponse.json({ error: { code: "internal", message: "Something went wrong on our side. Try again." } }, { status: 500 });
}

const UNSAFE = new Set(["POST", "PUT", "PATCH", "DELETE"]);

/**
 * Route handlers get no automatic CSRF check: a state-changing request must come from our own
 * origin (Origin header, or Sec-Fetch-Site: same-origin). Requests with neither are refused.
 */
export function assertSameOrigin(req: NextRequest): void {
  if (!UNSAFE.has(req.method)) return;
  const origin = req.headers.get("origin");
  const site = req.headers.get("sec-fetch-site");
  const ours = new URL(env().APP_URL).origin;
  const sameHost = origin && (origin === ours || origin === req.nextUrl.origin);
  if (sameHost || (!origin && site === "same-origin")) return;
  throw new AppError("forbidden", "Cross-site requests are not accepted.");
}

export function route<P = Record<string, string>>(fn: (req: NextRequest, params: P) => Promise<Response>) {
  return async (req: NextRequest, ctx: Ctx<P>): Promise<Response> => {
    try {
      assertSameOrigin(req);
      return await fn(req, await ctx.params);
    } catch (e) {
      return errorResponse(e);
    }
  };
}

export async function readJson<S extends z.ZodType>(req: NextRequest, schema: S): Promise<z.infer<S>> {
  let body: unknown;
  try {
    body = await req.json();
  } catch {
    throw new AppError("invalid_input", "The request body is not valid JSON.");
  }
  return schema.parse(body);
}

/** Path ids: anything but a positive integer is simply "not found". */
export function pathId(raw: string | undefined, what = "That record"): number {
  const n = Number(raw);
  if (!raw || !/^\d{1,15}$/.test(raw) || !Number.isSafeInteger(n) || n <= 0) throw new AppError("not_found", `${what} was not found.`);
  return n;
}
