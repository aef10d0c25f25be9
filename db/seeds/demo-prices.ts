// Current prices for the demo company's supplier items (Quillmoor Provisions), so the reorder page
// can compare suppliers and price its lines before anyone imports a price list. Each supplier item
// in its order pack costs what the invented price list says (orderCost in demo-stock-catalogue.ts);
// the two alternatives have invented prices of their own, each cheaper per stock unit than the
// usual supplier's, so the reorder page preselects them: Haverby's bundle of 5 hog hanks 32/35 at
// 118.00 (23.60 a hank against Fenwick & Rudd's 24.50) and Marlowe's 25 kg dextrose sack at 33.50
// (1.34 a kg against Haverby's 7.60 for 5 kg, 1.52 a kg). Prices take effect 30 days before the
// load. Plain knex (no lib/data: nothing to check). Loaded by load-demo.ts when the demo company
// has supplier items and no price at all; a later price-list import replaces them as it does any
// price (one per supplier item and day).
import type { Knex } from "knex";
import { DEMO_ITEMS } from "./demo-stock-catalogue";
import { demoSupplierItems } from "./demo-suppliers";

/** The alternatives' prices, per pack, by the supplier's SKU. */
const ALTERNATIVE_PRICES: Record<string, string> = { "HV-HOG3235-B5": "118.00", "MST-DEX25": "33.50" };

/** Pack price by the supplier's SKU, for every demo supplier item. */
export function demoPackPrices(): Map<string, string> {
  const cost = new Map(DEMO_ITEMS.map((d) => [d.draft.sku, d.orderCost]));
  return new Map(demoSupplierItems().map((si) => [si.sku, ALTERNATIVE_PRICES[si.sku] ?? cost.get(si.item)!]));
}

/** Writes the prices; the caller checks that the company has none yet. Returns how many. */
export async function loadDemoPrices(knex: Knex | Knex.Transaction, companyId: string, today: string): Promise<number> {
  const prices = demoPackPrices();
  const items: { id: string; sku: string }[] = await knex("supplier_items").where({ company_id: companyId }).select("id", "sku");
  const rows = items
    .filter((si) => prices.has(si.sku))
    .map((si) => ({
      company_id: companyId, supplier_item_id: si.id, pack_price: prices.get(si.sku)!,
      effective_from: knex.raw("?::date - 30", [today]),
    }));
  if (rows.length) await knex("supplier_item_prices").insert(rows);
  return rows.length;
}
