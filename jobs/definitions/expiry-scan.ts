// The daily expiry scan of one company: every lot with stock in an open kitchen whose date falls
// within its category's warning windows (companies.expiry_windows) gets one alert per crossed
// threshold (lib/alerts/expiry.ts). Alerts are unique per (company, kind, kitchen, lot, threshold,
// episode) and inserted with ON CONFLICT DO NOTHING, so running the scan twice, or a retry after a
// crash half-way, makes nothing new. The payload is the company id only.
//
// Scheduling (jobs/worker.ts): one BullMQ job scheduler per company, daily at 05:00 in the
// company's time zone, upserted when the worker starts and every hour after (new companies, time
// zone changes; schedulers of deleted companies are removed). BullMQ does not backfill missed runs,
// so on start the worker also enqueues a run for every company whose last run (job_runs) is older
// than 24 h. E-mail digests are not sent here: they will read the alerts this scan stores.
import { UnrecoverableError, type Queue } from "bullmq";
import type { Knex } from "knex";
import type { DateKind, ItemCategory, StockUnit } from "../../db/types";
import { crossedThresholds, dateInZone, normaliseWindows, type LotWithStock } from "../../lib/alerts/expiry";
import { plain } from "../../lib/units/decimal";
import { SCAN_JOB_OPTIONS } from "../queues";

export const EXPIRY_SCAN_JOB = "expiry-scan";
/** Local time of the daily run. */
export const EXPIRY_SCAN_CRON = "0 5 * * *";
export const EXPIRY_SCAN_PERIOD_MS = 24 * 3600 * 1000;

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export interface ExpiryAlertData {
  lotId: string;
  lotCode: string;
  itemId: string;
  itemSku: string;
  itemName: string;
  category: ItemCategory;
  /** on hand in the kitchen when the alert was raised, stock unit, decimal string */
  quantity: string;
  unit: StockUnit;
  date: string;
  dateKind: DateKind;
  daysLeft: number;
  kitchenName: string;
}

export type ExpiryScanResult =
  | { status: "done"; today: string; lotsChecked: number; crossed: number; created: number }
  | { status: "company-gone" };

interface ScanLot extends LotWithStock {
  lotCode: string;
  itemId: string;
  itemSku: string;
  itemName: string;
  unit: StockUnit;
  onHand: string;
  kitchenName: string;
}

/** Reads the payload; anything else than a company id can never succeed, so it is not retried. */
export function expiryScanPayload(data: unknown): { companyId: string } {
  const companyId = (data as { companyId?: unknown } | null)?.companyId;
  if (typeof companyId !== "string" || !UUID.test(companyId)) throw new UnrecoverableError("expiry-scan: the payload needs a companyId (uuid).");
  return { companyId };
}

const dayWord = (n: number) => (Math.abs(n) === 1 ? "day" : "days");
function title(l: ScanLot, daysLeft: number): string {
  const when = daysLeft < 0 ? `expired ${-daysLeft} ${dayWord(daysLeft)} ago` : daysLeft === 0 ? "expires today" : `${daysLeft} ${dayWord(daysLeft)} left`;
  return `${l.itemName}, lot ${l.lotCode}: ${when}`;
}

/** Runs the scan for one company as of `now` (the company's local date of it). */
export async function runExpiryScan(knex: Knex, data: unknown, now: Date = new Date()): Promise<ExpiryScanResult> {
  const { companyId } = expiryScanPayload(data);
  const company = await knex("companies").where({ id: companyId }).first<{ time_zone: string; expiry_windows: unknown } | undefined>("time_zone", "expiry_windows");
  if (!company) return { status: "company-gone" };
  const today = dateInZone(now, company.time_zone);
  const windows = normaliseWindows(company.expiry_windows);

  const lots: ScanLot[] = await knex("stock_balances as b")
    .join("lots as l", "l.id", "b.lot_id")
    .join("items as i", "i.id", "b.item_id")
    .join("kitchens as k", "k.id", "b.kitchen_id")
    .where("b.company_id", companyId)
    .where("b.on_hand", ">", 0)
    .whereNotNull("l.date")
    .whereNull("k.archived_at")
    .whereIn("i.category", Object.keys(windows))
    .select(
      "b.lot_id as lotId", "b.kitchen_id as kitchenId", "i.category", knex.raw(`to_char(l.date, 'YYYY-MM-DD') as date`), "l.date_kind as dateKind",
      "l.code as lotCode", "i.id as itemId", "i.sku as itemSku", "i.name as itemName", "i.stock_unit as unit", "b.on_hand as onHand", "k.name as kitchenName",
    )
    .orderBy([{ column: "l.date" }, { column: "b.lot_id" }, { column: "b.kitchen_id" }]);

  const crossed = crossedThresholds(lots, today, windows);
  let created = 0;
  if (crossed.length) {
    const rows = crossed.map(({ lot, thresholdDays, daysLeft }) => {
      const quantity = plain(lot.onHand);
      const alertData: ExpiryAlertData = {
        lotId: lot.lotId, lotCode: lot.lotCode, itemId: lot.itemId, itemSku: lot.itemSku, itemName: lot.itemName, category: lot.category,
        quantity, unit: lot.unit, date: lot.date!, dateKind: lot.dateKind!, daysLeft, kitchenName: lot.kitchenName,
      };
      return {
        company_id: companyId, kitchen_id: lot.kitchenId, kind: "expiry", subject_type: "lot", subject_id: lot.lotId, threshold_days: thresholdDays, episode: 0,
        title: title(lot, daysLeft),
        detail: `${quantity} ${lot.unit} in ${lot.kitchenName}; ${lot.dateKind === "use_by" ? "use by" : "best before"} ${lot.date} (${thresholdDays}-day warning).`,
        data: JSON.stringify(alertData),
      };
    });
    for (let i = 0; i < rows.length; i += 500) {
      const inserted = await knex("alerts")
        .insert(rows.slice(i, i + 500))
        .onConflict(["company_id", "kind", "kitchen_id", "subject_id", "threshold_days", "episode"])
        .ignore()
        .returning("id");
      created += inserted.length;
    }
  }
  const result = { status: "done" as const, today, lotsChecked: lots.length, crossed: crossed.length, created };
  await knex("job_runs")
    .insert({ company_id: companyId, job: EXPIRY_SCAN_JOB, last_run_at: now, last_result: JSON.stringify(result) })
    .onConflict(["company_id", "job"])
    .merge()
    // the company may be deleted between the read and here: then there is nothing to record
    .catch((e: { code?: string }) => { if (e.code !== "23503") throw e; });
  return result;
}

/**
 * Upserts each company's daily scheduler (05:00 in its time zone) and removes those of companies
 * that are gone. Returns how many companies are scheduled.
 */
export async function syncExpirySchedulers(knex: Knex, queue: Queue): Promise<number> {
  const companies: { id: string; time_zone: string }[] = await knex("companies").select("id", "time_zone");
  for (const c of companies) {
    await queue.upsertJobScheduler(
      `${EXPIRY_SCAN_JOB}:${c.id}`,
      { pattern: EXPIRY_SCAN_CRON, tz: c.time_zone },
      { name: EXPIRY_SCAN_JOB, data: { companyId: c.id }, opts: SCAN_JOB_OPTIONS },
    );
  }
  const ids = new Set(companies.map((c) => `${EXPIRY_SCAN_JOB}:${c.id}`));
  for (const s of await queue.getJobSchedulers()) {
    const id = s.id ?? s.key;
    if (id.startsWith(`${EXPIRY_SCAN_JOB}:`) && !ids.has(id)) await queue.removeJobScheduler(id);
  }
  return companies.length;
}

/** Companies whose last expiry scan is older than its period (or never ran), as of `now`. */
export async function overdueExpiryScans(knex: Knex, now: Date = new Date()): Promise<string[]> {
  const rows: { id: string }[] = await knex("companies as c")
    .leftJoin("job_runs as r", function () {
      this.on("r.company_id", "c.id").andOnVal("r.job", EXPIRY_SCAN_JOB);
    })
    .where((q) => q.whereNull("r.last_run_at").orWhere("r.last_run_at", "<", new Date(now.getTime() - EXPIRY_SCAN_PERIOD_MS)))
    .select("c.id");
  return rows.map((r) => r.id);
}

/** Enqueues a catch-up run per overdue company; the job id carries the day, so a restart loop adds one. */
export async function enqueueOverdueExpiryScans(knex: Knex, queue: Queue, now: Date = new Date()): Promise<number> {
  const ids = await overdueExpiryScans(knex, now);
  const day = now.toISOString().slice(0, 10);
  if (ids.length) {
    await queue.addBulk(ids.map((companyId) => ({ name: EXPIRY_SCAN_JOB, data: { companyId }, opts: { ...SCAN_JOB_OPTIONS, jobId: `${EXPIRY_SCAN_JOB}-catch-up-${companyId}-${day}` } })));
  }
  return ids.length;
}
