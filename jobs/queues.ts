// Queue names and producers. The web app enqueues through here; jobs/worker.ts consumes.
// env: REDIS_URL
import { Queue } from "bullmq";
import { Redis } from "ioredis";
import { env } from "../lib/env";

export const MAIL_QUEUE = "mail";
export const HOUSEKEEPING_QUEUE = "housekeeping";
/** The alert scans (jobs/definitions/scans.ts): one job per company and scan. */
export const SCANS_QUEUE = "scans";
/** Alert e-mail: deliveries per company after each scan and at each digest tick (jobs/definitions/deliver-alerts.ts). */
export const DIGESTS_QUEUE = "digests";
/** Every queue, for the job health page (Settings > Jobs); a new queue is added here too. */
export const QUEUE_NAMES = [MAIL_QUEUE, HOUSEKEEPING_QUEUE, SCANS_QUEUE, DIGESTS_QUEUE] as const;

/** Scans are idempotent (alerts are unique), so retries are safe; old jobs go after a day or a week. */
export const SCAN_JOB_OPTIONS = {
  attempts: 5,
  backoff: { type: "exponential", delay: 5000 },
  removeOnComplete: { age: 24 * 3600, count: 1000 },
  removeOnFail: { age: 7 * 24 * 3600, count: 5000 },
} as const;

export const MAIL_JOB_OPTIONS = {
  attempts: 6,
  backoff: { type: "exponential", delay: 2000 },
  removeOnComplete: { age: 24 * 3600, count: 1000 },
  removeOnFail: { age: 7 * 24 * 3600 },
} as const;

const globalForQueues = globalThis as unknown as { __hlMailQueue?: Queue };

/** Producer side: fails fast while Redis is down (the outbox keeps the mail; the worker sweeps it). */
export function mailQueue(): Queue {
  globalForQueues.__hlMailQueue ??= new Queue(MAIL_QUEUE, {
    connection: new Redis(env().REDIS_URL, { enableOfflineQueue: false, maxRetriesPerRequest: 1, connectTimeout: 1000 }).on("error", () => {}),
  });
  return globalForQueues.__hlMailQueue;
}

/** Enqueues outbox e-mails by id. The outbox id is the job id, so enqueuing twice is harmless. */
export async function enqueueOutboxEmails(queue: Queue, ids: readonly string[]): Promise<void> {
  if (ids.length === 0) return;
  await queue.addBulk(ids.map((outboxId) => ({ name: "send-email", data: { outboxId }, opts: { ...MAIL_JOB_OPTIONS, jobId: outboxId } })));
}
