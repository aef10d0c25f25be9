"use client";

import Link from "next/link";
import { useActionState } from "react";
import { FormMessage, TextField } from "@/components/ui/field";
import { resetPasswordAction, type ResetPasswordState } from "./actions";

export function ResetPasswordForm({ token }: { token: string }) {
  const [state, action, pending] = useActionState<ResetPasswordState, FormData>(resetPasswordAction, {});
  if (state.linkProblem) {
    return (
      <div className="space-y-6">
        <FormMessage tone="error">{state.linkProblem}</FormMessage>
        <Link href="/forgot-password" className="btn-primary w-full">Ask for a new link</Link>
      </div>
    );
  }
  return (
    <form action={action} className="flex flex-col gap-5" noValidate>
      <input type="hidden" name="token" value={token} />
      <FormMessage tone="error">{state.message}</FormMessage>
      <TextField
        name="password" label="New password" type="password" autoComplete="new-password" required
        hint="At least 10 characters. A short sentence is easy to remember." errors={state.fieldErrors?.password}
      />
      <TextField
        name="confirm" label="New password again" type="password" autoComplete="new-password" required
        errors={state.fieldErrors?.confirm}
      />
      <button type="submit" className="btn-primary w-full" disabled={pending}>
        {pending ? "Saving…" : "Save new password"}
      </button>
    </form>
  );
}
