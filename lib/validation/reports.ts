// The accountant's reports: queries and answers of GET /api/reports/usage and /api/reports/valuation
// (lib/data/reports.ts). Client-safe.
import { z } from "zod";
import { ITEM_CATEGORIES, STOCK_UNITS } from "../../db/types";

const MONTH = /^(\d{4})-(0[1-9]|1[0-2])$/;
const DAY = /^(\d{4})-(\d{2})-(\d{2})$/;

export const yearMonth = (field: string) =>
  z.string({ error: `${field}: a month as YYYY-MM, e.g. 2026-11.` }).regex(MONTH, `${field}: a month as YYYY-MM, e.g. 2026-11.`);

const isRealDay = (s: string) => {
  const m = DAY.exec(s);
  if (!m) return false;
  const d = new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])));
  return d.getUTCFullYear() === Number(m[1]) && d.getUTCMonth() === Number(m[2]) - 1 && d.getUTCDate() === Number(m[3]);
};

const flag = z.enum(["true", "false"], { error: "true or false." }).transform((v) => v === "true");
export const REPORT_FORMATS = ["json", "csv", "xlsx"] as const;
export const USAGE_GROUPS = ["item", "category", "kitchen"] as const;
export type UsageGroup = (typeof USAGE_GROUPS)[number];
/** The longest range one usage report covers. */
export const MAX_REPORT_MONTHS = 36;

/** The query's fields (the OpenAPI document shows these); usageQuery adds the range checks. */
export const usageQueryFields = z.object({
    from: yearMonth("from"),
    to: yearMonth("to"),
    groupBy: z.enum(USAGE_GROUPS, { error: "One of item, category or kitchen." }).default("item"),
    kitchen: z.string().trim().min(1, "Name the kitchen by its code or id.").max(100).optional(),
    format: z.enum(REPORT_FORMATS, { error: "json, csv or xlsx." }).default("json"),
    /** CSV only: start with a byte order mark, for spreadsheet programs that need one to read UTF-8 */
    bom: flag.default(false),
});
export const usageQuery = usageQueryFields.superRefine((q, ctx) => {
    if (q.from > q.to) ctx.addIssue({ code: "custom", path: ["to"], message: "to: the last month comes after from." });
    const months = (Number(q.to.slice(0, 4)) - Number(q.from.slice(0, 4))) * 12 + Number(q.to.slice(5)) - Number(q.from.slice(5)) + 1;
    if (months > MAX_REPORT_MONTHS) ctx.addIssue({ code: "custom", path: ["to"], message: `to: at most ${MAX_REPORT_MONTHS} months in one report.` });
  });
export type UsageQuery = z.infer<typeof usageQuery>;

export const valuationQuery = z.object({
  asOf: z.string({ error: "asOf: a day as YYYY-MM-DD." }).refine(isRealDay, "asOf: a day as YYYY-MM-DD, e.g. 2026-11-30."),
  kitchen: z.string().trim().min(1, "Name the kitchen by its code or id.").max(100).optional(),
  format: z.enum(REPORT_FORMATS, { error: "json, csv or xlsx." }).default("json"),
  bom: flag.default(false),
});
export type ValuationQuery = z.infer<typeof valuationQuery>;

/** The usage report's drill-down (the page /reports/usage/movements): one item's costed movements in one month. */
export const usageMovementsQuery = z.object({
  month: yearMonth("month"),
  item: z.string({ error: "item: the item's id or SKU." }).trim().min(1, "item: the item's id or SKU.").max(100),
  kitchen: z.string().trim().min(1, "Name the kitchen by its code or id.").max(100).optional(),
});
export type UsageMovementsQuery = z.infer<typeof usageMovementsQuery>;

const money = (description: string) => z.string().meta({ description: `${description} A decimal string with the currency's decimals.`, example: "41.70" });
const quantity = (description: string) => z.string().meta({ description: `${description} A decimal string in the item's stock unit.`, example: "2.5" });
const itemRef = z.object({ id: z.uuid(), sku: z.string(), name: z.string(), category: z.enum(ITEM_CATEGORIES) });
const kitchenRef = z.object({ id: z.uuid(), code: z.string(), name: z.string() });

export const usageRowResponse = z
  .object({
    month: z.string().meta({ description: "YYYY-MM, in the company's time zone.", example: "2026-11" }),
    item: itemRef.optional().meta({ description: "groupBy=item." }),
    unit: z.enum(STOCK_UNITS).optional().meta({ description: "groupBy=item: the stock unit of the quantities." }),
    category: z.enum(ITEM_CATEGORIES).optional().meta({ description: "groupBy=item or category." }),
    kitchen: kitchenRef.optional().meta({ description: "groupBy=kitchen." }),
    usedQuantity: quantity("groupBy=item: used (in production or by hand), net of reversals.").optional(),
    wastedQuantity: quantity("groupBy=item: wasted, net of reversals.").optional(),
    quantity: quantity("groupBy=item: used + wasted.").optional(),
    usedCost: money("Cost of what was used, by the company's cost formula."),
    wastedCost: money("Cost of what was wasted."),
    cost: money("usedCost + wastedCost."),
    countDifferenceQuantity: quantity("groupBy=item: stock counts and adjustments, gains positive, shown apart from usage.").optional(),
    countDifferenceCost: money("Value of count differences and adjustments (losses negative), shown apart from usage."),
  })
  .meta({ id: "UsageRow" });

export const usageResponse = z
  .object({
    from: z.string(),
    to: z.string(),
    groupBy: z.enum(USAGE_GROUPS),
    kitchen: kitchenRef.nullable(),
    currency: z.string(),
    costFormula: z.enum(["fifo", "average"]).meta({ description: "The company's cost formula (IAS 2): fifo or average." }),
    rows: z.array(usageRowResponse),
    totals: z.object({ usedCost: money("Sum of the rows."), wastedCost: money("Sum of the rows."), cost: money("Sum of the rows."), countDifferenceCost: money("Sum of the rows.") })
      .meta({ description: "Sums of the rows as shown (each row rounded to the currency first). Quantities are never totalled: units differ." }),
  })
  .meta({ id: "UsageReport" });

export const valuationRowResponse = z
  .object({
    kitchen: kitchenRef,
    item: itemRef,
    quantity: quantity("On hand at the end of the day."),
    unit: z.enum(STOCK_UNITS),
    value: money("By the company's cost formula."),
  })
  .meta({ id: "ValuationRow" });

export const valuationResponse = z
  .object({
    asOf: z.string().meta({ description: "YYYY-MM-DD: stock at the end of that day in the company's time zone." }),
    kitchen: kitchenRef.nullable(),
    currency: z.string(),
    costFormula: z.enum(["fifo", "average"]),
    rows: z.array(valuationRowResponse),
    totals: z.object({
      value: money("Sum of the rows."),
      byCategory: z.record(z.string(), z.string()).meta({ description: "Value per category, sums of the rows." }),
      byKitchen: z.record(z.string(), z.string()).meta({ description: "Value per kitchen code, sums of the rows." }),
    }),
  })
  .meta({ id: "ValuationReport" });
