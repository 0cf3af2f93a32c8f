"use client";

import {
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnDef,
  type SortingState,
} from "@tanstack/react-table";
import { useState } from "react";
import { SortableTh } from "./sortable-th";

/** A client-sorted, client-filtered table for short lists (users, documents). */
export function DataTable<T>({
  data,
  columns,
  filterLabel,
  caption,
  empty = "Nothing here yet.",
}: {
  data: T[];
  columns: ColumnDef<T, unknown>[];
  filterLabel?: string;
  caption: string;
  empty?: string;
}) {
  const [sorting, setSorting] = useState<SortingState>([]);
  const [filter, setFilter] = useState("");
  const table = useReactTable({
    data,
    columns,
    state: { sorting, globalFilter: filter },
    onSortingChange: setSorting,
    onGlobalFilterChange: setFilter,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
  });
  return (
    <div>
      {filterLabel ? (
        <label className="mb-3 block max-w-xs text-sm">
          <span className="font-medium">{filterLabel}</span>
          <input
            type="search"
            value={filter}
            onChange={(e) => setFilter(e.target.value)}
            className="mt-1 block w-full rounded-sm border border-rule-strong bg-sheet px-2.5 py-1.5 text-sm"
          />
        </label>
      ) : null}
      <div className="overflow-x-auto border-y border-rule">
        <table className="w-full border-collapse text-sm">
          <caption className="sr-only">{caption}</caption>
          <thead>
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id} className="border-b border-rule-strong bg-paper text-left">
                {hg.headers.map((h) => (
                  <SortableTh key={h.id} header={h} direction={h.column.getIsSorted()} onSort={h.column.getCanSort() ? h.column.getToggleSortingHandler() : undefined} />
                ))}
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.length === 0 ? (
              <tr>
                <td colSpan={columns.length} className="px-3 py-6 text-center text-ink-soft">
                  {empty}
                </td>
              </tr>
            ) : (
              table.getRowModel().rows.map((r) => (
                <tr key={r.id} className="border-b border-rule last:border-b-0 hover:bg-paper">
                  {r.getVisibleCells().map((c) => (
                    <td key={c.id} className="px-3 py-2 align-top">
                      {flexRender(c.column.columnDef.cell, c.getContext())}
                    </td>
                  ))}
                </tr>
              ))
            )}
          </tbody>
        </table>
      </div>
    </div>
  );
}
