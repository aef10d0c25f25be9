import "server-only";
import { redis } from "../redis";
import {
  memoryLimiter, redisLimiter, RESET_REQUEST_MAX, RESET_REQUEST_WINDOW_MS, SIGN_IN_MAX_FAILURES, SIGN_IN_WINDOW_MS,
  type FailureLimiter,
} from "./rate-limit";
import { rateLimited } from "../http/errors";

const g = globalThis as unknown as { __hlLimiters?: { signIn: FailureLimiter; resetRequest: FailureLimiter } };

function limiters() {
  g.__hlLimiters ??= {
    signIn: redisLimiter(redis(), memoryLimiter(SIGN_IN_MAX_FAILURES, SIGN_IN_WINDOW_MS), SIGN_IN_MAX_FAILURES, SIGN_IN_WINDOW_MS, "signin-failures"),
    resetRequest: redisLimiter(redis(), memoryLimiter(RESET_REQUEST_MAX, RESET_REQUEST_WINDOW_MS), RESET_REQUEST_MAX, RESET_REQUEST_WINDOW_MS, "reset-requests"),
  };
  return g.__hlLimiters;
}

export const signInLimiter = () => limiters().signIn;
export const resetRequestLimiter = () => limiters().resetRequest;

/** Throws 429 with the wait in minutes while the key is blocked. */
export async function assertNotLimited(limiter: FailureLimiter, key: string, what: string): Promise<void> {
  const waitMs = await limiter.blockedFor(key);
  if (waitMs > 0) {
    const minutes = Math.ceil(waitMs / 60000);
    throw rateLimited(`Too many ${what} for this e-mail. Try again in ${minutes} minute${minutes === 1 ? "" : "s"}.`, Math.ceil(waitMs / 1000));
  }
}
