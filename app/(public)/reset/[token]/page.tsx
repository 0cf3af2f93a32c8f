import { SetPasswordForm } from "@/components/auth/set-password-form";

export const metadata = { title: "Choose a new password" };

export default async function ResetPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  return (
    <section>
      <h1 className="mb-6 text-2xl font-semibold">Choose a new password</h1>
      <SetPasswordForm token={token} purpose="reset" />
    </section>
  );
}
