import Link from "next/link";
import { ApplicationsTable } from "@/components/applications/applications-table";
import { buttonClass } from "@/components/ui/button";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/auth/session";

export const metadata = { title: "Applications" };

export default async function ApplicationsPage() {
  const user = await requirePageUser("applicant", "technician", "examiner", "supervisor");
  const mine = user.role === "applicant";
  return (
    <>
      <PageHeader
        title={mine ? "My applications" : "All applications"}
        subtitle={mine ? "Applications you filed, where each one stands, and what the department is waiting for." : "Every filed application, newest activity first."}
        actions={mine ? <Link href="/applications/new" className={buttonClass("primary")}>New application</Link> : undefined}
      />
      <ApplicationsTable scope={mine ? "mine" : "all"} showApplicant={!mine} caption="Applications" />
    </>
  );
}
