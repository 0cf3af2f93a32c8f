import "server-only";
import { headers } from "next/headers";
import { db } from "@/db/client";
import { clientIp } from "@/lib/auth/request-ip";
import { env } from "@/lib/env";
import { recordRefusal } from "./refusal-audit";

export const FORGED_ACTION_MESSAGE = "This request was not sent from this site's own pages.";

/**
 * Server actions are public POST endpoints. Next refuses an Origin that does not match the
 * host, but lets a request with no Origin through; a state-changing action must come from our
 * own pages, so the first line of every action asks this. Returns the message to answer with
 * when the request is refused (and audited), null when it may go on.
 */
export async function refuseForgedAction(name: string): Promise<string | null> {
  const h = await headers();
  const origin = h.get("origin");
  const site = h.get("sec-fetch-site");
  const host = h.get("x-forwarded-host") ?? h.get("host");
  const ours = new URL(env().APP_URL).origin;
  let sameHost = false;
  if (origin) {
    try {
      sameHost = origin === ours || (host !== null && new URL(origin).host === host);
    } catch {
      sameHost = false;
    }
  }
  const internal = h.has("x-middleware-subrequest");
  if (!internal && (sameHost || (!origin && site === "same-origin"))) return null;
  await recordRefusal(db, {
    method: "POST",
    path: `action ${name}`,
    ip: clientIp(h),
    actor: null,
    reason: internal ? "internal_header" : "cross_site",
    status: 403,
  });
  return FORGED_ACTION_MESSAGE;
}
