// The price variance report (GET /api/reports/price-variance, lib/data/price-variance.ts): the
// query and the answer's shapes (a drift fails `tsc` in lib/http/openapi.ts). Client-safe.
import { z } from "zod";
import { ITEM_CATEGORIES, STOCK_UNITS } from "../../db/types";
import { uuid } from "./common";

/** The longest range one report covers, in calendar months (from and to included). */
export const MAX_PRICE_VARIANCE_MONTHS = 24;

const MONTH_MESSAGE = "Use a month as yyyy-mm, e.g. 2027-01.";
const MONTH = /^\d{4}-(0[1-9]|1[0-2])$/;
export const month = z.string({ error: MONTH_MESSAGE }).trim().regex(MONTH, MONTH_MESSAGE);

/** Months from `from` to `to`, both counted (2027-01..2027-01 is 1). */
export function monthsInRange(from: string, to: string): number {
  const n = (m: string) => Number(m.slice(0, 4)) * 12 + Number(m.slice(5, 7)) - 1;
  return n(to) - n(from) + 1;
}

/** The query's fields without the range check (lib/http/openapi.ts documents these). */
export const priceVarianceQueryFields = z.object({
  from: month,
  to: month,
  supplier: uuid.optional(),
  format: z.enum(["json", "csv"], { error: "format is json or csv." }).optional(),
});

/** GET /api/reports/price-variance */
export const priceVarianceQuery = priceVarianceQueryFields
  .superRefine((q, ctx) => {
    // zod runs this after a bad month too: only two good months have a range
    if (typeof q.from !== "string" || typeof q.to !== "string" || !MONTH.test(q.from) || !MONTH.test(q.to)) return;
    const months = monthsInRange(q.from, q.to);
    if (months < 1) ctx.addIssue({ code: "custom", path: ["to"], message: `to (${q.to}) is before from (${q.from}): give the later month as to.` });
    else if (months > MAX_PRICE_VARIANCE_MONTHS) {
      ctx.addIssue({ code: "custom", path: ["to"], message: `${q.from} to ${q.to} is ${months} months; one report covers at most ${MAX_PRICE_VARIANCE_MONTHS}.` });
    }
  });
export type PriceVarianceQuery = z.infer<typeof priceVarianceQuery>;

// ---------------------------------------------------------------------------------------------
// Answers

const decimal = (description: string, example?: string) => z.string().meta({ description: `${description} A decimal string.`, ...(example ? { example } : {}) });
const perStock = (description: string, example: string) => decimal(`${description} Per stock unit, half-even to 6 decimals (shown; the differences use the exact figure).`, example);
const perBuying = (description: string, example: string) => decimal(`${description} Per buyingUnit, half-even to 4 decimals (shown only).`, example);
const money = (description: string, example: string) =>
  decimal(`${description} In the company's currency, worked out exactly and rounded once, half-even, to its decimals.`, example);

export const priceVarianceRow = z
  .object({
    deliveryId: uuid,
    noteNumber: z.string(),
    deliveredOn: z.string().meta({ description: "The day the delivery was booked into stock, in the company's time zone, yyyy-mm-dd.", example: "2027-01-14" }),
    month: z.string().meta({ description: "The month of deliveredOn, yyyy-mm.", example: "2027-01" }),
    lineNo: z.number().int().meta({ description: "The line on the delivery note, from 1." }),
    supplierId: uuid,
    supplierName: z.string(),
    kitchenCode: z.string().meta({ description: "The kitchen the delivery was booked into." }),
    itemId: uuid,
    itemSku: z.string(),
    itemName: z.string(),
    category: z.enum(ITEM_CATEGORIES),
    stockUnit: z.enum(STOCK_UNITS),
    supplierSku: z.string(),
    packLabel: z.string(),
    packs: decimal("Packs delivered (as corrected by the buyer).", "10"),
    deliveredPackPrice: decimal("The price of one pack as booked: the note's (or the buyer's correction), else the order line's.", "12.6"),
    quantity: decimal("Delivered, in the item's stock unit.", "50000"),
    orderNumber: z.string().nullable().meta({ description: "The purchase order the line was matched to; null: not on any order." }),
    substitute: z.boolean().meta({ description: "true: matched to an order line of another pack of the same stock item (a different_item finding); the comparison is per stock unit all the same." }),
    orderedUnitPrice: perStock("The order line's pack price over its pack size; null without an order line.", "0.002400").nullable(),
    deliveredUnitPrice: perStock("deliveredPackPrice over the supplier item's pack size.", "0.002520"),
    listUnitPrice: perStock("The supplier item's price-list price effective on deliveredOn (the latest from on or before it); null: no list price then.", "0.002500").nullable(),
    listEffectiveFrom: z.string().nullable().meta({ description: "From when that list price held, yyyy-mm-dd; null without one." }),
    buyingUnit: z.string().meta({ description: "The unit a buyer thinks in for this item (kg or lb, l or gal, m or yd, the put-up such as hank, piece) by your unit system.", example: "kg" }),
    orderedPerBuyingUnit: perBuying("The ordered price.", "2.4000").nullable(),
    deliveredPerBuyingUnit: perBuying("The delivered price.", "2.5200"),
    listPerBuyingUnit: perBuying("The list price.", "2.5000").nullable(),
    deliveredValue: money("deliveredUnitPrice x quantity (before freight).", "126.00"),
    orderVariance: money("(deliveredUnitPrice - orderedUnitPrice) x quantity: more than ordered is positive. null without an order line, never 0.", "6.00").nullable(),
    listVariance: money("(deliveredUnitPrice - listUnitPrice) x quantity: more than the price list is positive. null without a list price, never 0.", "1.00").nullable(),
  })
  .meta({ id: "PriceVarianceRow" });

const sums = {
  lines: z.number().int().meta({ description: "Delivered lines counted." }),
  deliveredValue: money("The sum of the lines' exact delivered values.", "1250.40"),
  orderVariance: money("The sum of the exact order differences of the lines that have an order line; null when none has.", "6.00").nullable(),
  orderCompared: z.number().int().meta({ description: "Lines in orderVariance." }),
  withoutOrder: z.number().int().meta({ description: "Lines with no order line: left out of orderVariance." }),
  listVariance: money("The sum of the exact list differences of the lines that have a list price; null when none has.", "1.00").nullable(),
  listCompared: z.number().int().meta({ description: "Lines in listVariance." }),
  withoutListPrice: z.number().int().meta({ description: "Lines with no list price on their day: left out of listVariance." }),
};

export const priceVarianceGroup = z
  .object({ supplierId: uuid, supplierName: z.string(), month: z.string().meta({ example: "2027-01" }), ...sums })
  .meta({ id: "PriceVarianceGroup", description: "One supplier in one month. Totals add the exact line figures and round once, so they can differ by a cent from the sum of the rounded lines." });

export const priceVarianceTotals = z.object(sums).meta({ id: "PriceVarianceTotals" });

export const priceVarianceResponse = z
  .object({
    from: z.string().meta({ example: "2027-01" }),
    to: z.string().meta({ example: "2027-03" }),
    supplier: z.object({ id: uuid, name: z.string() }).nullable().meta({ description: "The one supplier asked for; null: every supplier." }),
    currency: z.string().meta({ example: "EUR" }),
    timeZone: z.string().meta({ description: "The company's time zone: months and days are its calendar.", example: "Europe/Vienna" }),
    rounding: z.literal("half-even").meta({ description: "How money is rounded to the currency's decimals (as order lines are)." }),
    rows: z.array(priceVarianceRow).meta({ description: "Every accepted line of the posted deliveries booked in the months, by supplier, month, day, note and line." }),
    groups: z.array(priceVarianceGroup).meta({ description: "Per supplier and month, by supplier name then month." }),
    totals: priceVarianceTotals,
    cureCaution: z.string().nullable().meta({ description: "The cure caution when a row is a cure; null otherwise." }),
  })
  .meta({ id: "PriceVarianceReport" });

export type PriceVarianceRow = z.infer<typeof priceVarianceRow>;
export type PriceVarianceGroup = z.infer<typeof priceVarianceGroup>;
export type PriceVarianceTotals = z.infer<typeof priceVarianceTotals>;
export type PriceVarianceReportShape = z.infer<typeof priceVarianceResponse>;
