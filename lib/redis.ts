// The web app's own Redis connection for plain commands (rate limits). It fails within half a second
// while Redis is down, so callers can fall back. BullMQ has its own (jobs/queues.ts).
// env: REDIS_URL
import { Redis } from "ioredis";
import { env } from "./env";

const globalForRedis = globalThis as unknown as { __hlRedis?: Redis };

export function redis(): Redis {
  globalForRedis.__hlRedis ??= new Redis(env().REDIS_URL, {
    // commands wait for the (re)connection, but never longer than commandTimeout: right after start
    // they still reach Redis, and while Redis is down callers fall back within half a second
    enableOfflineQueue: true,
    commandTimeout: 500,
    maxRetriesPerRequest: 1,
    connectTimeout: 1000,
    retryStrategy: (times) => Math.min(times * 200, 2000),
    lazyConnect: false,
  }).on("error", () => {
    // connection errors surface on each command; the rate limiter falls back then
  });
  return globalForRedis.__hlRedis;
}
