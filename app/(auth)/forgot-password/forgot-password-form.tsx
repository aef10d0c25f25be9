"use client";

import { useActionState } from "react";
import { MailCheck } from "lucide-react";
import { TextField } from "@/components/ui/field";
import { forgotPasswordAction, type ForgotPasswordState } from "./actions";

export function ForgotPasswordForm() {
  const [state, action, pending] = useActionState<ForgotPasswordState, FormData>(forgotPasswordAction, {});
  return (
    <div>
      <div role="status">
        {state.sent ? (
          <div className="panel flex items-start gap-3 px-4 py-4">
            <MailCheck aria-hidden className="mt-0.5 h-6 w-6 shrink-0 text-herb" />
            <p>If this e-mail has an account, a reset link is on its way. It works for one hour.</p>
          </div>
        ) : null}
      </div>
      {state.sent ? null : (
        <form action={action} className="flex flex-col gap-5" noValidate>
          <TextField
            name="email" label="E-mail" type="email" autoComplete="username" required
            defaultValue={state.values?.email} errors={state.fieldErrors?.email}
          />
          <button type="submit" className="btn-primary w-full" disabled={pending}>
            {pending ? "Sending…" : "Send reset link"}
          </button>
        </form>
      )}
    </div>
  );
}
