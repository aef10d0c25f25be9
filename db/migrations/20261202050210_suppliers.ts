import type { Knex } from "knex";

// Suppliers and what each sells us. A supplier belongs to one company and trades in the company's
// currency (companies.currency: one currency per company), so its minimum order value is a plain
// amount of that currency: NUMERIC(20,4) in major units (no ISO 4217 currency has more than 4
// decimals; the API refuses more decimals than the company's currency has).
//
// A supplier item is the supplier's SKU for one of our stock items, sold in one pack ("bundle of 5
// hanks"): the pack as entered (pack_quantity of pack_unit, any unit the item resolves) and its
// exact size in the item's stock unit (pack_size_stock, converted by lib/units and stored
// NUMERIC(30,12) half-even, like item_packs.stock_quantity). Supplier items pointing at the same
// item are alternatives for it, by construction. gtin14 is the GS1 GTIN of the pack, GTIN-8/12/13
// padded to 14 digits, for matching scanned or listed deliveries.
// Nothing is deleted: suppliers and supplier items are switched off with `active` (orders and
// deliveries will point at them).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("suppliers", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("company_id").notNullable().references("companies.id").onDelete("CASCADE");
    t.text("name").notNullable();
    t.text("contact_name").notNullable().defaultTo("");
    t.text("order_email"); // lower-cased; null: orders go another way
    t.text("phone").notNullable().defaultTo("");
    t.integer("lead_time_days").notNullable();
    t.decimal("min_order_value", 20, 4); // null: no minimum
    t.text("notes").notNullable().defaultTo("");
    t.boolean("active").notNullable().defaultTo(true);
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("updated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(["company_id", "id"]);
  });
  await knex.raw(`alter table suppliers
    add constraint suppliers_name check (btrim(name) <> ''),
    add constraint suppliers_order_email_lower check (order_email is null or order_email = lower(order_email)),
    add constraint suppliers_lead_time check (lead_time_days between 0 and 365),
    add constraint suppliers_min_order_value check (min_order_value is null or min_order_value >= 0)`);
  // one supplier per name in a company, whatever the case ("Fenwick & Rudd" = "FENWICK & RUDD")
  await knex.raw(`create unique index suppliers_company_name on suppliers (company_id, lower(name))`);

  await knex.schema.createTable("supplier_items", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("company_id").notNullable();
    t.uuid("supplier_id").notNullable();
    t.uuid("item_id").notNullable(); // our stock item
    t.text("sku").notNullable(); // the supplier's code, as the supplier writes it
    t.text("description").notNullable().defaultTo("");
    t.text("pack_label").notNullable(); // "bundle of 5 hanks"
    t.decimal("pack_quantity", 30, 12).notNullable(); // as entered, in pack_unit
    t.text("pack_unit").notNullable();
    t.decimal("pack_size_stock", 30, 12).notNullable(); // one pack in the item's stock unit
    t.specificType("gtin14", "char(14)");
    t.boolean("active").notNullable().defaultTo(true);
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("updated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.foreign(["company_id", "supplier_id"]).references(["company_id", "id"]).inTable("suppliers").onDelete("CASCADE");
    t.foreign(["company_id", "item_id"]).references(["company_id", "id"]).inTable("items").onDelete("CASCADE");
    t.unique(["company_id", "id"]);
  });
  await knex.raw(`alter table supplier_items
    add constraint supplier_items_sku check (btrim(sku) <> ''),
    add constraint supplier_items_pack_label check (btrim(pack_label) <> ''),
    add constraint supplier_items_pack_positive check (pack_quantity > 0 and pack_size_stock > 0),
    add constraint supplier_items_gtin14 check (gtin14 is null or gtin14 ~ '^[0-9]{14}$')`);
  // a supplier's SKU names one of its items (matched without regard to case on delivery notes)
  await knex.raw(`create unique index supplier_items_supplier_sku on supplier_items (supplier_id, lower(sku))`);
  // GS1 gives each pack its own GTIN, so within one supplier a GTIN names one supplier item; the
  // same GTIN may come through several suppliers (a branded pack from two wholesalers)
  await knex.raw(`create unique index supplier_items_supplier_gtin on supplier_items (supplier_id, gtin14) where gtin14 is not null`);
  await knex.raw(`create index supplier_items_company_gtin on supplier_items (company_id, gtin14) where gtin14 is not null`);
  // the alternatives for a stock item: every supplier item pointing at it
  await knex.raw(`create index supplier_items_item on supplier_items (company_id, item_id)`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("supplier_items");
  await knex.schema.dropTable("suppliers");
}
