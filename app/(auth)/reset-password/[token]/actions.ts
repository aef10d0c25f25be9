"use server";

import { redirect } from "next/navigation";
import { z } from "zod";
import { zodErrors, type FormState } from "@/components/ui/form-state";
import { AppError } from "@/lib/http/errors";
import { resetPassword } from "@/lib/data/password-resets";
import { passwordResetConfirmInput } from "@/lib/validation/auth";

export type ResetPasswordState = FormState & {
  /** The link itself is unknown, used or expired: the form cannot help any more. */
  linkProblem?: string;
};

const resetForm = passwordResetConfirmInput
  .extend({ confirm: z.string() })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], error: "The two passwords differ." });

export async function resetPasswordAction(_prev: ResetPasswordState, form: FormData): Promise<ResetPasswordState> {
  const parsed = resetForm.safeParse({
    token: form.get("token") ?? "",
    password: form.get("password") ?? "",
    confirm: form.get("confirm") ?? "",
  });
  if (!parsed.success) {
    const fieldErrors = zodErrors(parsed.error);
    if (fieldErrors.token) return { linkProblem: "This reset link is incomplete. Copy the whole link from the e-mail, or ask for a new one." };
    return { fieldErrors };
  }
  try {
    await resetPassword({ token: parsed.data.token, password: parsed.data.password });
  } catch (e) {
    // 404 unknown, 409 used or expired: the AppError says which
    if (!(e instanceof AppError) || (e.status !== 404 && e.status !== 409)) throw e;
    return { linkProblem: e.status === 404 ? "This reset link is not valid. Check that the whole link was copied, or ask for a new one." : e.message };
  }
  redirect("/sign-in?reset=1");
}
