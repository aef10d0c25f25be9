// The demo company's purchase orders (Quillmoor Provisions), one in each of the states a buyer
// meets first: casings sent to Fenwick & Rudd for the Yard, cures approved and waiting to go to
// Haverby for the Lane, and a large spice order for the Ropewalk still a draft because it is over
// the approval threshold (a manager approves it). Pack prices are the invented price list's
// (orderCost in demo-stock-catalogue.ts). Written through lib/data as the demo buyer, with the
// same checks as a person's; the sent order's e-mail (PDF and CSV attached) is left in the outbox
// for the worker's sweep, so loading needs no Redis. Loaded by load-demo.ts when the demo company
// has suppliers but no purchase order yet.
import type { Knex } from "knex";
import { approvePurchaseOrder, createPurchaseOrder, sendInTransaction } from "../../lib/data/purchase-orders";
import { loadCurrentUser } from "../../lib/data/users";
import { purchaseOrderCreateInput } from "../../lib/validation/purchase-orders";
import { DEMO_ITEMS, SUPPLIERS, type SupplierKey } from "./demo-stock-catalogue";

interface DemoOrder {
  supplier: SupplierKey;
  kitchen: string;
  /** our item's SKU and the packs of its usual supplier item */
  lines: [string, string][];
  deliverInDays: number | null;
  notes: string;
  /** how far the demo takes it */
  until: "draft" | "approved" | "sent";
}

export const DEMO_ORDERS: readonly DemoOrder[] = [
  {
    supplier: "casings", kitchen: "YARD", lines: [["HOG-32-35", "8"], ["SHP-22-24", "4"], ["COL-21", "1"]], deliverInDays: 5,
    notes: "Tuesday round, please. Casings to the cold store by the back door.", until: "sent",
  },
  {
    supplier: "curing", kitchen: "LANE", lines: [["CURE-1", "6"], ["CURE-2", "2"], ["DEXTROSE", "1"], ["ASCORBATE", "1"]], deliverInDays: 3,
    notes: "Certificates of analysis with the cure, as usual.", until: "approved",
  },
  {
    supplier: "spices", kitchen: "ROPE", lines: [["PEP-BLK-GR", "20"], ["PAPRIKA-SM", "12"], ["NUTMEG", "6"], ["SALT-FINE", "10"]], deliverInDays: null,
    notes: "", until: "draft",
  },
];

export interface DemoOrdersSummary {
  orders: number;
  sent: number;
}

/** Writes the demo orders; the caller checks that the company has suppliers and no order yet. */
export async function loadDemoOrders(knex: Knex, companyId: string, today: string): Promise<DemoOrdersSummary> {
  const row: { id: string } | undefined = await knex("app_users")
    .where({ company_id: companyId, role: "buyer" })
    .whereNull("disabled_at")
    .orderBy("email")
    .first("id");
  const buyer = row && (await loadCurrentUser(row.id));
  if (!buyer) throw new Error("The demo company has no active buyer.");
  const cost = new Map(DEMO_ITEMS.map((d) => [d.draft.sku, d.orderCost]));
  let orders = 0;
  let sent = 0;
  for (const o of DEMO_ORDERS) {
    const supplier: { id: string } | undefined = await knex("suppliers").where({ company_id: companyId, name: SUPPLIERS[o.supplier].name }).first("id");
    if (!supplier) continue;
    // each item's own pack at this supplier (the alternatives in other packs are not used here)
    const items: { id: string; item_sku: string }[] = await knex("supplier_items as si")
      .join("items as i", "i.id", "si.item_id")
      .where({ "si.company_id": companyId, "si.supplier_id": supplier.id, "si.active": true, "si.pack_quantity": "1" })
      .select("si.id", "i.sku as item_sku");
    const lines = o.lines.flatMap(([sku, packs]) => {
      const si = items.find((i) => i.item_sku === sku);
      return si && cost.has(sku) ? [{ supplierItem: si.id, packs, packPrice: cost.get(sku)! }] : [];
    });
    if (!lines.length) continue;
    const deliverBy = o.deliverInDays === null ? null : new Date(Date.parse(`${today}T00:00:00Z`) + o.deliverInDays * 86_400_000).toISOString().slice(0, 10);
    const order = await createPurchaseOrder(buyer, purchaseOrderCreateInput.parse({ supplier: supplier.id, kitchen: o.kitchen, lines, deliverBy, notes: o.notes }));
    orders++;
    if (o.until === "draft") continue;
    await approvePurchaseOrder(buyer, order.id);
    if (o.until === "sent") {
      await sendInTransaction(buyer, order.id);
      sent++;
    }
  }
  return { orders, sent };
}
