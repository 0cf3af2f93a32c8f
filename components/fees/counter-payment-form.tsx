"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useState, type FormEvent } from "react";
import { Button } from "@/components/ui/button";
import { FormMessage, SelectField, TextField } from "@/components/ui/field";
import { ApiError, fetchJson } from "@/lib/client/fetch-json";
import { formatCents } from "@/lib/fees/money";

/** Staff record a payment taken at the department's counter against an open invoice. */
export function CounterPaymentForm({ invoiceId, totalCents }: { invoiceId: number; totalCents: number }) {
  const qc = useQueryClient();
  const [method, setMethod] = useState("cheque");
  const [reference, setReference] = useState("");
  const record = useMutation({
    mutationFn: () => fetchJson(`/api/invoices/${invoiceId}/counter-payment`, { method: "POST", json: { method, reference } }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["invoice", invoiceId] }),
  });
  const fields = record.error instanceof ApiError ? (record.error.fields ?? {}) : {};
  const submit = (e: FormEvent) => {
    e.preventDefault();
    record.mutate();
  };

  return (
    <form onSubmit={submit} aria-label="Payment taken at the counter" className="mt-6 border-t border-rule pt-4">
      <h2 className="mb-1 text-base font-semibold">Payment taken at the counter</h2>
      <p className="mb-3 text-xs text-ink-soft">
        For a cheque, cash or a card run on the counter terminal. Record it once the money is in hand: the invoice is marked paid, the applicant gets a receipt and, where review waits for the fee, the review clock starts.
      </p>
      {record.error && !Object.keys(fields).length ? <FormMessage kind="error">{record.error.message}</FormMessage> : null}
      <div className="grid gap-x-4 sm:grid-cols-2">
        <SelectField label="Paid by" name="counter-method" value={method} onChange={(e) => setMethod(e.target.value)} error={fields.method}>
          <option value="cheque">Cheque</option>
          <option value="cash">Cash</option>
          <option value="card_terminal">Card at the counter terminal</option>
        </SelectField>
        <TextField
          label={method === "cheque" ? "Cheque number" : method === "cash" ? "Counter receipt number" : "Terminal slip number"}
          name="counter-reference"
          value={reference}
          onChange={(e) => setReference(e.target.value)}
          error={fields.reference}
          maxLength={60}
          autoComplete="off"
        />
      </div>
      <Button type="submit" variant="secondary" disabled={record.isPending}>
        {record.isPending ? "Recording…" : `Record payment of ${formatCents(totalCents)}`}
      </Button>
    </form>
  );
}
