// Instants ↔ calendar days in the department's time zone, with the platform's Intl (IANA data).
// The review clock counts whole days where the department works, whatever zone a server runs in.
import type { Day } from "./calendar";

/**
 * The department's time zone. Larkspur Falls is invented; a US Central zone is assumed for it.
 * A real deployment sets its own here.
 */
export const DEPARTMENT_TIME_ZONE = "America/Chicago";

const partsFormatters = new Map<string, Intl.DateTimeFormat>();
function partsFormatter(timeZone: string): Intl.DateTimeFormat {
  let f = partsFormatters.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat("en-US", {
      timeZone,
      hourCycle: "h23",
      year: "numeric",
      month: "2-digit",
      day: "2-digit",
      hour: "2-digit",
      minute: "2-digit",
      second: "2-digit",
    });
    partsFormatters.set(timeZone, f);
  }
  return f;
}

function wallClock(instant: Date, timeZone: string) {
  const p: Record<string, number> = {};
  for (const part of partsFormatter(timeZone).formatToParts(instant)) {
    if (part.type !== "literal") p[part.type] = Number(part.value);
  }
  return { y: p.year ?? 0, mo: p.month ?? 1, d: p.day ?? 1, h: p.hour ?? 0, mi: p.minute ?? 0, s: p.second ?? 0 };
}

/** Offset of the zone from UTC at this instant, in milliseconds (local − UTC). */
function offsetMs(instant: Date, timeZone: string): number {
  const w = wallClock(instant, timeZone);
  const asUtc = Date.UTC(w.y, w.mo - 1, w.d, w.h, w.mi, w.s);
  return asUtc - Math.floor(instant.getTime() / 1000) * 1000;
}

// Zone offsets only change on quarter-hour instants (every zone's rules), so one lookup per
// 15-minute bucket is exact; Intl's formatter is the slow part of formatting a queue page.
// The bound holds the longest statistics period (three years, 105,216 buckets) with room to
// spare, a few MB per zone; a smaller one emptied itself inside a one-year report.
const QUARTER_HOUR = 15 * 60_000;
const MAX_BUCKETS_PER_ZONE = 150_000;
const offsetCache = new Map<string, Map<number, number>>();
function cachedOffset(t: number, timeZone: string): number {
  let zone = offsetCache.get(timeZone);
  if (!zone) offsetCache.set(timeZone, (zone = new Map()));
  const bucket = Math.floor(t / QUARTER_HOUR);
  let o = zone.get(bucket);
  if (o === undefined) {
    if (zone.size >= MAX_BUCKETS_PER_ZONE) zone.clear();
    o = offsetMs(new Date(bucket * QUARTER_HOUR), timeZone);
    zone.set(bucket, o);
  }
  return o;
}

/** The calendar date in `timeZone` at this instant. */
export function dayInZone(instant: Date, timeZone: string = DEPARTMENT_TIME_ZONE): Day {
  const t = instant.getTime();
  return new Date(t + cachedOffset(t, timeZone)).toISOString().slice(0, 10);
}

/** The instant at which the wall clock in `timeZone` shows 00:00 on `day` (the first instant of that day). */
export function startOfDayInZone(day: Day, timeZone: string = DEPARTMENT_TIME_ZONE): Date {
  const [y, m, d] = day.split("-").map(Number) as [number, number, number];
  const guess = Date.UTC(y, m - 1, d);
  // Two passes settle the offset across a daylight-saving change.
  let t = guess - offsetMs(new Date(guess), timeZone);
  t = guess - offsetMs(new Date(t), timeZone);
  return new Date(t);
}

/** The last millisecond of `day` in `timeZone`: a due date means "by the end of that day". */
export function endOfDayInZone(day: Day, timeZone: string = DEPARTMENT_TIME_ZONE): Date {
  const [y, m, d] = day.split("-").map(Number) as [number, number, number];
  const next = new Date(Date.UTC(y, m - 1, d + 1)).toISOString().slice(0, 10);
  return new Date(startOfDayInZone(next, timeZone).getTime() - 1);
}
