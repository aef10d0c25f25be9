// job_runs: the last run of each company's scan (one row per company and job). The worker reads it
// to run at once what a missed schedule skipped; the job health page shows it.
import { UnrecoverableError } from "bullmq";
import type { Knex } from "knex";

/** Records a finished run. A company deleted meanwhile has nothing to record (its FK fails: ignored). */
export async function recordJobRun(knex: Knex, companyId: string, job: string, now: Date, result: unknown): Promise<void> {
  await knex("job_runs")
    .insert({ company_id: companyId, job, last_run_at: now, last_result: JSON.stringify(result) })
    .onConflict(["company_id", "job"])
    .merge()
    .catch((e: { code?: string }) => {
      if (e.code !== "23503") throw e;
    });
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/**
 * A scan's payload: `{ companyId }`, plus `deliverNow` when an admin pressed "run now" (the worker
 * then delivers what the scan found at once, as if every recipient's digest hour had come).
 * Anything else can never succeed, so it is not retried.
 */
export function scanPayload(job: string, data: unknown): { companyId: string; deliverNow: boolean } {
  const d = (data ?? {}) as { companyId?: unknown; deliverNow?: unknown };
  if (typeof d.companyId !== "string" || !UUID.test(d.companyId)) throw new UnrecoverableError(`${job}: the payload needs a companyId (uuid).`);
  return { companyId: d.companyId, deliverNow: d.deliverNow === true };
}
