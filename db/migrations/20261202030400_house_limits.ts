import type { Knex } from "knex";

// A company's own cure limits, stricter than the regulation's (e.g. at most 150 ppm ingoing nitrite
// in comminuted products). Unlike statutory maxima, a manager may plan past one with a reason, which
// is kept on the batch and in the audit trail.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("house_limits", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("company_id").notNullable().references("companies.id").onDelete("CASCADE");
    t.text("product_class").notNullable();
    t.text("substance").notNullable(); // nitrite | nitrate
    t.text("kind").notNullable(); // max | min
    t.decimal("limit_ppm", 12, 4).notNullable();
    t.text("note").notNullable().defaultTo("");
    t.uuid("updated_by").references("app_users.id").onDelete("SET NULL");
    t.timestamp("updated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(["company_id", "product_class", "substance", "kind"]);
  });
  await knex.raw(`alter table house_limits
    add constraint house_limits_class check (product_class in ('comminuted','dry_cured','immersion_cured','pumped','bacon_pumped','bacon_immersion','bacon_dry')),
    add constraint house_limits_substance check (substance in ('nitrite','nitrate')),
    add constraint house_limits_kind check (kind in ('max','min')),
    add constraint house_limits_ppm check (limit_ppm > 0)`);
  await knex.schema.alterTable("batches", (t) => {
    t.jsonb("house_checks"); // the house limits checked when planned, with their verdicts
    t.text("override_reason");
    t.uuid("override_by").references("app_users.id").onDelete("SET NULL");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("batches", (t) => {
    t.dropColumn("house_checks");
    t.dropColumn("override_reason");
    t.dropColumn("override_by");
  });
  await knex.schema.dropTable("house_limits");
}
