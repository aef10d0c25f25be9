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
import {
  companyToday, describeBatches as describe, loadBatchRows as loadRows, type Batch, type BatchLine, type BatchRow, type BatchStatus,
} from "../planning/describe-batches";

export type { Batch, BatchLine, BatchStatus, Production } from "../planning/describe-batches";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

async function kitchenByCode(k: Knex | Knex.Transaction, actor: CurrentUser, code: string): Promise<KitchenRow> {
  const row: KitchenRow | undefined = await k("kitchens").where({ company_id: actor.companyId }).whereRaw("upper(code) = upper(?)", [code]).first();
  if (!row) throw notFound("Kitchen");
  return row;
}

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

// The description itself lives in lib/planning/describe-batches.ts (the shortage scan reads it too);
// these take the current user and scope by their company.
const loadBatchRows = (k: Knex | Knex.Transaction, actor: CurrentUser, filter: (q: Knex.QueryBuilder) => void): Promise<BatchRow[]> =>
  loadRows(k, actor.companyId, filter);

const describeBatches = (k: Knex | Knex.Transaction, actor: CurrentUser, rows: BatchRow[]): Promise<Batch[]> => describe(k, actor.companyId, rows);

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

/**
 * The open batches (planned or reserved) of some kitchens between two days that are short of a
 * line, described exactly as the planner describes them (the same `short` per line). For the
 * Overview (lib/data/dashboard.ts): each kitchen needs dashboard.read, which buyers have without
 * planning.read, so this does not ask planning.read.
 */
export async function listShortBatches(actor: CurrentUser, opts: { kitchenIds: readonly string[]; from: string; to: string }): Promise<Batch[]> {
  for (const kitchenId of opts.kitchenIds) assertCan(actor, "dashboard.read", { kitchenId });
  if (!opts.kitchenIds.length) return [];
  const k = db();
  const rows = await loadBatchRows(k, actor, (q) => {
    q.whereIn("kitchen_id", opts.kitchenIds).whereIn("status", ["planned", "reserved"]).whereBetween("planned_for", [opts.from, opts.to]);
  });
  return (await describeBatches(k, actor, rows)).filter((b) => b.shortLines > 0);
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
