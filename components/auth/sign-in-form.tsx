"use client";

import { useActionState } from "react";
import { signInAction, type FormState } from "@/app/(public)/actions";
import { Button } from "@/components/ui/button";
import { FormMessage, TextField } from "@/components/ui/field";

export function SignInForm({ notice }: { notice?: string }) {
  const [state, action, pending] = useActionState<FormState, FormData>(signInAction, {});
  return (
    <form action={action} noValidate>
      {notice ? <FormMessage kind="ok">{notice}</FormMessage> : null}
      {state.error ? <FormMessage kind="error">{state.error}</FormMessage> : null}
      <TextField label="E-mail address" name="email" type="email" autoComplete="username" required />
      <TextField label="Password" name="password" type="password" autoComplete="current-password" required />
      <Button type="submit" disabled={pending} className="w-full">
        {pending ? "Signing in…" : "Sign in"}
      </Button>
    </form>
  );
}
