// Suppliers and their items (what each sells us, in which pack, under which SKU and GTIN). Reads
// need purchasing.read, writes purchasing.manage; everything is scoped to the actor's company and
// another company's supplier is 404. A supplier trades in the company's currency. A supplier item
// points at one of our stock items; its pack is converted exactly to the item's stock unit when
// saved (lib/data/supplier-packs.ts), and converted again whenever the item's units change.
// Supplier items of the same stock item are the alternatives for it (no table of their own).
import "server-only";
import type { Knex } from "knex";
import { db } from "../../db/client";
import type { ItemCategory, ItemPackRow, ItemRow, StockUnit, SupplierItemRow, SupplierRow } from "../../db/types";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import { conflict, notFound, validation } from "../http/errors";
import { CURRENCY_EXPONENTS, dec, metresOf, plain } from "../units";
import { isUuid } from "../validation/items";
import {
  gtin14Of, type SupplierCreateInput, type SupplierItemCreateInput, type SupplierItemPatchInput, type SupplierPatchInput,
} from "../validation/suppliers";
import { itemUnitsOf } from "./items";
import { convertPack } from "./supplier-packs";

export interface Supplier {
  id: string;
  name: string;
  contactName: string;
  orderEmail: string | null;
  phone: string;
  leadTimeDays: number;
  /** in the company's currency, with its decimals ("150.00"); null: no minimum */
  minOrderValue: string | null;
  currency: string;
  notes: string;
  active: boolean;
  /** active supplier items */
  itemCount: number;
  createdAt: string;
  updatedAt: string;
}

export interface SupplierItem {
  id: string;
  supplierId: string;
  /** the supplier's SKU */
  sku: string;
  description: string;
  /** our stock item */
  item: { id: string; sku: string; name: string; category: ItemCategory; stockUnit: StockUnit; archived: boolean };
  packLabel: string;
  /** the pack as entered */
  packQuantity: string;
  packUnit: string;
  /** one pack in the item's stock unit */
  packSizeStock: string;
  stockUnit: StockUnit;
  /** one pack's length in metres (casings in put-ups or metres), else null */
  packMetres: string | null;
  /** GTIN-14, or null */
  gtin: string | null;
  active: boolean;
  createdAt: string;
  updatedAt: string;
}

// ---------------------------------------------------------------------------------------------
// Suppliers

/** An amount with the currency's decimals ("150" GBP -> "150.00"); plain for a currency not in the table. */
function money(value: string | null, currency: string): string | null {
  if (value === null) return null;
  const e = Object.hasOwn(CURRENCY_EXPONENTS, currency) ? CURRENCY_EXPONENTS[currency] : undefined;
  return e === undefined ? plain(value) : dec(value).toFixed(e);
}

/** More decimals than the company's currency has is 422 (a currency not in the table: up to 4). */
function checkMoney(value: string | null | undefined, currency: string): void {
  if (value === null || value === undefined) return;
  const e = Object.hasOwn(CURRENCY_EXPONENTS, currency) ? CURRENCY_EXPONENTS[currency]! : 4;
  if (dec(value).decimalPlaces() > e) {
    throw validation({ minOrderValue: [e === 0 ? `${currency} has no decimals: enter a whole amount.` : `${currency} has ${e} decimals: enter at most ${e}.`] });
  }
}

type SupplierListRow = SupplierRow & { item_count: string | number };

function toSupplier(row: SupplierListRow, currency: string): Supplier {
  return {
    id: row.id,
    name: row.name,
    contactName: row.contact_name,
    orderEmail: row.order_email,
    phone: row.phone,
    leadTimeDays: row.lead_time_days,
    minOrderValue: money(row.min_order_value, currency),
    currency,
    notes: row.notes,
    active: row.active,
    itemCount: Number(row.item_count),
    createdAt: row.created_at.toISOString(),
    updatedAt: row.updated_at.toISOString(),
  };
}

const likePattern = (q: string) => `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

function supplierQuery(trx: Knex | Knex.Transaction, companyId: string) {
  return trx("suppliers as s")
    .where("s.company_id", companyId)
    .select(
      "s.*",
      trx.raw("(select count(*) from supplier_items si where si.company_id = s.company_id and si.supplier_id = s.id and si.active) as item_count"),
    );
}

/** The company's suppliers by name; inactive ones only when asked; `q` matches the name or contact. */
export async function listSuppliers(actor: CurrentUser, opts: { q?: string; includeInactive?: boolean } = {}): Promise<Supplier[]> {
  assertCan(actor, "purchasing.read");
  const query = supplierQuery(db(), actor.companyId).orderByRaw("lower(s.name)");
  if (!opts.includeInactive) query.where("s.active", true);
  const q = opts.q?.trim();
  if (q) query.where((b) => b.whereILike("s.name", likePattern(q)).orWhereILike("s.contact_name", likePattern(q)));
  const rows: SupplierListRow[] = await query;
  return rows.map((r) => toSupplier(r, actor.currency));
}

async function findSupplier(trx: Knex | Knex.Transaction, companyId: string, id: string): Promise<SupplierListRow | undefined> {
  if (!isUuid(id)) return undefined;
  return supplierQuery(trx, companyId).where("s.id", id).first();
}

/** One supplier of the actor's company; another company's (or no such) supplier is 404. */
export async function getSupplier(actor: CurrentUser, id: string): Promise<Supplier> {
  assertCan(actor, "purchasing.read");
  const row = await findSupplier(db(), actor.companyId, id);
  if (!row) throw notFound("Supplier");
  return toSupplier(row, actor.currency);
}

/** A unique index refused the row: which field, and what to say. */
function uniqueViolation(e: unknown): { field: string; message: string } | null {
  const err = e as { code?: string; constraint?: string };
  if (err.code !== "23505") return null;
  switch (err.constraint) {
    case "suppliers_company_name":
      return { field: "name", message: "Another supplier of your company has this name." };
    case "supplier_items_supplier_sku":
      return { field: "sku", message: "This supplier already has an item with this SKU." };
    case "supplier_items_supplier_gtin":
      return { field: "gtin", message: "Another item of this supplier has this GTIN." };
    default:
      return null;
  }
}

function rethrowUnique(e: unknown): never {
  const u = uniqueViolation(e);
  if (u) throw conflict(u.message, "CONFLICT", { fields: { [u.field]: [u.message] } });
  throw e;
}

export async function createSupplier(actor: CurrentUser, input: SupplierCreateInput): Promise<Supplier> {
  assertCan(actor, "purchasing.manage");
  checkMoney(input.minOrderValue, actor.currency);
  try {
    const [row] = await db()("suppliers")
      .insert({
        company_id: actor.companyId,
        name: input.name,
        contact_name: input.contactName ?? "",
        order_email: input.orderEmail ?? null,
        phone: input.phone ?? "",
        lead_time_days: input.leadTimeDays,
        min_order_value: input.minOrderValue ?? null,
        notes: input.notes ?? "",
        active: input.active ?? true,
      })
      .returning<SupplierRow[]>("*");
    return toSupplier({ ...row!, item_count: 0 }, actor.currency);
  } catch (e) {
    rethrowUnique(e);
  }
}

/** Changes the fields sent; null clears the order e-mail or the minimum order value. */
export async function updateSupplier(actor: CurrentUser, id: string, patch: SupplierPatchInput): Promise<Supplier> {
  assertCan(actor, "purchasing.manage");
  checkMoney(patch.minOrderValue, actor.currency);
  const changes: Partial<SupplierRow> = {};
  if (patch.name !== undefined) changes.name = patch.name;
  if (patch.contactName !== undefined) changes.contact_name = patch.contactName;
  if (patch.orderEmail !== undefined) changes.order_email = patch.orderEmail;
  if (patch.phone !== undefined) changes.phone = patch.phone;
  if (patch.leadTimeDays !== undefined) changes.lead_time_days = patch.leadTimeDays;
  if (patch.minOrderValue !== undefined) changes.min_order_value = patch.minOrderValue;
  if (patch.notes !== undefined) changes.notes = patch.notes;
  if (patch.active !== undefined) changes.active = patch.active;
  try {
    return await db().transaction(async (trx) => {
      if (!isUuid(id)) throw notFound("Supplier");
      const updated = await trx("suppliers")
        .where({ company_id: actor.companyId, id })
        .update({ ...changes, updated_at: trx.fn.now() })
        .returning("id");
      if (!updated.length) throw notFound("Supplier");
      return toSupplier((await findSupplier(trx, actor.companyId, id))!, actor.currency);
    });
  } catch (e) {
    rethrowUnique(e);
  }
}

// ---------------------------------------------------------------------------------------------
// Supplier items

type SupplierItemJoinRow = SupplierItemRow & {
  item_sku: string;
  item_name: string;
  item_category: ItemCategory;
  item_archived_at: Date | null;
} & Pick<ItemRow, "stock_unit" | "put_up" | "put_up_metres" | "density_g_per_ml">;

function supplierItemQuery(trx: Knex | Knex.Transaction, companyId: string) {
  return trx("supplier_items as si")
    .join("items as i", function () {
      this.on("i.company_id", "=", "si.company_id").andOn("i.id", "=", "si.item_id");
    })
    .where("si.company_id", companyId)
    .select(
      "si.*",
      "i.sku as item_sku",
      "i.name as item_name",
      "i.category as item_category",
      "i.archived_at as item_archived_at",
      "i.stock_unit",
      "i.put_up",
      "i.put_up_metres",
      "i.density_g_per_ml",
    );
}

function toSupplierItem(r: SupplierItemJoinRow): SupplierItem {
  // metres need only the stock unit and the put-up, not the item's packs
  const units = itemUnitsOf(r, []);
  const packMetres = r.stock_unit === "m" || units.putUp ? plain(metresOf(r.pack_size_stock, units)) : null;
  return {
    id: r.id,
    supplierId: r.supplier_id,
    sku: r.sku,
    description: r.description,
    item: { id: r.item_id, sku: r.item_sku, name: r.item_name, category: r.item_category, stockUnit: r.stock_unit, archived: r.item_archived_at !== null },
    packLabel: r.pack_label,
    packQuantity: plain(r.pack_quantity),
    packUnit: r.pack_unit,
    packSizeStock: plain(r.pack_size_stock),
    stockUnit: r.stock_unit,
    packMetres,
    gtin: r.gtin14,
    active: r.active,
    createdAt: r.created_at.toISOString(),
    updatedAt: r.updated_at.toISOString(),
  };
}

/** A supplier's items by SKU; inactive ones only when asked. The supplier must be the company's (404). */
export async function listSupplierItems(actor: CurrentUser, supplierId: string, opts: { includeInactive?: boolean } = {}): Promise<SupplierItem[]> {
  assertCan(actor, "purchasing.read");
  if (!(await findSupplier(db(), actor.companyId, supplierId))) throw notFound("Supplier");
  const query = supplierItemQuery(db(), actor.companyId).where("si.supplier_id", supplierId).orderByRaw("lower(si.sku)");
  if (!opts.includeInactive) query.where("si.active", true);
  const rows: SupplierItemJoinRow[] = await query;
  return rows.map(toSupplierItem);
}

async function loadSupplierItem(trx: Knex | Knex.Transaction, companyId: string, supplierId: string, id: string): Promise<SupplierItem | undefined> {
  if (!isUuid(id)) return undefined;
  const row: SupplierItemJoinRow | undefined = await supplierItemQuery(trx, companyId).where({ "si.supplier_id": supplierId, "si.id": id }).first();
  return row && toSupplierItem(row);
}

/** One supplier item; 404 unless it is an item of this supplier of the actor's company. */
export async function getSupplierItem(actor: CurrentUser, supplierId: string, id: string): Promise<SupplierItem> {
  assertCan(actor, "purchasing.read");
  const item = isUuid(supplierId) ? await loadSupplierItem(db(), actor.companyId, supplierId, id) : undefined;
  if (!item) throw notFound("Supplier item");
  return item;
}

/**
 * Our item named by a supplier item (id or SKU), locked FOR SHARE so that a change of its units
 * (lib/data/items.ts, FOR UPDATE) waits for this conversion and then converts it again itself.
 */
async function itemForPack(trx: Knex.Transaction, companyId: string, ref: string, allowArchived: boolean): Promise<{ row: ItemRow; packs: ItemPackRow[] }> {
  const row: ItemRow | undefined = await trx("items")
    .where({ company_id: companyId })
    .where(isUuid(ref) ? { id: ref } : { sku: ref.trim() })
    .forShare()
    .first();
  if (!row) throw validation({ item: ["No item with this id or SKU in your catalogue."] });
  if (row.archived_at && !allowArchived) throw validation({ item: [`${row.sku} is archived: bring it back in the catalogue first.`] });
  const packs: ItemPackRow[] = await trx("item_packs").where({ company_id: companyId, item_id: row.id }).orderBy("name");
  return { row, packs };
}

function packSize(row: ItemRow, packs: ItemPackRow[], quantity: string, unit: string): string {
  const c = convertPack(quantity, unit, itemUnitsOf(row, packs), row.sku);
  if (!c.ok) throw validation({ [c.field]: [c.message] });
  return c.packSizeStock;
}

async function lockSupplier(trx: Knex.Transaction, companyId: string, supplierId: string): Promise<void> {
  const s = isUuid(supplierId) ? await trx("suppliers").where({ company_id: companyId, id: supplierId }).forShare().first("id") : undefined;
  if (!s) throw notFound("Supplier");
}

export async function createSupplierItem(actor: CurrentUser, supplierId: string, input: SupplierItemCreateInput): Promise<SupplierItem> {
  assertCan(actor, "purchasing.manage");
  try {
    return await db().transaction(async (trx) => {
      await lockSupplier(trx, actor.companyId, supplierId);
      const { row: item, packs } = await itemForPack(trx, actor.companyId, input.item, false);
      const size = packSize(item, packs, input.packQuantity, input.packUnit);
      const [row] = await trx("supplier_items")
        .insert({
          company_id: actor.companyId,
          supplier_id: supplierId,
          item_id: item.id,
          sku: input.sku,
          description: input.description ?? "",
          pack_label: input.packLabel || `${plain(input.packQuantity)} ${input.packUnit}`,
          pack_quantity: input.packQuantity,
          pack_unit: input.packUnit,
          pack_size_stock: size,
          gtin14: input.gtin ? gtin14Of(input.gtin) : null,
          active: input.active ?? true,
        })
        .returning<{ id: string }[]>("id");
      return (await loadSupplierItem(trx, actor.companyId, supplierId, row!.id))!;
    });
  } catch (e) {
    rethrowUnique(e);
  }
}

/**
 * Changes the fields sent; null clears the GTIN. A new item, pack quantity or pack unit converts
 * the pack again (the others keep their values); an archived item stays allowed only if unchanged.
 */
export async function updateSupplierItem(actor: CurrentUser, supplierId: string, id: string, patch: SupplierItemPatchInput): Promise<SupplierItem> {
  assertCan(actor, "purchasing.manage");
  try {
    return await db().transaction(async (trx) => {
      const current: SupplierItemRow | undefined = isUuid(supplierId) && isUuid(id)
        ? await trx("supplier_items").where({ company_id: actor.companyId, supplier_id: supplierId, id }).forUpdate().first()
        : undefined;
      if (!current) throw notFound("Supplier item");
      const changes: Partial<SupplierItemRow> = {};
      if (patch.sku !== undefined) changes.sku = patch.sku;
      if (patch.description !== undefined) changes.description = patch.description;
      if (patch.gtin !== undefined) changes.gtin14 = patch.gtin ? gtin14Of(patch.gtin) : null;
      if (patch.active !== undefined) changes.active = patch.active;
      const quantity = patch.packQuantity ?? plain(current.pack_quantity);
      const unit = patch.packUnit ?? current.pack_unit;
      if (patch.packLabel !== undefined) changes.pack_label = patch.packLabel || `${plain(quantity)} ${unit}`;
      if (patch.item !== undefined || patch.packQuantity !== undefined || patch.packUnit !== undefined) {
        const itemRef = patch.item ?? current.item_id;
        const { row: item, packs } = await itemForPack(trx, actor.companyId, itemRef, true);
        if (item.archived_at && item.id !== current.item_id) throw validation({ item: [`${item.sku} is archived: bring it back in the catalogue first.`] });
        changes.item_id = item.id;
        changes.pack_quantity = quantity;
        changes.pack_unit = unit;
        changes.pack_size_stock = packSize(item, packs, quantity, unit);
      }
      await trx("supplier_items").where({ company_id: actor.companyId, id }).update({ ...changes, updated_at: trx.fn.now() });
      return (await loadSupplierItem(trx, actor.companyId, supplierId, id))!;
    });
  } catch (e) {
    rethrowUnique(e);
  }
}
