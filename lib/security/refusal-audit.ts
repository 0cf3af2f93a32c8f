import "server-only";
import { AsyncLocalStorage } from "node:async_hooks";
import type { Db, Tx } from "@/db/client";
import { recordAudit } from "@/db/queries/audit";

// Refused authorizations go to the audit log (ASVS 16.3.2, 16.3.3): every 401, 403 and
// object-level "not yours" 404. Written from the central places only (lib/api/handler.ts,
// lib/auth/session.ts, the server-action guard), always outside the request's own transaction,
// which has rolled back by then; a failed write is logged and never changes the answer.

export const REFUSAL_ACTION = "access.refused";

export type RefusalReason =
  | "signed_out"
  | "session_ended"
  | "role"
  | "forbidden"
  | "not_visible"
  | "cross_site"
  | "internal_header";

export interface RequestTarget {
  method: string;
  /** the request path, or "action <id>" for a server action */
  path: string;
  ip?: string;
}

export interface Refusal extends RequestTarget {
  actor: { id: number; role: string } | null;
  reason: RefusalReason;
  status: number;
  /** a signed-in session whose account is no longer active */
  sessionUserId?: number;
  message?: string;
}

const context = new AsyncLocalStorage<RequestTarget>();

/** Route handlers run inside this so a refusal deeper down knows the method and path. */
export function withRequestTarget<T>(target: RequestTarget, fn: () => Promise<T>): Promise<T> {
  return context.run(target, fn);
}

export function currentRequestTarget(): RequestTarget | undefined {
  return context.getStore();
}

// Errors already written by the place that threw them, so the handler does not write them twice.
const written = new WeakSet<object>();
const tagged = new WeakMap<object, RefusalReason>();

export function markWritten(e: unknown): void {
  if (e && typeof e === "object") written.add(e);
}
export function wasWritten(e: unknown): boolean {
  return !!e && typeof e === "object" && written.has(e);
}

/** An authorization check marks its error, so the handler records it even when it answers 404. */
export function tagRefusal<E>(e: E, reason: RefusalReason): E {
  if (e && typeof e === "object") tagged.set(e, reason);
  return e;
}
export function refusalTag(e: unknown): RefusalReason | undefined {
  return e && typeof e === "object" ? tagged.get(e) : undefined;
}

const clip = (s: string, n: number) => (s.length > n ? s.slice(0, n) : s);

/** The audit row for one refusal: who, what, why; never the body, a cookie or a token. */
export function refusalAudit(r: Refusal) {
  const target = clip(`${r.method} ${r.path}`, 64);
  return {
    actor: r.actor,
    action: REFUSAL_ACTION,
    entityType: r.path.startsWith("action ") ? "server_action" : "route",
    entityId: target,
    summary: `Refused (${r.status}, ${r.reason}): ${r.method} ${clip(r.path, 300)}`,
    detail: {
      method: r.method,
      path: clip(r.path, 300),
      status: r.status,
      reason: r.reason,
      ...(r.sessionUserId !== undefined ? { sessionUserId: r.sessionUserId } : {}),
      ...(r.message ? { message: clip(r.message, 200) } : {}),
    },
    ip: r.ip ?? null,
  };
}

export type AuditWriter = (row: ReturnType<typeof refusalAudit>) => Promise<void>;

/** Never throws: the refusal stands whether or not its audit row could be written. */
export async function recordRefusal(database: Db | Tx | (() => Db | Tx), r: Refusal, write?: AuditWriter): Promise<boolean> {
  try {
    const row = refusalAudit(r);
    if (write) await write(row);
    else await recordAudit(typeof database === "function" ? database() : database, row);
    return true;
  } catch (e) {
    console.error("[audit] could not record a refused request", r.method, r.path, r.reason, e instanceof Error ? e.message : e);
    return false;
  }
}
