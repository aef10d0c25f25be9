import type { Knex } from "knex";

// A kitchen asks another for stock; that kitchen's lead or a manager fulfils it (posting the
// transfer in the same transaction) or declines it with a reason.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("transfer_requests", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("company_id").notNullable();
    t.uuid("from_kitchen_id").notNullable(); // asked to send
    t.uuid("to_kitchen_id").notNullable(); // asking
    t.uuid("item_id").notNullable();
    t.decimal("quantity", 30, 12).notNullable(); // stock unit
    t.text("entered_quantity").notNullable();
    t.text("entered_unit").notNullable();
    t.text("note");
    t.text("status").notNullable().defaultTo("open");
    t.uuid("requested_by").references("app_users.id").onDelete("SET NULL");
    t.timestamp("requested_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.uuid("decided_by").references("app_users.id").onDelete("SET NULL");
    t.timestamp("decided_at", { useTz: true });
    t.text("decline_reason");
    t.uuid("posting_id"); // the transfer's movements
    t.foreign(["company_id", "from_kitchen_id"]).references(["company_id", "id"]).inTable("kitchens");
    t.foreign(["company_id", "to_kitchen_id"]).references(["company_id", "id"]).inTable("kitchens");
    t.foreign(["company_id", "item_id"]).references(["company_id", "id"]).inTable("items");
    t.index(["company_id", "status"]);
  });
  await knex.raw(`alter table transfer_requests
    add constraint transfer_requests_status check (status in ('open','fulfilled','declined','cancelled')),
    add constraint transfer_requests_kitchens check (from_kitchen_id <> to_kitchen_id),
    add constraint transfer_requests_quantity check (quantity > 0),
    add constraint transfer_requests_declined check (status <> 'declined' or coalesce(decline_reason, '') <> '')`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("transfer_requests");
}
