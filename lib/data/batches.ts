// Batch plans and reservations.
// - A plan turns a recipe version and a meat block (or links x link weight) into the exact bill of
//   materials in each item's stock unit (lib/recipes/bom), with cure rounded to the kitchen scale
//   toward compliance and the verdict on the rounded amounts; a plan over a statutory maximum is
//   refused. Casing follows from the filling mass (lib/casing).
// - Shortages: each line against the kitchen's available stock in lots still in date on the
//   production day; suggestions: a transfer from a kitchen whose available stock, less its own
//   planned use in the next 7 days and its par level, has room, and buying the rest.
// - Reserving allocates lots first-expired-first-out (dated lots by date, then undated by receipt;
//   lots expiring on or before the production day are skipped), splitting across lots, all or
//   nothing per batch, under row locks on the balances so two batches never hold the same stock.
import "server-only";
import { randomUUID } from "node:crypto";
import type { Knex } from "knex";
import { db } from "../../db/client";
import type { ItemRow, KitchenRow } from "../../db/types";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import { casingNeed, CasingInputError } from "../casing/calculate";
import { CURE_CAUTION, type CureCalculation } from "../cure";
import { houseChecks, type HouseCheck } from "../cure/house";
import { AppError, conflict, notFound, validation } from "../http/errors";
import { billOfMaterials, BomLineError, checkCureAmounts, roundCure } from "../recipes/bom";
import { convert, Dec, dec, plain, toStockUnits, toStored, UnitError, ZERO } from "../units";
import type { BatchChangeInput, BatchCreateInput, BatchProduceInput } from "../validation/batches";
import { casingBasisForItem } from "./casing-calculation";
import { getCureSettings } from "./companies";
import { loadHouseLimits } from "./house-limits";
import { loadItemForLedger } from "./items-for-ledger";
import { inTransaction, postInTransaction } from "./ledger";
import { loadVersionSpec } from "./recipes";

export type BatchStatus = "planned" | "reserved" | "produced" | "on_hold" | "cancelled";

export interface BatchLine {
  position: number;
  role: "cure" | "ingredient" | "casing";
  item: { id: string; sku: string; name: string; category: ItemRow["category"]; unit: ItemRow["stock_unit"] };
  /** to weigh or use, in the stock unit (cure rounded to the scale toward compliance) */
  quantity: string;
  exactQuantity: string;
  rounding: "exact" | "down" | "up";
  reserved: string;
  lots: { lotId: string; code: string; date: string | null; dateKind: string | null; quantity: string }[];
  /** the kitchen's available stock in lots still in date on the production day (this batch's own reservations not counted) */
  available: string;
  /** what batches planned (not reserved) ahead of this one in the kitchen still need of the item */
  plannedBefore: string;
  /** what this batch would lack once the batches ahead have taken theirs; null when nothing is short */
  short: string | null;
  suggestions: ({ kind: "transfer"; kitchen: { id: string; code: string }; quantity: string } | { kind: "buy"; quantity: string })[];
  /** transfer requests asked for this batch and item that are still open (one at most: see transfer-requests.ts) */
  openRequests: { id: string; fromKitchen: { id: string; code: string }; quantity: string; requestedAt: string }[];
}

export interface Batch {
  id: string;
  kitchen: { id: string; code: string; name: string };
  recipe: { id: string; code: string; name: string; version: number };
  plannedFor: string;
  status: BatchStatus;
  meatBlockG: string;
  fillingG: string;
  links: { count: number; weightG: string } | null;
  casing: { itemId: string; metres: string; putUps: string | null; putUpsToOpen: number | null; source: string } | null;
  lines: BatchLine[];
  cure: CureCalculation | null;
  /** lines still short of stock (0: everything can be reserved, or is) */
  shortLines: number;
  batchCode: string | null;
  note: string;
  notes: string[];
  caution: string | null;
  createdAt: string;
  createdBy: { id: string; name: string } | null;
  houseChecks: HouseCheck[];
  override: { reason: string; by: { id: string; name: string } | null } | null;
  /** what was made: null until the batch is produced */
  production: Production | null;
}

interface BatchRow {
  id: string; company_id: string; kitchen_id: string; recipe_id: string; recipe_version_id: string; planned_for: string;
  meat_block_g: string; link_count: number | null; link_weight_g: string | null; casing_item_id: string | null; status: BatchStatus;
  casing_metres: string | null; casing_source: string | null;
  cure_check: CureCalculation | null; note: string; batch_code: string | null; created_by: string | null; created_at: Date;
  actual_meat_block_g: string | null; actual_cure_check: CureCalculation | null; hold_reason: string | null; release_reason: string | null;
  released_by: string | null; released_at: Date | null; produced_by: string | null; produced_at: Date | null; production_posting_id: string | null;
  house_checks: HouseCheck[] | null; override_reason: string | null; override_by: string | null;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

async function kitchenByCode(k: Knex | Knex.Transaction, actor: CurrentUser, code: string): Promise<KitchenRow> {
  const row: KitchenRow | undefined = await k("kitchens").where({ company_id: actor.companyId }).whereRaw("upper(code) = upper(?)", [code]).first();
  if (!row) throw notFound("Kitchen");
  return row;
}

async function companyToday(k: Knex | Knex.Transaction, companyId: string): Promise<string> {
  const r = await k.raw<{ rows: { today: string }[] }>(
    "select to_char((now() at time zone c.time_zone)::date, 'YYYY-MM-DD') as today from companies c where c.id = ?",
    [companyId],
  );
  return r.rows[0]!.today;
}

const addDays = (isoDate: string, days: number) => {
  const d = new Date(`${isoDate}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + days);
  return d.toISOString().slice(0, 10);
};

function massIn(amount: { quantity: string; unit: string }, to: string, field: string): Dec {
  try {
    return convert(amount.quantity, amount.unit, to);
  } catch (e) {
    if (e instanceof UnitError) throw validation({ [`${field}.unit`]: [e.message] });
    throw e;
  }
}

// ---------------------------------------------------------------------------------------------
// Planning

interface PlanInput {
  plannedFor: string;
  meatBlock?: { quantity: string; unit: string };
  links?: { count: number; weight: { quantity: string; unit: string } };
  casing?: string;
  overrideReason?: string;
}

type VersionSpec = Awaited<ReturnType<typeof loadVersionSpec>>;

/**
 * A plan's contents from a recipe version and what the person asked for: the meat block, the bill
 * of materials with cure rounded toward compliance, the house checks and the casing. Refuses (422)
 * a day in the past, a plan over a statutory maximum, a missed house limit without a manager's
 * reason, a casing outside the recipe's calibre range.
 */
async function draftPlan(k: Knex | Knex.Transaction, actor: CurrentUser, kitchen: KitchenRow, { version, spec }: VersionSpec, input: PlanInput) {
  const today = await companyToday(k, actor.companyId);
  if (input.plannedFor < today) throw validation({ plannedFor: [`Plan for today (${today}) or later.`] });

  // the meat block: given, or from links (filling = count x weight; meat = filling / filling per g of meat)
  let meatG: Dec;
  let linkWeightG: Dec | null = null;
  if (input.meatBlock) {
    meatG = massIn(input.meatBlock, "g", "meatBlock");
  } else {
    const perKg = billOfMaterials(spec, dec("1000")).fillingGrams;
    linkWeightG = massIn(input.links!.weight, "g", "links.weight");
    meatG = linkWeightG.times(String(input.links!.count)).times("1000").div(perKg);
  }
  meatG = dec(toStored(meatG));
  if (meatG.lte(ZERO)) throw validation({ meatBlock: ["The meat block must be more than zero."] });

  let bom;
  try {
    bom = billOfMaterials(spec, meatG);
  } catch (e) {
    if (e instanceof BomLineError) throw validation({ recipe: [`Line ${e.position}: ${e.message}`] });
    throw e;
  }
  const settings = await getCureSettings(actor);
  const rounded = roundCure(spec, bom, { table: settings.regulatoryTable, scaleResolutionG: settings.scaleResolutionG });
  if (rounded?.check.blocked) {
    const over = rounded.check.checks.filter((c) => !c.within && c.severity === "block").map((c) => `${c.substance} ${c.ppm} ppm over the ${c.limitPpm} ppm maximum (${c.entry})`);
    throw new AppError(422, "VALIDATION", "The cure is over a statutory maximum: this plan cannot be saved.", {
      fields: { recipe: [`${over.join("; ")}. Correct the recipe's cure.`] },
      cure: rounded.check,
    });
  }

  // the company's own, stricter limits: a manager may plan past them, with a reason
  const house = rounded ? houseChecks(await loadHouseLimits(k, actor.companyId), rounded.check) : [];
  const missed = house.filter((h) => !h.within);
  if (missed.length && !input.overrideReason) {
    throw new AppError(422, "VALIDATION", "The cure misses a house limit: a manager may plan it with a reason.", {
      fields: { overrideReason: [missed.map((h) => `${h.substance} ${h.ppm} ppm is ${h.kind === "max" ? "over" : "under"} the house ${h.kind === "max" ? "maximum" : "minimum"} of ${h.limitPpm} ppm`).join("; ") + "."] },
      houseChecks: house,
    });
  }
  if (input.overrideReason && !missed.length) throw validation({ overrideReason: ["No house limit is missed: there is nothing to override."] });
  if (missed.length) assertCan(actor, "limits.override", { kitchenId: kitchen.id });

  // the casing: the batch's choice, or the recipe's, inside the recipe's calibre range
  const casingRef = input.casing ?? version.casing_item_id ?? undefined;
  let casingLine: { item: ItemRow; quantity: Dec; metres: Dec; source: string } | null = null;
  if (casingRef) {
    const { row } = await loadItemForLedger(k, actor.companyId, casingRef);
    if (row.category !== "casing") throw validation({ casing: [`${row.name} is not a casing.`] });
    const lo = version.casing_calibre_min_mm;
    const hi = version.casing_calibre_max_mm;
    if (lo && hi && (dec(row.calibre_min_mm!).lt(lo) || dec(row.calibre_max_mm!).gt(hi))) {
      throw validation({ casing: [`${row.name} (${plain(dec(row.calibre_min_mm!))}-${plain(dec(row.calibre_max_mm!))} mm) is outside the recipe's calibre range ${plain(dec(lo))}-${plain(dec(hi))} mm.`] });
    }
    const { basis, source } = casingBasisForItem(row, {}, "casing");
    let need;
    try {
      need = casingNeed(bom.fillingGrams.div(1000), basis);
    } catch (e) {
      if (e instanceof CasingInputError) throw validation({ casing: [e.message] });
      throw e;
    }
    const quantity = row.stock_unit === "m" ? need.metres : row.stock_unit === "pc" ? need.putUps : null;
    if (!quantity) throw validation({ casing: [`${row.name} is stocked in ${row.stock_unit} without a length per piece: the casing cannot be planned from it.`] });
    casingLine = { item: row, quantity, metres: need.metres, source };
  }

  const columns = {
    planned_for: input.plannedFor,
    meat_block_g: toStored(meatG),
    link_count: input.links?.count ?? null,
    link_weight_g: linkWeightG ? toStored(linkWeightG) : null,
    casing_item_id: casingLine?.item.id ?? null,
    casing_metres: casingLine ? toStored(casingLine.metres) : null,
    casing_source: casingLine?.source ?? null,
    cure_check: rounded ? JSON.stringify(rounded.check) : null,
    house_checks: JSON.stringify(house),
    override_reason: missed.length ? input.overrideReason! : null,
    override_by: missed.length ? actor.id : null,
  };
  const lines = (batchId: string) => {
    const out = bom.lines.map((l) => ({
      company_id: actor.companyId, batch_id: batchId, position: l.position, item_id: l.item.id, role: l.item.category === "cure" ? "cure" : "ingredient",
      quantity: toStored(rounded?.grams.get(l.position) ?? l.quantity), exact_quantity: toStored(l.quantity), rounding: rounded?.rounding.get(l.position) ?? "exact",
    }));
    if (casingLine) {
      out.push({
        company_id: actor.companyId, batch_id: batchId, position: bom.lines.length + 1, item_id: casingLine.item.id, role: "casing",
        quantity: toStored(casingLine.quantity), exact_quantity: toStored(casingLine.quantity), rounding: "exact",
      });
    }
    return out;
  };
  return { columns, lines, missed };
}

async function auditOverride(trx: Knex.Transaction, actor: CurrentUser, batchId: string, reason: string, missed: HouseCheck[]) {
  await trx("audit_events").insert({
    company_id: actor.companyId, actor_id: actor.id, action: "batch.house_limit_overridden", subject_type: "batch", subject_id: batchId,
    reason, details: JSON.stringify({ missed }),
  });
}

export async function createBatch(actor: CurrentUser, input: BatchCreateInput): Promise<Batch> {
  const k = db();
  const kitchen = await kitchenByCode(k, actor, input.kitchen);
  assertCan(actor, "planning.manage", { kitchenId: kitchen.id });
  if (kitchen.archived_at) throw validation({ kitchen: [`Kitchen ${kitchen.code} is archived.`] });

  const recipe: { id: string; current_version: number; archived_at: Date | null; name: string } | undefined = await k("recipes")
    .where({ company_id: actor.companyId })
    .where(UUID.test(input.recipe) ? { id: input.recipe } : { code: input.recipe.toUpperCase() })
    .first("id", "current_version", "archived_at", "name");
  if (!recipe) throw notFound("Recipe");
  if (recipe.archived_at) throw validation({ recipe: [`${recipe.name} is archived.`] });
  const versionNumber = input.version ?? recipe.current_version;
  const versionRow: { id: string } | undefined = await k("recipe_versions").where({ recipe_id: recipe.id, version: versionNumber }).first("id");
  if (!versionRow) throw validation({ version: [`${recipe.name} has no version ${versionNumber}.`] });
  const draft = await draftPlan(k, actor, kitchen, await loadVersionSpec(k, actor.companyId, versionRow.id), input);

  const id = await k.transaction(async (trx) => {
    const [b] = await trx("batches")
      .insert({
        company_id: actor.companyId, kitchen_id: kitchen.id, recipe_id: recipe.id, recipe_version_id: versionRow.id,
        status: "planned", note: input.note, created_by: actor.id, ...draft.columns,
      })
      .returning<{ id: string }[]>("id");
    if (draft.missed.length) await auditOverride(trx, actor, b!.id, input.overrideReason!, draft.missed);
    const lines = draft.lines(b!.id);
    if (lines.length) await trx("batch_lines").insert(lines);
    return b!.id;
  });
  return getBatch(actor, id);
}

/**
 * Changes a planned batch (day, meat block or links, casing, note): its reservations are released
 * and its lines worked out again from the same recipe version, in one transaction; reserve again
 * afterwards. A different recipe is a new plan.
 */
export async function changeBatch(actor: CurrentUser, id: string, input: BatchChangeInput): Promise<Batch> {
  await inTransaction(async (trx) => {
    const batch = await lockBatch(trx, actor, id, "planning.manage");
    if (batch.status !== "planned" && batch.status !== "reserved") throw conflict(`This batch is ${batch.status}: only a planned batch can be changed.`);
    const kitchen: KitchenRow = await trx("kitchens").where({ id: batch.kitchen_id }).first();
    const spec = await loadVersionSpec(trx, actor.companyId, batch.recipe_version_id);
    const keepsSize = !input.meatBlock && !input.links;
    const draft = await draftPlan(trx, actor, kitchen, spec, {
      plannedFor: input.plannedFor ?? batch.planned_for,
      meatBlock: input.meatBlock ?? (keepsSize && !batch.link_count ? { quantity: plain(dec(batch.meat_block_g)), unit: "g" } : undefined),
      links: input.links ?? (keepsSize && batch.link_count ? { count: batch.link_count, weight: { quantity: plain(dec(batch.link_weight_g!)), unit: "g" } } : undefined),
      casing: input.casing ?? batch.casing_item_id ?? undefined,
      overrideReason: input.overrideReason,
    });
    await releaseIn(trx, batch);
    await trx("batch_lines").where({ batch_id: batch.id }).delete();
    const lines = draft.lines(batch.id);
    if (lines.length) await trx("batch_lines").insert(lines);
    await trx("batches").where({ id: batch.id }).update({
      ...draft.columns, status: "planned", note: input.note ?? batch.note, updated_at: trx.fn.now(),
    });
    if (draft.missed.length) await auditOverride(trx, actor, batch.id, input.overrideReason!, draft.missed);
  });
  return getBatch(actor, id);
}

// ---------------------------------------------------------------------------------------------
// Reading

async function loadBatchRows(k: Knex | Knex.Transaction, actor: CurrentUser, filter: (q: Knex.QueryBuilder) => void): Promise<BatchRow[]> {
  const q = k("batches").where({ company_id: actor.companyId });
  filter(q);
  const rows: (BatchRow & { planned_day: string })[] = await q
    .orderBy([{ column: "batches.planned_for" }, { column: "batches.created_at" }])
    .select("*", k.raw("to_char(planned_for, 'YYYY-MM-DD') as planned_day"));
  return rows.map((r) => ({ ...r, planned_for: r.planned_day }));
}

/** Usable available per item in a kitchen on a day: lots still in date that day, on hand less reserved. */
async function usableAvailable(k: Knex | Knex.Transaction, kitchenIds: string[], itemIds: string[], day: string): Promise<Map<string, Dec>> {
  if (!kitchenIds.length || !itemIds.length) return new Map();
  const rows: { kitchen_id: string; item_id: string; available: string }[] = await k("stock_balances as b")
    .join("lots as l", "l.id", "b.lot_id")
    .whereIn("b.kitchen_id", kitchenIds)
    .whereIn("b.item_id", itemIds)
    .where((w) => w.whereNull("l.date").orWhere("l.date", ">", day))
    .groupBy("b.kitchen_id", "b.item_id")
    .select("b.kitchen_id", "b.item_id", k.raw("greatest(sum(b.on_hand - b.reserved), 0)::text as available"));
  return new Map(rows.map((r) => [`${r.kitchen_id}:${r.item_id}`, dec(r.available)]));
}

async function describeBatches(k: Knex | Knex.Transaction, actor: CurrentUser, rows: BatchRow[]): Promise<Batch[]> {
  if (!rows.length) return [];
  const ids = rows.map((r) => r.id);
  const lines: { id: string; batch_id: string; position: number; role: BatchLine["role"]; item_id: string; quantity: string; exact_quantity: string; rounding: BatchLine["rounding"]; sku: string; name: string; category: ItemRow["category"]; stock_unit: ItemRow["stock_unit"] }[] =
    await k("batch_lines as bl").join("items as i", "i.id", "bl.item_id").whereIn("bl.batch_id", ids).orderBy(["bl.batch_id", "bl.position"])
      .select("bl.id", "bl.batch_id", "bl.position", "bl.role", "bl.item_id", "bl.quantity", "bl.exact_quantity", "bl.rounding", "i.sku", "i.name", "i.category", "i.stock_unit");
  const reservations: { batch_line_id: string; lot_id: string; quantity: string; code: string; date: string | null; date_kind: string | null }[] = await k("reservations as r")
    .join("lots as l", "l.id", "r.lot_id").whereIn("r.batch_id", ids).orderByRaw("l.date is null, l.date, l.received_on, l.id")
    .select("r.batch_line_id", "r.lot_id", "r.quantity", "l.code", k.raw("to_char(l.date, 'YYYY-MM-DD') as date"), "l.date_kind");
  const kitchens: KitchenRow[] = await k("kitchens").where({ company_id: actor.companyId });
  const recipes: { id: string; recipe_id: string; version: number; code: string; name: string }[] = await k("recipe_versions as v").join("recipes as r", "r.id", "v.recipe_id")
    .whereIn("v.id", rows.map((r) => r.recipe_version_id)).select("v.id", "v.recipe_id", "v.version", "r.code", "r.name");
  const people: { id: string; name: string }[] = await k("app_users").whereIn("id", rows.map((r) => r.created_by).filter((x): x is string => !!x)).select("id", "name");
  const producedIds = rows.filter((r) => r.production_posting_id).map((r) => r.id);
  const used: { batch_id: string; item_id: string; lot_id: string; code: string; quantity: string }[] = producedIds.length
    ? await k("stock_movements as m").join("lots as l", "l.id", "m.lot_id").whereIn("m.batch_id", producedIds).where("m.kind", "use")
        .groupBy("m.batch_id", "m.item_id", "m.lot_id", "l.code").havingRaw("sum(m.delta) <> 0")
        .select("m.batch_id", "m.item_id", "m.lot_id", "l.code", k.raw("(-sum(m.delta))::text as quantity"))
    : [];
  const people2: { id: string; name: string }[] = await k("app_users")
    .whereIn("id", rows.flatMap((r) => [r.produced_by, r.released_by, r.override_by]).filter((x): x is string => !!x)).select("id", "name");
  const itemIds = [...new Set(lines.map((l) => l.item_id))];
  const activeKitchens = kitchens.filter((kk) => !kk.archived_at).map((kk) => kk.id);
  const today = await companyToday(k, actor.companyId);

  // per production day: usable stock everywhere, and other kitchens' planned use and par levels
  const days = [...new Set(rows.map((r) => r.planned_for))];
  const availableOn = new Map<string, Map<string, Dec>>();
  for (const day of days) availableOn.set(day, await usableAvailable(k, activeKitchens, itemIds, day));
  const plannedUse: { kitchen_id: string; item_id: string; quantity: string }[] = itemIds.length
    ? await k("batch_lines as bl").join("batches as b", "b.id", "bl.batch_id")
        .where("b.company_id", actor.companyId).where("b.status", "planned")
        .whereBetween("b.planned_for", [today, addDays(today, 7)]).whereIn("bl.item_id", itemIds)
        .groupBy("b.kitchen_id", "bl.item_id").select("b.kitchen_id", "bl.item_id", k.raw("sum(bl.quantity)::text as quantity"))
    : [];
  const plannedUseOf = new Map(plannedUse.map((p) => [`${p.kitchen_id}:${p.item_id}`, dec(p.quantity)]));
  // batches planned (not yet reserved) ahead of each one in its kitchen: they will want the same stock first
  const lastDay = days.reduce((a, d) => (d > a ? d : a), days[0]!);
  const planned: { batch_id: string; kitchen_id: string; day: string; created_at: Date; item_id: string; quantity: string }[] = itemIds.length
    ? await k("batch_lines as bl").join("batches as b", "b.id", "bl.batch_id")
        .where("b.company_id", actor.companyId).where("b.status", "planned").whereIn("b.kitchen_id", [...new Set(rows.map((r) => r.kitchen_id))])
        .where("b.planned_for", "<=", lastDay).whereIn("bl.item_id", itemIds)
        .select("b.id as batch_id", "b.kitchen_id", k.raw("to_char(b.planned_for, 'YYYY-MM-DD') as day"), "b.created_at", "bl.item_id", "bl.quantity")
    : [];
  const plannedBefore = (b: BatchRow, itemId: string) =>
    planned
      .filter((p) => p.kitchen_id === b.kitchen_id && p.item_id === itemId && p.batch_id !== b.id
        && (p.day < b.planned_for || (p.day === b.planned_for && p.created_at.getTime() < b.created_at.getTime())))
      .reduce((sum, p) => sum.plus(dec(p.quantity)), ZERO);
  const pars: { kitchen_id: string; item_id: string; par_level: string | null }[] = itemIds.length
    ? await k("stock_levels").where({ company_id: actor.companyId }).whereIn("item_id", itemIds).select("kitchen_id", "item_id", "par_level")
    : [];
  const parOf = new Map(pars.map((p) => [`${p.kitchen_id}:${p.item_id}`, dec(p.par_level ?? "0")]));
  const requests: { id: string; batch_id: string; item_id: string; from_kitchen_id: string; quantity: string; requested_at: Date }[] = await k("transfer_requests")
    .where({ company_id: actor.companyId, status: "open" }).whereIn("batch_id", ids).orderBy("requested_at")
    .select("id", "batch_id", "item_id", "from_kitchen_id", "quantity", "requested_at");

  return rows.map((b) => {
    const kitchen = kitchens.find((kk) => kk.id === b.kitchen_id)!;
    const recipe = recipes.find((r) => r.id === b.recipe_version_id)!;
    const creator = people.find((p) => p.id === b.created_by);
    const available = availableOn.get(b.planned_for)!;
    const open = b.status === "planned" || b.status === "reserved";
    const batchLines = lines.filter((l) => l.batch_id === b.id).map((l): BatchLine => {
      const lots = reservations.filter((r) => r.batch_line_id === l.id);
      const reserved = lots.reduce((s, r) => s.plus(dec(r.quantity)), ZERO);
      const need = Dec.max(dec(l.quantity).minus(reserved), ZERO);
      const here = available.get(`${b.kitchen_id}:${l.item_id}`) ?? ZERO;
      const ahead = b.status === "planned" ? plannedBefore(b, l.item_id) : ZERO;
      const left = Dec.max(here.minus(ahead), ZERO);
      const short = open && need.gt(left) ? need.minus(left) : null;
      const suggestions: BatchLine["suggestions"] = [];
      if (short) {
        let left = short;
        for (const other of kitchens) {
          if (other.id === b.kitchen_id || other.archived_at || left.lte(0)) continue;
          const key = `${other.id}:${l.item_id}`;
          const room = (available.get(key) ?? ZERO).minus(plannedUseOf.get(key) ?? ZERO).minus(parOf.get(key) ?? ZERO);
          if (room.lte(0)) continue;
          const take = Dec.min(room, left);
          suggestions.push({ kind: "transfer", kitchen: { id: other.id, code: other.code }, quantity: plain(take) });
          left = left.minus(take);
        }
        if (left.gt(0)) suggestions.push({ kind: "buy", quantity: plain(left) });
      }
      return {
        position: l.position, role: l.role,
        item: { id: l.item_id, sku: l.sku, name: l.name, category: l.category, unit: l.stock_unit },
        quantity: plain(dec(l.quantity)), exactQuantity: plain(dec(l.exact_quantity)), rounding: l.rounding, reserved: plain(reserved),
        lots: lots.map((r) => ({ lotId: r.lot_id, code: r.code, date: r.date, dateKind: r.date_kind, quantity: plain(dec(r.quantity)) })),
        available: plain(here), plannedBefore: plain(ahead), short: short ? plain(short) : null, suggestions,
        openRequests: requests.filter((r) => r.batch_id === b.id && r.item_id === l.item_id).map((r) => ({
          id: r.id, fromKitchen: { id: r.from_kitchen_id, code: kitchens.find((kk) => kk.id === r.from_kitchen_id)?.code ?? "" },
          quantity: plain(dec(r.quantity)), requestedAt: r.requested_at.toISOString(),
        })),
      };
    });
    const fillingG = batchLines.filter((l) => l.role !== "casing" && l.item.unit === "g").reduce((s, l) => s.plus(dec(l.exactQuantity)), dec(b.meat_block_g));
    const casingLine = batchLines.find((l) => l.role === "casing");
    const notes: string[] = [];
    if (!casingLine) notes.push("No casing item is chosen for this batch: choose one to plan and reserve casing.");
    return {
      id: b.id,
      kitchen: { id: kitchen.id, code: kitchen.code, name: kitchen.name },
      recipe: { id: recipe.recipe_id, code: recipe.code, name: recipe.name, version: recipe.version },
      plannedFor: b.planned_for,
      status: b.status,
      meatBlockG: plain(dec(b.meat_block_g)),
      fillingG: plain(fillingG.toDecimalPlaces(6)),
      links: b.link_count ? { count: b.link_count, weightG: plain(dec(b.link_weight_g!)) } : null,
      casing: casingLine
        ? {
            itemId: casingLine.item.id,
            metres: plain(dec(b.casing_metres ?? "0").toDecimalPlaces(4)),
            putUps: casingLine.item.unit === "pc" ? plain(dec(casingLine.quantity).toDecimalPlaces(4)) : null,
            putUpsToOpen: casingLine.item.unit === "pc" ? dec(casingLine.quantity).ceil().toNumber() : null,
            source: b.casing_source ?? "",
          }
        : null,
      lines: batchLines,
      cure: b.cure_check,
      shortLines: batchLines.filter((l) => l.short).length,
      batchCode: b.batch_code,
      note: b.note,
      notes,
      caution: b.cure_check ? CURE_CAUTION : null,
      createdAt: b.created_at.toISOString(),
      createdBy: b.created_by ? { id: b.created_by, name: creator?.name ?? "Former user" } : null,
      houseChecks: b.house_checks ?? [],
      override: b.override_reason ? { reason: b.override_reason, by: b.override_by ? { id: b.override_by, name: people2.find((p) => p.id === b.override_by)?.name ?? "Former user" } : null } : null,
      production: b.production_posting_id ? productionOf(b, batchLines, used.filter((u) => u.batch_id === b.id), people2) : null,
    };
  });
}

function productionOf(
  b: BatchRow,
  lines: BatchLine[],
  used: { item_id: string; lot_id: string; code: string; quantity: string }[],
  people: { id: string; name: string }[],
): Production {
  const person = (id: string | null) => (id ? { id, name: people.find((p) => p.id === id)?.name ?? "Former user" } : null);
  const seen = new Set<string>();
  return {
    batchCode: b.batch_code!,
    producedAt: b.produced_at!.toISOString(),
    producedBy: person(b.produced_by),
    actualMeatBlockG: plain(dec(b.actual_meat_block_g!)),
    lines: lines.map((l) => {
      // the same item on two lines: its use is shown on the first
      const lots = seen.has(l.item.id) ? [] : used.filter((u) => u.item_id === l.item.id);
      seen.add(l.item.id);
      const actual = lots.reduce((s, u) => s.plus(dec(u.quantity)), ZERO);
      return {
        position: l.position, item: { id: l.item.id, sku: l.item.sku, name: l.item.name, unit: l.item.unit },
        planned: l.quantity, actual: plain(actual), variance: plain(actual.minus(dec(l.quantity))),
        lots: lots.map((u) => ({ lotId: u.lot_id, code: u.code, quantity: plain(dec(u.quantity)) })),
      };
    }),
    cure: b.actual_cure_check,
    hold: b.hold_reason
      ? { reason: b.hold_reason, releasedAt: b.released_at?.toISOString() ?? null, releasedBy: person(b.released_by), releaseReason: b.release_reason }
      : null,
  };
}

export async function getBatch(actor: CurrentUser, id: string): Promise<Batch> {
  assertCan(actor, "planning.read");
  const k = db();
  const rows = await loadBatchRows(k, actor, (q) => q.where({ id }));
  if (!rows.length) throw notFound("Batch");
  return (await describeBatches(k, actor, rows))[0]!;
}

export async function listBatches(actor: CurrentUser, opts: { kitchen?: string; from?: string; to?: string; status?: BatchStatus }): Promise<Batch[]> {
  assertCan(actor, "planning.read");
  const k = db();
  const kitchen = opts.kitchen ? await kitchenByCode(k, actor, opts.kitchen) : null;
  const rows = await loadBatchRows(k, actor, (q) => {
    if (kitchen) q.where({ kitchen_id: kitchen.id });
    if (opts.from) q.where("planned_for", ">=", opts.from);
    if (opts.to) q.where("planned_for", "<=", opts.to);
    if (opts.status) q.where({ status: opts.status });
  });
  return describeBatches(k, actor, rows);
}

// ---------------------------------------------------------------------------------------------
// Reserving and releasing

interface Shortfall { position: number; sku: string; needed: string; available: string; unit: string }

/**
 * Reserves what a batch still lacks, in its own transaction: the lines short (nothing reserved then),
 * and whether anything was held now (false: every line was already held in full).
 */
async function reserveIn(trx: Knex.Transaction, actor: CurrentUser, batch: BatchRow): Promise<{ short: Shortfall[]; held: boolean }> {
  const lines: { id: string; position: number; item_id: string; quantity: string; sku: string; stock_unit: string; reserved: string }[] = await trx("batch_lines as bl")
    .join("items as i", "i.id", "bl.item_id")
    .where("bl.batch_id", batch.id)
    .orderBy("bl.item_id") // a fixed lock order across batches
    .select("bl.id", "bl.position", "bl.item_id", "bl.quantity", "i.sku", "i.stock_unit",
      trx.raw("coalesce((select sum(r.quantity) from reservations r where r.batch_line_id = bl.id), 0)::text as reserved"));
  const plan: { lineId: string; itemId: string; lotId: string; take: Dec }[] = [];
  const short: Shortfall[] = [];
  for (const line of lines) {
    let need = dec(line.quantity).minus(dec(line.reserved));
    if (need.lte(0)) continue;
    const candidates: { lot_id: string; available: string }[] = await trx("stock_balances as b")
      .join("lots as l", "l.id", "b.lot_id")
      .where({ "b.kitchen_id": batch.kitchen_id, "b.item_id": line.item_id })
      .whereRaw("b.on_hand - b.reserved > 0")
      .where((w) => w.whereNull("l.date").orWhere("l.date", ">", batch.planned_for))
      .orderByRaw("l.date is null, l.date, l.received_on, l.created_at, l.id")
      .forUpdate("b")
      .select("b.lot_id", trx.raw("(b.on_hand - b.reserved)::text as available"));
    const wanted = need;
    for (const c of candidates) {
      if (need.lte(0)) break;
      const take = Dec.min(dec(c.available), need);
      plan.push({ lineId: line.id, itemId: line.item_id, lotId: c.lot_id, take });
      need = need.minus(take);
    }
    if (need.gt(0)) short.push({ position: line.position, sku: line.sku, needed: plain(wanted), available: plain(wanted.minus(need)), unit: line.stock_unit });
  }
  if (short.length) return { short, held: false };
  if (plan.length) {
    // one statement for the balances (summed per lot: two lines may draw the same lot), one for the reservations
    const perLot = new Map<string, Dec>();
    for (const p of plan) perLot.set(p.lotId, (perLot.get(p.lotId) ?? ZERO).plus(p.take));
    const values = [...perLot].map(([lotId, take]) => trx.raw("(?::uuid, ?::numeric)", [lotId, toStored(take)]));
    const updated = await trx.raw<{ rowCount: number }>(
      `update stock_balances b set reserved = b.reserved + v.take, updated_at = now()
         from (values ${values.map(() => "?").join(", ")}) as v(lot_id, take)
        where b.kitchen_id = ? and b.lot_id = v.lot_id and b.on_hand - b.reserved >= v.take`,
      [...values, batch.kitchen_id],
    );
    if (updated.rowCount !== perLot.size) throw conflict("Stock changed while reserving; try again."); // cannot happen: the rows are locked
    await trx.raw(
      `insert into reservations (company_id, batch_id, batch_line_id, kitchen_id, item_id, lot_id, quantity, created_by)
       values ${plan.map(() => "(?, ?, ?, ?, ?, ?, ?::numeric, ?)").join(", ")}
       on conflict (batch_line_id, lot_id) do update set quantity = reservations.quantity + excluded.quantity`,
      plan.flatMap((p) => [actor.companyId, batch.id, p.lineId, batch.kitchen_id, p.itemId, p.lotId, toStored(p.take), actor.id]),
    );
  }
  await trx("batches").where({ id: batch.id }).update({ status: "reserved", updated_at: trx.fn.now() });
  return { short: [], held: plan.length > 0 };
}

async function lockBatch(trx: Knex.Transaction, actor: CurrentUser, id: string, action: "planning.manage" | "planning.read"): Promise<BatchRow> {
  const rows = await loadBatchRows(trx, actor, (q) => q.where({ id }).forUpdate());
  const batch = rows[0];
  if (!batch) throw notFound("Batch");
  assertCan(actor, action, { kitchenId: batch.kitchen_id });
  return batch;
}

const shortageError = (short: Shortfall[]) =>
  new AppError(409, "SHORTAGE", `Not enough stock to reserve: ${short.map((s) => `${s.sku} needs ${s.needed} ${s.unit}, ${s.available} ${s.unit} can be reserved`).join("; ")}. Nothing was reserved.`, { lines: short });

/** Reserves every line of a batch, all or nothing (409 SHORTAGE names the lines short). */
export async function reserveBatch(actor: CurrentUser, id: string): Promise<Batch> {
  await inTransaction(async (trx) => {
    const batch = await lockBatch(trx, actor, id, "planning.manage");
    if (batch.status !== "planned" && batch.status !== "reserved") throw conflict(`This batch is ${batch.status}: only a planned batch can be reserved.`);
    const { short } = await reserveIn(trx, actor, batch);
    if (short.length) throw shortageError(short);
  });
  return getBatch(actor, id);
}

/**
 * What reserve-all did with one batch: `reserved` (stock held now), `already_reserved` (every line was
 * held already: nothing to do), `short` (nothing held: the lines short), `skipped` (produced, on hold
 * or cancelled: nothing to reserve).
 */
export type ReserveOutcome = "reserved" | "already_reserved" | "short" | "skipped";

export interface ReserveAllResult {
  counts: Record<"reserved" | "alreadyReserved" | "short" | "skipped", number>;
  batches: {
    batchId: string;
    recipeCode: string;
    plannedFor: string;
    outcome: ReserveOutcome;
    /** the batch's status after the call */
    status: BatchStatus;
    /** every line is held for the batch (reserved now or already) */
    reserved: boolean;
    short: Shortfall[];
  }[];
}

/**
 * Reserves every planned batch of a kitchen in a date range, each all or nothing in its own
 * transaction, and says per batch what happened. A batch already held in full posts nothing again,
 * so a second call (or a retry with a new key) changes nothing.
 */
export async function reserveAll(actor: CurrentUser, input: { kitchen: string; from: string; to: string }): Promise<ReserveAllResult> {
  const kitchen = await kitchenByCode(db(), actor, input.kitchen);
  assertCan(actor, "planning.manage", { kitchenId: kitchen.id });
  const listed: { id: string; code: string; planned_for: string }[] = await db()("batches as b").join("recipes as r", "r.id", "b.recipe_id")
    .where({ "b.company_id": actor.companyId, "b.kitchen_id": kitchen.id })
    .whereBetween("b.planned_for", [input.from, input.to]).orderBy([{ column: "b.planned_for" }, { column: "b.created_at" }])
    .select("b.id", "r.code", db().raw("to_char(b.planned_for, 'YYYY-MM-DD') as planned_for"));
  const results: ReserveAllResult["batches"] = [];
  for (const { id, code, planned_for } of listed) {
    const r = await inTransaction(async (trx) => {
      const batch = await lockBatch(trx, actor, id, "planning.manage");
      if (batch.status !== "planned" && batch.status !== "reserved") return { outcome: "skipped" as const, status: batch.status, short: [] };
      const { short, held } = await reserveIn(trx, actor, batch);
      // all or nothing: a batch short of a line rolls back (a reserved batch short of a top-up keeps what it held)
      if (short.length) throw Object.assign(shortageError(short), { short, batchStatus: batch.status });
      return { outcome: held || batch.status === "planned" ? ("reserved" as const) : ("already_reserved" as const), status: "reserved" as const, short };
    }).catch((e: unknown) => {
      if (e instanceof AppError && e.code === "SHORTAGE") {
        const x = e as AppError & { short: Shortfall[]; batchStatus: BatchStatus };
        return { outcome: "short" as const, status: x.batchStatus, short: x.short };
      }
      throw e;
    });
    results.push({ batchId: id, recipeCode: code, plannedFor: planned_for, outcome: r.outcome, status: r.status, reserved: r.outcome === "reserved" || r.outcome === "already_reserved", short: r.short });
  }
  const count = (o: ReserveOutcome) => results.filter((r) => r.outcome === o).length;
  return {
    counts: { reserved: count("reserved"), alreadyReserved: count("already_reserved"), short: count("short"), skipped: count("skipped") },
    batches: results,
  };
}

async function releaseIn(trx: Knex.Transaction, batch: BatchRow) {
  const held: { kitchen_id: string; lot_id: string; quantity: string }[] = await trx("reservations").where({ batch_id: batch.id }).orderBy("lot_id").select("kitchen_id", "lot_id", "quantity");
  for (const r of held) {
    await trx("stock_balances").where({ kitchen_id: r.kitchen_id, lot_id: r.lot_id })
      .update({ reserved: trx.raw("reserved - ?::numeric", [r.quantity]), updated_at: trx.fn.now() });
  }
  await trx("reservations").where({ batch_id: batch.id }).delete();
}

/** Gives a batch's reserved lots back to available stock; the batch stays planned. */
export async function releaseBatch(actor: CurrentUser, id: string): Promise<Batch> {
  await inTransaction(async (trx) => {
    const batch = await lockBatch(trx, actor, id, "planning.manage");
    if (batch.status !== "planned" && batch.status !== "reserved") throw conflict(`This batch is ${batch.status}: there is nothing to release.`);
    await releaseIn(trx, batch);
    await trx("batches").where({ id: batch.id }).update({ status: "planned", updated_at: trx.fn.now() });
  });
  return getBatch(actor, id);
}

/** Cancels a planned batch and releases what it held. */
export async function cancelBatch(actor: CurrentUser, id: string): Promise<Batch> {
  await inTransaction(async (trx) => {
    const batch = await lockBatch(trx, actor, id, "planning.manage");
    if (batch.status !== "planned" && batch.status !== "reserved") throw conflict(`This batch is ${batch.status}: only a planned batch can be cancelled.`);
    await releaseIn(trx, batch);
    await trx("batches").where({ id: batch.id }).update({ status: "cancelled", updated_at: trx.fn.now() });
  });
  return getBatch(actor, id);
}

// ---------------------------------------------------------------------------------------------
// Production

export interface Production {
  batchCode: string;
  producedAt: string;
  producedBy: { id: string; name: string } | null;
  actualMeatBlockG: string;
  lines: {
    position: number;
    item: { id: string; sku: string; name: string; unit: string };
    planned: string;
    actual: string;
    /** actual - planned, signed */
    variance: string;
    lots: { lotId: string; code: string; quantity: string }[];
  }[];
  /** the cure check on the weights actually used */
  cure: CureCalculation | null;
  hold: { reason: string; releasedAt: string | null; releasedBy: { id: string; name: string } | null; releaseReason: string | null } | null;
}

const HOLD_ADVICE =
  "Follow the HACCP plan's corrective action for this batch (segregate, do not release for sale); a manager releases the hold with a reason once it is dealt with.";

/**
 * Records a batch as made: the actual meat block, what was weighed per line and from which lots,
 * posted as use movements naming the batch, all in one transaction. The reservation is released
 * and the stock drawn: named lots, else the reserved lots first, then first-expired-first-out.
 * The cure check runs again on the actual weights; over a statutory maximum the batch goes on hold.
 */
export async function produceBatch(actor: CurrentUser, id: string, input: BatchProduceInput): Promise<Batch> {
  await inTransaction(async (trx) => {
    const batch = await lockBatch(trx, actor, id, "planning.read");
    assertCan(actor, "production.post", { kitchenId: batch.kitchen_id });
    if (batch.status !== "planned" && batch.status !== "reserved") throw conflict(`This batch is ${batch.status}: it cannot be produced again.`, "NOT_PRODUCIBLE");
    const kitchen: KitchenRow = await trx("kitchens").where({ id: batch.kitchen_id }).first();
    const actualMeatG = massIn(input.actualMeatBlock, "g", "actualMeatBlock");
    if (actualMeatG.lte(ZERO)) throw validation({ "actualMeatBlock.quantity": ["The meat block must be more than zero."] });

    const lines: { id: string; position: number; item_id: string; quantity: string; role: BatchLine["role"]; stock_unit: string }[] = await trx("batch_lines as bl")
      .join("items as i", "i.id", "bl.item_id")
      .where("bl.batch_id", batch.id).orderBy("bl.position").select("bl.id", "bl.position", "bl.item_id", "bl.quantity", "bl.role", "i.stock_unit");
    const held: { batch_line_id: string; lot_id: string; quantity: string }[] = await trx("reservations as r").join("lots as l", "l.id", "r.lot_id")
      .where("r.batch_id", batch.id).orderByRaw("l.date is null, l.date, l.received_on, l.id").select("r.batch_line_id", "r.lot_id", "r.quantity");
    const given = new Map(input.lines.map((l, i) => [l.position, { ...l, index: i }]));
    for (const [position, g] of given) {
      if (!lines.some((l) => l.position === position)) throw validation({ [`lines.${g.index}.position`]: [`This batch has no line ${position}.`] });
    }

    // what was used per line, in the stock unit
    const actual = new Map<number, Dec>();
    for (const line of lines) {
      const g = given.get(line.position);
      if (!g?.quantity) {
        actual.set(line.position, dec(line.quantity));
        continue;
      }
      const item = await loadItemForLedger(trx, actor.companyId, line.item_id);
      try {
        actual.set(line.position, toStockUnits(g.quantity, g.unit ?? item.row.stock_unit, item.units));
      } catch (e) {
        if (e instanceof UnitError) throw validation({ [`lines.${g.index}.unit`]: [e.message] });
        throw e;
      }
    }

    await releaseIn(trx, batch);
    const postingId = randomUUID();
    const code = await nextBatchCode(trx, actor.companyId, batch);
    for (const line of lines) {
      const amount = actual.get(line.position)!;
      if (amount.lte(0)) continue;
      const g = given.get(line.position);
      const use = (quantity: Dec, lot?: string, field?: string) =>
        postInTransaction(trx, actor, {
          kind: "use", kitchen: kitchen.code, item: line.item_id, quantity: toStored(quantity), unit: line.stock_unit, lot, reason: `Production of batch ${code}`,
        }, postingId, { batchId: batch.id }).catch((e: unknown) => {
          if (e instanceof AppError && field) throw new AppError(e.status, e.code, `Line ${line.position}: ${e.message}`, { ...(e.details as object), fields: { [field]: [e.message] } });
          throw e;
        });
      if (g?.lots?.length) {
        const sum = g.lots.reduce((s, l) => s.plus(dec(l.quantity)), ZERO);
        if (!sum.eq(amount)) throw validation({ [`lines.${g.index}.lots`]: [`The lots add up to ${plain(sum)}, not the ${plain(amount)} used.`] });
        for (const [j, l] of g.lots.entries()) if (dec(l.quantity).gt(0)) await use(dec(l.quantity), l.lot, `lines.${g.index}.lots.${j}.lot`);
        continue;
      }
      let left = amount;
      for (const r of held.filter((h) => h.batch_line_id === line.id)) {
        if (left.lte(0)) break;
        const take = Dec.min(dec(r.quantity), left);
        await use(take, r.lot_id, g ? `lines.${g.index}.quantity` : undefined);
        left = left.minus(take);
      }
      if (left.gt(0)) await use(left, undefined, g ? `lines.${g.index}.quantity` : undefined);
    }

    // the cure check again, on what was actually weighed
    const { spec } = await loadVersionSpec(trx, actor.companyId, batch.recipe_version_id);
    const settings = await getCureSettings(actor);
    const bom = billOfMaterials(spec, actualMeatG);
    const cureGrams = new Map(bom.lines.filter((l) => l.item.category === "cure").map((l) => [l.position, actual.get(l.position) ?? ZERO]));
    const check = checkCureAmounts(spec, bom, cureGrams, { table: settings.regulatoryTable, scaleResolutionG: settings.scaleResolutionG });
    const over = check?.blocked
      ? check.checks.filter((c) => !c.within && c.severity === "block").map((c) => `${c.substance} ${c.ppm} ppm is over the ${c.limitPpm} ppm maximum (${c.entry})`).join("; ")
      : null;
    await trx("batches").where({ id: batch.id }).update({
      status: over ? "on_hold" : "produced",
      batch_code: code,
      actual_meat_block_g: toStored(actualMeatG),
      actual_cure_check: check ? JSON.stringify(check) : null,
      hold_reason: over ? `On hold: ${over}. ${HOLD_ADVICE}` : null,
      produced_by: actor.id,
      produced_at: trx.fn.now(),
      production_posting_id: postingId,
      note: input.note ? (batch.note ? `${batch.note}\n${input.note}` : input.note) : batch.note,
      updated_at: trx.fn.now(),
    });
  });
  return getBatch(actor, id);
}

/** RECIPE-YYMMDD-N: the recipe's code, the day it was made (the company's today) and a running number (under a company lock). */
async function nextBatchCode(trx: Knex.Transaction, companyId: string, batch: BatchRow): Promise<string> {
  await trx.raw("select pg_advisory_xact_lock(hashtext(?))", [`batch-code:${companyId}`]);
  const recipe: { code: string } = await trx("recipes").where({ id: batch.recipe_id }).first("code");
  const prefix = `${recipe.code}-${(await companyToday(trx, companyId)).slice(2).replace(/-/g, "")}-`;
  const taken: { n: string | null } = await trx("batches").where({ company_id: companyId }).whereLike("batch_code", `${prefix}%`)
    .first(trx.raw("max(substring(batch_code from ?)::int)::text as n", [`^${prefix.replace(/[-]/g, "\\-")}(\\d+)$`]));
  return `${prefix}${Number(taken?.n ?? 0) + 1}`;
}

/** A manager releases a batch held over a cure limit, with a reason (audited). */
export async function releaseHold(actor: CurrentUser, id: string, reason: string): Promise<Batch> {
  await inTransaction(async (trx) => {
    const batch = await lockBatch(trx, actor, id, "planning.read");
    assertCan(actor, "limits.override", { kitchenId: batch.kitchen_id });
    if (batch.status !== "on_hold") throw conflict(`This batch is ${batch.status}, not on hold.`);
    await trx("batches").where({ id: batch.id }).update({
      status: "produced", release_reason: reason, released_by: actor.id, released_at: trx.fn.now(), updated_at: trx.fn.now(),
    });
    await trx("audit_events").insert({
      company_id: actor.companyId, actor_id: actor.id, action: "batch.hold_released", subject_type: "batch", subject_id: batch.id, reason,
      details: JSON.stringify({ batchCode: batch.batch_code, holdReason: batch.hold_reason }),
    });
  });
  return getBatch(actor, id);
}
