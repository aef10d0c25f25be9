// The web app's own Redis connection for plain commands (rate limits). It fails fast while Redis is
// down instead of queueing commands, so callers can fall back. BullMQ has its own (jobs/queues.ts).
// env: REDIS_URL
import { Redis } from "ioredis";
import { env } from "./env";

const globalForRedis = globalThis as unknown as { __hlRedis?: Redis };

export function redis(): Redis {
  globalForRedis.__hlRedis ??= new Redis(env().REDIS_URL, {
    enableOfflineQueue: false,
    maxRetriesPerRequest: 0,
    connectTimeout: 1000,
    retryStrategy: (times) => Math.min(times * 200, 2000),
    lazyConnect: false,
  }).on("error", () => {
    // connection errors surface on each command; the rate limiter falls back then
  });
  return globalForRedis.__hlRedis;
}
