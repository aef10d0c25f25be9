// The job worker: sends outbox e-mail, runs housekeeping and the alert scans. Closes gracefully on SIGTERM/SIGINT.
// env: DATABASE_URL, REDIS_URL, SMTP_HOST, SMTP_PORT, MAIL_FROM, APP_URL (links in e-mail), OUTBOX_SWEEP_MS (10000),
//      WORKER_LOCK_MS (30000) and WORKER_STALLED_MS (30000): how long a job's lock lasts and how often
//      jobs of a dead worker are looked for (the tests shorten both); WORKER_SYNC_MS (600000): how
//      often the schedules are checked and overdue scans caught up
import { Queue, UnrecoverableError, Worker, type Job } from "bullmq";
import { Redis } from "ioredis";
import nodemailer from "nodemailer";
import { closeDb, db } from "../db/client";
import { env } from "../lib/env";
import { DELIVER_ALERTS_JOB, DELIVER_JOB_OPTIONS, deliverAlerts, DIGEST_TICK_EVERY_MS, DIGEST_TICK_JOB, enqueueDeliveries } from "./definitions/deliver-alerts";
import { scanPayload } from "./definitions/job-runs";
import { enqueueOverdueScans, scanByName, syncScanSchedulers } from "./definitions/scans";
import { runHousekeeping } from "./definitions/housekeeping";
import { markOutboxEmailFailed, pendingOutboxIds, sendOutboxEmail } from "./definitions/send-email";
import { DIGESTS_QUEUE, enqueueOutboxEmails, HOUSEKEEPING_QUEUE, MAIL_QUEUE, SCANS_QUEUE } from "./queues";

const config = env();
const sweepMs = Number(process.env.OUTBOX_SWEEP_MS ?? 10_000);
const workerConnection = () => new Redis(config.REDIS_URL, { maxRetriesPerRequest: null });
const lockDuration = Number(process.env.WORKER_LOCK_MS ?? 30_000);
const stalledInterval = Number(process.env.WORKER_STALLED_MS ?? 30_000);
const workerOptions = () => ({ connection: workerConnection(), lockDuration, stalledInterval });
const transport = nodemailer.createTransport({ host: config.SMTP_HOST, port: config.SMTP_PORT, secure: false, ignoreTLS: true });

const mailWorker = new Worker(
  MAIL_QUEUE,
  async (job: Job) => sendOutboxEmail(db(), transport, config.MAIL_FROM, job.data),
  { ...workerOptions(), concurrency: 4 },
);
mailWorker.on("failed", (job, err) => {
  if (!job) return;
  console.warn(`[worker] mail ${job.id} failed (attempt ${job.attemptsMade}): ${err.message}`);
  if (job.attemptsMade >= (job.opts.attempts ?? 1)) void markOutboxEmailFailed(db(), job.data.outboxId, err.message);
});

const housekeepingWorker = new Worker(
  HOUSEKEEPING_QUEUE,
  async () => runHousekeeping(db()),
  workerOptions(),
);

// Alert scans: one job per company and scan (payload {companyId}); see jobs/definitions/scans.ts.
// After a scan, a delivery for the company: people who want alerts at once get them; "run now"
// (deliverNow) treats every digest as due.
const scansWorker = new Worker(
  SCANS_QUEUE,
  async (job: Job) => {
    const scan = scanByName(job.name);
    if (!scan) throw new UnrecoverableError(`Unknown scan job ${job.name}`);
    const { companyId, deliverNow } = scanPayload(scan.name, job.data);
    const result = await scan.run(db(), job.data);
    if ((result as { status?: string }).status !== "company-gone") {
      await digestsQueue.add(DELIVER_ALERTS_JOB, { companyId, force: deliverNow }, { ...DELIVER_JOB_OPTIONS, jobId: `${DELIVER_ALERTS_JOB}-after-${job.id}` });
    }
    return result;
  },
  { ...workerOptions(), concurrency: 2 },
);
scansWorker.on("failed", (job, err) => {
  if (job) console.warn(`[worker] scan ${job.name} ${job.id} failed (attempt ${job.attemptsMade}): ${err.message}`);
});

// Alert e-mail (jobs/definitions/deliver-alerts.ts): a delivery writes outbox rows and their send
// records in one transaction per person, then queues the rows on the mail queue (the sweep covers a lost enqueue).
const digestsWorker = new Worker(
  DIGESTS_QUEUE,
  async (job: Job) => {
    if (job.name === DIGEST_TICK_JOB) return { companies: await enqueueDeliveries(db(), digestsQueue) };
    if (job.name !== DELIVER_ALERTS_JOB) throw new UnrecoverableError(`Unknown digests job ${job.name}`);
    const result = await deliverAlerts(db(), job.data, config.APP_URL);
    if (result.status === "done") await enqueueOutboxEmails(mailQueue, result.outboxIds);
    return result;
  },
  { ...workerOptions(), concurrency: 2 },
);
digestsWorker.on("failed", (job, err) => {
  if (job) console.warn(`[worker] ${job.name} ${job.id} failed (attempt ${job.attemptsMade}): ${err.message}`);
});

const mailQueue = new Queue(MAIL_QUEUE, { connection: workerConnection() });
const digestsQueue = new Queue(DIGESTS_QUEUE, { connection: workerConnection() });
const housekeepingQueue = new Queue(HOUSEKEEPING_QUEUE, { connection: workerConnection() });
const scansQueue = new Queue(SCANS_QUEUE, { connection: workerConnection() });
const KEEP_FEW = { removeOnComplete: { count: 100 }, removeOnFail: { count: 100 } };

// The schedules, at start and every WORKER_SYNC_MS (10 min): per-company scan schedulers (new
// companies, changed time zones), the digest tick and housekeeping, and a catch-up run of every scan
// whose last run is older than its period (BullMQ schedulers never backfill). Redis runs without
// persistence, so one that restarts comes back empty: this sets it up again within minutes and the
// scans it missed run at once. Interval schedulers are only created when missing (re-adding one
// could move its next run); cron ones are upserted (their next run is fixed by the clock).
async function syncSchedules() {
  try {
    if (!(await digestsQueue.getJobScheduler(DIGEST_TICK_JOB))) {
      await digestsQueue.upsertJobScheduler(DIGEST_TICK_JOB, { every: DIGEST_TICK_EVERY_MS }, { name: DIGEST_TICK_JOB, opts: KEEP_FEW });
    }
    if (!(await housekeepingQueue.getJobScheduler("daily-housekeeping"))) {
      await housekeepingQueue.upsertJobScheduler("daily-housekeeping", { every: 24 * 3600 * 1000 }, { name: "housekeeping", opts: KEEP_FEW });
    }
    await syncScanSchedulers(db(), scansQueue);
    const n = await enqueueOverdueScans(db(), scansQueue);
    if (n) console.log(`[worker] ${n} overdue scan(s) queued`);
  } catch (e) {
    console.warn("[worker] scheduling failed (retried at the next sync):", (e as Error).message);
  }
}
await syncSchedules();
// and one digest tick now: digest hours that passed while the worker was down go out at once
await digestsQueue
  .add(DIGEST_TICK_JOB, {}, { ...KEEP_FEW, jobId: `${DIGEST_TICK_JOB}-start-${Math.floor(Date.now() / 60_000)}` })
  .catch((e: Error) => console.warn("[worker] start tick not queued:", e.message));
const scheduleSyncTimer = setInterval(() => void syncSchedules(), Number(process.env.WORKER_SYNC_MS ?? 600_000));

// The outbox sweep: e-mails written while Redis was down (or whose enqueue was lost) get queued.
let sweeping = false;
async function sweep() {
  if (sweeping) return;
  sweeping = true;
  try {
    await enqueueOutboxEmails(mailQueue, await pendingOutboxIds(db(), 2000));
  } catch (e) {
    console.warn("[worker] outbox sweep failed:", (e as Error).message);
  } finally {
    sweeping = false;
  }
}
void sweep();
const sweepTimer = setInterval(sweep, sweepMs);
console.log(`[worker] running: queues ${MAIL_QUEUE}, ${HOUSEKEEPING_QUEUE}, ${SCANS_QUEUE}, ${DIGESTS_QUEUE}; SMTP ${config.SMTP_HOST}:${config.SMTP_PORT}`);

let closing = false;
async function shutdown(signal: string) {
  if (closing) return;
  closing = true;
  console.log(`[worker] ${signal}: finishing current jobs`);
  clearInterval(sweepTimer);
  clearInterval(scheduleSyncTimer);
  await Promise.allSettled([
    mailWorker.close(), housekeepingWorker.close(), scansWorker.close(), digestsWorker.close(),
    mailQueue.close(), housekeepingQueue.close(), scansQueue.close(), digestsQueue.close(),
  ]);
  transport.close();
  await closeDb();
  process.exit(0);
}
process.on("SIGTERM", () => void shutdown("SIGTERM"));
process.on("SIGINT", () => void shutdown("SIGINT"));
