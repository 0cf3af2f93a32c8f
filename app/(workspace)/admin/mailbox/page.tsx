import { notFound } from "next/navigation";
import { Mailbox } from "@/components/admin/mailbox";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/auth/session";
import { env } from "@/lib/env";

export const metadata = { title: "Captured mail" };

export default async function MailboxPage() {
  await requirePageUser("admin");
  if (!env().DEMO_MODE) notFound();
  return (
    <>
      <PageHeader title="Captured mail (demo)" subtitle="Every message Spanproof sent, as the local mail receiver captured it. Nothing leaves this machine in demo mode." />
      <Mailbox />
    </>
  );
}
