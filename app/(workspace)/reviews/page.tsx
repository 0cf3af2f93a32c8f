import { ApplicationsTable } from "@/components/applications/applications-table";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/auth/session";

export const metadata = { title: "My reviews" };

export default async function ReviewsPage() {
  await requirePageUser("examiner", "supervisor");
  return (
    <>
      <PageHeader title="My reviews" subtitle="Applications assigned to you that are in plan review or back as a resubmittal." />
      <ApplicationsTable scope="reviews" caption="My reviews" />
    </>
  );
}
