import "server-only";
import { NextResponse, type NextRequest } from "next/server";
import { ZodError, type z } from "zod";
import { db, isUnreachable } from "@/db/client";
import { clientIp } from "@/lib/auth/request-ip";
import { AppError, toErrorBody } from "@/lib/errors";
import { env } from "@/lib/env";
import { pathNamesExistingObjects } from "@/lib/security/object-exists";
import { recordRefusal, refusalTag, wasWritten, withRequestTarget, type RefusalReason } from "@/lib/security/refusal-audit";
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

/** A lost or refused database connection, possibly wrapped (drizzle puts the driver's error in `cause`). */
function databaseDown(e: unknown): boolean {
  for (let cur = e, depth = 0; cur && depth < 5; cur = (cur as { cause?: unknown }).cause, depth++) {
    if (isUnreachable(cur)) return true;
  }
  return false;
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
  if (databaseDown(e)) {
    console.error("[api] database unreachable:", e instanceof Error ? e.message : e);
    return NextResponse.json(
      { error: { code: "unavailable", message: "The database cannot be reached just now. Reload in a moment to see whether your change was saved before trying again." } },
      { status: 503, headers: { "Retry-After": "5" } },
    );
  }
  console.error("[api] unexpected error", e);
  return NextResponse.json({ error: { code: "internal", message: "Something went wrong on our side. Try again." } }, { status: 500 });
}

const UNSAFE = new Set(["POST", "PUT", "PATCH", "DELETE"]);

/**
 * Next's internal recursion marker (CVE-2025-29927 skipped middleware with it). No browser or
 * client of ours sends it, so a request that carries it is refused outright, whatever it asks.
 */
export const INTERNAL_HEADERS = ["x-middleware-subrequest"] as const;

class RefusedRequest extends AppError {
  constructor(
    readonly reason: RefusalReason,
    message: string,
  ) {
    super("forbidden", message);
  }
}

export function assertNoInternalHeaders(h: Headers): void {
  if (INTERNAL_HEADERS.some((n) => h.has(n))) throw new RefusedRequest("internal_header", "This request carries a header reserved for the server.");
}

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
  throw new RefusedRequest("cross_site", "Cross-site requests are not accepted.");
}

function reasonOf(e: unknown, status: number): RefusalReason {
  const tag = refusalTag(e);
  if (tag) return tag;
  if (e instanceof RefusedRequest) return e.reason;
  if (status === 401) return "signed_out";
  return status === 404 ? "not_visible" : "forbidden";
}

/**
 * Every refused authorization leaves an audit row: 401 and 403 always; a 404 when an
 * authorization check marked it, or when it went to a signed-in caller about objects that
 * exist (another applicant's id, or a check of one application asked for under another).
 */
async function auditRefusal(req: NextRequest, e: unknown, status: number): Promise<void> {
  if (wasWritten(e) || (status !== 401 && status !== 403 && status !== 404)) return;
  let actor = null;
  try {
    // Loaded here, not at the top: the error mapping above stays usable without the auth config.
    const { currentUser } = await import("@/lib/auth/session");
    actor = await currentUser();
  } catch (lookup) {
    console.error("[audit] could not read the caller of a refused request", lookup instanceof Error ? lookup.message : lookup);
  }
  if (status === 404 && !refusalTag(e)) {
    if (!actor) return;
    try {
      if (!(await pathNamesExistingObjects(db(), req.method, req.nextUrl.pathname))) return;
    } catch (lookup) {
      console.error("[audit] could not classify a 404", lookup instanceof Error ? lookup.message : lookup);
      return;
    }
  }
  await recordRefusal(db, {
    method: req.method,
    path: req.nextUrl.pathname,
    ip: clientIp(req.headers),
    actor: actor ? { id: actor.id, role: actor.role } : null,
    reason: reasonOf(e, status),
    status,
    message: e instanceof Error ? e.message : undefined,
  });
}

export function route<P = Record<string, string>>(fn: (req: NextRequest, params: P) => Promise<Response>) {
  return async (req: NextRequest, ctx: Ctx<P>): Promise<Response> =>
    withRequestTarget({ method: req.method, path: req.nextUrl.pathname, ip: clientIp(req.headers) }, async () => {
      try {
        assertNoInternalHeaders(req.headers);
        assertSameOrigin(req);
        return await fn(req, await ctx.params);
      } catch (e) {
        const res = errorResponse(e);
        await auditRefusal(req, e, res.status);
        return res;
      }
    });
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
