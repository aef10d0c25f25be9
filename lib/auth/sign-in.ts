import "server-only";
import { findUserForSignIn, loadCurrentUser } from "../data/users";
import { unauthenticated } from "../http/errors";
import type { SignInInput } from "../validation/auth";
import type { CurrentUser } from "./current-user";
import { verifyPassword } from "./password";
import { assertNotLimited, signInLimiter } from "./limiters";
import { createSession } from "./session";

/** Wrong password and unknown e-mail get the same answer (and take as long). */
export async function signIn(input: SignInInput): Promise<{ user: CurrentUser; session: { id: string; expiresAt: Date } }> {
  const key = input.email;
  await assertNotLimited(signInLimiter(), key, "failed sign-ins");
  const row = await findUserForSignIn(input.email);
  const passwordOk = await verifyPassword(row?.password_hash ?? null, input.password);
  const user = row && passwordOk && !row.disabled_at ? await loadCurrentUser(row.id) : undefined;
  if (!user) {
    await signInLimiter().recordFailure(key);
    throw unauthenticated("The e-mail or password is wrong.");
  }
  await signInLimiter().reset(key);
  return { user, session: await createSession(user.id) };
}
