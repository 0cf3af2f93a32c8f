import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/auth/session";

export const metadata = { title: "My applications" };

export default async function Page() {
  await requirePageUser();
  return (
    <>
      <PageHeader title="My applications" />
      <p className="text-sm text-ink-soft">Nothing is here yet.</p>
    </>
  );
}
