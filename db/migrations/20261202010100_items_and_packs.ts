import type { Knex } from "knex";

// The catalogue. One table for the three kinds of dry goods; each category's own attributes are
// nullable columns held in shape by CHECKs. Quantities are NUMERIC(30,12) in the item's stock unit
// (g, m, ml or pc; a natural casing is stocked in put-ups, one pc = one hank/set/strand).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("items", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("company_id").notNullable().references("companies.id").onDelete("CASCADE");
    t.text("sku").notNullable();
    t.text("name").notNullable();
    t.text("category").notNullable();
    t.text("stock_unit").notNullable();
    t.boolean("track_lots").notNullable().defaultTo(false);
    t.boolean("track_dates").notNullable().defaultTo(false);
    // casings
    t.text("casing_kind");
    t.decimal("calibre_min_mm", 8, 2);
    t.decimal("calibre_max_mm", 8, 2);
    t.text("put_up");
    t.decimal("put_up_metres", 30, 12);
    t.decimal("capacity_kg_per_put_up", 30, 12);
    t.text("storage");
    // cures: fractions from the label, never assumed
    t.decimal("nitrite_fraction", 10, 8);
    t.decimal("nitrate_fraction", 10, 8);
    // spices and other ingredients
    t.text("form");
    t.decimal("density_g_per_ml", 30, 12);
    t.timestamp("archived_at", { useTz: true });
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("updated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(["company_id", "sku"]);
    t.unique(["company_id", "id"]);
  });
  await knex.raw(`alter table items
    add constraint items_category check (category in ('casing','cure','spice','ingredient')),
    add constraint items_stock_unit check (stock_unit in ('g','m','ml','pc')),
    add constraint items_casing_kind check (casing_kind is null or casing_kind in ('natural_hog','natural_sheep','natural_beef','collagen','fibrous','cellulose')),
    add constraint items_put_up check (put_up is null or put_up in ('hank','beef_set','tubed_strand','stick','box')),
    add constraint items_storage check (storage is null or storage in ('salted','brine','dry')),
    add constraint items_casing_fields check (category <> 'casing' or (casing_kind is not null and calibre_min_mm > 0 and calibre_max_mm >= calibre_min_mm)),
    add constraint items_put_up_metres check (put_up is null or put_up_metres > 0),
    add constraint items_cure_fields check (category <> 'cure' or (nitrite_fraction is not null and nitrate_fraction is not null
      and nitrite_fraction >= 0 and nitrate_fraction >= 0 and nitrite_fraction + nitrate_fraction > 0 and nitrite_fraction + nitrate_fraction <= 1
      and track_lots and track_dates and stock_unit = 'g')),
    add constraint items_density check (density_g_per_ml is null or density_g_per_ml > 0),
    add constraint items_dates_need_lots check (not track_dates or track_lots)`);

  // Purchase packs with exact sizes: "box of 10 hanks", "25 lb pail", "1 kg bag".
  await knex.schema.createTable("item_packs", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("company_id").notNullable();
    t.uuid("item_id").notNullable();
    t.text("name").notNullable();
    t.decimal("quantity", 30, 12).notNullable(); // as typed, in `unit`
    t.text("unit").notNullable();
    t.decimal("stock_quantity", 30, 12).notNullable(); // the same size in the item's stock unit
    t.foreign(["company_id", "item_id"]).references(["company_id", "id"]).inTable("items").onDelete("CASCADE");
    t.unique(["item_id", "name"]);
  });
  await knex.raw(`alter table item_packs add constraint item_packs_positive check (quantity > 0 and stock_quantity > 0)`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("item_packs");
  await knex.schema.dropTable("items");
}
