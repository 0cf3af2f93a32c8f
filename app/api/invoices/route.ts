import { NextResponse } from "next/server";
import { z } from "zod";
import { db } from "@/db/client";
import { route } from "@/lib/api/handler";
import { requireRole } from "@/lib/auth/session";
import { invoicesFor } from "@/lib/fees/service";

const query = z.object({ status: z.enum(["open", "paid", "void", "refunded"]).optional() });

// Applicants: their own invoices. Permit technicians and supervisors: every invoice.
export const GET = route(async (req) => {
  const user = await requireRole("applicant", "technician", "supervisor");
  const q = query.parse({ status: req.nextUrl.searchParams.get("status") || undefined });
  return NextResponse.json({ invoices: await invoicesFor(db(), user, q.status) });
});
