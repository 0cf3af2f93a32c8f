"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import Link from "next/link";
import { useEffect, useRef } from "react";
import { Button } from "@/components/ui/button";
import { FormMessage } from "@/components/ui/field";
import { fetchJson } from "@/lib/client/fetch-json";
import { formatCents } from "@/lib/fees/money";
import { CounterPaymentForm } from "./counter-payment-form";
import { InvoiceLines } from "./invoice-lines";
import { InvoiceStatus } from "./invoice-status";
import type { InvoiceDetailView } from "./types";
import { usePayOnline } from "./use-pay-online";

const fmt = (s: string | null) => (s ? new Date(s).toLocaleString("en-US", { dateStyle: "medium", timeStyle: "short" }) : "—");

/**
 * One invoice. Back from the provider's checkout (?checkout=success|cancelled) it says how the
 * attempt ended; after a success it asks the server to confirm with the provider, in case the
 * browser came back before the provider's webhook did.
 */
export function InvoiceDetail({ initial, checkout, sessionId }: { initial: InvoiceDetailView; checkout: "success" | "cancelled" | null; sessionId: string | null }) {
  const id = initial.invoice.id;
  const qc = useQueryClient();
  const key = ["invoice", id] as const;
  const q = useQuery({
    queryKey: key,
    queryFn: () => fetchJson<InvoiceDetailView>(`/api/invoices/${id}`),
    initialData: initial,
    refetchInterval: (query) => (checkout === "success" && query.state.data?.invoice.status === "open" ? 1_500 : 30_000),
  });
  const d = q.data;
  const inv = d.invoice;
  const pay = usePayOnline();
  const refund = useMutation({
    mutationFn: () => fetchJson(`/api/invoices/${id}/refund`, { method: "POST" }),
    onSettled: () => qc.invalidateQueries({ queryKey: key }),
  });
  const confirm = useMutation({
    mutationFn: (sid: string) => fetchJson(`/api/invoices/${id}/confirm`, { method: "POST", json: { sessionId: sid } }),
    onSettled: () => qc.invalidateQueries({ queryKey: key }),
  });
  const asked = useRef(false);
  useEffect(() => {
    if (checkout === "success" && sessionId && initial.invoice.status === "open" && !asked.current) {
      asked.current = true;
      confirm.mutate(sessionId);
    }
  }, [checkout, sessionId, initial.invoice.status, confirm]);

  const declined = d.lastAttempt?.type === "payment_intent.payment_failed";
  return (
    <div className="max-w-3xl">
      {checkout === "success" && inv.status === "paid" ? (
        <FormMessage kind="ok">
          Payment received: {formatCents(inv.totalCents)}. A receipt is on its way by e-mail.
          {inv.purpose === "plan_review" && d.paymentRequiredBeforeReview ? " Plan review has started; the review clock started today." : ""}
        </FormMessage>
      ) : null}
      {checkout === "success" && inv.status === "open" ? <FormMessage kind="info">Confirming your payment with the payment provider…</FormMessage> : null}
      {checkout === "cancelled" && inv.status === "open" ? (
        declined ? (
          <FormMessage kind="error">
            Your payment was declined{d.lastAttempt?.message ? `: ${d.lastAttempt.message}` : "."} Nothing was charged and the invoice is still open. You can try again, with another card if need be.
          </FormMessage>
        ) : (
          <FormMessage kind="info">You left the checkout without paying. Nothing was charged; the invoice is still open.</FormMessage>
        )
      ) : null}
      {confirm.error ? <FormMessage kind="error">{confirm.error.message}</FormMessage> : null}
      {pay.error ? <FormMessage kind="error">{pay.error.message}</FormMessage> : null}
      {refund.error ? <FormMessage kind="error">{refund.error.message}</FormMessage> : null}

      <div className="mb-4 flex flex-wrap items-center justify-between gap-3">
        <div className="flex flex-wrap items-center gap-3 text-sm">
          <InvoiceStatus status={inv.status} />
          <span>
            {inv.purposeLabel}
            {inv.purpose === "resubmittal" ? `, review cycle ${inv.cycle}` : ""} for{" "}
            <Link href={`/applications/${d.application.id}`} className="num text-accent underline-offset-2 hover:underline">
              {d.application.number}
            </Link>
            , {d.application.siteAddress}
          </span>
        </div>
        <div className="flex gap-2">
          {d.canPay ? (
            <Button onClick={() => pay.mutate(inv.id)} disabled={pay.isPending}>
              {pay.isPending ? "Opening the checkout…" : `Pay online ${formatCents(inv.totalCents)}`}
            </Button>
          ) : null}
          {d.canRefund ? (
            <Button variant="danger" onClick={() => refund.mutate()} disabled={refund.isPending}>
              Refund {formatCents(inv.totalCents)}
            </Button>
          ) : null}
        </div>
      </div>
      {inv.status === "open" && inv.purpose === "plan_review" && d.paymentRequiredBeforeReview ? (
        <p className="mb-4 text-sm text-ink-soft">Plan review begins when this fee is paid: the review clock starts on the day of payment.</p>
      ) : null}

      <InvoiceLines invoice={inv} caption={`Invoice ${inv.number}`} />

      <dl className="mt-5 grid grid-cols-[11rem_1fr] gap-x-4 gap-y-1 text-sm">
        <dt className="text-ink-soft">Issued</dt>
        <dd className="num">{fmt(inv.createdAt)}</dd>
        <dt className="text-ink-soft">Paid</dt>
        <dd className="num">{fmt(inv.paidAt)}</dd>
        {inv.counterPayment ? (
          <>
            <dt className="text-ink-soft">Paid at the counter</dt>
            <dd>
              {inv.counterPayment.methodLabel[0]!.toUpperCase() + inv.counterPayment.methodLabel.slice(1)}, recorded by {inv.counterPayment.recordedBy}
            </dd>
          </>
        ) : null}
        {inv.paymentReference ? (
          <>
            <dt className="text-ink-soft">Payment reference</dt>
            <dd className="num break-all">{inv.paymentReference}</dd>
          </>
        ) : null}
        {inv.status === "void" || inv.status === "refunded" ? (
          <>
            <dt className="text-ink-soft">{inv.status === "void" ? "Voided" : "Refunded"}</dt>
            <dd className="num">{fmt(inv.closedAt)}</dd>
          </>
        ) : null}
      </dl>
      {d.canRecordCounterPayment ? <CounterPaymentForm invoiceId={inv.id} totalCents={inv.totalCents} /> : null}
      <p className="mt-6 text-xs text-ink-faint">Card payments are taken on the payment provider&apos;s own checkout page; the department never sees or stores card numbers.</p>
    </div>
  );
}
