// The daily shortage scan of one company: every open batch (planned or reserved; not produced, on
// hold or cancelled) dated in the next 7 days that cannot be covered gets one open alert, in the
// batch's kitchen, listing the lines short. "Short" is exactly what the planner shows: the
// description of lib/planning/describe-batches.ts (each line against the kitchen's stock in lots
// still in date on the day, after the batches planned ahead of it), read here with the scan's
// knex. The alert clears when the batch is covered, produced, cancelled or moved out of the window;
// if it runs short again later, a new alert opens with the next episode (./open-alerts.ts).
// Running the scan twice makes nothing new. The payload is the company id only.
//
// The window: today and the six days after it in the company's time zone (today .. today + 6,
// seven calendar days). A batch still planned for a day already past is not in it: the planner
// shows it as late, and its alert, if any, clears.
//
// Scheduling: jobs/definitions/scans.ts (daily 05:30 in the company's time zone; catch-up on start).
import type { Knex } from "knex";
import type { ItemCategory, StockUnit } from "../../db/types";
import { dateInZone } from "../../lib/alerts/expiry";
import { addDays, describeBatches, loadBatchRows } from "../../lib/planning/describe-batches";
import { recordJobRun, scanPayload } from "./job-runs";
import { syncOpenAlerts, type CurrentAlert } from "./open-alerts";

export const SHORTAGE_SCAN_JOB = "shortage-scan";
/** today and the days after it, in days */
export const SHORTAGE_WINDOW_DAYS = 7;

export interface ShortageLine {
  position: number;
  itemId: string;
  sku: string;
  name: string;
  category: ItemCategory;
  unit: StockUnit;
  /** decimal strings in the item's stock unit */
  quantity: string;
  reserved: string;
  available: string;
  plannedBefore: string;
  short: string;
  suggestions: ({ kind: "transfer"; kitchenCode: string; quantity: string } | { kind: "buy"; quantity: string })[];
}

export interface ShortageAlertData {
  batchId: string;
  recipeCode: string;
  recipeName: string;
  plannedFor: string;
  status: string;
  kitchenName: string;
  /** the categories of the lines short (the list shows the cure caution when cure is among them) */
  categories: ItemCategory[];
  lines: ShortageLine[];
}

export type ShortageScanResult =
  | { status: "done"; today: string; until: string; batchesChecked: number; short: number; created: number; cleared: number }
  | { status: "company-gone" };

export function shortageScanPayload(data: unknown): { companyId: string } {
  return { companyId: scanPayload(SHORTAGE_SCAN_JOB, data).companyId };
}

function describe(d: ShortageAlertData): Pick<CurrentAlert, "title" | "detail"> {
  const n = d.lines.length;
  const lines = d.lines.map((l) => `${l.name} short ${l.short} ${l.unit} (needs ${l.quantity} ${l.unit}, ${l.available} ${l.unit} usable in the kitchen${l.plannedBefore !== "0" ? `, ${l.plannedBefore} ${l.unit} wanted by batches ahead` : ""})`);
  return {
    title: `${d.recipeName} (${d.recipeCode}) on ${d.plannedFor} in ${d.kitchenName}: short of ${n} ${n === 1 ? "item" : "items"}`,
    detail: `${lines.join("; ")}.`,
  };
}

/** Runs the scan for one company as of `now` (the company's local date of it). */
export async function runShortageScan(knex: Knex, data: unknown, now: Date = new Date()): Promise<ShortageScanResult> {
  const { companyId } = shortageScanPayload(data);
  const company = await knex("companies").where({ id: companyId }).first<{ time_zone: string } | undefined>("time_zone");
  if (!company) return { status: "company-gone" };
  const today = dateInZone(now, company.time_zone);
  const until = addDays(today, SHORTAGE_WINDOW_DAYS - 1);

  const rows = await loadBatchRows(knex, companyId, (q) => {
    q.whereIn("status", ["planned", "reserved"]).whereBetween("planned_for", [today, until]);
  });
  const batches = await describeBatches(knex, companyId, rows, today);

  const current: CurrentAlert[] = [];
  for (const b of batches) {
    const short = b.lines.filter((l) => l.short !== null);
    if (!short.length) continue;
    const d: ShortageAlertData = {
      batchId: b.id, recipeCode: b.recipe.code, recipeName: b.recipe.name, plannedFor: b.plannedFor, status: b.status, kitchenName: b.kitchen.name,
      categories: [...new Set(short.map((l) => l.item.category))],
      lines: short.map((l) => ({
        position: l.position, itemId: l.item.id, sku: l.item.sku, name: l.item.name, category: l.item.category, unit: l.item.unit,
        quantity: l.quantity, reserved: l.reserved, available: l.available, plannedBefore: l.plannedBefore, short: l.short!,
        suggestions: l.suggestions.map((s) => (s.kind === "transfer" ? { kind: s.kind, kitchenCode: s.kitchen.code, quantity: s.quantity } : s)),
      })),
    };
    current.push({ kitchenId: b.kitchen.id, subjectId: b.id, ...describe(d), data: { ...d } });
  }

  const synced = await syncOpenAlerts(knex, { companyId, kind: "shortage", subjectType: "batch", now, current }).catch(async (e: { code?: string }) => {
    // 23503: the company (or a kitchen) went while the scan ran
    if (e.code === "23503" && !(await knex("companies").where({ id: companyId }).first("id"))) return null;
    throw e;
  });
  if (!synced) return { status: "company-gone" };
  const result = { status: "done" as const, today, until, batchesChecked: batches.length, short: current.length, ...synced };
  await recordJobRun(knex, companyId, SHORTAGE_SCAN_JOB, now, result);
  return result;
}
