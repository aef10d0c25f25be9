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
// Money is "at receipt cost": on hand x the lot's unit cost (lots.unit_cost, per stock unit,
// fixed when the lot was received; stock_movements.unit_cost carries the same figure). There is
// no cost formula yet (average or FIFO costing comes with accounting). Products are exact in SQL
// NUMERIC; each value shown is rounded once, half-even, to the currency's decimals, and a total
// is the sum of the rounded values above it, so a column adds up.
//
// Who sees what: dashboard.read per kitchen. Admins, managers, buyers and accountants read every
// open kitchen of their company, kitchen leads their own. Every query names the company and the
// kitchens. "Today" and months are the company's (its time zone), as for expiry everywhere.
import "server-only";
import { db } from "../../db/client";
import type { DateKind, ItemCategory, StockUnit } from "../../db/types";
import { DEFAULT_EXPIRY_WINDOWS, dateInZone, daysBetween, normaliseWindows } from "../alerts/expiry";
import type { CurrentUser } from "../auth/current-user";
import { can, canSomewhere } from "../auth/permissions";
import { CURE_CAUTION } from "../cure/caution";
import { forbidden } from "../http/errors";
import { currencyDecimals } from "../purchasing/order-money";
import { gatherReorder, type ReorderItemRef } from "../reorder/gather";
import type { OfferFigures } from "../reorder/suggest";
import { Dec, dec, plain, ZERO } from "../units/decimal";
import { listShortBatches } from "./batches";

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
  /** on hand x the lot's unit cost, currency decimals */
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
  costBasis: "receipt";
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
  cureWindow: number;
  kitchens: DashboardKitchen[];
}

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
  const company: { time_zone: string; currency: string; expiry_windows: unknown } = await db()("companies")
    .where({ id: user.companyId })
    .first("time_zone", "currency", "expiry_windows");
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
    cureWindow: cure?.length ? Math.max(...cure) : FALLBACK_CURE_WINDOW,
    kitchens: open.filter((k) => can(user, "dashboard.read", { kitchenId: k.id })),
  };
}

// ---------------------------------------------------------------------------------------------
// Panels

async function cureExpiringIn(s: Scope): Promise<CureExpiringPanel> {
  if (!s.kitchens.length) return { windowDays: s.cureWindow, lots: [], caution: null };
  const rows: {
    kitchen_id: string; kitchen_code: string; kitchen_name: string; item_id: string; sku: string; item_name: string; stock_unit: StockUnit;
    lot_id: string; lot_code: string; date: string; date_kind: DateKind; on_hand: string; value: string;
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
      db().raw("trim_scale(b.on_hand)::text as on_hand"), db().raw("(b.on_hand * l.unit_cost)::text as value"),
    );
  const lots = rows.map((r): ExpiringCureLot => ({
    kitchen: { id: r.kitchen_id, code: r.kitchen_code, name: r.kitchen_name },
    item: { id: r.item_id, sku: r.sku, name: r.item_name, category: "cure", stockUnit: r.stock_unit, putUp: null },
    lot: { id: r.lot_id, code: r.lot_code },
    quantity: plain(r.on_hand),
    value: money(r.value, s.currency),
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

async function stockValueIn(s: Scope): Promise<StockValuePanel> {
  if (!s.kitchens.length) return { kitchens: [], total: money("0", s.currency) };
  const rows: { kitchen_id: string; value: string }[] = await db()("stock_balances as b")
    .join("lots as l", function () {
      this.on("l.company_id", "=", "b.company_id").andOn("l.id", "=", "b.lot_id");
    })
    .where("b.company_id", s.companyId)
    .whereIn("b.kitchen_id", kitchenIds(s))
    .groupBy("b.kitchen_id")
    .select("b.kitchen_id", db().raw("sum(b.on_hand * l.unit_cost)::text as value"));
  const exact = new Map(rows.map((r) => [r.kitchen_id, r.value]));
  const kitchens = s.kitchens.map((kitchen) => ({ kitchen, value: money(exact.get(kitchen.id) ?? "0", s.currency) }));
  return { kitchens, total: sumMoney(kitchens.map((k) => k.value), s.currency) };
}

async function usageTrendIn(s: Scope): Promise<UsageTrendPanel> {
  const months = Array.from({ length: USAGE_MONTHS }, (_, i) => monthBefore(s.today, USAGE_MONTHS - 1 - i));
  const after = monthBefore(s.today, -1);
  const rows: { month: string; category: ItemCategory; value: string }[] = s.kitchens.length
    ? await db()("stock_movements as m")
        .join("items as i", function () {
          this.on("i.company_id", "=", "m.company_id").andOn("i.id", "=", "m.item_id");
        })
        .where("m.company_id", s.companyId)
        .whereIn("m.kitchen_id", kitchenIds(s))
        .whereIn("m.kind", [...USAGE_KINDS])
        // the months' bounds are the company's midnights
        .whereRaw("m.occurred_at >= (?::date)::timestamp at time zone ?", [`${months[0]}-01`, s.timeZone])
        .whereRaw("m.occurred_at < (?::date)::timestamp at time zone ?", [`${after}-01`, s.timeZone])
        .groupByRaw("1, 2")
        .select(
          db().raw("to_char(m.occurred_at at time zone ?, 'YYYY-MM') as month", [s.timeZone]),
          "i.category",
          // a use or waste takes stock (delta < 0); its reversal gives it back in the same kind
          db().raw("(-sum(m.delta * m.unit_cost))::text as value"),
        )
    : [];
  const valueOf = (month: string, category: ItemCategory) => money(rows.find((r) => r.month === month && r.category === category)?.value ?? "0", s.currency);
  return {
    kinds: [...USAGE_KINDS],
    months: months.map((month) => {
      const v = { cure: valueOf(month, "cure"), casing: valueOf(month, "casing"), spice: valueOf(month, "spice"), ingredient: valueOf(month, "ingredient") };
      return { month, ...v, total: sumMoney(Object.values(v), s.currency) };
    }),
  };
}

// ---------------------------------------------------------------------------------------------
// Reading: one function per panel, and the whole overview at once

export async function getCureExpiring(user: CurrentUser, now: Date = new Date()): Promise<CureExpiringPanel> {
  return cureExpiringIn(await scopeOf(user, now));
}

export async function getBelowReorder(user: CurrentUser, now: Date = new Date()): Promise<BelowReorderPanel> {
  return belowReorderIn(await scopeOf(user, now));
}

export async function getShortages(user: CurrentUser, now: Date = new Date()): Promise<ShortagesPanel> {
  return shortagesIn(user, await scopeOf(user, now));
}

export async function getStockValue(user: CurrentUser, now: Date = new Date()): Promise<StockValuePanel> {
  return stockValueIn(await scopeOf(user, now));
}

export async function getUsageTrend(user: CurrentUser, now: Date = new Date()): Promise<UsageTrendPanel> {
  return usageTrendIn(await scopeOf(user, now));
}

export async function getDashboard(user: CurrentUser, now: Date = new Date()): Promise<Dashboard> {
  const s = await scopeOf(user, now);
  const [cureExpiring, belowReorder, shortages, stockValue, usageTrend] = await Promise.all([
    cureExpiringIn(s), belowReorderIn(s), shortagesIn(user, s), stockValueIn(s), usageTrendIn(s),
  ]);
  return { today: s.today, currency: s.currency, costBasis: "receipt", kitchens: s.kitchens, cureExpiring, belowReorder, shortages, stockValue, usageTrend };
}
