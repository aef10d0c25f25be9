"use client";

import Link from "next/link";
import { useActionState } from "react";
import { signInAction, type SignInState } from "./actions";

export function SignInForm({ next }: { next?: string }) {
  const [state, action, pending] = useActionState<SignInState, FormData>(signInAction, {});
  return (
    <form action={action} className="space-y-5" noValidate>
      {next ? <input type="hidden" name="next" value={next} /> : null}
      {state.message ? (
        <p role="alert" className="rounded-md border border-ember/30 bg-ember-soft px-3 py-2 text-sm font-medium text-ember">
          {state.message}
        </p>
      ) : null}
      <div>
        <label htmlFor="email" className="field-label">E-mail</label>
        <input
          id="email" name="email" type="email" autoComplete="username" required defaultValue={state.email}
          className="field-input" aria-invalid={Boolean(state.fieldErrors?.email)}
          aria-describedby={state.fieldErrors?.email ? "email-error" : undefined}
        />
        {state.fieldErrors?.email ? <p id="email-error" className="field-error">{state.fieldErrors.email[0]}</p> : null}
      </div>
      <div>
        <label htmlFor="password" className="field-label">Password</label>
        <input
          id="password" name="password" type="password" autoComplete="current-password" required
          className="field-input" aria-invalid={Boolean(state.fieldErrors?.password)}
          aria-describedby={state.fieldErrors?.password ? "password-error" : undefined}
        />
        {state.fieldErrors?.password ? <p id="password-error" className="field-error">{state.fieldErrors.password[0]}</p> : null}
      </div>
      <button type="submit" className="btn-primary w-full" disabled={pending}>
        {pending ? "Signing in…" : "Sign in"}
      </button>
      <p className="text-sm">
        <Link href="/forgot-password" className="inline-flex min-h-touch items-center font-semibold text-paprika underline-offset-4 hover:underline">
          Forgot your password?
        </Link>
      </p>
    </form>
  );
}
