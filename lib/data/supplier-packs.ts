// A supplier's pack in our item's stock unit: the one conversion suppliers need, shared by
// lib/data/suppliers.ts (saving a supplier item) and lib/data/items.ts (an item whose units change
// converts its supplier items' packs again, so pack_size_stock never goes stale). Imports nothing
// from either, so neither import forms a cycle. Server-only like the rest of lib/data.
import "server-only";
import type { Knex } from "knex";
import type { SupplierItemRow } from "../../db/types";
import { validation } from "../http/errors";
import { dec, isUnitError, plain, putUpLabel, toStockUnits, toStoredQuantity, type ItemUnits } from "../units";

/** "m", "pc (one hank)": the stock unit as people read it. */
export function stockUnitWords(units: ItemUnits): string {
  return units.putUp ? `pc (one ${putUpLabel(units.putUp)})` : units.stockUnit;
}

export type PackConversion = { ok: true; packSizeStock: string } | { ok: false; field: "packUnit" | "packQuantity"; message: string };

/**
 * `quantity` of `unit` in the item's stock unit: exact (lib/units), then rounded half-even to
 * NUMERIC(30,12) for storage. A unit that does not convert names both units.
 */
export function convertPack(quantity: string, unit: string, units: ItemUnits, itemSku: string): PackConversion {
  let exact;
  try {
    exact = toStockUnits(quantity, unit, units);
  } catch (e) {
    if (!isUnitError(e)) throw e;
    if (e.code === "INVALID_NUMBER") return { ok: false, field: "packQuantity", message: e.message };
    return {
      ok: false,
      field: "packUnit",
      message: `"${unit}" does not convert to ${stockUnitWords(units)}, the stock unit of ${itemSku}: ${e.message}`,
    };
  }
  let stored: string;
  try {
    stored = toStoredQuantity(exact);
  } catch (e) {
    if (!isUnitError(e)) throw e;
    return { ok: false, field: "packQuantity", message: "Too large to store." };
  }
  if (!dec(stored).gt(0)) return { ok: false, field: "packQuantity", message: `Too small: under 0.000000000001 ${units.stockUnit}.` };
  return { ok: true, packSizeStock: stored };
}

/**
 * After an item's units changed (stock unit, put-up length, density or its own packs): every
 * supplier item of it is converted again from its pack as entered. One that no longer converts
 * refuses the item's change (422 on `supplierItems`), naming the supplier item to change first.
 */
export async function reconvertSupplierPacks(trx: Knex.Transaction, companyId: string, itemId: string, units: ItemUnits, itemSku: string): Promise<void> {
  const rows: (Pick<SupplierItemRow, "id" | "sku" | "pack_label" | "pack_quantity" | "pack_unit" | "pack_size_stock"> & { supplier_name: string })[] = await trx("supplier_items as si")
    .join("suppliers as s", function () {
      this.on("s.company_id", "=", "si.company_id").andOn("s.id", "=", "si.supplier_id");
    })
    .where({ "si.company_id": companyId, "si.item_id": itemId })
    .select("si.id", "si.sku", "si.pack_label", "si.pack_quantity", "si.pack_unit", "si.pack_size_stock", "s.name as supplier_name");
  const problems: string[] = [];
  for (const r of rows) {
    const c = convertPack(plain(r.pack_quantity), r.pack_unit, units, itemSku);
    if (!c.ok) {
      problems.push(`${r.supplier_name} sells it as ${r.sku} "${r.pack_label}" (${plain(r.pack_quantity)} ${r.pack_unit}), which would no longer convert: ${c.message} Change that supplier item first.`);
      continue;
    }
    if (!dec(c.packSizeStock).eq(dec(r.pack_size_stock))) {
      await trx("supplier_items").where({ company_id: companyId, id: r.id }).update({ pack_size_stock: c.packSizeStock, updated_at: trx.fn.now() });
    }
  }
  if (problems.length) throw validation({ supplierItems: problems });
}
