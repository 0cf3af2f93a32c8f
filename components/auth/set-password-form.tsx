"use client";

import { useActionState } from "react";
import { acceptInviteAction, resetPasswordAction, type FormState } from "@/app/(public)/actions";
import { Button } from "@/components/ui/button";
import { FormMessage, TextField } from "@/components/ui/field";
import { PASSWORD_MIN } from "@/lib/auth/password-policy";

export function SetPasswordForm({ token, purpose }: { token: string; purpose: "invite" | "reset" }) {
  const [state, action, pending] = useActionState<FormState, FormData>(purpose === "invite" ? acceptInviteAction : resetPasswordAction, {});
  return (
    <form action={action} noValidate>
      {state.error ? <FormMessage kind="error">{state.error}</FormMessage> : null}
      <input type="hidden" name="token" value={token} />
      <TextField
        label="New password"
        name="password"
        type="password"
        autoComplete="new-password"
        required
        error={state.fields?.password}
        hint={`At least ${PASSWORD_MIN} characters. A short sentence works well.`}
      />
      <TextField label="Repeat the password" name="confirm" type="password" autoComplete="new-password" required error={state.fields?.confirm} />
      <Button type="submit" disabled={pending} className="w-full">
        {purpose === "invite" ? "Set password and finish" : "Save new password"}
      </Button>
    </form>
  );
}
