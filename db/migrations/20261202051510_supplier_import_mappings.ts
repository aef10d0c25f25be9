import type { Knex } from "knex";

// The column mapping a person set for a supplier's files, remembered so the next file of the same
// layout reads without asking: which column holds each field, the decimal and thousands separators,
// the date format and the header row (CsvMapping, lib/validation/imports.ts). One per supplier and
// kind of file: 'price_list' now, 'delivery_note' when deliveries import CSV. Saved when a price
// list is applied with it.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("supplier_import_mappings", (t) => {
    t.uuid("company_id").notNullable().references("companies.id").onDelete("CASCADE");
    t.uuid("supplier_id").notNullable();
    t.text("kind").notNullable();
    t.jsonb("mapping").notNullable();
    t.uuid("updated_by").references("app_users.id").onDelete("SET NULL");
    t.timestamp("updated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(["company_id", "supplier_id", "kind"]);
    t.foreign(["company_id", "supplier_id"]).references(["company_id", "id"]).inTable("suppliers").onDelete("CASCADE");
  });
  await knex.raw(`alter table supplier_import_mappings add constraint supplier_import_mappings_kind check (kind in ('price_list','delivery_note'))`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("supplier_import_mappings");
}
