import type { Knex } from "knex";

// The day the company's planning week starts on (the week planner, its ?week= and prev/next).
// Monday for existing companies (ISO 8601, the default); a company may choose Sunday or
// Saturday instead.
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`alter table companies
    add column week_start text not null default 'monday',
    add constraint companies_week_start check (week_start in ('monday','sunday','saturday'))`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`alter table companies
    drop constraint companies_week_start,
    drop column week_start`);
}
