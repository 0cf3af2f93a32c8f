import { formatCents } from "@/lib/fees/money";
import type { InvoiceView } from "./types";

/** The line items with the arithmetic behind each, and the total. */
export function InvoiceLines({ invoice, caption }: { invoice: Pick<InvoiceView, "lineItems" | "totalCents" | "scheduleVersion">; caption: string }) {
  return (
    <table className="w-full border-collapse text-sm">
      <caption className="sr-only">{caption}</caption>
      <thead>
        <tr className="border-b border-rule text-left text-ink-soft">
          <th scope="col" className="py-1 pr-3 font-medium">Item</th>
          <th scope="col" className="py-1 text-right font-medium">Amount</th>
        </tr>
      </thead>
      <tbody>
        {invoice.lineItems.map((l) => (
          <tr key={l.code} className="border-b border-rule align-top">
            <td className="py-2 pr-3">
              <div className="font-medium">{l.label}</div>
              <p className="mt-0.5 text-xs text-ink-soft">{l.basis}</p>
            </td>
            <td className="num py-2 text-right">{formatCents(l.amountCents)}</td>
          </tr>
        ))}
      </tbody>
      <tfoot>
        <tr>
          <th scope="row" className="py-2 pr-3 text-left font-semibold">Total</th>
          <td className="num py-2 text-right font-semibold" data-testid="invoice-total">{formatCents(invoice.totalCents)}</td>
        </tr>
        <tr>
          <td colSpan={2} className="pt-1 text-xs text-ink-faint">Fee schedule {invoice.scheduleVersion}; amounts in whole cents, a share rounded half up to the cent.</td>
        </tr>
      </tfoot>
    </table>
  );
}
