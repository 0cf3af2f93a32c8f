import { notFound } from "next/navigation";
import { InvoiceDetail } from "@/components/fees/invoice-detail";
import type { InvoiceDetailView } from "@/components/fees/types";
import { PageHeader } from "@/components/ui/page-header";
import { db } from "@/db/client";
import { requirePageUser } from "@/lib/auth/session";
import { AppError } from "@/lib/errors";
import { invoiceDetail } from "@/lib/fees/service";

export const metadata = { title: "Invoice" };

const one = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v) ?? "";

export default async function InvoicePage({ params, searchParams }: { params: Promise<{ id: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePageUser("applicant", "technician", "examiner", "supervisor");
  const { id } = await params;
  if (!/^\d{1,15}$/.test(id)) notFound();
  const detail = await invoiceDetail(db(), user, Number(id)).catch((e: unknown) => {
    if (e instanceof AppError && e.code === "not_found") notFound();
    throw e;
  });
  const sp = await searchParams;
  // Where the provider's checkout sends the browser back; anything else is ignored.
  const checkout = one(sp.checkout) === "success" ? "success" : one(sp.checkout) === "cancelled" ? "cancelled" : null;
  const sessionId = /^cs_\w{6,250}$/.test(one(sp.session_id)) ? one(sp.session_id) : null;
  return (
    <>
      <PageHeader title={`Invoice ${detail.invoice.number}`} subtitle={`${detail.invoice.purposeLabel} · ${detail.application.number} · ${detail.application.siteAddress}`} />
      <InvoiceDetail initial={JSON.parse(JSON.stringify(detail)) as InvoiceDetailView} checkout={checkout} sessionId={sessionId} />
    </>
  );
}
