// The expiry scan against the real database with an injected clock, and the worker started by
// db/test.sh running a scan job enqueued on the real Redis. Windows are the product's defaults
// (issue 6: cure 60/30/7, casing 30/7, spice 90/30 days), not trade figures.
import { Queue, UnrecoverableError } from "bullmq";
import { Redis } from "ioredis";
import { addDays, formatISO } from "date-fns";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "../../db/client";
import { dateInZone } from "../../lib/alerts/expiry";
import { postMovement } from "../../lib/data/ledger";
import {
  EXPIRY_SCAN_JOB, expiryScanPayload, runExpiryScan,
} from "../../jobs/definitions/expiry-scan";
import { enqueueOverdueScans, overdueScans, SCANS, syncScanSchedulers } from "../../jobs/definitions/scans";
import { SCAN_JOB_OPTIONS, SCANS_QUEUE } from "../../jobs/queues";
import { createCompany, tag, type TestCompany } from "../support/factory";
import { currentUser } from "../support/sessions";
import { createItem } from "../support/stock";

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
// the injected clock: noon UTC today, so the company's local date is stable in Europe/London
const NOW = new Date(`${new Date().toISOString().slice(0, 10)}T12:00:00Z`);
const plusDays = (n: number) => formatISO(addDays(NOW, n), { representation: "date" });

async function receiveLot(co: TestCompany, kitchenIndex: number, category: "cure" | "casing" | "spice" | "ingredient", daysOut: number, quantity = "500") {
  const item = await createItem(co.company.id, { category, trackLots: true, trackDates: true });
  const manager = await currentUser(co.users.manager.id);
  const code = `L-${tag()}`;
  const [m] = await postMovement(manager, {
    kind: "receipt", kitchen: co.kitchens[kitchenIndex]!.code, item: item.sku, quantity, unit: category === "casing" ? "pc" : "g",
    lot: { code, date: plusDays(daysOut), dateKind: "best_before", unitCost: "0.01" },
  } as never);
  return { itemId: item.id, lotId: m!.lot.id as string, code };
}

const alertsOf = (companyId: string) =>
  db()("alerts").where({ company_id: companyId }).orderBy([{ column: "subject_id" }, { column: "threshold_days", order: "desc" }]);

let co: TestCompany;
let other: TestCompany;
beforeAll(async () => {
  co = await createCompany({ kitchens: 2 });
  other = await createCompany({ kitchens: 1 });
});

describe("runExpiryScan", () => {
  it("raises the most urgent threshold crossed, one at a time as days pass; none outside the window; none new when run again", async () => {
    const far = await receiveLot(co, 0, "cure", 65);
    const near = await receiveLot(co, 0, "cure", 59);
    const nearer = await receiveLot(co, 0, "cure", 29, "125.5");
    await receiveLot(co, 0, "ingredient", 3); // ingredients have no window by default
    const theirs = await receiveLot(other, 0, "cure", 5);

    const first = await runExpiryScan(db(), { companyId: co.company.id }, NOW);
    expect(first).toMatchObject({ status: "done", today: dateInZone(NOW, "Europe/London"), created: 2 });

    const rows = await alertsOf(co.company.id);
    expect(rows.filter((r) => r.subject_id === far.lotId)).toHaveLength(0);
    expect(rows.filter((r) => r.subject_id === near.lotId).map((r) => r.threshold_days)).toEqual([60]);
    const nearerRows = rows.filter((r) => r.subject_id === nearer.lotId);
    expect(nearerRows.map((r) => r.threshold_days)).toEqual([30]); // first seen past 60 and 30: only 30
    expect(nearerRows[0]).toMatchObject({ kind: "expiry", subject_type: "lot", kitchen_id: co.kitchens[0]!.id, episode: 0 });
    expect(nearerRows[0].data).toMatchObject({ lotCode: nearer.code, quantity: "125.5", unit: "g", daysLeft: 29, category: "cure", date: plusDays(29) });
    expect(rows.some((r) => r.subject_id === theirs.lotId)).toBe(false); // another company's lots never appear

    const again = await runExpiryScan(db(), { companyId: co.company.id }, NOW);
    expect(again).toMatchObject({ status: "done", created: 0, crossed: 2 });
    expect(await alertsOf(co.company.id)).toHaveLength(2);

    // 25 days pass: the 59-day lot has 34 left (60 stored, 30 not yet), the 29-day lot 4 (7), the 65-day 40 (60)
    const mid = await runExpiryScan(db(), { companyId: co.company.id }, addDays(NOW, 25));
    expect(mid).toMatchObject({ created: 2 });
    // 55 days pass: the 65-day lot has 10 left (30), the 59-day lot 4 (7), the 29-day lot expired 26
    // days ago (7 already stored: nothing); a lot crossing 60, then 30, then 7 made three alerts
    const later = await runExpiryScan(db(), { companyId: co.company.id }, addDays(NOW, 55));
    expect(later).toMatchObject({ created: 2 });
    const after = await alertsOf(co.company.id);
    expect(after.filter((r) => r.subject_id === near.lotId).map((r) => r.threshold_days)).toEqual([60, 7]); // 30 was passed between runs at 34 and 4 days
    expect(after.filter((r) => r.subject_id === far.lotId).map((r) => r.threshold_days)).toEqual([60, 30]);
    expect(after.filter((r) => r.subject_id === nearer.lotId).map((r) => r.threshold_days)).toEqual([30, 7]);
    expect(after.find((r) => r.subject_id === nearer.lotId && r.threshold_days === 7)).toMatchObject({ title: expect.stringContaining("4 days left") });

    const run = await db()("job_runs").where({ company_id: co.company.id, job: EXPIRY_SCAN_JOB }).first();
    expect(run.last_run_at.toISOString()).toBe(addDays(NOW, 55).toISOString());
    expect(await alertsOf(other.company.id)).toHaveLength(0);
  });

  it("keeps a lot's alerts per kitchen, skips lots with nothing on hand, and follows the company's windows", async () => {
    const c = await createCompany({ kitchens: 2 });
    const a = await receiveLot(c, 0, "spice", 20);
    const b = await receiveLot(c, 1, "spice", 20);
    // used up: nothing on hand, no alert
    const lead = await currentUser(c.users.manager.id);
    await postMovement(lead, { kind: "use", kitchen: c.kitchens[1]!.code, item: (await db()("items").where({ id: b.itemId }).first()).sku, quantity: "500", unit: "g", lot: b.lotId } as never);
    await db()("companies").where({ id: c.company.id }).update({ expiry_windows: JSON.stringify({ spice: [21, 14] }) });
    expect(await runExpiryScan(db(), { companyId: c.company.id }, NOW)).toMatchObject({ created: 1 });
    const rows = await alertsOf(c.company.id);
    expect(rows.map((r) => [r.subject_id, r.kitchen_id, r.threshold_days])).toEqual([[a.lotId, c.kitchens[0]!.id, 21]]);
  });

  it("refuses a bad payload as unrecoverable and finishes for a deleted company", async () => {
    await expect(runExpiryScan(db(), {}, NOW)).rejects.toBeInstanceOf(UnrecoverableError);
    await expect(runExpiryScan(db(), { companyId: "nope" }, NOW)).rejects.toBeInstanceOf(UnrecoverableError);
    expect(() => expiryScanPayload(null)).toThrow(UnrecoverableError);
    expect(await runExpiryScan(db(), { companyId: crypto.randomUUID() }, NOW)).toEqual({ status: "company-gone" });
  });

  it("finds companies whose last scan is older than a day", async () => {
    const c = await createCompany({ kitchens: 1 });
    const overdue = async (at: Date) => (await overdueScans(db(), at)).filter((o) => o.scan === EXPIRY_SCAN_JOB).map((o) => o.companyId);
    expect(await overdue(NOW)).toContain(c.company.id); // never ran
    await runExpiryScan(db(), { companyId: c.company.id }, NOW);
    const hours = (h: number) => new Date(NOW.getTime() + h * 3600_000);
    expect(await overdue(hours(23))).not.toContain(c.company.id);
    expect(await overdue(hours(25))).toContain(c.company.id);
  });
});

describe("the worker", () => {
  let queue: Queue;
  beforeAll(() => {
    queue = new Queue(SCANS_QUEUE, { connection: new Redis(process.env.REDIS_URL!, { maxRetriesPerRequest: null }) });
  });
  afterAll(async () => {
    await queue.close();
  });

  it("runs an expiry scan enqueued on the real Redis and stores its alerts", async () => {
    const c = await createCompany({ kitchens: 1 });
    const lot = await receiveLot(c, 0, "casing", 6); // today's real date: casings 30/7 -> past both: the 7-day alert
    await queue.add(EXPIRY_SCAN_JOB, { companyId: c.company.id }, { ...SCAN_JOB_OPTIONS, jobId: `test-${c.company.id}` });
    let rows: { threshold_days: number }[] = [];
    for (let i = 0; i < 100 && rows.length < 1; i++) {
      await sleep(150);
      rows = await db()("alerts").where({ company_id: c.company.id, subject_id: lot.lotId }).orderBy("threshold_days", "desc");
    }
    const job = await queue.getJob(`test-${c.company.id}`);
    for (let i = 0; i < 50 && (await job?.getState()) !== "completed"; i++) await sleep(100);
    expect(await job?.getState()).toBe("completed");
    expect(rows.map((r) => r.threshold_days)).toEqual([7]);
  });

  it("keeps one scheduler per company and scan in the company's time zone, and drops those of deleted companies", async () => {
    const c = await createCompany({ kitchens: 1, timeZone: "America/Chicago" });
    const gone = await createCompany({ kitchens: 0 });
    await syncScanSchedulers(db(), queue);
    const ours = async () => (await queue.getJobSchedulers(0, -1)).filter((s) => [c.company.id, gone.company.id].some((id) => (s.id ?? s.key).endsWith(id)));
    const expected = (companies: [string, string][]) =>
      SCANS.flatMap((scan) => companies.map(([id, tz]) => [`${scan.name}:${id}`, scan.cron, tz])).sort();
    expect((await ours()).map((s) => [s.id ?? s.key, s.pattern, s.tz]).sort()).toEqual(
      expected([[c.company.id, "America/Chicago"], [gone.company.id, "Europe/London"]]),
    );
    expect(SCANS.find((s) => s.name === EXPIRY_SCAN_JOB)?.cron).toBe("0 5 * * *"); // 05:00 local
    await syncScanSchedulers(db(), queue); // again: still one each
    expect(await ours()).toHaveLength(2 * SCANS.length);
    await db()("app_users").where({ company_id: gone.company.id }).delete();
    await db()("companies").where({ id: gone.company.id }).delete();
    await syncScanSchedulers(db(), queue);
    expect((await ours()).map((s) => s.id ?? s.key).sort()).toEqual(expected([[c.company.id, "America/Chicago"]]).map((e) => e[0]));
  });

  it("catch-up runs: enqueued for overdue companies, once per day however often the worker starts", async () => {
    const c = await createCompany({ kitchens: 1 });
    await receiveLot(c, 0, "spice", 10);
    const now = new Date();
    await enqueueOverdueScans(db(), queue, now);
    await enqueueOverdueScans(db(), queue, now); // a restart: same job id, nothing added
    let run: { last_result: { created: number } } | undefined;
    for (let i = 0; i < 100 && !run; i++) {
      await sleep(150);
      run = await db()("job_runs").where({ company_id: c.company.id, job: EXPIRY_SCAN_JOB }).first();
    }
    expect(run?.last_result).toMatchObject({ status: "done", created: 1 }); // spices 90/30: 10 days left, the 30-day alert
    expect(await db()("alerts").where({ company_id: c.company.id })).toHaveLength(1);
  });
});
