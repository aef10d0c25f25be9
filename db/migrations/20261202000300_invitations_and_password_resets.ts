import type { Knex } from "knex";

// Only a SHA-256 of each link token is stored: a database reader cannot use a pending link.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("invitations", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("company_id").notNullable().references("companies.id").onDelete("CASCADE");
    t.text("email").notNullable();
    t.text("name").notNullable();
    t.text("role").notNullable();
    t.specificType("kitchen_ids", "uuid[]").notNullable().defaultTo("{}");
    t.text("token_hash").notNullable().unique();
    t.uuid("invited_by").references("app_users.id").onDelete("SET NULL");
    t.timestamp("expires_at", { useTz: true }).notNullable();
    t.timestamp("accepted_at", { useTz: true });
    t.timestamp("revoked_at", { useTz: true });
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(["company_id", "email"]);
  });
  await knex.raw(`alter table invitations
    add constraint invitations_email_lower check (email = lower(email)),
    add constraint invitations_role check (role in ('admin','manager','buyer','kitchen_lead','accountant'))`);

  await knex.schema.createTable("password_resets", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("company_id").notNullable().references("companies.id").onDelete("CASCADE");
    t.uuid("user_id").notNullable().references("app_users.id").onDelete("CASCADE");
    t.text("token_hash").notNullable().unique();
    t.timestamp("expires_at", { useTz: true }).notNullable();
    t.timestamp("used_at", { useTz: true });
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("password_resets");
  await knex.schema.dropTable("invitations");
}
