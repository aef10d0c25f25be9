import type { Knex } from "knex";

// A replayed Idempotency-Key returns the stored response. Scoped to company, user and endpoint.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("idempotency_keys", (t) => {
    t.uuid("company_id").notNullable().references("companies.id").onDelete("CASCADE");
    t.uuid("user_id").notNullable().references("app_users.id").onDelete("CASCADE");
    t.text("endpoint").notNullable();
    t.text("key").notNullable();
    t.text("request_hash").notNullable();
    t.integer("status_code"); // null while the first request is still running
    t.jsonb("response_body");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(["company_id", "user_id", "endpoint", "key"]);
    t.index(["created_at"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("idempotency_keys");
}
