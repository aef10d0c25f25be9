import type { Knex } from "knex";

// Transactional outbox: an e-mail row is written in the same transaction as the change that causes
// it; the worker sends it later. A request never waits on SMTP and mail survives a Redis outage.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("outbox_emails", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("company_id").references("companies.id").onDelete("CASCADE");
    t.specificType("to_addresses", "text[]").notNullable();
    t.text("subject").notNullable();
    t.text("text_body").notNullable();
    t.text("html_body");
    t.text("status").notNullable().defaultTo("pending");
    t.integer("attempts").notNullable().defaultTo(0);
    t.text("last_error");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("sent_at", { useTz: true });
  });
  await knex.raw(`alter table outbox_emails add constraint outbox_emails_status check (status in ('pending','sent','failed'))`);
  await knex.raw(`create index outbox_emails_pending on outbox_emails (created_at) where status = 'pending'`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("outbox_emails");
}
