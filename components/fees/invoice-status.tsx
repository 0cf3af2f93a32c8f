import type { InvoiceView } from "./types";

// Words first, a glyph of our own, then colour: nothing depends on colour alone.
const STYLE: Record<InvoiceView["status"], { cls: string; glyph: string; label: string }> = {
  open: { cls: "border-warn text-warn bg-warn-wash", glyph: "◌", label: "Unpaid" },
  paid: { cls: "border-ok text-ok bg-ok-wash", glyph: "●", label: "Paid" },
  void: { cls: "border-rule-strong text-ink-faint bg-paper", glyph: "⊘", label: "Void" },
  refunded: { cls: "border-info text-info bg-info-wash", glyph: "↺", label: "Refunded" },
};

export function InvoiceStatus({ status }: { status: InvoiceView["status"] }) {
  const s = STYLE[status];
  return (
    <span className={`inline-flex items-center gap-1.5 whitespace-nowrap rounded-sm border px-1.5 py-0.5 text-xs font-medium ${s.cls}`} data-invoice-status={status}>
      <span aria-hidden="true">{s.glyph}</span>
      {s.label}
    </span>
  );
}
