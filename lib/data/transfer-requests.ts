// Transfer requests between kitchens of one company: asked by the receiving kitchen, fulfilled
// (the transfer posted in the same transaction) or declined by the sending one. The sending
// kitchen may send a lot of its choosing; without one the ledger draws first-expired-first-out,
// and lotChoices shows beforehand which lots that draw would take. A request asked from a batch's
// shortage names the batch; while one is open for a batch and item, a second is refused (409
// ALREADY_REQUESTED, also under two requests at once: a partial unique index).
import "server-only";
import { randomUUID } from "node:crypto";
import type { Knex } from "knex";
import type { z } from "zod";
import { db } from "../../db/client";
import type { DateKind, KitchenRow } from "../../db/types";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import { AppError, conflict, notFound, validation } from "../http/errors";
import { Dec, plain, toStockUnits, toStored, UnitError, dec } from "../units";
import type { transferRequestInput, transferRequestsQuery } from "../validation/movements";
import { loadItemForLedger } from "./items-for-ledger";
import { describeMovements, inTransaction, postInTransaction, type Movement } from "./ledger";
import type { StockRow } from "./stock";

export interface TransferRequest {
  id: string;
  status: "open" | "fulfilled" | "declined" | "cancelled";
  fromKitchen: { id: string; code: string };
  toKitchen: { id: string; code: string };
  item: { id: string; sku: string; name: string; unit: string };
  quantity: string;
  enteredQuantity: string;
  enteredUnit: string;
  note: string | null;
  requestedBy: string | null;
  requestedAt: string;
  decidedBy: string | null;
  decidedAt: string | null;
  declineReason: string | null;
  postingId: string | null;
  /** the planned batch the request was asked for, if any */
  batchId: string | null;
}

interface Row {
  id: string; status: TransferRequest["status"]; from_kitchen_id: string; to_kitchen_id: string; item_id: string;
  quantity: string; entered_quantity: string; entered_unit: string; note: string | null; requested_by: string | null;
  requested_at: Date; decided_by: string | null; decided_at: Date | null; decline_reason: string | null; posting_id: string | null;
  batch_id: string | null;
  from_code: string; to_code: string; sku: string; name: string; stock_unit: string;
}

const query = (companyId: string) =>
  db()("transfer_requests as r")
    .join("kitchens as f", "f.id", "r.from_kitchen_id")
    .join("kitchens as t", "t.id", "r.to_kitchen_id")
    .join("items as i", "i.id", "r.item_id")
    .where("r.company_id", companyId)
    .select("r.*", "f.code as from_code", "t.code as to_code", "i.sku", "i.name", "i.stock_unit");

const toRequest = (r: Row): TransferRequest => ({
  id: r.id, status: r.status,
  fromKitchen: { id: r.from_kitchen_id, code: r.from_code }, toKitchen: { id: r.to_kitchen_id, code: r.to_code },
  item: { id: r.item_id, sku: r.sku, name: r.name, unit: r.stock_unit },
  quantity: plain(dec(r.quantity)), enteredQuantity: r.entered_quantity, enteredUnit: r.entered_unit, note: r.note,
  requestedBy: r.requested_by, requestedAt: r.requested_at.toISOString(),
  decidedBy: r.decided_by, decidedAt: r.decided_at?.toISOString() ?? null, declineReason: r.decline_reason, postingId: r.posting_id,
  batchId: r.batch_id,
});

async function kitchen(actor: CurrentUser, code: string, field: string): Promise<KitchenRow> {
  const k: KitchenRow | undefined = await db()("kitchens").where({ company_id: actor.companyId }).whereRaw("upper(code) = upper(?)", [code]).first();
  if (!k) throw notFound("Kitchen");
  if (k.archived_at) throw validation({ [field]: [`Kitchen ${k.code} is archived.`] });
  return k;
}

async function getRequest(actor: CurrentUser, id: string): Promise<TransferRequest> {
  const r: Row | undefined = await query(actor.companyId).where("r.id", id).first();
  if (!r) throw notFound("Transfer request");
  return toRequest(r);
}

export async function requestTransfer(actor: CurrentUser, input: z.infer<typeof transferRequestInput>): Promise<TransferRequest> {
  const [from, to] = [await kitchen(actor, input.fromKitchen, "fromKitchen"), await kitchen(actor, input.toKitchen, "toKitchen")];
  assertCan(actor, "transfers.request", { kitchenId: to.id });
  const item = await loadItemForLedger(db(), actor.companyId, input.item);
  let quantity;
  try {
    quantity = toStockUnits(input.quantity, input.unit, item.units);
  } catch (e) {
    if (e instanceof UnitError) throw validation({ unit: [e.message] });
    throw e;
  }
  if (input.batch) await checkBatch(actor, input.batch, to, item.row.id, item.row.sku);
  const [row] = await db()("transfer_requests")
    .insert({
      company_id: actor.companyId, from_kitchen_id: from.id, to_kitchen_id: to.id, item_id: item.row.id, quantity: toStored(quantity),
      entered_quantity: input.quantity, entered_unit: input.unit, note: input.note ?? null, requested_by: actor.id, batch_id: input.batch ?? null,
    })
    .returning<{ id: string }[]>("id")
    .catch(async (e: unknown) => {
      // two requests at once for the same batch and item: the second meets the partial unique index
      if ((e as { constraint?: string }).constraint === OPEN_PER_BATCH_ITEM) throw await alreadyRequested(actor, input.batch!, item.row.id, item.row.sku);
      throw e;
    });
  return getRequest(actor, row!.id);
}

const OPEN_PER_BATCH_ITEM = "transfer_requests_open_per_batch_item";

async function alreadyRequested(actor: CurrentUser, batchId: string, itemId: string, sku: string): Promise<AppError> {
  const open: Row | undefined = await query(actor.companyId).where({ "r.batch_id": batchId, "r.item_id": itemId, "r.status": "open" }).first();
  return conflict(
    `${sku} for this batch is already asked of ${open?.from_code ?? "another kitchen"}; that request is still open.`,
    "ALREADY_REQUESTED",
    open ? { request: toRequest(open) } : undefined,
  );
}

/**
 * A request for a batch: the batch is of the company (404), still planned or reserved, planned in
 * the receiving kitchen, needs the item, and has no open request for it yet (409 ALREADY_REQUESTED).
 */
async function checkBatch(actor: CurrentUser, batchId: string, to: KitchenRow, itemId: string, sku: string): Promise<void> {
  const batch: { id: string; kitchen_id: string; status: string } | undefined = await db()("batches")
    .where({ company_id: actor.companyId, id: batchId }).first("id", "kitchen_id", "status");
  if (!batch) throw notFound("Batch");
  if (batch.kitchen_id !== to.id) throw validation({ batch: [`This batch is planned in another kitchen than ${to.code}: ask for the batch's kitchen.`] });
  if (batch.status !== "planned" && batch.status !== "reserved") throw validation({ batch: [`This batch is ${batch.status.replace("_", " ")}: it needs no more stock.`] });
  const line = await db()("batch_lines").where({ batch_id: batch.id, item_id: itemId }).first("id");
  if (!line) throw validation({ item: [`${sku} is not on this batch's bill of materials.`] });
  const open = await db()("transfer_requests").where({ company_id: actor.companyId, batch_id: batch.id, item_id: itemId, status: "open" }).first("id");
  if (open) throw await alreadyRequested(actor, batch.id, itemId, sku);
}

export async function listTransferRequests(actor: CurrentUser, f: z.infer<typeof transferRequestsQuery>): Promise<TransferRequest[]> {
  assertCan(actor, "stock.read");
  const q = query(actor.companyId).orderBy("r.requested_at", "desc").limit(500);
  if (f.status) q.where("r.status", f.status);
  const code = f.kitchen;
  if (code) q.where((w) => w.whereRaw("upper(f.code) = upper(?)", [code]).orWhereRaw("upper(t.code) = upper(?)", [code]));
  return (await q).map(toRequest);
}

/** A lot the sending kitchen could send: it has stock available there. */
export interface TransferLotChoice {
  lotId: string;
  code: string;
  date: string | null;
  dateKind: DateKind | null;
  receivedOn: string;
  /** Days from the company's today to the date; negative once expired, null when undated. */
  daysLeft: number | null;
  expired: boolean;
  /** On hand minus reserved in the sending kitchen, stock unit. */
  available: string;
}

export interface TransferLotChoices {
  item: Pick<StockRow, "sku" | "name" | "unit" | "trackLots" | "trackDates" | "casing"> & { id: string; cure: boolean };
  /** The sending kitchen. */
  kitchen: { id: string; code: string };
  /** The company's date, by which expiry is judged (yyyy-mm-dd). */
  today: string;
  /** In the order the ledger draws them: dated lots by date, then undated ones by receipt. */
  lots: TransferLotChoice[];
  /** What fulfilling without a lot would send now: expired lots are skipped. */
  fefo: { takes: { lotId: string; code: string; quantity: string }[]; short: string };
}

interface ChoiceRow {
  lot_id: string; code: string; date: string | null; date_kind: DateKind | null; received_on: string; available: string; days_left: number | null; today: string;
}

/**
 * The sending kitchen's lots of the requested item with stock available, and the lots a draw
 * without a named lot would take (the same order and expiry rule as the ledger's own draw).
 */
export async function lotChoices(actor: CurrentUser, id: string): Promise<TransferLotChoices> {
  const request = await getRequest(actor, id);
  assertCan(actor, "stock.read", { kitchenId: request.fromKitchen.id });
  const item = await db()("items").where({ company_id: actor.companyId, id: request.item.id })
    .first<{ id: string; sku: string; name: string; category: string; stock_unit: StockRow["unit"]; track_lots: boolean; track_dates: boolean;
      casing_kind: string | null; calibre_min_mm: string | null; calibre_max_mm: string | null; put_up: string | null; put_up_metres: string | null }>(
      "id", "sku", "name", "category", "stock_unit", "track_lots", "track_dates", "casing_kind",
      db().raw("trim_scale(calibre_min_mm)::text as calibre_min_mm"), db().raw("trim_scale(calibre_max_mm)::text as calibre_max_mm"),
      "put_up", db().raw("trim_scale(put_up_metres)::text as put_up_metres"),
    );
  const r = await db().raw<{ rows: ChoiceRow[] }>(
    `with today as (select (now() at time zone time_zone)::date as d from companies where id = :company)
     select b.lot_id, l.code, to_char(l.date, 'YYYY-MM-DD') as date, l.date_kind, to_char(l.received_on, 'YYYY-MM-DD') as received_on,
            trim_scale(b.on_hand - b.reserved)::text as available, (l.date - today.d)::int as days_left, to_char(today.d, 'YYYY-MM-DD') as today
       from stock_balances b join lots l on l.id = b.lot_id cross join today
      where b.company_id = :company and b.kitchen_id = :kitchen and b.item_id = :item and b.on_hand - b.reserved > 0
      order by l.date is null, l.date, l.received_on, l.created_at, l.id`,
    { company: actor.companyId, kitchen: request.fromKitchen.id, item: request.item.id },
  );
  const today = r.rows[0]?.today
    ?? (await db().raw<{ rows: { today: string }[] }>("select to_char((now() at time zone time_zone)::date, 'YYYY-MM-DD') as today from companies where id = ?", [actor.companyId])).rows[0]!.today;
  const lots: TransferLotChoice[] = r.rows.map((l) => ({
    lotId: l.lot_id, code: l.code, date: l.date, dateKind: l.date_kind, receivedOn: l.received_on,
    daysLeft: l.days_left, expired: l.days_left !== null && l.days_left < 0, available: l.available,
  }));
  const takes: TransferLotChoices["fefo"]["takes"] = [];
  let left = dec(request.quantity);
  for (const l of lots) {
    if (left.lte(0)) break;
    if (l.expired) continue;
    const take = Dec.min(dec(l.available), left);
    takes.push({ lotId: l.lotId, code: l.code, quantity: plain(take) });
    left = left.minus(take);
  }
  return {
    item: {
      id: item!.id, sku: item!.sku, name: item!.name, unit: item!.stock_unit, trackLots: item!.track_lots, trackDates: item!.track_dates,
      casing: item!.category === "casing" && item!.casing_kind
        ? { kind: item!.casing_kind, calibreMinMm: item!.calibre_min_mm!, calibreMaxMm: item!.calibre_max_mm!, putUp: item!.put_up, metresPerPutUp: item!.put_up_metres }
        : null,
      cure: item!.category === "cure",
    },
    kitchen: { id: request.fromKitchen.id, code: request.fromKitchen.code },
    today,
    lots,
    fefo: { takes, short: plain(Dec.max(left, dec("0"))) },
  };
}

/**
 * A lot named for the transfer must be a lot of the requested item (422 on `lot` otherwise, also
 * for an id that is no lot of the company: nothing about other companies is revealed).
 */
async function namedLot(trx: Knex.Transaction, actor: CurrentUser, r: Row, lotId: string): Promise<{ id: string; code: string }> {
  const lot: { id: string; code: string; item_id: string } | undefined = await trx("lots").where({ company_id: actor.companyId, id: lotId }).first("id", "code", "item_id");
  if (!lot) throw validation({ lot: ["No such lot in your company."] });
  if (lot.item_id !== r.item_id) throw validation({ lot: [`Lot ${lot.code} is a lot of another item, not of ${r.sku}.`] });
  return lot;
}

/**
 * Posts the transfer and closes the request in one transaction; a shortfall leaves it open. With
 * `lot`, that lot is sent (a shortfall in it is 409 INSUFFICIENT_STOCK naming `lot`); an expired
 * lot named on purpose is sent as the ledger allows for transfers (only using it is refused).
 */
export async function fulfilTransferRequest(actor: CurrentUser, id: string, lot?: string): Promise<{ request: TransferRequest; movements: Movement[] }> {
  const rows = await inTransaction(async (trx) => {
    const r: Row | undefined = await trx("transfer_requests as r")
      .join("kitchens as f", "f.id", "r.from_kitchen_id").join("kitchens as t", "t.id", "r.to_kitchen_id").join("items as i", "i.id", "r.item_id")
      .where({ "r.company_id": actor.companyId, "r.id": id }).forUpdate("r")
      .first("r.*", "f.code as from_code", "t.code as to_code", "i.sku", "i.name", "i.stock_unit");
    if (!r) throw notFound("Transfer request");
    assertCan(actor, "transfers.fulfil", { kitchenId: r.from_kitchen_id });
    if (r.status !== "open") throw conflict(`This request is already ${r.status}.`, "REQUEST_CLOSED");
    const named = lot ? await namedLot(trx, actor, r, lot) : null;
    const postingId = randomUUID();
    const moved = await postInTransaction(trx, actor, {
      kind: "transfer", kitchen: r.from_code, toKitchen: r.to_code, item: r.item_id, quantity: plain(dec(r.quantity)), unit: r.stock_unit,
      lot, reason: `Transfer request ${r.id}`,
    }, postingId).catch((e: unknown) => {
      if (!named || !(e instanceof AppError) || e.code !== "INSUFFICIENT_STOCK") throw e;
      const d = (e.details ?? {}) as { available?: string; requested?: string; unit?: string };
      const message = d.available !== undefined && dec(d.available).isZero()
        ? `Lot ${named.code} has no stock available in ${r.from_code}.`
        : `Lot ${named.code} has only ${d.available} ${d.unit} available in ${r.from_code}; ${d.requested} ${d.unit} asked for.`;
      throw new AppError(409, "INSUFFICIENT_STOCK", message, { ...d, fields: { lot: [message] } });
    });
    await trx("transfer_requests").where({ id }).update({ status: "fulfilled", decided_by: actor.id, decided_at: trx.fn.now(), posting_id: postingId });
    return moved;
  });
  return { request: await getRequest(actor, id), movements: await describeMovements(actor.companyId, rows) };
}

export async function declineTransferRequest(actor: CurrentUser, id: string, reason: string): Promise<TransferRequest> {
  const current = await getRequest(actor, id);
  assertCan(actor, "transfers.fulfil", { kitchenId: current.fromKitchen.id });
  const n = await db()("transfer_requests").where({ company_id: actor.companyId, id, status: "open" })
    .update({ status: "declined", decided_by: actor.id, decided_at: db().fn.now(), decline_reason: reason });
  if (n === 0) throw conflict(`This request is already ${current.status}.`, "REQUEST_CLOSED");
  return getRequest(actor, id);
}
