// Words for dates and clock states, the same on every screen and in every reminder.
import type { Day } from "./calendar";
import type { ClockStatus } from "./clock";

// A Day names a date, not an instant: format it at noon UTC in UTC so no zone can shift it.
const noonUtc = (day: Day) => {
  const [y, m, d] = day.split("-").map(Number) as [number, number, number];
  return new Date(Date.UTC(y, m - 1, d, 12));
};

const shortFmt = new Intl.DateTimeFormat("en-US", { timeZone: "UTC", month: "short", day: "numeric", year: "numeric" });
const weekdayFmt = new Intl.DateTimeFormat("en-US", { timeZone: "UTC", weekday: "short", month: "short", day: "numeric" });
const longFmt = new Intl.DateTimeFormat("en-US", { timeZone: "UTC", weekday: "long", month: "long", day: "numeric", year: "numeric" });

/** "Dec 11, 2026" */
export const formatDay = (day: Day | null): string => (day ? shortFmt.format(noonUtc(day)) : "—");
/** "Fri, Dec 11" */
export const formatDayWithWeekday = (day: Day | null): string => (day ? weekdayFmt.format(noonUtc(day)) : "—");
/** "Friday, December 11, 2026" */
export const formatDayLong = (day: Day): string => longFmt.format(noonUtc(day));

export const plural = (n: number, noun: string) => `${n} ${noun}${n === 1 ? "" : "s"}`;

/** One short sentence for a running clock, e.g. "3 business days left", "Overdue by 2 business days". */
export function clockWords(s: ClockStatus): string {
  switch (s.kind) {
    case "no_due_date":
      return "No due date set";
    case "due_today":
      return "Due today";
    case "due_soon":
    case "on_track":
      return `${plural(s.businessDaysLeft ?? 0, "business day")} left`;
    case "overdue":
      return s.businessDaysOverdue ? `Overdue by ${plural(s.businessDaysOverdue, "business day")}` : "Overdue";
  }
}
