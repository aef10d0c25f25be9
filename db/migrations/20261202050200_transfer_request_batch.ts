import type { Knex } from "knex";

// A transfer request asked from a batch's shortage names the batch. While one is open for a batch
// and item, another cannot be opened (the unique index also holds under two requests at once).
// A batch is never deleted; if one were, its requests would stay, without the batch (PostgreSQL 15
// column list on SET NULL, so company_id stays).
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`alter table transfer_requests
    add column batch_id uuid,
    add constraint transfer_requests_batch foreign key (company_id, batch_id) references batches (company_id, id) on delete set null (batch_id)`);
  await knex.raw(`create unique index transfer_requests_open_per_batch_item on transfer_requests (batch_id, item_id)
    where status = 'open' and batch_id is not null`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw("drop index transfer_requests_open_per_batch_item");
  await knex.raw(`alter table transfer_requests
    drop constraint transfer_requests_batch,
    drop column batch_id`);
}
