// The daily reorder scan of one company: every item below its reorder point in an open kitchen, as
// the buying page and GET /api/reorder-suggestions say it (lib/reorder/gather.ts + suggest.ts, the
// same call as lib/data/reorder-suggestions.ts; no second formula here), gets one open alert per
// kitchen and item. When the item is no longer below, the alert is cleared (`cleared_at`); when it
// falls below again, a new alert opens with the next episode (jobs/definitions/open-alerts.ts).
// Running the scan twice makes nothing new. The payload is the company id only.
//
// "Below" is the suggestion's own verdict: a supplier's projection over its lead time is under the
// reorder point (the preselected offer), or no supplier lists the item and what is left today is
// under it. The figures stored are that offer's (projection to today + its lead time, the quantity
// after the supplier's minimum order raise), else today's projection with no quantity.
//
// Scheduling: jobs/definitions/scans.ts (daily 05:15 in the company's time zone; catch-up on start).
import type { Knex } from "knex";
import type { ItemCategory, StockUnit } from "../../db/types";
import { dateInZone } from "../../lib/alerts/expiry";
import { gatherReorder } from "../../lib/reorder/gather";
import { recordJobRun, scanPayload } from "./job-runs";
import { syncOpenAlerts, type CurrentAlert } from "./open-alerts";

export const REORDER_SCAN_JOB = "reorder-scan";

export interface ReorderAlertData {
  itemId: string;
  sku: string;
  name: string;
  category: ItemCategory;
  /** the item's stock unit: every quantity below is in it, as a decimal string */
  unit: StockUnit;
  kitchenName: string;
  onHand: string;
  reserved: string;
  reorderPoint: string;
  parLevel: string | null;
  /** the projection the verdict rests on, and the day it looks to (today + the supplier's lead time) */
  projected: string;
  projectedBy: string;
  /** what the buying page preselects; null when no supplier lists the item */
  suggestedQuantity: string | null;
  packs: number | null;
  packLabel: string | null;
  supplierId: string | null;
  supplierName: string | null;
  supplierItemId: string | null;
}

export type ReorderScanResult =
  | { status: "done"; today: string; watched: number; below: number; created: number; cleared: number }
  | { status: "company-gone" };

export function reorderScanPayload(data: unknown): { companyId: string } {
  return { companyId: scanPayload(REORDER_SCAN_JOB, data).companyId };
}

function describe(d: ReorderAlertData): Pick<CurrentAlert, "title" | "detail"> {
  const u = d.unit;
  const order =
    d.suggestedQuantity !== null
      ? `Suggested order: ${d.packs} × ${d.packLabel} (${d.suggestedQuantity} ${u}) from ${d.supplierName}.`
      : "No supplier lists this item: add one on a supplier's page to get an order suggestion.";
  return {
    title: `${d.name} is below its reorder point in ${d.kitchenName}`,
    detail: `Projected ${d.projected} ${u} by ${d.projectedBy} against a reorder point of ${d.reorderPoint} ${u} (on hand ${d.onHand} ${u}, reserved ${d.reserved} ${u}). ${order}`,
  };
}

/** Runs the scan for one company as of `now` (the company's local date of it). */
export async function runReorderScan(knex: Knex, data: unknown, now: Date = new Date()): Promise<ReorderScanResult> {
  const { companyId } = reorderScanPayload(data);
  const company = await knex("companies").where({ id: companyId }).first<{ time_zone: string } | undefined>("time_zone");
  if (!company) return { status: "company-gone" };
  const today = dateInZone(now, company.time_zone);
  const kitchenIds: string[] = await knex("kitchens").where({ company_id: companyId }).whereNull("archived_at").orderBy("id").pluck("id");

  let gathered: Awaited<ReturnType<typeof gatherReorder>>;
  try {
    gathered = await gatherReorder(knex, { companyId, kitchenIds, today });
  } catch (e) {
    // deleted between the two reads
    if (!(await knex("companies").where({ id: companyId }).first("id"))) return { status: "company-gone" };
    throw e;
  }

  const current: CurrentAlert[] = [];
  let watched = 0;
  for (const k of gathered.kitchens) {
    watched += k.items.length;
    const raised = new Map(k.groups.flatMap((g) => g.lines.map((l) => [l.key, l.figures] as const)));
    for (const f of k.items) {
      if (!f.suggestion.suggested) continue;
      const chosen = f.suggestion.chosen ? raised.get(f.key) ?? f.suggestion.chosen : null;
      const d: ReorderAlertData = {
        itemId: f.item.id, sku: f.item.sku, name: f.item.name, category: f.item.category, unit: f.item.stockUnit, kitchenName: k.kitchen.name,
        onHand: f.input.onHand, reserved: f.input.reserved, reorderPoint: f.input.reorderPoint!, parLevel: f.input.parLevel,
        projected: chosen ? chosen.projected : f.suggestion.projectedToday,
        projectedBy: chosen ? chosen.horizon : gathered.today,
        suggestedQuantity: chosen ? chosen.quantity : null,
        packs: chosen ? chosen.packs : null,
        packLabel: chosen ? chosen.offer.packLabel : null,
        supplierId: chosen ? chosen.offer.supplierId : null,
        supplierName: chosen ? chosen.offer.supplierName : null,
        supplierItemId: chosen ? chosen.offer.supplierItemId : null,
      };
      current.push({ kitchenId: k.kitchen.id, subjectId: f.item.id, ...describe(d), data: { ...d } });
    }
  }

  const synced = await syncOpenAlerts(knex, { companyId, kind: "reorder", subjectType: "item", now, current }).catch(async (e: { code?: string }) => {
    // 23503: the company (or a kitchen) went while the scan ran
    if (e.code === "23503" && !(await knex("companies").where({ id: companyId }).first("id"))) return null;
    throw e;
  });
  if (!synced) return { status: "company-gone" };
  const { created, cleared } = synced;
  const result = { status: "done" as const, today, watched, below: current.length, created, cleared };
  await recordJobRun(knex, companyId, REORDER_SCAN_JOB, now, result);
  return result;
}
