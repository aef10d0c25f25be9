// Items, receipts and balance checks for ledger tests. Items are written straight to the table so
// ledger tests do not depend on the catalogue endpoints.
import { db } from "../../db/client";
import type { ItemCategory, StockUnit } from "../../db/types";
import { tag } from "./factory";

export interface TestItem {
  id: string;
  sku: string;
}

export async function createItem(
  companyId: string,
  opts: { category?: ItemCategory; unit?: StockUnit; trackLots?: boolean; trackDates?: boolean; putUpMetres?: string; sku?: string } = {},
): Promise<TestItem> {
  const category = opts.category ?? "spice";
  const sku = opts.sku ?? `SKU-${tag()}`.toUpperCase();
  const cure = category === "cure";
  const casing = category === "casing";
  const [row] = await db()("items")
    .insert({
      company_id: companyId, sku, name: `Test ${category} ${sku}`, category,
      stock_unit: cure ? "g" : (opts.unit ?? (casing ? "pc" : "g")),
      track_lots: cure || (opts.trackLots ?? false), track_dates: cure || (opts.trackDates ?? false),
      ...(cure ? { nitrite_fraction: "0.0625", nitrate_fraction: "0" } : {}),
      ...(casing ? { casing_kind: "natural_hog", calibre_min_mm: "32", calibre_max_mm: "35", put_up: "hank", put_up_metres: opts.putUpMetres ?? "91.44", capacity_kg_per_put_up: "45", storage: "salted" } : {}),
    })
    .returning<{ id: string }[]>("id");
  return { id: row!.id, sku };
}

/** Every (kitchen, lot) balance equals the sum of its movements, and none is negative. */
export async function ledgerMismatches(companyId: string): Promise<unknown[]> {
  const r = await db().raw(
    `select coalesce(b.kitchen_id, m.kitchen_id) as kitchen_id, coalesce(b.lot_id, m.lot_id) as lot_id, b.on_hand, m.total
       from (select * from stock_balances where company_id = :c) b
       full join (select kitchen_id, lot_id, sum(delta) as total from stock_movements where company_id = :c group by 1, 2) m
         on m.kitchen_id = b.kitchen_id and m.lot_id = b.lot_id
      where coalesce(b.on_hand, 0) <> coalesce(m.total, 0) or b.on_hand < 0`,
    { c: companyId },
  );
  return r.rows;
}

export async function onHand(kitchenId: string, lotId: string): Promise<string | undefined> {
  const b = await db()("stock_balances").where({ kitchen_id: kitchenId, lot_id: lotId }).first("on_hand");
  return b?.on_hand;
}
