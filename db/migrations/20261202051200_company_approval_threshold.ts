import type { Knex } from "knex";

// The order value up to which a buyer may approve a purchase order alone; above it a manager (or
// an admin) approves. In the company's one currency, major units, NUMERIC(20,4) like every other
// amount of money kept in major units; 500 for every company until an admin changes it.
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`alter table companies
    add column approval_threshold numeric(20,4) not null default 500,
    add constraint companies_approval_threshold check (approval_threshold >= 0)`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`alter table companies
    drop constraint companies_approval_threshold,
    drop column approval_threshold`);
}
