"use client";

import { keepPreviousData, useQuery, useQueryClient } from "@tanstack/react-query";
import { flexRender, getCoreRowModel, useReactTable, type ColumnDef, type RowSelectionState } from "@tanstack/react-table";
import Link from "next/link";
import { useState } from "react";
import { StateBadge } from "@/components/applications/state-badge";
import { ClockBadge } from "@/components/review-clock/clock-badge";
import { Button } from "@/components/ui/button";
import { FormMessage } from "@/components/ui/field";
import { fetchJson } from "@/lib/client/fetch-json";
import { formatDay, formatDayWithWeekday } from "@/lib/review-clock/format";
import type { QueueApiPage, QueueApiRow } from "@/lib/review-clock/queue-row";
import { ReassignDialog, useExaminers } from "./reassign-dialog";
import { SortableTh } from "@/components/ui/sortable-th";

export interface QueueFilters {
  examinerId: string;
  state: "" | "in_review" | "resubmitted";
  due: "" | "overdue" | "this_week";
  sort: "due" | "received" | "number";
  dir: "asc" | "desc";
}

const PAGE_SIZE = 50;
const SORTABLE: Record<string, QueueFilters["sort"]> = { application: "number", received: "received", due: "due" };
const select = "mt-1 block rounded-sm border border-rule-strong bg-sheet px-2 py-1.5 text-sm";

function paramsOf(f: QueueFilters, cursor: string | null) {
  const p = new URLSearchParams({ sort: f.sort, dir: f.dir, limit: String(PAGE_SIZE) });
  if (f.examinerId) p.set("examinerId", f.examinerId);
  if (f.state) p.set("state", f.state);
  if (f.due) p.set("due", f.due);
  if (cursor) p.set("cursor", cursor);
  return p;
}

/** The department's open reviews: server-side filters and sort, keyset pages, selection for reassignment. */
export function QueueTable({ initial }: { initial: QueueFilters }) {
  const qc = useQueryClient();
  const [filters, setFilters] = useState<QueueFilters>(initial);
  // cursors[i] opens page i + 1; page 1 has none. Going back pops; nothing is re-counted by offset.
  const [cursors, setCursors] = useState<(string | null)[]>([null]);
  const [chosen, setChosen] = useState<Map<number, { id: number; number: string | null }>>(new Map());
  const [dialog, setDialog] = useState(false);
  const [notice, setNotice] = useState<string | null>(null);
  const [total, setTotal] = useState<{ key: string; n: number; capped: boolean } | null>(null);
  const examiners = useExaminers();

  const filterKey = paramsOf(filters, null).toString();
  const cursor = cursors.at(-1) ?? null;
  const params = paramsOf(filters, cursor);
  const page = useQuery({
    queryKey: ["queue", params.toString()],
    queryFn: () => fetchJson<QueueApiPage>(`/api/queue?${params}`),
    placeholderData: keepPreviousData,
    refetchInterval: 60_000,
  });
  const counted = page.data && !page.isPlaceholderData ? page.data.total : null;
  if (counted && (total?.key !== filterKey || total.n !== counted.n || total.capped !== counted.capped)) {
    setTotal({ key: filterKey, ...counted });
  }

  function change(next: Partial<QueueFilters>) {
    const f = { ...filters, ...next };
    setFilters(f);
    setCursors([null]);
    setChosen(new Map());
    setNotice(null);
    const url = new URL(window.location.href);
    url.search = paramsOf(f, null).toString();
    url.searchParams.delete("limit");
    window.history.replaceState(null, "", url);
  }

  const columns: ColumnDef<QueueApiRow, unknown>[] = [
    {
      id: "select",
      header: ({ table }) => (
        <input
          type="checkbox"
          aria-label="Select every review on this page"
          checked={table.getIsAllPageRowsSelected()}
          ref={(el) => {
            if (el) el.indeterminate = table.getIsSomePageRowsSelected();
          }}
          onChange={table.getToggleAllPageRowsSelectedHandler()}
        />
      ),
      cell: ({ row }) => (
        <input type="checkbox" aria-label={`Select ${row.original.number ?? `#${row.original.id}`}`} checked={row.getIsSelected()} onChange={row.getToggleSelectedHandler()} />
      ),
    },
    {
      id: "application",
      header: "Application",
      cell: ({ row: { original: r } }) => (
        <div>
          <Link href={`/applications/${r.id}`} className="num font-medium text-accent underline-offset-2 hover:underline">
            {r.number ?? `#${r.id}`}
          </Link>
          <div className="line-clamp-1 text-xs text-ink-soft">{r.siteAddress}</div>
        </div>
      ),
    },
    { id: "examiner", header: "Plans examiner", cell: ({ row: { original: r } }) => r.examiner?.name ?? <span className="text-ink-faint">Unassigned</span> },
    { id: "state", header: "Status", cell: ({ row: { original: r } }) => <StateBadge state={r.state} /> },
    { id: "cycle", header: "Cycle", cell: ({ row: { original: r } }) => <span className="num">{r.cycle}</span> },
    { id: "received", header: "Received", cell: ({ row: { original: r } }) => <span className="num text-xs">{formatDay(r.receivedDay)}</span> },
    {
      id: "due",
      header: "Due",
      cell: ({ row: { original: r } }) => (
        <div className="flex flex-col items-start gap-1">
          <span className="num text-xs">{formatDayWithWeekday(r.dueDay)}</span>
          {/* A clock held for the fee is not a missing due date: say which. */}
          <ClockBadge status={r.clock} label={r.waitingForFee && r.clock.kind === "no_due_date" ? "Waiting for fee" : undefined} />
        </div>
      ),
    },
    {
      id: "overdue",
      header: () => (
        <span>
          Days overdue <span className="sr-only">(business days)</span>
        </span>
      ),
      cell: ({ row: { original: r } }) =>
        r.clock.kind === "overdue" ? (
          <span className="num font-medium text-bad" data-testid="days-overdue">
            {r.clock.businessDaysOverdue}
          </span>
        ) : (
          <span className="text-ink-faint">—</span>
        ),
    },
  ];

  const rows = page.data?.rows ?? [];
  // Selection is kept by id, so it survives paging back and forth.
  const selection: RowSelectionState = Object.fromEntries([...chosen.keys()].map((id) => [String(id), true]));
  const table = useReactTable({
    data: rows,
    columns,
    getRowId: (r) => String(r.id),
    state: { rowSelection: selection },
    enableRowSelection: true,
    onRowSelectionChange: (u) => {
      const next = typeof u === "function" ? u(selection) : u;
      setChosen((prev) => {
        const m = new Map(prev);
        for (const r of rows) {
          if (next[String(r.id)]) m.set(r.id, { id: r.id, number: r.number });
          else m.delete(r.id);
        }
        return m;
      });
    },
    manualPagination: true,
    manualSorting: true,
    getCoreRowModel: getCoreRowModel(),
  });

  const sortBy = (id: string) => {
    const key = SORTABLE[id];
    if (!key) return;
    change(filters.sort === key ? { dir: filters.dir === "asc" ? "desc" : "asc" } : { sort: key, dir: "asc" });
  };

  const pageNo = cursors.length;
  const from = (pageNo - 1) * PAGE_SIZE + 1;
  const shown = total?.key === filterKey ? total : null;
  const totalWords = shown ? (shown.capped ? `more than ${shown.n.toLocaleString("en-US")}` : shown.n.toLocaleString("en-US")) : null;

  return (
    <div>
      <div className="mb-3 flex flex-wrap items-end gap-3" role="group" aria-label="Filters">
        <label className="text-sm">
          <span className="font-medium">Plans examiner</span>
          <select value={filters.examinerId} onChange={(e) => change({ examinerId: e.target.value })} className={select}>
            <option value="">Every examiner</option>
            {(examiners.data ?? []).map((x) => (
              <option key={x.id} value={x.id}>
                {x.name} ({x.openReviews} open)
              </option>
            ))}
          </select>
        </label>
        <label className="text-sm">
          <span className="font-medium">Status</span>
          <select value={filters.state} onChange={(e) => change({ state: e.target.value as QueueFilters["state"] })} className={select}>
            <option value="">Any open review</option>
            <option value="in_review">In plan review</option>
            <option value="resubmitted">Resubmitted</option>
          </select>
        </label>
        <label className="text-sm">
          <span className="font-medium">Due date</span>
          <select value={filters.due} onChange={(e) => change({ due: e.target.value as QueueFilters["due"] })} className={select}>
            <option value="">Any due date</option>
            <option value="overdue">Overdue</option>
            <option value="this_week">Due this week</option>
          </select>
        </label>
        <span className="ml-auto text-sm text-ink-soft" aria-live="polite">
          {shown ? `${totalWords} review${shown.n === 1 && !shown.capped ? "" : "s"}` : ""}
        </span>
      </div>

      {notice ? <FormMessage kind="ok">{notice}</FormMessage> : null}
      {page.isError ? <FormMessage kind="error">{page.error.message}</FormMessage> : null}

      <div className="mb-2 flex flex-wrap items-center gap-3 text-sm">
        <span aria-live="polite">{chosen.size ? `${chosen.size} selected` : "Select reviews to move them."}</span>
        <Button type="button" disabled={chosen.size === 0} onClick={() => setDialog(true)}>
          Reassign selected
        </Button>
        {chosen.size ? (
          <Button type="button" variant="quiet" onClick={() => setChosen(new Map())}>
            Clear selection
          </Button>
        ) : null}
      </div>

      <div className="overflow-x-auto border-y border-rule">
        <table className="w-full border-collapse text-sm">
          <caption className="sr-only">Open reviews</caption>
          <thead>
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id} className="border-b border-rule-strong bg-paper text-left">
                {hg.headers.map((h) => {
                  const key = SORTABLE[h.column.id];
                  return <SortableTh key={h.id} header={h} direction={key && filters.sort === key ? filters.dir : null} onSort={key ? () => sortBy(h.column.id) : undefined} />;
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {page.isPending ? (
              <tr><td colSpan={columns.length} className="px-3 py-6 text-center text-ink-soft">Loading…</td></tr>
            ) : rows.length === 0 ? (
              <tr><td colSpan={columns.length} className="px-3 py-6 text-center text-ink-soft">No open reviews match.</td></tr>
            ) : (
              table.getRowModel().rows.map((r) => (
                <tr key={r.id} data-state={r.getIsSelected() ? "selected" : undefined} className="border-b border-rule last:border-b-0 hover:bg-paper data-[state=selected]:bg-accent-wash">
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
        <button type="button" disabled={pageNo <= 1} onClick={() => setCursors((c) => c.slice(0, -1))} className="rounded-sm border border-rule-strong px-2 py-1 disabled:opacity-40">
          Previous
        </button>
        <span className="num">
          {rows.length ? `${from}–${from + rows.length - 1}` : "0"}
          {totalWords ? ` of ${totalWords}` : ""}
        </span>
        <button
          type="button"
          disabled={!page.data?.nextCursor || page.isPlaceholderData}
          onClick={() => {
            const next = page.data?.nextCursor;
            if (next) setCursors((c) => [...c, next]);
          }}
          className="rounded-sm border border-rule-strong px-2 py-1 disabled:opacity-40"
        >
          Next
        </button>
      </nav>

      <ReassignDialog
        open={dialog}
        selected={[...chosen.values()]}
        onClose={() => setDialog(false)}
        onDone={(summary) => {
          setDialog(false);
          setChosen(new Map());
          setNotice(summary);
          void qc.invalidateQueries({ queryKey: ["queue"] });
          void qc.invalidateQueries({ queryKey: ["examiners"] });
          void qc.invalidateQueries({ queryKey: ["workload"] });
        }}
      />
    </div>
  );
}
