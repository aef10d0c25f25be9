// Reading stock: on hand, reserved and available per kitchen, item and lot. Reads the balances
// table (kept with every movement), so answers stay as fast as the ledger grows.
import "server-only";
import { db } from "../../db/client";
import type { DateKind, ItemCategory, KitchenRow, StockUnit } from "../../db/types";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import { notFound } from "../http/errors";
import { dec, plain } from "../units";

export interface StockLot {
  lotId: string;
  code: string;
  date: string | null;
  dateKind: DateKind | null;
  receivedOn: string;
  onHand: string;
  reserved: string;
  available: string;
  unitCost: string;
}

export interface StockRow {
  itemId: string;
  sku: string;
  name: string;
  category: ItemCategory;
  unit: StockUnit;
  trackLots: boolean;
  trackDates: boolean;
  /** Casings: calibre and put-up, so the grid can group by calibre and show metres. */
  casing: { kind: string; calibreMinMm: string; calibreMaxMm: string; putUp: string | null; metresPerPutUp: string | null } | null;
  /** Cures: the label's fractions (the grid marks cure rows). */
  cure: { nitriteFraction: string; nitrateFraction: string } | null;
  parLevel: string | null;
  reorderPoint: string | null;
  onHand: string;
  reserved: string;
  available: string;
  lots: StockLot[];
}

export interface KitchenStock {
  kitchen: { id: string; code: string; name: string };
  rows: StockRow[];
}

/**
 * The two statements behind one kitchen's stock. Sums, differences and the plain decimal text
 * (trim_scale: no trailing zeros) are done by PostgreSQL, so the answer needs no decimal work in
 * JavaScript. Exported so the benchmark can time the same SQL run directly.
 */
export const STOCK_ITEMS_SQL = `
  select i.id, i.sku, i.name, i.category, i.stock_unit, i.track_lots, i.track_dates, i.casing_kind, i.put_up,
         trim_scale(i.calibre_min_mm)::text as calibre_min_mm, trim_scale(i.calibre_max_mm)::text as calibre_max_mm,
         trim_scale(i.put_up_metres)::text as put_up_metres,
         trim_scale(i.nitrite_fraction)::text as nitrite_fraction, trim_scale(i.nitrate_fraction)::text as nitrate_fraction,
         trim_scale(coalesce(s.on_hand, 0))::text as on_hand, trim_scale(coalesce(s.reserved, 0))::text as reserved,
         trim_scale(coalesce(s.on_hand - s.reserved, 0))::text as available,
         trim_scale(lv.par_level)::text as par_level, trim_scale(lv.reorder_point)::text as reorder_point
    from items i
    left join (select item_id, sum(on_hand) as on_hand, sum(reserved) as reserved
                 from stock_balances where kitchen_id = :kitchen group by item_id) s on s.item_id = i.id
    left join stock_levels lv on lv.kitchen_id = :kitchen and lv.item_id = i.id
   where i.company_id = :company and i.archived_at is null
   order by i.category, i.calibre_min_mm, i.name, i.id`;

export const STOCK_LOTS_SQL = `
  select b.item_id, b.lot_id, l.code, to_char(l.date, 'YYYY-MM-DD') as date, l.date_kind,
         to_char(l.received_on, 'YYYY-MM-DD') as received_on,
         trim_scale(b.on_hand)::text as on_hand, trim_scale(b.reserved)::text as reserved,
         trim_scale(b.on_hand - b.reserved)::text as available, trim_scale(l.unit_cost)::text as unit_cost
    from stock_balances b join lots l on l.id = b.lot_id
   where b.company_id = :company and b.kitchen_id = :kitchen and (b.on_hand > 0 or b.reserved > 0)
   order by l.date is null, l.date, l.received_on, l.code`;

export interface StockItemLine {
  id: string; sku: string; name: string; category: ItemCategory; stock_unit: StockUnit; track_lots: boolean; track_dates: boolean;
  casing_kind: string | null; put_up: string | null; calibre_min_mm: string | null; calibre_max_mm: string | null; put_up_metres: string | null;
  nitrite_fraction: string | null; nitrate_fraction: string | null;
  on_hand: string; reserved: string; available: string; par_level: string | null; reorder_point: string | null;
}

export interface StockLotLine {
  item_id: string; lot_id: string; code: string; date: string | null; date_kind: DateKind | null; received_on: string;
  on_hand: string; reserved: string; available: string; unit_cost: string;
}

async function kitchenRows(companyId: string, kitchenId: string): Promise<StockRow[]> {
  const params = { company: companyId, kitchen: kitchenId };
  const [items, lots] = await Promise.all([
    db().raw<{ rows: StockItemLine[] }>(STOCK_ITEMS_SQL, params),
    db().raw<{ rows: StockLotLine[] }>(STOCK_LOTS_SQL, params),
  ]);
  const lotsOf = new Map<string, StockLot[]>();
  for (const l of lots.rows) {
    const lot: StockLot = {
      lotId: l.lot_id, code: l.code, date: l.date, dateKind: l.date_kind, receivedOn: l.received_on,
      onHand: l.on_hand, reserved: l.reserved, available: l.available, unitCost: l.unit_cost,
    };
    const list = lotsOf.get(l.item_id);
    if (list) list.push(lot);
    else lotsOf.set(l.item_id, [lot]);
  }
  return items.rows.map((i) => ({
    itemId: i.id,
    sku: i.sku,
    name: i.name,
    category: i.category,
    unit: i.stock_unit,
    trackLots: i.track_lots,
    trackDates: i.track_dates,
    casing: i.category === "casing" && i.casing_kind
      ? { kind: i.casing_kind, calibreMinMm: i.calibre_min_mm!, calibreMaxMm: i.calibre_max_mm!, putUp: i.put_up, metresPerPutUp: i.put_up_metres }
      : null,
    cure: i.category === "cure" ? { nitriteFraction: i.nitrite_fraction!, nitrateFraction: i.nitrate_fraction! } : null,
    parLevel: i.par_level,
    reorderPoint: i.reorder_point,
    onHand: i.on_hand,
    reserved: i.reserved,
    available: i.available,
    lots: lotsOf.get(i.id) ?? [],
  }));
}

/** Stock of one kitchen (by code) or, without one, of every kitchen of the company. */
export async function getStock(actor: CurrentUser, kitchenCode?: string): Promise<KitchenStock[]> {
  const kq = db()("kitchens").where({ company_id: actor.companyId }).whereNull("archived_at").orderBy("code");
  if (kitchenCode) kq.whereRaw("upper(code) = upper(?)", [kitchenCode]);
  const kitchens: KitchenRow[] = await kq;
  if (kitchenCode && kitchens.length === 0) throw notFound("Kitchen");
  for (const k of kitchens) assertCan(actor, "stock.read", { kitchenId: k.id });
  return Promise.all(kitchens.map(async (k) => ({
    kitchen: { id: k.id, code: k.code, name: k.name },
    rows: await kitchenRows(actor.companyId, k.id),
  })));
}

export interface ExpiringLot {
  lotId: string;
  itemId: string;
  sku: string;
  name: string;
  category: ItemCategory;
  unit: StockUnit;
  code: string;
  date: string;
  dateKind: DateKind;
  daysLeft: number;
  onHand: string;
  kitchens: { code: string; onHand: string }[];
}

/** Dated lots that still have stock and expire within `days` (expired ones only when asked). */
export async function listExpiringLots(actor: CurrentUser, opts: { withinDays: number; includeExpired: boolean; kitchenCode?: string }): Promise<ExpiringLot[]> {
  assertCan(actor, "stock.read");
  const r = await db().raw<{ rows: (Omit<ExpiringLot, "kitchens" | "onHand"> & { kitchen_code: string; on_hand: string })[] }>(
    `with today as (select (now() at time zone time_zone)::date as d from companies where id = :company)
     select l.id as "lotId", i.id as "itemId", i.sku, i.name, i.category, i.stock_unit as unit, l.code,
            to_char(l.date, 'YYYY-MM-DD') as date, l.date_kind as "dateKind", (l.date - today.d)::int as "daysLeft",
            k.code as kitchen_code, b.on_hand
       from lots l
       join items i on i.id = l.item_id
       join stock_balances b on b.lot_id = l.id and b.on_hand > 0
       join kitchens k on k.id = b.kitchen_id
       cross join today
      where l.company_id = :company and l.date is not null
        and l.date <= today.d + :days::int
        and (:includeExpired or l.date >= today.d)
        and (:kitchen::text is null or upper(k.code) = upper(:kitchen::text))
      order by l.date, i.name, l.code, k.code`,
    { company: actor.companyId, days: opts.withinDays, includeExpired: opts.includeExpired, kitchen: opts.kitchenCode ?? null },
  );
  const byLot = new Map<string, ExpiringLot>();
  for (const row of r.rows) {
    const { kitchen_code, on_hand, ...lot } = row;
    const entry = byLot.get(lot.lotId) ?? byLot.set(lot.lotId, { ...lot, onHand: "0", kitchens: [] }).get(lot.lotId)!;
    entry.kitchens.push({ code: kitchen_code, onHand: plain(dec(on_hand)) });
    entry.onHand = plain(dec(entry.onHand).plus(dec(on_hand)));
  }
  return [...byLot.values()];
}
