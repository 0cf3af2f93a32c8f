"use client";

import { keepPreviousData, useQuery } from "@tanstack/react-query";
import type { ColumnDef } from "@tanstack/react-table";
import Link from "next/link";
import { useState } from "react";
import { DataTable } from "@/components/ui/data-table";
import { FormMessage } from "@/components/ui/field";
import { fetchJson } from "@/lib/client/fetch-json";
import { formatCents } from "@/lib/fees/money";
import { InvoiceStatus } from "./invoice-status";
import type { InvoiceListRow } from "./types";

const STATUS_FILTERS = [
  { value: "", label: "Every status" },
  { value: "open", label: "Unpaid" },
  { value: "paid", label: "Paid" },
  { value: "refunded", label: "Refunded" },
  { value: "void", label: "Void" },
] as const;

const PURPOSE: Record<string, string> = { plan_review: "Plan-review fee", resubmittal: "Resubmittal review" };
const day = (s: string | null) => (s ? new Date(s).toLocaleDateString("en-US", { year: "numeric", month: "short", day: "numeric" }) : "—");

/** Invoices, newest first: an applicant's own, or every invoice for staff. */
export function InvoicesTable({ showApplicant }: { showApplicant: boolean }) {
  const [status, setStatus] = useState("");
  const q = useQuery({
    queryKey: ["invoices", status],
    queryFn: () => fetchJson<{ invoices: InvoiceListRow[] }>(`/api/invoices${status ? `?status=${status}` : ""}`),
    placeholderData: keepPreviousData,
    refetchInterval: 30_000,
  });

  const columns: ColumnDef<InvoiceListRow, unknown>[] = [
    {
      id: "number",
      header: "Invoice",
      accessorFn: (r) => r.number,
      cell: (c) => (
        <Link href={`/invoices/${c.row.original.id}`} className="num font-medium text-accent underline-offset-2 hover:underline">
          {c.row.original.number}
        </Link>
      ),
    },
    {
      id: "application",
      header: "Application",
      accessorFn: (r) => `${r.applicationNumber} ${r.siteAddress}`,
      cell: (c) => (
        <div>
          <Link href={`/applications/${c.row.original.applicationId}`} className="num text-accent underline-offset-2 hover:underline">
            {c.row.original.applicationNumber}
          </Link>
          <div className="text-xs text-ink-soft">{c.row.original.siteAddress}</div>
        </div>
      ),
    },
    ...(showApplicant
      ? [{ id: "applicant", header: "Applicant", accessorFn: (r: InvoiceListRow) => r.firmName ?? r.applicantName } as ColumnDef<InvoiceListRow, unknown>]
      : []),
    { id: "purpose", header: "For", accessorFn: (r) => `${PURPOSE[r.purpose] ?? r.purpose}${r.purpose === "resubmittal" ? `, cycle ${r.cycle}` : ""}` },
    { id: "total", header: "Amount", accessorFn: (r) => r.totalCents, cell: (c) => <span className="num">{formatCents(c.row.original.totalCents)}</span> },
    { id: "status", header: "Status", accessorFn: (r) => r.status, cell: (c) => <InvoiceStatus status={c.row.original.status} /> },
    { id: "issued", header: "Issued", accessorFn: (r) => r.createdAt, cell: (c) => <span className="num text-xs">{day(c.row.original.createdAt)}</span> },
    { id: "paid", header: "Paid", accessorFn: (r) => r.paidAt ?? "", cell: (c) => <span className="num text-xs">{day(c.row.original.paidAt)}</span> },
  ];

  return (
    <div>
      <label className="mb-3 block max-w-xs text-sm">
        <span className="font-medium">Status</span>
        <select value={status} onChange={(e) => setStatus(e.target.value)} className="mt-1 block w-full rounded-sm border border-rule-strong bg-sheet px-2.5 py-1.5 text-sm">
          {STATUS_FILTERS.map((s) => (
            <option key={s.value} value={s.value}>
              {s.label}
            </option>
          ))}
        </select>
      </label>
      {q.error ? <FormMessage kind="error">{q.error.message}</FormMessage> : null}
      <DataTable data={q.data?.invoices ?? []} columns={columns} caption="Invoices" filterLabel="Find an invoice, application or address" empty={q.isPending ? "Loading…" : "No invoices."} />
    </div>
  );
}
