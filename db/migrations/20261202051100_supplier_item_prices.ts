import type { Knex } from "knex";

// What a supplier charges for one pack of a supplier item, from a date on: the price history.
// The current price of a supplier item on a day is its row with the latest effective_from on or
// before that day. Rows come from a price-list import (price_list_import_id) or are keyed in
// (null). Money is NUMERIC(20,4) in the company's one currency, per pack as the supplier quotes it;
// the price per stock unit is pack_price / supplier_items.pack_size_stock, worked out exactly when
// read. A later import for the same supplier item and date replaces the price (one per day).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("supplier_item_prices", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("company_id").notNullable();
    t.uuid("supplier_item_id").notNullable();
    t.decimal("pack_price", 20, 4).notNullable();
    t.date("effective_from").notNullable();
    t.uuid("price_list_import_id"); // the import that set it; FK added with the imports table
    t.uuid("created_by");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.foreign(["company_id", "supplier_item_id"]).references(["company_id", "id"]).inTable("supplier_items").onDelete("CASCADE");
    t.unique(["supplier_item_id", "effective_from"]);
  });
  await knex.raw(`alter table supplier_item_prices add constraint supplier_item_prices_positive check (pack_price > 0)`);
  await knex.raw(`create index supplier_item_prices_latest on supplier_item_prices (supplier_item_id, effective_from desc)`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("supplier_item_prices");
}
