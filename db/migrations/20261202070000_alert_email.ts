import type { Knex } from "knex";

// E-mail about alerts. Each person chooses how alerts reach them by e-mail (app_users.alert_email:
// off, a daily digest at alert_digest_hour in their own time zone, or at once) and which kinds
// (alert_kinds; the defaults follow the role, see lib/alerts/digest.ts). alert_last_digest_at is
// when their last digest was made, so a digest hour that passed while the worker was down is caught
// up at the next tick.
// alert_deliveries is the send record: one row per (alert, recipient), written in the same
// transaction as the outbox e-mail that carries it. Re-runs and retries find the row and never
// send the alert to that person again; the outbox row is sent at least once (jobs/definitions/send-email.ts).
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`alter table app_users
    add column alert_email text not null default 'digest',
    add column alert_digest_hour smallint not null default 7,
    add column alert_kinds text[],
    add column alert_last_digest_at timestamptz,
    add constraint app_users_alert_email check (alert_email in ('off','digest','immediate')),
    add constraint app_users_alert_digest_hour check (alert_digest_hour between 0 and 23),
    add constraint app_users_alert_kinds check (alert_kinds is null or alert_kinds <@ array['expiry','reorder','shortage']::text[])`);

  await knex.schema.createTable("alert_deliveries", (t) => {
    t.uuid("alert_id").notNullable().references("alerts.id").onDelete("CASCADE");
    t.uuid("user_id").notNullable().references("app_users.id").onDelete("CASCADE");
    t.uuid("outbox_email_id").references("outbox_emails.id").onDelete("SET NULL");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(["alert_id", "user_id"]);
    t.index(["user_id", "created_at"]);
    t.index(["outbox_email_id"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("alert_deliveries");
  await knex.raw(`alter table app_users
    drop constraint app_users_alert_kinds, drop constraint app_users_alert_digest_hour, drop constraint app_users_alert_email,
    drop column alert_last_digest_at, drop column alert_kinds, drop column alert_digest_hour, drop column alert_email`);
}
