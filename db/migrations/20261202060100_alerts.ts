import type { Knex } from "knex";

// Alerts raised by the scans in jobs/ (expiry now; reorder and shortage later). An alert is stored
// once per (company, kind, kitchen, subject, threshold, episode): a scan run twice inserts nothing new
// (ON CONFLICT DO NOTHING). `episode` is for kinds that clear and come back (a shortage that is
// solved and returns is a new episode); expiry alerts keep episode 0.
// alert_states holds each user's own acknowledgement and snooze. job_runs records the last run of
// each company's scan, so the worker can run at once what a missed schedule skipped.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("alerts", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("company_id").notNullable().references("companies.id").onDelete("CASCADE");
    t.uuid("kitchen_id").notNullable();
    t.text("kind").notNullable();
    t.text("subject_type").notNullable();
    t.uuid("subject_id").notNullable();
    t.integer("threshold_days").notNullable();
    t.integer("episode").notNullable().defaultTo(0);
    t.text("title").notNullable();
    t.text("detail").notNullable();
    t.jsonb("data").notNullable().defaultTo("{}");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.foreign(["company_id", "kitchen_id"]).references(["company_id", "id"]).inTable("kitchens").onDelete("CASCADE");
    // per kitchen too: a lot split between kitchens is stock to act on in each of them
    t.unique(["company_id", "kind", "kitchen_id", "subject_id", "threshold_days", "episode"]);
    t.index(["company_id", "created_at"]);
  });
  await knex.raw(`alter table alerts
    add constraint alerts_kind check (kind in ('expiry','reorder','shortage')),
    add constraint alerts_subject_type check (subject_type in ('lot','item','batch'))`);

  await knex.schema.createTable("alert_states", (t) => {
    t.uuid("alert_id").notNullable().references("alerts.id").onDelete("CASCADE");
    t.uuid("user_id").notNullable().references("app_users.id").onDelete("CASCADE");
    t.timestamp("acknowledged_at", { useTz: true });
    t.timestamp("snoozed_until", { useTz: true });
    t.primary(["alert_id", "user_id"]);
  });

  await knex.raw(`alter table companies
    add column expiry_windows jsonb not null default '{"cure":[60,30,7],"casing":[30,7],"spice":[90,30]}'::jsonb`);

  await knex.schema.createTable("job_runs", (t) => {
    t.uuid("company_id").notNullable().references("companies.id").onDelete("CASCADE");
    t.text("job").notNullable();
    t.timestamp("last_run_at", { useTz: true }).notNullable();
    t.jsonb("last_result").notNullable().defaultTo("{}");
    t.primary(["company_id", "job"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("job_runs");
  await knex.raw(`alter table companies drop column expiry_windows`);
  await knex.schema.dropTable("alert_states");
  await knex.schema.dropTable("alerts");
}
