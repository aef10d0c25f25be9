import type { Knex } from "knex";

// What the cure calculator needs from the company: the regulatory table its checks use (us, eu or
// none; 'us' for existing companies, the demo company included) and the kitchen scale's
// resolution in grams, to which a cure quantity is rounded toward compliance (default 0.1 g).
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`alter table companies
    add column regulatory_table text not null default 'us',
    add column scale_resolution_g numeric(10,4) not null default 0.1,
    add constraint companies_regulatory_table check (regulatory_table in ('us','eu','none')),
    add constraint companies_scale_resolution check (scale_resolution_g > 0 and scale_resolution_g <= 100)`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`alter table companies
    drop constraint companies_scale_resolution,
    drop constraint companies_regulatory_table,
    drop column scale_resolution_g,
    drop column regulatory_table`);
}
