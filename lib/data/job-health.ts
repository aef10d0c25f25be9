// The job health page (Settings > Jobs) and its API: queue counts, this company's failed jobs, each
// scan's last and next run, "run now", retrying a failed job; and the shell's "alerts are delayed".
//
// Redis is read through a connection of its own that fails fast (no offline queue, one retry, a
// 1 s connect timeout), and every Redis step has a short deadline: while Redis is down the page
// answers within about 2 s with {redis: "down"} and what the database knows (the last runs). The
// stock pages never come here; the shell's check waits at most 500 ms and remembers its answer
// for a few seconds.
//
// Tenancy: queue counts are installation-wide (one Redis for every company) and labelled so;
// failed jobs are shown only when they belong to the user's company: scan (and digest) jobs by
// data.companyId, mail jobs by their outbox e-mail's company. Anything else is never shown.
import "server-only";
import { Queue, type Job } from "bullmq";
import { Redis } from "ioredis";
import { db } from "../../db/client";
import { enqueueScanNow, SCAN_NAMES, SCANS, scanByName, schedulerId } from "../../jobs/definitions/scans";
import { QUEUE_NAMES, SCANS_QUEUE } from "../../jobs/queues";
import { resultInWords } from "../alerts/scan-words";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import { can, canSomewhere } from "../auth/permissions";
import { env } from "../env";
import { AppError, conflict, notFound, serviceUnavailable } from "../http/errors";
import { lastExpiryScan } from "./alerts";

export interface QueueCounts {
  name: string;
  waiting: number;
  active: number;
  delayed: number;
  failed: number;
  completed: number;
}

export interface FailedJob {
  queue: string;
  id: string;
  name: string;
  /** the scan's label, or the job name for other queues */
  label: string;
  failedReason: string;
  attemptsMade: number;
  /** when it last failed, ISO 8601 */
  failedAt: string | null;
}

export interface ScanStatus {
  name: string;
  label: string;
  /** cron pattern, local time of `timeZone` (the company's) */
  cron: string;
  timeZone: string;
  lastRunAt: string | null;
  lastResult: Record<string, unknown> | null;
  /** the last result in words, e.g. "3 new alerts, 12 lots checked" */
  lastResultText: string | null;
  /** from the company's job scheduler; null while Redis is down or before the worker set it up */
  nextRunAt: string | null;
}

export interface JobHealth {
  redis: "up" | "down";
  checkedAt: string;
  /** installation-wide counts (every company's jobs); null while Redis is down */
  queues: QueueCounts[] | null;
  /** this company's failed jobs, newest first; null while Redis is down */
  failed: FailedJob[] | null;
  scans: ScanStatus[];
}

/** Where Redis is; tests point it at a port nothing listens on. Default: REDIS_URL. */
export interface JobsRedisOptions {
  redisUrl?: string;
}

const PING_MS = 500;
const READ_MS = 1200;
/** failed jobs looked at per queue, newest first (the queues keep a week of them) */
const FAILED_SCAN = 500;
/** failed jobs shown */
const FAILED_SHOWN = 50;

interface JobsConnection {
  redis: Redis;
  queues: Map<string, Queue>;
  /** the last PING's answer and when: while Redis is down, pages of the shell do not each wait */
  lastCheck?: { up: boolean; at: number };
}

const globalForJobs = globalThis as unknown as { __hlJobHealth?: Map<string, JobsConnection> };

function connection(opts: JobsRedisOptions = {}): JobsConnection {
  const url = opts.redisUrl ?? env().REDIS_URL;
  const all = (globalForJobs.__hlJobHealth ??= new Map());
  let c = all.get(url);
  if (!c) {
    const redis = new Redis(url, {
      enableOfflineQueue: false,
      maxRetriesPerRequest: 1,
      connectTimeout: 1000,
      retryStrategy: (times) => Math.min(times * 200, 2000),
    }).on("error", () => {
      // surfaces as "down" on the next read
    });
    c = { redis, queues: new Map() };
    all.set(url, c);
  }
  return c;
}

function queueOf(c: JobsConnection, name: string): Queue {
  let q = c.queues.get(name);
  if (!q) {
    q = new Queue(name, { connection: c.redis });
    q.on("error", () => {});
    c.queues.set(name, q);
  }
  return q;
}

class Timeout extends Error {}

function within<T>(p: Promise<T>, ms: number): Promise<T> {
  let timer: NodeJS.Timeout | undefined;
  return Promise.race([
    p.finally(() => clearTimeout(timer)),
    new Promise<never>((_, reject) => {
      timer = setTimeout(() => reject(new Timeout(`no answer within ${ms} ms`)), ms);
    }),
  ]);
}

/** Waits up to `ms` for the connection to be ready (a fresh process is still connecting). */
function ready(redis: Redis, ms: number): Promise<boolean> {
  if (redis.status === "ready") return Promise.resolve(true);
  if (redis.status === "end" || redis.status === "close") return Promise.resolve(false);
  return new Promise((resolve) => {
    const done = (up: boolean) => {
      clearTimeout(timer);
      redis.off("ready", onReady);
      resolve(up);
    };
    const onReady = () => done(true);
    const timer = setTimeout(() => done(false), ms);
    redis.once("ready", onReady);
  });
}

/** True when Redis answers a PING within `ms` (never throws). */
async function redisAnswers(c: JobsConnection, ms = PING_MS): Promise<boolean> {
  const start = Date.now();
  let up = false;
  try {
    if (await ready(c.redis, ms)) up = (await within(c.redis.ping(), Math.max(50, ms - (Date.now() - start)))) === "PONG";
  } catch {
    up = false;
  }
  c.lastCheck = { up, at: Date.now() };
  return up;
}

const iso = (ms: number | undefined | null) => (ms ? new Date(ms).toISOString() : null);

async function companyTimeZone(user: CurrentUser): Promise<string> {
  const row = await db()("companies").where({ id: user.companyId }).first<{ time_zone: string } | undefined>("time_zone");
  return row?.time_zone ?? "UTC";
}

async function lastRuns(user: CurrentUser): Promise<Map<string, { last_run_at: Date; last_result: Record<string, unknown> | null }>> {
  const rows: { job: string; last_run_at: Date; last_result: Record<string, unknown> | null }[] = await db()("job_runs")
    .where({ company_id: user.companyId })
    .whereIn("job", SCAN_NAMES)
    .select("job", "last_run_at", "last_result");
  return new Map(rows.map((r) => [r.job, r]));
}

/** Of these jobs, those that belong to the user's company. */
async function companyJobs(user: CurrentUser, jobs: Job[]): Promise<Job[]> {
  const outboxIds = jobs
    .map((j) => (j.data as { outboxId?: unknown } | undefined)?.outboxId)
    .filter((id): id is string => typeof id === "string" && /^[0-9a-f-]{36}$/i.test(id));
  const ours = new Set<string>();
  if (outboxIds.length) {
    const rows: { id: string }[] = await db()("outbox_emails").where({ company_id: user.companyId }).whereIn("id", outboxIds).select("id");
    for (const r of rows) ours.add(r.id);
  }
  return jobs.filter((j) => {
    const data = (j.data ?? {}) as { companyId?: unknown; outboxId?: unknown };
    if (typeof data.companyId === "string") return data.companyId === user.companyId;
    if (typeof data.outboxId === "string") return ours.has(data.outboxId);
    return false;
  });
}

function toFailedJob(queue: string, j: Job): FailedJob {
  return {
    queue,
    id: j.id ?? "",
    name: j.name,
    label: scanByName(j.name)?.label ?? j.name,
    failedReason: j.failedReason || "No reason recorded.",
    attemptsMade: j.attemptsMade,
    failedAt: iso(j.finishedOn ?? j.processedOn ?? j.timestamp),
  };
}

/** Counts per queue, this company's failed jobs, each scan's last and next run. Never throws for Redis. */
export async function jobHealth(user: CurrentUser, opts: JobsRedisOptions = {}): Promise<JobHealth> {
  assertCan(user, "jobs.manage");
  const c = connection(opts);
  const [timeZone, runs, up] = await Promise.all([companyTimeZone(user), lastRuns(user), redisAnswers(c, 800)]);

  let queues: QueueCounts[] | null = null;
  let failed: FailedJob[] | null = null;
  let next = new Map<string, number | undefined>();
  if (up) {
    try {
      const read = async () => {
        const counts = await Promise.all(
          QUEUE_NAMES.map(async (name) => {
            const n = await queueOf(c, name).getJobCounts("waiting", "active", "delayed", "failed", "completed");
            return { name, waiting: n.waiting ?? 0, active: n.active ?? 0, delayed: n.delayed ?? 0, failed: n.failed ?? 0, completed: n.completed ?? 0 };
          }),
        );
        const failedJobs = await Promise.all(
          QUEUE_NAMES.map(async (name) => {
            const jobs = (await queueOf(c, name).getFailed(0, FAILED_SCAN - 1)).filter((j): j is Job => Boolean(j));
            return (await companyJobs(user, jobs)).map((j) => toFailedJob(name, j));
          }),
        );
        const schedulers = await Promise.all(
          SCANS.map(async (s) => [s.name, (await queueOf(c, SCANS_QUEUE).getJobScheduler(schedulerId(s.name, user.companyId)))?.next] as const),
        );
        return { counts, failedJobs, schedulers };
      };
      const r = await within(read(), READ_MS);
      queues = r.counts;
      failed = r.failedJobs
        .flat()
        .sort((a, b) => (b.failedAt ?? "").localeCompare(a.failedAt ?? ""))
        .slice(0, FAILED_SHOWN);
      next = new Map(r.schedulers);
    } catch (e) {
      if (!(e instanceof Timeout) && c.redis.status === "ready") throw e;
      queues = null;
      failed = null;
      c.lastCheck = { up: false, at: Date.now() };
    }
  }

  return {
    redis: queues ? "up" : "down",
    checkedAt: new Date().toISOString(),
    queues,
    failed,
    scans: SCANS.map((s) => {
      const run = runs.get(s.name);
      return {
        name: s.name,
        label: s.label,
        cron: s.cron,
        timeZone,
        lastRunAt: run ? run.last_run_at.toISOString() : null,
        lastResult: run?.last_result ?? null,
        lastResultText: run ? resultInWords(run.last_result) : null,
        nextRunAt: iso(next.get(s.name)),
      };
    }),
  };
}

const queueDown = () =>
  serviceUnavailable("The job queue (Redis) is not answering, so nothing could be queued and alerts are delayed. Stock is not affected; try again once the queue is back.", "QUEUE_UNAVAILABLE");

/** Queues a run of one scan for the user's company now; the worker delivers what it finds at once. */
export async function runScanNow(user: CurrentUser, name: string, now: Date = new Date(), opts: JobsRedisOptions = {}): Promise<{ jobId: string; scan: string }> {
  assertCan(user, "jobs.manage");
  if (!SCAN_NAMES.includes(name)) {
    throw new AppError(404, "NOT_FOUND", `No scan called "${name}". The scans are: ${SCAN_NAMES.join(", ")}.`, { scans: SCAN_NAMES });
  }
  const c = connection(opts);
  // only a ready connection is asked: a queued command would run later, after we said 503
  if (!(await redisAnswers(c, 800))) throw queueDown();
  try {
    const jobId = await within(enqueueScanNow(queueOf(c, SCANS_QUEUE), name, user.companyId, now), READ_MS);
    return { jobId, scan: name };
  } catch (e) {
    if (e instanceof AppError) throw e;
    c.lastCheck = { up: false, at: Date.now() };
    throw queueDown();
  }
}

/** Runs a failed job of the user's company again. Unknown, not failed or another company's: 404 / 409. */
export async function retryFailedJob(user: CurrentUser, queueName: string, jobId: string, opts: JobsRedisOptions = {}): Promise<{ queue: string; id: string; state: string }> {
  assertCan(user, "jobs.manage");
  if (!(QUEUE_NAMES as readonly string[]).includes(queueName)) throw notFound("Queue");
  const c = connection(opts);
  if (!(await redisAnswers(c, 800))) throw queueDown();
  const queue = queueOf(c, queueName);
  const job = await within(queue.getJob(jobId), READ_MS).catch(() => {
    throw queueDown();
  });
  if (!job || (await companyJobs(user, [job])).length === 0) throw notFound("Failed job");
  const state = await within(job.getState(), READ_MS);
  if (state !== "failed") throw conflict(`This job is not failed (it is ${state}), so there is nothing to retry.`, "JOB_NOT_FAILED", { state });
  const outboxId = (job.data as { outboxId?: unknown }).outboxId;
  if (typeof outboxId === "string") {
    // the worker marked the e-mail failed after its last attempt; it must be pending to be sent
    await db()("outbox_emails").where({ id: outboxId, company_id: user.companyId, status: "failed" }).update({ status: "pending", last_error: null });
  }
  await within(job.retry("failed", { resetAttemptsMade: true }), READ_MS);
  return { queue: queueName, id: jobId, state: "waiting" };
}

export type AlertsDelay = { delayed: false; reason: null } | { delayed: true; reason: "queue-down" | "scan-late"; lastRunAt: string | null };

const REMEMBER_MS = 5000;

/**
 * Whether the user's alerts are delayed, for the shell and the alerts page: the job queue does not
 * answer a PING within 500 ms (a "down" is remembered for 5 s), or the company's last expiry scan is over 26 h
 * old (a company that never ran counts only once it is a day old: its first scan is the next
 * morning). Never throws, never waits more than about half a second; false for people who get no
 * alerts.
 */
export async function alertsDelayed(user: CurrentUser, opts: JobsRedisOptions = {}): Promise<AlertsDelay> {
  if (!canSomewhere(user, "alerts.read") && !can(user, "jobs.manage")) return { delayed: false, reason: null };
  try {
    const c = connection(opts);
    // a "down" is remembered a few seconds (each page would wait 500 ms otherwise); "up" costs a PING
    const knownDown = c.lastCheck && !c.lastCheck.up && Date.now() - c.lastCheck.at < REMEMBER_MS;
    const [up, scan, company] = await Promise.all([
      knownDown ? false : redisAnswers(c, PING_MS),
      lastExpiryScan(user),
      db()("companies").where({ id: user.companyId }).first<{ created_at: Date } | undefined>("created_at"),
    ]);
    if (!up) return { delayed: true, reason: "queue-down", lastRunAt: scan.lastRunAt };
    const dayOld = company ? Date.now() - company.created_at.getTime() > 26 * 3600_000 : false;
    if (scan.late && (scan.lastRunAt || dayOld)) return { delayed: true, reason: "scan-late", lastRunAt: scan.lastRunAt };
    return { delayed: false, reason: null };
  } catch {
    return { delayed: false, reason: null };
  }
}

/** Closes the connections this module opened (tests). */
export async function closeJobHealthConnections(): Promise<void> {
  const all = globalForJobs.__hlJobHealth;
  if (!all) return;
  globalForJobs.__hlJobHealth = undefined;
  for (const c of all.values()) {
    await Promise.allSettled([...c.queues.values()].map((q) => within(q.close(), 1000)));
    c.redis.disconnect();
  }
}
