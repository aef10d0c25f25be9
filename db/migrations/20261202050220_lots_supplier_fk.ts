import type { Knex } from "knex";

// lots.supplier_id was kept without a foreign key until suppliers existed. Now it points at the
// supplier of the lot's own company (composite key, so a lot cannot name another company's
// supplier); null when the receipt named no known supplier (supplier_name keeps what was typed).
// Ids that name no supplier (there can be none: nothing wrote the column) are cleared first.
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`update lots l set supplier_id = null
    where supplier_id is not null and not exists (select 1 from suppliers s where s.company_id = l.company_id and s.id = l.supplier_id)`);
  await knex.raw(`alter table lots add constraint lots_supplier_fk
    foreign key (company_id, supplier_id) references suppliers (company_id, id)`);
  await knex.raw(`create index lots_supplier on lots (company_id, supplier_id) where supplier_id is not null`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw("drop index lots_supplier");
  await knex.raw("alter table lots drop constraint lots_supplier_fk");
}
