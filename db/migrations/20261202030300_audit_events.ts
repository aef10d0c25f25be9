import type { Knex } from "knex";

// Decisions that need a name and a reason on record: a manager releasing a batch held over a cure
// limit, an override of a house limit, reopening a closed period. Append-only, like the ledger.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("audit_events", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("company_id").notNullable().references("companies.id").onDelete("CASCADE");
    t.uuid("actor_id").references("app_users.id").onDelete("SET NULL");
    t.text("action").notNullable(); // e.g. batch.hold_released
    t.text("subject_type").notNullable(); // e.g. batch
    t.uuid("subject_id").notNullable();
    t.text("reason").notNullable();
    t.jsonb("details");
    t.timestamp("at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(["company_id", "subject_type", "subject_id"]);
  });
  await knex.raw(`alter table audit_events add constraint audit_events_reason check (reason <> '')`);
  await knex.raw(`create function audit_events_append_only() returns trigger language plpgsql as $$
    begin raise exception 'audit events are append-only'; end $$`);
  await knex.raw(`create trigger audit_events_no_update before update or delete on audit_events
    for each row when (pg_trigger_depth() = 0) execute function audit_events_append_only()`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("audit_events");
  await knex.raw("drop function if exists audit_events_append_only()");
}
