// The job health API (GET /api/jobs, POST /api/jobs/:name/run, POST /api/jobs/failed/:queue/:id/retry)
// and the shell's "alerts are delayed", against the real Redis and the worker db/test.sh started;
// "Redis down" is a port nothing listens on. Expiry windows are the product's defaults (issue 6:
// casings 30/7 days), the schedule is the registry's (jobs/definitions/scans.ts: 05:00 local).
import { createServer } from "node:net";
import { Queue, type Job } from "bullmq";
import { Redis } from "ioredis";
import { addDays, formatISO } from "date-fns";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as healthRoute } from "../../app/api/jobs/route";
import { POST as runRoute } from "../../app/api/jobs/[name]/run/route";
import { POST as retryRoute } from "../../app/api/jobs/failed/[queue]/[id]/retry/route";
import { db } from "../../db/client";
import { EXPIRY_SCAN_JOB } from "../../jobs/definitions/expiry-scan";
import { SCAN_NAMES, SCANS, schedulerId, syncScanSchedulers } from "../../jobs/definitions/scans";
import { QUEUE_NAMES, SCAN_JOB_OPTIONS, SCANS_QUEUE } from "../../jobs/queues";
import { AppError } from "../../lib/http/errors";
import { alertsDelayed, closeJobHealthConnections, jobHealth, runScanNow } from "../../lib/data/job-health";
import { postMovement } from "../../lib/data/ledger";
import { call } from "../support/http";
import { createCompany, tag, type TestCompany } from "../support/factory";
import { currentUser, sessionCookieFor } from "../support/sessions";
import { createItem } from "../support/stock";

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function until<T>(what: string, read: () => Promise<T>, ok: (v: T) => boolean, ms = 15_000): Promise<T> {
  const end = Date.now() + ms;
  for (;;) {
    const v = await read();
    if (ok(v)) return v;
    if (Date.now() > end) throw new Error(`Timed out waiting for ${what}; last: ${JSON.stringify(v)}`);
    await sleep(150);
  }
}

/** A port nothing listens on (taken from the OS, then released). */
async function deadPort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((r) => server.listen(0, "127.0.0.1", r));
  const port = (server.address() as { port: number }).port;
  await new Promise((r) => server.close(r));
  return port;
}

let co: TestCompany;
let other: TestCompany;
const cookies: Record<string, string> = {};
let queue: Queue;
/** when the test companies count as scanned (so the catch-up runs other files enqueue leave them alone) */
const markedAt = new Date(Date.now() - 3600_000);
const markScanned = (companyId: string, at: Date) =>
  db()("job_runs").insert(SCANS.map((s) => ({ company_id: companyId, job: s.name, last_run_at: at, last_result: "{}" })));

const health = (who: string) => call(healthRoute, { path: "/api/jobs", cookie: cookies[who] });
const runNow = (who: string, name: string) => call(runRoute, { path: `/api/jobs/${name}/run`, method: "POST", params: { name }, cookie: cookies[who] });
const retry = (who: string, q: string, id: string) =>
  call(retryRoute, { path: `/api/jobs/failed/${q}/${encodeURIComponent(id)}/retry`, method: "POST", params: { queue: q, id }, cookie: cookies[who] });

/** A scans job the worker cannot run (an unknown scan: UnrecoverableError), belonging to a company. */
async function failingJob(companyId: string): Promise<Job> {
  const job = await queue.add(`no-such-scan-${tag()}`, { companyId }, { ...SCAN_JOB_OPTIONS, jobId: `test-fail-${tag()}` });
  await until("the worker to fail the job", () => job.getState(), (s) => s === "failed");
  return (await queue.getJob(job.id!))!;
}

beforeAll(async () => {
  co = await createCompany({ kitchens: 1 });
  other = await createCompany({ kitchens: 1 });
  await markScanned(co.company.id, markedAt);
  await markScanned(other.company.id, markedAt);
  for (const role of ["admin", "manager", "buyer", "kitchen_lead", "accountant"] as const) cookies[role] = await sessionCookieFor(co.users[role].id);
  cookies.otherAdmin = await sessionCookieFor(other.users.admin.id);
  queue = new Queue(SCANS_QUEUE, { connection: new Redis(process.env.REDIS_URL!, { maxRetriesPerRequest: null }) });
});

afterAll(async () => {
  await queue.close();
  await closeJobHealthConnections();
});

describe("GET /api/jobs", () => {
  it("counts every queue; a job added shows in its queue's count", async () => {
    const before = await health("admin");
    expect(before.status).toBe(200);
    expect(before.body.redis).toBe("up");
    expect(before.body.queues.map((q: { name: string }) => q.name)).toEqual([...QUEUE_NAMES]);
    const delayedBefore = before.body.queues.find((q: { name: string }) => q.name === SCANS_QUEUE).delayed;
    // a job due in an hour is "delayed" until then; the worker leaves it alone
    const job = await queue.add(`count-check-${tag()}`, { companyId: other.company.id }, { delay: 3600_000, jobId: `test-count-${tag()}` });
    const after = await health("admin");
    expect(after.body.queues.find((q: { name: string }) => q.name === SCANS_QUEUE).delayed).toBeGreaterThanOrEqual(delayedBefore + 1);
    await job.remove();
  });

  it("lists each scan of the registry with its schedule in the company's zone and the next run from its scheduler", async () => {
    let r = await health("admin");
    expect(r.body.scans.map((s: { name: string }) => s.name)).toEqual(SCAN_NAMES);
    const expiry = r.body.scans.find((s: { name: string }) => s.name === EXPIRY_SCAN_JOB);
    expect(expiry).toMatchObject({
      label: SCANS.find((s) => s.name === EXPIRY_SCAN_JOB)!.label, cron: "0 5 * * *", timeZone: "Europe/London",
      lastRunAt: markedAt.toISOString(), lastResult: {}, lastResultText: "Finished",
    });

    await syncScanSchedulers(db(), queue); // what the worker does hourly: this new company gets its schedulers
    r = await health("admin");
    const next = r.body.scans.find((s: { name: string }) => s.name === EXPIRY_SCAN_JOB).nextRunAt as string;
    const scheduler = await queue.getJobScheduler(schedulerId(EXPIRY_SCAN_JOB, co.company.id));
    expect(next).toBe(new Date(scheduler!.next!).toISOString());
    const local = new Intl.DateTimeFormat("en-GB", { timeZone: "Europe/London", hour: "2-digit", minute: "2-digit", hourCycle: "h23" }).format(new Date(next));
    expect(local).toBe("05:00");
    expect(new Date(next).getTime()).toBeGreaterThan(Date.now());
    expect(new Date(next).getTime() - Date.now()).toBeLessThanOrEqual(25 * 3600_000);
  });

  it("shows this company's failed jobs with their reason, and never another company's", async () => {
    const ours = await failingJob(co.company.id);
    const theirs = await failingJob(other.company.id);
    const r = await health("admin");
    const mine = r.body.failed.find((j: { id: string }) => j.id === ours.id);
    expect(mine).toMatchObject({ queue: SCANS_QUEUE, name: ours.name, label: ours.name, failedReason: `Unknown scan job ${ours.name}`, attemptsMade: 1 });
    expect(mine.failedAt).toBe(new Date(ours.finishedOn!).toISOString());
    expect(r.body.failed.some((j: { id: string }) => j.id === theirs.id)).toBe(false);

    const o = await health("otherAdmin");
    expect(o.body.failed.some((j: { id: string }) => j.id === ours.id)).toBe(false);
    expect(o.body.failed.some((j: { id: string }) => j.id === theirs.id)).toBe(true);
  });

  it("is for admins only", async () => {
    for (const role of ["manager", "buyer", "kitchen_lead", "accountant"]) expect((await health(role)).status, role).toBe(403);
    expect((await call(healthRoute, { path: "/api/jobs" })).status).toBe(401);
  });
});

describe("POST /api/jobs/failed/:queue/:id/retry", () => {
  it("runs a failed job of the company again, attempts counted afresh", async () => {
    const job = await failingJob(co.company.id);
    const firstFinished = job.finishedOn!;
    const r = await retry("admin", SCANS_QUEUE, job.id!);
    expect(r.status).toBe(200);
    expect(r.body).toEqual({ queue: SCANS_QUEUE, id: job.id, state: "waiting" });
    // it left the failed set and ran again: the worker fails it anew (an unknown scan never succeeds)
    const again = await until("the job to run again", async () => (await queue.getJob(job.id!))!, (j) => (j.finishedOn ?? 0) > firstFinished);
    expect(again.attemptsMade).toBe(1);
    expect(again.failedReason).toBe(`Unknown scan job ${job.name}`);
  });

  it("refuses another company's job (404), jobs that are not failed (409), unknown queues and ids (404), non-admins (403)", async () => {
    const job = await failingJob(co.company.id);
    expect((await retry("otherAdmin", SCANS_QUEUE, job.id!)).status).toBe(404);
    expect((await retry("admin", SCANS_QUEUE, `nope-${tag()}`)).status).toBe(404);
    expect((await retry("admin", "no-such-queue", job.id!)).status).toBe(404);
    expect((await retry("manager", SCANS_QUEUE, job.id!)).status).toBe(403);

    const later = await queue.add(EXPIRY_SCAN_JOB, { companyId: co.company.id }, { delay: 3600_000, jobId: `test-later-${tag()}` });
    const notFailed = await retry("admin", SCANS_QUEUE, later.id!);
    expect(notFailed.status).toBe(409);
    expect(notFailed.body.error).toMatchObject({ code: "JOB_NOT_FAILED", details: { state: "delayed" } });
    await later.remove();
  });
});

describe("POST /api/jobs/:name/run", () => {
  it("queues the scan for the company at once (202); the worker runs it within seconds and the page shows what it found", async () => {
    const item = await createItem(co.company.id, { category: "casing", trackLots: true, trackDates: true });
    await postMovement(await currentUser(co.users.manager.id), {
      kind: "receipt", kitchen: co.kitchens[0]!.code, item: item.sku, quantity: "3", unit: "pc",
      lot: { code: `L-${tag()}`, date: formatISO(addDays(new Date(), 6), { representation: "date" }), dateKind: "best_before", unitCost: "1" },
    } as never);
    const before = await db()("job_runs").where({ company_id: co.company.id, job: EXPIRY_SCAN_JOB }).first();
    expect(before.last_run_at).toEqual(markedAt);

    const r = await runNow("admin", EXPIRY_SCAN_JOB);
    expect(r.status).toBe(202);
    expect(r.body.scan).toBe(EXPIRY_SCAN_JOB);
    const job = await queue.getJob(r.body.jobId);
    expect(job?.data).toEqual({ companyId: co.company.id, deliverNow: true });

    const run = await until(
      "job_runs to move",
      () => db()("job_runs").where({ company_id: co.company.id, job: EXPIRY_SCAN_JOB }).first(),
      (row) => row.last_run_at > before.last_run_at,
      10_000,
    );
    // a casing lot 6 days from its date has crossed the 30- and 7-day windows: the most urgent, one alert
    expect(run.last_result).toMatchObject({ status: "done", lotsChecked: 1, created: 1 });
    const h = await health("admin");
    expect(h.body.scans.find((s: { name: string }) => s.name === EXPIRY_SCAN_JOB)).toMatchObject({
      lastRunAt: run.last_run_at.toISOString(),
      lastResultText: "1 new alert, 1 lot checked",
    });
  });

  it("names the scans when the name is unknown (404); non-admins get 403", async () => {
    const r = await runNow("admin", "tidy-the-larder");
    expect(r.status).toBe(404);
    for (const name of SCAN_NAMES) expect(r.body.error.message).toContain(name);
    expect(r.body.error.details.scans).toEqual(SCAN_NAMES);
    for (const role of ["manager", "buyer", "kitchen_lead", "accountant"]) expect((await runNow(role, EXPIRY_SCAN_JOB)).status, role).toBe(403);
    expect((await runNow("manager", "tidy-the-larder")).status).toBe(403);
  });
});

describe("while Redis is unreachable", () => {
  it("the health answers within 2 s with redis down and the last runs the database knows; run-now is 503", async () => {
    const admin = await currentUser(co.users.admin.id);
    const redisUrl = `redis://127.0.0.1:${await deadPort()}`;
    const lastRun = await db()("job_runs").where({ company_id: co.company.id, job: EXPIRY_SCAN_JOB }).first();

    const t0 = Date.now();
    const h = await jobHealth(admin, { redisUrl });
    expect(Date.now() - t0).toBeLessThan(2000);
    expect(h).toMatchObject({ redis: "down", queues: null, failed: null });
    expect(h.scans.find((s) => s.name === EXPIRY_SCAN_JOB)).toMatchObject({ lastRunAt: lastRun.last_run_at.toISOString(), nextRunAt: null });

    const t1 = Date.now();
    const err = await runScanNow(admin, EXPIRY_SCAN_JOB, new Date(), { redisUrl }).catch((e: unknown) => e);
    expect(Date.now() - t1).toBeLessThan(2000);
    expect(err).toBeInstanceOf(AppError);
    expect(err).toMatchObject({ status: 503, code: "QUEUE_UNAVAILABLE" });
    expect((err as AppError).message).toMatch(/not answering.*alerts are delayed/);

    const t2 = Date.now();
    expect(await alertsDelayed(admin, { redisUrl })).toMatchObject({ delayed: true, reason: "queue-down" });
    expect(Date.now() - t2).toBeLessThan(1000);
    // a manager sees the same delay (alerts.read), still without an error
    expect(await alertsDelayed(await currentUser(co.users.manager.id), { redisUrl })).toMatchObject({ delayed: true, reason: "queue-down" });
  });
});

describe("alertsDelayed with Redis up", () => {
  it("not delayed after a recent scan, nor for a new company that has not had its first morning yet; late after 26 h", async () => {
    const admin = await currentUser(co.users.admin.id);
    expect(await alertsDelayed(admin)).toEqual({ delayed: false, reason: null }); // ran above

    const fresh = await createCompany({ kitchens: 1 }); // never ran, but its first morning has not come yet
    expect(await alertsDelayed(await currentUser(fresh.users.admin.id))).toEqual({ delayed: false, reason: null });

    // (an old company that never ran: tests/e2e/job-health.spec.ts; here the catch-up runs other
    // files enqueue for overdue companies could run it meanwhile)
    const old = await createCompany({ kitchens: 1 });
    const twoDaysAgo = new Date(Date.now() - 48 * 3600_000);
    await db()("companies").where({ id: old.company.id }).update({ created_at: twoDaysAgo });
    await markScanned(old.company.id, twoDaysAgo);
    const oldAdmin = await currentUser(old.users.admin.id);
    expect(await alertsDelayed(oldAdmin)).toEqual({ delayed: true, reason: "scan-late", lastRunAt: twoDaysAgo.toISOString() });
    // accountants get no alerts: never delayed for them
    expect(await alertsDelayed(await currentUser(old.users.accountant.id))).toEqual({ delayed: false, reason: null });
  });
});
