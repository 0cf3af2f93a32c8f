"use client";

import { useQuery } from "@tanstack/react-query";
import Link from "next/link";
import { ReverifyBadge, VerdictBadge } from "@/components/checks/verdict-badge";
import { buttonClass } from "@/components/ui/button";
import type { View } from "@/components/applications/workspace/types";
import { fetchJson } from "@/lib/client/fetch-json";
import type { CheckVerdict } from "@/lib/checks/verdict";

interface ChecksResponse {
  checks: {
    id: number;
    cycle: number;
    purpose: "review" | "precheck";
    memberMark: string;
    verdict: CheckVerdict;
    summary: string;
    status: "current" | "reverify";
    createdAt: string;
    createdByName: string;
    calcPage: number | null;
    comment: { id: number; number: number; status: string } | null;
  }[];
  permissions: { run: boolean; save: boolean; precheck: boolean; uploadModels: boolean };
}

/** The application's deflection checks and pre-checks, with the way to start a new one for those allowed. */
export function ApplicationChecks({ view }: { view: View }) {
  const id = view.application.id;
  const q = useQuery({ queryKey: ["checks", id], queryFn: () => fetchJson<ChecksResponse>(`/api/applications/${id}/checks`) });
  const data = q.data;
  if (q.error) return null;
  const precheck = data?.permissions.precheck;
  return (
    <section aria-labelledby="checks-title" className="mt-8">
      <div className="mb-3 flex flex-wrap items-baseline justify-between gap-3">
        <h2 id="checks-title" className="text-lg font-semibold">
          Deflection checks
        </h2>
        {data?.permissions.run ? (
          <Link href={`/applications/${id}/checks/new`} className={buttonClass("secondary")}>
            {precheck ? "Pre-check members" : "New deflection check"}
          </Link>
        ) : null}
      </div>
      {q.isLoading ? <p className="text-sm text-ink-soft">Loading…</p> : null}
      {data && data.checks.length === 0 ? (
        <p className="text-sm text-ink-soft">
          {precheck ? "No pre-checks yet. Run your members through the checker before you submit; upload member models or a CSV schedule." : "No deflection checks on this application yet."}
        </p>
      ) : null}
      {data && data.checks.length ? (
        <div className="overflow-x-auto border-y border-rule">
          <table className="w-full border-collapse text-sm">
            <caption className="sr-only">Deflection checks</caption>
            <thead>
              <tr className="border-b border-rule-strong bg-paper text-left text-xs text-ink-soft">
                <th className="px-3 py-2 font-medium">Member</th>
                <th className="px-3 py-2 font-medium">Kind</th>
                <th className="px-3 py-2 font-medium">Cycle</th>
                <th className="px-3 py-2 font-medium">Verdict</th>
                <th className="px-3 py-2 font-medium">Summary</th>
                <th className="px-3 py-2 font-medium">By</th>
                <th className="px-3 py-2 font-medium">Comment</th>
              </tr>
            </thead>
            <tbody>
              {data.checks.map((c) => (
                <tr key={c.id} className="border-b border-rule align-top last:border-b-0">
                  <td className="px-3 py-2 font-medium">
                    <Link href={`/applications/${id}/checks/${c.id}`} className="text-accent underline-offset-2 hover:underline">
                      {c.memberMark}
                    </Link>
                  </td>
                  <td className="px-3 py-2">{c.purpose === "precheck" ? "Applicant pre-check" : "Review check"}</td>
                  <td className="num px-3 py-2">{c.cycle}</td>
                  <td className="space-y-1 px-3 py-2">
                    <VerdictBadge verdict={c.verdict} />
                    {c.status === "reverify" ? (
                      <div>
                        <ReverifyBadge />
                      </div>
                    ) : null}
                  </td>
                  <td className="max-w-md px-3 py-2 text-xs text-ink-soft">{c.summary}</td>
                  <td className="px-3 py-2 text-xs">
                    {c.createdByName}
                    <br />
                    <span className="num text-ink-faint">{new Date(c.createdAt).toLocaleDateString("en-US")}</span>
                  </td>
                  <td className="num px-3 py-2">{c.comment ? `No. ${c.comment.number}${c.comment.status === "draft" ? " (draft)" : ""}` : "—"}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : null}
    </section>
  );
}
