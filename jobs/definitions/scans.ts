// The alert scans, in one registry: what each is called, when it runs and what it runs. The worker
// (jobs/worker.ts), the job health page and POST /api/jobs/:name/run all read this list.
//
// Scheduling: one BullMQ job scheduler per company and scan, at the scan's local time in the
// company's time zone, upserted when the worker starts and every hour after (new companies, time
// zone changes; schedulers of deleted companies are removed). Scheduler ids are `<scan>:<companyId>`.
// BullMQ does not backfill missed runs, so on start the worker also enqueues a run of every scan
// whose last run (job_runs) is older than its period; the job id carries the day, so a restart loop
// adds it once.
import type { Queue } from "bullmq";
import type { Knex } from "knex";
import { SCAN_JOB_OPTIONS } from "../queues";
import { EXPIRY_SCAN_JOB, runExpiryScan } from "./expiry-scan";
import { REORDER_SCAN_JOB, runReorderScan } from "./reorder-scan";
import { runShortageScan, SHORTAGE_SCAN_JOB } from "./shortage-scan";

export interface ScanDefinition {
  name: string;
  /** what the scan looks for, for the job health page */
  label: string;
  /** cron pattern, local time of the company */
  cron: string;
  /** a run older than this is overdue (the worker runs it at once on start) */
  periodMs: number;
  run(knex: Knex, data: unknown, now?: Date): Promise<unknown>;
}

const DAY = 24 * 3600 * 1000;

export const SCANS: readonly ScanDefinition[] = [
  { name: EXPIRY_SCAN_JOB, label: "Lots nearing their date", cron: "0 5 * * *", periodMs: DAY, run: runExpiryScan },
  { name: REORDER_SCAN_JOB, label: "Items below their reorder point", cron: "15 5 * * *", periodMs: DAY, run: runReorderScan },
  { name: SHORTAGE_SCAN_JOB, label: "Batches of the next 7 days short of stock", cron: "30 5 * * *", periodMs: DAY, run: runShortageScan },
];

export const SCAN_NAMES = SCANS.map((s) => s.name);

export function scanByName(name: string): ScanDefinition | undefined {
  return SCANS.find((s) => s.name === name);
}

export const schedulerId = (scan: string, companyId: string) => `${scan}:${companyId}`;

/** Upserts every company's scheduler of every scan and removes those of companies that are gone. Returns the number of companies. */
export async function syncScanSchedulers(knex: Knex, queue: Queue): Promise<number> {
  const companies: { id: string; time_zone: string }[] = await knex("companies").select("id", "time_zone");
  const wanted = new Set<string>();
  for (const scan of SCANS) {
    for (const c of companies) {
      const id = schedulerId(scan.name, c.id);
      wanted.add(id);
      await queue.upsertJobScheduler(id, { pattern: scan.cron, tz: c.time_zone }, { name: scan.name, data: { companyId: c.id }, opts: SCAN_JOB_OPTIONS });
    }
  }
  for (const s of await queue.getJobSchedulers()) {
    const id = s.id ?? s.key;
    if (SCANS.some((scan) => id.startsWith(`${scan.name}:`)) && !wanted.has(id)) await queue.removeJobScheduler(id);
  }
  return companies.length;
}

/** (company, scan) pairs whose last run is older than the scan's period, or that never ran, as of `now`. */
export async function overdueScans(knex: Knex, now: Date = new Date()): Promise<{ companyId: string; scan: string }[]> {
  const out: { companyId: string; scan: string }[] = [];
  for (const scan of SCANS) {
    const rows: { id: string }[] = await knex("companies as c")
      .leftJoin("job_runs as r", function () {
        this.on("r.company_id", "c.id").andOnVal("r.job", scan.name);
      })
      .where((q) => q.whereNull("r.last_run_at").orWhere("r.last_run_at", "<", new Date(now.getTime() - scan.periodMs)))
      .orderBy("c.id")
      .select("c.id");
    out.push(...rows.map((r) => ({ companyId: r.id, scan: scan.name })));
  }
  return out;
}

/** Enqueues a catch-up run per overdue (company, scan); returns how many. */
export async function enqueueOverdueScans(knex: Knex, queue: Queue, now: Date = new Date()): Promise<number> {
  const due = await overdueScans(knex, now);
  const day = now.toISOString().slice(0, 10);
  if (due.length) {
    await queue.addBulk(due.map(({ companyId, scan }) => ({ name: scan, data: { companyId }, opts: { ...SCAN_JOB_OPTIONS, jobId: `${scan}-catch-up-${companyId}-${day}` } })));
  }
  return due.length;
}

/** "Run now" (POST /api/jobs/:name/run): a run of one scan for one company, delivering at once. */
export async function enqueueScanNow(queue: Queue, scan: string, companyId: string, now: Date = new Date()): Promise<string> {
  const job = await queue.add(scan, { companyId, deliverNow: true }, { ...SCAN_JOB_OPTIONS, jobId: `${scan}-now-${companyId}-${now.getTime()}` });
  return job.id!;
}
