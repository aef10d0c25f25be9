// The job health page's calls to the API (client-safe: fetch only; the data layer's types are
// erased at build time).
import type { JobHealth } from "@/lib/data/job-health";
import { apiFetch } from "./api";
import { newIdempotencyKey } from "./stock";

export type { FailedJob, JobHealth, QueueCounts, ScanStatus } from "@/lib/data/job-health";

export const jobKeys = { health: ["jobs", "health"] as const };

/** GET /api/jobs */
export const fetchJobHealth = () => apiFetch<JobHealth>("/api/jobs");

/** POST /api/jobs/:name/run (202). One Idempotency-Key per press. */
export const runScanNow = (name: string) =>
  apiFetch<{ jobId: string; scan: string }>(`/api/jobs/${encodeURIComponent(name)}/run`, { method: "POST", headers: { "idempotency-key": newIdempotencyKey() } });

/** POST /api/jobs/failed/:queue/:id/retry */
export const retryFailedJob = (queue: string, id: string) =>
  apiFetch<{ queue: string; id: string; state: string }>(`/api/jobs/failed/${encodeURIComponent(queue)}/${encodeURIComponent(id)}/retry`, {
    method: "POST",
    headers: { "idempotency-key": newIdempotencyKey() },
  });
