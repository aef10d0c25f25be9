// The Overview's answer (GET /api/dashboard): the shapes of lib/data/dashboard.ts, for the OpenAPI
// document (a drift fails `tsc` in lib/http/openapi.ts). Client-safe. The route takes no query.
// Money follows the company's cost formula (FIFO cost or moving average cost; `costFormula`).
import { z } from "zod";
import { DATE_KINDS, ITEM_CATEGORIES, STOCK_UNITS } from "../../db/types";

const id = z.uuid();
const isoDate = (description: string, example = "2026-12-09") => z.string().meta({ description: `${description} yyyy-mm-dd.`, example });
const decimal = (description: string, example?: string) =>
  z.string().meta({ description: `${description} A decimal string.`, ...(example ? { example } : {}) });
const money = (description: string, example = "1250.40") =>
  decimal(`${description} By the company's cost formula (costFormula: FIFO cost or moving average cost, kept per kitchen), in the company's currency, rounded half-even to its decimals.`, example);
const quantity = (description: string, example?: string) => decimal(`${description} In the item's stock unit.`, example);

const kitchen = z.object({ id, code: z.string(), name: z.string() }).meta({ id: "DashboardKitchen" });
const item = z
  .object({
    id, sku: z.string(), name: z.string(), category: z.enum(ITEM_CATEGORIES), stockUnit: z.enum(STOCK_UNITS),
    putUp: z.object({ name: z.string(), metres: z.string() }).nullable().meta({ description: "Natural casings: the put-up one pc is (a hank of 91.44 m); null otherwise." }),
  })
  .meta({ id: "DashboardItem" });
const caution = z.string().nullable().meta({ description: "The cure caution when the panel lists a cure; null otherwise." });

export const cureExpiringPanel = z
  .object({
    windowDays: z.number().int().meta({ description: "The company's largest cure warning window (Settings: expiry windows; 60 when none is set): lots dated up to today + this many days are listed." }),
    lots: z.array(
      z.object({
        kitchen,
        item,
        lot: z.object({ id, code: z.string() }),
        quantity: quantity("On hand in the kitchen.", "2500"),
        value: money("On hand x the kitchen's unit value of the item under the cost formula (the item's value in the kitchen / its quantity there, as Reports > Valuation has them for today), rounded once.", "16.00"),
        date: isoDate("The lot's date."),
        dateKind: z.enum(DATE_KINDS),
        daysLeft: z.number().int().meta({ description: "The date less the company's today, in calendar days: 0 on the day, negative once past it." }),
      }),
    ).meta({ description: "Lots of cure with stock in open kitchens, dated within the window or already past it; fewest days left first." }),
    caution,
  })
  .meta({ id: "DashboardCureExpiring" });

export const belowReorderPanel = z
  .object({
    items: z.array(
      z.object({
        kitchen,
        item,
        onHand: quantity("On hand in the kitchen."),
        projected: quantity("What the reorder rule projects by `by` (on hand - reserved - planned use + open orders)."),
        by: isoDate("The day of the projection: today + the chosen supplier's lead time (today when no supplier sells it)."),
        reorderPoint: quantity("The kitchen's reorder point."),
        parLevel: quantity("The kitchen's par level; null: none.").nullable(),
        suggestedQuantity: quantity("What the reorder page suggests ordering from the preselected supplier (whole packs, raised to a minimum order); null: no supplier sells it.").nullable(),
        supplier: z.string().nullable().meta({ description: "The preselected supplier; null: none sells the item." }),
      }),
    ).meta({ description: "Items the reorder rule (lib/reorder) suggests ordering, per kitchen, as on Buying > Reorder." }),
    caution,
  })
  .meta({ id: "DashboardBelowReorder" });

export const shortagesPanel = z
  .object({
    from: isoDate("The first day looked at (today)."),
    to: isoDate("The last day looked at (today + 6)."),
    lines: z.array(
      z.object({
        batch: z.object({ id, recipeCode: z.string(), recipeName: z.string(), status: z.enum(["planned", "reserved"]) }),
        kitchen,
        plannedFor: isoDate("The batch's day."),
        item,
        needed: quantity("The batch line's quantity."),
        short: quantity("What the batch would lack, as the planner works it out (stock in date on the day, batches ahead first)."),
        suggestions: z.array(
          z.union([
            z.object({ kind: z.literal("transfer"), kitchen: z.object({ id, code: z.string() }), quantity: quantity("To ask for from that kitchen.") }),
            z.object({ kind: z.literal("buy"), quantity: quantity("To buy.") }),
          ]),
        ),
      }),
    ).meta({ description: "Each short line of the planned and reserved batches of the next seven days, by day." }),
    caution,
  })
  .meta({ id: "DashboardShortages" });

export const stockValuePanel = z
  .object({
    kitchens: z.array(z.object({ kitchen, value: money("The kitchen's stock at the end of today: each item's value in the kitchen rounded once, then added; the kitchen's total in GET /api/reports/valuation for today.") })),
    total: money("The sum of the kitchens' values as shown (so the column adds up)."),
  })
  .meta({ id: "DashboardStockValue" });

const perCategory = (what: string) => money(what, "84.20");
export const usageTrendPanel = z
  .object({
    kinds: z.array(z.enum(["use", "waste"])).meta({ description: "The movement kinds counted as usage: use (production and by hand) and waste, net of their reversals. Transfers, counts and adjustments are not usage." }),
    months: z.array(
      z.object({
        month: z.string().meta({ description: "yyyy-mm in the company's time zone.", example: "2026-11" }),
        cure: perCategory("Cure used or wasted (used and wasted each rounded, then added: the cost of GET /api/reports/usage?groupBy=category for the month)."),
        casing: perCategory("Casings used or wasted (as cure)."),
        spice: perCategory("Spices used or wasted (as cure)."),
        ingredient: perCategory("Other ingredients used or wasted (as cure)."),
        total: perCategory("The four above added."),
      }),
    ).meta({ description: "The last six months, oldest first, this month (so far) last." }),
  })
  .meta({ id: "DashboardUsageTrend" });

export const dashboardResponse = z
  .object({
    today: isoDate("The company's date."),
    currency: z.string().meta({ description: "The company's currency (ISO 4217).", example: "GBP" }),
    costFormula: z.enum(["fifo", "average"]).meta({ description: "The company's cost formula (Settings > Company), which every money figure here follows: fifo, FIFO cost (cost layers in receipt order, per kitchen), or average, moving average cost (per kitchen). The same costing as the reports." }),
    kitchens: z.array(kitchen).meta({ description: "The open kitchens the panels cover: every one for most roles, their own for kitchen leads." }),
    cureExpiring: cureExpiringPanel,
    belowReorder: belowReorderPanel,
    shortages: shortagesPanel,
    stockValue: stockValuePanel,
    usageTrend: usageTrendPanel,
  })
  .meta({ id: "Dashboard" });
