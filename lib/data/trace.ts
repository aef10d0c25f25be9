// Traceability for a recall (EU 178/2002 Art. 18: one step back, one step forward; trade-facts §5):
// a lot forward to the batches that used it, a batch back to the lots it used. Built from the
// ledger: receipts say who supplied a lot, production's use movements name their batch. What left
// the business (shipments to customers) is outside Hank & Lot, and both reports say so.
import "server-only";
import { db } from "../../db/client";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import { kitchensWhere } from "../auth/permissions";
import { notFound } from "../http/errors";
import { toCsv } from "../csv";
import { dec, plain } from "../units";

export const SHIPMENTS_NOTE =
  "Shipments to customers are not recorded in Hank & Lot: follow the batch codes below into your sales or dispatch records for the step forward.";

export interface LotTrace {
  lot: { id: string; code: string; item: { id: string; sku: string; name: string; unit: string }; supplier: string | null; receivedOn: string; date: string | null; dateKind: string | null };
  /** where it came from and where it went between kitchens */
  movements: { kind: string; kitchen: string; otherKitchen: string | null; quantity: string; occurredAt: string; batchCode: string | null }[];
  batches: { batchId: string; batchCode: string; recipe: { code: string; name: string; version: number }; kitchen: string; producedAt: string; quantity: string; status: string }[];
  onHand: { kitchen: string; quantity: string }[];
  note: string;
}

export interface BatchTrace {
  batch: { id: string; batchCode: string; recipe: { code: string; name: string; version: number }; kitchen: string; producedAt: string; status: string; actualMeatBlockG: string };
  lots: { lotId: string; code: string; item: { sku: string; name: string; unit: string }; supplier: string | null; receivedOn: string; date: string | null; dateKind: string | null; quantity: string }[];
  note: string;
}

const readableKitchens = async (actor: CurrentUser) => {
  const all: { id: string; code: string }[] = await db()("kitchens").where({ company_id: actor.companyId }).select("id", "code");
  const ids = new Set(kitchensWhere(actor, "planning.read", all.map((k) => k.id)));
  return all.filter((k) => ids.has(k.id));
};

/** A lot forward: its receipts and transfers, the batches that used it, what is left where. */
export async function traceLot(actor: CurrentUser, lotId: string): Promise<LotTrace> {
  assertCan(actor, "planning.read");
  const k = db();
  const lot = await k("lots as l").join("items as i", "i.id", "l.item_id").where({ "l.company_id": actor.companyId, "l.id": lotId })
    .first("l.id", "l.code", "l.supplier_name", k.raw("to_char(l.received_on, 'YYYY-MM-DD') as received_on"), k.raw("to_char(l.date, 'YYYY-MM-DD') as date"), "l.date_kind",
      "i.id as item_id", "i.sku", "i.name", "i.stock_unit");
  if (!lot) throw notFound("Lot");
  const kitchens = await readableKitchens(actor);
  const codeOf = new Map(kitchens.map((x) => [x.id, x.code]));
  const ids = kitchens.map((x) => x.id);
  const movements = await k("stock_movements as m").leftJoin("batches as b", "b.id", "m.batch_id")
    .where({ "m.company_id": actor.companyId, "m.lot_id": lotId }).whereIn("m.kitchen_id", ids).whereIn("m.kind", ["receipt", "transfer", "use", "waste"])
    .orderBy([{ column: "m.occurred_at" }, { column: "m.recorded_at" }])
    .select("m.kind", "m.kitchen_id", "m.other_kitchen_id", "m.delta", "m.occurred_at", "b.batch_code");
  const batches = await k("stock_movements as m").join("batches as b", "b.id", "m.batch_id").join("recipe_versions as v", "v.id", "b.recipe_version_id")
    .join("recipes as r", "r.id", "b.recipe_id")
    .where({ "m.company_id": actor.companyId, "m.lot_id": lotId, "m.kind": "use" }).whereIn("m.kitchen_id", ids)
    .groupBy("b.id", "b.batch_code", "r.code", "r.name", "v.version", "b.kitchen_id", "b.produced_at", "b.status").havingRaw("sum(m.delta) <> 0")
    .orderBy("b.produced_at")
    .select("b.id", "b.batch_code", "r.code", "r.name", "v.version", "b.kitchen_id", "b.produced_at", "b.status", k.raw("(-sum(m.delta))::text as quantity"));
  const onHand = await k("stock_balances").where({ lot_id: lotId }).whereIn("kitchen_id", ids).where("on_hand", ">", 0).select("kitchen_id", "on_hand");
  return {
    lot: {
      id: lot.id, code: lot.code, item: { id: lot.item_id, sku: lot.sku, name: lot.name, unit: lot.stock_unit }, supplier: lot.supplier_name,
      receivedOn: lot.received_on, date: lot.date, dateKind: lot.date_kind,
    },
    movements: movements.map((m: { kind: string; kitchen_id: string; other_kitchen_id: string | null; delta: string; occurred_at: Date; batch_code: string | null }) => ({
      kind: m.kind, kitchen: codeOf.get(m.kitchen_id)!, otherKitchen: m.other_kitchen_id ? (codeOf.get(m.other_kitchen_id) ?? null) : null,
      quantity: plain(dec(m.delta)), occurredAt: new Date(m.occurred_at).toISOString(), batchCode: m.batch_code,
    })),
    batches: batches.map((b: { id: string; batch_code: string; code: string; name: string; version: number; kitchen_id: string; produced_at: Date; status: string; quantity: string }) => ({
      batchId: b.id, batchCode: b.batch_code, recipe: { code: b.code, name: b.name, version: b.version }, kitchen: codeOf.get(b.kitchen_id)!,
      producedAt: new Date(b.produced_at).toISOString(), quantity: plain(dec(b.quantity)), status: b.status,
    })),
    onHand: onHand.map((b: { kitchen_id: string; on_hand: string }) => ({ kitchen: codeOf.get(b.kitchen_id)!, quantity: plain(dec(b.on_hand)) })),
    note: SHIPMENTS_NOTE,
  };
}

/** A batch back: every lot it used, with the supplier and the supplier's lot code. */
export async function traceBatch(actor: CurrentUser, batchId: string): Promise<BatchTrace> {
  assertCan(actor, "planning.read");
  const k = db();
  const b = await k("batches as b").join("recipes as r", "r.id", "b.recipe_id").join("recipe_versions as v", "v.id", "b.recipe_version_id").join("kitchens as kk", "kk.id", "b.kitchen_id")
    .where({ "b.company_id": actor.companyId, "b.id": batchId })
    .first("b.id", "b.batch_code", "b.produced_at", "b.status", "b.actual_meat_block_g", "b.kitchen_id", "r.code", "r.name", "v.version", "kk.code as kitchen");
  if (!b) throw notFound("Batch");
  assertCan(actor, "planning.read", { kitchenId: b.kitchen_id });
  if (!b.batch_code) throw notFound("Produced batch");
  const lots = await k("stock_movements as m").join("lots as l", "l.id", "m.lot_id").join("items as i", "i.id", "m.item_id")
    .where({ "m.company_id": actor.companyId, "m.batch_id": batchId, "m.kind": "use" })
    .groupBy("l.id", "l.code", "i.sku", "i.name", "i.stock_unit", "l.supplier_name", "l.received_on", "l.date", "l.date_kind").havingRaw("sum(m.delta) <> 0")
    .orderBy(["i.sku", "l.code"])
    .select("l.id", "l.code", "i.sku", "i.name", "i.stock_unit", "l.supplier_name", k.raw("to_char(l.received_on, 'YYYY-MM-DD') as received_on"),
      k.raw("to_char(l.date, 'YYYY-MM-DD') as date"), "l.date_kind", k.raw("(-sum(m.delta))::text as quantity"));
  return {
    batch: {
      id: b.id, batchCode: b.batch_code, recipe: { code: b.code, name: b.name, version: b.version }, kitchen: b.kitchen, producedAt: new Date(b.produced_at).toISOString(),
      status: b.status, actualMeatBlockG: plain(dec(b.actual_meat_block_g)),
    },
    lots: lots.map((l: { id: string; code: string; sku: string; name: string; stock_unit: string; supplier_name: string | null; received_on: string; date: string | null; date_kind: string | null; quantity: string }) => ({
      lotId: l.id, code: l.code, item: { sku: l.sku, name: l.name, unit: l.stock_unit }, supplier: l.supplier_name, receivedOn: l.received_on,
      date: l.date, dateKind: l.date_kind, quantity: plain(dec(l.quantity)),
    })),
    note: SHIPMENTS_NOTE,
  };
}

export function lotTraceCsv(t: LotTrace): string {
  return toCsv(
    ["lot", "item_sku", "item", "supplier", "received_on", "date", "date_kind", "batch_code", "recipe", "recipe_version", "kitchen", "produced_at", "quantity_used", "unit", "note"],
    t.batches.length
      ? t.batches.map((b) => [t.lot.code, t.lot.item.sku, t.lot.item.name, t.lot.supplier, t.lot.receivedOn, t.lot.date, t.lot.dateKind, b.batchCode, b.recipe.name, b.recipe.version, b.kitchen, b.producedAt, b.quantity, t.lot.item.unit, t.note])
      : [[t.lot.code, t.lot.item.sku, t.lot.item.name, t.lot.supplier, t.lot.receivedOn, t.lot.date, t.lot.dateKind, "", "", "", "", "", "", t.lot.item.unit, t.note]],
  );
}

export function batchTraceCsv(t: BatchTrace): string {
  return toCsv(
    ["batch_code", "recipe", "recipe_version", "kitchen", "produced_at", "item_sku", "item", "lot", "supplier", "received_on", "date", "date_kind", "quantity_used", "unit", "note"],
    t.lots.map((l) => [t.batch.batchCode, t.batch.recipe.name, t.batch.recipe.version, t.batch.kitchen, t.batch.producedAt, l.item.sku, l.item.name, l.code, l.supplier, l.receivedOn, l.date, l.dateKind, l.quantity, l.item.unit, t.note]),
  );
}
