// Transfer requests between kitchens of one company: asked by the receiving kitchen, fulfilled
// (the transfer posted in the same transaction) or declined by the sending one.
import "server-only";
import { randomUUID } from "node:crypto";
import type { z } from "zod";
import { db } from "../../db/client";
import type { KitchenRow } from "../../db/types";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import { conflict, notFound, validation } from "../http/errors";
import { plain, toStockUnits, toStored, UnitError, dec } from "../units";
import type { transferRequestInput, transferRequestsQuery } from "../validation/movements";
import { loadItemForLedger } from "./items-for-ledger";
import { describeMovements, inTransaction, postInTransaction, type Movement } from "./ledger";

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
}

interface Row {
  id: string; status: TransferRequest["status"]; from_kitchen_id: string; to_kitchen_id: string; item_id: string;
  quantity: string; entered_quantity: string; entered_unit: string; note: string | null; requested_by: string | null;
  requested_at: Date; decided_by: string | null; decided_at: Date | null; decline_reason: string | null; posting_id: string | null;
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
  const [row] = await db()("transfer_requests")
    .insert({
      company_id: actor.companyId, from_kitchen_id: from.id, to_kitchen_id: to.id, item_id: item.row.id, quantity: toStored(quantity),
      entered_quantity: input.quantity, entered_unit: input.unit, note: input.note ?? null, requested_by: actor.id,
    })
    .returning<{ id: string }[]>("id");
  return getRequest(actor, row!.id);
}

export async function listTransferRequests(actor: CurrentUser, f: z.infer<typeof transferRequestsQuery>): Promise<TransferRequest[]> {
  assertCan(actor, "stock.read");
  const q = query(actor.companyId).orderBy("r.requested_at", "desc").limit(500);
  if (f.status) q.where("r.status", f.status);
  const code = f.kitchen;
  if (code) q.where((w) => w.whereRaw("upper(f.code) = upper(?)", [code]).orWhereRaw("upper(t.code) = upper(?)", [code]));
  return (await q).map(toRequest);
}

/** Posts the transfer and closes the request in one transaction; a shortfall leaves it open. */
export async function fulfilTransferRequest(actor: CurrentUser, id: string, lot?: string): Promise<{ request: TransferRequest; movements: Movement[] }> {
  const rows = await inTransaction(async (trx) => {
    const r: Row | undefined = await trx("transfer_requests as r")
      .join("kitchens as f", "f.id", "r.from_kitchen_id").join("kitchens as t", "t.id", "r.to_kitchen_id").join("items as i", "i.id", "r.item_id")
      .where({ "r.company_id": actor.companyId, "r.id": id }).forUpdate("r")
      .first("r.*", "f.code as from_code", "t.code as to_code", "i.sku", "i.name", "i.stock_unit");
    if (!r) throw notFound("Transfer request");
    assertCan(actor, "transfers.fulfil", { kitchenId: r.from_kitchen_id });
    if (r.status !== "open") throw conflict(`This request is already ${r.status}.`, "REQUEST_CLOSED");
    const postingId = randomUUID();
    const moved = await postInTransaction(trx, actor, {
      kind: "transfer", kitchen: r.from_code, toKitchen: r.to_code, item: r.item_id, quantity: plain(dec(r.quantity)), unit: r.stock_unit,
      lot, reason: `Transfer request ${r.id}`,
    }, postingId);
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
