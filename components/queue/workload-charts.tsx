"use client";

import { keepPreviousData, useQuery } from "@tanstack/react-query";
import { useState, type ReactNode } from "react";
import { Bar, BarChart, CartesianGrid, ComposedChart, Legend, Line, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { FormMessage } from "@/components/ui/field";
import { fetchJson } from "@/lib/client/fetch-json";
import type { ReviewTargets, Turnaround } from "@/lib/review-clock";
import { formatDay, shiftDays } from "@/lib/review-clock";

interface Workload {
  today: string;
  examiners: { id: number; name: string; role: string; open: number; overdue: number; dueThisWeek: number }[];
  totals: { open: number; overdue: number; dueThisWeek: number };
}

const C = { accent: "var(--color-accent)", bad: "var(--color-bad)", warn: "var(--color-warn)", info: "var(--color-info)", rule: "var(--color-rule)", ink: "var(--color-ink-soft)" };
const pct = (x: number | null) => (x === null ? "—" : `${Math.round(x * 100)} %`);
const num = (x: number | null, digits = 1) => (x === null ? "—" : x.toFixed(digits).replace(/\.0$/, ""));
const monthFmt = new Intl.DateTimeFormat("en-US", { timeZone: "UTC", month: "short", year: "numeric" });
const monthLabel = (m: string) => monthFmt.format(new Date(`${m}-15T12:00:00Z`));
const input = "mt-1 block rounded-sm border border-rule-strong bg-sheet px-2 py-1 text-sm";

function Figure({ title, children, table }: { title: string; children: ReactNode; table: ReactNode }) {
  return (
    <figure className="border border-rule bg-sheet p-4">
      <figcaption className="mb-3 text-sm font-semibold">{title}</figcaption>
      <div className="h-64">{children}</div>
      <details className="mt-3 text-sm">
        <summary className="cursor-pointer text-accent">The numbers</summary>
        <div className="mt-2 overflow-x-auto">{table}</div>
      </details>
    </figure>
  );
}

function Tile({ label, value, note }: { label: string; value: string; note?: string }) {
  return (
    <div className="border border-rule bg-sheet px-4 py-3">
      <div className="text-xs text-ink-soft">{label}</div>
      <div className="num mt-1 text-2xl font-semibold">{value}</div>
      {note ? <div className="mt-1 text-xs text-ink-faint">{note}</div> : null}
    </div>
  );
}

function SimpleTable({ caption, head, rows }: { caption: string; head: string[]; rows: (string | number)[][] }) {
  return (
    <table className="w-full border-collapse text-xs">
      <caption className="sr-only">{caption}</caption>
      <thead>
        <tr className="border-b border-rule text-left text-ink-soft">
          {head.map((h) => (
            <th key={h} scope="col" className="py-1 pr-3 font-medium">{h}</th>
          ))}
        </tr>
      </thead>
      <tbody>
        {rows.map((r, i) => (
          <tr key={i} className="border-b border-rule last:border-b-0">
            {r.map((c, j) => (
              <td key={j} className={`py-1 pr-3 ${j ? "num" : ""}`}>{c}</td>
            ))}
          </tr>
        ))}
      </tbody>
    </table>
  );
}

export function WorkloadCharts({ today, defaultFrom }: { today: string; defaultFrom: string }) {
  const [period, setPeriod] = useState({ from: defaultFrom, to: today });
  const workload = useQuery({ queryKey: ["workload"], queryFn: () => fetchJson<Workload>("/api/stats/workload"), refetchInterval: 60_000 });
  const turn = useQuery({
    queryKey: ["turnaround", period.from, period.to],
    queryFn: () => fetchJson<Turnaround & { targets: ReviewTargets }>(`/api/stats/turnaround?from=${period.from}&to=${period.to}`),
    placeholderData: keepPreviousData,
  });
  const t = turn.data;
  const w = workload.data;

  return (
    <div className="space-y-8">
      <section aria-labelledby="workload-title">
        <h2 id="workload-title" className="mb-3 text-lg font-semibold">Workload today</h2>
        {workload.isError ? <FormMessage kind="error">{workload.error.message}</FormMessage> : null}
        {w ? (
          <>
            <div className="mb-4 grid gap-3 sm:grid-cols-3">
              <Tile label="Open reviews" value={String(w.totals.open)} />
              <Tile label="Overdue" value={String(w.totals.overdue)} note="past the due date, no decision" />
              <Tile label="Due this week" value={String(w.totals.dueThisWeek)} note="by Sunday, not yet overdue" />
            </div>
            <Figure
              title="Open, overdue and due this week, per plans examiner"
              table={<SimpleTable caption="Workload per examiner" head={["Examiner", "Open", "Overdue", "Due this week"]} rows={w.examiners.map((e) => [e.name, e.open, e.overdue, e.dueThisWeek])} />}
            >
              <ResponsiveContainer width="100%" height="100%">
                <BarChart data={w.examiners} margin={{ top: 4, right: 8, bottom: 4, left: 0 }}>
                  <CartesianGrid stroke={C.rule} vertical={false} />
                  <XAxis dataKey="name" tick={{ fontSize: 12 }} />
                  <YAxis allowDecimals={false} tick={{ fontSize: 12 }} />
                  <Tooltip />
                  <Legend wrapperStyle={{ fontSize: 12 }} itemSorter={null} />
                  <Bar dataKey="open" name="Open" fill={C.accent} />
                  <Bar dataKey="overdue" name="Overdue" fill={C.bad} />
                  <Bar dataKey="dueThisWeek" name="Due this week" fill={C.warn} />
                </BarChart>
              </ResponsiveContainer>
            </Figure>
          </>
        ) : (
          <p className="text-sm text-ink-soft">Loading…</p>
        )}
      </section>

      <section aria-labelledby="turnaround-title">
        <h2 id="turnaround-title" className="mb-3 text-lg font-semibold">Turnaround</h2>
        <div className="mb-4 flex flex-wrap items-end gap-3" role="group" aria-label="Period">
          <label className="text-sm">
            <span className="font-medium">From</span>
            <input type="date" value={period.from} max={period.to} onChange={(e) => e.target.value && setPeriod((p) => ({ ...p, from: e.target.value }))} className={input} />
          </label>
          <label className="text-sm">
            <span className="font-medium">To</span>
            <input type="date" value={period.to} min={period.from} max={today} onChange={(e) => e.target.value && setPeriod((p) => ({ ...p, to: e.target.value }))} className={input} />
          </label>
          {[30, 90, 365].map((n) => (
            <button key={n} type="button" onClick={() => setPeriod({ from: shiftDays(today, -(n - 1)), to: today })} className="rounded-sm border border-rule-strong px-2 py-1 text-sm hover:border-ink-soft">
              Last {n} days
            </button>
          ))}
          <span className="text-sm text-ink-soft" aria-live="polite">
            {formatDay(period.from)} – {formatDay(period.to)}
          </span>
        </div>
        {turn.isError ? <FormMessage kind="error">{turn.error.message}</FormMessage> : null}
        {t ? (
          <>
            <div className="mb-4 grid gap-3 sm:grid-cols-2 lg:grid-cols-5">
              <Tile label="Review cycles decided" value={String(t.decidedCycles)} />
              <Tile label="Median days with the department" value={num(t.medianDays)} note="per cycle, business days" />
              <Tile label="Reviews on time" value={pct(t.onTime.share)} note={`${t.onTime.onTime} of ${t.onTime.counted} decided by the due date`} />
              <Tile label="Approved on the first cycle" value={pct(t.approvals.firstCycleShare)} note={`of ${t.approvals.count} approvals`} />
              <Tile label="Cycles per approval" value={num(t.approvals.meanCycles, 2)} note="mean" />
            </div>
            <div className="grid gap-4 lg:grid-cols-2">
              <Figure
                title="Median business days with the department, per cycle, against the target"
                table={<SimpleTable caption="Median days per cycle" head={["Cycle", "Decided", "Median days", "Target"]} rows={t.byCycle.map((g) => [g.label, g.count, num(g.medianDays), g.targetDays])} />}
              >
                <ResponsiveContainer width="100%" height="100%">
                  <BarChart data={t.byCycle.map((g) => ({ ...g, medianDays: g.medianDays ?? 0 }))} margin={{ top: 4, right: 8, bottom: 4, left: 0 }}>
                    <CartesianGrid stroke={C.rule} vertical={false} />
                    <XAxis dataKey="label" tick={{ fontSize: 12 }} />
                    <YAxis allowDecimals={false} tick={{ fontSize: 12 }} />
                    <Tooltip />
                    <Legend wrapperStyle={{ fontSize: 12 }} itemSorter={null} />
                    <Bar dataKey="medianDays" name="Median days" fill={C.accent} />
                    <Bar dataKey="targetDays" name="Target" fill={C.ink} fillOpacity={0.35} stroke={C.ink} />
                  </BarChart>
                </ResponsiveContainer>
              </Figure>
              <Figure
                title="Review cycles it took to approve"
                table={<SimpleTable caption="Cycles per approval" head={["Cycles", "Approvals"]} rows={t.approvals.distribution.map((d) => [d.cycles, d.count])} />}
              >
                <ResponsiveContainer width="100%" height="100%">
                  <BarChart data={t.approvals.distribution} margin={{ top: 4, right: 8, bottom: 4, left: 0 }}>
                    <CartesianGrid stroke={C.rule} vertical={false} />
                    <XAxis dataKey="cycles" tick={{ fontSize: 12 }} label={{ value: "cycles", position: "insideBottomRight", offset: -2, fontSize: 12 }} />
                    <YAxis allowDecimals={false} tick={{ fontSize: 12 }} />
                    <Tooltip />
                    <Bar dataKey="count" name="Approvals" fill={C.info} />
                  </BarChart>
                </ResponsiveContainer>
              </Figure>
              <Figure
                title="Month by month: median days with the department and share on time"
                table={
                  <SimpleTable
                    caption="Turnaround by month"
                    head={["Month", "Decided", "Median days", "On time"]}
                    rows={t.byMonth.map((m) => [monthLabel(m.month), m.decided, num(m.medianDays), pct(m.onTimeShare)])}
                  />
                }
              >
                <ResponsiveContainer width="100%" height="100%">
                  <ComposedChart data={t.byMonth.map((m) => ({ ...m, label: monthLabel(m.month), onTimePct: m.onTimeShare === null ? null : Math.round(m.onTimeShare * 100) }))} margin={{ top: 4, right: 8, bottom: 4, left: 0 }}>
                    <CartesianGrid stroke={C.rule} vertical={false} />
                    <XAxis dataKey="label" tick={{ fontSize: 12 }} />
                    <YAxis yAxisId="days" allowDecimals={false} tick={{ fontSize: 12 }} />
                    <YAxis yAxisId="pct" orientation="right" domain={[0, 100]} unit=" %" tick={{ fontSize: 12 }} />
                    <Tooltip />
                    <Legend wrapperStyle={{ fontSize: 12 }} itemSorter={null} />
                    <Bar yAxisId="days" dataKey="medianDays" name="Median days" fill={C.accent} />
                    <Line yAxisId="pct" dataKey="onTimePct" name="On time (%)" stroke={C.bad} strokeWidth={2} dot />
                  </ComposedChart>
                </ResponsiveContainer>
              </Figure>
            </div>
          </>
        ) : (
          <p className="text-sm text-ink-soft">Loading…</p>
        )}
      </section>
    </div>
  );
}
