// The accountant's reports: usage by month and stock valuation at a date, by the company's cost
// formula (lib/costing/engine.ts over every movement up to the report's end, lib/costing/load.ts).
// Months and days are the company's (its time zone); `to` is inclusive. Money is exact until a row
// is shown: each row's cost is rounded half-even to the currency's decimals, and totals are sums of
// the rows as shown, so a spreadsheet adding the rows gets the totals. Quantities of different
// units are never added: rows grouped by category or kitchen carry cost only.
// Everyone with reports.read (accountants, managers, admins) sees every kitchen of the company.
import "server-only";
import { TZDate } from "@date-fns/tz";
import { db } from "../../db/client";
import type { ItemCategory, MovementKind, StockUnit } from "../../db/types";
import { dateInZone } from "../alerts/expiry";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import { VALUE_SCALE, type CostBasis, type CostFormula } from "../costing/engine";
import { costCompany } from "../costing/load";
import { toCsv, type CsvCell } from "../csv";
import { workbook, type SheetColumn } from "../reports/xlsx";
import { notFound } from "../http/errors";
import { currencyExponent } from "../units/money";
import { Dec, dec, plain, ZERO } from "../units/decimal";
import { isUuid } from "../validation/items";
import type { UsageGroup, UsageMovementsQuery, UsageQuery, ValuationQuery } from "../validation/reports";

interface KitchenRef { id: string; code: string; name: string }
interface ItemRef { id: string; sku: string; name: string; category: ItemCategory }

export interface UsageRow {
  month: string;
  item?: ItemRef;
  unit?: StockUnit;
  category?: ItemCategory;
  kitchen?: KitchenRef;
  usedQuantity?: string;
  wastedQuantity?: string;
  quantity?: string;
  usedCost: string;
  wastedCost: string;
  cost: string;
  countDifferenceQuantity?: string;
  countDifferenceCost: string;
}

export interface UsageReport {
  from: string;
  to: string;
  groupBy: UsageGroup;
  kitchen: KitchenRef | null;
  currency: string;
  costFormula: CostFormula;
  rows: UsageRow[];
  totals: { usedCost: string; wastedCost: string; cost: string; countDifferenceCost: string };
}

export interface ValuationRow {
  kitchen: KitchenRef;
  item: ItemRef;
  quantity: string;
  unit: StockUnit;
  value: string;
}

export interface ValuationReport {
  asOf: string;
  kitchen: KitchenRef | null;
  currency: string;
  costFormula: CostFormula;
  rows: ValuationRow[];
  totals: { value: string; byCategory: Record<string, string>; byKitchen: Record<string, string> };
}

interface Company { currency: string; time_zone: string; cost_formula: CostFormula }

/** The instant a local calendar day starts in a time zone. */
export function dayStart(isoDay: string, timeZone: string): Date {
  const [y, m, d] = isoDay.split("-").map(Number) as [number, number, number];
  return new Date(new TZDate(y, m - 1, d, 0, 0, 0, timeZone).getTime());
}

/** YYYY-MM plus n months. */
export function addMonths(month: string, n: number): string {
  const total = Number(month.slice(0, 4)) * 12 + Number(month.slice(5)) - 1 + n;
  return `${String(Math.floor(total / 12)).padStart(4, "0")}-${String((total % 12) + 1).padStart(2, "0")}`;
}

/** reports.read; the company, its kitchens (by id), the kitchen asked for (code or id; 404 if not the company's) and its items. The journal shares it. */
export async function loadContext(user: CurrentUser, kitchenRef: string | undefined) {
  assertCan(user, "reports.read");
  const company: Company = await db()("companies").where({ id: user.companyId }).first("currency", "time_zone", "cost_formula");
  const kitchens: KitchenRef[] = await db()("kitchens").where({ company_id: user.companyId }).select("id", "code", "name").orderBy("code");
  let kitchen: KitchenRef | null = null;
  if (kitchenRef) {
    kitchen = kitchens.find((k) => (isUuid(kitchenRef) ? k.id === kitchenRef : k.code.toUpperCase() === kitchenRef.toUpperCase())) ?? null;
    if (!kitchen) throw notFound("Kitchen");
  }
  const items: (ItemRef & { stock_unit: StockUnit })[] = await db()("items").where({ company_id: user.companyId }).select("id", "sku", "name", "category", "stock_unit");
  return { company, kitchens: new Map(kitchens.map((k) => [k.id, k])), kitchen, items: new Map(items.map((i) => [i.id, i])) };
}

const byCategoryThenSku = (a: ItemRef, b: ItemRef) => (a.category < b.category ? -1 : a.category > b.category ? 1 : a.sku < b.sku ? -1 : a.sku > b.sku ? 1 : 0);

export async function usageReport(user: CurrentUser, q: UsageQuery): Promise<UsageReport> {
  return (await usageReports(user, q, [q.groupBy]))[0]!;
}

/** The same months and kitchen grouped several ways, from ONE costing run (the usage page's table and chart). */
export async function usageReports(user: CurrentUser, q: UsageQuery, groupings: readonly UsageGroup[]): Promise<UsageReport[]> {
  const context = await loadContext(user, q.kitchen);
  const end = dayStart(`${addMonths(q.to, 1)}-01`, context.company.time_zone);
  const costs = await costCompany(db(), user.companyId, { before: end, formula: context.company.cost_formula });
  return groupings.map((groupBy) => buildUsage(context, costs, { ...q, groupBy }));
}

function buildUsage(
  { company, kitchens, kitchen, items }: Awaited<ReturnType<typeof loadContext>>,
  costs: Awaited<ReturnType<typeof costCompany>>,
  q: UsageQuery,
): UsageReport {
  const tz = company.time_zone;
  const start = dayStart(`${q.from}-01`, tz);

  interface Acc { month: string; key: string; used: Dec; wasted: Dec; usedCost: Dec; wastedCost: Dec; countQty: Dec; countCost: Dec }
  const acc = new Map<string, Acc>();
  for (const [itemId, result] of costs) {
    const item = items.get(itemId);
    if (!item) continue;
    for (const m of result.movements) {
      if (m.occurredAt < start) continue;
      if (kitchen && m.kitchenId !== kitchen.id) continue;
      if (m.kind !== "use" && m.kind !== "waste" && m.kind !== "count" && m.kind !== "adjustment") continue;
      const month = dateInZone(m.occurredAt, tz).slice(0, 7);
      const key = q.groupBy === "item" ? itemId : q.groupBy === "category" ? item.category : m.kitchenId;
      const id = `${month}|${key}`;
      let a = acc.get(id);
      if (!a) acc.set(id, (a = { month, key, used: ZERO, wasted: ZERO, usedCost: ZERO, wastedCost: ZERO, countQty: ZERO, countCost: ZERO }));
      if (m.kind === "use") {
        a.used = a.used.sub(m.delta);
        a.usedCost = a.usedCost.sub(m.value);
      } else if (m.kind === "waste") {
        a.wasted = a.wasted.sub(m.delta);
        a.wastedCost = a.wastedCost.sub(m.value);
      } else {
        a.countQty = a.countQty.add(m.delta);
        a.countCost = a.countCost.add(m.value);
      }
    }
  }

  const places = currencyExponent(company.currency);
  const money = (v: Dec) => v.toDecimalPlaces(places, Dec.ROUND_HALF_EVEN);
  const rows: UsageRow[] = [];
  for (const a of acc.values()) {
    const usedCost = money(a.usedCost);
    const wastedCost = money(a.wastedCost);
    const countCost = money(a.countCost);
    if (a.used.isZero() && a.wasted.isZero() && a.countQty.isZero() && usedCost.isZero() && wastedCost.isZero() && countCost.isZero()) continue;
    const row: UsageRow = {
      month: a.month,
      usedCost: usedCost.toFixed(places),
      wastedCost: wastedCost.toFixed(places),
      cost: usedCost.add(wastedCost).toFixed(places),
      countDifferenceCost: countCost.toFixed(places),
    };
    if (q.groupBy === "item") {
      const item = items.get(a.key)!;
      Object.assign(row, {
        item: { id: item.id, sku: item.sku, name: item.name, category: item.category }, unit: item.stock_unit, category: item.category,
        usedQuantity: plain(a.used), wastedQuantity: plain(a.wasted), quantity: plain(a.used.add(a.wasted)), countDifferenceQuantity: plain(a.countQty),
      });
    } else if (q.groupBy === "category") {
      row.category = a.key as ItemCategory;
    } else {
      row.kitchen = kitchens.get(a.key)!;
    }
    rows.push(row);
  }
  rows.sort((x, y) => {
    if (x.month !== y.month) return x.month < y.month ? -1 : 1;
    if (x.item && y.item) return byCategoryThenSku(x.item, y.item);
    if (x.kitchen && y.kitchen) return x.kitchen.code < y.kitchen.code ? -1 : 1;
    return (x.category ?? "") < (y.category ?? "") ? -1 : 1;
  });
  const sum = (f: (r: UsageRow) => string) => rows.reduce((s, r) => s.add(dec(f(r))), ZERO).toFixed(places);
  return {
    from: q.from, to: q.to, groupBy: q.groupBy, kitchen, currency: company.currency, costFormula: company.cost_formula, rows,
    totals: { usedCost: sum((r) => r.usedCost), wastedCost: sum((r) => r.wastedCost), cost: sum((r) => r.cost), countDifferenceCost: sum((r) => r.countDifferenceCost) },
  };
}

export async function valuationReport(user: CurrentUser, q: ValuationQuery): Promise<ValuationReport> {
  const { company, kitchens, kitchen, items } = await loadContext(user, q.kitchen);
  const next = new Date(Date.UTC(Number(q.asOf.slice(0, 4)), Number(q.asOf.slice(5, 7)) - 1, Number(q.asOf.slice(8)) + 1)).toISOString().slice(0, 10);
  const costs = await costCompany(db(), user.companyId, { before: dayStart(next, company.time_zone), formula: company.cost_formula });
  const places = currencyExponent(company.currency);
  const rows: ValuationRow[] = [];
  for (const [itemId, result] of costs) {
    const item = items.get(itemId);
    if (!item) continue;
    for (const [kitchenId, p] of result.positions) {
      if (kitchen && kitchenId !== kitchen.id) continue;
      const value = p.value.toDecimalPlaces(places, Dec.ROUND_HALF_EVEN);
      if (p.quantity.isZero() && value.isZero()) continue;
      rows.push({
        kitchen: kitchens.get(kitchenId)!, item: { id: item.id, sku: item.sku, name: item.name, category: item.category },
        quantity: plain(p.quantity), unit: item.stock_unit, value: value.toFixed(places),
      });
    }
  }
  rows.sort((a, b) => (a.kitchen.code !== b.kitchen.code ? (a.kitchen.code < b.kitchen.code ? -1 : 1) : byCategoryThenSku(a.item, b.item)));
  const byCategory: Record<string, Dec> = {};
  const byKitchen: Record<string, Dec> = {};
  let total = ZERO;
  for (const r of rows) {
    const v = dec(r.value);
    total = total.add(v);
    byCategory[r.item.category] = (byCategory[r.item.category] ?? ZERO).add(v);
    byKitchen[r.kitchen.code] = (byKitchen[r.kitchen.code] ?? ZERO).add(v);
  }
  const fixed = (o: Record<string, Dec>) => Object.fromEntries(Object.entries(o).map(([k, v]) => [k, v.toFixed(places)]));
  return {
    asOf: q.asOf, kitchen, currency: company.currency, costFormula: company.cost_formula, rows,
    totals: { value: total.toFixed(places), byCategory: fixed(byCategory), byKitchen: fixed(byKitchen) },
  };
}

export interface UsageMovement {
  id: string;
  /** ISO instant */
  occurredAt: string;
  kind: MovementKind;
  kitchen: KitchenRef;
  /** a transfer's other kitchen */
  otherKitchen: KitchenRef | null;
  lot: { id: string; code: string };
  /** signed change of on hand, stock units */
  quantity: string;
  /** signed change of the kitchen's stock value by the cost formula (an issue is negative), half-even to the currency's decimals: shown only */
  value: string;
  /** |value / quantity| before rounding, half-even to VALUE_SCALE places: shown only */
  unitCost: string;
  basis: CostBasis;
  reversal: boolean;
  reason: string | null;
  /** the usage report column the movement feeds; null: not usage (receipts, transfers) */
  countsAs: "used" | "wasted" | "countDifference" | null;
}

export interface UsageMovements {
  month: string;
  item: ItemRef;
  unit: StockUnit;
  kitchen: KitchenRef | null;
  currency: string;
  costFormula: CostFormula;
  /** in costing order (the ledger's order) */
  movements: UsageMovement[];
  /** the usage report's row for this item and month, worked the same way (exact sums, each rounded once) */
  totals: { usedQuantity: string; wastedQuantity: string; countDifferenceQuantity: string; usedCost: string; wastedCost: string; cost: string; countDifferenceCost: string };
}

/**
 * The usage report's drill-down: every movement of one item in one month (one kitchen or all), each
 * with what the cost formula made of it, from the same engine run as the report (costCompany up to
 * the month's end, this item only: an item is costed on its own).
 */
export async function usageMovements(user: CurrentUser, q: UsageMovementsQuery): Promise<UsageMovements> {
  const { company, kitchens, kitchen, items } = await loadContext(user, q.kitchen);
  const item = isUuid(q.item) ? items.get(q.item) : [...items.values()].find((i) => i.sku.toUpperCase() === q.item.toUpperCase());
  if (!item) throw notFound("Item");
  const tz = company.time_zone;
  const start = dayStart(`${q.month}-01`, tz);
  const end = dayStart(`${addMonths(q.month, 1)}-01`, tz);
  const costs = await costCompany(db(), user.companyId, { before: end, formula: company.cost_formula, itemIds: [item.id] });
  const costed = (costs.get(item.id)?.movements ?? []).filter((m) => m.occurredAt >= start && (!kitchen || m.kitchenId === kitchen.id));
  const details: { id: string; other_kitchen_id: string | null; reverses_id: string | null; reason: string | null; lot_id: string; lot_code: string }[] = costed.length
    ? await db()("stock_movements as m")
        .join("lots as l", function () {
          this.on("l.company_id", "=", "m.company_id").andOn("l.id", "=", "m.lot_id");
        })
        .where("m.company_id", user.companyId)
        .whereIn("m.id", costed.map((m) => m.id))
        .select("m.id", "m.other_kitchen_id", "m.reverses_id", "m.reason", "l.id as lot_id", "l.code as lot_code")
    : [];
  const byId = new Map(details.map((d) => [d.id, d]));
  const places = currencyExponent(company.currency);
  const money = (v: Dec) => v.toDecimalPlaces(places, Dec.ROUND_HALF_EVEN);
  let used = ZERO, wasted = ZERO, countQty = ZERO, usedCost = ZERO, wastedCost = ZERO, countCost = ZERO;
  const movements: UsageMovement[] = costed.map((m) => {
    const d = byId.get(m.id)!;
    const countsAs = m.kind === "use" ? "used" : m.kind === "waste" ? "wasted" : m.kind === "count" || m.kind === "adjustment" ? "countDifference" : null;
    if (countsAs === "used") {
      used = used.sub(m.delta);
      usedCost = usedCost.sub(m.value);
    } else if (countsAs === "wasted") {
      wasted = wasted.sub(m.delta);
      wastedCost = wastedCost.sub(m.value);
    } else if (countsAs === "countDifference") {
      countQty = countQty.add(m.delta);
      countCost = countCost.add(m.value);
    }
    return {
      id: m.id, occurredAt: m.occurredAt.toISOString(), kind: m.kind, kitchen: kitchens.get(m.kitchenId)!,
      otherKitchen: d.other_kitchen_id ? (kitchens.get(d.other_kitchen_id) ?? null) : null, lot: { id: d.lot_id, code: d.lot_code },
      quantity: plain(m.delta), value: money(m.value).toFixed(places),
      unitCost: m.delta.isZero() ? "0" : plain(m.value.div(m.delta).abs().toDecimalPlaces(VALUE_SCALE, Dec.ROUND_HALF_EVEN)),
      basis: m.basis, reversal: d.reverses_id !== null, reason: d.reason, countsAs,
    };
  });
  const u = money(usedCost), w = money(wastedCost);
  return {
    month: q.month, item: { id: item.id, sku: item.sku, name: item.name, category: item.category }, unit: item.stock_unit, kitchen,
    currency: company.currency, costFormula: company.cost_formula, movements,
    totals: {
      usedQuantity: plain(used), wastedQuantity: plain(wasted), countDifferenceQuantity: plain(countQty),
      usedCost: u.toFixed(places), wastedCost: w.toFixed(places), cost: u.add(w).toFixed(places), countDifferenceCost: money(countCost).toFixed(places),
    },
  };
}

// CSV: one line per row, the same figures as the JSON (numbers as plain decimals, never quoted).
export const BOM = "\uFEFF";

export function usageCsv(r: UsageReport, bom = false): string {
  const kitchenCols = r.groupBy === "kitchen" ? ["kitchen_code", "kitchen_name"] : [];
  const itemCols = r.groupBy === "item" ? ["sku", "item", "category", "unit", "used_quantity", "wasted_quantity", "quantity"] : r.groupBy === "category" ? ["category"] : [];
  const costCols = ["used_cost", "wasted_cost", "cost", ...(r.groupBy === "item" ? ["count_difference_quantity"] : []), "count_difference_cost", "currency"];
  const rows: CsvCell[][] = r.rows.map((x) => [
    x.month,
    ...(r.groupBy === "kitchen" ? [x.kitchen!.code, x.kitchen!.name] : []),
    ...(r.groupBy === "item" ? [x.item!.sku, x.item!.name, x.category, x.unit, x.usedQuantity, x.wastedQuantity, x.quantity] : r.groupBy === "category" ? [x.category] : []),
    x.usedCost, x.wastedCost, x.cost, ...(r.groupBy === "item" ? [x.countDifferenceQuantity] : []), x.countDifferenceCost, r.currency,
  ]);
  return (bom ? BOM : "") + toCsv(["month", ...kitchenCols, ...itemCols, ...costCols], rows);
}

export function valuationCsv(r: ValuationReport, bom = false): string {
  return (bom ? BOM : "") + toCsv(
    ["as_of", "kitchen_code", "kitchen_name", "sku", "item", "category", "quantity", "unit", "value", "currency"],
    r.rows.map((x) => [r.asOf, x.kitchen.code, x.kitchen.name, x.item.sku, x.item.name, x.item.category, x.quantity, x.unit, x.value, r.currency]),
  );
}

// Spreadsheet files: the same rows and totals, a sheet per report (lib/reports/xlsx.ts).
const CATEGORY_WORDS: Record<string, string> = { casing: "Casings", cure: "Cures", spice: "Spices", ingredient: "Other ingredients" };
const FORMULA_WORDS: Record<CostFormula, string> = { fifo: "FIFO (first in, first out), per kitchen", average: "moving weighted average, per kitchen" };

export function usageXlsx(r: UsageReport): Promise<Buffer> {
  const columns: SheetColumn[] = [
    { header: "Month", key: "month", kind: "text", width: 10 },
    ...(r.groupBy === "kitchen" ? [{ header: "Kitchen", key: "kitchen", kind: "text" } as const] : []),
    ...(r.groupBy === "item"
      ? ([
          { header: "SKU", key: "sku", kind: "text", width: 14 }, { header: "Item", key: "item", kind: "text", width: 32 },
          { header: "Category", key: "category", kind: "text", width: 16 }, { header: "Unit", key: "unit", kind: "text", width: 6 },
          { header: "Used", key: "usedQuantity", kind: "quantity" }, { header: "Wasted", key: "wastedQuantity", kind: "quantity" },
        ] as const)
      : r.groupBy === "category" ? [{ header: "Category", key: "category", kind: "text" } as const] : []),
    { header: `Used cost (${r.currency})`, key: "usedCost", kind: "money" },
    { header: `Wasted cost (${r.currency})`, key: "wastedCost", kind: "money" },
    { header: `Cost (${r.currency})`, key: "cost", kind: "money" },
    ...(r.groupBy === "item" ? [{ header: "Count difference", key: "countDifferenceQuantity", kind: "quantity" } as const] : []),
    { header: `Count difference (${r.currency})`, key: "countDifferenceCost", kind: "money" },
  ];
  const rows = r.rows.map((x) => ({
    month: x.month, kitchen: x.kitchen ? `${x.kitchen.code} ${x.kitchen.name}` : undefined, sku: x.item?.sku, item: x.item?.name,
    category: x.category ? CATEGORY_WORDS[x.category] : undefined, unit: x.unit, usedQuantity: x.usedQuantity, wastedQuantity: x.wastedQuantity,
    usedCost: x.usedCost, wastedCost: x.wastedCost, cost: x.cost, countDifferenceQuantity: x.countDifferenceQuantity, countDifferenceCost: x.countDifferenceCost,
  }));
  return workbook([{
    name: "Usage",
    preamble: [
      `Usage and cost by month, ${r.from} to ${r.to}${r.kitchen ? `, ${r.kitchen.name}` : ", all kitchens"}`,
      `Cost formula: ${FORMULA_WORDS[r.costFormula]}. Count differences are shown apart from usage.`,
    ],
    columns, rows, currencyDecimals: currencyExponent(r.currency),
    totals: { month: "Total", usedCost: r.totals.usedCost, wastedCost: r.totals.wastedCost, cost: r.totals.cost, countDifferenceCost: r.totals.countDifferenceCost },
  }]);
}

export function valuationXlsx(r: ValuationReport): Promise<Buffer> {
  return workbook([{
    name: "Valuation",
    preamble: [
      `Stock valuation at the end of ${r.asOf}${r.kitchen ? `, ${r.kitchen.name}` : ", all kitchens"}`,
      `Cost formula: ${FORMULA_WORDS[r.costFormula]}.`,
    ],
    columns: [
      { header: "Kitchen", key: "kitchen", kind: "text" }, { header: "SKU", key: "sku", kind: "text", width: 14 },
      { header: "Item", key: "item", kind: "text", width: 32 }, { header: "Category", key: "category", kind: "text", width: 16 },
      { header: "On hand", key: "quantity", kind: "quantity" }, { header: "Unit", key: "unit", kind: "text", width: 6 },
      { header: `Value (${r.currency})`, key: "value", kind: "money" },
    ],
    rows: r.rows.map((x) => ({ kitchen: `${x.kitchen.code} ${x.kitchen.name}`, sku: x.item.sku, item: x.item.name, category: CATEGORY_WORDS[x.item.category], quantity: x.quantity, unit: x.unit, value: x.value })),
    totals: { kitchen: "Total", value: r.totals.value },
    currencyDecimals: currencyExponent(r.currency),
  }]);
}
