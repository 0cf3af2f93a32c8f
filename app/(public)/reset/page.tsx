import { ResetRequestForm } from "@/components/auth/reset-request-form";

export const metadata = { title: "Reset password" };

export default function ResetRequestPage() {
  return (
    <section>
      <h1 className="mb-1 text-2xl font-semibold">Reset your password</h1>
      <p className="mb-6 text-sm text-ink-soft">We will e-mail a one-time link to the address on your account.</p>
      <ResetRequestForm />
    </section>
  );
}
