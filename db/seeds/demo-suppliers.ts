// The demo company's suppliers (Quillmoor Provisions): the three invented suppliers its demo stock
// is delivered by (SUPPLIERS in demo-stock-catalogue.ts), with contacts, lead times and minimum
// orders, and a supplier item for every demo item in the pack the buyer orders, plus two
// alternatives from a second supplier. Names, e-mails (.test), phone numbers (the 01632 960 range
// kept for drama), SKUs and GTINs are invented; the GTINs use GS1 prefix 952, which GS1 keeps for
// demonstrations and examples, with their check digits worked out by lib/gs1. Written through
// lib/data as the demo buyer (the same checks and pack conversion as a person's), then the demo
// lots received from each supplier are linked to it by name. Loaded by load-demo.ts when the demo
// company has items but no supplier yet.
import type { Knex } from "knex";
import { gtinCheckDigit } from "../../lib/gs1/gtin";
import { createSupplier, createSupplierItem } from "../../lib/data/suppliers";
import { loadCurrentUser } from "../../lib/data/users";
import { supplierCreateInput, supplierItemCreateInput } from "../../lib/validation/suppliers";
import { DEMO_ITEMS, SUPPLIERS, type SupplierKey } from "./demo-stock-catalogue";

export const DEMO_SUPPLIERS: Record<SupplierKey, {
  contactName: string;
  orderEmail: string;
  phone: string;
  leadTimeDays: number;
  minOrderValue: string | null;
  notes: string;
  /** the supplier's SKUs: this prefix and our SKU without dashes */
  skuPrefix: string;
}> = {
  curing: {
    contactName: "Ottilie Brack", orderEmail: "orders@haverby-curing.test", phone: "01632 960 114", leadTimeDays: 3, minOrderValue: "75.00",
    notes: "Orders by 11:00 go out the same day. Cure comes with the lot's certificate of analysis.", skuPrefix: "HV",
  },
  casings: {
    contactName: "Bram Rudd", orderEmail: "trade@fenwickrudd.test", phone: "01632 960 237", leadTimeDays: 5, minOrderValue: "150.00",
    notes: "Natural casings packed salted; hanks counted at 100 yd. Tuesday round.", skuPrefix: "FR",
  },
  spices: {
    contactName: "Sefa Marlowe", orderEmail: "buying@marlowespice.test", phone: "01632 960 482", leadTimeDays: 7, minOrderValue: null,
    notes: "No minimum order; carriage charged under £60.", skuPrefix: "MST",
  },
};

/** Demo items sold with a GTIN (a GTIN-13 under the demonstration prefix 952): SKU -> item reference. */
const GTIN_ITEMS: Record<string, string> = {
  "CURE-1": "0001", "CURE-2": "0002", "CURE-EU06": "0003", DEXTROSE: "0004", ASCORBATE: "0005", "CULTURE-SM4": "0006", "SMOKE-LIQ": "0007",
  "PEP-BLK-GR": "0101", "PEP-WHT": "0102", "PAPRIKA-SM": "0103", NUTMEG: "0104", "SALT-FINE": "0105",
};

/** A GTIN-13 with prefix 952 (GS1: demonstrations and examples), check digit by lib/gs1. */
export function demoGtin(supplierNo: number, itemRef: string): string {
  const body = `952${String(supplierNo).padStart(5, "0")}${itemRef}`;
  return `${body}${gtinCheckDigit(body)}`;
}

const SUPPLIER_NO: Record<SupplierKey, number> = { curing: 1, casings: 2, spices: 3 };

export interface DemoSupplierItem {
  supplier: SupplierKey;
  sku: string;
  item: string;
  description: string;
  packLabel: string;
  packQuantity: string;
  packUnit: string;
  gtin?: string;
}

/** Every demo item at its own supplier, in the pack the buyer orders it in; then the alternatives. */
export function demoSupplierItems(): DemoSupplierItem[] {
  const out: DemoSupplierItem[] = DEMO_ITEMS.map((d) => {
    const s = DEMO_SUPPLIERS[d.supplier];
    const hank = d.orderUnit === "hank";
    return {
      supplier: d.supplier,
      sku: `${s.skuPrefix}-${d.draft.sku.replace(/-/g, "")}`,
      item: d.draft.sku,
      description: d.draft.name,
      // hanks are sold singly here; every other order unit is one of the item's own packs
      packLabel: hank ? "hank of 100 yd" : d.orderUnit,
      packQuantity: "1",
      packUnit: d.orderUnit,
      ...(GTIN_ITEMS[d.draft.sku] ? { gtin: demoGtin(SUPPLIER_NO[d.supplier], GTIN_ITEMS[d.draft.sku]!) } : {}),
    };
  });
  // alternatives: the same stock items from a second supplier, in packs of their own
  out.push(
    {
      supplier: "curing", sku: "HV-HOG3235-B5", item: "HOG-32-35", description: "Hog casings 32/35 mm, salted, bundled", packLabel: "bundle of 5 hanks",
      packQuantity: "5", packUnit: "hank", gtin: demoGtin(SUPPLIER_NO.curing, "0201"),
    },
    {
      supplier: "spices", sku: "MST-DEX25", item: "DEXTROSE", description: "Dextrose monohydrate", packLabel: "25 kg sack",
      packQuantity: "25", packUnit: "kg",
    },
  );
  return out;
}

export interface DemoSuppliersSummary {
  suppliers: number;
  items: number;
  /** demo lots now linked to their supplier */
  lots: number;
}

/** Writes the demo suppliers and their items; the caller checks that the company has none yet. */
export async function loadDemoSuppliers(knex: Knex, companyId: string): Promise<DemoSuppliersSummary> {
  const row: { id: string } | undefined = await knex("app_users")
    .where({ company_id: companyId })
    .whereIn("role", ["buyer", "manager", "admin"])
    .whereNull("disabled_at")
    .orderByRaw("array_position(array['buyer','manager','admin']::text[], role), email")
    .first("id");
  const buyer = row && (await loadCurrentUser(row.id));
  if (!buyer) throw new Error("The demo company has no active buyer, manager or admin.");
  const haveItems = new Set<string>(await knex("items").where({ company_id: companyId }).whereNull("archived_at").pluck("sku"));

  const ids = {} as Record<SupplierKey, string>;
  for (const key of Object.keys(SUPPLIERS) as SupplierKey[]) {
    const { skuPrefix: _prefix, ...rest } = DEMO_SUPPLIERS[key];
    const s = await createSupplier(buyer, supplierCreateInput.parse({ name: SUPPLIERS[key].name, ...rest }));
    ids[key] = s.id;
  }
  let items = 0;
  for (const si of demoSupplierItems()) {
    if (!haveItems.has(si.item)) continue;
    const { supplier, ...body } = si;
    await createSupplierItem(buyer, ids[supplier], supplierItemCreateInput.parse(body));
    items++;
  }
  // the demo receipts named their supplier as text: point each lot at it
  const linked = await knex.raw<{ rowCount: number }>(
    `update lots l set supplier_id = s.id from suppliers s
      where l.company_id = :c and s.company_id = l.company_id and l.supplier_id is null and lower(l.supplier_name) = lower(s.name)`,
    { c: companyId },
  );
  return { suppliers: Object.keys(ids).length, items, lots: linked.rowCount };
}
