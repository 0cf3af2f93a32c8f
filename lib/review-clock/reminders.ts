import "server-only";
import { type Db, withTransaction } from "@/db/client";
import { enqueueMail, type OutgoingMail } from "@/db/queries/outbox";
import { listDueSoonWithoutReminder, listOverdueWithoutNotice, markReminderSent } from "@/db/queries/queue";
import { listUsersByRole } from "@/db/queries/users";
import { env } from "@/lib/env";
import { businessDaysBetween, shiftDays } from "./calendar";
import { remindersOwed } from "./clock";
import { dueTomorrowMail, overdueMail } from "./reminder-mail";
import { loadCalendar } from "./server";
import { dayInZone, endOfDayInZone } from "./zone";

export interface ReminderRun {
  dueTomorrow: number;
  overdue: number;
  /** already sent by an earlier or concurrent run */
  alreadySent: number;
}

// Reminders per run, per kind: a backlog drains over a few runs instead of one long transaction burst.
const BATCH = 200;
// A holiday weekend puts at most a few days between "the business day before" and the due date.
const LOOKAHEAD_DAYS = 10;

const isDuplicate = (e: unknown) => {
  const err = e as { code?: string; cause?: { code?: string } };
  return err.code === "ER_DUP_ENTRY" || err.cause?.code === "ER_DUP_ENTRY";
};

/**
 * E-mails the assigned examiner on the business day before a due date, and the supervising
 * examiners once a review is overdue. Each reminder is sent once per application and cycle:
 * the reminders_sent row and its outbox rows are written in one transaction, and the unique
 * key (application, cycle, kind) turns any repeat — a second run, a restart, a second worker —
 * into a no-op.
 */
export async function runReminders(database: Db, now: Date): Promise<ReminderRun> {
  const run: ReminderRun = { dueTomorrow: 0, overdue: 0, alreadySent: 0 };
  const cal = await loadCalendar(database);
  const today = dayInZone(now);
  const base = env().APP_URL;
  const queueLink = `${base}/queue?due=overdue`;

  async function once(applicationId: number, cycle: number, kind: "due_tomorrow" | "overdue", mails: OutgoingMail[]): Promise<boolean> {
    try {
      await withTransaction(database, async (tx) => {
        await markReminderSent(tx, applicationId, cycle, kind, now);
        await enqueueMail(tx, mails);
      });
      return true;
    } catch (e) {
      if (!isDuplicate(e)) throw e;
      run.alreadySent++;
      return false;
    }
  }

  // What both reminders say about the review, whoever receives them.
  type Review = { id: number; number: string | null; siteAddress: string; workDescription: string; cycle: number; examinerName: string | null };
  const about = (a: Review, dueDay: string) => ({
    number: a.number ?? `#${a.id}`,
    siteAddress: a.siteAddress,
    workDescription: a.workDescription,
    cycle: a.cycle,
    dueDay,
    examinerName: a.examinerName,
    link: `${base}/applications/${a.id}`,
    queueLink,
  });

  const soon = await listDueSoonWithoutReminder(database, now, endOfDayInZone(shiftDays(today, LOOKAHEAD_DAYS)), BATCH);
  for (const a of soon) {
    if (!a.dueAt || !a.examinerId || !a.examinerEmail || a.examinerStatus !== "active") continue;
    const dueDay = dayInZone(a.dueAt);
    if (!remindersOwed(dueDay, today, cal).includes("due_tomorrow")) continue;
    const m = dueTomorrowMail({ recipientName: a.examinerName ?? "", ...about(a, dueDay) });
    const sent = await once(a.id, a.cycle, "due_tomorrow", [
      { dedupeKey: `reminder:${a.id}:c${a.cycle}:due_tomorrow:${a.examinerId}`, template: "reminder.due_tomorrow", to: { address: a.examinerEmail, name: a.examinerName ?? "" }, applicationId: a.id, ...m },
    ]);
    if (sent) run.dueTomorrow++;
  }

  const late = await listOverdueWithoutNotice(database, now, BATCH);
  if (late.length) {
    const supervisors = await listUsersByRole(database, "supervisor");
    for (const a of late) {
      if (!a.dueAt) continue;
      const dueDay = dayInZone(a.dueAt);
      if (!remindersOwed(dueDay, today, cal).includes("overdue")) continue;
      const mails = supervisors.map((s): OutgoingMail => ({
        dedupeKey: `reminder:${a.id}:c${a.cycle}:overdue:${s.id}`,
        template: "reminder.overdue",
        to: { address: s.email, name: s.name },
        applicationId: a.id,
        ...overdueMail({
          recipientName: s.name,
          ...about(a, dueDay),
          businessDaysOverdue: businessDaysBetween(dueDay, today, cal),
        }),
      }));
      if (await once(a.id, a.cycle, "overdue", mails)) run.overdue++;
    }
  }
  return run;
}

let lastRunAt = 0;

/**
 * For the worker loop: runs the reminders at most once per REMINDER_INTERVAL_MS (default one
 * minute) and never lets a failure stop the mail relay.
 */
export async function remindersTick(database: Db, now: Date = new Date()): Promise<ReminderRun | null> {
  const every = Number(process.env.REMINDER_INTERVAL_MS ?? 60_000);
  if (now.getTime() - lastRunAt < every) return null;
  lastRunAt = now.getTime();
  try {
    const r = await runReminders(database, now);
    if (r.dueTomorrow || r.overdue) console.log(`[worker] reminders: ${r.dueTomorrow} due tomorrow, ${r.overdue} overdue`);
    return r;
  } catch (err) {
    console.error("[worker] reminder round failed:", err instanceof Error ? err.message : err);
    return null;
  }
}
