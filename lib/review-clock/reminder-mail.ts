// Reminder e-mails in the department's voice: what is due, by when, what the reader does next.
import { mailSignature, type Mail } from "@/lib/mail/templates";
import type { Day } from "./calendar";
import { formatDayLong, plural } from "./format";
import { cycleKind } from "./targets";

export interface ReminderContext {
  recipientName: string;
  number: string;
  siteAddress: string;
  workDescription: string;
  cycle: number;
  dueDay: Day;
  examinerName: string | null;
  link: string;
  queueLink: string;
  /** business days past the due date, for the overdue notice */
  businessDaysOverdue?: number;
}

const reviewOf = (cycle: number) => (cycleKind(cycle) === "first_review" ? "first review" : `resubmittal review (cycle ${cycle})`);

export function dueTomorrowMail(c: ReminderContext): Mail {
  return {
    subject: `Due ${formatDayLong(c.dueDay)}: ${c.number} — ${c.siteAddress}`,
    text:
      `Dear ${c.recipientName},\n\n` +
      `The ${reviewOf(c.cycle)} of ${c.number} (${c.workDescription}, ${c.siteAddress}) is due by the end of ${formatDayLong(c.dueDay)}, the next business day.\n\n` +
      `Issue the correction list or the approval by then. If the review cannot be decided in time, tell your supervising examiner today so the file can be moved or the applicant told.\n\n` +
      `Open it: ${c.link}` +
      mailSignature,
  };
}

export function overdueMail(c: ReminderContext): Mail {
  const late = c.businessDaysOverdue ? ` and is ${plural(c.businessDaysOverdue, "business day")} past it` : "";
  return {
    subject: `Overdue: ${c.number} — due ${formatDayLong(c.dueDay)}, with ${c.examinerName ?? "no examiner"}`,
    text:
      `Dear ${c.recipientName},\n\n` +
      `The ${reviewOf(c.cycle)} of ${c.number} (${c.siteAddress}) was due by the end of ${formatDayLong(c.dueDay)} without a decision${late}. ` +
      `It is with ${c.examinerName ?? "no plans examiner"}.\n\n` +
      `Decide whether it stays where it is or moves: you can reassign it from the queue, where every overdue review is listed.\n\n` +
      `Overdue reviews: ${c.queueLink}\nThis application: ${c.link}` +
      mailSignature,
  };
}
