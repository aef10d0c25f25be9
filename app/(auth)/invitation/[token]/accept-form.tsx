"use client";

import Link from "next/link";
import { useActionState } from "react";
import { FormMessage, TextField } from "@/components/ui/field";
import { acceptInvitationAction, type AcceptState } from "./actions";

export function AcceptForm({ token, name }: { token: string; name: string }) {
  const [state, action, pending] = useActionState<AcceptState, FormData>(acceptInvitationAction, {});
  if (state.linkProblem) {
    return (
      <div className="space-y-6">
        <FormMessage tone="error">{state.linkProblem}</FormMessage>
        <Link href="/sign-in" className="btn-quiet w-full">Go to sign in</Link>
      </div>
    );
  }
  return (
    <form action={action} className="flex flex-col gap-5" noValidate>
      <input type="hidden" name="token" value={token} />
      <FormMessage tone="error">{state.message}</FormMessage>
      <TextField
        name="name" label="Your name" autoComplete="name" required
        defaultValue={state.values?.name ?? name} errors={state.fieldErrors?.name}
        hint="As your colleagues will see it."
      />
      <TextField
        name="password" label="Choose a password" type="password" autoComplete="new-password" required
        hint="At least 10 characters. A short sentence is easy to remember." errors={state.fieldErrors?.password}
      />
      <TextField
        name="confirm" label="Password again" type="password" autoComplete="new-password" required
        errors={state.fieldErrors?.confirm}
      />
      <button type="submit" className="btn-primary w-full" disabled={pending}>
        {pending ? "Setting up…" : "Join and sign in"}
      </button>
    </form>
  );
}
