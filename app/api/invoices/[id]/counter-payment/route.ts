import { NextResponse } from "next/server";
import { db } from "@/db/client";
import { pathId, readJson, route } from "@/lib/api/handler";
import { clientIp } from "@/lib/auth/request-ip";
import { requireRole } from "@/lib/auth/session";
import { counterPaymentSchema, recordCounterPayment } from "@/lib/fees/service";

// Staff record a payment taken at the department's counter: { method, reference }.
export const POST = route<{ id: string }>(async (req, p) => {
  const user = await requireRole("technician", "supervisor");
  const body = await readJson(req, counterPaymentSchema);
  return NextResponse.json(await recordCounterPayment(db(), user, pathId(p.id, "That invoice"), body, clientIp(req.headers)));
});
