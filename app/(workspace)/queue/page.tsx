import { ApplicationsTable } from "@/components/applications/applications-table";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/auth/session";

export const metadata = { title: "Queue" };

export default async function QueuePage() {
  await requirePageUser("supervisor");
  return (
    <>
      <PageHeader title="Queue" subtitle="Every filed application and who holds it. Filter by status to see the reviews in progress." />
      <ApplicationsTable scope="all" caption="Department queue" />
    </>
  );
}
