import type { Knex } from "knex";

// The company's cost formula under IAS 2 (para. 25): FIFO cost layers in receipt order (the
// default) or the moving weighted average, kept per kitchen (lib/costing/engine.ts).
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`alter table companies
    add column cost_formula text not null default 'fifo',
    add constraint companies_cost_formula check (cost_formula in ('fifo','average'))`);
  // the reports read every movement of an item in time order
  await knex.raw(`create index if not exists stock_movements_costing on stock_movements (company_id, item_id, occurred_at, recorded_at)`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`drop index if exists stock_movements_costing`);
  await knex.raw(`alter table companies drop constraint companies_cost_formula, drop column cost_formula`);
}
