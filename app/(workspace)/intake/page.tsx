import { ApplicationsTable } from "@/components/applications/applications-table";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/auth/session";

export const metadata = { title: "Intake" };

export default async function IntakePage() {
  await requirePageUser("technician", "supervisor");
  return (
    <>
      <PageHeader title="Intake" subtitle="Submitted applications waiting for a completeness screen, oldest first. The review clock starts when you accept one." />
      <ApplicationsTable scope="intake" caption="Intake queue" />
    </>
  );
}
