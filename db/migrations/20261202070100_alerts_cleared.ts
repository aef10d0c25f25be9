import type { Knex } from "knex";

// Alerts that clear: a reorder or shortage alert is open while its condition holds; the scan that
// finds it no longer holding sets `cleared_at`. When it comes back, the scan opens a new alert (the
// next `episode` for that subject). Expiry alerts are never cleared by the scans.
// At most one OPEN alert per (company, kind, kitchen, subject) for reorder and shortage: two scans
// running at once both try to open one and the second insert hits this index (ON CONFLICT DO NOTHING).
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`alter table alerts add column cleared_at timestamptz null`);
  await knex.raw(`create unique index alerts_one_open on alerts (company_id, kind, kitchen_id, subject_id)
    where cleared_at is null and kind in ('reorder', 'shortage')`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`drop index alerts_one_open`);
  await knex.raw(`alter table alerts drop column cleared_at`);
}
