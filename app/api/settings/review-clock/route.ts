import { NextResponse } from "next/server";
import { db } from "@/db/client";
import { readJson, route } from "@/lib/api/handler";
import { clientIp } from "@/lib/auth/request-ip";
import { requireRole } from "@/lib/auth/session";
import { reviewTargetsSchema } from "@/lib/review-clock/targets";
import { getClockSettings, saveReviewTargets } from "@/lib/review-clock/server";

// Review targets and the holiday calendar. Supervisors read them (the desk shows them); the administrator changes them.
export const GET = route(async () => {
  await requireRole("admin", "supervisor");
  return NextResponse.json(await getClockSettings(db()));
});

export const PUT = route(async (req) => {
  const actor = await requireRole("admin");
  const targets = await readJson(req, reviewTargetsSchema);
  await saveReviewTargets(db(), actor, targets, clientIp(req.headers));
  return NextResponse.json({ targets });
});
