import { resetPassword } from "@/lib/data/password-resets";
import { route } from "@/lib/http/route";
import { passwordResetConfirmInput } from "@/lib/validation/auth";

export const POST = route({ auth: false, body: passwordResetConfirmInput }, async ({ body }) => {
  await resetPassword(body);
  return { ok: true };
});
