// A supplier with items and a sent purchase order, straight into the tables (plain knex, so the
// browser stories can use it too), and the delivery-note fixtures filled in for today.
//
// The order (to the first kitchen): 10 x PAP-1KG (1 kg bag of paprika, 12.50), 4 x HOG-B5 (bundle
// of 5 hog hanks, 189.50), 2 x SHP-B5 (bundle of 5 sheep hanks, 145.00), 2 x CURE-5KG (5 kg tub of
// curing salt, 30.00). Alternatives not ordered: PAP-500 (500 g tub of the same paprika), HOG-B10
// (bundle of 10 hog hanks). Not ordered at all: PEP-1KG (pepper).
import { readFileSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { db } from "../../db/client";
import { tag } from "./factory";
import { createItem, type TestItem } from "./stock";

export const DELIVERY_FIXTURES = path.join(path.dirname(fileURLToPath(import.meta.url)), "..", "fixtures", "csv", "deliveries");

export interface DeliveryScenario {
  supplierId: string;
  supplierName: string;
  orderId: string;
  orderNumber: string;
  items: { paprika: TestItem; hog: TestItem; sheep: TestItem; cure: TestItem; pepper: TestItem };
  si: Record<"PAP-1KG" | "PAP-500" | "HOG-B5" | "HOG-B10" | "SHP-B5" | "CURE-5KG" | "PEP-1KG", string>;
  lines: Record<"PAP-1KG" | "HOG-B5" | "SHP-B5" | "CURE-5KG", string>;
}

/** yyyy-mm-dd of the company's today plus n days. */
export async function companyDay(companyId: string, n = 0): Promise<string> {
  const r = await db().raw<{ rows: { d: string }[] }>(
    "select to_char((now() at time zone time_zone)::date + ?::int, 'YYYY-MM-DD') as d from companies where id = ?", [n, companyId]);
  return r.rows[0]!.d;
}

export async function deliveryScenario(companyId: string, kitchenId: string, userId: string): Promise<DeliveryScenario> {
  const supplierName = `Brackwater Provisions ${tag()}`;
  const [s] = await db()("suppliers").insert({ company_id: companyId, name: supplierName, lead_time_days: 3 }).returning<{ id: string }[]>("id");
  const items = {
    paprika: await createItem(companyId, { category: "spice" }), // g
    hog: await createItem(companyId, { category: "casing", trackLots: true, trackDates: true }), // pc = one hank
    sheep: await createItem(companyId, { category: "casing", trackLots: true, trackDates: true }),
    cure: await createItem(companyId, { category: "cure" }), // g, lots and dates always
    pepper: await createItem(companyId, { category: "spice" }),
  };
  const rows = [
    { sku: "PAP-1KG", item: items.paprika, label: "1 kg bag", size: "1000", gtin: "09521234000013" },
    { sku: "PAP-500", item: items.paprika, label: "500 g tub", size: "500", gtin: null },
    { sku: "HOG-B5", item: items.hog, label: "bundle of 5 hanks", size: "5", gtin: null },
    { sku: "HOG-B10", item: items.hog, label: "bundle of 10 hanks", size: "10", gtin: null },
    { sku: "SHP-B5", item: items.sheep, label: "bundle of 5 hanks", size: "5", gtin: null },
    { sku: "CURE-5KG", item: items.cure, label: "5 kg tub", size: "5000", gtin: null },
    { sku: "PEP-1KG", item: items.pepper, label: "1 kg bag", size: "1000", gtin: null },
  ] as const;
  const si = {} as DeliveryScenario["si"];
  for (const r of rows) {
    const [row] = await db()("supplier_items")
      .insert({
        company_id: companyId, supplier_id: s!.id, item_id: r.item.id, sku: r.sku, description: r.label, pack_label: r.label, pack_quantity: "1",
        pack_unit: r.label, pack_size_stock: r.size, gtin14: r.gtin,
      })
      .returning<{ id: string }[]>("id");
    si[r.sku] = row!.id;
  }
  const number = `PO-2026-${String(Math.floor(Math.random() * 90_000_000) + 10_000_000)}`;
  const ordered = [
    { sku: "PAP-1KG", packs: "10", size: "1000", price: "12.50", total: "125.00", item: items.paprika },
    { sku: "HOG-B5", packs: "4", size: "5", price: "189.50", total: "758.00", item: items.hog },
    { sku: "SHP-B5", packs: "2", size: "5", price: "145.00", total: "290.00", item: items.sheep },
    { sku: "CURE-5KG", packs: "2", size: "5000", price: "30.00", total: "60.00", item: items.cure },
  ] as const;
  const [o] = await db()("purchase_orders")
    .insert({
      company_id: companyId, number, supplier_id: s!.id, kitchen_id: kitchenId, status: "sent", total: "1233.00", created_by: userId,
      approved_by: userId, approved_at: new Date(), sent_by: userId, sent_at: new Date(),
    })
    .returning<{ id: string }[]>("id");
  const lines = {} as DeliveryScenario["lines"];
  for (const [i, l] of ordered.entries()) {
    const [row] = await db()("purchase_order_lines")
      .insert({
        company_id: companyId, order_id: o!.id, line_no: i + 1, supplier_item_id: si[l.sku], item_id: l.item.id, supplier_sku: l.sku, description: l.sku,
        pack_label: l.sku, packs: l.packs, pack_size_stock: l.size, quantity_stock: String(BigInt(l.packs) * BigInt(l.size)), pack_price: l.price, line_total: l.total,
      })
      .returning<{ id: string }[]>("id");
    lines[l.sku] = row!.id;
  }
  return { supplierId: s!.id, supplierName, orderId: o!.id, orderNumber: number, items, si, lines };
}

/**
 * A fixture with its placeholders filled: NOTE (the delivery note number), DATE+n / DATE-n (the
 * company's today plus or minus n days, yyyy-mm-dd), DEDATE+n (the same as dd.mm.yyyy).
 */
export async function deliveryFixture(name: string, companyId: string, note: string): Promise<string> {
  const text = readFileSync(path.join(DELIVERY_FIXTURES, name), "utf8");
  const tokens = [...new Set(text.match(/\b(?:DE)?DATE[+-]\d+\b/g) ?? [])];
  let out = text.replace(/\bNOTE\b/g, note);
  for (const t of tokens) {
    const n = Number(t.replace(/^(?:DE)?DATE/, ""));
    const iso = await companyDay(companyId, n);
    const value = t.startsWith("DE") ? iso.split("-").reverse().join(".") : iso;
    out = out.replace(new RegExp(`\\b${t.replace("+", "\\+")}\\b`, "g"), value);
  }
  return out;
}
