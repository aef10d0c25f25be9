import type { Knex } from "knex";

// Files sent with an outbox e-mail (a purchase order's PDF and CSV), written in the same
// transaction as the e-mail, so what the supplier receives is exactly what was sent.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("outbox_email_attachments", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("outbox_email_id").notNullable().references("outbox_emails.id").onDelete("CASCADE");
    t.integer("position").notNullable();
    t.text("filename").notNullable();
    t.text("content_type").notNullable();
    t.binary("content").notNullable();
    t.unique(["outbox_email_id", "position"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("outbox_email_attachments");
}
