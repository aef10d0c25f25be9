import type { Knex } from "knex";

// Batch plans, their bill of materials, and reservations of lots.
// - A batch is planned in one kitchen for one day, from one recipe version, for a meat block weight
//   (or a link count x link weight, from which the meat block follows). Its lines are the exact bill
//   of materials in each item's stock unit; cure lines are rounded to the kitchen scale toward
//   compliance, and the cure verdict on the rounded amounts is kept with the batch.
// - Reservations hold lots for a batch line: stock_balances.reserved rises in the same transaction
//   (conditionally, so two batches can never hold the same stock) and falls when the reservation is
//   released or consumed by production.
// - Use movements posted by production name their batch (stock_movements.batch_id): lot -> batches
//   and batch -> lots for a recall.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("batches", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("company_id").notNullable();
    t.uuid("kitchen_id").notNullable();
    t.uuid("recipe_id").notNullable();
    t.uuid("recipe_version_id").notNullable();
    t.date("planned_for").notNullable();
    t.decimal("meat_block_g", 30, 12).notNullable();
    t.integer("link_count");
    t.decimal("link_weight_g", 30, 12);
    t.uuid("casing_item_id");
    t.decimal("casing_metres", 30, 12); // planned from the filling mass (lib/casing)
    t.text("casing_source"); // where the capacity or geometry came from
    t.text("status").notNullable().defaultTo("planned");
    t.jsonb("cure_check"); // lib/cure's verdict on the rounded cure amounts, as planned
    t.text("note").notNullable().defaultTo("");
    t.text("batch_code"); // given at production
    t.decimal("actual_meat_block_g", 30, 12);
    t.jsonb("actual_cure_check");
    t.text("hold_reason");
    t.text("release_reason");
    t.uuid("released_by").references("app_users.id").onDelete("SET NULL");
    t.timestamp("released_at", { useTz: true });
    t.uuid("created_by").references("app_users.id").onDelete("SET NULL");
    t.uuid("produced_by").references("app_users.id").onDelete("SET NULL");
    t.timestamp("produced_at", { useTz: true });
    t.uuid("production_posting_id");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("updated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.foreign(["company_id", "kitchen_id"]).references(["company_id", "id"]).inTable("kitchens");
    t.foreign(["company_id", "recipe_id"]).references(["company_id", "id"]).inTable("recipes");
    t.foreign(["company_id", "recipe_version_id"]).references(["company_id", "id"]).inTable("recipe_versions");
    t.foreign(["company_id", "casing_item_id"]).references(["company_id", "id"]).inTable("items");
    t.unique(["company_id", "id"]);
    t.unique(["company_id", "batch_code"]);
    t.index(["company_id", "kitchen_id", "planned_for"]);
  });
  await knex.raw(`alter table batches
    add constraint batches_status check (status in ('planned','reserved','produced','on_hold','cancelled')),
    add constraint batches_meat_block check (meat_block_g > 0),
    add constraint batches_links check ((link_count is null) = (link_weight_g is null) and coalesce(link_count, 1) > 0 and coalesce(link_weight_g, 1) > 0),
    add constraint batches_produced check (status not in ('produced','on_hold') or (batch_code is not null and actual_meat_block_g > 0)),
    add constraint batches_hold check (status <> 'on_hold' or coalesce(hold_reason, '') <> '')`);

  await knex.schema.createTable("batch_lines", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("company_id").notNullable();
    t.uuid("batch_id").notNullable().references("batches.id").onDelete("CASCADE");
    t.integer("position").notNullable();
    t.uuid("item_id").notNullable();
    t.text("role").notNullable(); // cure | ingredient | casing
    t.decimal("quantity", 30, 12).notNullable(); // to weigh / use, stock unit (cure: rounded to the scale)
    t.decimal("exact_quantity", 30, 12).notNullable(); // before rounding
    t.text("rounding").notNullable().defaultTo("exact"); // exact | down | up
    t.foreign(["company_id", "item_id"]).references(["company_id", "id"]).inTable("items");
    t.unique(["batch_id", "position"]);
    t.unique(["company_id", "id"]);
  });
  await knex.raw(`alter table batch_lines
    add constraint batch_lines_role check (role in ('cure','ingredient','casing')),
    add constraint batch_lines_quantity check (quantity >= 0 and exact_quantity > 0),
    add constraint batch_lines_rounding check (rounding in ('exact','down','up'))`);

  await knex.schema.createTable("reservations", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("company_id").notNullable();
    t.uuid("batch_id").notNullable().references("batches.id").onDelete("CASCADE");
    t.uuid("batch_line_id").notNullable();
    t.uuid("kitchen_id").notNullable();
    t.uuid("item_id").notNullable();
    t.uuid("lot_id").notNullable();
    t.decimal("quantity", 30, 12).notNullable();
    t.uuid("created_by").references("app_users.id").onDelete("SET NULL");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.foreign(["company_id", "batch_line_id"]).references(["company_id", "id"]).inTable("batch_lines").onDelete("CASCADE");
    t.foreign(["kitchen_id", "lot_id"]).references(["kitchen_id", "lot_id"]).inTable("stock_balances");
    t.unique(["batch_line_id", "lot_id"]);
    t.index(["company_id", "kitchen_id", "item_id"]);
  });
  await knex.raw(`alter table reservations add constraint reservations_quantity check (quantity > 0)`);

  await knex.schema.alterTable("stock_movements", (t) => {
    t.uuid("batch_id").references("batches.id");
    t.index(["batch_id"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("stock_movements", (t) => t.dropColumn("batch_id"));
  await knex.schema.dropTable("reservations");
  await knex.schema.dropTable("batch_lines");
  await knex.schema.dropTable("batches");
}
