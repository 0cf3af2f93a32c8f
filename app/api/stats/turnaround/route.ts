import { NextResponse } from "next/server";
import { z } from "zod";
import { db } from "@/db/client";
import { listApprovalsBetween, listCyclesDecidedBetween } from "@/db/queries/queue";
import { getReviewTargets } from "@/db/queries/settings";
import { route } from "@/lib/api/handler";
import { requireRole } from "@/lib/auth/session";
import { AppError } from "@/lib/errors";
import { calendarDaysBetween, dayInZone, endOfDayInZone, isDay, shiftDays, startOfDayInZone, turnaround } from "@/lib/review-clock";
import { loadCalendar } from "@/lib/review-clock/server";

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
  const database = db();
  const start = startOfDayInZone(from);
  const end = endOfDayInZone(to);
  const [cycles, approvals, cal, targets] = await Promise.all([
    listCyclesDecidedBetween(database, start, end),
    listApprovalsBetween(database, start, end),
    loadCalendar(database),
    getReviewTargets(database),
  ]);
  const t = turnaround(
    {
      from,
      to,
      cycles: cycles.flatMap((c) => (c.decidedAt && c.outcome ? [{ ...c, decidedAt: c.decidedAt, outcome: c.outcome }] : [])),
      approvals: approvals.flatMap((a) => (a.decidedAt ? [{ ...a, decidedAt: a.decidedAt }] : [])),
    },
    cal,
    targets,
  );
  return NextResponse.json({ ...t, targets });
});
