// The catalogue: casings, cures, spices and other ingredients of the actor's company, with their
// purchase packs. Reads need stock.read, writes items.manage. Every rule about an item's shape and
// defaults lives in lib/validation/items.ts (resolveItem), so forms, routes and this module agree;
// the CHECKs of the items table hold the same shape in the database.
import "server-only";
import type { Knex } from "knex";
import { db } from "../../db/client";
import type { ItemCategory, ItemPackRow, ItemRow, StockUnit } from "../../db/types";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import type { Salt } from "../cure/limits";
import { conflict, notFound, validation } from "../http/errors";
import { plain, type ItemUnits } from "../units";
import { reconvertSupplierPacks } from "./supplier-packs";
import {
  isUuid, mergeItemPatch, resolveItem, type ItemDraft, type ItemPatch, type ResolvedCasing, type ResolvedItem,
} from "../validation/items";

export type CasingAttributes = ResolvedCasing;

export interface CureAttributes {
  /** fraction of the cure's mass, from the label: 6.25 % is "0.0625" */
  nitriteFraction: string;
  nitrateFraction: string;
  /** the salt of each, from the label: potassium nitrite counts differently (lib/cure) */
  nitriteSalt: Salt;
  nitrateSalt: Salt;
}

export interface ItemPack {
  name: string;
  /** the size as entered, in `unit` */
  quantity: string;
  unit: string;
  /** the same size in the item's stock unit */
  stockQuantity: string;
}

/** An item as callers see it. Decimals are plain strings without trailing zeros. */
export interface Item {
  id: string;
  sku: string;
  name: string;
  category: ItemCategory;
  stockUnit: StockUnit;
  trackLots: boolean;
  trackDates: boolean;
  archived: boolean;
  /** casings only */
  casing: CasingAttributes | null;
  /** cures only: the marker that this item is a curing salt, with its strength */
  cure: CureAttributes | null;
  /** spices and ingredients: ground, whole, flakes, liquid, culture... */
  form: string | null;
  /** spices and ingredients: grams per millilitre, for recipes given by volume */
  densityGPerMl: string | null;
  packs: ItemPack[];
  /** what lib/units needs to convert this item's quantities */
  itemUnits: ItemUnits;
  createdAt: string;
  updatedAt: string;
}

const p = (v: string | null): string | null => (v === null ? null : plain(v));

type UnitsRow = Pick<ItemRow, "stock_unit" | "put_up" | "put_up_metres" | "density_g_per_ml">;
type UnitsPackRow = Pick<ItemPackRow, "name" | "quantity" | "unit">;

/**
 * The ItemUnits of a stored item for lib/units (toStockUnits and friends): its stock unit, its
 * put-up (one pc = one put-up of `metres`), its density and its packs as entered.
 */
export function itemUnitsOf(row: UnitsRow, packs: readonly UnitsPackRow[]): ItemUnits {
  return {
    stockUnit: row.stock_unit,
    putUp: row.put_up && row.put_up_metres !== null ? { name: row.put_up, metres: plain(row.put_up_metres) } : null,
    densityGPerMl: p(row.density_g_per_ml),
    packs: packs.map((k) => ({ name: k.name, quantity: plain(k.quantity), unit: k.unit })),
  };
}

function toItem(row: ItemRow, packRows: readonly ItemPackRow[]): Item {
  return {
    id: row.id,
    sku: row.sku,
    name: row.name,
    category: row.category,
    stockUnit: row.stock_unit,
    trackLots: row.track_lots,
    trackDates: row.track_dates,
    archived: row.archived_at !== null,
    casing:
      row.category === "casing" && row.casing_kind && row.calibre_min_mm !== null && row.calibre_max_mm !== null
        ? {
            kind: row.casing_kind,
            calibreMinMm: plain(row.calibre_min_mm),
            calibreMaxMm: plain(row.calibre_max_mm),
            putUp: row.put_up,
            putUpMetres: p(row.put_up_metres),
            capacityKgPerPutUp: p(row.capacity_kg_per_put_up),
            storage: row.storage ?? "dry",
          }
        : null,
    cure:
      row.category === "cure" && row.nitrite_fraction !== null && row.nitrate_fraction !== null
        ? {
            nitriteFraction: plain(row.nitrite_fraction),
            nitrateFraction: plain(row.nitrate_fraction),
            // the items_cure_salts CHECK keeps both set on a cure
            nitriteSalt: row.nitrite_salt ?? "sodium",
            nitrateSalt: row.nitrate_salt ?? "sodium",
          }
        : null,
    form: row.form,
    densityGPerMl: p(row.density_g_per_ml),
    packs: packRows.map((k) => ({ name: k.name, quantity: plain(k.quantity), unit: k.unit, stockQuantity: plain(k.stock_quantity) })),
    itemUnits: itemUnitsOf(row, packRows),
    createdAt: row.created_at.toISOString(),
    updatedAt: row.updated_at.toISOString(),
  };
}

/** The stored item as the draft a PATCH is merged into. */
function draftOf(item: Item): ItemDraft {
  const d: ItemDraft = {
    sku: item.sku,
    name: item.name,
    category: item.category,
    unit: item.stockUnit,
    trackLots: item.trackLots,
    trackDates: item.trackDates,
    packs: item.packs.map(({ name, quantity, unit }) => ({ name, quantity, unit })),
  };
  if (item.casing) {
    const c = item.casing;
    Object.assign(d, { casingKind: c.kind, calibreMinMm: c.calibreMinMm, calibreMaxMm: c.calibreMaxMm, storage: c.storage });
    if (c.putUp) d.putUp = c.putUp;
    if (c.putUpMetres !== null) d.putUpMetres = c.putUpMetres;
    if (c.capacityKgPerPutUp !== null) d.capacityKgPerPutUp = c.capacityKgPerPutUp;
  }
  if (item.cure) Object.assign(d, item.cure);
  if (item.form !== null) d.form = item.form;
  if (item.densityGPerMl !== null) d.densityGPerMl = item.densityGPerMl;
  return d;
}

/** The columns of a resolved item (everything but id, company and timestamps). */
function columns(r: ResolvedItem): Partial<ItemRow> {
  return {
    sku: r.sku,
    name: r.name,
    category: r.category,
    stock_unit: r.stockUnit,
    track_lots: r.trackLots,
    track_dates: r.trackDates,
    casing_kind: r.casing?.kind ?? null,
    calibre_min_mm: r.casing?.calibreMinMm ?? null,
    calibre_max_mm: r.casing?.calibreMaxMm ?? null,
    put_up: r.casing?.putUp ?? null,
    put_up_metres: r.casing?.putUpMetres ?? null,
    capacity_kg_per_put_up: r.casing?.capacityKgPerPutUp ?? null,
    storage: r.casing?.storage ?? null,
    nitrite_fraction: r.cure?.nitriteFraction ?? null,
    nitrate_fraction: r.cure?.nitrateFraction ?? null,
    nitrite_salt: r.cure?.nitriteSalt ?? null,
    nitrate_salt: r.cure?.nitrateSalt ?? null,
    form: r.form,
    density_g_per_ml: r.densityGPerMl,
  };
}

async function packsOf(trx: Knex | Knex.Transaction, companyId: string, itemIds: readonly string[]): Promise<Map<string, ItemPackRow[]>> {
  const out = new Map<string, ItemPackRow[]>();
  if (itemIds.length === 0) return out;
  const rows: ItemPackRow[] = await trx("item_packs").where({ company_id: companyId }).whereIn("item_id", itemIds).orderBy(["item_id", "name"]);
  for (const r of rows) out.set(r.item_id, [...(out.get(r.item_id) ?? []), r]);
  return out;
}

const CATEGORY_ORDER = "array_position(array['casing','cure','spice','ingredient']::text[], category)";

/** `%`, `_` and `\` typed in a search are matched literally. */
const likePattern = (q: string) => `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

/** The company's items, casings first, then cures, spices and ingredients, each by SKU. */
export async function listItems(
  actor: CurrentUser,
  opts: { category?: ItemCategory; q?: string; includeArchived?: boolean } = {},
): Promise<Item[]> {
  assertCan(actor, "stock.read");
  const query = db()("items").where({ company_id: actor.companyId }).orderByRaw(`${CATEGORY_ORDER}, sku`);
  if (opts.category) query.where({ category: opts.category });
  if (!opts.includeArchived) query.whereNull("archived_at");
  const q = opts.q?.trim();
  if (q) query.where((b) => b.whereILike("sku", likePattern(q)).orWhereILike("name", likePattern(q)));
  const rows: ItemRow[] = await query;
  const packs = await packsOf(db(), actor.companyId, rows.map((r) => r.id));
  return rows.map((r) => toItem(r, packs.get(r.id) ?? []));
}

async function findRow(trx: Knex | Knex.Transaction, companyId: string, idOrSku: string, forUpdate = false): Promise<ItemRow | undefined> {
  const q = trx("items").where({ company_id: companyId }).where(isUuid(idOrSku) ? { id: idOrSku } : { sku: idOrSku.trim() });
  if (forUpdate) q.forUpdate();
  return q.first();
}

/** One item of the actor's company by id (a UUID) or SKU; another company's item is 404. */
export async function getItem(actor: CurrentUser, idOrSku: string): Promise<Item> {
  assertCan(actor, "stock.read");
  const row = await findRow(db(), actor.companyId, idOrSku);
  if (!row) throw notFound("Item");
  const packs = await packsOf(db(), actor.companyId, [row.id]);
  return toItem(row, packs.get(row.id) ?? []);
}

/** The (company_id, sku) unique index refused the row. */
const isSkuViolation = (e: unknown) => {
  const err = e as { code?: string; constraint?: string };
  return err.code === "23505" && (err.constraint ?? "").includes("sku");
};
const skuTaken = (sku: string) => conflict(`An item with SKU ${sku} already exists.`, "CONFLICT", { fields: { sku: ["Already used by another item."] } });

function resolved(draft: ItemDraft): ResolvedItem {
  const r = resolveItem(draft);
  if (!r.ok) throw validation(r.fields);
  return r.item;
}

export async function createItem(actor: CurrentUser, input: ItemDraft): Promise<Item> {
  assertCan(actor, "items.manage");
  const item = resolved(input);
  try {
    return await db().transaction(async (trx) => {
      const [row] = await trx("items").insert({ company_id: actor.companyId, ...columns(item) }).returning<ItemRow[]>("*");
      if (item.packs.length) {
        await trx("item_packs").insert(item.packs.map((k) => ({
          company_id: actor.companyId, item_id: row!.id, name: k.name, quantity: k.quantity, unit: k.unit, stock_quantity: k.stockQuantity,
        })));
      }
      return toItem(row!, (await packsOf(trx, actor.companyId, [row!.id])).get(row!.id) ?? []);
    });
  } catch (e) {
    if (isSkuViolation(e)) throw skuTaken(item.sku);
    throw e;
  }
}

/**
 * Changes an item (by id or SKU, like getItem). The merged item is checked as a whole; `packs` replaces every pack. Once the
 * item has a lot, its category and stock unit are fixed (409 ITEM_HAS_LOTS): stock and movements
 * are held in that unit. `archived: true` hides it from lists and pickers; its records stay.
 */
export async function updateItem(actor: CurrentUser, idOrSku: string, patch: ItemPatch): Promise<Item> {
  try {
    return await db().transaction(async (trx) => {
      // FOR UPDATE also waits for a receipt that is creating this item's first lot
      const row = await findRow(trx, actor.companyId, idOrSku, true);
      if (!row) throw notFound("Item");
      assertCan(actor, "items.manage");
      const id = row.id;
      const currentPacks = (await packsOf(trx, actor.companyId, [id])).get(id) ?? [];
      const current = toItem(row, currentPacks);
      const next = resolved(mergeItemPatch(draftOf(current), patch));

      const changes: Record<string, string[]> = {};
      if (next.category !== row.category) changes.category = ["Fixed once the item has lots."];
      if (next.stockUnit !== row.stock_unit) changes.unit = ["Fixed once the item has lots."];
      if (Object.keys(changes).length) {
        const lot = await trx("lots").where({ company_id: actor.companyId, item_id: id }).first("id");
        if (lot) {
          throw conflict(
            `${row.sku} has stock lots, so its category and stock unit can no longer change. Archive it and add a new item instead.`,
            "ITEM_HAS_LOTS",
            { fields: changes },
          );
        }
      }

      const archivedAt = patch.archived === undefined ? row.archived_at : patch.archived ? (row.archived_at ?? new Date()) : null;
      const [updated] = await trx("items")
        .where({ company_id: actor.companyId, id })
        .update({ ...columns(next), archived_at: archivedAt, updated_at: trx.fn.now() })
        .returning<ItemRow[]>("*");

      // packs are matched by name, so a pack kept keeps its id
      const keep = new Set(next.packs.map((k) => k.name));
      const gone = currentPacks.filter((k) => !keep.has(k.name)).map((k) => k.id);
      if (gone.length) await trx("item_packs").where({ company_id: actor.companyId, item_id: id }).whereIn("id", gone).delete();
      for (const k of next.packs) {
        const old = currentPacks.find((c) => c.name === k.name);
        const values = { quantity: k.quantity, unit: k.unit, stock_quantity: k.stockQuantity };
        if (old) await trx("item_packs").where({ company_id: actor.companyId, id: old.id }).update(values);
        else await trx("item_packs").insert({ company_id: actor.companyId, item_id: id, name: k.name, ...values });
      }
      const packs = (await packsOf(trx, actor.companyId, [id])).get(id) ?? [];
      const saved = toItem(updated!, packs);
      // suppliers' packs follow the item's units (stock unit, put-up length, density, own packs)
      await reconvertSupplierPacks(trx, actor.companyId, id, saved.itemUnits, saved.sku);
      return saved;
    });
  } catch (e) {
    if (isSkuViolation(e)) throw skuTaken(patch.sku ?? "");
    throw e;
  }
}
