"use client";

import { keepPreviousData, useQuery } from "@tanstack/react-query";
import { flexRender, getCoreRowModel, useReactTable, type ColumnDef, type SortingState } from "@tanstack/react-table";
import Link from "next/link";
import { useState } from "react";
import { FormMessage } from "@/components/ui/field";
import { fetchJson } from "@/lib/client/fetch-json";
import { STATES, stateLabel, type State } from "@/lib/workflow";
import { StateBadge } from "./state-badge";
import { SortableTh } from "@/components/ui/sortable-th";

interface Row {
  id: number;
  number: string | null;
  state: State;
  cycle: number;
  siteAddress: string;
  workDescription: string;
  submittedAt: string | null;
  updatedAt: string;
  applicantName: string;
  firmName: string | null;
  examinerName: string | null;
}

type Scope = "mine" | "intake" | "reviews" | "all";
const SORT_KEYS: Record<string, string> = { number: "number", siteAddress: "address", state: "state", submittedAt: "submitted", updatedAt: "updated" };

const fmtDate = (s: string | null) => (s ? new Date(s).toLocaleDateString("en-US", { year: "numeric", month: "short", day: "numeric" }) : "—");

export function ApplicationsTable({ scope, showApplicant = true, caption }: { scope: Scope; showApplicant?: boolean; caption: string }) {
  const [sorting, setSorting] = useState<SortingState>([{ id: scope === "intake" ? "submittedAt" : "updatedAt", desc: scope !== "intake" }]);
  const [q, setQ] = useState("");
  const [state, setState] = useState("");
  const [page, setPage] = useState(1);
  const sort = sorting[0];
  const params = new URLSearchParams({
    scope,
    sort: SORT_KEYS[sort?.id ?? "updatedAt"] ?? "updated",
    dir: sort?.desc ? "desc" : "asc",
    page: String(page),
    pageSize: "25",
    ...(q ? { q } : {}),
    ...(state ? { state } : {}),
  });
  const query = useQuery({
    queryKey: ["applications", params.toString()],
    queryFn: () => fetchJson<{ rows: Row[]; hasMore: boolean; total: number }>(`/api/applications?${params}`),
    placeholderData: keepPreviousData,
    refetchInterval: 30_000,
  });

  const columns: ColumnDef<Row, unknown>[] = [
    {
      id: "number",
      header: "Application",
      cell: (c) => (
        <Link href={`/applications/${c.row.original.id}`} className="num font-medium text-accent underline-offset-2 hover:underline">
          {c.row.original.number}
        </Link>
      ),
    },
    {
      id: "siteAddress",
      header: "Site and work",
      cell: (c) => (
        <div>
          <div>{c.row.original.siteAddress}</div>
          <div className="line-clamp-1 text-xs text-ink-soft">{c.row.original.workDescription}</div>
        </div>
      ),
    },
    ...(showApplicant
      ? [{ id: "applicant", header: "Applicant", enableSorting: false, cell: (c: { row: { original: Row } }) => <span>{c.row.original.firmName ?? c.row.original.applicantName}</span> } as ColumnDef<Row, unknown>]
      : []),
    { id: "state", header: "Status", cell: (c) => <StateBadge state={c.row.original.state} /> },
    { id: "cycle", header: "Cycle", enableSorting: false, cell: (c) => <span className="num">{c.row.original.cycle || "—"}</span> },
    { id: "examiner", header: "Plans examiner", enableSorting: false, cell: (c) => c.row.original.examinerName ?? "—" },
    { id: "submittedAt", header: "Submitted", cell: (c) => <span className="num text-xs">{fmtDate(c.row.original.submittedAt)}</span> },
    { id: "updatedAt", header: "Last change", cell: (c) => <span className="num text-xs">{fmtDate(c.row.original.updatedAt)}</span> },
  ];

  const table = useReactTable({
    data: query.data?.rows ?? [],
    columns,
    state: { sorting },
    manualSorting: true,
    manualPagination: true,
    onSortingChange: (u) => {
      setSorting(u);
      setPage(1);
    },
    getCoreRowModel: getCoreRowModel(),
  });

  return (
    <div>
      <div className="mb-3 flex flex-wrap items-end gap-3">
        <label className="text-sm">
          <span className="font-medium">Search</span>
          <input
            type="search"
            value={q}
            placeholder="Number, address, parcel, work"
            onChange={(e) => {
              setQ(e.target.value);
              setPage(1);
            }}
            className="mt-1 block w-72 rounded-sm border border-rule-strong bg-sheet px-2.5 py-1.5 text-sm"
          />
        </label>
        {scope !== "intake" ? (
          <label className="text-sm">
            <span className="font-medium">Status</span>
            <select
              value={state}
              onChange={(e) => {
                setState(e.target.value);
                setPage(1);
              }}
              className="mt-1 block rounded-sm border border-rule-strong bg-sheet px-2 py-1.5 text-sm"
            >
              <option value="">Any status</option>
              {STATES.map((s) => (
                <option key={s} value={s}>
                  {stateLabel(s)}
                </option>
              ))}
            </select>
          </label>
        ) : null}
        <span className="ml-auto text-sm text-ink-soft" aria-live="polite">
          {query.data ? `${query.data.total} application${query.data.total === 1 ? "" : "s"}` : ""}
        </span>
      </div>
      {query.isError ? <FormMessage kind="error">{query.error.message}</FormMessage> : null}
      <div className="overflow-x-auto border-y border-rule">
        <table className="w-full border-collapse text-sm">
          <caption className="sr-only">{caption}</caption>
          <thead>
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id} className="border-b border-rule-strong bg-paper text-left">
                {hg.headers.map((h) => (
                  <SortableTh
                    key={h.id}
                    header={h}
                    direction={h.column.getIsSorted()}
                    onSort={h.column.getCanSort() && h.column.id in SORT_KEYS ? h.column.getToggleSortingHandler() : undefined}
                  />
                ))}
              </tr>
            ))}
          </thead>
          <tbody>
            {query.isPending ? (
              <tr><td colSpan={columns.length} className="px-3 py-6 text-center text-ink-soft">Loading…</td></tr>
            ) : table.getRowModel().rows.length === 0 ? (
              <tr><td colSpan={columns.length} className="px-3 py-6 text-center text-ink-soft">No applications match.</td></tr>
            ) : (
              table.getRowModel().rows.map((r) => (
                <tr key={r.id} className="border-b border-rule last:border-b-0 hover:bg-paper">
                  {r.getVisibleCells().map((c) => (
                    <td key={c.id} className="px-3 py-2 align-top">{flexRender(c.column.columnDef.cell, c.getContext())}</td>
                  ))}
                </tr>
              ))
            )}
          </tbody>
        </table>
      </div>
      <nav aria-label="Pages" className="mt-3 flex items-center gap-3 text-sm">
        <button type="button" disabled={page <= 1} onClick={() => setPage((p) => p - 1)} className="rounded-sm border border-rule-strong px-2 py-1 disabled:opacity-40">
          Previous
        </button>
        <span className="num">Page {page}</span>
        <button type="button" disabled={!query.data?.hasMore} onClick={() => setPage((p) => p + 1)} className="rounded-sm border border-rule-strong px-2 py-1 disabled:opacity-40">
          Next
        </button>
      </nav>
    </div>
  );
}
