import RedisMock from "ioredis-mock";
import type { Redis } from "ioredis";
import { describe, expect, it } from "vitest";
import { memoryLimiter, redisLimiter, SIGN_IN_MAX_FAILURES, SIGN_IN_WINDOW_MS, type FailureLimiter } from "../../lib/auth/rate-limit";

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function fail(limiter: FailureLimiter, key: string, times: number) {
  for (let i = 0; i < times; i++) await limiter.recordFailure(key);
}

/** A client whose every command fails, as ioredis does while Redis is unreachable. */
function downClient(): Redis {
  const down = () => Promise.reject(new Error("Stream isn't writeable and enableOfflineQueue options is false"));
  return { get: down, pttl: down, incr: down, pexpire: down, del: down } as unknown as Redis;
}

it("the documented limits: 10 failures in 15 minutes", () => {
  expect(SIGN_IN_MAX_FAILURES).toBe(10);
  expect(SIGN_IN_WINDOW_MS).toBe(15 * 60 * 1000);
});

describe("memoryLimiter", () => {
  it("lets 10 failures through and blocks the 11th attempt for the rest of the window", async () => {
    let now = 1_000_000;
    const limiter = memoryLimiter(10, 60_000, () => now);
    for (let i = 0; i < 10; i++) {
      expect(await limiter.blockedFor("a@x.test")).toBe(0);
      await limiter.recordFailure("a@x.test");
      now += 1000;
    }
    // the window started at the first failure: 60 s minus the 10 s that have passed
    expect(await limiter.blockedFor("a@x.test")).toBe(50_000);
    expect(await limiter.blockedFor("b@x.test")).toBe(0);
  });

  it("unblocks when the window ends", async () => {
    let now = 0;
    const limiter = memoryLimiter(10, 60_000, () => now);
    await fail(limiter, "a", 10);
    now = 59_999;
    expect(await limiter.blockedFor("a")).toBe(1);
    now = 60_000;
    expect(await limiter.blockedFor("a")).toBe(0);
    // and the count starts over
    await fail(limiter, "a", 9);
    expect(await limiter.blockedFor("a")).toBe(0);
  });

  it("reset clears the count", async () => {
    const limiter = memoryLimiter(10, 60_000, () => 0);
    await fail(limiter, "a", 10);
    expect(await limiter.blockedFor("a")).toBeGreaterThan(0);
    await limiter.reset("a");
    expect(await limiter.blockedFor("a")).toBe(0);
    await fail(limiter, "a", 9);
    expect(await limiter.blockedFor("a")).toBe(0);
  });
});

describe("redisLimiter (ioredis-mock)", () => {
  const client = () => new RedisMock() as unknown as Redis;

  it("lets 10 failures through and blocks the 11th attempt", async () => {
    const limiter = redisLimiter(client(), memoryLimiter(), 10, 60_000);
    const key = `a-${Math.random()}@x.test`;
    for (let i = 0; i < 10; i++) {
      expect(await limiter.blockedFor(key)).toBe(0);
      await limiter.recordFailure(key);
    }
    const wait = await limiter.blockedFor(key);
    expect(wait).toBeGreaterThan(50_000);
    expect(wait).toBeLessThanOrEqual(60_000);
  });

  it("shares the count between limiters on the same Redis (every web process)", async () => {
    const redis = client();
    const key = `shared-${Math.random()}`;
    await fail(redisLimiter(redis, memoryLimiter(), 10, 60_000), key, 5);
    await fail(redisLimiter(redis, memoryLimiter(), 10, 60_000), key, 5);
    expect(await redisLimiter(redis, memoryLimiter(), 10, 60_000).blockedFor(key)).toBeGreaterThan(0);
  });

  it("unblocks when the window ends, and later failures do not extend it", async () => {
    const redis = client();
    const limiter = redisLimiter(redis, memoryLimiter(), 3, 1000);
    const key = `w-${Math.random()}`;
    await limiter.recordFailure(key);
    await sleep(300);
    await fail(limiter, key, 2);
    expect(await limiter.blockedFor(key)).toBeGreaterThan(0);
    expect(await limiter.blockedFor(key)).toBeLessThanOrEqual(700); // counted from the first failure
    await sleep(800);
    expect(await limiter.blockedFor(key)).toBe(0);
  });

  it("reset clears the count", async () => {
    const limiter = redisLimiter(client(), memoryLimiter(), 10, 60_000);
    const key = `r-${Math.random()}`;
    await fail(limiter, key, 10);
    expect(await limiter.blockedFor(key)).toBeGreaterThan(0);
    await limiter.reset(key);
    expect(await limiter.blockedFor(key)).toBe(0);
  });

  it("falls back to the memory limiter while Redis throws", async () => {
    const fallback = memoryLimiter(10, 60_000);
    const limiter = redisLimiter(downClient(), fallback, 10, 60_000);
    await fail(limiter, "down@x.test", 10);
    expect(await fallback.blockedFor("down@x.test")).toBeGreaterThan(0);
    expect(await limiter.blockedFor("down@x.test")).toBeGreaterThan(0);
    await limiter.reset("down@x.test");
    expect(await limiter.blockedFor("down@x.test")).toBe(0);
  });

  it("keeps counting failures made while Redis was down once it is back", async () => {
    const fallback = memoryLimiter(10, 60_000);
    await fail(redisLimiter(downClient(), fallback, 10, 60_000), "flaky@x.test", 10);
    const back = redisLimiter(new RedisMock() as unknown as Redis, fallback, 10, 60_000);
    expect(await back.blockedFor("flaky@x.test")).toBeGreaterThan(0);
  });
});
