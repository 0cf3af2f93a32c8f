"use client";

import { useQuery } from "@tanstack/react-query";
import { useState } from "react";
import { fetchJson } from "@/lib/client/fetch-json";
import type { Found } from "@/lib/checks/suggestions";

interface SuggestionsResponse {
  documents: { id: number; name: string; cycle: number; pageCount: number }[];
  documentId: number | null;
  pageCount: number;
  suggestions: Found[];
  message: string | null;
}

const KIND_LABEL: Record<Found["kind"], string> = {
  span: "Span",
  trib: "Tributary width",
  "line-load": "Line load",
  "point-load": "Point load",
  "area-load": "Area load",
  section: "Section",
  material: "Material",
  E: "E",
  I: "I",
  deflection: "Claimed deflection",
};

/**
 * What the calc package's text layer says, beside the form. Suggestions only: a value goes
 * into the form when the examiner clicks "Use", never by itself.
 */
export function SuggestionsPanel({ applicationId, mark, onUse, canUse }: { applicationId: number; mark: string; onUse: (s: Found, documentId: number) => void; canUse: (s: Found) => boolean }) {
  const [documentId, setDocumentId] = useState<number | null>(null);
  const [onlyMark, setOnlyMark] = useState(true);
  const q = useQuery({
    queryKey: ["check-suggestions", applicationId, documentId],
    queryFn: () => fetchJson<SuggestionsResponse>(`/api/applications/${applicationId}/checks/suggestions${documentId ? `?documentId=${documentId}` : ""}`),
    staleTime: 5 * 60_000,
  });
  const data = q.data;
  const trimmed = mark.trim().toUpperCase();
  const list = (data?.suggestions ?? []).filter((s) => !onlyMark || !trimmed || s.mark === null || s.mark.toUpperCase() === trimmed);
  const pages = [...new Set(list.map((s) => s.page))];
  const doc = data?.documents.find((d) => d.id === data.documentId);
  return (
    <section aria-labelledby="suggestions-title" className="border border-rule bg-sheet p-3">
      <h2 id="suggestions-title" className="text-base font-semibold">
        From the calculation package
      </h2>
      <p className="mb-2 text-xs text-ink-soft">Read from the PDF&apos;s text layer. Suggestions only: nothing enters the form until you click “Use”.</p>
      {q.isLoading ? <p className="text-sm text-ink-soft">Reading the calculation package…</p> : null}
      {q.error ? <p className="text-sm text-bad">{q.error.message}</p> : null}
      {data && data.documents.length > 1 ? (
        <label className="mb-2 block text-xs">
          <span className="font-medium text-ink-soft">Package</span>
          <select className="mt-0.5 block w-full rounded-sm border border-rule-strong bg-sheet px-1.5 py-1 text-sm" value={data.documentId ?? ""} onChange={(e) => setDocumentId(Number(e.target.value))}>
            {data.documents.map((d) => (
              <option key={d.id} value={d.id}>
                {d.name} (cycle {d.cycle})
              </option>
            ))}
          </select>
        </label>
      ) : doc ? (
        <p className="mb-2 text-xs">
          {doc.name}, cycle <span className="num">{doc.cycle}</span>, <span className="num">{doc.pageCount}</span> pages
        </p>
      ) : null}
      {data?.message ? <p className="text-sm text-ink-soft">{data.message}</p> : null}
      {data && data.suggestions.length ? (
        <label className="mb-2 inline-flex items-center gap-2 text-xs">
          <input type="checkbox" checked={onlyMark} onChange={(e) => setOnlyMark(e.target.checked)} className="accent-accent" />
          Only lines about {trimmed || "this member"} (and general criteria)
        </label>
      ) : null}
      <div className="max-h-[70vh] space-y-3 overflow-y-auto pr-1">
        {pages.map((p) => (
          <div key={p}>
            <p className="mb-1 flex items-baseline justify-between text-xs font-medium text-ink-soft">
              <span>Calc page {p}</span>
              {data?.documentId ? (
                <a className="text-accent underline-offset-2 hover:underline" href={`/api/documents/${data.documentId}/file#page=${p}`} target="_blank" rel="noreferrer">
                  open page
                </a>
              ) : null}
            </p>
            <ul className="space-y-1" aria-label={`Suggestions on calc page ${p}`}>
              {list
                .filter((s) => s.page === p)
                .map((s) => (
                  <li key={s.id} className="flex items-start justify-between gap-2 border-b border-rule pb-1 text-sm">
                    <div className="min-w-0">
                      <p>
                        <span className="text-xs text-ink-soft">{KIND_LABEL[s.kind]}</span>{" "}
                        <span className="num">{s.label.replace(/^(Span|Tributary width|Line load|Point load|Area load|Section|E =|I =|Claimed Δ)\s*/, "")}</span>
                        {s.mark ? <span className="ml-1 text-xs text-ink-faint">({s.mark})</span> : null}
                      </p>
                      <p className="truncate text-xs text-ink-faint" title={s.line}>
                        “{s.line}”
                      </p>
                    </div>
                    <button
                      type="button"
                      className="shrink-0 rounded-sm border border-rule-strong px-2 py-0.5 text-xs hover:border-accent disabled:opacity-40"
                      disabled={!canUse(s)}
                      onClick={() => data?.documentId && onUse(s, data.documentId)}
                      aria-label={`Use ${s.label}`}
                      title={canUse(s) ? "Drop this value into the form" : "Open the beam form to drop this in"}
                    >
                      Use
                    </button>
                  </li>
                ))}
            </ul>
          </div>
        ))}
      </div>
    </section>
  );
}
