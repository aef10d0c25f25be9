// Recipes and their versions. A version is written once (a database trigger refuses changes); a
// change is a new version, and a batch keeps the version it was planned with. Every write checks
// the lines against the catalogue (each item in the company; rates its stock unit can take) and the
// recipe's cure against the company's table: a recipe over a statutory maximum is refused.
import "server-only";
import type { Knex } from "knex";
import { db } from "../../db/client";
import type { ItemRow } from "../../db/types";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import { methodOf } from "../cure/method";
import type { CureCalculation, CureMethod, ProductClass, Storage } from "../cure";
import { AppError, conflict, notFound, validation } from "../http/errors";
import { billOfMaterials, BomLineError, checkCure, lineProblem, type BomItem, type BomSpec } from "../recipes/bom";
import { convert, dec, plain, toStored, UnitError, type Dec } from "../units";
import { RATE_UNITS, type RateUnit, type RateUnitInput, type RecipeCreateInput, type RecipeVersionInput } from "../validation/recipes";
import { getCureSettings } from "./companies";
import { loadItemForLedger } from "./items-for-ledger";

const RATE_UNIT_LABEL = Object.fromEntries(Object.entries(RATE_UNITS).map(([k, v]) => [v, k])) as Record<RateUnit, RateUnitInput>;

export interface RecipeLine {
  position: number;
  item: { id: string; sku: string; name: string; category: BomItem["category"]; stockUnit: BomItem["stockUnit"] };
  rate: string;
  unit: RateUnitInput;
  basis: "meat_block" | "pickle";
  /** the line for 1 kg of meat block, in the item's stock unit */
  perKgMeat: { quantity: string; unit: "g" | "ml" };
}

export interface RecipeVersion {
  version: number;
  productClass: ProductClass;
  method: CureMethod;
  storage: Storage;
  meatBlock: { name: string; percent: string }[];
  lines: RecipeLine[];
  pickle: { kgPerKgMeat: string; pumpFraction: string | null } | null;
  casing: {
    item: { id: string; sku: string; name: string; calibreMinMm: string; calibreMaxMm: string } | null;
    calibreMinMm: string | null;
    calibreMaxMm: string | null;
    linkLengthM: string | null;
    linkWeightG: string | null;
  } | null;
  /** filling mass for 1 kg of meat block, grams (what goes into the casing) */
  fillingGramsPerKgMeat: string;
  processNotes: string;
  changeNote: string;
  createdAt: string;
  createdBy: { id: string; name: string } | null;
  /** the cure check on the recipe's exact rates, per the company's table; null without cure */
  cure: CureCalculation | null;
}

export interface Recipe {
  id: string;
  code: string;
  name: string;
  archived: boolean;
  currentVersion: number;
  versions: { version: number; createdAt: string; createdBy: { id: string; name: string } | null; changeNote: string }[];
  /** the version asked for (default: the current one) */
  version: RecipeVersion;
}

export interface RecipeSummary {
  id: string;
  code: string;
  name: string;
  currentVersion: number;
  productClass: ProductClass;
  storage: Storage;
  hasCure: boolean;
  archived: boolean;
}

interface VersionRow {
  id: string; company_id: string; recipe_id: string; version: number; product_class: ProductClass; storage: Storage;
  pickle_kg_per_kg_meat: string | null; pump_fraction: string | null; casing_item_id: string | null;
  casing_calibre_min_mm: string | null; casing_calibre_max_mm: string | null; link_length_m: string | null; link_weight_g: string | null;
  process_notes: string; change_note: string; created_by: string | null; created_at: Date;
}

const trim = (v: string | null) => (v === null ? null : plain(dec(v)));

/** An item row as the bill of materials needs it; a cure brings the salts its label names. */
export const bomItemOf = (row: ItemRow): BomItem => ({
  id: row.id, sku: row.sku, name: row.name, category: row.category, stockUnit: row.stock_unit,
  densityGPerMl: row.density_g_per_ml, nitriteFraction: row.nitrite_fraction, nitrateFraction: row.nitrate_fraction,
  nitriteSalt: row.nitrite_salt ?? undefined, nitrateSalt: row.nitrate_salt ?? undefined,
});

/** Resolves the lines' items and checks each against the catalogue; 422 names the line. */
async function resolveVersion(trx: Knex | Knex.Transaction, actor: CurrentUser, input: RecipeVersionInput) {
  const fields: Record<string, string[]> = {};
  const items: (ItemRow | null)[] = [];
  for (const [i, line] of input.lines.entries()) {
    try {
      const { row } = await loadItemForLedger(trx, actor.companyId, line.item);
      const problem = lineProblem(bomItemOf(row), RATE_UNITS[line.unit]);
      if (row.archived_at) (fields[`lines.${i}.item`] ??= []).push(`${row.name} is archived.`);
      else if (problem) (fields[`lines.${i}.${problem.field}`] ??= []).push(problem.message);
      const usesPickle = input.pickle !== undefined;
      if (row.category === "cure" && usesPickle && line.basis !== "pickle") {
        (fields[`lines.${i}.basis`] ??= []).push("In a pumped or immersion-cured product the cure goes into the pickle: give its rate per kg of pickle.");
      }
      items.push(row);
    } catch (e) {
      if (e instanceof AppError && e.status === 404) {
        (fields[`lines.${i}.item`] ??= []).push("No such item in your company.");
        items.push(null);
      } else throw e;
    }
  }
  const seen = new Map<string, number>();
  items.forEach((row, i) => {
    if (!row) return;
    const key = `${row.id}:${input.lines[i]!.basis}`;
    if (seen.has(key)) (fields[`lines.${i}.item`] ??= []).push(`${row.name} is on line ${seen.get(key)! + 1} already.`);
    else seen.set(key, i);
  });

  let casingItem: ItemRow | null = null;
  if (input.casing?.item) {
    try {
      casingItem = (await loadItemForLedger(trx, actor.companyId, input.casing.item)).row;
      if (casingItem.category !== "casing") (fields["casing.item"] ??= []).push(`${casingItem.name} is not a casing.`);
      const { calibreMinMm: lo, calibreMaxMm: hi } = input.casing;
      if (casingItem.category === "casing" && lo && hi && (dec(casingItem.calibre_min_mm!).lt(lo) || dec(casingItem.calibre_max_mm!).gt(hi))) {
        (fields["casing.item"] ??= []).push(
          `${casingItem.name} (${plain(dec(casingItem.calibre_min_mm!))}-${plain(dec(casingItem.calibre_max_mm!))} mm) is outside the recipe's calibre range ${lo}-${hi} mm.`,
        );
      }
    } catch (e) {
      if (e instanceof AppError && e.status === 404) (fields["casing.item"] ??= []).push("No such item in your company.");
      else throw e;
    }
  }

  let linkLengthM: Dec | null = null;
  let linkWeightG: Dec | null = null;
  try {
    if (input.casing?.linkLength) linkLengthM = convert(input.casing.linkLength.quantity, input.casing.linkLength.unit, "m");
  } catch (e) {
    if (e instanceof UnitError) (fields["casing.linkLength.unit"] ??= []).push(e.message);
    else throw e;
  }
  try {
    if (input.casing?.linkWeight) linkWeightG = convert(input.casing.linkWeight.quantity, input.casing.linkWeight.unit, "g");
  } catch (e) {
    if (e instanceof UnitError) (fields["casing.linkWeight.unit"] ??= []).push(e.message);
    else throw e;
  }
  if (Object.keys(fields).length) throw validation(fields);

  const spec: BomSpec = {
    productClass: input.productClass,
    storage: input.storage,
    pickleKgPerKgMeat: input.pickle?.kgPerKgMeat ?? null,
    pumpFraction: input.pickle?.pumpFraction ?? null,
    lines: input.lines.map((l, i) => ({ position: i + 1, item: bomItemOf(items[i]!), rate: l.rate, rateUnit: RATE_UNITS[l.unit], basis: l.basis })),
  };
  return { spec, casingItem, linkLengthM, linkWeightG };
}

/** The recipe's cure check at its exact rates; over a statutory maximum: 422 naming the cure lines. */
async function checkRecipeCure(actor: CurrentUser, spec: BomSpec): Promise<CureCalculation | null> {
  const settings = await getCureSettings(actor);
  let bom;
  try {
    bom = billOfMaterials(spec, dec("1000"));
  } catch (e) {
    if (e instanceof BomLineError) throw validation({ [`lines.${e.position - 1}.${e.field}`]: [e.message] });
    throw e;
  }
  const check = checkCure(spec, bom, { table: settings.regulatoryTable, scaleResolutionG: settings.scaleResolutionG });
  if (check?.blocked) {
    const over = check.checks.filter((c) => !c.within && c.severity === "block").map((c) => `${c.substance} ${c.ppm} ppm is over the ${c.limitPpm} ppm maximum of ${c.entry}`);
    const fields: Record<string, string[]> = {};
    spec.lines.forEach((l) => {
      if (l.item.category === "cure") fields[`lines.${l.position - 1}.rate`] = [`${over.join("; ")}. Lower the cure.`];
    });
    throw new AppError(422, "VALIDATION", "The cure is over a statutory maximum: this recipe cannot be saved.", { fields, cure: check });
  }
  return check;
}

async function insertVersion(trx: Knex.Transaction, actor: CurrentUser, recipeId: string, version: number, input: RecipeVersionInput) {
  const { spec, casingItem, linkLengthM, linkWeightG } = await resolveVersion(trx, actor, input);
  await checkRecipeCure(actor, spec);
  const [row] = await trx("recipe_versions")
    .insert({
      company_id: actor.companyId, recipe_id: recipeId, version, product_class: input.productClass, storage: input.storage,
      pickle_kg_per_kg_meat: input.pickle?.kgPerKgMeat ?? null, pump_fraction: input.pickle?.pumpFraction ?? null,
      casing_item_id: casingItem?.id ?? null, casing_calibre_min_mm: input.casing?.calibreMinMm ?? null, casing_calibre_max_mm: input.casing?.calibreMaxMm ?? null,
      link_length_m: linkLengthM ? toStored(linkLengthM) : null, link_weight_g: linkWeightG ? toStored(linkWeightG) : null,
      process_notes: input.processNotes, change_note: input.changeNote, created_by: actor.id,
    })
    .returning<{ id: string }[]>("id");
  await trx("recipe_meat_components").insert(input.meatBlock.map((c, i) => ({ recipe_version_id: row!.id, position: i + 1, name: c.name, percent: c.percent })));
  if (input.lines.length) {
    await trx("recipe_lines").insert(
      spec.lines.map((l) => ({ company_id: actor.companyId, recipe_version_id: row!.id, position: l.position, item_id: l.item.id, rate: l.rate, rate_unit: l.rateUnit, basis: l.basis })),
    );
  }
}

export async function createRecipe(actor: CurrentUser, input: RecipeCreateInput): Promise<Recipe> {
  assertCan(actor, "recipes.manage");
  const id = await db().transaction(async (trx) => {
    const taken = await trx("recipes").where({ company_id: actor.companyId, code: input.code }).first("id");
    if (taken) throw validation({ code: [`Another recipe already has the code ${input.code}.`] });
    const [r] = await trx("recipes").insert({ company_id: actor.companyId, code: input.code, name: input.name, current_version: 1 }).returning<{ id: string }[]>("id");
    await insertVersion(trx, actor, r!.id, 1, input);
    return r!.id;
  });
  return getRecipe(actor, id);
}

/** A new version of a recipe (which becomes its current version); the older ones stay as they were. */
export async function addRecipeVersion(actor: CurrentUser, recipeRef: string, input: RecipeVersionInput): Promise<Recipe> {
  assertCan(actor, "recipes.manage");
  const id = await db().transaction(async (trx) => {
    const recipe = await findRecipe(trx, actor, recipeRef, true);
    if (recipe.archived_at) throw conflict(`${recipe.name} is archived.`);
    const next = recipe.current_version + 1;
    await insertVersion(trx, actor, recipe.id, next, input);
    await trx("recipes").where({ id: recipe.id }).update({ current_version: next, name: input.name, updated_at: trx.fn.now() });
    return recipe.id;
  });
  return getRecipe(actor, id);
}

interface RecipeRow { id: string; code: string; name: string; current_version: number; archived_at: Date | null }

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

async function findRecipe(trx: Knex | Knex.Transaction, actor: CurrentUser, ref: string, forUpdate = false): Promise<RecipeRow> {
  const q = trx("recipes").where({ company_id: actor.companyId });
  if (UUID.test(ref)) q.where({ id: ref });
  else q.where({ code: ref.toUpperCase() });
  if (forUpdate) q.forUpdate();
  const row: RecipeRow | undefined = await q.first("id", "code", "name", "current_version", "archived_at");
  if (!row) throw notFound("Recipe");
  return row;
}

/** A version as the planning code needs it: the spec for billOfMaterials, and the casing. */
export async function loadVersionSpec(trx: Knex | Knex.Transaction, companyId: string, versionId: string) {
  const v: VersionRow | undefined = await trx("recipe_versions").where({ company_id: companyId, id: versionId }).first();
  if (!v) throw notFound("Recipe version");
  const lines: (ItemRow & { position: number; rate: string; rate_unit: RateUnit; basis: "meat_block" | "pickle"; item_id: string })[] = await trx("recipe_lines as l")
    .join("items as i", "i.id", "l.item_id")
    .where("l.recipe_version_id", versionId)
    .orderBy("l.position")
    .select("i.*", "l.position", "l.rate", "l.rate_unit", "l.basis", "l.item_id");
  const spec: BomSpec = {
    productClass: v.product_class, storage: v.storage, pickleKgPerKgMeat: v.pickle_kg_per_kg_meat, pumpFraction: v.pump_fraction,
    lines: lines.map((l) => ({ position: l.position, item: bomItemOf({ ...l, id: l.item_id }), rate: l.rate, rateUnit: l.rate_unit, basis: l.basis })),
  };
  return { version: v, spec };
}

export async function getRecipe(actor: CurrentUser, ref: string, versionNumber?: number): Promise<Recipe> {
  assertCan(actor, "planning.read");
  const k = db();
  const recipe = await findRecipe(k, actor, ref);
  const versions: (VersionRow & { user_name: string | null })[] = await k("recipe_versions as v")
    .leftJoin("app_users as u", "u.id", "v.created_by")
    .where({ "v.recipe_id": recipe.id })
    .orderBy("v.version")
    .select("v.*", "u.name as user_name");
  const wanted = versionNumber ?? recipe.current_version;
  const row = versions.find((v) => v.version === wanted);
  if (!row) throw notFound("Recipe version");
  const { spec } = await loadVersionSpec(k, actor.companyId, row.id);
  const meat: { name: string; percent: string }[] = await k("recipe_meat_components").where({ recipe_version_id: row.id }).orderBy("position").select("name", "percent");
  const bom = billOfMaterials(spec, dec("1000"));
  const settings = await getCureSettings(actor);
  const casingItem: ItemRow | undefined = row.casing_item_id ? await k("items").where({ id: row.casing_item_id }).first() : undefined;
  const by = (v: { created_by: string | null; user_name: string | null }) => (v.created_by ? { id: v.created_by, name: v.user_name ?? "Former user" } : null);
  return {
    id: recipe.id,
    code: recipe.code,
    name: recipe.name,
    archived: recipe.archived_at !== null,
    currentVersion: recipe.current_version,
    versions: versions.map((v) => ({ version: v.version, createdAt: v.created_at.toISOString(), createdBy: by(v), changeNote: v.change_note })),
    version: {
      version: row.version,
      productClass: row.product_class,
      method: methodOf(row.product_class),
      storage: row.storage,
      meatBlock: meat.map((m) => ({ name: m.name, percent: plain(dec(m.percent)) })),
      lines: spec.lines.map((l, i) => ({
        position: l.position,
        item: { id: l.item.id, sku: l.item.sku, name: l.item.name, category: l.item.category, stockUnit: l.item.stockUnit },
        rate: plain(dec(l.rate)),
        unit: RATE_UNIT_LABEL[l.rateUnit],
        basis: l.basis,
        perKgMeat: { quantity: plain(bom.lines[i]!.quantity.toDecimalPlaces(6)), unit: bom.lines[i]!.unit },
      })),
      pickle: row.pickle_kg_per_kg_meat ? { kgPerKgMeat: trim(row.pickle_kg_per_kg_meat)!, pumpFraction: trim(row.pump_fraction) } : null,
      casing:
        casingItem || row.casing_calibre_min_mm
          ? {
              item: casingItem
                ? { id: casingItem.id, sku: casingItem.sku, name: casingItem.name, calibreMinMm: plain(dec(casingItem.calibre_min_mm!)), calibreMaxMm: plain(dec(casingItem.calibre_max_mm!)) }
                : null,
              calibreMinMm: trim(row.casing_calibre_min_mm),
              calibreMaxMm: trim(row.casing_calibre_max_mm),
              linkLengthM: trim(row.link_length_m),
              linkWeightG: trim(row.link_weight_g),
            }
          : null,
      fillingGramsPerKgMeat: plain(bom.fillingGrams.toDecimalPlaces(6)),
      processNotes: row.process_notes,
      changeNote: row.change_note,
      createdAt: row.created_at.toISOString(),
      createdBy: by(row),
      cure: checkCure(spec, bom, { table: settings.regulatoryTable, scaleResolutionG: settings.scaleResolutionG }),
    },
  };
}

export async function listRecipes(actor: CurrentUser, opts: { includeArchived?: boolean } = {}): Promise<RecipeSummary[]> {
  assertCan(actor, "planning.read");
  const q = db()("recipes as r")
    .join("recipe_versions as v", (j) => j.on("v.recipe_id", "r.id").andOn("v.version", "r.current_version"))
    .where("r.company_id", actor.companyId)
    .orderBy("r.name")
    .select(
      "r.id", "r.code", "r.name", "r.current_version", "r.archived_at", "v.product_class", "v.storage",
      db().raw(`exists (select 1 from recipe_lines l join items i on i.id = l.item_id where l.recipe_version_id = v.id and i.category = 'cure') as has_cure`),
    );
  if (!opts.includeArchived) q.whereNull("r.archived_at");
  const rows: { id: string; code: string; name: string; current_version: number; archived_at: Date | null; product_class: ProductClass; storage: Storage; has_cure: boolean }[] = await q;
  return rows.map((r) => ({
    id: r.id, code: r.code, name: r.name, currentVersion: r.current_version, productClass: r.product_class, storage: r.storage, hasCure: r.has_cure, archived: r.archived_at !== null,
  }));
}
