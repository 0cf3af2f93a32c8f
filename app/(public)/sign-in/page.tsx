import Link from "next/link";
import { redirect } from "next/navigation";
import { SignInForm } from "@/components/auth/sign-in-form";
import { currentUser, HOME_BY_ROLE } from "@/lib/auth/session";

export const metadata = { title: "Sign in" };

export default async function SignInPage({ searchParams }: { searchParams: Promise<Record<string, string | undefined>> }) {
  const user = await currentUser();
  if (user) redirect(HOME_BY_ROLE[user.role]);
  const sp = await searchParams;
  const notice = sp.welcome ? "Your password is set. Sign in to continue." : sp.reset ? "Your password was changed. Sign in with the new one." : undefined;
  return (
    <section aria-labelledby="sign-in-title">
      <h1 id="sign-in-title" className="mb-1 text-2xl font-semibold">
        Sign in
      </h1>
      <p className="mb-6 text-sm text-ink-soft">Design professionals, contractors and department staff.</p>
      <SignInForm notice={notice} />
      <p className="mt-6 text-sm">
        <Link href="/reset" className="text-accent underline-offset-2 hover:underline">
          Forgot your password?
        </Link>
      </p>
    </section>
  );
}
