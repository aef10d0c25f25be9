import type { Knex } from "knex";

// The accountant's account mapping (issue 7): which ledger account code the movement journal
// (lib/data/journal.ts) books each side to. kind 'inventory': one stock account per item category
// (key casing | cure | spice | ingredient). kind 'movement': the other side of a movement (key
// receipt: the goods-received clearing account; use and waste: expense accounts; loss and gain:
// count and adjustment differences, and cost differences the formula leaves). Transfers need none:
// the value stays in the same inventory account. A key with no row is simply unmapped (the journal
// says so); the whole mapping is replaced at once (PUT /api/reports/accounts).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("account_mappings", (t) => {
    t.uuid("company_id").notNullable().references("companies.id").onDelete("CASCADE");
    t.text("kind").notNullable();
    t.text("key").notNullable();
    t.text("account_code").notNullable();
    t.text("name");
    t.timestamp("updated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.uuid("updated_by").references("app_users.id").onDelete("SET NULL");
    t.primary(["company_id", "kind", "key"]);
  });
  await knex.raw(`alter table account_mappings
    add constraint account_mappings_key check (
      (kind = 'inventory' and key in ('casing','cure','spice','ingredient'))
      or (kind = 'movement' and key in ('receipt','use','waste','loss','gain'))),
    add constraint account_mappings_code check (account_code ~ '^[A-Za-z0-9][A-Za-z0-9.-]{0,19}$'),
    add constraint account_mappings_name check (name is null or char_length(name) between 1 and 100)`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("account_mappings");
}
