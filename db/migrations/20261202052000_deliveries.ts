import type { Knex } from "knex";

// Deliveries: a supplier's delivery note reconciled against open purchase orders, then posted as
// receipts (lib/data/deliveries.ts). A draft holds the note's lines as sent (CSV row, keyed in or
// scanned) with the buyer's corrections beside them, the purchase order line each matched and the
// findings (as_ordered, short, over, different_item, not_on_order, price_differs, lot_missing,
// date_missing, expired, short_dated), worked out again whenever a line or the delivery changes.
//
// Quantities on the note count the supplier's packs (supplier_items.pack_size_stock converts them
// to the item's stock unit, exactly); unit prices are per pack, in the company's one currency.
// Posting writes receipts (lots with the landed unit cost), raises purchase_order_lines.received_stock
// and the orders' status in one transaction. The same CSV (unique upload per company) or the same
// note number of a supplier (unique among posted deliveries) cannot post twice.
//
// Companies get the receiving checks: the price tolerance in percent (2) and the shortest
// remaining life a delivered lot may have per category (cure 90, casing 60, spice 180 days;
// ingredient 0 = no check).
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`alter table companies
    add column receiving_price_tolerance_pct numeric(6,2) not null default 2,
    add column short_dated_days_cure integer not null default 90,
    add column short_dated_days_casing integer not null default 60,
    add column short_dated_days_spice integer not null default 180,
    add column short_dated_days_ingredient integer not null default 0,
    add constraint companies_receiving_tolerance check (receiving_price_tolerance_pct >= 0 and receiving_price_tolerance_pct <= 100),
    add constraint companies_short_dated_days check (short_dated_days_cure between 0 and 3650 and short_dated_days_casing between 0 and 3650
      and short_dated_days_spice between 0 and 3650 and short_dated_days_ingredient between 0 and 3650)`);

  await knex.schema.createTable("deliveries", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("company_id").notNullable().references("companies.id").onDelete("CASCADE");
    t.uuid("supplier_id").notNullable();
    t.uuid("kitchen_id").notNullable();
    t.uuid("purchase_order_id"); // the order the buyer named; null: the supplier's open orders for the kitchen
    t.text("note_number");
    t.date("note_date");
    t.uuid("upload_id"); // the CSV the lines came from
    t.uuid("document_upload_id"); // the delivery note as PDF or photo
    t.decimal("freight", 20, 4).notNullable().defaultTo(0);
    t.text("status").notNullable().defaultTo("draft");
    t.uuid("created_by").references("app_users.id").onDelete("SET NULL");
    t.uuid("posted_by").references("app_users.id").onDelete("SET NULL");
    t.timestamp("posted_at", { useTz: true });
    t.uuid("posting_id"); // stock_movements.posting_id of the receipts
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("updated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(["company_id", "id"]);
    t.foreign(["company_id", "supplier_id"]).references(["company_id", "id"]).inTable("suppliers");
    t.foreign(["company_id", "kitchen_id"]).references(["company_id", "id"]).inTable("kitchens");
    t.foreign(["company_id", "purchase_order_id"]).references(["company_id", "id"]).inTable("purchase_orders");
    t.foreign(["company_id", "upload_id"]).references(["company_id", "id"]).inTable("uploads");
    t.foreign(["company_id", "document_upload_id"]).references(["company_id", "id"]).inTable("uploads");
  });
  await knex.raw(`alter table deliveries
    add constraint deliveries_status check (status in ('draft','posted')),
    add constraint deliveries_posted check (status <> 'posted' or (posted_at is not null and note_number is not null)),
    add constraint deliveries_freight check (freight >= 0)`);
  await knex.raw(`create unique index deliveries_upload on deliveries (company_id, upload_id) where upload_id is not null`);
  await knex.raw(`create unique index deliveries_note_posted on deliveries (company_id, supplier_id, lower(note_number)) where status = 'posted'`);
  await knex.raw(`create index deliveries_list on deliveries (company_id, created_at desc, id desc)`);

  await knex.schema.createTable("delivery_lines", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("company_id").notNullable();
    t.uuid("delivery_id").notNullable();
    t.integer("line_no").notNullable();
    t.integer("row_number"); // the CSV row (the header is row 1); null when keyed in or scanned
    t.text("source").notNullable(); // csv | keyed | scan
    // as the note says
    t.text("sku");
    t.text("gtin14");
    t.text("description");
    t.decimal("quantity", 30, 12).notNullable(); // packs
    t.decimal("unit_price", 20, 4); // per pack
    t.text("lot_code");
    t.date("date");
    t.text("date_kind");
    // the buyer's corrections (null: as noted)
    t.uuid("corrected_supplier_item_id");
    t.decimal("corrected_quantity", 30, 12);
    t.decimal("corrected_unit_price", 20, 4);
    t.text("corrected_lot_code");
    t.date("corrected_date");
    t.text("corrected_date_kind");
    // the reconciliation (worked out again on every change)
    t.uuid("supplier_item_id");
    t.decimal("quantity_stock", 30, 12);
    t.uuid("purchase_order_line_id");
    t.specificType("findings", "text[]").notNullable().defaultTo("{}");
    t.text("decision").notNullable().defaultTo("pending");
    t.text("note");
    // after posting
    t.decimal("landed_unit_cost", 20, 6);
    t.uuid("lot_id");
    t.unique(["company_id", "id"]);
    t.unique(["delivery_id", "line_no"]);
    t.foreign(["company_id", "delivery_id"]).references(["company_id", "id"]).inTable("deliveries").onDelete("CASCADE");
    t.foreign(["company_id", "supplier_item_id"]).references(["company_id", "id"]).inTable("supplier_items");
    t.foreign(["company_id", "corrected_supplier_item_id"]).references(["company_id", "id"]).inTable("supplier_items");
    t.foreign(["company_id", "purchase_order_line_id"]).references(["company_id", "id"]).inTable("purchase_order_lines");
    t.foreign(["company_id", "lot_id"]).references(["company_id", "id"]).inTable("lots");
  });
  await knex.raw(`alter table delivery_lines
    add constraint delivery_lines_source check (source in ('csv','keyed','scan')),
    add constraint delivery_lines_decision check (decision in ('pending','accept','reject')),
    add constraint delivery_lines_quantity check (quantity > 0 and (corrected_quantity is null or corrected_quantity > 0)),
    add constraint delivery_lines_price check ((unit_price is null or unit_price >= 0) and (corrected_unit_price is null or corrected_unit_price >= 0)),
    add constraint delivery_lines_date_kind check (date_kind is null or date_kind in ('use_by','best_before')),
    add constraint delivery_lines_corrected_date_kind check (corrected_date_kind is null or corrected_date_kind in ('use_by','best_before')),
    add constraint delivery_lines_findings check (findings <@ array['as_ordered','short','over','different_item','not_on_order','price_differs','lot_missing','date_missing','expired','short_dated']::text[])`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("delivery_lines");
  await knex.schema.dropTable("deliveries");
  await knex.raw(`alter table companies
    drop constraint companies_short_dated_days, drop constraint companies_receiving_tolerance,
    drop column receiving_price_tolerance_pct, drop column short_dated_days_cure, drop column short_dated_days_casing,
    drop column short_dated_days_spice, drop column short_dated_days_ingredient`);
}
