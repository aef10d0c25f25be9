import type { Knex } from "knex";

// Par level and reorder point per item per kitchen (stock units), and count sheets: the lines of a
// count are posted together as count movements whose posting_id is the count's id.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("stock_levels", (t) => {
    t.uuid("company_id").notNullable();
    t.uuid("kitchen_id").notNullable();
    t.uuid("item_id").notNullable();
    t.decimal("par_level", 30, 12);
    t.decimal("reorder_point", 30, 12);
    t.uuid("updated_by").references("app_users.id").onDelete("SET NULL");
    t.timestamp("updated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(["kitchen_id", "item_id"]);
    t.foreign(["company_id", "kitchen_id"]).references(["company_id", "id"]).inTable("kitchens");
    t.foreign(["company_id", "item_id"]).references(["company_id", "id"]).inTable("items").onDelete("CASCADE");
  });
  await knex.raw(`alter table stock_levels
    add constraint stock_levels_not_negative check (coalesce(par_level, 0) >= 0 and coalesce(reorder_point, 0) >= 0),
    add constraint stock_levels_reorder_below_par check (par_level is null or reorder_point is null or reorder_point <= par_level)`);

  await knex.schema.createTable("stock_counts", (t) => {
    t.uuid("id").primary();
    t.uuid("company_id").notNullable();
    t.uuid("kitchen_id").notNullable();
    t.uuid("user_id").references("app_users.id").onDelete("SET NULL");
    t.text("note");
    t.integer("line_count").notNullable();
    t.timestamp("counted_at", { useTz: true }).notNullable();
    t.timestamp("posted_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.foreign(["company_id", "kitchen_id"]).references(["company_id", "id"]).inTable("kitchens");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("stock_counts");
  await knex.schema.dropTable("stock_levels");
}
