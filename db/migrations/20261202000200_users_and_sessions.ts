import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("app_users", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("company_id").notNullable().references("companies.id").onDelete("CASCADE");
    t.text("email").notNullable().unique(); // sign-in is by e-mail alone, so e-mails are unique across companies
    t.text("name").notNullable();
    t.text("role").notNullable();
    t.text("password_hash");
    t.text("time_zone"); // null: the company's; used for the user's e-mails
    t.text("unit_system").notNullable().defaultTo("metric");
    t.timestamp("disabled_at", { useTz: true });
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(["company_id", "id"]);
  });
  await knex.raw(`alter table app_users
    add constraint app_users_email_lower check (email = lower(email)),
    add constraint app_users_role check (role in ('admin','manager','buyer','kitchen_lead','accountant')),
    add constraint app_users_unit_system check (unit_system in ('metric','us'))`);

  // Kitchens a user acts in. Composite keys keep user and kitchen in the same company.
  await knex.schema.createTable("user_kitchens", (t) => {
    t.uuid("company_id").notNullable();
    t.uuid("user_id").notNullable();
    t.uuid("kitchen_id").notNullable();
    t.primary(["user_id", "kitchen_id"]);
    t.foreign(["company_id", "user_id"]).references(["company_id", "id"]).inTable("app_users").onDelete("CASCADE");
    t.foreign(["company_id", "kitchen_id"]).references(["company_id", "id"]).inTable("kitchens").onDelete("CASCADE");
  });

  // Column names are the ones the session library's PostgreSQL adapter expects.
  await knex.schema.createTable("user_sessions", (t) => {
    t.text("id").primary();
    t.uuid("user_id").notNullable().references("app_users.id").onDelete("CASCADE");
    t.timestamp("expires_at", { useTz: true }).notNullable();
    t.index(["user_id"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("user_sessions");
  await knex.schema.dropTable("user_kitchens");
  await knex.schema.dropTable("app_users");
}
