import "server-only";
import { findUserForSignIn, loadCurrentUser } from "../data/users";
import { rateLimited, unauthenticated } from "../http/errors";
import { redis } from "../redis";
import type { SignInInput } from "../validation/auth";
import type { CurrentUser } from "./current-user";
import { verifyPassword } from "./password";
import { memoryLimiter, redisLimiter, type FailureLimiter } from "./rate-limit";
import { createSession } from "./session";

const globalForLimiter = globalThis as unknown as { __hlSignInLimiter?: FailureLimiter };
function limiter(): FailureLimiter {
  globalForLimiter.__hlSignInLimiter ??= redisLimiter(redis(), memoryLimiter());
  return globalForLimiter.__hlSignInLimiter;
}

/** Wrong password and unknown e-mail get the same answer (and take as long). */
export async function signIn(input: SignInInput): Promise<{ user: CurrentUser; session: { id: string; expiresAt: Date } }> {
  const key = input.email;
  const waitMs = await limiter().blockedFor(key);
  if (waitMs > 0) {
    const minutes = Math.ceil(waitMs / 60000);
    throw rateLimited(`Too many failed sign-ins for this e-mail. Try again in ${minutes} minute${minutes === 1 ? "" : "s"}.`, Math.ceil(waitMs / 1000));
  }
  const row = await findUserForSignIn(input.email);
  const passwordOk = await verifyPassword(row?.password_hash ?? null, input.password);
  const user = row && passwordOk && !row.disabled_at ? await loadCurrentUser(row.id) : undefined;
  if (!user) {
    await limiter().recordFailure(key);
    throw unauthenticated("The e-mail or password is wrong.");
  }
  await limiter().reset(key);
  return { user, session: await createSession(user.id) };
}
