// The stock ledger: every change of stock is a movement, posted here and nowhere else.
// - Movements are append-only; corrections are reversals (reverseMovement).
// - stock_balances (per kitchen and lot) changes in the same transaction as its movements. A
//   withdrawal is ONE conditional statement (UPDATE ... WHERE on_hand - reserved >= n, feeding the
//   movement INSERT), so concurrent requests cannot oversell; the CHECK on_hand >= 0 backs it up.
// - A withdrawal that names no lot draws first-expired-first-out: dated lots by date, then undated
//   lots by receipt date; automatic draws skip expired lots; using an expired lot by name is refused.
// - Quantities are exact decimals in the item's stock unit (lib/units); what the person typed is kept.
// - Movements dated in a closed month are refused (409 PERIOD_CLOSED, lib/data/period-guard.ts):
//   every posting checks inside its transaction; a reversal is dated now, in the open month.
import "server-only";
import { randomUUID } from "node:crypto";
import type { Knex } from "knex";
import { db } from "../../db/client";
import type { ItemRow, KitchenRow, LotRow, MovementKind, StockMovementRow } from "../../db/types";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import { AppError, conflict, notFound, validation } from "../http/errors";
import { Dec, dec, plain, toStockUnits, toStored, unitCostPerStockUnit, UnitError } from "../units";
import type { MovementInput } from "../validation/movements";
import { loadItemForLedger, type LedgerItem } from "./items-for-ledger";
import { assertPeriodOpen } from "./period-guard";

export interface Movement {
  id: string;
  postingId: string;
  kind: MovementKind;
  kitchen: { id: string; code: string };
  otherKitchen: { id: string; code: string } | null;
  item: { id: string; sku: string; name: string; unit: string };
  lot: { id: string; code: string };
  /** Signed change of on hand, in the item's stock unit. */
  delta: string;
  /** The size of the movement, always zero or more (for a count: the counted quantity). */
  quantity: string;
  counted: string | null;
  enteredQuantity: string | null;
  enteredUnit: string | null;
  unitCost: string;
  reason: string | null;
  reversesId: string | null;
  occurredAt: string;
  recordedAt: string;
  userId: string | null;
}

const FUTURE_TOLERANCE_MS = 60_000;
const insufficient = (available: Dec, wanted: Dec, unit: string) =>
  new AppError(409, "INSUFFICIENT_STOCK", `Only ${plain(available)} ${unit} available; ${plain(wanted)} ${unit} asked for.`, {
    available: plain(available),
    requested: plain(wanted),
    unit,
  });

/** Retries a transaction that lost a deadlock or serialization race (transfers lock two kitchens). */
export async function inTransaction<T>(fn: (trx: Knex.Transaction) => Promise<T>): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await db().transaction(fn);
    } catch (e) {
      const code = (e as { code?: string }).code;
      if ((code === "40P01" || code === "40001") && attempt < 4) continue;
      throw e;
    }
  }
}

async function kitchenByCode(trx: Knex | Knex.Transaction, actor: CurrentUser, code: string): Promise<KitchenRow> {
  const row: KitchenRow | undefined = await trx("kitchens").where({ company_id: actor.companyId }).whereRaw("upper(code) = upper(?)", [code]).first();
  if (!row) throw notFound("Kitchen");
  return row;
}

/** The company's today, for expiry (a lot dated today is still in date). */
async function companyToday(trx: Knex.Transaction, companyId: string): Promise<string> {
  const r = await trx.raw<{ rows: { today: string }[] }>(
    "select to_char((now() at time zone c.time_zone)::date, 'YYYY-MM-DD') as today from companies c where c.id = ?",
    [companyId],
  );
  return r.rows[0]!.today;
}

interface PostContext {
  trx: Knex.Transaction;
  actor: CurrentUser;
  postingId: string;
  item: LedgerItem;
  kitchen: KitchenRow;
  occurredAt: Date;
  enteredQuantity: string;
  enteredUnit: string;
  reason: string | null;
  /** production: the batch the stock was used for (traceability) */
  batchId?: string | null;
}

type MovementFields = Pick<StockMovementRow, "kind" | "kitchen_id" | "lot_id" | "delta"> &
  Partial<Pick<StockMovementRow, "counted" | "other_kitchen_id" | "reverses_id" | "reason" | "entered_quantity" | "entered_unit">>;

function movementRow(c: PostContext, f: MovementFields) {
  return {
    company_id: c.actor.companyId,
    posting_id: c.postingId,
    item_id: c.item.row.id,
    entered_quantity: c.enteredQuantity,
    entered_unit: c.enteredUnit,
    reason: c.reason,
    user_id: c.actor.id,
    occurred_at: c.occurredAt,
    batch_id: c.batchId ?? null,
    counted: null,
    other_kitchen_id: null,
    reverses_id: null,
    ...f,
  };
}

/** Adds to a kitchen's balance of a lot (creating the balance row) and writes the movement. */
async function addStock(c: PostContext, f: MovementFields): Promise<StockMovementRow> {
  await c.trx.raw(
    `insert into stock_balances (company_id, kitchen_id, item_id, lot_id, on_hand) values (?, ?, ?, ?, ?::numeric)
     on conflict (kitchen_id, lot_id) do update set on_hand = stock_balances.on_hand + excluded.on_hand, updated_at = now()`,
    [c.actor.companyId, f.kitchen_id, c.item.row.id, f.lot_id, f.delta],
  );
  const [row] = await c.trx("stock_movements")
    .insert({ ...movementRow(c, f), unit_cost: c.trx("lots").select("unit_cost").where({ id: f.lot_id }) })
    .returning<StockMovementRow[]>("*");
  return row!;
}

/**
 * Takes `amount` from a kitchen's lot in one statement: the balance update only happens when enough
 * is available, and the movement is inserted from the updated row. Returns null when short.
 * `fromReserved` lets a withdrawal draw reserved stock too (a batch consuming its reservation).
 */
async function takeStock(c: PostContext, f: MovementFields, amount: Dec, fromReserved = false): Promise<StockMovementRow | null> {
  const m = movementRow(c, { ...f, delta: toStored(amount.neg()) });
  const guard = fromReserved ? "on_hand >= ?::numeric" : "on_hand - reserved >= ?::numeric";
  const r = await c.trx.raw<{ rows: StockMovementRow[] }>(
    `with taken as (
       update stock_balances set on_hand = on_hand - ?::numeric, updated_at = now()
        where kitchen_id = ? and lot_id = ? and ${guard}
        returning company_id, kitchen_id, item_id, lot_id
     )
     insert into stock_movements (company_id, posting_id, kind, kitchen_id, item_id, lot_id, delta, counted, entered_quantity,
                                  entered_unit, unit_cost, reason, other_kitchen_id, reverses_id, user_id, occurred_at, batch_id)
     select t.company_id, ?, ?, t.kitchen_id, t.item_id, t.lot_id, ?::numeric, ?::numeric, ?, ?, l.unit_cost, ?, ?, ?, ?, ?, ?
       from taken t join lots l on l.id = t.lot_id
     returning *`,
    [
      toStored(amount), f.kitchen_id, f.lot_id, toStored(amount),
      m.posting_id, m.kind, m.delta, m.counted, m.entered_quantity, m.entered_unit, m.reason, m.other_kitchen_id, m.reverses_id, m.user_id, m.occurred_at,
      m.batch_id,
    ],
  );
  return r.rows[0] ?? null;
}

interface Candidate {
  lot_id: string;
  on_hand: string;
  reserved: string;
  date: string | null;
}

/** A kitchen's lots of the item with stock, locked, in FEFO order. */
async function lotsInFefoOrder(c: PostContext, opts: { skipExpiredBefore?: string; includeReserved?: boolean }): Promise<Candidate[]> {
  const q = c.trx("stock_balances as b")
    .join("lots as l", "l.id", "b.lot_id")
    .where({ "b.kitchen_id": c.kitchen.id, "b.item_id": c.item.row.id })
    .whereRaw(opts.includeReserved ? "b.on_hand > 0" : "b.on_hand - b.reserved > 0")
    .orderByRaw("l.date is null, l.date, l.received_on, l.created_at, l.id")
    .forUpdate("b")
    .select<Candidate[]>("b.lot_id", "b.on_hand", "b.reserved", "l.date");
  if (opts.skipExpiredBefore) q.where((w) => w.whereNull("l.date").orWhere("l.date", ">=", opts.skipExpiredBefore!));
  return q;
}

/** Withdraws `amount` first-expired-first-out, splitting across lots; all or nothing. */
async function takeFefo(c: PostContext, f: Omit<MovementFields, "lot_id" | "delta">, amount: Dec, opts: { skipExpired: boolean }): Promise<StockMovementRow[]> {
  const today = opts.skipExpired ? await companyToday(c.trx, c.actor.companyId) : undefined;
  const candidates = await lotsInFefoOrder(c, { skipExpiredBefore: today });
  const plan: { lotId: string; take: Dec }[] = [];
  let left = amount;
  for (const cand of candidates) {
    if (left.lte(0)) break;
    const available = dec(cand.on_hand).minus(dec(cand.reserved));
    const take = Dec.min(available, left);
    plan.push({ lotId: cand.lot_id, take });
    left = left.minus(take);
  }
  if (left.gt(0)) throw insufficient(amount.minus(left), amount, c.item.row.stock_unit);
  const rows: StockMovementRow[] = [];
  for (const p of plan) {
    const row = await takeStock(c, { ...f, lot_id: p.lotId, delta: "0" }, p.take);
    if (!row) throw insufficient(dec("0"), amount, c.item.row.stock_unit); // cannot happen: the rows are locked
    rows.push(row);
  }
  return rows;
}

async function lotOfItem(c: PostContext, lotId: string, field = "lot"): Promise<LotRow> {
  const lot: LotRow | undefined = await c.trx("lots").where({ company_id: c.actor.companyId, id: lotId }).first();
  if (!lot) throw notFound("Lot");
  if (lot.item_id !== c.item.row.id) throw validation({ [field]: [`This lot belongs to another item, not ${c.item.row.sku}.`] });
  return lot;
}

async function withdrawNamedLot(c: PostContext, f: Omit<MovementFields, "lot_id" | "delta">, lotId: string, amount: Dec): Promise<StockMovementRow> {
  const row = await takeStock(c, { ...f, lot_id: lotId, delta: "0" }, amount);
  if (row) return row;
  const b = await c.trx("stock_balances").where({ kitchen_id: c.kitchen.id, lot_id: lotId }).first<{ on_hand: string; reserved: string } | undefined>("on_hand", "reserved");
  throw insufficient(b ? dec(b.on_hand).minus(dec(b.reserved)) : dec("0"), amount, c.item.row.stock_unit);
}

function occurredAtOf(input: MovementInput): Date {
  if (!input.occurredAt) return new Date();
  const at = new Date(input.occurredAt);
  if (at.getTime() > Date.now() + FUTURE_TOLERANCE_MS) throw validation({ occurredAt: ["A movement cannot happen in the future."] });
  return at;
}

function stockQuantity(input: MovementInput, item: LedgerItem): Dec {
  try {
    return toStockUnits(input.quantity, input.unit, item.units);
  } catch (e) {
    if (e instanceof UnitError) throw validation({ unit: [e.message] });
    throw e;
  }
}

async function receive(c: PostContext, input: MovementInput, amount: Dec): Promise<StockMovementRow[]> {
  const item = c.item.row;
  let lotId: string;
  if (typeof input.lot === "string") {
    lotId = (await lotOfItem(c, input.lot)).id;
  } else {
    const lot = input.lot!;
    const fields: Record<string, string[]> = {};
    if (item.track_lots && !lot.code) fields["lot.code"] = [`${item.sku} is tracked by lot: enter the supplier's lot code.`];
    if (item.track_dates && !lot.date) fields["lot.date"] = [`${item.sku} is tracked by date: enter the use-by or best-before date.`];
    if (lot.date && !lot.dateKind) fields["lot.dateKind"] = ["Say whether the date is use_by or best_before."];
    if (!lot.date && lot.dateKind) fields["lot.date"] = ["Enter the date this kind refers to."];
    if (Object.keys(fields).length) throw validation(fields);
    let unitCost: string;
    try {
      unitCost = unitCostPerStockUnit(lot.unitCost, input.unit, c.item.units);
    } catch (e) {
      if (e instanceof UnitError) throw validation({ unit: [e.message] });
      throw e;
    }
    const code = lot.code ?? `R${c.occurredAt.toISOString().slice(0, 10).replace(/-/g, "")}-${randomUUID().slice(0, 6).toUpperCase()}`;
    const inserted = await c.trx.raw<{ rows: { id: string }[] }>(
      `insert into lots (company_id, item_id, code, supplier_name, received_on, date, date_kind, unit_cost)
       values (?, ?, ?, ?, (?::timestamptz at time zone (select time_zone from companies where id = ?))::date, ?, ?, ?::numeric)
       on conflict (company_id, item_id, code) do nothing returning id`,
      [c.actor.companyId, item.id, code, input.supplier ?? null, c.occurredAt.toISOString(), c.actor.companyId, lot.date ?? null, lot.dateKind ?? null, unitCost],
    );
    if (!inserted.rows[0]) {
      throw conflict(`Lot ${code} of ${item.sku} already exists; receive into it by its id.`, "LOT_EXISTS", { fields: { "lot.code": ["Already received."] } });
    }
    lotId = inserted.rows[0].id;
  }
  return [await addStock(c, { kind: "receipt", kitchen_id: c.kitchen.id, lot_id: lotId, delta: toStored(amount) })];
}

async function withdraw(c: PostContext, input: MovementInput, amount: Dec, kind: "use" | "waste" | "transfer", extra: Partial<MovementFields> = {}) {
  const f = { kind, kitchen_id: c.kitchen.id, ...extra } as const;
  if (typeof input.lot === "string") {
    const lot = await lotOfItem(c, input.lot);
    if (kind === "use" && lot.date && lot.date < (await companyToday(c.trx, c.actor.companyId))) {
      throw new AppError(409, "LOT_EXPIRED", `Lot ${lot.code} expired on ${lot.date}; it cannot be used. Waste it instead.`, { lotId: lot.id, date: lot.date });
    }
    return [await withdrawNamedLot(c, f, lot.id, amount)];
  }
  return takeFefo(c, f, amount, { skipExpired: true });
}

async function transfer(c: PostContext, input: MovementInput, amount: Dec): Promise<StockMovementRow[]> {
  const to = await kitchenByCode(c.trx, c.actor, input.toKitchen!);
  if (to.id === c.kitchen.id) throw validation({ toKitchen: ["A transfer goes to another kitchen, not the same one."] });
  if (to.archived_at) throw validation({ toKitchen: [`Kitchen ${to.code} is archived.`] });
  const out = await withdraw(c, input, amount, "transfer", { other_kitchen_id: to.id });
  const into: StockMovementRow[] = [];
  for (const leg of out) {
    into.push(await addStock(c, { kind: "transfer", kitchen_id: to.id, lot_id: leg.lot_id, delta: dec(leg.delta).neg().toFixed(), other_kitchen_id: c.kitchen.id }));
  }
  return [...out, ...into];
}

/** The lot to add to when no lot is named: the item's most recently received lot. */
async function newestLot(c: PostContext, field: string): Promise<string> {
  if (c.item.row.track_lots) throw validation({ lot: [`${c.item.row.sku} is tracked by lot: name the lot.`] });
  const lot = await c.trx("lots").where({ company_id: c.actor.companyId, item_id: c.item.row.id }).orderBy([{ column: "received_on", order: "desc" }, { column: "created_at", order: "desc" }]).first<{ id: string } | undefined>("id");
  if (!lot) throw validation({ [field]: [`Nothing of ${c.item.row.sku} has been received yet; post a receipt first.`] });
  return lot.id;
}

async function adjust(c: PostContext, input: MovementInput, signed: Dec): Promise<StockMovementRow[]> {
  const f = { kind: "adjustment" as const, kitchen_id: c.kitchen.id };
  if (signed.gt(0)) {
    const lotId = typeof input.lot === "string" ? (await lotOfItem(c, input.lot)).id : await newestLot(c, "quantity");
    return [await addStock(c, { ...f, lot_id: lotId, delta: toStored(signed) })];
  }
  if (typeof input.lot === "string") return [await withdrawNamedLot(c, f, (await lotOfItem(c, input.lot)).id, signed.abs())];
  return takeFefo(c, f, signed.abs(), { skipExpired: false });
}

/**
 * A count sets on hand to what was counted and posts the difference, recorded even when zero.
 * Without a lot (items not tracked by lot), the item's lots in the kitchen are counted together:
 * a shortfall comes off the oldest lots first, a surplus goes to the newest.
 */
async function count(c: PostContext, input: MovementInput, counted: Dec): Promise<StockMovementRow[]> {
  const base = { kind: "count" as const, kitchen_id: c.kitchen.id };
  if (typeof input.lot === "string") {
    const lot = await lotOfItem(c, input.lot);
    const b = await c.trx("stock_balances").where({ kitchen_id: c.kitchen.id, lot_id: lot.id }).forUpdate().first<{ on_hand: string } | undefined>("on_hand");
    const diff = counted.minus(dec(b?.on_hand ?? "0"));
    if (diff.lt(0)) return [(await takeStock(c, { ...base, lot_id: lot.id, delta: "0", counted: toStored(counted) }, diff.abs(), true))!];
    return [await addStock(c, { ...base, lot_id: lot.id, delta: toStored(diff), counted: toStored(counted) })];
  }
  if (c.item.row.track_lots) throw validation({ lot: [`${c.item.row.sku} is tracked by lot: count each lot.`] });
  const lots = await lotsInFefoOrder(c, { includeReserved: true });
  const onHand = lots.reduce((sum, l) => sum.plus(dec(l.on_hand)), dec("0"));
  const diff = counted.minus(onHand);
  if (diff.gte(0)) {
    const lotId = lots.at(-1)?.lot_id ?? (await newestLot(c, "quantity"));
    return [await addStock(c, { ...base, lot_id: lotId, delta: toStored(diff), counted: toStored(counted) })];
  }
  const rows: StockMovementRow[] = [];
  let left = diff.abs();
  for (const l of lots) {
    if (left.lte(0)) break;
    const take = Dec.min(dec(l.on_hand), left);
    rows.push((await takeStock(c, { ...base, lot_id: l.lot_id, delta: "0", counted: toStored(counted) }, take, true))!);
    left = left.minus(take);
  }
  return rows;
}

/** Posts one movement inside the caller's transaction (a count sheet posts many in one). */
export async function postInTransaction(
  trx: Knex.Transaction,
  actor: CurrentUser,
  input: MovementInput,
  postingId: string,
  opts: { batchId?: string } = {},
): Promise<StockMovementRow[]> {
  const occurredAt = occurredAtOf(input);
  const kitchen = await kitchenByCode(trx, actor, input.kitchen);
  assertCan(actor, input.kind === "receipt" ? "stock.receive" : "stock.post", { kitchenId: kitchen.id });
  if (kitchen.archived_at) throw validation({ kitchen: [`Kitchen ${kitchen.code} is archived.`] });
  await assertPeriodOpen(trx, actor.companyId, occurredAt);
  const item = await loadItemForLedger(trx, actor.companyId, input.item);
  const amount = stockQuantity(input, item);
  const c: PostContext = {
    trx, actor, postingId, item, kitchen, occurredAt,
    enteredQuantity: input.quantity, enteredUnit: input.unit, reason: input.reason ?? null, batchId: opts.batchId ?? null,
  };
  switch (input.kind) {
    case "receipt": return receive(c, input, amount);
    case "use": return withdraw(c, input, amount, "use");
    case "waste": return withdraw(c, input, amount, "waste");
    case "transfer": return transfer(c, input, amount);
    case "adjustment": return adjust(c, input, amount);
    case "count": return count(c, input, amount);
  }
}

/** Posts one movement request; returns one movement per lot (and kitchen) touched. */
export async function postMovement(actor: CurrentUser, input: MovementInput): Promise<Movement[]> {
  const rows = await inTransaction((trx) => postInTransaction(trx, actor, input, randomUUID()));
  return describeMovements(actor.companyId, rows);
}

export interface CountSheet {
  kitchen: string;
  lines: { item: string; lot?: string; counted: string; unit: string }[];
  note?: string;
  countedAt?: string;
}

/**
 * Posts a count sheet: every line a count movement, all in one transaction (all or nothing), under
 * one posting id that is also the count's id. A refused line is reported as lines.N.field.
 */
export async function postCount(actor: CurrentUser, sheet: CountSheet): Promise<{ countId: string; movements: Movement[] }> {
  const countId = randomUUID();
  const rows = await inTransaction(async (trx) => {
    const kitchen = await kitchenByCode(trx, actor, sheet.kitchen);
    assertCan(actor, "stock.post", { kitchenId: kitchen.id });
    const seen = new Set<string>();
    const out: StockMovementRow[] = [];
    for (const [i, line] of sheet.lines.entries()) {
      const key = `${line.item.toUpperCase()}|${line.lot ?? ""}`;
      if (seen.has(key)) throw validation({ [`lines.${i}.item`]: ["This item (and lot) is already on the sheet."] });
      seen.add(key);
      try {
        out.push(...(await postInTransaction(trx, actor, {
          kind: "count", kitchen: sheet.kitchen, item: line.item, lot: line.lot, quantity: line.counted, unit: line.unit, occurredAt: sheet.countedAt,
        }, countId)));
      } catch (e) {
        if (e instanceof AppError && e.status === 422) {
          const fields = (e.details as { fields?: Record<string, string[]> } | undefined)?.fields ?? {};
          const renamed = Object.fromEntries(Object.entries(fields).map(([f, msgs]) => [`lines.${i}.${f === "quantity" ? "counted" : f}`, msgs]));
          throw validation(renamed, `Line ${i + 1}: ${e.message}`);
        }
        if (e instanceof AppError && e.status === 404) throw validation({ [`lines.${i}.item`]: [e.message] }, `Line ${i + 1}: ${e.message}`);
        throw e;
      }
    }
    await trx("stock_counts").insert({
      id: countId, company_id: actor.companyId, kitchen_id: kitchen.id, user_id: actor.id, note: sheet.note ?? null,
      line_count: sheet.lines.length, counted_at: sheet.countedAt ? new Date(sheet.countedAt) : new Date(),
    });
    return out;
  });
  return { countId, movements: await describeMovements(actor.companyId, rows) };
}

/**
 * Reverses a movement with an equal and opposite one (a transfer: both legs). Never edits. A
 * reversal that would take stock no longer there is refused with INSUFFICIENT_STOCK.
 */
export async function reverseMovement(actor: CurrentUser, id: string, reason?: string): Promise<Movement[]> {
  const rows = await inTransaction(async (trx) => {
    const m: StockMovementRow | undefined = await trx("stock_movements").where({ company_id: actor.companyId, id }).first();
    if (!m) throw notFound("Movement");
    assertCan(actor, m.kind === "receipt" ? "stock.receive" : "stock.post", { kitchenId: m.kitchen_id });
    if (m.reverses_id) throw conflict("This movement is itself a reversal; post a new movement instead.", "CANNOT_REVERSE");
    let legs = [m];
    if (m.kind === "transfer") {
      const pair: StockMovementRow | undefined = await trx("stock_movements")
        .where({ posting_id: m.posting_id, lot_id: m.lot_id, kind: "transfer", kitchen_id: m.other_kitchen_id, other_kitchen_id: m.kitchen_id })
        .whereNull("reverses_id")
        .first();
      if (pair) legs = dec(m.delta).lt(0) ? [pair, m] : [m, pair]; // give back at the destination first
    }
    const already = await trx("stock_movements").whereIn("reverses_id", legs.map((l) => l.id)).first("id");
    if (already) throw conflict("This movement has already been reversed.", "ALREADY_REVERSED");
    // dated now, whatever the date of the movement reversed: a correction lands in the open month
    const occurredAt = new Date();
    await assertPeriodOpen(trx, actor.companyId, occurredAt);
    const item = await loadItemForLedger(trx, actor.companyId, m.item_id);
    const out: StockMovementRow[] = [];
    const postingId = randomUUID();
    for (const leg of legs) {
      const kitchen: KitchenRow = await trx("kitchens").where({ id: leg.kitchen_id }).first();
      const c: PostContext = {
        trx, actor, postingId, item, kitchen, occurredAt,
        enteredQuantity: dec(leg.delta).neg().toFixed(), enteredUnit: item.row.stock_unit, reason: reason ?? `Reversal of ${leg.id}`,
        batchId: leg.batch_id, // a reversed production use stays on the batch's trace
      };
      const f = { kind: leg.kind, kitchen_id: leg.kitchen_id, lot_id: leg.lot_id, other_kitchen_id: leg.other_kitchen_id, reverses_id: leg.id };
      const delta = dec(leg.delta);
      if (delta.gt(0)) {
        const row = await takeStock(c, { ...f, delta: "0" }, delta, true);
        if (!row) {
          const b = await trx("stock_balances").where({ kitchen_id: leg.kitchen_id, lot_id: leg.lot_id }).first<{ on_hand: string } | undefined>("on_hand");
          throw insufficient(dec(b?.on_hand ?? "0"), delta, item.row.stock_unit);
        }
        out.push(row);
      } else {
        out.push(await addStock(c, { ...f, delta: toStored(delta.neg()) }));
      }
    }
    return out;
  }).catch((e: unknown) => {
    if ((e as { code?: string }).code === "23505") throw conflict("This movement has already been reversed.", "ALREADY_REVERSED");
    throw e;
  });
  return describeMovements(actor.companyId, rows);
}

/** Movements as the API shows them (camelCase, plain decimals, kitchen and lot codes). */
export async function describeMovements(companyId: string, rows: StockMovementRow[]): Promise<Movement[]> {
  if (rows.length === 0) return [];
  const kitchenIds = [...new Set(rows.flatMap((r) => [r.kitchen_id, r.other_kitchen_id].filter((x): x is string => Boolean(x))))];
  const [kitchens, lots, items] = await Promise.all([
    db()("kitchens").where({ company_id: companyId }).whereIn("id", kitchenIds).select<{ id: string; code: string }[]>("id", "code"),
    db()("lots").where({ company_id: companyId }).whereIn("id", [...new Set(rows.map((r) => r.lot_id))]).select<{ id: string; code: string }[]>("id", "code"),
    db()("items").where({ company_id: companyId }).whereIn("id", [...new Set(rows.map((r) => r.item_id))]).select<Pick<ItemRow, "id" | "sku" | "name" | "stock_unit">[]>("id", "sku", "name", "stock_unit"),
  ]);
  const k = new Map(kitchens.map((x) => [x.id, x]));
  const l = new Map(lots.map((x) => [x.id, x]));
  const it = new Map(items.map((x) => [x.id, x]));
  return rows.map((r) => {
    const item = it.get(r.item_id)!;
    return {
      id: r.id,
      postingId: r.posting_id,
      kind: r.kind,
      kitchen: { id: r.kitchen_id, code: k.get(r.kitchen_id)!.code },
      otherKitchen: r.other_kitchen_id ? { id: r.other_kitchen_id, code: k.get(r.other_kitchen_id)!.code } : null,
      item: { id: item.id, sku: item.sku, name: item.name, unit: item.stock_unit },
      lot: { id: r.lot_id, code: l.get(r.lot_id)!.code },
      delta: plain(dec(r.delta)),
      quantity: r.counted !== null ? plain(dec(r.counted)) : plain(dec(r.delta).abs()),
      counted: r.counted === null ? null : plain(dec(r.counted)),
      enteredQuantity: r.entered_quantity,
      enteredUnit: r.entered_unit,
      unitCost: plain(dec(r.unit_cost)),
      reason: r.reason,
      reversesId: r.reverses_id,
      occurredAt: new Date(r.occurred_at).toISOString(),
      recordedAt: new Date(r.recorded_at).toISOString(),
      userId: r.user_id,
    };
  });
}
