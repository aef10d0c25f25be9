import type { Knex } from "knex";

// The ledger. Movements are append-only (corrections reverse, never edit); stock_balances is kept
// in the same transaction as each movement and can never go below zero (CHECK). Withdrawals are
// conditional updates (on_hand - reserved >= n) so concurrent requests cannot oversell.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("stock_balances", (t) => {
    t.uuid("company_id").notNullable();
    t.uuid("kitchen_id").notNullable();
    t.uuid("item_id").notNullable();
    t.uuid("lot_id").notNullable();
    t.decimal("on_hand", 30, 12).notNullable().defaultTo(0);
    t.decimal("reserved", 30, 12).notNullable().defaultTo(0); // reservations arrive with planning
    t.timestamp("updated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(["kitchen_id", "lot_id"]);
    t.foreign(["company_id", "kitchen_id"]).references(["company_id", "id"]).inTable("kitchens");
    t.foreign(["company_id", "lot_id"]).references(["company_id", "id"]).inTable("lots");
    t.foreign(["company_id", "item_id"]).references(["company_id", "id"]).inTable("items");
    t.index(["company_id", "kitchen_id", "item_id"]);
  });
  await knex.raw(`alter table stock_balances
    add constraint stock_balances_on_hand_not_negative check (on_hand >= 0),
    add constraint stock_balances_reserved_not_negative check (reserved >= 0)`);

  await knex.schema.createTable("stock_movements", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("company_id").notNullable();
    t.uuid("posting_id").notNullable(); // the movements one request posted together
    t.text("kind").notNullable();
    t.uuid("kitchen_id").notNullable();
    t.uuid("item_id").notNullable();
    t.uuid("lot_id").notNullable();
    t.decimal("delta", 30, 12).notNullable(); // signed change of on hand, stock unit
    t.decimal("counted", 30, 12); // count: the counted quantity
    t.text("entered_quantity"); // what the person typed, kept as typed
    t.text("entered_unit");
    t.decimal("unit_cost", 20, 6).notNullable(); // the lot's cost, for valuation
    t.text("reason");
    t.uuid("other_kitchen_id"); // transfer: the kitchen on the other side
    t.uuid("reverses_id").unique().references("stock_movements.id");
    t.uuid("user_id").references("app_users.id").onDelete("SET NULL");
    t.timestamp("occurred_at", { useTz: true }).notNullable();
    t.timestamp("recorded_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.foreign(["company_id", "kitchen_id"]).references(["company_id", "id"]).inTable("kitchens");
    t.foreign(["company_id", "lot_id"]).references(["company_id", "id"]).inTable("lots");
    t.foreign(["company_id", "item_id"]).references(["company_id", "id"]).inTable("items");
    t.index(["company_id", "kitchen_id", "item_id", "occurred_at"]);
    t.index(["lot_id"]);
    t.index(["posting_id"]);
  });
  await knex.raw(`alter table stock_movements
    add constraint stock_movements_kind check (kind in ('receipt','transfer','use','waste','adjustment','count')),
    add constraint stock_movements_delta check (kind = 'count' or reverses_id is not null or delta <> 0),
    add constraint stock_movements_waste_reason check (kind <> 'waste' or reverses_id is not null or coalesce(reason, '') <> ''),
    add constraint stock_movements_count check ((kind = 'count') = (counted is not null) or reverses_id is not null)`);
  // append-only: the application role may insert and read, never change or delete
  await knex.raw(`create function stock_movements_append_only() returns trigger language plpgsql as $$
    begin raise exception 'stock movements are append-only; post a reversal instead'; end $$`);
  await knex.raw(`create trigger stock_movements_no_update before update or delete on stock_movements
    for each row execute function stock_movements_append_only()`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("stock_movements");
  await knex.raw("drop function if exists stock_movements_append_only()");
  await knex.schema.dropTable("stock_balances");
}
