import { NextResponse } from "next/server";
import { db } from "@/db/client";
import { pathId, route } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { invoiceDetail } from "@/lib/fees/service";

// One invoice with its line items and arithmetic, for whoever may view its application.
export const GET = route<{ id: string }>(async (_req, p) => {
  const user = await requireUser();
  return NextResponse.json(await invoiceDetail(db(), user, pathId(p.id, "That invoice")));
});
