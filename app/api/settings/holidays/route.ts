import { NextResponse } from "next/server";
import { z } from "zod";
import { db } from "@/db/client";
import { readJson, route } from "@/lib/api/handler";
import { clientIp } from "@/lib/auth/request-ip";
import { requireRole } from "@/lib/auth/session";
import { isDay } from "@/lib/review-clock";
import { addHoliday } from "@/lib/review-clock/server";

const body = z.object({
  day: z.string().refine(isDay, "Use a date YYYY-MM-DD."),
  name: z.string().trim().min(2, "Name the holiday or closure.").max(80),
});

export const POST = route(async (req) => {
  const actor = await requireRole("admin");
  const input = await readJson(req, body);
  const r = await addHoliday(db(), actor, input.day, input.name, clientIp(req.headers));
  return NextResponse.json({ holiday: input, movedDueDates: r.moved }, { status: r.created ? 201 : 200 });
});
