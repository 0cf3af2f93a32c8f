// The review clock of one application: due date, business days left or overdue, and the days
// the file spent with the department vs. with the applicant. The clock runs from a cycle's
// receipt to its decision; between a decision and the next receipt the file is with the
// applicant (departments measure both: common practice, no source).
import { addBusinessDays, businessDaysBetween, previousBusinessDay, type BusinessCalendar, type Day } from "./calendar";
import { targetDays, type ReviewTargets } from "./targets";

/** The due date of a cycle received on `receivedDay` (receipt day not counted). */
export function dueDayFor(receivedDay: Day, cycleNumber: number, targets: ReviewTargets, cal: BusinessCalendar): Day {
  return addBusinessDays(receivedDay, targetDays(cycleNumber, targets), cal);
}

export type ClockKind = "no_due_date" | "on_track" | "due_soon" | "due_today" | "overdue";

export interface ClockStatus {
  kind: ClockKind;
  dueDay: Day | null;
  /** business days from today to the due date (due date counted, today not); null when overdue or no date */
  businessDaysLeft: number | null;
  /** business days after the due date up to and including today; null unless overdue */
  businessDaysOverdue: number | null;
}

/** Where a running cycle stands today. Overdue from the day after the due date. */
export function clockStatus(dueDay: Day | null, today: Day, cal: BusinessCalendar): ClockStatus {
  if (!dueDay) return { kind: "no_due_date", dueDay: null, businessDaysLeft: null, businessDaysOverdue: null };
  if (today > dueDay) {
    return { kind: "overdue", dueDay, businessDaysLeft: null, businessDaysOverdue: businessDaysBetween(dueDay, today, cal) };
  }
  if (today === dueDay) return { kind: "due_today", dueDay, businessDaysLeft: 0, businessDaysOverdue: null };
  const left = businessDaysBetween(today, dueDay, cal);
  return { kind: left <= 1 ? "due_soon" : "on_track", dueDay, businessDaysLeft: left, businessDaysOverdue: null };
}

export interface CycleSpan {
  number: number;
  receivedDay: Day;
  dueDay: Day | null;
  decidedDay: Day | null;
}

export interface CycleClock {
  number: number;
  /** business days from receipt to decision (or to today while the review runs) */
  departmentDays: number;
  /** business days the file then spent with the applicant before the next receipt (or to today) */
  applicantDaysAfter: number;
  running: boolean;
  /** decided by the due date; null while running or without a due date */
  onTime: boolean | null;
}

export interface ClockTotals {
  departmentDays: number;
  applicantDays: number;
  cycles: CycleClock[];
}

/**
 * Days with the department vs. with the applicant so far, in business days. `withApplicantNow`
 * says whether the file is on the applicant's side today (corrections outstanding): only then
 * does the gap after the last decision keep growing until today.
 */
export function clockTotals(cycles: readonly CycleSpan[], today: Day, cal: BusinessCalendar, withApplicantNow: boolean): ClockTotals {
  const sorted = [...cycles].sort((a, b) => a.number - b.number);
  const out: CycleClock[] = [];
  sorted.forEach((c, i) => {
    const end = c.decidedDay ?? today;
    const next = sorted[i + 1];
    let applicantDaysAfter = 0;
    if (c.decidedDay) {
      if (next) applicantDaysAfter = Math.max(0, businessDaysBetween(c.decidedDay, next.receivedDay, cal));
      else if (withApplicantNow) applicantDaysAfter = Math.max(0, businessDaysBetween(c.decidedDay, today, cal));
    }
    out.push({
      number: c.number,
      departmentDays: Math.max(0, businessDaysBetween(c.receivedDay, end, cal)),
      applicantDaysAfter,
      running: !c.decidedDay,
      onTime: c.decidedDay && c.dueDay ? c.decidedDay <= c.dueDay : null,
    });
  });
  return {
    departmentDays: out.reduce((s, c) => s + c.departmentDays, 0),
    applicantDays: out.reduce((s, c) => s + c.applicantDaysAfter, 0),
    cycles: out,
  };
}

export type ReminderKind = "due_tomorrow" | "overdue";

/**
 * Reminders a running cycle is owed today. The examiner's comes on the business day before the
 * due date (or, if no job ran that day, on any day before the due date); the supervisors' once
 * the due date has passed. Sending each once is the caller's bookkeeping.
 */
export function remindersOwed(dueDay: Day | null, today: Day, cal: BusinessCalendar): ReminderKind[] {
  if (!dueDay) return [];
  if (today > dueDay) return ["overdue"];
  if (today < dueDay && today >= previousBusinessDay(dueDay, cal)) return ["due_tomorrow"];
  return [];
}
