// Reads an item's movements for the costing engine and runs it. Takes a knex handle (no
// server-only guard), so the reports and, later, jobs can share it.
import type { Knex } from "knex";
import type { MovementKind } from "../../db/types";
import { costMovements, type CostFormula, type CostingResult, type CostInput } from "./engine";

interface Row {
  id: string;
  posting_id: string;
  kind: MovementKind;
  kitchen_id: string;
  other_kitchen_id: string | null;
  item_id: string;
  lot_id: string;
  delta: string;
  unit_cost: string;
  reverses_id: string | null;
  occurred_at: Date;
  recorded_at: Date;
}

/**
 * Every item's costing for one company from its first movement up to (not including) `before`,
 * in every kitchen (transfers tie kitchens together, so a kitchen is never costed alone).
 */
export async function costCompany(
  knex: Knex,
  companyId: string,
  opts: { before: Date; formula: CostFormula; itemIds?: readonly string[] },
): Promise<Map<string, CostingResult>> {
  let q = knex("stock_movements")
    .where("company_id", companyId)
    .where("occurred_at", "<", opts.before)
    .select<Row[]>("id", "posting_id", "kind", "kitchen_id", "other_kitchen_id", "item_id", "lot_id", "delta", "unit_cost", "reverses_id", "occurred_at", "recorded_at")
    .orderBy([{ column: "item_id" }, { column: "occurred_at" }, { column: "recorded_at" }, { column: "id" }]);
  if (opts.itemIds) q = q.whereIn("item_id", opts.itemIds as string[]);
  const rows = await q;
  const byItem = new Map<string, CostInput[]>();
  for (const r of rows) {
    let list = byItem.get(r.item_id);
    if (!list) byItem.set(r.item_id, (list = []));
    list.push({
      id: r.id, postingId: r.posting_id, kind: r.kind, kitchenId: r.kitchen_id, otherKitchenId: r.other_kitchen_id, lotId: r.lot_id,
      delta: r.delta, lotCost: r.unit_cost, reversesId: r.reverses_id, occurredAt: r.occurred_at, recordedAt: r.recorded_at,
    });
  }
  const out = new Map<string, CostingResult>();
  for (const [itemId, list] of byItem) out.set(itemId, costMovements(list, opts.formula));
  return out;
}
