"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { ResultView } from "@/components/checks/result-view";
import { ReverifyBadge, VerdictBadge } from "@/components/checks/verdict-badge";
import { Button, buttonClass } from "@/components/ui/button";
import { FormMessage } from "@/components/ui/field";
import { ApiError, fetchJson } from "@/lib/client/fetch-json";
import { CREEP_LABELS } from "@/lib/checks/claims";
import type { CheckVerdict } from "@/lib/checks/verdict";
import type { CreepInterpretation, SolveResult } from "@/lib/solver";

export interface SavedCheckView {
  application: { id: number; number: string | null; siteAddress: string; state: string; cycle: number };
  check: {
    id: number;
    cycle: number;
    purpose: "review" | "precheck";
    memberMark: string;
    sheet: { id: number; sheetNumber: string | null; title: string } | null;
    calcDocument: { id: number; originalName: string; cycle: number; kind: string } | null;
    calcPage: number | null;
    model: unknown;
    options: { creep: CreepInterpretation; limits: string };
    solverVersion: string;
    result: SolveResult;
    verdict: CheckVerdict;
    summary: string;
    status: "current" | "reverify";
    createdAt: string;
    createdByName: string;
  };
  comment: { id: number; number: number; status: string } | null;
  permissions: { comment: boolean; rerun: boolean; recheck: boolean };
  currentSolverVersion: string;
}

interface Rerun {
  identical: boolean;
  differences: string[];
  storedSolverVersion: string;
  solverVersion: string;
  verdict: CheckVerdict;
}

/** A saved check exactly as stored; "Re-run" solves the stored model again and compares, without changing the record. */
export function SavedCheck({ view }: { view: SavedCheckView }) {
  const router = useRouter();
  const { check: c, application: a } = view;
  const [rerun, setRerun] = useState<Rerun | null>(null);
  const [message, setMessage] = useState<{ kind: "error" | "ok" | "info"; text: string } | null>(null);
  const [busy, setBusy] = useState<"rerun" | "comment" | null>(null);
  const base = `/api/applications/${a.id}/checks/${c.id}`;

  async function doRerun() {
    setBusy("rerun");
    setMessage(null);
    try {
      setRerun(await fetchJson<Rerun>(`${base}/rerun`, { method: "POST" }));
    } catch (e) {
      setMessage({ kind: "error", text: e instanceof ApiError ? e.message : "The re-run failed." });
    } finally {
      setBusy(null);
    }
  }

  async function toComment() {
    setBusy("comment");
    setMessage(null);
    try {
      const r = await fetchJson<{ comment: { id: number; number: number } }>(`${base}/comment`, { method: "POST" });
      setMessage({ kind: "ok", text: `Correction comment ${r.comment.number} drafted in cycle ${a.cycle}; it goes to the applicant when the correction list is issued.` });
      router.refresh();
    } catch (e) {
      setMessage({ kind: "error", text: e instanceof ApiError ? e.message : "The comment could not be made." });
    } finally {
      setBusy(null);
    }
  }

  const modelHref = `data:application/json;charset=utf-8,${encodeURIComponent(JSON.stringify(c.model, null, 2))}`;
  return (
    <div>
      <header className="mb-4 border-b border-rule pb-3">
        <p className="text-sm">
          <Link href={`/applications/${a.id}`} className="text-accent underline-offset-2 hover:underline">
            ← {a.number} {a.siteAddress}
          </Link>
        </p>
        <div className="mt-1 flex flex-wrap items-center gap-3">
          <h1 className="text-2xl font-semibold">
            {c.purpose === "precheck" ? "Pre-check" : "Deflection check"} of {c.memberMark}
          </h1>
          <VerdictBadge verdict={c.verdict} />
          {c.status === "reverify" ? <ReverifyBadge /> : null}
        </div>
        <dl className="mt-2 grid gap-x-4 gap-y-0.5 text-sm sm:grid-cols-[10rem_1fr]">
          <dt className="text-ink-soft">Check</dt>
          <dd className="num">
            #{c.id}, review cycle {c.cycle}, {c.createdByName}, {new Date(c.createdAt).toLocaleString("en-US", { dateStyle: "medium", timeStyle: "short" })}
          </dd>
          <dt className="text-ink-soft">From</dt>
          <dd>
            {c.sheet ? `sheet ${c.sheet.sheetNumber ?? "?"} (${c.sheet.title})` : "no sheet given"}
            {c.calcDocument ? `; ${c.calcDocument.originalName} (cycle ${c.calcDocument.cycle})` : ""}
            {c.calcPage ? `, calc page ${c.calcPage}` : ""}
          </dd>
          <dt className="text-ink-soft">Options</dt>
          <dd>
            {CREEP_LABELS[c.options.creep] ?? c.options.creep}; {c.options.limits}
          </dd>
          <dt className="text-ink-soft">Solver</dt>
          <dd className="num">
            {c.solverVersion}
            {c.solverVersion !== view.currentSolverVersion ? <span className="ml-2 text-warn">(the checker is now {view.currentSolverVersion}; this page shows the stored result)</span> : null}
          </dd>
        </dl>
        {c.status === "reverify" ? (
          <p className="mt-2 border-l-4 border-warn bg-warn-wash px-3 py-2 text-sm">
            Re-verify: the calculation package this check rests on has been replaced by a resubmittal. Check the member again against the revised calculation.
          </p>
        ) : null}
        <div className="no-print mt-3 flex flex-wrap gap-2">
          <Button type="button" variant="secondary" onClick={doRerun} disabled={busy !== null}>
            {busy === "rerun" ? "Re-running…" : "Re-run"}
          </Button>
          {view.permissions.comment ? (
            <Button type="button" onClick={toComment} disabled={busy !== null}>
              {busy === "comment" ? "Writing…" : "Make a correction comment"}
            </Button>
          ) : null}
          <Link href={`/applications/${a.id}/checks/${c.id}/report`} className={buttonClass("secondary")}>
            Printable report
          </Link>
          {view.permissions.recheck ? (
            <Link href={`/applications/${a.id}/checks/new?from=${c.id}`} className={buttonClass("quiet")}>
              Check again from this model
            </Link>
          ) : null}
          <a href={modelHref} download={`check-${c.id}-${c.memberMark.replace(/[^\w-]+/g, "_")}.model.json`} className={buttonClass("quiet")}>
            Download the model file
          </a>
        </div>
        {view.comment ? (
          <p className="mt-2 text-sm">
            Made into correction comment{" "}
            <Link href={`/applications/${a.id}#comment-${view.comment.id}`} className="font-medium text-accent underline-offset-2 hover:underline">
              No. {view.comment.number}
            </Link>{" "}
            ({view.comment.status === "draft" ? "draft, not yet issued" : view.comment.status}).
          </p>
        ) : null}
        {message ? <FormMessage kind={message.kind}>{message.text}</FormMessage> : null}
        {rerun ? (
          <div role="status" className={`mt-2 border-l-4 px-3 py-2 text-sm ${rerun.identical ? "border-ok bg-ok-wash" : "border-warn bg-warn-wash"}`} data-testid="rerun-outcome">
            {rerun.identical ? (
              <p>
                <span aria-hidden="true">✓ </span>Re-run with {rerun.solverVersion}: every number is identical to the stored result.
              </p>
            ) : (
              <>
                <p className="font-medium">
                  Re-run with {rerun.solverVersion} (stored: {rerun.storedSolverVersion}) differs from the stored result in {rerun.differences.length}
                  {rerun.differences.length >= 20 ? "+" : ""} place(s); the stored result is unchanged. Verdict now: {rerun.verdict.replace("_", " ")}.
                </p>
                <ul className="num ml-5 list-disc text-xs">
                  {rerun.differences.map((d) => (
                    <li key={d}>{d}</li>
                  ))}
                </ul>
              </>
            )}
          </div>
        ) : null}
      </header>
      <p className="mb-3 text-sm text-ink-soft">{c.summary}</p>
      <ResultView result={c.result} model={c.model} />
      <details className="mt-4 border border-rule bg-sheet p-3">
        <summary className="cursor-pointer text-sm font-semibold">The model file, as stored</summary>
        <pre className="num mt-2 max-h-96 overflow-auto text-xs">{JSON.stringify(c.model, null, 2)}</pre>
      </details>
    </div>
  );
}
