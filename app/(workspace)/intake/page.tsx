import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/auth/session";

export const metadata = { title: "Intake" };

export default async function Page() {
  await requirePageUser();
  return (
    <>
      <PageHeader title="Intake" />
      <p className="text-sm text-ink-soft">Nothing is here yet.</p>
    </>
  );
}
