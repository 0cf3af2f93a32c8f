import { NextResponse } from "next/server";
import { route } from "@/lib/api/handler";
import { requireRole } from "@/lib/auth/session";
import { env } from "@/lib/env";
import { AppError } from "@/lib/errors";

// Demo only: the admin reads what the local mail receiver captured.
export const GET = route(async () => {
  await requireRole("admin");
  const e = env();
  if (!e.DEMO_MODE || !e.MAIL_CAPTURE_URL) throw new AppError("not_found", "The captured mailbox exists only in demo mode.");
  const res = await fetch(`${e.MAIL_CAPTURE_URL}/messages`, { cache: "no-store" }).catch(() => null);
  if (!res?.ok) throw new AppError("internal", "The local mail receiver is not answering.");
  const messages = (await res.json()) as unknown[];
  return NextResponse.json({ messages: messages.slice(-200).reverse() });
});
