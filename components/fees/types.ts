import type { applicationInvoices, invoiceDetail, invoicesFor } from "@/lib/fees/service";

// The fee API's answers as they arrive over JSON (dates become strings).
type Jsonify<T> = T extends Date
  ? string
  : T extends (infer U)[]
    ? Jsonify<U>[]
    : T extends object
      ? { [K in keyof T]: Jsonify<T[K]> }
      : T;

export type ApplicationInvoicesView = Jsonify<Awaited<ReturnType<typeof applicationInvoices>>>;
export type InvoiceDetailView = Jsonify<Awaited<ReturnType<typeof invoiceDetail>>>;
export type InvoiceView = InvoiceDetailView["invoice"];
export type InvoiceListRow = Jsonify<Awaited<ReturnType<typeof invoicesFor>>[number]>;
