// Reading the ledger: filtered, newest first, in pages (keyset on occurred_at, id), each movement
// with the name of the person who posted it.
import "server-only";
import { toCsv } from "../csv";
import type { z } from "zod";
import { db } from "../../db/client";
import type { StockMovementRow } from "../../db/types";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import { notFound, validation } from "../http/errors";
import type { movementsQuery } from "../validation/stock";
import { describeMovements, type Movement } from "./ledger";
import { loadItemForLedger } from "./items-for-ledger";

/** A movement as the history shows it: who posted it, by name. */
export interface MovementEntry extends Movement {
  /** null when no person is recorded (userId null) or the user is not (or no longer) in the company. */
  userName: string | null;
}

/** The names of the people who posted `movements`, looked up in the actor's company only. */
async function withUserNames(companyId: string, movements: Movement[]): Promise<MovementEntry[]> {
  const ids = [...new Set(movements.map((m) => m.userId).filter((x): x is string => x !== null))];
  const users = ids.length
    ? await db()("app_users").where({ company_id: companyId }).whereIn("id", ids).select<{ id: string; name: string }[]>("id", "name")
    : [];
  const names = new Map(users.map((u) => [u.id, u.name]));
  return movements.map((m) => ({ ...m, userName: m.userId ? (names.get(m.userId) ?? null) : null }));
}

export async function listMovements(actor: CurrentUser, f: z.infer<typeof movementsQuery>): Promise<{ movements: MovementEntry[]; nextCursor: string | null }> {
  assertCan(actor, "stock.read");
  const q = db()("stock_movements").where({ company_id: actor.companyId });
  if (f.kitchen) {
    const k = await db()("kitchens").where({ company_id: actor.companyId }).whereRaw("upper(code) = upper(?)", [f.kitchen]).first("id");
    if (!k) throw notFound("Kitchen");
    q.where({ kitchen_id: k.id });
  }
  if (f.item) q.where({ item_id: (await loadItemForLedger(db(), actor.companyId, f.item)).row.id });
  if (f.lot) q.where({ lot_id: f.lot });
  if (f.kind) q.where({ kind: f.kind });
  if (f.from) q.where("occurred_at", ">=", f.from);
  if (f.to) q.where("occurred_at", "<", f.to);
  if (f.cursor) {
    const [at, id] = f.cursor.split("|");
    if (!at || !id || Number.isNaN(Date.parse(at))) throw validation({ cursor: ["Use the nextCursor of the previous page."] });
    q.whereRaw("(occurred_at, id) < (?::timestamptz, ?::uuid)", [at, id]);
  }
  const rows: StockMovementRow[] = await q.orderBy([{ column: "occurred_at", order: "desc" }, { column: "id", order: "desc" }]).limit(f.limit + 1);
  const page = rows.slice(0, f.limit);
  const last = page.at(-1);
  return {
    movements: await withUserNames(actor.companyId, await describeMovements(actor.companyId, page)),
    nextCursor: rows.length > f.limit && last ? `${new Date(last.occurred_at).toISOString()}|${last.id}` : null,
  };
}

const CSV_COLUMNS = ["occurredAt", "kind", "kitchen", "otherKitchen", "sku", "item", "lot", "delta", "unit", "counted", "enteredQuantity", "enteredUnit", "unitCost", "reason", "reversesId", "id", "user"] as const;

/** Who posted a movement, for the CSV: the name; "former user" when unknown here; empty when none is recorded. */
const userCell = (m: MovementEntry) => m.userName ?? (m.userId ? "former user" : "");

/** RFC 4180 CSV; cells that a spreadsheet would run as a formula are prefixed with '. */
export function movementsCsv(movements: MovementEntry[]): string {
  return toCsv(CSV_COLUMNS, movements.map((m) => [
    m.occurredAt, m.kind, m.kitchen.code, m.otherKitchen?.code ?? "", m.item.sku, m.item.name, m.lot.code, m.delta, m.item.unit, m.counted,
    m.enteredQuantity, m.enteredUnit, m.unitCost, m.reason, m.reversesId, m.id, userCell(m),
  ]));
}
