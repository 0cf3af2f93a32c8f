"use client";

import { useActionState } from "react";
import { requestResetAction, type FormState } from "@/app/(public)/actions";
import { Button } from "@/components/ui/button";
import { FormMessage, TextField } from "@/components/ui/field";

export function ResetRequestForm() {
  const [state, action, pending] = useActionState<FormState, FormData>(requestResetAction, {});
  if (state.done) {
    return <FormMessage kind="ok">If that address belongs to an active account, a reset link is on its way. It works for one hour.</FormMessage>;
  }
  return (
    <form action={action} noValidate>
      <TextField label="E-mail address" name="email" type="email" autoComplete="username" required error={state.fields?.email} />
      <Button type="submit" disabled={pending} className="w-full">
        Send reset link
      </Button>
    </form>
  );
}
