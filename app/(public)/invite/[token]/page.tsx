import { SetPasswordForm } from "@/components/auth/set-password-form";

export const metadata = { title: "Accept invitation" };

export default async function InvitePage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  return (
    <section>
      <h1 className="mb-1 text-2xl font-semibold">Welcome to Spanproof</h1>
      <p className="mb-6 text-sm text-ink-soft">Choose a password to finish setting up your account.</p>
      <SetPasswordForm token={token} purpose="invite" />
    </section>
  );
}
