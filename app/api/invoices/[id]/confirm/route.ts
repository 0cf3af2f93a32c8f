import { NextResponse } from "next/server";
import { z } from "zod";
import { db } from "@/db/client";
import { pathId, readJson, route } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { confirmCheckout } from "@/lib/payments/checkout";

const body = z.object({ sessionId: z.string().regex(/^cs_[\w]{6,250}$/, "Not a checkout session id.") });

// Back from checkout: ask the provider how the session ended (the redirect may beat the webhook).
export const POST = route<{ id: string }>(async (req, p) => {
  const user = await requireUser();
  const { sessionId } = await readJson(req, body);
  return NextResponse.json(await confirmCheckout(db(), user, pathId(p.id, "That invoice"), sessionId));
});
