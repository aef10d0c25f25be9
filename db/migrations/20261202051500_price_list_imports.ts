import type { Knex } from "knex";

// Supplier price lists applied from CSV (lib/data/price-lists.ts). One row per file applied for a
// supplier: which upload (the bytes, by SHA-256), the column mapping it was read with, the date
// the prices took effect unless a row gave its own, who applied it, and what it did (counts, the
// first warnings). A preview (dryRun) writes no row here: only the upload is recorded.
//
// (company_id, supplier_id, upload_id) is unique: the same file applied twice for the same supplier
// is recognised and posts nothing the second time (uploads are unique per company, kind and
// SHA-256, so the same bytes are the same upload_id).
//
// supplier_item_prices gains the foreign key its price_list_import_id was waiting for, and
// listed_description: the product's description as the list wrote it (text, kept exactly as sent,
// never evaluated; exports neutralise formula-like text, lib/csv.ts).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("price_list_imports", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("company_id").notNullable().references("companies.id").onDelete("CASCADE");
    t.uuid("supplier_id").notNullable();
    t.uuid("upload_id").notNullable();
    t.jsonb("mapping").notNullable(); // CsvMapping (lib/validation/imports.ts) as used
    t.date("effective_from").notNullable(); // for rows without a date of their own
    t.integer("rows").notNullable(); // data rows read
    t.integer("priced").notNullable(); // rows that set a price
    t.integer("raised").notNullable();
    t.integer("lowered").notNullable();
    t.integer("unchanged").notNullable();
    t.integer("first_prices").notNullable(); // supplier items with no earlier price
    t.integer("skipped").notNullable(); // unknown SKUs
    t.integer("warning_count").notNullable();
    t.jsonb("warnings").notNullable().defaultTo("[]"); // the first 100 [{row, column, field?, message}]
    t.uuid("applied_by").references("app_users.id").onDelete("SET NULL");
    t.timestamp("applied_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.foreign(["company_id", "supplier_id"]).references(["company_id", "id"]).inTable("suppliers").onDelete("CASCADE");
    t.foreign(["company_id", "upload_id"]).references(["company_id", "id"]).inTable("uploads");
    t.unique(["company_id", "id"]);
    t.unique(["company_id", "supplier_id", "upload_id"]);
  });
  await knex.raw(`alter table price_list_imports
    add constraint price_list_imports_counts check (
      rows >= 0 and priced >= 0 and raised >= 0 and lowered >= 0 and unchanged >= 0 and first_prices >= 0 and skipped >= 0 and warning_count >= 0
      and raised + lowered + unchanged + first_prices = priced)`);
  await knex.raw(`create index price_list_imports_supplier on price_list_imports (company_id, supplier_id, applied_at desc)`);

  await knex.schema.alterTable("supplier_item_prices", (t) => {
    t.text("listed_description"); // null: keyed in, or the list had no description column
    t.foreign(["company_id", "price_list_import_id"]).references(["company_id", "id"]).inTable("price_list_imports");
  });
  await knex.raw(`alter table supplier_item_prices add constraint supplier_item_prices_listed_description check (length(listed_description) <= 500)`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("supplier_item_prices", (t) => {
    t.dropForeign(["company_id", "price_list_import_id"]);
    t.dropChecks(["supplier_item_prices_listed_description"]);
    t.dropColumn("listed_description");
  });
  await knex.schema.dropTable("price_list_imports");
}
