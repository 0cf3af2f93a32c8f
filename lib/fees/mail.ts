// Fee notices in the department's voice: what was charged and why, what the reader does next.
import { mailSignature, type Mail } from "@/lib/mail/templates";
import { dayInZone, formatDayLong } from "@/lib/review-clock";
import { formatCents } from "./money";

export const FEE_MAIL_TEMPLATES = {
  issued: "fees.invoice_issued",
  receipt: "fees.receipt",
  refunded: "fees.refunded",
  voided: "fees.voided",
} as const;

interface Line {
  label: string;
  amountCents: number;
  basis: string;
}

export interface InvoiceMailContext {
  recipientName: string;
  applicationNumber: string;
  siteAddress: string;
  invoiceNumber: string;
  lines: Line[];
  totalCents: number;
  /** the invoice page, where the fee is paid online */
  link: string;
}

const dear = (name: string, body: string): string => `Dear ${name},\n\n${body}${mailSignature}`;

function lineList(lines: Line[], totalCents: number): string {
  const rows = lines.map((l) => `  ${l.label}: ${formatCents(l.amountCents)}\n    How it was worked out: ${l.basis}`);
  return `${rows.join("\n")}\n  Total: ${formatCents(totalCents)}`;
}

export function invoiceIssuedMail(c: InvoiceMailContext & { paymentRequiredBeforeReview: boolean; purpose: "plan_review" | "resubmittal" }): Mail {
  const when = !c.paymentRequiredBeforeReview
    ? "Please pay it before the review is decided; the review itself goes ahead meanwhile."
    : c.purpose === "plan_review"
      ? "Plan review begins when this fee is paid: the review clock starts on the day of payment, not before."
      : "The review of your resubmittal begins when this fee is paid: its review clock starts on the day of payment, not before.";
  return {
    subject: `${c.applicationNumber}: ${c.purpose === "plan_review" ? "plan-review fee" : "resubmittal fee"} ${formatCents(c.totalCents)} — invoice ${c.invoiceNumber}`,
    text: dear(
      c.recipientName,
      `Invoice ${c.invoiceNumber} for application ${c.applicationNumber} (${c.siteAddress}) is ready:\n\n${lineList(c.lines, c.totalCents)}\n\n${when}\n\nPay online by card here: ${c.link}\n\nThis is an invoice, not a receipt; a receipt follows once the payment is confirmed.`,
    ),
  };
}

export function receiptMail(c: InvoiceMailContext & { paidAt: Date; paymentReference: string; reviewDueAt: Date | null; cycle: number; paidBy?: string }): Mail {
  const due = c.reviewDueAt ? formatDayLong(dayInZone(c.reviewDueAt)) : "";
  const clock = !c.reviewDueAt
    ? ""
    : c.cycle === 1
      ? `\n\nPlan review has started: the review clock started on the day of payment, and the first review is due by ${due}.`
      : `\n\nThe review of your resubmittal (cycle ${c.cycle}) has started: its review clock started on the day of payment, and it is due by ${due}.`;
  return {
    subject: `Receipt: ${c.invoiceNumber} paid, ${formatCents(c.totalCents)} — ${c.applicationNumber}`,
    text: dear(
      c.recipientName,
      `We received your payment for invoice ${c.invoiceNumber}, application ${c.applicationNumber} (${c.siteAddress}).\n\n${lineList(c.lines, c.totalCents)}\n\nPaid: ${formatDayLong(dayInZone(c.paidAt))}, ${c.paidBy ?? "by card online"}\nPayment reference: ${c.paymentReference}${clock}\n\nKeep this message as your receipt. Invoice and receipt: ${c.link}`,
    ),
  };
}

export function refundMail(c: InvoiceMailContext & { refundReference: string }): Mail {
  return {
    subject: `Refund: ${c.invoiceNumber}, ${formatCents(c.totalCents)} — ${c.applicationNumber} withdrawn`,
    text: dear(
      c.recipientName,
      `Application ${c.applicationNumber} (${c.siteAddress}) was withdrawn before plan review began, so the fee paid on invoice ${c.invoiceNumber} is refunded in full: ${formatCents(c.totalCents)}, to the card it was paid with.\n\nRefund reference: ${c.refundReference}. Card issuers usually take a few business days to show it.\n\n${c.link}`,
    ),
  };
}

export function voidMail(c: InvoiceMailContext): Mail {
  return {
    subject: `${c.invoiceNumber} cancelled — ${c.applicationNumber} withdrawn`,
    text: dear(
      c.recipientName,
      `Application ${c.applicationNumber} (${c.siteAddress}) was withdrawn before the fee was paid, so invoice ${c.invoiceNumber} (${formatCents(c.totalCents)}) is void. There is nothing to pay.\n\n${c.link}`,
    ),
  };
}
