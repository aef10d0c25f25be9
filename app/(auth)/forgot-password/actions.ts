"use server";

import { requestPasswordReset } from "@/lib/data/password-resets";
import { AppError } from "@/lib/http/errors";
import { passwordResetRequestInput } from "@/lib/validation/auth";
import { zodErrors, type FormState } from "@/components/ui/form-state";

export type ForgotPasswordState = FormState<{ email?: string }> & { sent?: boolean };

/** Same answer for every well-formed address: whether it has an account is never revealed. */
export async function forgotPasswordAction(_prev: ForgotPasswordState, form: FormData): Promise<ForgotPasswordState> {
  const email = String(form.get("email") ?? "");
  const parsed = passwordResetRequestInput.safeParse({ email });
  if (!parsed.success) return { fieldErrors: zodErrors(parsed.error), values: { email } };
  try {
    await requestPasswordReset(parsed.data.email);
  } catch (e) {
    if (e instanceof AppError && e.status === 429) return { message: e.message, values: { email } };
    throw e;
  }
  return { sent: true, values: { email: parsed.data.email } };
}
