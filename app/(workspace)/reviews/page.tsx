import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/auth/session";

export const metadata = { title: "My reviews" };

export default async function Page() {
  await requirePageUser();
  return (
    <>
      <PageHeader title="My reviews" />
      <p className="text-sm text-ink-soft">Nothing is here yet.</p>
    </>
  );
}
