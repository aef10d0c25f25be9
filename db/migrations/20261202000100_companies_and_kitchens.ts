import type { Knex } from "knex";

// A company is the tenant: every company-owned row carries company_id. The (company_id, id) unique
// keys let child tables use composite foreign keys, so a row can never point into another company.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("companies", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.text("name").notNullable();
    t.text("time_zone").notNullable().defaultTo("UTC");
    t.specificType("currency", "char(3)").notNullable().defaultTo("USD");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.raw(`alter table companies add constraint companies_currency_upper check (currency ~ '^[A-Z]{3}$')`);

  await knex.schema.createTable("kitchens", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("company_id").notNullable().references("companies.id").onDelete("CASCADE");
    t.text("code").notNullable();
    t.text("name").notNullable();
    t.text("address").notNullable().defaultTo("");
    t.text("time_zone"); // null: the company's
    t.timestamp("archived_at", { useTz: true });
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(["company_id", "code"]);
    t.unique(["company_id", "id"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("kitchens");
  await knex.schema.dropTable("companies");
}
