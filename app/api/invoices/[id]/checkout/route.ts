import { NextResponse } from "next/server";
import { db } from "@/db/client";
import { pathId, route } from "@/lib/api/handler";
import { clientIp } from "@/lib/auth/request-ip";
import { requireRole } from "@/lib/auth/session";
import { startCheckout } from "@/lib/payments/checkout";

// The applicant's "Pay online": the provider's hosted checkout page for this open invoice.
export const POST = route<{ id: string }>(async (req, p) => {
  const user = await requireRole("applicant");
  return NextResponse.json(await startCheckout(db(), user, pathId(p.id, "That invoice"), clientIp(req.headers)));
});
