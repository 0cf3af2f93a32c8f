import { NextResponse } from "next/server";
import { z } from "zod";
import { db } from "@/db/client";
import { pathId, readJson, route } from "@/lib/api/handler";
import { clientIp } from "@/lib/auth/request-ip";
import { requireRole, requireUser } from "@/lib/auth/session";
import { applicationInvoices, createResubmittalInvoice } from "@/lib/fees/service";

// The application's invoices, for its workspace; staff charge the fee for a resubmittal
// beyond the cycles the plan-review fee covers.
export const GET = route<{ id: string }>(async (_req, p) => {
  const user = await requireUser();
  return NextResponse.json(await applicationInvoices(db(), user, pathId(p.id, "That application")));
});

const body = z.object({ purpose: z.literal("resubmittal") });

export const POST = route<{ id: string }>(async (req, p) => {
  const user = await requireRole("technician", "supervisor");
  await readJson(req, body);
  const r = await createResubmittalInvoice(db(), user, pathId(p.id, "That application"), clientIp(req.headers));
  return NextResponse.json({ invoice: r }, { status: 201 });
});
