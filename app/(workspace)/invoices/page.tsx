import { InvoicesTable } from "@/components/fees/invoices-table";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/auth/session";

export const metadata = { title: "Invoices" };

export default async function InvoicesPage() {
  const user = await requirePageUser("applicant", "technician", "supervisor");
  const mine = user.role === "applicant";
  return (
    <>
      <PageHeader
        title={mine ? "My invoices" : "Invoices"}
        subtitle={
          mine
            ? "Fees for your applications, what each one is for, and how it was worked out. Unpaid fees can be paid online by card."
            : "Every fee invoice the department has issued, newest first: plan-review fees at intake acceptance and resubmittal fees beyond the included cycles."
        }
      />
      <InvoicesTable showApplicant={!mine} />
    </>
  );
}
