import type { Knex } from "knex";

// Every receipt creates (or adds to) a lot, also for items whose lots are not tracked: the lot
// carries the unit cost that costing needs. Untracked items simply never show their lots.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("lots", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("company_id").notNullable();
    t.uuid("item_id").notNullable();
    t.text("code").notNullable(); // the supplier's lot code, or one we generate
    t.uuid("supplier_id"); // suppliers arrive with purchasing
    t.text("supplier_name");
    t.date("received_on").notNullable();
    t.date("date"); // use-by or best-before
    t.text("date_kind");
    t.decimal("unit_cost", 20, 6).notNullable(); // per stock unit, company currency
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.foreign(["company_id", "item_id"]).references(["company_id", "id"]).inTable("items").onDelete("CASCADE");
    t.unique(["company_id", "item_id", "code"]);
    t.unique(["company_id", "id"]);
  });
  await knex.raw(`alter table lots
    add constraint lots_date_kind check ((date is null and date_kind is null) or (date is not null and date_kind in ('use_by','best_before'))),
    add constraint lots_unit_cost check (unit_cost >= 0)`);
  await knex.raw(`create index lots_expiry on lots (company_id, date) where date is not null`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("lots");
}
