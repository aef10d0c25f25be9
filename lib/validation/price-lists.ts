// Supplier price lists from CSV: the text fields sent beside the file (multipart), the query of an
// item's prices, and the answers' shapes (lib/data/price-lists.ts and item-prices.ts; a drift fails
// `tsc` in lib/http/openapi.ts). Client-safe: the upload form validates with these too.
import { z } from "zod";
import { ITEM_CATEGORIES, STOCK_UNITS } from "../../db/types";
import { CSV_DELIMITERS, csvMapping } from "./imports";

const DATE_MESSAGE = "Use a date as yyyy-mm-dd.";
export const isoDate = z
  .string({ error: DATE_MESSAGE })
  .trim()
  .regex(/^\d{4}-\d{2}-\d{2}$/, DATE_MESSAGE)
  .refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)) && new Date(`${s}T00:00:00Z`).toISOString().startsWith(s), { error: "No such date." });

/** A form field that is empty or missing counts as not sent. */
const blankAsMissing = (v: unknown) => (typeof v === "string" && v.trim() === "" ? undefined : v);

/** The column mapping as a JSON text field (multipart fields are text), read with the same schema as everywhere. */
const mappingField = z
  .string()
  .transform((s, ctx) => {
    try {
      return JSON.parse(s) as unknown;
    } catch {
      ctx.addIssue({ code: "custom", message: "Send the mapping as JSON, e.g. {\"columns\": {\"sku\": {\"header\": \"SKU\"}, \"price\": {\"header\": \"Price\"}}}." });
      return z.NEVER;
    }
  })
  .pipe(csvMapping);

export const dryRunFlag = z.enum(["true", "false"], { error: "Send true or false." });

/** POST /api/suppliers/{id}/price-lists: the text fields of the multipart body. */
export const priceListUploadFields = z.object({
  /** left out: the supplier's remembered mapping, else one proposed from the file's headers */
  mapping: z.preprocess(blankAsMissing, mappingField.optional()),
  /** left out: the company's today; a row's own date (an "effective from" column) wins */
  effectiveFrom: z.preprocess(blankAsMissing, isoDate.optional()),
  /** "true": the preview, nothing written but the upload */
  dryRun: z.preprocess(blankAsMissing, dryRunFlag.optional()),
});
export type PriceListUploadFields = z.infer<typeof priceListUploadFields>;

/** ?dryRun=true on the query string does the same as the form field. */
export const priceListUploadQuery = z.object({ dryRun: dryRunFlag.optional() });

/** GET /api/items/{id}/prices */
export const itemPricesQuery = z.object({
  /** the day "current" means; default the company's today */
  on: isoDate.optional(),
  format: z.enum(["json", "csv"], { error: "format is json or csv." }).optional(),
});

// ---------------------------------------------------------------------------------------------
// Answers

const id = z.uuid();
const timestamp = z.iso.datetime({ offset: true }).meta({ description: "ISO 8601 timestamp in UTC." });
const date = z.string().meta({ description: "A date, yyyy-mm-dd.", example: "2027-01-01" });
const decimal = (description: string, example?: string) => z.string().meta({ description: `${description} A decimal string.`, ...(example ? { example } : {}) });
const direction = z.enum(["up", "down", "same", "new"]).meta({ description: "up / down against the price in effect before; same: unchanged; new: the supplier item had no earlier price." });

const problem = z
  .object({
    row: z.number().int().meta({ description: "The spreadsheet row: the file's first line is row 1 (the header)." }),
    column: z.string().nullable().meta({ description: "The column as the file names it, \"column 3\" without a header; null for the whole row or file." }),
    field: z.string().optional().meta({ description: "The price-list field the cell was read for (sku, price, packUnit...)." }),
    message: z.string().meta({ example: "row 7, column 'Price': the price must be more than 0 (the file says -4.20)" }),
  })
  .meta({ id: "PriceListProblem" });

const unitPrice = z.object({
  unit: z.string().meta({ description: "A unit code or the item's put-up.", example: "kg" }),
  label: z.string().meta({ example: "kg" }),
  price: decimal("The price of one unit, 4 decimals (half-even).", "12.4000"),
});

const unitChange = z.object({
  unit: z.string().meta({ example: "kg" }),
  label: z.string().meta({ example: "kg" }),
  before: decimal("4 decimals; null without an earlier price.").nullable(),
  after: decimal("4 decimals.", "12.4000"),
});

const itemRef = z.object({ id, sku: z.string(), name: z.string(), category: z.enum(ITEM_CATEGORIES), stockUnit: z.enum(STOCK_UNITS) });

export const priceListChange = z
  .object({
    row: z.number().int(),
    supplierItemId: id,
    sku: z.string().meta({ description: "The supplier's SKU as on record." }),
    item: itemRef.meta({ description: "Our stock item." }),
    listedDescription: z.string().nullable().meta({ description: "The description cell as sent (text, never evaluated); null without one." }),
    packLabel: z.string(),
    packSizeStock: decimal("One pack in the item's stock unit."),
    effectiveFrom: date,
    oldPrice: decimal("The pack price in effect before (on the effective date); null: none.").nullable(),
    oldEffectiveFrom: date.nullable(),
    newPrice: decimal("The pack price from the list.", "38.5000"),
    direction,
    changePercent: decimal("(new - old) / old in percent, half-even to 1 decimal; null for a first price.", "4.1").nullable(),
    perStockUnit: z.object({ before: decimal("6 decimals.").nullable(), after: decimal("6 decimals.") }).meta({ description: "Per stock unit (g, m, ml or pc)." }),
    perUnit: z.array(unitChange).meta({ description: "Per kg and lb, l and gal, m and yd, or per put-up (hank) and m and yd, as the item's units allow." }),
  })
  .meta({ id: "PriceListChange" });

export const priceListImportResponse = z
  .object({
    id,
    supplierId: id,
    upload: z.object({ id, filename: z.string(), sha256: z.string(), size: z.number().int() }),
    effectiveFrom: date.meta({ description: "For rows without a date of their own." }),
    mapping: csvMapping.meta({ description: "The column mapping the file was read with." }),
    counts: z.object({
      rows: z.number().int(), priced: z.number().int(), raised: z.number().int(), lowered: z.number().int(),
      unchanged: z.number().int(), firstPrices: z.number().int(), skipped: z.number().int(), warnings: z.number().int(),
    }),
    warnings: z.array(problem).meta({ description: "The first 100 warnings." }),
    appliedBy: z.object({ id, name: z.string() }).nullable(),
    appliedAt: timestamp,
  })
  .meta({ id: "PriceListImport" });

export const priceListImportListResponse = z.object({ imports: z.array(priceListImportResponse) }).meta({ id: "PriceListImportList" });

export const priceListResultResponse = z
  .object({
    status: z.enum(["preview", "applied", "already_applied"]).meta({ description: "preview (dryRun=true: nothing written but the upload), applied, or already_applied (this file was applied for this supplier before: nothing posted again)." }),
    message: z.string(),
    supplier: z.object({ id, name: z.string() }),
    upload: z.object({ id, filename: z.string(), sha256: z.string(), size: z.number().int(), duplicate: z.boolean().meta({ description: "The same bytes were uploaded before (the earlier upload is used)." }) }),
    file: z.object({
      encoding: z.enum(["utf-8", "windows-1252", "utf-16le", "utf-16be"]),
      bom: z.boolean(),
      delimiter: z.enum(CSV_DELIMITERS),
      headerRow: z.number().int(),
      headers: z.array(z.string()),
      columnNames: z.array(z.string()).meta({ description: "How the mapping form names each column (the header, or \"Column 3\")." }),
      sampleRows: z.array(z.array(z.string())).meta({ description: "The first 10 rows below the header, cells as text." }),
    }),
    mapping: csvMapping,
    mappingSource: z.enum(["sent", "remembered", "proposed"]),
    proposal: z
      .object({ numberFormatAmbiguous: z.boolean(), dateFormatAmbiguous: z.boolean(), missingRequired: z.array(z.string()) })
      .nullable()
      .meta({ description: "With mappingSource proposed: what to check before applying." }),
    effectiveFrom: date,
    currency: z.string().meta({ example: "EUR" }),
    appliedBefore: priceListImportResponse.nullable().meta({ description: "This file applied for this supplier earlier, if it was." }),
    import: priceListImportResponse.nullable().meta({ description: "status applied or already_applied: the import." }),
    summary: z.object({
      rows: z.number().int().meta({ description: "Data rows read (not the header or blank rows)." }),
      priced: z.number().int().meta({ description: "Rows that set a price." }),
      raised: z.number().int(), lowered: z.number().int(), unchanged: z.number().int(),
      firstPrices: z.number().int().meta({ description: "Supplier items that had no earlier price." }),
      skipped: z.number().int().meta({ description: "Rows with an unknown SKU (a warning each)." }),
      rejected: z.number().int().meta({ description: "Rows with an error." }),
      blankRows: z.number().int(),
      errors: z.number().int(),
      warnings: z.number().int(),
      complete: z.boolean().meta({ description: "false: reading stopped early (100 errors, broken quoting, a mapped column missing)." }),
      moreChanges: z.number().int().meta({ description: "Changes past the 1,000 listed." }),
    }),
    errors: z.array(problem),
    warnings: z.array(problem).meta({ description: "At most 100; summary.warnings counts them all." }),
    changes: z.array(priceListChange).meta({ description: "Raised, lowered and first prices in file order, at most 1,000; unchanged prices are only counted." }),
  })
  .meta({ id: "PriceListResult" });

const currentPrice = z.object({
  packPrice: decimal("Per pack, 4 decimals.", "38.0000"),
  effectiveFrom: date,
  perStockUnit: decimal("Per stock unit, 6 decimals."),
  perUnit: z.array(unitPrice),
});

export const itemPricesResponse = z
  .object({
    item: itemRef,
    currency: z.string(),
    on: date.meta({ description: "The day \"current\" is for." }),
    units: z.array(z.object({ unit: z.string(), label: z.string() })).meta({ description: "The units prices are compared in." }),
    offers: z
      .array(
        z.object({
          supplier: z.object({ id, name: z.string(), active: z.boolean() }),
          supplierItem: z.object({ id, sku: z.string(), description: z.string(), packLabel: z.string(), packSizeStock: decimal("One pack in the item's stock unit."), active: z.boolean() }),
          current: currentPrice.nullable().meta({ description: "The latest price on or before `on`; null: none known." }),
          cheapest: z.boolean().meta({ description: "The lowest price per stock unit among the active offers." }),
        }),
      )
      .meta({ description: "Every supplier item of this item, cheapest per stock unit first, those without a price last." }),
    history: z
      .array(
        z.object({
          id,
          supplierId: id,
          supplierName: z.string(),
          supplierItemId: id,
          sku: z.string(),
          packLabel: z.string(),
          packPrice: decimal("Per pack, 4 decimals."),
          effectiveFrom: date,
          previousPrice: decimal("The supplier item's price before this one; null for its first.").nullable(),
          direction,
          changePercent: decimal("Half-even to 1 decimal.").nullable(),
          perStockUnit: decimal("6 decimals, with the supplier item's pack as it is now."),
          perUnit: z.array(unitPrice),
          source: z.enum(["price_list", "entered"]),
          priceListImportId: id.nullable(),
          filename: z.string().nullable().meta({ description: "The price list's file name." }),
          listedDescription: z.string().nullable().meta({ description: "The description as the list wrote it (text, never evaluated)." }),
        }),
      )
      .meta({ description: "Every price of every supplier item of this item, newest first (at most 500)." }),
  })
  .meta({ id: "ItemPrices" });
