// What an item costs from each supplier: every supplier item of the item (its alternatives) with
// its current pack price and that price per stock unit and per kg / per metre / per hank as the
// item's units allow (lib/purchasing/unit-prices.ts), cheapest first; and the price history of all
// of them, newest first, as JSON or CSV (text cells neutralised by lib/csv.ts: a description a
// price list sent as "=1+1" is exported as "'=1+1").
// Reads need purchasing.read; another company's item is 404.
import "server-only";
import { db } from "../../db/client";
import type { ItemCategory, ItemPackRow, ItemRow, StockUnit } from "../../db/types";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import { toCsv } from "../csv";
import { notFound } from "../http/errors";
import {
  changePercent, comparisonUnits, exactPerStockUnit, pricePerStockUnit, priceDirection, type ComparisonUnit, type PriceDirection, type UnitPrice,
} from "../purchasing/unit-prices";
import { Dec, stockUnitsPer, type ItemUnits } from "../units";
import { isUuid } from "../validation/items";
import { itemUnitsOf } from "./items";

/** History rows sent at most. */
export const MAX_PRICE_HISTORY = 500;

export interface CurrentPrice {
  packPrice: string;
  effectiveFrom: string;
  perStockUnit: string;
  perUnit: UnitPrice[];
}

export interface PriceOffer {
  supplier: { id: string; name: string; active: boolean };
  supplierItem: { id: string; sku: string; description: string; packLabel: string; packSizeStock: string; active: boolean };
  current: CurrentPrice | null;
  cheapest: boolean;
}

export interface PriceHistoryEntry {
  id: string;
  supplierId: string;
  supplierName: string;
  supplierItemId: string;
  sku: string;
  packLabel: string;
  packPrice: string;
  effectiveFrom: string;
  previousPrice: string | null;
  direction: PriceDirection;
  changePercent: string | null;
  perStockUnit: string;
  perUnit: UnitPrice[];
  source: "price_list" | "entered";
  priceListImportId: string | null;
  filename: string | null;
  listedDescription: string | null;
}

export interface ItemPrices {
  item: { id: string; sku: string; name: string; category: ItemCategory; stockUnit: StockUnit };
  currency: string;
  on: string;
  units: ComparisonUnit[];
  offers: PriceOffer[];
  history: PriceHistoryEntry[];
}

function perUnit(packPrice: string, packSizeStock: string, units: ItemUnits): UnitPrice[] {
  const perStock = exactPerStockUnit(packPrice, packSizeStock);
  return comparisonUnits(units).map((u) => ({ ...u, price: perStock.times(stockUnitsPer(u.unit, units)).toDecimalPlaces(4, Dec.ROUND_HALF_EVEN).toFixed(4) }));
}

export async function getItemPrices(actor: CurrentUser, idOrSku: string, opts: { on?: string } = {}): Promise<ItemPrices> {
  assertCan(actor, "purchasing.read");
  const knex = db();
  const ref = idOrSku.trim();
  const item: (ItemRow & { today: string }) | undefined = ref
    ? await knex("items as i")
      .join("companies as c", "c.id", "i.company_id")
      .where("i.company_id", actor.companyId)
      .where(isUuid(ref) ? { "i.id": ref } : { "i.sku": ref })
      .first("i.*", knex.raw("to_char((now() at time zone c.time_zone)::date, 'YYYY-MM-DD') as today"))
    : undefined;
  if (!item) throw notFound("Item");
  const on = opts.on ?? item.today;
  const packs: ItemPackRow[] = await knex("item_packs").where({ company_id: actor.companyId, item_id: item.id });
  const units = itemUnitsOf(item, packs);

  const offerRows: {
    supplier_id: string; supplier_name: string; supplier_active: boolean; id: string; sku: string; description: string; pack_label: string;
    pack_size_stock: string; active: boolean; pack_price: string | null; effective_from: string | null;
  }[] = await knex("supplier_items as si")
    .join("suppliers as s", function () {
      this.on("s.company_id", "=", "si.company_id").andOn("s.id", "=", "si.supplier_id");
    })
    .joinRaw(
      `left join lateral (select p.pack_price, p.effective_from from supplier_item_prices p
                          where p.company_id = si.company_id and p.supplier_item_id = si.id and p.effective_from <= ?::date
                          order by p.effective_from desc limit 1) as cur on true`,
      [on],
    )
    .where({ "si.company_id": actor.companyId, "si.item_id": item.id })
    .orderByRaw("lower(s.name), lower(si.sku)")
    .select(
      "s.id as supplier_id", "s.name as supplier_name", "s.active as supplier_active", "si.id", "si.sku", "si.description", "si.pack_label",
      knex.raw("trim_scale(si.pack_size_stock)::text as pack_size_stock"), "si.active",
      knex.raw("cur.pack_price::text as pack_price"), knex.raw("cur.effective_from::text as effective_from"),
    );

  const offers: PriceOffer[] = offerRows.map((r) => ({
    supplier: { id: r.supplier_id, name: r.supplier_name, active: r.supplier_active },
    supplierItem: { id: r.id, sku: r.sku, description: r.description, packLabel: r.pack_label, packSizeStock: r.pack_size_stock, active: r.active },
    current: r.pack_price === null
      ? null
      : { packPrice: r.pack_price, effectiveFrom: r.effective_from!, perStockUnit: pricePerStockUnit(r.pack_price, r.pack_size_stock), perUnit: perUnit(r.pack_price, r.pack_size_stock, units) },
    cheapest: false,
  }));
  // cheapest per stock unit first (exact comparison), those without a price last
  const exact = new Map(offers.map((o) => [o, o.current ? exactPerStockUnit(o.current.packPrice, o.supplierItem.packSizeStock) : null]));
  offers.sort((a, b) => {
    const x = exact.get(a);
    const y = exact.get(b);
    if (x && y) return x.cmp(y);
    return x ? -1 : y ? 1 : 0;
  });
  const buyable = offers.filter((o) => o.current && o.supplier.active && o.supplierItem.active);
  if (buyable.length) {
    const best = exact.get(buyable[0]!)!;
    for (const o of buyable) if (exact.get(o)!.eq(best)) o.cheapest = true;
  }

  const historyRows: {
    id: string; supplier_id: string; supplier_name: string; supplier_item_id: string; sku: string; pack_label: string; pack_size_stock: string;
    pack_price: string; effective_from: string; previous_price: string | null; price_list_import_id: string | null; filename: string | null;
    listed_description: string | null;
  }[] = await knex("supplier_item_prices as p")
    .join("supplier_items as si", function () {
      this.on("si.company_id", "=", "p.company_id").andOn("si.id", "=", "p.supplier_item_id");
    })
    .join("suppliers as s", function () {
      this.on("s.company_id", "=", "si.company_id").andOn("s.id", "=", "si.supplier_id");
    })
    .leftJoin("price_list_imports as pl", function () {
      this.on("pl.company_id", "=", "p.company_id").andOn("pl.id", "=", "p.price_list_import_id");
    })
    .leftJoin("uploads as u", function () {
      this.on("u.company_id", "=", "pl.company_id").andOn("u.id", "=", "pl.upload_id");
    })
    .where({ "p.company_id": actor.companyId, "si.item_id": item.id })
    .orderBy([{ column: "p.effective_from", order: "desc" }, { column: "s.name" }, { column: "si.sku" }])
    .limit(MAX_PRICE_HISTORY)
    .select(
      "p.id", "s.id as supplier_id", "s.name as supplier_name", "si.id as supplier_item_id", "si.sku", "si.pack_label",
      knex.raw("trim_scale(si.pack_size_stock)::text as pack_size_stock"), knex.raw("p.pack_price::text as pack_price"),
      knex.raw("p.effective_from::text as effective_from"),
      knex.raw(`(select q.pack_price::text from supplier_item_prices q where q.supplier_item_id = p.supplier_item_id and q.effective_from < p.effective_from
                  order by q.effective_from desc limit 1) as previous_price`),
      "p.price_list_import_id", "u.filename", "p.listed_description",
    );

  return {
    item: { id: item.id, sku: item.sku, name: item.name, category: item.category, stockUnit: item.stock_unit },
    currency: actor.currency,
    on,
    units: comparisonUnits(units),
    offers,
    history: historyRows.map((r) => ({
      id: r.id, supplierId: r.supplier_id, supplierName: r.supplier_name, supplierItemId: r.supplier_item_id, sku: r.sku, packLabel: r.pack_label,
      packPrice: r.pack_price, effectiveFrom: r.effective_from, previousPrice: r.previous_price,
      direction: priceDirection(r.previous_price, r.pack_price), changePercent: changePercent(r.previous_price, r.pack_price),
      perStockUnit: pricePerStockUnit(r.pack_price, r.pack_size_stock), perUnit: perUnit(r.pack_price, r.pack_size_stock, units),
      source: r.price_list_import_id ? "price_list" : "entered", priceListImportId: r.price_list_import_id, filename: r.filename,
      listedDescription: r.listed_description,
    })),
  };
}

/** The price history as CSV (RFC 4180; text that a spreadsheet would run is neutralised). */
export function itemPricesCsv(p: ItemPrices): string {
  const unitColumns = p.units.map((u) => `${p.currency} per ${u.label}`);
  return toCsv(
    ["Effective from", "Supplier", "Supplier SKU", "Pack", `Pack price (${p.currency})`, "Change %", `${p.currency} per ${p.item.stockUnit}`, ...unitColumns, "Source", "Description on the list"],
    p.history.map((h) => [
      h.effectiveFrom, h.supplierName, h.sku, h.packLabel, h.packPrice, h.changePercent ?? "", h.perStockUnit, ...h.perUnit.map((u) => u.price),
      h.source === "price_list" ? `price list ${h.filename ?? ""}`.trim() : "entered", h.listedDescription ?? "",
    ]),
  );
}
