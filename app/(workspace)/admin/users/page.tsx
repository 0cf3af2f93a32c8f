import { UsersAdmin } from "@/components/admin/users-admin";
import { PageHeader } from "@/components/ui/page-header";
import { db } from "@/db/client";
import { listFirms } from "@/db/queries/users";
import { requirePageUser } from "@/lib/auth/session";

export const metadata = { title: "Users" };

export default async function UsersPage() {
  const me = await requirePageUser("admin");
  const firms = await listFirms(db());
  return (
    <>
      <PageHeader title="Users" subtitle="Invite staff and applicants, change roles, deactivate accounts. A change ends that person's open sessions." />
      <UsersAdmin selfId={me.id} firms={firms} />
    </>
  );
}
