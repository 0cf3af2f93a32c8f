import { ApplicationForm } from "@/components/applications/application-form";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/auth/session";

export const metadata = { title: "New application" };

export default async function NewApplicationPage() {
  await requirePageUser("applicant");
  return (
    <>
      <PageHeader title="New application" subtitle="Start with the project details. You add the drawing set and calculations next, then submit for intake." />
      <ApplicationForm />
    </>
  );
}
