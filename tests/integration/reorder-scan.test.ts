// The reorder scan against the real database with an injected clock, and the worker started by
// db/test.sh running a reorder-scan job added on the real Redis.
// Figures: the purchasing issue's rule as lib/reorder/suggest.ts states it (projected = on hand -
// reserved - planned use not yet reserved + open orders, within the supplier's lead time; below when
// projected < reorder point; packs = ceil(((par, else the reorder point) - projected) / pack size)),
// worked out beside each check, and compared with what GET /api/reorder-suggestions answers for the
// same data. Open / cleared / episode: the issue's rule ("a reorder alert that cleared and comes
// back is a new alert"; "the same scan run twice makes none new").
import { Queue, UnrecoverableError } from "bullmq";
import { Redis } from "ioredis";
import { addDays, formatISO } from "date-fns";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as alertsRoute } from "../../app/api/alerts/route";
import { GET as suggestionsRoute } from "../../app/api/reorder-suggestions/route";
import { db } from "../../db/client";
import type { ItemCategory } from "../../db/types";
import { REORDER_SCAN_JOB, reorderScanPayload, runReorderScan } from "../../jobs/definitions/reorder-scan";
import { SHORTAGE_SCAN_JOB } from "../../jobs/definitions/shortage-scan";
import { SCANS } from "../../jobs/definitions/scans";
import { SCAN_JOB_OPTIONS, SCANS_QUEUE } from "../../jobs/queues";
import { CURE_CAUTION } from "../../lib/cure/caution";
import { postMovement } from "../../lib/data/ledger";
import { createCompany, tag, uniqueEmail, type TestCompany } from "../support/factory";
import { call } from "../support/http";
import { currentUser, sessionCookieFor } from "../support/sessions";
import { createItem } from "../support/stock";

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
// the injected clock: noon UTC today, so the company's local date (Europe/London) is today
const NOW = new Date(`${new Date().toISOString().slice(0, 10)}T12:00:00Z`);
const later = (hours: number) => new Date(NOW.getTime() + hours * 3600_000);
const day = (n: number) => formatISO(addDays(NOW, n), { representation: "date" });

/**
 * A company of its own, marked as scanned just now so the catch-up runs other test files enqueue
 * (enqueueOverdueScans: every overdue company) leave its alerts to this file's injected clock.
 */
async function company(kitchens = 2): Promise<TestCompany> {
  const c = await createCompany({ kitchens });
  await db()("job_runs").insert([REORDER_SCAN_JOB, SHORTAGE_SCAN_JOB].map((job) => ({ company_id: c.company.id, job, last_run_at: new Date(), last_result: "{}" })));
  return c;
}

async function item(c: TestCompany, category: ItemCategory = "spice") {
  return createItem(c.company.id, { category, trackLots: false });
}

async function move(c: TestCompany, kind: "receipt" | "use", k: number, sku: string, grams: string) {
  const manager = await currentUser(c.users.manager.id);
  await postMovement(manager, {
    kind, kitchen: c.kitchens[k]!.code, item: sku, quantity: grams, unit: "g", ...(kind === "receipt" ? { lot: { code: `L-${tag()}`, unitCost: "0.01" } } : {}),
  } as never);
}

async function level(c: TestCompany, k: number, itemId: string, reorderPoint: string, parLevel: string | null) {
  await db()("stock_levels").insert({ company_id: c.company.id, kitchen_id: c.kitchens[k]!.id, item_id: itemId, reorder_point: reorderPoint, par_level: parLevel });
}

async function offer(c: TestCompany, itemId: string, opts: { leadTimeDays: number; packLabel: string; packGrams: string; price: string }) {
  const [s] = await db()("suppliers")
    .insert({ company_id: c.company.id, name: `Alder Spice Co ${tag()}`, contact_name: "Wren Halloway", order_email: uniqueEmail("orders"), lead_time_days: opts.leadTimeDays })
    .returning<{ id: string }[]>("id");
  const [si] = await db()("supplier_items")
    .insert({
      company_id: c.company.id, supplier_id: s!.id, item_id: itemId, sku: `SI-${tag()}`.toUpperCase(), pack_label: opts.packLabel,
      pack_quantity: opts.packGrams, pack_unit: "g", pack_size_stock: opts.packGrams,
    })
    .returning<{ id: string }[]>("id");
  await db()("supplier_item_prices").insert({ company_id: c.company.id, supplier_item_id: si!.id, pack_price: opts.price, effective_from: day(-1) });
  return { supplierId: s!.id, supplierItemId: si!.id };
}

const reorderAlerts = (companyId: string) =>
  db()("alerts").where({ company_id: companyId, kind: "reorder" }).orderBy([{ column: "subject_id" }, { column: "kitchen_id" }, { column: "episode" }]);

describe("runReorderScan", () => {
  it("raises one alert per kitchen and item below its reorder point, with the figures GET /api/reorder-suggestions shows; a second run makes none", async () => {
    const c = await company();
    const paprika = await item(c);
    const mace = await item(c);
    const salt = await item(c);
    const cure = await item(c, "cure");
    await move(c, "receipt", 0, paprika.sku, "2500");
    await move(c, "receipt", 0, mace.sku, "200");
    await move(c, "receipt", 0, salt.sku, "9000");
    await level(c, 0, paprika.id, "3000", "6000");
    await level(c, 1, paprika.id, "1000", "2000"); // nothing on hand in the second kitchen
    await level(c, 0, mace.id, "500", "1000"); // no supplier lists mace
    await level(c, 0, salt.id, "1000", null); // 9000 on hand: not below
    await level(c, 0, cure.id, "100", null); // none on hand, no supplier
    const alder = await offer(c, paprika.id, { leadTimeDays: 5, packLabel: "1 kg bag", packGrams: "1000", price: "12.00" });

    const first = await runReorderScan(db(), { companyId: c.company.id }, NOW);
    expect(first).toEqual({ status: "done", today: day(0), watched: 5, below: 4, created: 4, cleared: 0 });
    const rows = await reorderAlerts(c.company.id);
    expect(rows).toHaveLength(4);
    for (const r of rows) expect(r).toMatchObject({ subject_type: "item", threshold_days: 0, episode: 0, cleared_at: null });

    const p0 = rows.find((r) => r.subject_id === paprika.id && r.kitchen_id === c.kitchens[0]!.id)!;
    // 2500 - 0 - 0 + 0 = 2500 < 3000; (6000 - 2500) / 1000 = 3.5 -> 4 bags, 4000 g
    expect(p0.data).toMatchObject({
      itemId: paprika.id, sku: paprika.sku, category: "spice", unit: "g", kitchenName: c.kitchens[0]!.name, onHand: "2500", reserved: "0",
      reorderPoint: "3000", parLevel: "6000", projected: "2500", projectedBy: day(5), suggestedQuantity: "4000", packs: 4, packLabel: "1 kg bag",
      supplierId: alder.supplierId, supplierItemId: alder.supplierItemId,
    });
    expect(p0.title).toBe(`${p0.data.name} is below its reorder point in ${c.kitchens[0]!.name}`);
    expect(p0.detail).toContain(`Projected 2500 g by ${day(5)} against a reorder point of 3000 g`);
    expect(p0.detail).toContain("4 × 1 kg bag (4000 g)");
    // second kitchen: 0 < 1000; (2000 - 0) / 1000 -> 2 bags
    const p1 = rows.find((r) => r.subject_id === paprika.id && r.kitchen_id === c.kitchens[1]!.id)!;
    expect(p1.data).toMatchObject({ projected: "0", suggestedQuantity: "2000", packs: 2 });
    // no supplier: what is left today, 200 < 500; no quantity
    const m = rows.find((r) => r.subject_id === mace.id)!;
    expect(m.data).toMatchObject({ projected: "200", projectedBy: day(0), suggestedQuantity: null, packs: null, supplierName: null });
    expect(m.detail).toContain("No supplier lists this item");
    expect(rows.some((r) => r.subject_id === salt.id)).toBe(false);

    // the same figures as the buying page's API, for the same data
    const cookie = await sessionCookieFor(c.users.manager.id);
    for (const [k, alert] of [[0, p0], [1, p1]] as const) {
      const api = await call(suggestionsRoute, { path: `/api/reorder-suggestions?kitchen=${c.kitchens[k]!.code}`, cookie });
      expect(api.status).toBe(200);
      const line = api.body.kitchens[0].suppliers.flatMap((g: { lines: unknown[] }) => g.lines).find((l: { item: { id: string } }) => l.item.id === paprika.id);
      expect(alert.data).toMatchObject({
        onHand: line.onHand, reserved: line.reserved, reorderPoint: line.reorderPoint, parLevel: line.parLevel,
        projected: line.chosen.projected, projectedBy: line.chosen.horizon, suggestedQuantity: line.chosen.quantity, packs: line.chosen.packs,
        supplierItemId: line.chosen.supplierItemId,
      });
    }
    const api0 = (await call(suggestionsRoute, { path: `/api/reorder-suggestions?kitchen=${c.kitchens[0]!.code}`, cookie })).body.kitchens[0];
    expect(api0.unsourced.map((u: { item: { id: string } }) => u.item.id).sort()).toEqual([mace.id, cure.id].sort());
    expect(m.data.projected).toBe(api0.unsourced.find((u: { item: { id: string } }) => u.item.id === mace.id).projectedToday);

    // the in-app list: a cure item's alert carries the cure caution
    const list = await call(alertsRoute, { path: "/api/alerts?kind=reorder", cookie });
    expect(list.body.alerts).toHaveLength(4);
    expect(list.body.alerts.find((a: { subjectId: string }) => a.subjectId === cure.id)).toMatchObject({ caution: CURE_CAUTION, clearedAt: null, unread: true });
    expect(list.body.alerts.find((a: { subjectId: string }) => a.subjectId === mace.id).caution).toBeNull();

    const again = await runReorderScan(db(), { companyId: c.company.id }, later(1));
    expect(again).toMatchObject({ status: "done", below: 4, created: 0, cleared: 0 });
    expect(await reorderAlerts(c.company.id)).toHaveLength(4);
    const run = await db()("job_runs").where({ company_id: c.company.id, job: REORDER_SCAN_JOB }).first();
    expect(run.last_run_at.toISOString()).toBe(later(1).toISOString());
    expect(run.last_result).toMatchObject({ created: 0, below: 4 });
  });

  it("clears an alert when the item is back above its reorder point, and a return is a new alert (episode 1)", async () => {
    const c = await company(1);
    const mace = await item(c);
    await move(c, "receipt", 0, mace.sku, "500");
    await level(c, 0, mace.id, "1000", "2000");
    await offer(c, mace.id, { leadTimeDays: 2, packLabel: "1 kg bag", packGrams: "1000", price: "30.00" });

    expect(await runReorderScan(db(), { companyId: c.company.id }, NOW)).toMatchObject({ created: 1, cleared: 0 });
    await move(c, "receipt", 0, mace.sku, "1000"); // 1500: not below 1000
    expect(await runReorderScan(db(), { companyId: c.company.id }, later(1))).toMatchObject({ below: 0, created: 0, cleared: 1 });
    let rows = await reorderAlerts(c.company.id);
    expect(rows).toHaveLength(1);
    expect(rows[0].cleared_at.toISOString()).toBe(later(1).toISOString());
    expect(await runReorderScan(db(), { companyId: c.company.id }, later(2))).toMatchObject({ created: 0, cleared: 0 }); // still fine: nothing

    await move(c, "use", 0, mace.sku, "1000"); // 500 again: below
    expect(await runReorderScan(db(), { companyId: c.company.id }, later(3))).toMatchObject({ created: 1, cleared: 0 });
    expect(await runReorderScan(db(), { companyId: c.company.id }, later(4))).toMatchObject({ created: 0, cleared: 0 });
    rows = await reorderAlerts(c.company.id);
    expect(rows.map((r) => [r.episode, r.cleared_at === null])).toEqual([[0, false], [1, true]]);
    // as raised the second time: 500 < 1000; par 2000 - 500 = 1500 -> ceil(1.5) = 2 bags
    expect(rows[1].data).toMatchObject({ projected: "500", suggestedQuantity: "2000" });

    // the list hides the cleared one unless asked; a cleared alert is never unread
    const cookie = await sessionCookieFor(c.users.buyer.id);
    const open = await call(alertsRoute, { path: "/api/alerts", cookie });
    expect(open.body.alerts.map((a: { id: string }) => a.id)).toEqual([rows[1].id]);
    expect(open.body.unreadCount).toBe(1);
    const all = await call(alertsRoute, { path: "/api/alerts?includeCleared=true", cookie });
    expect(all.body.alerts.map((a: { id: string; clearedAt: string | null; unread: boolean }) => [a.id, a.clearedAt, a.unread]).sort()).toEqual(
      [[rows[0].id, later(1).toISOString(), false], [rows[1].id, null, true]].sort(),
    );
    expect(all.body.unreadCount).toBe(1);
    expect((await call(alertsRoute, { path: "/api/alerts?includeCleared=yes", cookie })).status).toBe(422);
  });

  it("two runs at once open one alert", async () => {
    const c = await company(1);
    const sage = await item(c);
    await level(c, 0, sage.id, "100", null);
    const runs = await Promise.all([1, 2, 3, 4].map(() => runReorderScan(db(), { companyId: c.company.id }, NOW)));
    expect(runs.reduce((n, r) => n + (r.status === "done" ? r.created : 0), 0)).toBe(1);
    const rows = await reorderAlerts(c.company.id);
    expect(rows.map((r) => [r.subject_id, r.episode, r.cleared_at])).toEqual([[sage.id, 0, null]]);

    // and clearing then reopening at once: still one open alert, with the next episode
    await move(c, "receipt", 0, sage.sku, "100");
    await runReorderScan(db(), { companyId: c.company.id }, later(1));
    await move(c, "use", 0, sage.sku, "50");
    await Promise.all([1, 2, 3].map(() => runReorderScan(db(), { companyId: c.company.id }, later(2))));
    const after = await reorderAlerts(c.company.id);
    expect(after.map((r) => [r.episode, r.cleared_at === null])).toEqual([[0, false], [1, true]]);
  });

  it("refuses a bad payload as unrecoverable and finishes for a deleted company", async () => {
    await expect(runReorderScan(db(), {}, NOW)).rejects.toBeInstanceOf(UnrecoverableError);
    await expect(runReorderScan(db(), { companyId: "nope" }, NOW)).rejects.toBeInstanceOf(UnrecoverableError);
    expect(() => reorderScanPayload(null)).toThrow(UnrecoverableError);
    expect(await runReorderScan(db(), { companyId: crypto.randomUUID() }, NOW)).toEqual({ status: "company-gone" });
    const gone = await createCompany({ kitchens: 0 });
    await db()("app_users").where({ company_id: gone.company.id }).delete();
    await db()("companies").where({ id: gone.company.id }).delete();
    expect(await runReorderScan(db(), { companyId: gone.company.id }, NOW)).toEqual({ status: "company-gone" });
  });

  it("is registered: daily at 05:15 in the company's time zone", () => {
    expect(SCANS.find((s) => s.name === REORDER_SCAN_JOB)).toMatchObject({ cron: "15 5 * * *", periodMs: 24 * 3600_000, run: runReorderScan });
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

  it("runs a reorder scan added to the scans queue on the real Redis and stores its alert", async () => {
    const c = await createCompany({ kitchens: 1 });
    const sage = await item(c);
    await level(c, 0, sage.id, "100", null);
    await queue.add(REORDER_SCAN_JOB, { companyId: c.company.id }, { ...SCAN_JOB_OPTIONS, jobId: `test-reorder-${c.company.id}` });
    let rows: { subject_id: string }[] = [];
    for (let i = 0; i < 100 && rows.length < 1; i++) {
      await sleep(150);
      rows = await reorderAlerts(c.company.id);
    }
    expect(rows.map((r) => r.subject_id)).toEqual([sage.id]);
    const id = `test-reorder-${c.company.id}`;
    for (let i = 0; i < 50 && (await queue.getJobState(id)) !== "completed"; i++) await sleep(100);
    expect(await queue.getJobState(id)).toBe("completed");
    expect((await queue.getJob(id))?.returnvalue).toMatchObject({ status: "done", created: 1 });
  });
});
