// The job health API (/api/jobs): the answers' shapes (lib/data/job-health.ts; a drift fails `tsc`
// in lib/http/openapi.ts) and the path parameters. Client-safe.
import { z } from "zod";

const timestamp = z.string().meta({ description: "ISO 8601 timestamp in UTC." });

export const queueCountsResponse = z
  .object({
    name: z.string().meta({ description: "The queue: mail, housekeeping, scans or digests." }),
    waiting: z.number().int(),
    active: z.number().int(),
    delayed: z.number().int().meta({ description: "Waiting for their time, including retries waiting out their backoff." }),
    failed: z.number().int().meta({ description: "Failed for good (kept a week)." }),
    completed: z.number().int().meta({ description: "Finished (kept a day)." }),
  })
  .meta({ id: "QueueCounts", description: "Counts for the whole installation (every company's jobs), not only yours." });

export const failedJobResponse = z
  .object({
    queue: z.string(),
    id: z.string().meta({ description: "The job's id in its queue (for the retry endpoint)." }),
    name: z.string().meta({ description: "The job name, e.g. expiry-scan or send-email." }),
    label: z.string().meta({ description: "The scan's label, or the job name." }),
    failedReason: z.string(),
    attemptsMade: z.number().int(),
    failedAt: timestamp.nullable(),
  })
  .meta({ id: "FailedJob", description: "A failed job of your company: a scan of it, or one of its e-mails." });

export const scanStatusResponse = z
  .object({
    name: z.string().meta({ description: "The scan, e.g. expiry-scan (POST /api/jobs/{name}/run)." }),
    label: z.string(),
    cron: z.string().meta({ description: "When it runs: a cron pattern in the company's time zone.", example: "0 5 * * *" }),
    timeZone: z.string().meta({ description: "The company's time zone.", example: "Europe/London" }),
    lastRunAt: timestamp.nullable().meta({ description: "When it last ran for your company; null: never." }),
    lastResult: z.record(z.string(), z.unknown()).nullable().meta({ description: "What the run stored, e.g. {status, today, lotsChecked, crossed, created}." }),
    lastResultText: z.string().nullable().meta({ description: "The same in words, e.g. \"3 new alerts, 12 lots checked\"." }),
    nextRunAt: timestamp.nullable().meta({ description: "The next scheduled run; null while the queue is down or before the worker has scheduled it." }),
  })
  .meta({ id: "ScanStatus" });

export const jobHealthResponse = z
  .object({
    redis: z.enum(["up", "down"]).meta({ description: "down: the job queue did not answer within about a second; alerts are delayed and only the last runs are known." }),
    checkedAt: timestamp,
    queues: z.array(queueCountsResponse).nullable().meta({ description: "null while the queue is down." }),
    failed: z.array(failedJobResponse).nullable().meta({ description: "Your company's failed jobs, newest first (at most 50; of the newest 500 per queue). null while the queue is down." }),
    scans: z.array(scanStatusResponse),
  })
  .meta({ id: "JobHealth" });

export const runScanResponse = z
  .object({
    jobId: z.string().meta({ description: "The queued job's id." }),
    scan: z.string(),
  })
  .meta({ id: "ScanRunQueued" });

export const retryJobResponse = z
  .object({
    queue: z.string(),
    id: z.string(),
    state: z.string().meta({ description: "waiting: queued again with its attempts reset." }),
  })
  .meta({ id: "JobRetried" });
