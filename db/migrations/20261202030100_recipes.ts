import type { Knex } from "knex";

// Recipes, versioned. A recipe is a name and a code; what it says lives in its versions, which are
// never changed once written (a change is a new version), so a produced batch can keep the version
// it used. A version has:
// - the meat block: meat and fat components by percentage of its weight (they add up to 100);
//   the block's green weight is the basis of every rate and of the cure check (FSIS method);
// - lines: the non-meat items (cure, salt, spices, liquids, ...) as a rate per kg of the meat block
//   (g/kg, % or ml/kg) or, for pumped and immersion products, per kg of the pickle;
// - the pickle (pumped or immersion): kg of pickle made per kg of meat, and the pump fraction;
// - the casing: an item, or a calibre range, with a link length or link weight;
// - the product class (which fixes the cure method), refrigerated or shelf stable, process notes.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("recipes", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("company_id").notNullable().references("companies.id").onDelete("CASCADE");
    t.text("code").notNullable(); // short, upper case; starts batch codes
    t.text("name").notNullable();
    t.integer("current_version").notNullable().defaultTo(1);
    t.timestamp("archived_at", { useTz: true });
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("updated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(["company_id", "code"]);
    t.unique(["company_id", "id"]);
  });

  await knex.schema.createTable("recipe_versions", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("company_id").notNullable();
    t.uuid("recipe_id").notNullable();
    t.integer("version").notNullable();
    t.text("product_class").notNullable();
    t.text("storage").notNullable();
    t.decimal("pickle_kg_per_kg_meat", 20, 12); // pumped / immersion: pickle made per kg of meat
    t.decimal("pump_fraction", 20, 12); // pumped: pickle pumped in, as a fraction of green weight
    t.uuid("casing_item_id");
    t.decimal("casing_calibre_min_mm", 8, 2);
    t.decimal("casing_calibre_max_mm", 8, 2);
    t.decimal("link_length_m", 30, 12);
    t.decimal("link_weight_g", 30, 12);
    t.text("process_notes").notNullable().defaultTo("");
    t.text("change_note").notNullable().defaultTo("");
    t.uuid("created_by").references("app_users.id").onDelete("SET NULL");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.foreign(["company_id", "recipe_id"]).references(["company_id", "id"]).inTable("recipes").onDelete("CASCADE");
    t.foreign(["company_id", "casing_item_id"]).references(["company_id", "id"]).inTable("items");
    t.unique(["recipe_id", "version"]);
    t.unique(["company_id", "id"]);
  });
  await knex.raw(`alter table recipe_versions
    add constraint recipe_versions_class check (product_class in ('comminuted','dry_cured','immersion_cured','pumped','bacon_pumped','bacon_immersion','bacon_dry')),
    add constraint recipe_versions_storage check (storage in ('keep_refrigerated','shelf_stable')),
    add constraint recipe_versions_pickle check (pickle_kg_per_kg_meat is null or pickle_kg_per_kg_meat > 0),
    add constraint recipe_versions_pump check (pump_fraction is null or (pump_fraction > 0 and pump_fraction <= 1)),
    add constraint recipe_versions_calibre check ((casing_calibre_min_mm is null) = (casing_calibre_max_mm is null)
      and (casing_calibre_min_mm is null or (casing_calibre_min_mm > 0 and casing_calibre_max_mm >= casing_calibre_min_mm))),
    add constraint recipe_versions_link check (not (link_length_m is not null and link_weight_g is not null)
      and coalesce(link_length_m, 1) > 0 and coalesce(link_weight_g, 1) > 0)`);

  await knex.schema.createTable("recipe_meat_components", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("recipe_version_id").notNullable().references("recipe_versions.id").onDelete("CASCADE");
    t.integer("position").notNullable();
    t.text("name").notNullable(); // e.g. "pork shoulder, lean", "back fat"
    t.decimal("percent", 9, 6).notNullable();
    t.unique(["recipe_version_id", "position"]);
  });
  await knex.raw(`alter table recipe_meat_components add constraint recipe_meat_components_percent check (percent > 0 and percent <= 100)`);

  await knex.schema.createTable("recipe_lines", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("company_id").notNullable();
    t.uuid("recipe_version_id").notNullable().references("recipe_versions.id").onDelete("CASCADE");
    t.integer("position").notNullable();
    t.uuid("item_id").notNullable();
    t.decimal("rate", 30, 12).notNullable();
    t.text("rate_unit").notNullable(); // g_per_kg | percent | ml_per_kg
    t.text("basis").notNullable().defaultTo("meat_block"); // meat_block | pickle
    t.foreign(["company_id", "item_id"]).references(["company_id", "id"]).inTable("items");
    t.unique(["recipe_version_id", "position"]);
  });
  await knex.raw(`alter table recipe_lines
    add constraint recipe_lines_rate check (rate > 0),
    add constraint recipe_lines_rate_unit check (rate_unit in ('g_per_kg','percent','ml_per_kg')),
    add constraint recipe_lines_basis check (basis in ('meat_block','pickle'))`);

  // versions are written once: a change is a new version
  await knex.raw(`create function recipe_versions_immutable() returns trigger language plpgsql as $$
    begin raise exception 'recipe versions are never changed; write a new version'; end $$`);
  for (const table of ["recipe_versions", "recipe_meat_components", "recipe_lines"]) {
    await knex.raw(`create trigger ${table}_no_update before update on ${table} for each row execute function recipe_versions_immutable()`);
  }
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("recipe_lines");
  await knex.schema.dropTable("recipe_meat_components");
  await knex.schema.dropTable("recipe_versions");
  await knex.raw("drop function if exists recipe_versions_immutable()");
  await knex.schema.dropTable("recipes");
}
