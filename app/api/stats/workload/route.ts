import { NextResponse } from "next/server";
import { db } from "@/db/client";
import { listActiveExaminers } from "@/db/queries/applications";
import { workloadByExaminer } from "@/db/queries/queue";
import { route } from "@/lib/api/handler";
import { requireRole } from "@/lib/auth/session";
import { dayInZone, endOfDayInZone, weekEnd } from "@/lib/review-clock";

// Per examiner: open reviews, overdue, due this week (Monday–Sunday in the department's zone).
export const GET = route(async () => {
  await requireRole("supervisor");
  const now = new Date();
  const today = dayInZone(now);
  const database = db();
  const [people, counts] = await Promise.all([listActiveExaminers(database), workloadByExaminer(database, now, endOfDayInZone(weekEnd(today)))]);
  const byId = new Map(counts.map((c) => [c.examinerId, c]));
  const examiners = people.map((p) => {
    const c = byId.get(p.id);
    return { id: p.id, name: p.name, role: p.role, open: c?.open ?? 0, overdue: c?.overdue ?? 0, dueThisWeek: c?.dueThisWeek ?? 0 };
  });
  // Reviews held by someone no longer active (or nobody) still belong on the chart.
  const known = new Set(people.map((p) => p.id));
  const orphans = counts.filter((c) => c.examinerId === null || !known.has(c.examinerId));
  if (orphans.length) {
    examiners.push({
      id: 0,
      name: "Not with an active examiner",
      role: "examiner",
      open: orphans.reduce((s, c) => s + c.open, 0),
      overdue: orphans.reduce((s, c) => s + c.overdue, 0),
      dueThisWeek: orphans.reduce((s, c) => s + c.dueThisWeek, 0),
    });
  }
  const totals = examiners.reduce((t, e) => ({ open: t.open + e.open, overdue: t.overdue + e.overdue, dueThisWeek: t.dueThisWeek + e.dueThisWeek }), { open: 0, overdue: 0, dueThisWeek: 0 });
  return NextResponse.json({ today, examiners, totals });
});
