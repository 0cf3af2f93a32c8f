"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import Link from "next/link";
import { Button } from "@/components/ui/button";
import { FormMessage } from "@/components/ui/field";
import type { View } from "@/components/applications/workspace/types";
import { appKey } from "@/components/applications/workspace/use-application";
import { fetchJson } from "@/lib/client/fetch-json";
import { formatCents } from "@/lib/fees/money";
import { InvoiceLines } from "./invoice-lines";
import { InvoiceStatus } from "./invoice-status";
import type { ApplicationInvoicesView } from "./types";
import { usePayOnline } from "./use-pay-online";

export const invoicesKey = (applicationId: number) => ["application-invoices", applicationId] as const;

/** The application's fees in its workspace: what is owed and why, and "Pay online" for the applicant. */
export function ApplicationInvoices({ view }: { view: View }) {
  const app = view.application;
  const qc = useQueryClient();
  const q = useQuery({
    queryKey: [...invoicesKey(app.id), app.state, app.cycle],
    queryFn: () => fetchJson<ApplicationInvoicesView>(`/api/applications/${app.id}/invoices`),
    refetchInterval: 20_000,
  });
  const pay = usePayOnline();
  const charge = useMutation({
    mutationFn: () => fetchJson(`/api/applications/${app.id}/invoices`, { method: "POST", json: { purpose: "resubmittal" } }),
    onSettled: () => Promise.all([qc.invalidateQueries({ queryKey: invoicesKey(app.id) }), qc.invalidateQueries({ queryKey: appKey(app.id) })]),
  });

  const data = q.data;
  if (!data || (data.invoices.length === 0 && !data.resubmittalFee)) return null;
  // The fee the review waits for (the oldest open one), where the department reviews after payment.
  const owed = data.invoices.filter((i) => i.status === "open").sort((a, b) => a.cycle - b.cycle)[0];
  const waitingForFee = data.paymentRequiredBeforeReview && owed && (app.state === "in_review" || app.state === "resubmitted") ? owed : null;

  return (
    <section aria-labelledby="fees-title" className="mb-6 border border-rule bg-sheet px-4 py-3">
      <h2 id="fees-title" className="mb-2 text-lg font-semibold">Fees</h2>
      {waitingForFee ? (
        <FormMessage kind="info">
          {waitingForFee.purpose === "plan_review"
            ? data.canPay
              ? "Plan review begins when you pay the plan-review fee: the review clock starts on the day of payment."
              : "Waiting for the plan-review fee: the review clock starts, and review steps unlock, when the applicant pays it."
            : data.canPay
              ? `The review of your resubmittal (cycle ${waitingForFee.cycle}) begins when you pay the resubmittal fee: its review clock starts on the day of payment.`
              : `Waiting for the resubmittal fee for cycle ${waitingForFee.cycle}: its review clock starts, and review steps unlock, when the applicant pays it.`}
        </FormMessage>
      ) : null}
      {pay.error ? <FormMessage kind="error">{pay.error.message}</FormMessage> : null}
      {charge.error ? <FormMessage kind="error">{charge.error.message}</FormMessage> : null}
      <ul className="divide-y divide-rule">
        {data.invoices.map((inv) => (
          <li key={inv.id} className="py-2" aria-label={`Invoice ${inv.number}`}>
            <div className="flex flex-wrap items-center justify-between gap-3">
              <div className="flex flex-wrap items-center gap-3 text-sm">
                <Link href={`/invoices/${inv.id}`} className="num font-medium text-accent underline-offset-2 hover:underline">
                  {inv.number}
                </Link>
                <span>{inv.purposeLabel}{inv.purpose === "resubmittal" ? `, cycle ${inv.cycle}` : ""}</span>
                <span className="num font-medium">{formatCents(inv.totalCents)}</span>
                <InvoiceStatus status={inv.status} />
                {inv.paidAt ? <span className="text-xs text-ink-soft">paid {new Date(inv.paidAt).toLocaleDateString("en-US")}</span> : null}
              </div>
              {data.canPay && inv.status === "open" ? (
                <Button onClick={() => pay.mutate(inv.id)} disabled={pay.isPending}>
                  {pay.isPending ? "Opening the checkout…" : "Pay online"}
                </Button>
              ) : null}
            </div>
            <details className="mt-1">
              <summary className="cursor-pointer text-xs text-accent">How the fee was worked out</summary>
              <div className="mt-2 max-w-3xl">
                <InvoiceLines invoice={inv} caption={`Invoice ${inv.number}`} />
              </div>
            </details>
          </li>
        ))}
      </ul>
      {data.resubmittalFee ? (
        <div className="mt-2 flex flex-wrap items-center gap-3 border-t border-rule pt-2 text-sm">
          <span>
            Cycle <span className="num">{data.resubmittalFee.cycle}</span> is beyond the cycles the plan-review fee covers: {data.resubmittalFee.basis}
          </span>
          <Button variant="secondary" onClick={() => charge.mutate()} disabled={charge.isPending}>
            Charge resubmittal fee {formatCents(data.resubmittalFee.totalCents)}
          </Button>
        </div>
      ) : null}
    </section>
  );
}
