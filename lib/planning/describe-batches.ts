// The planner's description of batches: each line's reservation, the kitchen's usable stock on the
// production day, what batches ahead of it take first, what is short and where it could come from
// (a transfer from a kitchen with room, else buying), and what was made. Moved out of
// lib/data/batches.ts so the shortage scan (jobs/definitions/shortage-scan.ts) reads exactly what the
// planner shows: it takes its knex handle and company id from the caller, imports no `server-only`
// (the worker runs without the react-server condition) and authorizes nothing.
import type { Knex } from "knex";
import type { ItemRow, KitchenRow } from "../../db/types";
import { CURE_CAUTION, type CureCalculation } from "../cure";
import type { HouseCheck } from "../cure/house";
import { Dec, dec, plain, ZERO } from "../units";

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

export interface BatchRow {
  id: string; company_id: string; kitchen_id: string; recipe_id: string; recipe_version_id: string; planned_for: string;
  meat_block_g: string; link_count: number | null; link_weight_g: string | null; casing_item_id: string | null; status: BatchStatus;
  casing_metres: string | null; casing_source: string | null;
  cure_check: CureCalculation | null; note: string; batch_code: string | null; created_by: string | null; created_at: Date;
  actual_meat_block_g: string | null; actual_cure_check: CureCalculation | null; hold_reason: string | null; release_reason: string | null;
  released_by: string | null; released_at: Date | null; produced_by: string | null; produced_at: Date | null; production_posting_id: string | null;
  house_checks: HouseCheck[] | null; override_reason: string | null; override_by: string | null;
}

export async function companyToday(k: Knex | Knex.Transaction, companyId: string): Promise<string> {
  const r = await k.raw<{ rows: { today: string }[] }>(
    "select to_char((now() at time zone c.time_zone)::date, 'YYYY-MM-DD') as today from companies c where c.id = ?",
    [companyId],
  );
  return r.rows[0]!.today;
}

export const addDays = (isoDate: string, days: number) => {
  const d = new Date(`${isoDate}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + days);
  return d.toISOString().slice(0, 10);
};

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

export async function loadBatchRows(k: Knex | Knex.Transaction, companyId: string, filter: (q: Knex.QueryBuilder) => void): Promise<BatchRow[]> {
  const q = k("batches").where({ company_id: companyId });
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

/**
 * The batches as the planner shows them. `today` (the company's date) only bounds the other kitchens'
 * planned use that transfer suggestions leave alone; by default it is read from the database clock.
 */
export async function describeBatches(k: Knex | Knex.Transaction, companyId: string, rows: BatchRow[], today?: string): Promise<Batch[]> {
  if (!rows.length) return [];
  const ids = rows.map((r) => r.id);
  const lines: { id: string; batch_id: string; position: number; role: BatchLine["role"]; item_id: string; quantity: string; exact_quantity: string; rounding: BatchLine["rounding"]; sku: string; name: string; category: ItemRow["category"]; stock_unit: ItemRow["stock_unit"] }[] =
    await k("batch_lines as bl").join("items as i", "i.id", "bl.item_id").whereIn("bl.batch_id", ids).orderBy(["bl.batch_id", "bl.position"])
      .select("bl.id", "bl.batch_id", "bl.position", "bl.role", "bl.item_id", "bl.quantity", "bl.exact_quantity", "bl.rounding", "i.sku", "i.name", "i.category", "i.stock_unit");
  const reservations: { batch_line_id: string; lot_id: string; quantity: string; code: string; date: string | null; date_kind: string | null }[] = await k("reservations as r")
    .join("lots as l", "l.id", "r.lot_id").whereIn("r.batch_id", ids).orderByRaw("l.date is null, l.date, l.received_on, l.id")
    .select("r.batch_line_id", "r.lot_id", "r.quantity", "l.code", k.raw("to_char(l.date, 'YYYY-MM-DD') as date"), "l.date_kind");
  const kitchens: KitchenRow[] = await k("kitchens").where({ company_id: companyId });
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
  today ??= await companyToday(k, companyId);

  // per production day: usable stock everywhere, and other kitchens' planned use and par levels
  const days = [...new Set(rows.map((r) => r.planned_for))];
  const availableOn = new Map<string, Map<string, Dec>>();
  for (const day of days) availableOn.set(day, await usableAvailable(k, activeKitchens, itemIds, day));
  const plannedUse: { kitchen_id: string; item_id: string; quantity: string }[] = itemIds.length
    ? await k("batch_lines as bl").join("batches as b", "b.id", "bl.batch_id")
        .where("b.company_id", companyId).where("b.status", "planned")
        .whereBetween("b.planned_for", [today, addDays(today, 7)]).whereIn("bl.item_id", itemIds)
        .groupBy("b.kitchen_id", "bl.item_id").select("b.kitchen_id", "bl.item_id", k.raw("sum(bl.quantity)::text as quantity"))
    : [];
  const plannedUseOf = new Map(plannedUse.map((p) => [`${p.kitchen_id}:${p.item_id}`, dec(p.quantity)]));
  // batches planned (not yet reserved) ahead of each one in its kitchen: they will want the same stock first
  const lastDay = days.reduce((a, d) => (d > a ? d : a), days[0]!);
  const planned: { batch_id: string; kitchen_id: string; day: string; created_at: Date; item_id: string; quantity: string }[] = itemIds.length
    ? await k("batch_lines as bl").join("batches as b", "b.id", "bl.batch_id")
        .where("b.company_id", companyId).where("b.status", "planned").whereIn("b.kitchen_id", [...new Set(rows.map((r) => r.kitchen_id))])
        .where("b.planned_for", "<=", lastDay).whereIn("bl.item_id", itemIds)
        .select("b.id as batch_id", "b.kitchen_id", k.raw("to_char(b.planned_for, 'YYYY-MM-DD') as day"), "b.created_at", "bl.item_id", "bl.quantity")
    : [];
  const plannedBefore = (b: BatchRow, itemId: string) =>
    planned
      .filter((p) => p.kitchen_id === b.kitchen_id && p.item_id === itemId && p.batch_id !== b.id
        && (p.day < b.planned_for || (p.day === b.planned_for && p.created_at.getTime() < b.created_at.getTime())))
      .reduce((sum, p) => sum.plus(dec(p.quantity)), ZERO);
  const pars: { kitchen_id: string; item_id: string; par_level: string | null }[] = itemIds.length
    ? await k("stock_levels").where({ company_id: companyId }).whereIn("item_id", itemIds).select("kitchen_id", "item_id", "par_level")
    : [];
  const parOf = new Map(pars.map((p) => [`${p.kitchen_id}:${p.item_id}`, dec(p.par_level ?? "0")]));
  const requests: { id: string; batch_id: string; item_id: string; from_kitchen_id: string; quantity: string; requested_at: Date }[] = await k("transfer_requests")
    .where({ company_id: companyId, status: "open" }).whereIn("batch_id", ids).orderBy("requested_at")
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
