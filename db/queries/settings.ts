import "server-only";
import { and, asc, eq, gte, inArray, lte, sql } from "drizzle-orm";
import { parseReviewTargets, REVIEW_TARGETS_KEY, type ReviewTargets } from "@/lib/review-clock/targets";
import type { Db, Tx } from "../client";
import { applications, holidays, reviewCycles, settings } from "../schema";

export async function getSetting(database: Db | Tx, key: string): Promise<unknown> {
  const [row] = await database.select({ value: settings.value }).from(settings).where(eq(settings.key, key)).limit(1);
  return row?.value;
}

export async function putSetting(database: Db | Tx, key: string, value: unknown, updatedBy: number | null): Promise<void> {
  await database
    .insert(settings)
    .values({ key, value, updatedBy })
    .onDuplicateKeyUpdate({ set: { value, updatedBy, updatedAt: new Date() } });
}

/** The department's review targets; the defaults when none were saved. */
export async function getReviewTargets(database: Db | Tx): Promise<ReviewTargets> {
  return parseReviewTargets(await getSetting(database, REVIEW_TARGETS_KEY));
}

export async function listHolidays(database: Db | Tx) {
  return database.select({ day: holidays.day, name: holidays.name }).from(holidays).orderBy(asc(holidays.day));
}

export async function getHoliday(database: Db | Tx, day: string) {
  const [row] = await database.select().from(holidays).where(eq(holidays.day, day)).limit(1);
  return row;
}

/** Adds or renames; returns whether the day was new. */
export async function upsertHoliday(database: Db | Tx, day: string, name: string): Promise<boolean> {
  const existing = await getHoliday(database, day);
  if (existing) {
    await database.update(holidays).set({ name }).where(eq(holidays.day, day));
    return false;
  }
  await database.insert(holidays).values({ day, name });
  return true;
}

export async function deleteHoliday(database: Db | Tx, day: string): Promise<boolean> {
  const r = await database.delete(holidays).where(eq(holidays.day, day));
  return r[0].affectedRows === 1;
}

/** Inserts what is missing; existing days keep their names. */
export async function insertHolidaysIfMissing(database: Db | Tx, rows: readonly { day: string; name: string }[]): Promise<void> {
  if (rows.length === 0) return;
  await database
    .insert(holidays)
    .values([...rows])
    .onDuplicateKeyUpdate({ set: { day: sql`${holidays.day}` } });
}

/** Open reviews whose current due date falls inside [start, end]: the ones a new closure day moves. */
export async function listOpenReviewsDueBetween(database: Db | Tx, start: Date, end: Date) {
  return database
    .select({ id: applications.id, number: applications.number, cycle: applications.cycle, dueAt: applications.dueAt })
    .from(applications)
    .where(and(inArray(applications.state, ["in_review", "resubmitted"]), gte(applications.dueAt, start), lte(applications.dueAt, end)));
}

/** Moves the current cycle's due date, on the cycle and its copy on the application. */
export async function setCurrentDueDate(database: Db | Tx, applicationId: number, cycle: number, dueAt: Date): Promise<void> {
  await database.update(applications).set({ dueAt }).where(eq(applications.id, applicationId));
  await database
    .update(reviewCycles)
    .set({ dueAt })
    .where(and(eq(reviewCycles.applicationId, applicationId), eq(reviewCycles.number, cycle)));
}
