import "server-only";
import { type Db, type Tx, withTransaction } from "@/db/client";
import { recordAudit } from "@/db/queries/audit";
import { listApprovalsBetween, listCyclesDecidedBetween } from "@/db/queries/queue";
import {
  deleteHoliday,
  getReviewTargets,
  listHolidays,
  listOpenReviewsDueBetween,
  putSetting,
  setCurrentDueDate,
  upsertHoliday,
} from "@/db/queries/settings";
import type { SessionUser } from "@/db/queries/users";
import { AppError, forbidden } from "@/lib/errors";
import { makeCalendar, rollForward, type BusinessCalendar, type Day } from "./calendar";
import { dueDayFor } from "./clock";
import { REVIEW_TARGETS_KEY, type ReviewTargets } from "./targets";
import { turnaround } from "./turnaround";
import { dayInZone, DEPARTMENT_TIME_ZONE, endOfDayInZone, startOfDayInZone } from "./zone";

type Actor = Pick<SessionUser, "id" | "role">;

/** The holiday calendar as the arithmetic wants it. A few dozen rows: read whole. */
export async function loadCalendar(database: Db | Tx): Promise<BusinessCalendar> {
  return makeCalendar((await listHolidays(database)).map((h) => h.day));
}

/**
 * Department turnaround over [from, to] (department days, both ends included), with the review
 * targets it was measured against: what GET /api/stats/turnaround answers.
 */
export async function departmentTurnaround(database: Db | Tx, from: Day, to: Day) {
  const start = startOfDayInZone(from);
  const end = endOfDayInZone(to);
  const [cycles, approvals, cal, targets] = await Promise.all([
    listCyclesDecidedBetween(database, start, end),
    listApprovalsBetween(database, start, end),
    loadCalendar(database),
    getReviewTargets(database),
  ]);
  const measured = turnaround(
    {
      from,
      to,
      cycles: cycles.flatMap((c) => (c.decidedAt && c.outcome ? [{ ...c, decidedAt: c.decidedAt, outcome: c.outcome }] : [])),
      approvals: approvals.flatMap((a) => (a.decidedAt ? [{ ...a, decidedAt: a.decidedAt }] : [])),
    },
    cal,
    targets,
  );
  return { ...measured, targets };
}

// Read-mostly: the queue answers many requests a second from this. A change made through this
// process clears it at once; other instances see it within the minute.
const CALENDAR_TTL_MS = 60_000;
let cachedCalendar: { at: number; cal: BusinessCalendar } | null = null;

export async function loadCalendarCached(database: Db | Tx, now = Date.now()): Promise<BusinessCalendar> {
  if (cachedCalendar && now - cachedCalendar.at < CALENDAR_TTL_MS) return cachedCalendar.cal;
  const cal = await loadCalendar(database);
  cachedCalendar = { at: now, cal };
  return cal;
}

/**
 * When a review cycle received at `receivedAt` is due: receipt + the target for its cycle type
 * in business days (receipt day not counted), as the last instant of that day in the
 * department's time zone. Call it inside the transaction that starts the cycle.
 */
export async function dueDateFor(tx: Db | Tx, receivedAt: Date, cycleNumber: number): Promise<Date> {
  const [targets, cal] = await Promise.all([getReviewTargets(tx), loadCalendar(tx)]);
  return endOfDayInZone(dueDayFor(dayInZone(receivedAt, DEPARTMENT_TIME_ZONE), cycleNumber, targets, cal), DEPARTMENT_TIME_ZONE);
}

export async function getClockSettings(database: Db) {
  const [targets, list] = await Promise.all([getReviewTargets(database), listHolidays(database)]);
  return { targets, holidays: list, timeZone: DEPARTMENT_TIME_ZONE };
}

function assertAdmin(actor: Actor) {
  if (actor.role !== "admin") throw forbidden("Only an administrator changes the review clock.");
}

/** New targets apply to cycles that start from now on; a due date already given stands. */
export async function saveReviewTargets(database: Db, actor: Actor, targets: ReviewTargets, ip?: string): Promise<void> {
  assertAdmin(actor);
  await withTransaction(database, async (tx) => {
    const before = await getReviewTargets(tx);
    await putSetting(tx, REVIEW_TARGETS_KEY, targets, actor.id);
    await recordAudit(tx, {
      actor,
      action: "settings.review_targets",
      entityType: "settings",
      entityId: REVIEW_TARGETS_KEY,
      summary: `Review targets set to ${targets.firstReviewDays} business days for a first review and ${targets.resubmittalDays} for a resubmittal.`,
      detail: { before, after: targets },
      ip,
    });
  });
}

/**
 * Adds a closure day (or renames one). Open reviews due on that day move to the next business
 * day, so a due date never lands on a day the department is closed.
 */
export async function addHoliday(database: Db, actor: Actor, day: Day, name: string, ip?: string): Promise<{ created: boolean; moved: number }> {
  assertAdmin(actor);
  return withTransaction(database, async (tx) => {
    const created = await upsertHoliday(tx, day, name);
    const cal = await loadCalendar(tx);
    const affected = await listOpenReviewsDueBetween(tx, startOfDayInZone(day), endOfDayInZone(day));
    const to = rollForward(day, cal);
    for (const a of affected) {
      await setCurrentDueDate(tx, a.id, a.cycle, endOfDayInZone(to));
      await recordAudit(tx, {
        actor,
        action: "review.due_date_moved",
        entityType: "application",
        entityId: a.id,
        applicationId: a.id,
        summary: `Due date of review cycle ${a.cycle} moved from ${day} to ${to}: the department is closed on ${day} (${name}).`,
        ip,
      });
    }
    await recordAudit(tx, {
      actor,
      action: created ? "settings.holiday_added" : "settings.holiday_renamed",
      entityType: "holiday",
      entityId: day,
      summary: `${created ? "Holiday added" : "Holiday renamed"}: ${day} ${name}${affected.length ? `; ${affected.length} due date(s) moved to ${to}` : ""}.`,
      ip,
    });
    return { created, moved: affected.length };
  }).finally(() => (cachedCalendar = null));
}

/** Removing a closure day does not pull due dates earlier: a date given to an applicant stands. */
export async function removeHoliday(database: Db, actor: Actor, day: Day, ip?: string): Promise<void> {
  assertAdmin(actor);
  await withTransaction(database, async (tx) => {
    if (!(await deleteHoliday(tx, day))) throw new AppError("not_found", "That holiday was not found.");
    await recordAudit(tx, { actor, action: "settings.holiday_removed", entityType: "holiday", entityId: day, summary: `Holiday removed: ${day}.`, ip });
  });
  cachedCalendar = null;
}
