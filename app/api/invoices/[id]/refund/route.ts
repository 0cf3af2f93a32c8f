import { NextResponse } from "next/server";
import { db } from "@/db/client";
import { pathId, route } from "@/lib/api/handler";
import { requireRole } from "@/lib/auth/session";
import { retryRefund } from "@/lib/fees/service";

// Staff retry of a refund the provider refused when the application was withdrawn.
export const POST = route<{ id: string }>(async (_req, p) => {
  const user = await requireRole("technician", "supervisor");
  return NextResponse.json(await retryRefund(db(), user, pathId(p.id, "That invoice")));
});
