import type { ReactNode } from "react";
import {
  clockStatus,
  clockTotals,
  dayInZone,
  formatDay,
  formatDayWithWeekday,
  makeCalendar,
  plural,
  type Day,
} from "@/lib/review-clock";
import { STATE_INFO, type State } from "@/lib/workflow";
import { ClockBadge } from "./clock-badge";

export interface ClockCycle {
  number: number;
  /** ISO instant the cycle was received (the clock starts) */
  receivedAt: string;
  /** ISO instant: the end of the due day in the department's time zone */
  dueAt: string | null;
  /** ISO instant of the cycle's decision (corrections issued, approval, withdrawal) */
  decidedAt: string | null;
}

const day = (iso: string | null): Day | null => (iso ? dayInZone(new Date(iso)) : null);

/**
 * The review clock of one application: due date and business days left or overdue while the
 * department holds it; days with the department vs. days with the applicant so far. Plain
 * rendering, usable from server and client components alike.
 */
export function ClockSummary({ cycles, state, today, holidays }: { cycles: ClockCycle[]; state: State; today?: string; holidays?: string[] }) {
  const cal = makeCalendar(holidays ?? []);
  const now: Day = today ?? dayInZone(new Date());
  const info = STATE_INFO[state];
  const spans = [...cycles]
    .sort((a, b) => a.number - b.number)
    .map((c) => ({ number: c.number, receivedDay: day(c.receivedAt) as Day, dueDay: day(c.dueAt), decidedDay: day(c.decidedAt) }));
  const current = spans.at(-1);
  const totals = clockTotals(spans, now, cal, info.holder === "applicant" && Boolean(current?.decidedDay));

  let headline: ReactNode;
  if (!current) {
    headline = (
      <p className="flex flex-wrap items-center gap-2 text-sm">
        <ClockBadge status={{ kind: "not_started" }} />
        <span className="text-ink-soft">{state === "submitted" ? "The clock starts when intake accepts the file for plan review." : "The clock starts when the file is accepted for plan review."}</span>
      </p>
    );
  } else if (info.reviewClock && !current.decidedDay) {
    const status = clockStatus(current.dueDay, now, cal);
    headline = (
      <p className="flex flex-wrap items-center gap-2 text-sm">
        <span>
          Cycle <span className="num">{current.number}</span> due <strong className="num">{formatDayWithWeekday(current.dueDay)}</strong>
          {current.dueDay ? <span className="num text-ink-soft">, {current.dueDay.slice(0, 4)}</span> : null}
        </span>
        <ClockBadge status={status} />
      </p>
    );
  } else if (info.holder === "applicant" && current.decidedDay) {
    headline = (
      <p className="flex flex-wrap items-center gap-2 text-sm">
        <ClockBadge status={{ kind: "stopped" }} label="Clock stopped" />
        <span>
          Corrections with the applicant since <span className="num">{formatDay(current.decidedDay)}</span>
        </span>
      </p>
    );
  } else {
    const last = totals.cycles.at(-1);
    headline = (
      <p className="flex flex-wrap items-center gap-2 text-sm">
        <ClockBadge status={{ kind: "stopped" }} label={info.final ? "Decided" : "Clock stopped"} />
        {current.decidedDay ? (
          <span>
            Cycle <span className="num">{current.number}</span> decided <span className="num">{formatDay(current.decidedDay)}</span>
            {last?.onTime === true ? ", on time" : last?.onTime === false ? ", after its due date" : ""}
          </span>
        ) : null}
      </p>
    );
  }

  return (
    <section aria-label="Review clock" className="border border-rule bg-sheet px-4 py-3">
      <h3 className="mb-2 text-sm font-semibold">Review clock</h3>
      {headline}
      {spans.length ? (
        <>
          <dl className="mt-3 grid grid-cols-2 gap-x-6 gap-y-1 text-sm sm:max-w-md">
            <dt className="text-ink-soft">With the department</dt>
            <dd className="num" data-testid="days-with-department">{plural(totals.departmentDays, "business day")}</dd>
            <dt className="text-ink-soft">With the applicant</dt>
            <dd className="num" data-testid="days-with-applicant">{plural(totals.applicantDays, "business day")}</dd>
          </dl>
          <table className="mt-3 w-full border-collapse text-xs">
            <caption className="sr-only">Clock per review cycle</caption>
            <thead>
              <tr className="border-b border-rule text-left text-ink-soft">
                <th scope="col" className="py-1 pr-3 font-medium">Cycle</th>
                <th scope="col" className="py-1 pr-3 font-medium">Received</th>
                <th scope="col" className="py-1 pr-3 font-medium">Due</th>
                <th scope="col" className="py-1 pr-3 font-medium">Decided</th>
                <th scope="col" className="py-1 pr-3 font-medium">With department</th>
                <th scope="col" className="py-1 font-medium">Then with applicant</th>
              </tr>
            </thead>
            <tbody>
              {totals.cycles.map((c, i) => {
                const s = spans[i]!;
                return (
                  <tr key={c.number} className="border-b border-rule last:border-b-0">
                    <td className="num py-1 pr-3">{c.number}</td>
                    <td className="num py-1 pr-3">{formatDay(s.receivedDay)}</td>
                    <td className="num py-1 pr-3">{formatDay(s.dueDay)}</td>
                    <td className="num py-1 pr-3">
                      {s.decidedDay ? formatDay(s.decidedDay) : "running"}
                      {c.onTime === false ? <span className="ml-1 text-bad">(late)</span> : null}
                    </td>
                    <td className="num py-1 pr-3">{c.departmentDays}</td>
                    <td className="num py-1">{s.decidedDay ? c.applicantDaysAfter : "—"}</td>
                  </tr>
                );
              })}
            </tbody>
          </table>
          <p className="mt-2 text-xs text-ink-faint">Business days; weekends and the department&apos;s holidays are not counted.</p>
        </>
      ) : null}
    </section>
  );
}
