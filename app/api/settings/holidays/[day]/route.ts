import { NextResponse } from "next/server";
import { db } from "@/db/client";
import { route } from "@/lib/api/handler";
import { clientIp } from "@/lib/auth/request-ip";
import { requireRole } from "@/lib/auth/session";
import { notFound } from "@/lib/errors";
import { isDay } from "@/lib/review-clock";
import { removeHoliday } from "@/lib/review-clock/server";

export const DELETE = route<{ day: string }>(async (req, p) => {
  const actor = await requireRole("admin");
  if (!isDay(p.day)) throw notFound("That holiday");
  await removeHoliday(db(), actor, p.day, clientIp(req.headers));
  return NextResponse.json({ ok: true });
});
