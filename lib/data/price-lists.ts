// Supplier price lists from CSV. `receivePriceList` (the route) streams the upload to disk
// (lib/data/uploads.ts: permission first, 25 MB, type check, SHA-256), then `runPriceList` reads it:
//
//   1. the column mapping: the one sent, else the one remembered for this supplier (if the file
//      has its columns), else one proposed from the headers (no column matching at all: 422
//      naming the headers found);
//   2. in one transaction: the supplier's items loaded once (SKU -> supplier item), then the file
//      streamed through lib/import (papaparse, chunked) with every row checked here (unknown SKU,
//      SKU twice, price not above 0 or with more than 4 decimals, another currency, bad GTIN, a pack
//      that does not convert or differs from the one on record);
//   3. the good rows go to the database in batches of 10,000 while the file goes on being read:
//      one statement per batch compares each row with the price in effect on its date and, when
//      applying, writes the batch (PriceBatches);
//   4. a preview (dryRun) or a file with any row error rolls back: nothing is written but the
//      upload record. Applying writes the prices (one per supplier item and date: a later list for
//      the same date replaces the price), records the import and remembers the mapping, all in
//      the same transaction. The same file applied again for the same supplier posts nothing and
//      answers the earlier import.
//
// Text cells are data: kept as sent (the description goes to supplier_item_prices.listed_description),
// never evaluated; exports neutralise formula-like text (lib/csv.ts).
import "server-only";
import type { Knex } from "knex";
import type { PoolClient } from "pg";
import { db } from "../../db/client";
import type { ItemCategory, ItemPackRow, ItemRow, PriceListImportRow, StockUnit } from "../../db/types";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import { normalizeGtin } from "../gs1/gtin";
import { AppError, conflict, fieldErrors, notFound, validation } from "../http/errors";
import {
  importCsv, normalizeHeader, proposeDateFormat, proposeMapping, proposeNumberFormat, sniffCsv, type CsvProblem, type CsvSniff, type ImportRow, type RowIssue,
} from "../import";
import { PRICE_LIST_FIELDS, type PriceListField } from "../purchasing/price-list-fields";
import { changePercent, comparisonUnits, exactPerStockUnit, pricePerStockUnit, priceDirection, type PriceDirection } from "../purchasing/unit-prices";
import { dec, Dec, plain, stockUnitsPer, type ItemUnits } from "../units";
import { csvMapping, type CsvMapping } from "../validation/imports";
import { isUuid } from "../validation/items";
import { priceListUploadFields, priceListUploadQuery } from "../validation/price-lists";
import { itemUnitsOf } from "./items";
import { convertPack, type PackConversion } from "./supplier-packs";
import { receiveUpload, uploadFilePath, type Upload } from "./uploads";

/** Changes listed in an answer (the rest are counted). */
export const MAX_LISTED_CHANGES = 1000;
/** Reading stops after this many row errors. */
export const MAX_PRICE_LIST_ERRORS = 100;
const MAX_STORED_WARNINGS = 100;

export type PriceListProblem = CsvProblem;

export interface PriceListUnitChange {
  unit: string;
  label: string;
  before: string | null;
  after: string;
}

export interface PriceListChange {
  row: number;
  supplierItemId: string;
  sku: string;
  item: { id: string; sku: string; name: string; category: ItemCategory; stockUnit: StockUnit };
  listedDescription: string | null;
  packLabel: string;
  packSizeStock: string;
  effectiveFrom: string;
  oldPrice: string | null;
  oldEffectiveFrom: string | null;
  newPrice: string;
  direction: PriceDirection;
  changePercent: string | null;
  perStockUnit: { before: string | null; after: string };
  perUnit: PriceListUnitChange[];
}

export interface PriceListCounts {
  rows: number;
  priced: number;
  raised: number;
  lowered: number;
  unchanged: number;
  firstPrices: number;
  skipped: number;
  warnings: number;
}

export interface PriceListImport {
  id: string;
  supplierId: string;
  upload: { id: string; filename: string; sha256: string; size: number };
  effectiveFrom: string;
  mapping: CsvMapping;
  counts: PriceListCounts;
  warnings: PriceListProblem[];
  appliedBy: { id: string; name: string } | null;
  appliedAt: string;
}

export interface PriceListSummary {
  rows: number;
  priced: number;
  raised: number;
  lowered: number;
  unchanged: number;
  firstPrices: number;
  skipped: number;
  rejected: number;
  blankRows: number;
  errors: number;
  warnings: number;
  complete: boolean;
  moreChanges: number;
}

export interface PriceListFileFacts {
  encoding: CsvSniff["encoding"];
  bom: boolean;
  delimiter: CsvSniff["delimiter"];
  headerRow: number;
  headers: string[];
  columnNames: string[];
  sampleRows: string[][];
}

export interface PriceListResult {
  status: "preview" | "applied" | "already_applied";
  message: string;
  supplier: { id: string; name: string };
  upload: { id: string; filename: string; sha256: string; size: number; duplicate: boolean };
  file: PriceListFileFacts;
  mapping: CsvMapping;
  mappingSource: "sent" | "remembered" | "proposed";
  proposal: { numberFormatAmbiguous: boolean; dateFormatAmbiguous: boolean; missingRequired: string[] } | null;
  effectiveFrom: string;
  currency: string;
  appliedBefore: PriceListImport | null;
  import: PriceListImport | null;
  summary: PriceListSummary;
  errors: PriceListProblem[];
  warnings: PriceListProblem[];
  changes: PriceListChange[];
}

export interface PriceListOutcome {
  /** 200 preview or already applied, 201 applied */
  status: 200 | 201;
  body: PriceListResult;
}

// ---------------------------------------------------------------------------------------------
// Reading what is on record

interface SupplierFacts {
  id: string;
  name: string;
  today: string;
}

async function supplierFacts(trx: Knex | Knex.Transaction, companyId: string, supplierId: string): Promise<SupplierFacts> {
  const row = isUuid(supplierId)
    ? await trx("suppliers as s")
      .join("companies as c", "c.id", "s.company_id")
      .where({ "s.company_id": companyId, "s.id": supplierId })
      .first<{ id: string; name: string; today: string } | undefined>("s.id", "s.name", trx.raw("to_char((now() at time zone c.time_zone)::date, 'YYYY-MM-DD') as today"))
    : undefined;
  if (!row) throw notFound("Supplier");
  return row;
}

type ImportJoinRow = PriceListImportRow & { filename: string; sha256: string; size: string; applied_by_name: string | null };

function toImport(r: ImportJoinRow): PriceListImport {
  return {
    id: r.id,
    supplierId: r.supplier_id,
    upload: { id: r.upload_id, filename: r.filename, sha256: r.sha256, size: Number(r.size) },
    effectiveFrom: r.effective_from,
    mapping: csvMapping.parse(r.mapping),
    counts: {
      rows: r.rows, priced: r.priced, raised: r.raised, lowered: r.lowered, unchanged: r.unchanged,
      firstPrices: r.first_prices, skipped: r.skipped, warnings: r.warning_count,
    },
    warnings: r.warnings as PriceListProblem[],
    appliedBy: r.applied_by ? { id: r.applied_by, name: r.applied_by_name ?? "" } : null,
    appliedAt: r.applied_at.toISOString(),
  };
}

function importQuery(trx: Knex | Knex.Transaction, companyId: string) {
  return trx("price_list_imports as pl")
    .join("uploads as u", function () {
      this.on("u.company_id", "=", "pl.company_id").andOn("u.id", "=", "pl.upload_id");
    })
    .leftJoin("app_users as au", "au.id", "pl.applied_by")
    .where("pl.company_id", companyId)
    .select("pl.*", "u.filename", "u.sha256", "u.size", "au.name as applied_by_name");
}

async function appliedImport(trx: Knex | Knex.Transaction, companyId: string, supplierId: string, uploadId: string): Promise<PriceListImport | null> {
  const row: ImportJoinRow | undefined = await importQuery(trx, companyId).where({ "pl.supplier_id": supplierId, "pl.upload_id": uploadId }).first();
  return row ? toImport(row) : null;
}

/** The price lists applied for a supplier, newest first. */
export async function listPriceListImports(actor: CurrentUser, supplierId: string, opts: { limit?: number } = {}): Promise<PriceListImport[]> {
  assertCan(actor, "purchasing.read");
  await supplierFacts(db(), actor.companyId, supplierId);
  const rows: ImportJoinRow[] = await importQuery(db(), actor.companyId)
    .where("pl.supplier_id", supplierId)
    .orderBy([{ column: "pl.applied_at", order: "desc" }, { column: "pl.id", order: "desc" }])
    .limit(Math.min(opts.limit ?? 200, 500));
  return rows.map(toImport);
}

/** The mapping remembered for this supplier's price lists, if one was saved. */
export async function rememberedPriceListMapping(actor: CurrentUser, supplierId: string): Promise<CsvMapping | null> {
  assertCan(actor, "purchasing.read");
  return loadMapping(db(), actor.companyId, supplierId);
}

async function loadMapping(trx: Knex | Knex.Transaction, companyId: string, supplierId: string): Promise<CsvMapping | null> {
  if (!isUuid(supplierId)) return null;
  const row = await trx("supplier_import_mappings").where({ company_id: companyId, supplier_id: supplierId, kind: "price_list" }).first("mapping");
  if (!row) return null;
  const parsed = csvMapping.safeParse(row.mapping);
  return parsed.success ? parsed.data : null;
}

// ---------------------------------------------------------------------------------------------
// The supplier's items, loaded once per file

interface ItemFacts {
  id: string;
  sku: string;
  name: string;
  category: ItemCategory;
  stockUnit: StockUnit;
  row: Pick<ItemRow, "stock_unit" | "put_up" | "put_up_metres" | "density_g_per_ml">;
  units?: ItemUnits;
}

interface CatalogueEntry {
  id: string;
  sku: string;
  item: ItemFacts;
  packLabel: string;
  packUnit: string;
  /** NUMERIC(30,12) as PostgreSQL writes it ("1000.000000000000"): what toStoredQuantity gives */
  packSizeStored: string;
  gtin14: string | null;
  active: boolean;
}

interface Catalogue {
  byKey: Map<string, CatalogueEntry>;
  byId: Map<string, CatalogueEntry>;
  unitsOf(item: ItemFacts): ItemUnits;
}

/** The supplier's items by lower-cased SKU (as the unique index compares them) and by id; their stock items once each. */
async function loadCatalogue(trx: Knex.Transaction, companyId: string, supplierId: string, withPacks: boolean): Promise<Catalogue> {
  const ofSupplier = () => trx("supplier_items").where({ company_id: companyId, supplier_id: supplierId }).select("item_id");
  // one after the other: they share the transaction's connection
  const itemRows = await trx("items")
      .where({ company_id: companyId })
      .whereIn("id", ofSupplier())
      .select<(Pick<ItemRow, "id" | "sku" | "name" | "category" | "stock_unit" | "put_up" | "put_up_metres" | "density_g_per_ml">)[]>(
        "id", "sku", "name", "category", "stock_unit", "put_up", "put_up_metres", "density_g_per_ml",
      );
  const rows = await trx("supplier_items")
      .where({ company_id: companyId, supplier_id: supplierId })
      .select<{ id: string; sku: string; key: string; item_id: string; pack_label: string; pack_unit: string; pack_size_stored: string; gtin14: string | null; active: boolean }[]>(
        "id", "sku", trx.raw("lower(sku) as key"), "item_id", "pack_label", "pack_unit", trx.raw("pack_size_stock::text as pack_size_stored"), "gtin14", "active",
      );
  const packRows: ItemPackRow[] = withPacks ? await trx("item_packs").where({ company_id: companyId }).whereIn("item_id", ofSupplier()).select("*") : [];
  const items = new Map<string, ItemFacts>();
  for (const i of itemRows) {
    items.set(i.id, { id: i.id, sku: i.sku, name: i.name, category: i.category, stockUnit: i.stock_unit, row: i });
  }
  const packs = new Map<string, ItemPackRow[]>();
  for (const p of packRows) packs.set(p.item_id, [...(packs.get(p.item_id) ?? []), p]);
  const byKey = new Map<string, CatalogueEntry>();
  const byId = new Map<string, CatalogueEntry>();
  for (const r of rows) {
    const e: CatalogueEntry = {
      id: r.id, sku: r.sku, item: items.get(r.item_id)!, packLabel: r.pack_label, packUnit: r.pack_unit, packSizeStored: r.pack_size_stored,
      gtin14: r.gtin14, active: r.active,
    };
    byKey.set(r.key, e);
    byId.set(r.id, e);
  }
  return {
    byKey,
    byId,
    unitsOf(item) {
      return (item.units ??= itemUnitsOf(item.row, packs.get(item.id) ?? []));
    },
  };
}

// ---------------------------------------------------------------------------------------------
// The mapping

interface ChosenMapping {
  mapping: CsvMapping;
  source: PriceListResult["mappingSource"];
  proposal: PriceListResult["proposal"];
  sniff: CsvSniff;
}

const fileFacts = (s: CsvSniff): PriceListFileFacts => ({
  encoding: s.encoding, bom: s.bom, delimiter: s.delimiter, headerRow: s.headerRow, headers: s.headers, columnNames: s.columnNames, sampleRows: s.sampleRows,
});

/**
 * Whether a remembered mapping fits this file: every column it names by header is there (compared
 * as lib/import does: without case or extra spaces, else without punctuation) and every column it
 * names by number exists. A file of another layout gets a fresh proposal instead.
 */
function fits(mapping: CsvMapping, sniff: CsvSniff): boolean {
  const loose = (h: string) => h.trim().replace(/\s+/g, " ").toLowerCase();
  const names = new Set(sniff.headers.map(loose));
  const bare = new Set(sniff.headers.map(normalizeHeader).filter((h) => h !== ""));
  return Object.values(mapping.columns).every((r) =>
    "header" in r ? names.has(loose(r.header)) || bare.has(normalizeHeader(r.header)) : r.column <= sniff.columnNames.length);
}

function noMatchingColumns(sniff: CsvSniff, problem: string): AppError {
  return new AppError(422, "VALIDATION", problem, { fields: { file: [problem] }, file: fileFacts(sniff) });
}

async function chooseMapping(filePath: string, sent: CsvMapping | undefined, remembered: CsvMapping | null): Promise<ChosenMapping> {
  if (sent) return { mapping: sent, source: "sent", proposal: null, sniff: await sniffCsv(filePath, { headerRow: sent.headerRow, delimiter: sent.delimiter ?? null }) };
  if (remembered) {
    const sniff = await sniffCsv(filePath, { headerRow: remembered.headerRow, delimiter: remembered.delimiter ?? null });
    if (fits(remembered, sniff)) return { mapping: remembered, source: "remembered", proposal: null, sniff };
  }
  const sniff = await sniffCsv(filePath, { headerRow: 1 });
  const p = proposeMapping(sniff.headers, PRICE_LIST_FIELDS);
  if (p.problem) throw noMatchingColumns(sniff, p.problem);
  const valuesOf = (field: PriceListField) => {
    const m = p.matched.find((x) => x.field === field);
    return m ? sniff.sampleRows.map((r) => r[m.column - 1] ?? "") : [];
  };
  const numbers = proposeNumberFormat([...valuesOf("price"), ...valuesOf("packQuantity")], sniff.delimiter);
  const dates = valuesOf("effectiveFrom").length ? proposeDateFormat(valuesOf("effectiveFrom")) : { format: "yyyy-MM-dd" as const, ambiguous: false };
  const mapping = csvMapping.parse({
    headerRow: 1, columns: p.columns, delimiter: null, decimal: numbers.format.decimal, thousands: numbers.format.thousands, dateFormat: dates.format,
  });
  return {
    mapping, source: "proposed", sniff,
    proposal: { numberFormatAmbiguous: numbers.ambiguous, dateFormatAmbiguous: dates.ambiguous, missingRequired: p.missingRequired },
  };
}

// ---------------------------------------------------------------------------------------------
// Checking rows

const PRICE_INTEGER_DIGITS = 16;
const PRICE_DECIMALS = 4;

/** A price from the import engine ("-4.20", "0.00", "38.5"): why it cannot be a pack price, or null. */
function priceProblem(price: string): string | null {
  if (price.charCodeAt(0) === 45) return `the price is negative (${price}); a pack price must be more than 0`;
  const dot = price.indexOf(".");
  const whole = dot < 0 ? price : price.slice(0, dot);
  const fraction = dot < 0 ? "" : price.slice(dot + 1);
  if (!/[1-9]/.test(whole) && !/[1-9]/.test(fraction)) return "the price is 0; a pack price must be more than 0 (leave an item without a price out of the list)";
  if (fraction.length > PRICE_DECIMALS && /[1-9]/.test(fraction.slice(PRICE_DECIMALS))) return `the price ${price} has more than ${PRICE_DECIMALS} decimals; prices are kept to ${PRICE_DECIMALS}`;
  if (whole.replace(/^0+/, "").length > PRICE_INTEGER_DIGITS) return `the price ${price} is too large`;
  return null;
}

type RowSink = (row: number, supplierItemId: string, price: string, effectiveFrom: string, description: string | null) => void | Promise<void>;

interface RowChecker {
  onRow(row: ImportRow<PriceListField>, rowNumber: number): void | RowIssue<PriceListField>[] | Promise<RowIssue<PriceListField>[]>;
  priced: number;
  skipped: number;
}

/** Checks each row against the supplier's items and hands each good row to `sink`. */
function rowChecker(catalogue: Catalogue, opts: { currency: string; effectiveFrom: string; sink: RowSink }): RowChecker {
  const seen = new Map<string, number>();
  const packs = new Map<string, PackConversion>();
  const state = { priced: 0, skipped: 0 };
  const checker: RowChecker = {
    get priced() {
      return state.priced;
    },
    get skipped() {
      return state.skipped;
    },
    onRow(row, rowNumber) {
      const sku = row.sku!;
      const date = row.effectiveFrom ?? opts.effectiveFrom;
      const key = sku.toLowerCase();
      const once = `${key}\u0000${date}`;
      const first = seen.get(once);
      if (first !== undefined) {
        return [{ field: "sku", message: `the SKU "${sku}" is listed twice${row.effectiveFrom ? ` for ${date}` : ""}: it is first on row ${first}; keep one price per SKU` }];
      }
      seen.set(once, rowNumber);
      let issues: RowIssue<PriceListField>[] | undefined;
      const add = (issue: RowIssue<PriceListField>) => (issues ??= []).push(issue);

      const bad = priceProblem(row.price!);
      if (bad) add({ field: "price", message: bad });
      if (row.currency !== null && row.currency.trim().toUpperCase() !== opts.currency) {
        add({ field: "currency", message: `the price is in "${row.currency}", but your company trades in ${opts.currency}; send the list in ${opts.currency} or leave this row out` });
      }
      let gtin: string | null = null;
      if (row.gtin !== null) {
        gtin = normalizeGtin(row.gtin);
        if (!gtin) add({ field: "gtin", message: `'${row.gtin}' is not a valid GTIN (8, 12, 13 or 14 digits with a correct check digit)` });
      }
      const entry = catalogue.byKey.get(key);
      if (!entry) {
        if (issues) return issues;
        state.skipped++;
        return [{ field: "sku", warning: true, message: `unknown SKU "${sku}": no item of this supplier has it, so the row is skipped (add the item on the supplier's page to price it)` }];
      }
      if (gtin && entry.gtin14 && gtin !== entry.gtin14) {
        add({ field: "gtin", warning: true, message: `the GTIN ${gtin} differs from the one on record for ${entry.sku} (${entry.gtin14}); the price is taken by SKU` });
      }
      if (row.packQuantity !== null || row.packUnit !== null) {
        const quantity = row.packQuantity ?? "1";
        const unit = row.packUnit ?? entry.packUnit;
        // many rows share a pack ("1 kg" of one spice or another): convert each pack of each item once
        const packKey = `${entry.item.id}\u0000${quantity}\u0000${unit}`;
        let c = packs.get(packKey);
        if (!c) {
          c = convertPack(quantity, unit, catalogue.unitsOf(entry.item), entry.item.sku);
          packs.set(packKey, c);
        }
        if (!c.ok) {
          add({ field: c.field === "packUnit" && row.packUnit !== null ? "packUnit" : "packQuantity", message: c.field === "packUnit" ? `the pack unit ${c.message}` : `the pack size ${quantity} ${unit}: ${c.message}` });
        } else if (c.packSizeStock !== entry.packSizeStored) {
          // both are NUMERIC(30,12) with all 12 decimals: equal values are equal strings
          const unitWord = entry.item.stockUnit;
          add({
            field: row.packQuantity !== null ? "packQuantity" : "packUnit", warning: true,
            message: `the list's pack is ${plain(quantity)} ${unit} (${plain(c.packSizeStock)} ${unitWord}), but ${entry.sku} is on record as "${entry.packLabel}" (${plain(entry.packSizeStored)} ${unitWord}); the price is recorded per the pack on record, so change the supplier item first if the pack changed`,
          });
        }
      }
      if (!entry.active) add({ field: "sku", warning: true, message: `${entry.sku} is marked as not sold now; its price is recorded anyway` });
      if (issues?.some((i) => !i.warning)) return issues;

      state.priced++;
      const written = opts.sink(rowNumber, entry.id, row.price!, date, row.description);
      if (written) return written.then(() => issues ?? []);
      return issues;
    },
  };
  return checker;
}

// ---------------------------------------------------------------------------------------------
// Changes against what is on record

interface ChangeRow {
  row_number: number;
  supplier_item_id: string;
  pack_price: string;
  effective_from: string;
  listed_description: string | null;
  old_price: string | null;
  old_from: string | null;
}

/** Rows per batch: each is copied, compared and (when applying) written while the next is read. */
const BATCH_ROWS = 10_000;
/** Batches read ahead of the database before reading waits for it. */
const BATCHES_AHEAD = 2;
/** An import id no row carries: a preview compares against every price on record. */
const NO_IMPORT = "00000000-0000-0000-0000-000000000000";

/**
 * One statement per batch: each row of the batch against the price in effect on its date (the
 * latest on or before it, not counting prices this import wrote in an earlier batch, so applying
 * compares like the preview does); counts of up, down, unchanged and first prices; the changed
 * rows in file order (as many as are still to be listed). When applying, the same statement
 * writes the batch: a row for a supplier item and date that already has a price replaces it
 * (one price per item and date), the others are inserted.
 */
function batchStatement(apply: boolean): string {
  // $1-$5 the batch's columns, $6 the import to leave out, $7 how many changes to list; applying:
  // $8 the import, $9 the user, $10 the company
  const writes = apply
    ? `,
    replaced as (
      update supplier_item_prices sp
         set pack_price = c.pack_price, price_list_import_id = $8::uuid, created_by = $9::uuid, listed_description = c.listed_description, created_at = now()
        from c
       where c.old_from = c.effective_from and sp.supplier_item_id = c.supplier_item_id and sp.effective_from = c.effective_from
    ),
    added as (
      insert into supplier_item_prices (company_id, supplier_item_id, pack_price, effective_from, price_list_import_id, created_by, listed_description)
      select $10::uuid, supplier_item_id, pack_price, effective_from, $8::uuid, $9::uuid, listed_description from c
       where c.old_from is distinct from c.effective_from
    )`
    : "";
  return `
    with c as materialized (
      select b.row_number, b.supplier_item_id, b.pack_price, b.effective_from, b.listed_description, p.pack_price as old_price, p.effective_from as old_from
        from unnest($1::int[], $2::uuid[], $3::numeric(20,4)[], $4::date[], $5::text[]) as b(row_number, supplier_item_id, pack_price, effective_from, listed_description)
        left join lateral (
          select sp.pack_price, sp.effective_from from supplier_item_prices sp
           where sp.supplier_item_id = b.supplier_item_id and sp.effective_from <= b.effective_from
             and (sp.price_list_import_id is null or sp.price_list_import_id <> $6::uuid)
           order by sp.effective_from desc limit 1
        ) p on true
    )${writes},
    counts as (
      select count(*) filter (where pack_price > old_price) as raised,
             count(*) filter (where pack_price < old_price) as lowered,
             count(*) filter (where pack_price = old_price) as unchanged,
             count(*) filter (where old_price is null) as first_prices
        from c
    ),
    listed as (
      select row_number, supplier_item_id, trim_scale(pack_price)::text as pack_price, effective_from::text as effective_from, listed_description,
             trim_scale(old_price)::text as old_price, old_from::text as old_from
        from c where old_price is null or old_price <> pack_price
       order by row_number limit $7
    )
    select (select row_to_json(counts) from counts) as counts,
           (select coalesce(json_agg(listed order by row_number), '[]'::json) from listed) as changes`;
}

/**
 * The good rows on their way to the database, in batches of BATCH_ROWS, each one statement (its
 * columns as arrays, unnest-ed), while the file goes on being read: the database works on one
 * batch while the next is checked. One batch at a time on the transaction's own connection.
 * (COPY into a temporary table per batch, then the statement, measured the same in the benchmark:
 * the statement's writes and foreign-key checks are the cost, not getting the rows there.)
 */
class PriceBatches {
  readonly totals = { raised: 0, lowered: 0, unchanged: 0, firstPrices: 0 };
  readonly listed: ChangeRow[] = [];
  private batch = PriceBatches.empty();
  private tail: Promise<void> = Promise.resolve();
  private pending: Promise<void>[] = [];
  private failure: unknown = null;

  private static empty() {
    return { rows: [] as number[], ids: [] as string[], prices: [] as string[], dates: [] as string[], descriptions: [] as (string | null)[] };
  }

  constructor(
    private readonly trx: Knex.Transaction,
    private readonly target: { apply: boolean; importId: string | null; companyId: string; userId: string },
  ) {}

  /** A good row; answers a promise only when reading should wait for the database. */
  add: RowSink = (row, supplierItemId, price, effectiveFrom, description) => {
    if (this.failure) throw this.failure;
    const b = this.batch;
    b.rows.push(row);
    b.ids.push(supplierItemId);
    b.prices.push(price);
    b.dates.push(effectiveFrom);
    b.descriptions.push(description);
    if (b.rows.length < BATCH_ROWS) return;
    this.send();
    if (this.pending.length > BATCHES_AHEAD) return this.pending.shift()!.then(() => this.check());
  };

  async finish(): Promise<void> {
    if (this.batch.rows.length) this.send();
    await this.settle();
    this.check();
  }

  /** Waits for every batch sent (after a failure elsewhere, before the transaction is rolled back). */
  async settle(): Promise<void> {
    await Promise.allSettled(this.pending);
    this.pending = [];
  }

  private check(): void {
    if (this.failure) throw this.failure;
  }

  private send(): void {
    const batch = this.batch;
    this.batch = PriceBatches.empty();
    this.tail = this.tail.then(() => (this.failure ? undefined : this.write(batch))).catch((e: unknown) => {
      this.failure ??= e;
    });
    this.pending.push(this.tail);
  }

  private async write(b: ReturnType<typeof PriceBatches.empty>): Promise<void> {
    const { apply, importId, companyId, userId } = this.target;
    const room = MAX_LISTED_CHANGES - this.listed.length;
    const values: unknown[] = [b.rows, b.ids, b.prices, b.dates, b.descriptions, importId ?? NO_IMPORT, room];
    if (apply) values.push(importId, userId, companyId);
    // straight on the transaction's connection: knex would spread the arrays into lists
    const connection = await (this.trx.client as { acquireConnection(): Promise<PoolClient> }).acquireConnection();
    const r = await connection.query<{ counts: { raised: number; lowered: number; unchanged: number; first_prices: number }; changes: ChangeRow[] }>(
      { name: apply ? "price_list_apply_batch" : "price_list_preview_batch", text: batchStatement(apply), values },
    );
    const { counts, changes } = r.rows[0]!;
    this.totals.raised += Number(counts.raised);
    this.totals.lowered += Number(counts.lowered);
    this.totals.unchanged += Number(counts.unchanged);
    this.totals.firstPrices += Number(counts.first_prices);
    this.listed.push(...changes);
  }
}

const money4 = (v: string) => dec(v).toFixed(4);
const perUnit4 = (perStock: Dec, unit: string, units: ItemUnits) => perStock.times(stockUnitsPer(unit, units)).toDecimalPlaces(4, Dec.ROUND_HALF_EVEN).toFixed(4);

function toChange(r: ChangeRow, catalogue: Catalogue): PriceListChange {
  const e = catalogue.byId.get(r.supplier_item_id)!;
  const units = catalogue.unitsOf(e.item);
  const size = plain(e.packSizeStored);
  const after = exactPerStockUnit(r.pack_price, size);
  const before = r.old_price === null ? null : exactPerStockUnit(r.old_price, size);
  return {
    row: r.row_number,
    supplierItemId: e.id,
    sku: e.sku,
    item: { id: e.item.id, sku: e.item.sku, name: e.item.name, category: e.item.category, stockUnit: e.item.stockUnit },
    listedDescription: r.listed_description,
    packLabel: e.packLabel,
    packSizeStock: size,
    effectiveFrom: r.effective_from,
    oldPrice: r.old_price === null ? null : money4(r.old_price),
    oldEffectiveFrom: r.old_from,
    newPrice: money4(r.pack_price),
    direction: priceDirection(r.old_price, r.pack_price),
    changePercent: changePercent(r.old_price, r.pack_price),
    perStockUnit: { before: r.old_price === null ? null : pricePerStockUnit(r.old_price, size), after: pricePerStockUnit(r.pack_price, size) },
    perUnit: comparisonUnits(units).map((u) => ({ ...u, before: before ? perUnit4(before, u.unit, units) : null, after: perUnit4(after, u.unit, units) })),
  };
}

// ---------------------------------------------------------------------------------------------
// The import

export interface RunPriceListOptions {
  upload: Upload & { duplicate: boolean };
  /** where the upload's bytes are (uploadFilePath) */
  filePath: string;
  /** left out: remembered, else proposed */
  mapping?: CsvMapping;
  /** left out: the company's today */
  effectiveFrom?: string;
  dryRun: boolean;
}

/** Rolls the transaction back and hands the answer out of it. */
class Outcome {
  constructor(readonly value: PriceListOutcome | AppError) {}
}

const plural = (n: number, one: string, many = `${one}s`) => `${n.toLocaleString("en")} ${n === 1 ? one : many}`;

function describe(counts: Pick<PriceListSummary, "raised" | "lowered" | "unchanged" | "firstPrices" | "skipped">): string {
  const parts = [
    counts.raised ? `${counts.raised.toLocaleString("en")} up` : null,
    counts.lowered ? `${counts.lowered.toLocaleString("en")} down` : null,
    counts.unchanged ? `${counts.unchanged.toLocaleString("en")} unchanged` : null,
    counts.firstPrices ? plural(counts.firstPrices, "first price") : null,
    counts.skipped ? `${plural(counts.skipped, "unknown SKU")} skipped` : null,
  ].filter(Boolean);
  return parts.length ? parts.join(", ") : "no prices";
}

/**
 * Reads a stored price list for a supplier: the preview (dryRun) or the import, all or nothing.
 * Throws 422 (VALIDATION, with the whole result in details) when the file has row errors and
 * dryRun is false, or when no column of the file matches a price-list field.
 */
export async function runPriceList(actor: CurrentUser, supplierId: string, opts: RunPriceListOptions): Promise<PriceListOutcome> {
  assertCan(actor, "purchasing.manage");
  if (opts.upload.kind !== "price_list") throw new Error("runPriceList: not a price-list upload");
  const supplier = await supplierFacts(db(), actor.companyId, supplierId);
  const effectiveFrom = opts.effectiveFrom ?? supplier.today;
  const upload = { id: opts.upload.id, filename: opts.upload.filename, sha256: opts.upload.sha256, size: opts.upload.size, duplicate: opts.upload.duplicate };
  const appliedBefore = await appliedImport(db(), actor.companyId, supplierId, opts.upload.id);

  if (appliedBefore && !opts.dryRun) {
    const sniff = await sniffCsv(opts.filePath, { headerRow: appliedBefore.mapping.headerRow, delimiter: appliedBefore.mapping.delimiter ?? null });
    return { status: 200, body: alreadyApplied(actor, supplier, upload, appliedBefore, sniff) };
  }

  const remembered = opts.mapping ? null : await loadMapping(db(), actor.companyId, supplierId);
  const chosen = await chooseMapping(opts.filePath, opts.mapping, remembered);
  const mapping = chosen.mapping;
  const mapped = (field: PriceListField) => mapping.columns[field] !== undefined;

  const trx = await db().transaction();
  let settled = false;
  try {
    // a bulk of short statements: compiling them (JIT) costs more than it saves
    await trx.raw("set local jit = off");
    let importId: string | null = null;
    if (!opts.dryRun) {
      // one list at a time per supplier: nothing else writes this supplier's prices meanwhile
      await trx("suppliers").where({ company_id: actor.companyId, id: supplierId }).forNoKeyUpdate().first("id");
      // the import first (its counts follow at the end): the prices point at it, and the same file
      // applied at the same moment by someone else waits here and then finds it applied
      try {
        const [row] = await trx("price_list_imports")
          .insert({
            company_id: actor.companyId, supplier_id: supplierId, upload_id: opts.upload.id, mapping: JSON.stringify(mapping), effective_from: effectiveFrom,
            rows: 0, priced: 0, raised: 0, lowered: 0, unchanged: 0, first_prices: 0, skipped: 0, warning_count: 0, applied_by: actor.id,
          })
          .returning<{ id: string }[]>("id");
        importId = row!.id;
      } catch (e) {
        if ((e as { code?: string }).code !== "23505") throw e;
        await trx.rollback();
        settled = true;
        const earlier = (await appliedImport(db(), actor.companyId, supplierId, opts.upload.id))!;
        return { status: 200, body: alreadyApplied(actor, supplier, upload, earlier, chosen.sniff) };
      }
    }
    const catalogue = await loadCatalogue(trx, actor.companyId, supplierId, mapped("packQuantity") || mapped("packUnit"));
    const batches = new PriceBatches(trx, { apply: !opts.dryRun, importId, companyId: actor.companyId, userId: actor.id });
    const checker = rowChecker(catalogue, { currency: actor.currency, effectiveFrom, sink: batches.add });
    let read;
    try {
      read = await importCsv(opts.filePath, PRICE_LIST_FIELDS, mapping, { onRow: checker.onRow, maxErrors: MAX_PRICE_LIST_ERRORS, maxWarnings: MAX_STORED_WARNINGS });
      await batches.finish();
    } catch (e) {
      await batches.settle(); // nothing may still be running on the connection when it rolls back
      throw e;
    }

    const t = batches.totals;
    const summary: PriceListSummary = {
      rows: read.rows, priced: checker.priced, raised: t.raised, lowered: t.lowered, unchanged: t.unchanged, firstPrices: t.firstPrices,
      skipped: checker.skipped, rejected: read.rejected, blankRows: read.blankRows, errors: read.errors.length, warnings: read.warnings.length + read.moreWarnings,
      complete: read.complete, moreChanges: Math.max(0, t.raised + t.lowered + t.firstPrices - batches.listed.length),
    };
    const result: PriceListResult = {
      status: "preview", message: "", supplier: { id: supplier.id, name: supplier.name }, upload, file: fileFacts(chosen.sniff), mapping,
      mappingSource: chosen.source, proposal: chosen.proposal, effectiveFrom, currency: actor.currency, appliedBefore, import: null, summary,
      errors: read.errors, warnings: read.warnings, changes: batches.listed.map((r) => toChange(r, catalogue)),
    };

    const rowErrors = read.errors.length;
    if (opts.dryRun) {
      result.message = rowErrors
        ? `${plural(rowErrors, "row error")} to correct before these prices can be applied; nothing was written.`
        : `Ready to apply: ${describe(summary)}. Nothing is written until you apply.`;
      if (appliedBefore) result.message += ` This file was already applied for ${supplier.name} on ${appliedBefore.appliedAt.slice(0, 10)}; applying it again posts nothing.`;
      throw new Outcome({ status: 200, body: result });
    }
    if (rowErrors) {
      const message = `The price list has ${plural(rowErrors, "row error")}; nothing was written. Correct the file (or the column mapping) and send it again.`;
      throw new Outcome(new AppError(422, "VALIDATION", message, { fields: { file: read.errors.slice(0, 20).map((e) => e.message) }, ...result, message }));
    }
    if (checker.priced === 0) {
      const message = "No row of this list sets a price for one of this supplier's items; nothing was written.";
      throw new Outcome(new AppError(422, "VALIDATION", message, { fields: { file: [message] }, ...result, message }));
    }

    await trx("price_list_imports")
      .where({ company_id: actor.companyId, id: importId! })
      .update({
        rows: summary.rows, priced: summary.priced, raised: summary.raised, lowered: summary.lowered, unchanged: summary.unchanged,
        first_prices: summary.firstPrices, skipped: summary.skipped, warning_count: summary.warnings,
        warnings: JSON.stringify(read.warnings.slice(0, MAX_STORED_WARNINGS)),
      });
    await trx("supplier_import_mappings")
      .insert({ company_id: actor.companyId, supplier_id: supplierId, kind: "price_list", mapping: JSON.stringify(mapping), updated_by: actor.id })
      .onConflict(["company_id", "supplier_id", "kind"])
      .merge({ mapping: JSON.stringify(mapping), updated_by: actor.id, updated_at: trx.fn.now() });
    await trx.commit();
    settled = true;
    const applied = (await appliedImport(db(), actor.companyId, supplierId, opts.upload.id))!;
    result.status = "applied";
    result.import = applied;
    result.message = `Applied ${upload.filename} for ${supplier.name} from ${effectiveFrom}: ${describe(summary)}.`;
    return { status: 201, body: result };
  } catch (e) {
    if (!settled) await trx.rollback().catch(() => {});
    if (e instanceof Outcome) {
      if (e.value instanceof AppError) throw e.value;
      return e.value;
    }
    if ((e as { code?: string; constraint?: string }).code === "23505" && (e as { constraint?: string }).constraint?.startsWith("supplier_item_prices")) {
      throw conflict("A price for one of these items and dates was entered while the list was being applied; nothing was written. Apply the list again.", "PRICES_CHANGED");
    }
    throw e;
  }
}

function alreadyApplied(actor: CurrentUser, supplier: SupplierFacts, upload: PriceListResult["upload"], earlier: PriceListImport, sniff: CsvSniff): PriceListResult {
  const c = earlier.counts;
  const who = earlier.appliedBy ? ` by ${earlier.appliedBy.name}` : "";
  return {
    status: "already_applied",
    message: `Already applied: this file was applied for ${supplier.name} on ${earlier.appliedAt.slice(0, 10)}${who} (${describe(c)}). Nothing was posted again.`,
    supplier: { id: supplier.id, name: supplier.name }, upload, file: fileFacts(sniff), mapping: earlier.mapping, mappingSource: "remembered", proposal: null,
    effectiveFrom: earlier.effectiveFrom, currency: actor.currency, appliedBefore: earlier, import: earlier,
    summary: {
      rows: c.rows, priced: c.priced, raised: c.raised, lowered: c.lowered, unchanged: c.unchanged, firstPrices: c.firstPrices, skipped: c.skipped,
      rejected: 0, blankRows: 0, errors: 0, warnings: c.warnings, complete: true, moreChanges: 0,
    },
    errors: [], warnings: earlier.warnings, changes: [],
  };
}

/**
 * The route's whole job: permission and supplier first (403 / 404 before a byte is read), then the
 * streamed upload (413 over 25 MB, 422 for a file that is not CSV text), then runPriceList.
 */
export async function receivePriceList(actor: CurrentUser, supplierId: string, req: Request, query: Record<string, string>): Promise<PriceListOutcome> {
  assertCan(actor, "purchasing.manage");
  const q = priceListUploadQuery.safeParse(query);
  if (!q.success) {
    await req.body?.cancel().catch(() => {});
    throw validation(fieldErrors(q.error));
  }
  try {
    await supplierFacts(db(), actor.companyId, supplierId);
  } catch (e) {
    await req.body?.cancel().catch(() => {});
    throw e;
  }
  const received = await receiveUpload(actor, req, "price_list", { fields: priceListUploadFields });
  const { fields } = received;
  return runPriceList(actor, supplierId, {
    upload: { ...received.upload, duplicate: received.duplicate },
    filePath: uploadFilePath(actor.companyId, received.upload),
    mapping: fields.mapping,
    effectiveFrom: fields.effectiveFrom,
    dryRun: (fields.dryRun ?? q.data.dryRun) === "true",
  });
}
