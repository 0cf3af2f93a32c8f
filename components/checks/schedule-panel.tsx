"use client";

import { useState } from "react";
import { VerdictBadge } from "@/components/checks/verdict-badge";
import { Button } from "@/components/ui/button";
import { FormMessage } from "@/components/ui/field";
import { ApiError, fetchJson } from "@/lib/client/fetch-json";
import { bothLengths } from "@/lib/checks/quantities";
import { EXAMPLE_SCHEDULE_CSV, SCHEDULE_COLUMNS, SCHEDULE_HEADER, parseSchedule, formatRowError } from "@/lib/checks/schedule";
import type { CheckVerdict } from "@/lib/checks/verdict";
import type { CreepInterpretation } from "@/lib/solver";

interface BatchRow {
  line: number;
  mark: string;
  verdict: CheckVerdict | null;
  summary: string;
  error: string | null;
  combos: { name: string; delta_m: number; allowable_m: number; limit: string; span_over_delta: number | null; pass: boolean; near_limit: boolean; claim: { claimed_m: number; difference: number; verdict: string } | null }[];
}

/** A member schedule as CSV, checked in one batch: the header documented, an example to download, one verdict per row. */
export function SchedulePanel({ creep }: { creep: CreepInterpretation }) {
  const [csv, setCsv] = useState("");
  const [name, setName] = useState<string | null>(null);
  const [rows, setRows] = useState<BatchRow[] | null>(null);
  const [message, setMessage] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  // The same parser the server runs, so a bad header or row shows before anything is sent.
  const preview = csv.trim() ? parseSchedule(csv) : null;

  async function run() {
    setBusy(true);
    setMessage(null);
    try {
      const r = await fetchJson<{ rows: BatchRow[] }>("/api/checks/batch", { method: "POST", json: { csv, options: { creep } } });
      setRows(r.rows);
    } catch (e) {
      setRows(null);
      setMessage(e instanceof ApiError ? e.message : "The schedule could not be checked.");
    } finally {
      setBusy(false);
    }
  }

  return (
    <div>
      <details className="mb-3 border border-rule bg-sheet p-3" open>
        <summary className="cursor-pointer text-sm font-semibold">The schedule&apos;s columns</summary>
        <p className="mt-2 text-sm">
          The first line is the header, exactly <code className="num bg-paper px-1">{SCHEDULE_HEADER}</code> (in any order; <code className="num">material</code> may be added). One member per line; each is checked as a single
          span, cantilever or fixed-end beam.
        </p>
        <table className="mt-2 w-full border-collapse text-sm">
          <thead>
            <tr className="border-b border-rule-strong text-left text-xs text-ink-soft">
              <th className="px-2 py-1 font-medium">Column</th>
              <th className="px-2 py-1 font-medium">What it holds</th>
              <th className="px-2 py-1 font-medium">Example</th>
            </tr>
          </thead>
          <tbody>
            {SCHEDULE_COLUMNS.map((c) => (
              <tr key={c.name} className="border-b border-rule align-top">
                <td className="num px-2 py-1">
                  {c.name}
                  {c.required ? "" : " (optional)"}
                </td>
                <td className="px-2 py-1">{c.help}</td>
                <td className="num px-2 py-1">{c.example}</td>
              </tr>
            ))}
          </tbody>
        </table>
        <a className="mt-2 inline-block text-sm text-accent underline-offset-2 hover:underline" download="member-schedule-example.csv" href={`data:text/csv;charset=utf-8,${encodeURIComponent(EXAMPLE_SCHEDULE_CSV)}`}>
          Download an example schedule (CSV)
        </a>
      </details>

      <div className="flex flex-wrap items-end gap-3">
        <label className="text-sm">
          <span className="block font-medium">Member schedule (CSV)</span>
          <input
            type="file"
            accept=".csv,text/csv"
            aria-label="Choose a member schedule (CSV)"
            className="mt-1 text-sm"
            onChange={async (e) => {
              const f = e.target.files?.[0];
              if (!f) return;
              setName(f.name);
              setRows(null);
              setCsv(await f.text());
            }}
          />
        </label>
        <Button type="button" variant="quiet" onClick={() => { setCsv(EXAMPLE_SCHEDULE_CSV); setName("example"); setRows(null); }}>
          Try the example
        </Button>
      </div>
      <label className="mt-2 block text-sm">
        <span className="font-medium">Or paste it</span>
        <textarea aria-label="Member schedule text" value={csv} onChange={(e) => { setCsv(e.target.value); setRows(null); }} rows={6} className="num mt-1 block w-full rounded-sm border border-rule-strong bg-sheet px-2 py-1 text-xs" spellCheck={false} />
      </label>
      {name ? <p className="mt-1 text-xs text-ink-soft">Loaded {name}.</p> : null}
      {preview && !preview.ok ? <FormMessage kind="error">{preview.message}</FormMessage> : null}
      {preview && preview.ok && preview.errors.length ? (
        <div className="mt-2 border-l-4 border-warn bg-warn-wash px-3 py-2 text-sm">
          <p className="font-medium">These lines will not run:</p>
          <ul className="ml-5 list-disc">
            {preview.errors.map((e) => (
              <li key={e.line}>{formatRowError(e)}</li>
            ))}
          </ul>
        </div>
      ) : null}
      {message ? <FormMessage kind="error">{message}</FormMessage> : null}
      <div className="mt-3">
        <Button type="button" onClick={run} disabled={busy || !preview || !preview.ok}>
          {busy ? "Checking…" : `Check the schedule${preview?.ok ? ` (${preview.rows.length} members)` : ""}`}
        </Button>
      </div>
      {rows ? (
        <div className="mt-4 overflow-x-auto">
          <table className="w-full border-collapse text-sm" aria-label="Schedule verdicts">
            <thead>
              <tr className="border-b border-rule-strong text-left text-xs text-ink-soft">
                <th className="px-2 py-1 font-medium">Line</th>
                <th className="px-2 py-1 font-medium">Mark</th>
                <th className="px-2 py-1 font-medium">Verdict</th>
                <th className="px-2 py-1 font-medium">Combinations (computed vs limit; claim)</th>
              </tr>
            </thead>
            <tbody>
              {rows.map((r) => (
                <tr key={r.line} className="border-b border-rule align-top">
                  <td className="num px-2 py-1">{r.line}</td>
                  <td className="whitespace-nowrap px-2 py-1 font-medium">{r.mark}</td>
                  <td className="px-2 py-1">{r.verdict ? <VerdictBadge verdict={r.verdict} /> : <span className="text-xs font-medium text-bad">not checked</span>}</td>
                  <td className="px-2 py-1">
                    {r.error ? <p className="text-xs text-bad">{r.error}</p> : null}
                    <ul className="space-y-0.5">
                      {r.combos.map((c) => (
                        <li key={c.name} className="num text-xs">
                          <span className="font-medium">{c.name}</span> {bothLengths(c.delta_m)} {c.pass ? "≤" : ">"} {c.limit} = {bothLengths(c.allowable_m)}
                          {c.span_over_delta ? ` (l/${Math.round(c.span_over_delta)})` : ""}
                          {c.near_limit ? " · near limit" : ""}
                          {c.claim ? ` · claimed ${bothLengths(c.claim.claimed_m)}, ${(100 * c.claim.difference).toFixed(1)} %: ${c.claim.verdict}` : ""}
                        </li>
                      ))}
                    </ul>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : null}
    </div>
  );
}
