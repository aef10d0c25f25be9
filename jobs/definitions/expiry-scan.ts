// The daily expiry scan of one company: every lot with stock in an open kitchen whose date falls
// within its category's warning windows (companies.expiry_windows) gets an alert for the most urgent
// threshold it has crossed, unless one of that threshold or a more urgent one is stored
// (lib/alerts/expiry.ts). Alerts are unique per (company, kind, kitchen, lot, threshold, episode)
// and inserted with ON CONFLICT DO NOTHING, so running the scan twice, two at once, or a retry after
// a crash half-way, makes nothing new. The payload is the company id only.
//
// Scheduling: jobs/definitions/scans.ts (one scheduler per company and scan, in the company's time
// zone; catch-up on worker start). E-mail is not sent here: the digests read the alerts stored.
import type { Knex } from "knex";
import type { DateKind, ItemCategory, StockUnit } from "../../db/types";
import { dateInZone, mostUrgentThresholds, normaliseWindows, type LotWithStock } from "../../lib/alerts/expiry";
import { plain } from "../../lib/units/decimal";
import { recordJobRun, scanPayload } from "./job-runs";

export const EXPIRY_SCAN_JOB = "expiry-scan";

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
  return { companyId: scanPayload(EXPIRY_SCAN_JOB, data).companyId };
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

  const crossed = mostUrgentThresholds(lots, today, windows);
  let created = 0;
  if (crossed.length) {
    const rows = crossed.map(({ lot, thresholdDays, daysLeft }) => {
      const quantity = plain(lot.onHand);
      const alertData: ExpiryAlertData = {
        lotId: lot.lotId, lotCode: lot.lotCode, itemId: lot.itemId, itemSku: lot.itemSku, itemName: lot.itemName, category: lot.category,
        quantity, unit: lot.unit, date: lot.date!, dateKind: lot.dateKind!, daysLeft, kitchenName: lot.kitchenName,
      };
      return {
        kitchen_id: lot.kitchenId, subject_id: lot.lotId, threshold_days: thresholdDays,
        title: title(lot, daysLeft),
        detail: `${quantity} ${lot.unit} in ${lot.kitchenName}; ${lot.dateKind === "use_by" ? "use by" : "best before"} ${lot.date} (${thresholdDays}-day warning).`,
        data: alertData,
      };
    });
    for (let i = 0; i < rows.length; i += 500) {
      const inserted = await knex.raw<{ rows: { id: string }[] }>(
        `insert into alerts (company_id, kitchen_id, kind, subject_type, subject_id, threshold_days, episode, title, detail, data)
         select :companyId, v.kitchen_id, 'expiry', 'lot', v.subject_id, v.threshold_days, 0, v.title, v.detail, v.data
           from jsonb_to_recordset(:rows::jsonb) as v(kitchen_id uuid, subject_id uuid, threshold_days int, title text, detail text, data jsonb)
          where not exists (select 1 from alerts a
                             where a.company_id = :companyId and a.kind = 'expiry' and a.kitchen_id = v.kitchen_id
                               and a.subject_id = v.subject_id and a.threshold_days <= v.threshold_days)
         on conflict do nothing
         returning id`,
        { companyId, rows: JSON.stringify(rows.slice(i, i + 500)) },
      );
      created += inserted.rows.length;
    }
  }
  const result = { status: "done" as const, today, lotsChecked: lots.length, crossed: crossed.length, created };
  await recordJobRun(knex, companyId, EXPIRY_SCAN_JOB, now, result);
  return result;
}
