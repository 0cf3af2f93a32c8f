// Department turnaround over a period: median business days with the department per cycle,
// cycles per approval, share approved on the first cycle, share of reviews decided on time.
// These are the measures departments publish (domain notes, "Turnaround"; common practice).
import { businessDaysBetween, type BusinessCalendar, type Day } from "./calendar";
import { targetDays, type ReviewTargets } from "./targets";
import { dayInZone, DEPARTMENT_TIME_ZONE } from "./zone";

export interface DecidedCycle {
  applicationId: number;
  number: number;
  receivedAt: Date;
  dueAt: Date | null;
  decidedAt: Date;
  outcome: "corrections_issued" | "approved" | "approved_with_conditions" | "withdrawn";
}

export interface Approval {
  applicationId: number;
  /** review cycles it took, the approving one included */
  cycles: number;
  decidedAt: Date;
}

export interface CycleGroupStat {
  group: "1" | "2" | "3+";
  label: string;
  count: number;
  medianDays: number | null;
  targetDays: number;
}

export interface MonthStat {
  month: string;
  decided: number;
  onTimeShare: number | null;
  medianDays: number | null;
}

export interface Turnaround {
  from: Day;
  to: Day;
  decidedCycles: number;
  medianDays: number | null;
  byCycle: CycleGroupStat[];
  onTime: { counted: number; onTime: number; share: number | null };
  approvals: {
    count: number;
    firstCycleShare: number | null;
    meanCycles: number | null;
    distribution: { cycles: "1" | "2" | "3" | "4+"; count: number }[];
  };
  byMonth: MonthStat[];
}

/** The middle value; the mean of the two middle values for an even count. null for none. */
export function median(values: readonly number[]): number | null {
  if (values.length === 0) return null;
  const s = [...values].sort((a, b) => a - b);
  const mid = s.length >> 1;
  return s.length % 2 ? (s[mid] as number) : ((s[mid - 1] as number) + (s[mid] as number)) / 2;
}

const share = (part: number, whole: number) => (whole === 0 ? null : part / whole);

const GROUPS: { group: CycleGroupStat["group"]; label: string; cycle: number; test: (n: number) => boolean }[] = [
  { group: "1", label: "First review", cycle: 1, test: (n) => n === 1 },
  { group: "2", label: "Second cycle", cycle: 2, test: (n) => n === 2 },
  { group: "3+", label: "Third cycle and later", cycle: 3, test: (n) => n >= 3 },
];

/**
 * Cycles and approvals decided in [from, to] (department days). Withdrawn cycles are left
 * out: the department made no decision on them. Cycles without a due date count toward the
 * medians but not toward the on-time share.
 */
export function turnaround(
  input: { from: Day; to: Day; cycles: readonly DecidedCycle[]; approvals: readonly Approval[] },
  cal: BusinessCalendar,
  targets: ReviewTargets,
  timeZone: string = DEPARTMENT_TIME_ZONE,
): Turnaround {
  const inPeriod = (d: Date) => {
    const day = dayInZone(d, timeZone);
    return day >= input.from && day <= input.to;
  };
  const rows = input.cycles
    .filter((c) => c.outcome !== "withdrawn" && inPeriod(c.decidedAt))
    .map((c) => {
      const decided = dayInZone(c.decidedAt, timeZone);
      return {
        number: c.number,
        month: decided.slice(0, 7),
        days: Math.max(0, businessDaysBetween(dayInZone(c.receivedAt, timeZone), decided, cal)),
        onTime: c.dueAt ? decided <= dayInZone(c.dueAt, timeZone) : null,
      };
    });

  const timed = rows.filter((r) => r.onTime !== null);
  const onTime = timed.filter((r) => r.onTime).length;

  const months = [...new Set(rows.map((r) => r.month))].sort();
  const byMonth = months.map((month) => {
    const m = rows.filter((r) => r.month === month);
    const mt = m.filter((r) => r.onTime !== null);
    return { month, decided: m.length, onTimeShare: share(mt.filter((r) => r.onTime).length, mt.length), medianDays: median(m.map((r) => r.days)) };
  });

  const approvals = input.approvals.filter((a) => inPeriod(a.decidedAt));
  const dist = (test: (n: number) => boolean) => approvals.filter((a) => test(a.cycles)).length;

  return {
    from: input.from,
    to: input.to,
    decidedCycles: rows.length,
    medianDays: median(rows.map((r) => r.days)),
    byCycle: GROUPS.map((g) => {
      const days = rows.filter((r) => g.test(r.number)).map((r) => r.days);
      return { group: g.group, label: g.label, count: days.length, medianDays: median(days), targetDays: targetDays(g.cycle, targets) };
    }),
    onTime: { counted: timed.length, onTime, share: share(onTime, timed.length) },
    approvals: {
      count: approvals.length,
      firstCycleShare: share(dist((n) => n === 1), approvals.length),
      meanCycles: approvals.length ? approvals.reduce((s, a) => s + a.cycles, 0) / approvals.length : null,
      distribution: [
        { cycles: "1", count: dist((n) => n === 1) },
        { cycles: "2", count: dist((n) => n === 2) },
        { cycles: "3", count: dist((n) => n === 3) },
        { cycles: "4+", count: dist((n) => n >= 4) },
      ],
    },
    byMonth,
  };
}
