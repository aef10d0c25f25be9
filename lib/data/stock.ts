// Reading stock: on hand, reserved and available per kitchen, item and lot. Reads the balances
// table (kept with every movement), so answers stay as fast as the ledger grows.
import "server-only";
import { db } from "../../db/client";
import type { DateKind, ItemCategory, ItemRow, KitchenRow, StockUnit } from "../../db/types";
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

interface BalanceLine {
  kitchen_id: string;
  item_id: string;
  lot_id: string;
  on_hand: string;
  reserved: string;
  code: string;
  date: string | null;
  date_kind: DateKind | null;
  received_on: string;
  unit_cost: string;
}

/** Stock of one kitchen (by code) or, without one, of every kitchen of the company. */
export async function getStock(actor: CurrentUser, kitchenCode?: string): Promise<KitchenStock[]> {
  const kq = db()("kitchens").where({ company_id: actor.companyId }).whereNull("archived_at").orderBy("code");
  if (kitchenCode) kq.whereRaw("upper(code) = upper(?)", [kitchenCode]);
  const kitchens: KitchenRow[] = await kq;
  if (kitchenCode && kitchens.length === 0) throw notFound("Kitchen");
  for (const k of kitchens) assertCan(actor, "stock.read", { kitchenId: k.id });

  const [items, balances, levels] = await Promise.all([
    db()("items")
      .where({ company_id: actor.companyId })
      .whereNull("archived_at")
      .orderBy([{ column: "category" }, { column: "calibre_min_mm" }, { column: "name" }])
      .select<ItemRow[]>("*"),
    db()("stock_balances as b")
      .join("lots as l", "l.id", "b.lot_id")
      .where("b.company_id", actor.companyId)
      .whereIn("b.kitchen_id", kitchens.map((k) => k.id))
      .where((w) => w.where("b.on_hand", ">", 0).orWhere("b.reserved", ">", 0))
      .orderByRaw("l.date is null, l.date, l.received_on, l.code")
      .select<BalanceLine[]>("b.kitchen_id", "b.item_id", "b.lot_id", "b.on_hand", "b.reserved", "l.code", "l.date", "l.date_kind",
        db().raw("to_char(l.received_on, 'YYYY-MM-DD') as received_on"), "l.unit_cost"),
    db()("stock_levels")
      .where({ company_id: actor.companyId })
      .whereIn("kitchen_id", kitchens.map((k) => k.id))
      .select<{ kitchen_id: string; item_id: string; par_level: string | null; reorder_point: string | null }[]>("kitchen_id", "item_id", "par_level", "reorder_point"),
  ]);
  const levelOf = new Map(levels.map((l) => [`${l.kitchen_id}:${l.item_id}`, l]));
  const num = (v: string | null) => (v === null ? null : plain(dec(v)));

  const byKitchenItem = new Map<string, BalanceLine[]>();
  for (const b of balances) {
    const key = `${b.kitchen_id}:${b.item_id}`;
    (byKitchenItem.get(key) ?? byKitchenItem.set(key, []).get(key)!).push(b);
  }
  return kitchens.map((k) => ({
    kitchen: { id: k.id, code: k.code, name: k.name },
    rows: items.map((i) => {
      const lines = byKitchenItem.get(`${k.id}:${i.id}`) ?? [];
      const onHand = lines.reduce((s, l) => s.plus(dec(l.on_hand)), dec("0"));
      const reserved = lines.reduce((s, l) => s.plus(dec(l.reserved)), dec("0"));
      return {
        itemId: i.id,
        sku: i.sku,
        name: i.name,
        category: i.category,
        unit: i.stock_unit,
        trackLots: i.track_lots,
        trackDates: i.track_dates,
        casing: i.category === "casing" && i.casing_kind
          ? { kind: i.casing_kind, calibreMinMm: plain(dec(i.calibre_min_mm!)), calibreMaxMm: plain(dec(i.calibre_max_mm!)), putUp: i.put_up, metresPerPutUp: num(i.put_up_metres) }
          : null,
        cure: i.category === "cure" ? { nitriteFraction: plain(dec(i.nitrite_fraction!)), nitrateFraction: plain(dec(i.nitrate_fraction!)) } : null,
        parLevel: num(levelOf.get(`${k.id}:${i.id}`)?.par_level ?? null),
        reorderPoint: num(levelOf.get(`${k.id}:${i.id}`)?.reorder_point ?? null),
        onHand: plain(onHand),
        reserved: plain(reserved),
        available: plain(onHand.minus(reserved)),
        lots: lines.map((l) => ({
          lotId: l.lot_id,
          code: l.code,
          date: l.date,
          dateKind: l.date_kind,
          receivedOn: l.received_on,
          onHand: plain(dec(l.on_hand)),
          reserved: plain(dec(l.reserved)),
          available: plain(dec(l.on_hand).minus(dec(l.reserved))),
          unitCost: plain(dec(l.unit_cost)),
        })),
      };
    }),
  }));
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
