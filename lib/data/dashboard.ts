// The manager's Overview (app/(app)/overview, GET /api/dashboard): five panels read from what the
// rest of the product already keeps, one function per panel, none with a rule of its own where
// one exists elsewhere:
// - cure expiring soon: cure lots with stock dated within the company's largest cure warning
//   window (companies.expiry_windows, lib/alerts/expiry.ts), or already past their date
// - below the reorder point: lib/reorder (gatherReorder + suggestReorder + groupBySupplier), the
//   figures of Buying > Reorder
// - next week's shortages: the planner's own shortage per batch line (listShortBatches in
//   ./batches.ts) for batches of today and the six days after
// - stock value by kitchen and the usage trend
//
// Money follows the company's cost formula (companies.cost_formula: FIFO or moving average, kept
// per kitchen; lib/costing/engine.ts), from ONE engine run per request (costCompany, as the
// reports run it), over every kitchen of the company since transfers tie them together, up to the
// end of the company's today (a movement may be dated up to a minute ahead of its posting, so the
// end of the day, not this instant, is what agrees with the balances; it is also what
// Reports > Valuation for today costs up to). From that run:
// - stock value by kitchen: each item's value in the kitchen (its position) rounded, then added:
//   the rows and kitchen totals of Reports > Valuation for today (valuationReport);
// - usage trend: use and waste net of reversals as the formula costed them, used and wasted each
//   rounded per month and category, then added: the cost of Reports > Usage by category
//   (usageReport);
// - a cure lot's value: its on hand x the kitchen's unit value of the item under the formula
//   (position value / position quantity), rounded once. The ledger draws lots FEFO, the formula
//   costs what leaves, so a lot has no cost of its own under the formula; its share of the item's
//   value in the kitchen is what it is worth there.
// Values are exact decimals until shown; each is rounded once, half-even, to the currency's
// decimals (where a figure adds several, as the reports do, each part is rounded once and the
// parts added), and a total is the sum of the rounded values above it, so a column adds up.
//
// Who sees what: dashboard.read per kitchen. Admins, managers, buyers and accountants read every
// open kitchen of their company, kitchen leads their own. Every query names the company and the
// kitchens; the costing run covers every kitchen (a transfer carries its cost from one to the
// other), and only the user's kitchens' figures are taken from it. "Today" and months are the
// company's (its time zone), as for expiry everywhere.
import "server-only";
import { db } from "../../db/client";
import type { DateKind, ItemCategory, StockUnit } from "../../db/types";
import { DEFAULT_EXPIRY_WINDOWS, dateInZone, daysBetween, normaliseWindows } from "../alerts/expiry";
import type { CurrentUser } from "../auth/current-user";
import { can, canSomewhere } from "../auth/permissions";
import type { CostFormula, CostingResult } from "../costing/engine";
import { costCompany } from "../costing/load";
import { CURE_CAUTION } from "../cure/caution";
import { forbidden } from "../http/errors";
import { currencyDecimals } from "../purchasing/order-money";
import { gatherReorder, type ReorderItemRef } from "../reorder/gather";
import type { OfferFigures } from "../reorder/suggest";
import { Dec, dec, plain, ZERO } from "../units/decimal";
import { listShortBatches } from "./batches";
import { dayStart } from "./reports";

export interface DashboardKitchen {
  id: string;
  code: string;
  name: string;
}

/** An item as the panels show it: the same reference Reorder uses. */
export type DashboardItem = ReorderItemRef;

export interface ExpiringCureLot {
  kitchen: DashboardKitchen;
  item: DashboardItem;
  lot: { id: string; code: string };
  /** on hand in the kitchen, stock unit */
  quantity: string;
  /** on hand x the kitchen's unit value of the item under the cost formula, currency decimals */
  value: string;
  date: string;
  dateKind: DateKind;
  /** the date less the company's today; negative once past it */
  daysLeft: number;
}

export interface CureExpiringPanel {
  windowDays: number;
  lots: ExpiringCureLot[];
  caution: string | null;
}

export interface BelowReorderItem {
  kitchen: DashboardKitchen;
  item: DashboardItem;
  onHand: string;
  projected: string;
  by: string;
  reorderPoint: string;
  parLevel: string | null;
  suggestedQuantity: string | null;
  supplier: string | null;
}

export interface BelowReorderPanel {
  items: BelowReorderItem[];
  caution: string | null;
}

export type ShortageSuggestion = { kind: "transfer"; kitchen: { id: string; code: string }; quantity: string } | { kind: "buy"; quantity: string };

export interface ShortageLine {
  batch: { id: string; recipeCode: string; recipeName: string; status: "planned" | "reserved" };
  kitchen: DashboardKitchen;
  plannedFor: string;
  item: DashboardItem;
  needed: string;
  short: string;
  suggestions: ShortageSuggestion[];
}

export interface ShortagesPanel {
  from: string;
  to: string;
  lines: ShortageLine[];
  caution: string | null;
}

export interface StockValuePanel {
  kitchens: { kitchen: DashboardKitchen; value: string }[];
  total: string;
}

export const USAGE_KINDS = ["use", "waste"] as const;
export const USAGE_MONTHS = 6;

export interface UsageMonth {
  /** yyyy-mm in the company's time zone */
  month: string;
  cure: string;
  casing: string;
  spice: string;
  ingredient: string;
  total: string;
}

export interface UsageTrendPanel {
  kinds: ("use" | "waste")[];
  months: UsageMonth[];
}

export interface Dashboard {
  today: string;
  currency: string;
  /** the company's cost formula, which every money figure follows */
  costFormula: CostFormula;
  kitchens: DashboardKitchen[];
  cureExpiring: CureExpiringPanel;
  belowReorder: BelowReorderPanel;
  shortages: ShortagesPanel;
  stockValue: StockValuePanel;
  usageTrend: UsageTrendPanel;
}

/** Days ahead a cure is listed when the company has no cure window of its own. */
export const FALLBACK_CURE_WINDOW = Math.max(...(DEFAULT_EXPIRY_WINDOWS.cure ?? [60]));
/** The shortages panel looks at today and this many days after. */
export const SHORTAGE_DAYS_AFTER = 6;

interface Scope {
  companyId: string;
  today: string;
  timeZone: string;
  currency: string;
  costFormula: CostFormula;
  cureWindow: number;
  kitchens: DashboardKitchen[];
}

/** The engine's answer per item (lib/costing/load.ts). */
type Costs = Map<string, CostingResult>;

const kitchenIds = (s: Scope) => s.kitchens.map((k) => k.id);

function addDays(isoDate: string, days: number): string {
  const d = new Date(`${isoDate}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + days);
  return d.toISOString().slice(0, 10);
}

/** yyyy-mm of the month `back` months before the one `isoDate` falls in. */
function monthBefore(isoDate: string, back: number): string {
  const [y, m] = isoDate.split("-").map(Number) as [number, number];
  const index = y * 12 + (m - 1) - back;
  return `${String(Math.floor(index / 12)).padStart(4, "0")}-${String((index % 12) + 1).padStart(2, "0")}`;
}

/** The one rounding of a money value: half-even to the currency's decimals. */
function money(value: string | Dec, currency: string): string {
  const e = currencyDecimals(currency);
  return dec(value).toDecimalPlaces(e, Dec.ROUND_HALF_EVEN).toFixed(e);
}

const sumMoney = (values: readonly string[], currency: string) => values.reduce<Dec>((s, v) => s.plus(dec(v)), ZERO).toFixed(currencyDecimals(currency));

/** The company's date, currency, cure window and the open kitchens the user may read here (403 without any). */
async function scopeOf(user: CurrentUser, now: Date): Promise<Scope> {
  if (!canSomewhere(user, "dashboard.read")) throw forbidden("The overview covers your kitchens, and you have none assigned yet: ask an admin.");
  const company: { time_zone: string; currency: string; expiry_windows: unknown; cost_formula: CostFormula } = await db()("companies")
    .where({ id: user.companyId })
    .first("time_zone", "currency", "expiry_windows", "cost_formula");
  const open: DashboardKitchen[] = await db()("kitchens")
    .where({ company_id: user.companyId })
    .whereNull("archived_at")
    .orderByRaw("lower(name), code")
    .select("id", "code", "name");
  const cure = normaliseWindows(company.expiry_windows).cure;
  return {
    companyId: user.companyId,
    today: dateInZone(now, company.time_zone),
    timeZone: company.time_zone,
    currency: company.currency,
    costFormula: company.cost_formula,
    cureWindow: cure?.length ? Math.max(...cure) : FALLBACK_CURE_WINDOW,
    kitchens: open.filter((k) => can(user, "dashboard.read", { kitchenId: k.id })),
  };
}

/**
 * The one costing run of a request: every item, every kitchen of the company (transfers tie them),
 * up to the start of the company's tomorrow. Nothing to run when the user reads no open kitchen.
 */
async function costsOf(s: Scope): Promise<Costs> {
  if (!s.kitchens.length) return new Map();
  return costCompany(db(), s.companyId, { before: dayStart(addDays(s.today, 1), s.timeZone), formula: s.costFormula });
}

// ---------------------------------------------------------------------------------------------
// Panels

async function cureExpiringIn(s: Scope, costing: Promise<Costs>): Promise<CureExpiringPanel> {
  if (!s.kitchens.length) return { windowDays: s.cureWindow, lots: [], caution: null };
  const rows: {
    kitchen_id: string; kitchen_code: string; kitchen_name: string; item_id: string; sku: string; item_name: string; stock_unit: StockUnit;
    lot_id: string; lot_code: string; date: string; date_kind: DateKind; on_hand: string; unit_cost: string;
  }[] = await db()("stock_balances as b")
    .join("lots as l", function () {
      this.on("l.company_id", "=", "b.company_id").andOn("l.id", "=", "b.lot_id");
    })
    .join("items as i", function () {
      this.on("i.company_id", "=", "b.company_id").andOn("i.id", "=", "b.item_id");
    })
    .join("kitchens as k", function () {
      this.on("k.company_id", "=", "b.company_id").andOn("k.id", "=", "b.kitchen_id");
    })
    .where("b.company_id", s.companyId)
    .whereIn("b.kitchen_id", kitchenIds(s))
    .where("b.on_hand", ">", 0)
    .where("i.category", "cure")
    .whereNotNull("l.date")
    .where("l.date", "<=", addDays(s.today, s.cureWindow))
    .orderByRaw("l.date, lower(i.name), lower(k.name), l.code")
    .select(
      "b.kitchen_id", "k.code as kitchen_code", "k.name as kitchen_name", "i.id as item_id", "i.sku", "i.name as item_name", "i.stock_unit",
      "l.id as lot_id", "l.code as lot_code", db().raw("to_char(l.date, 'YYYY-MM-DD') as date"), "l.date_kind",
      db().raw("trim_scale(b.on_hand)::text as on_hand"), db().raw("l.unit_cost::text as unit_cost"),
    );
  const costs = await costing;
  /** on hand x position value / position quantity (multiplied first: the unit value need not terminate) */
  const valueOf = (r: (typeof rows)[number]) => {
    const p = costs.get(r.item_id)?.positions.get(r.kitchen_id);
    // the position holds what the balances hold; were it ever empty (a movement dated after the end
    // of today), the engine's own fallback for stock it cannot place applies: the lot's cost
    if (!p || p.quantity.lte(0)) return dec(r.on_hand).mul(dec(r.unit_cost));
    return dec(r.on_hand).mul(p.value).div(p.quantity);
  };
  const lots = rows.map((r): ExpiringCureLot => ({
    kitchen: { id: r.kitchen_id, code: r.kitchen_code, name: r.kitchen_name },
    item: { id: r.item_id, sku: r.sku, name: r.item_name, category: "cure", stockUnit: r.stock_unit, putUp: null },
    lot: { id: r.lot_id, code: r.lot_code },
    quantity: plain(r.on_hand),
    value: money(valueOf(r), s.currency),
    date: r.date,
    dateKind: r.date_kind,
    daysLeft: daysBetween(s.today, r.date),
  }));
  return { windowDays: s.cureWindow, lots, caution: lots.length ? CURE_CAUTION : null };
}

async function belowReorderIn(s: Scope): Promise<BelowReorderPanel> {
  const g = await gatherReorder(db(), { companyId: s.companyId, kitchenIds: kitchenIds(s), today: s.today });
  const items: BelowReorderItem[] = [];
  for (const k of g.kitchens) {
    // the chosen offer after the raise to the supplier's minimum: what Buying > Reorder shows
    const chosen = new Map<string, OfferFigures>(k.groups.flatMap((grp) => grp.lines.map((l) => [l.key, l.figures] as const)));
    for (const f of k.items) {
      if (!f.suggestion.suggested) continue;
      const fig = chosen.get(f.key) ?? null;
      items.push({
        kitchen: k.kitchen,
        item: f.item,
        onHand: plain(f.input.onHand),
        projected: fig ? fig.projected : f.suggestion.projectedToday,
        by: fig ? fig.horizon : s.today,
        reorderPoint: plain(f.input.reorderPoint!),
        parLevel: f.input.parLevel === null ? null : plain(f.input.parLevel),
        suggestedQuantity: fig ? fig.quantity : null,
        supplier: fig ? fig.offer.supplierName : null,
      });
    }
  }
  return { items, caution: items.some((i) => i.item.category === "cure") ? CURE_CAUTION : null };
}

async function shortagesIn(user: CurrentUser, s: Scope): Promise<ShortagesPanel> {
  const to = addDays(s.today, SHORTAGE_DAYS_AFTER);
  const batches = await listShortBatches(user, { kitchenIds: kitchenIds(s), from: s.today, to });
  const itemIds = [...new Set(batches.flatMap((b) => b.lines.map((l) => l.item.id)))];
  const putUps: { id: string; put_up: string | null; put_up_metres: string | null }[] = itemIds.length
    ? await db()("items").where({ company_id: s.companyId }).whereIn("id", itemIds).select("id", "put_up", db().raw("trim_scale(put_up_metres)::text as put_up_metres"))
    : [];
  const putUpOf = (itemId: string) => {
    const p = putUps.find((x) => x.id === itemId);
    return p?.put_up && p.put_up_metres ? { name: p.put_up, metres: p.put_up_metres } : null;
  };
  const lines: ShortageLine[] = batches.flatMap((b) =>
    b.lines
      .filter((l) => l.short !== null)
      .map((l): ShortageLine => ({
        batch: { id: b.id, recipeCode: b.recipe.code, recipeName: b.recipe.name, status: b.status as "planned" | "reserved" },
        kitchen: b.kitchen,
        plannedFor: b.plannedFor,
        item: { id: l.item.id, sku: l.item.sku, name: l.item.name, category: l.item.category, stockUnit: l.item.unit, putUp: putUpOf(l.item.id) },
        needed: l.quantity,
        short: l.short!,
        suggestions: l.suggestions,
      })),
  );
  return { from: s.today, to, lines, caution: lines.some((l) => l.item.category === "cure") ? CURE_CAUTION : null };
}

function stockValueIn(s: Scope, costs: Costs): StockValuePanel {
  const e = currencyDecimals(s.currency);
  // each item's value in the kitchen rounded once (a row of Reports > Valuation), then added
  const byKitchen = new Map<string, Dec>();
  for (const result of costs.values()) {
    for (const [kitchenId, p] of result.positions) {
      byKitchen.set(kitchenId, (byKitchen.get(kitchenId) ?? ZERO).add(p.value.toDecimalPlaces(e, Dec.ROUND_HALF_EVEN)));
    }
  }
  const kitchens = s.kitchens.map((kitchen) => ({ kitchen, value: money(byKitchen.get(kitchen.id) ?? ZERO, s.currency) }));
  return { kitchens, total: sumMoney(kitchens.map((k) => k.value), s.currency) };
}

function usageTrendIn(s: Scope, costs: Costs, categories: Map<string, ItemCategory>): UsageTrendPanel {
  const months = Array.from({ length: USAGE_MONTHS }, (_, i) => monthBefore(s.today, USAGE_MONTHS - 1 - i));
  // the months' bounds are the company's midnights; the run ends with today
  const start = dayStart(`${months[0]}-01`, s.timeZone);
  const mine = new Set(kitchenIds(s));
  const acc = new Map<string, { used: Dec; wasted: Dec }>();
  for (const [itemId, result] of costs) {
    const category = categories.get(itemId);
    if (!category) continue;
    for (const m of result.movements) {
      if (m.kind !== "use" && m.kind !== "waste") continue;
      if (m.occurredAt < start || !mine.has(m.kitchenId)) continue;
      const key = `${dateInZone(m.occurredAt, s.timeZone).slice(0, 7)}|${category}`;
      let a = acc.get(key);
      if (!a) acc.set(key, (a = { used: ZERO, wasted: ZERO }));
      // an issue lowers the kitchen's value (value < 0); its reversal keeps the kind and gives it back
      if (m.kind === "use") a.used = a.used.sub(m.value);
      else a.wasted = a.wasted.sub(m.value);
    }
  }
  const e = currencyDecimals(s.currency);
  const valueOf = (month: string, category: ItemCategory) => {
    const a = acc.get(`${month}|${category}`);
    // used and wasted each rounded, then added: the usage report's cost for the row
    return a ? money(a.used.toDecimalPlaces(e, Dec.ROUND_HALF_EVEN).add(a.wasted.toDecimalPlaces(e, Dec.ROUND_HALF_EVEN)), s.currency) : money(ZERO, s.currency);
  };
  return {
    kinds: [...USAGE_KINDS],
    months: months.map((month) => {
      const v = { cure: valueOf(month, "cure"), casing: valueOf(month, "casing"), spice: valueOf(month, "spice"), ingredient: valueOf(month, "ingredient") };
      return { month, ...v, total: sumMoney(Object.values(v), s.currency) };
    }),
  };
}

/** Each costed item's category, for the usage trend. */
async function categoriesOf(s: Scope): Promise<Map<string, ItemCategory>> {
  const rows: { id: string; category: ItemCategory }[] = s.kitchens.length ? await db()("items").where({ company_id: s.companyId }).select("id", "category") : [];
  return new Map(rows.map((r) => [r.id, r.category]));
}

// ---------------------------------------------------------------------------------------------
// Reading: one function per panel, and the whole overview at once

export async function getCureExpiring(user: CurrentUser, now: Date = new Date()): Promise<CureExpiringPanel> {
  const s = await scopeOf(user, now);
  return cureExpiringIn(s, costsOf(s));
}

export async function getBelowReorder(user: CurrentUser, now: Date = new Date()): Promise<BelowReorderPanel> {
  return belowReorderIn(await scopeOf(user, now));
}

export async function getShortages(user: CurrentUser, now: Date = new Date()): Promise<ShortagesPanel> {
  return shortagesIn(user, await scopeOf(user, now));
}

export async function getStockValue(user: CurrentUser, now: Date = new Date()): Promise<StockValuePanel> {
  const s = await scopeOf(user, now);
  return stockValueIn(s, await costsOf(s));
}

export async function getUsageTrend(user: CurrentUser, now: Date = new Date()): Promise<UsageTrendPanel> {
  const s = await scopeOf(user, now);
  const [costs, categories] = await Promise.all([costsOf(s), categoriesOf(s)]);
  return usageTrendIn(s, costs, categories);
}

/** Every panel, with the money of all three money panels from one costing run. */
export async function getDashboard(user: CurrentUser, now: Date = new Date()): Promise<Dashboard> {
  const s = await scopeOf(user, now);
  const costing = costsOf(s);
  const [costs, categories, cureExpiring, belowReorder, shortages] = await Promise.all([costing, categoriesOf(s), cureExpiringIn(s, costing), belowReorderIn(s), shortagesIn(user, s)]);
  return {
    today: s.today, currency: s.currency, costFormula: s.costFormula, kitchens: s.kitchens,
    cureExpiring, belowReorder, shortages, stockValue: stockValueIn(s, costs), usageTrend: usageTrendIn(s, costs, categories),
  };
}
