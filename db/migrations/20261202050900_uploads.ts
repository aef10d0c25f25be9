import type { Knex } from "knex";

// Files people sent (price lists, delivery notes). The bytes live on disk under the state folder,
// named by their SHA-256 (lib/uploads/storage.ts); a row says which company sent which file for
// what. The same bytes sent again for the same purpose are the same row: (company, kind, sha256)
// is unique, which is how a price list or delivery note sent twice is recognised.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("uploads", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("company_id").notNullable().references("companies.id").onDelete("CASCADE");
    t.text("kind").notNullable(); // price_list | delivery_note (lib/uploads/kinds.ts)
    t.text("sha256").notNullable();
    t.bigInteger("size").notNullable();
    t.text("filename").notNullable(); // as the sender named it
    t.text("media_type").notNullable(); // from the bytes, not from the client
    t.uuid("created_by").references("app_users.id").onDelete("SET NULL");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(["company_id", "kind", "sha256"]);
    t.unique(["company_id", "id"]); // for composite foreign keys from price lists and deliveries
  });
  await knex.raw(`alter table uploads
    add constraint uploads_kind check (kind in ('price_list','delivery_note')),
    add constraint uploads_sha256 check (sha256 ~ '^[0-9a-f]{64}$'),
    add constraint uploads_size check (size >= 0),
    add constraint uploads_filename check (filename <> '' and length(filename) <= 255)`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("uploads");
}
