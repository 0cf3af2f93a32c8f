import { NextResponse } from "next/server";
import { z } from "zod";
import { db } from "@/db/client";
import { route } from "@/lib/api/handler";
import { requireRole } from "@/lib/auth/session";
import { AppError } from "@/lib/errors";
import { calendarDaysBetween, dayInZone, isDay, shiftDays } from "@/lib/review-clock";
import { departmentTurnaround } from "@/lib/review-clock/server";

const day = z.string().refine(isDay, "Use a date YYYY-MM-DD.");
const query = z.object({ from: day.optional(), to: day.optional() });

// Department turnaround over a period (department days, both ends included); default the last 90 days.
export const GET = route(async (req) => {
  await requireRole("supervisor");
  const q = query.parse(Object.fromEntries(req.nextUrl.searchParams));
  const today = dayInZone(new Date());
  const to = q.to ?? today;
  const from = q.from ?? shiftDays(to, -89);
  if (from > to) throw new AppError("invalid_input", "The period starts after it ends.", { from: "Start on or before the end date." });
  if (calendarDaysBetween(from, to) > 3 * 366) throw new AppError("invalid_input", "Choose a period of at most three years.", { from: "At most three years." });
  return NextResponse.json(await departmentTurnaround(db(), from, to));
});
