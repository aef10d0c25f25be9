import { requestPasswordReset } from "@/lib/data/password-resets";
import { Reply, route } from "@/lib/http/route";
import { passwordResetRequestInput } from "@/lib/validation/auth";

/** Always the same answer, known e-mail or not. */
export const POST = route({ auth: false, body: passwordResetRequestInput }, async ({ body }) => {
  await requestPasswordReset(body.email);
  return new Reply(202, { ok: true, message: "If this e-mail has an account, a reset link is on its way. It works for one hour." });
});
