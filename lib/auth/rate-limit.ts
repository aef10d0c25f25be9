// Sign-in failures per e-mail: 10 in a 15-minute window, then 429 until the window ends. The same
// counters limit password-reset requests.
// Counted in Redis (shared by every web process); while Redis is unreachable, each process keeps its
// own count so the limit still holds per process.
import type { Redis } from "ioredis";

export const SIGN_IN_MAX_FAILURES = 10;
export const SIGN_IN_WINDOW_MS = 15 * 60 * 1000;
// password-reset requests per e-mail, known or not (so the limit reveals nothing): 5 an hour
export const RESET_REQUEST_MAX = 5;
export const RESET_REQUEST_WINDOW_MS = 60 * 60 * 1000;

export interface FailureLimiter {
  /** Milliseconds until the key may try again, or 0 when it is not blocked. */
  blockedFor(key: string): Promise<number>;
  recordFailure(key: string): Promise<void>;
  reset(key: string): Promise<void>;
}

export function memoryLimiter(max = SIGN_IN_MAX_FAILURES, windowMs = SIGN_IN_WINDOW_MS, now = () => Date.now()): FailureLimiter {
  const windows = new Map<string, { count: number; endsAt: number }>();
  const live = (key: string) => {
    const w = windows.get(key);
    if (w && w.endsAt <= now()) windows.delete(key);
    return windows.get(key);
  };
  return {
    async blockedFor(key) {
      const w = live(key);
      return w && w.count >= max ? w.endsAt - now() : 0;
    },
    async recordFailure(key) {
      const w = live(key);
      if (w) w.count += 1;
      else windows.set(key, { count: 1, endsAt: now() + windowMs });
    },
    async reset(key) {
      windows.delete(key);
    },
  };
}

export function redisLimiter(
  client: Redis,
  fallback: FailureLimiter,
  max = SIGN_IN_MAX_FAILURES,
  windowMs = SIGN_IN_WINDOW_MS,
  name = "signin-failures",
): FailureLimiter {
  const k = (key: string) => `hl:${name}:${key}`;
  return {
    async blockedFor(key) {
      // failures counted in this process while Redis was unreachable still count once it is back
      const local = await fallback.blockedFor(key);
      try {
        const [count, ttl] = await Promise.all([client.get(k(key)), client.pttl(k(key))]);
        return Math.max(local, Number(count ?? 0) >= max ? Math.max(ttl, 1) : 0);
      } catch {
        return local;
      }
    },
    async recordFailure(key) {
      try {
        // the window starts at the first failure and is not extended by later ones
        const count = await client.incr(k(key));
        if (count === 1) await client.pexpire(k(key), windowMs);
      } catch {
        await fallback.recordFailure(key);
      }
    },
    async reset(key) {
      try {
        await client.del(k(key));
      } catch {
        /* nothing to clear */
      }
      await fallback.reset(key);
    },
  };
}
