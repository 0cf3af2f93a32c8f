// Business-day arithmetic on calendar dates ("YYYY-MM-DD" in the department's time zone).
// Pure: no clock, no I/O. A date string stands for the whole day; date-fns works on it as
// local midnight, which only ever serves to name the weekday and step whole days.
import { addDays, differenceInCalendarDays, isWeekend } from "date-fns";

/** A calendar date in the department's time zone, YYYY-MM-DD. */
export type Day = string;

const DAY_RE = /^\d{4}-\d{2}-\d{2}$/;

export interface BusinessCalendar {
  /** sorted, unique holiday dates */
  readonly holidays: readonly Day[];
  readonly holidaySet: ReadonlySet<Day>;
  /** the holidays that fall Monday to Friday, sorted: the only ones that take a business day away */
  readonly weekdayHolidays: readonly Day[];
}

// Local midnight of the date; built from its numbers (the queue formats thousands of these a second).
const toDate = (day: Day) => new Date(Number(day.slice(0, 4)), Number(day.slice(5, 7)) - 1, Number(day.slice(8, 10)));
const pad = (n: number) => (n < 10 ? `0${n}` : String(n));
const toDay = (d: Date): Day => `${String(d.getFullYear()).padStart(4, "0")}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}`;

export function isDay(value: unknown): value is Day {
  // The round trip refuses dates that do not exist (2026-02-30 would come back as March 2).
  return typeof value === "string" && DAY_RE.test(value) && toDay(toDate(value)) === value;
}

function assertDay(day: Day, what: string): void {
  if (!isDay(day)) throw new RangeError(`${what} must be a calendar date YYYY-MM-DD, got "${day}".`);
}

export function makeCalendar(holidays: Iterable<Day> = []): BusinessCalendar {
  const list = [...new Set(holidays)];
  for (const h of list) assertDay(h, "A holiday");
  list.sort();
  return { holidays: list, holidaySet: new Set(list), weekdayHolidays: list.filter((h) => !isWeekend(toDate(h))) };
}

export function shiftDays(day: Day, n: number): Day {
  assertDay(day, "The date");
  return toDay(addDays(toDate(day), n));
}

export function isWeekendDay(day: Day): boolean {
  assertDay(day, "The date");
  return isWeekend(toDate(day));
}

/** Monday to Friday and not a holiday of the calendar. */
export function isBusinessDay(day: Day, cal: BusinessCalendar): boolean {
  return !isWeekendDay(day) && !cal.holidaySet.has(day);
}

/** The first business day strictly after `day`. */
export function nextBusinessDay(day: Day, cal: BusinessCalendar): Day {
  let d = shiftDays(day, 1);
  while (!isBusinessDay(d, cal)) d = shiftDays(d, 1);
  return d;
}

/** The last business day strictly before `day`. */
export function previousBusinessDay(day: Day, cal: BusinessCalendar): Day {
  let d = shiftDays(day, -1);
  while (!isBusinessDay(d, cal)) d = shiftDays(d, -1);
  return d;
}

/** `day` itself when it is a business day, else the next one (a due date on a closure moves forward). */
export function rollForward(day: Day, cal: BusinessCalendar): Day {
  return isBusinessDay(day, cal) ? day : nextBusinessDay(day, cal);
}

/**
 * The date `n` business days after `from`. The start day is not counted (a file received on
 * Monday with a 1-day target is due Tuesday); weekends and holidays are skipped, so the result
 * is always a business day. n = 0 gives `from` rolled forward to a business day.
 */
export function addBusinessDays(from: Day, n: number, cal: BusinessCalendar): Day {
  if (!Number.isInteger(n) || n < 0) throw new RangeError(`The number of business days must be a whole number ≥ 0, got ${n}.`);
  if (n === 0) return rollForward(from, cal);
  let d = from;
  for (let left = n; left > 0; left--) d = nextBusinessDay(d, cal);
  return d;
}

// Days since 1970-01-01, a Thursday. Counting runs on these integers: the queue counts the
// business days of every row it shows, and date-fns' zone-aware helpers cost ~10 µs a call.
const epochDay = (day: Day) => Date.UTC(Number(day.slice(0, 4)), Number(day.slice(5, 7)) - 1, Number(day.slice(8, 10))) / 86_400_000;
const isWeekendEpochDay = (n: number) => {
  const dow = (((n + 4) % 7) + 7) % 7; // 0 = Sunday
  return dow === 0 || dow === 6;
};

/** Weekdays in the half-open interval (from, to], for from ≤ to: whole weeks, then the odd days. */
function weekdaysAfter(from: Day, to: Day): number {
  const a = epochDay(from);
  const span = epochDay(to) - a;
  const weeks = Math.floor(span / 7);
  let count = weeks * 5;
  for (let i = weeks * 7 + 1; i <= span; i++) if (!isWeekendEpochDay(a + i)) count++;
  return count;
}

/** How many entries of a sorted list are ≤ day (binary search). */
function countUpTo(sorted: readonly Day[], day: Day): number {
  let lo = 0;
  let hi = sorted.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if ((sorted[mid] as Day) <= day) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * Business days d with from < d ≤ to: how many business days the clock ran from `from` to `to`.
 * Negative when `to` is before `from` (the same count, the other way).
 */
export function businessDaysBetween(from: Day, to: Day, cal: BusinessCalendar): number {
  assertDay(from, "The start date");
  assertDay(to, "The end date");
  if (to < from) return -businessDaysBetween(to, from, cal);
  return weekdaysAfter(from, to) - (countUpTo(cal.weekdayHolidays, to) - countUpTo(cal.weekdayHolidays, from));
}

/** Calendar days from `from` to `to` (to − from). */
export function calendarDaysBetween(from: Day, to: Day): number {
  assertDay(from, "The start date");
  assertDay(to, "The end date");
  return differenceInCalendarDays(toDate(to), toDate(from));
}


/** Monday of the week that holds `day` (weeks run Monday to Sunday). */
export function weekStart(day: Day): Day {
  const dow = toDate(day).getDay(); // 0 = Sunday
  return shiftDays(day, dow === 0 ? -6 : 1 - dow);
}

/** Sunday of the week that holds `day`. */
export function weekEnd(day: Day): Day {
  return shiftDays(weekStart(day), 6);
}
