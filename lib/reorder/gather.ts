// The figures the reorder suggestion needs, gathered for one or more kitchens of a company in a
// fixed number of set-based statements (whatever the number of items), then run through the pure
// rule in ./suggest.ts per kitchen and item, and the chosen lines grouped by supplier there too.
//
// Server code that takes its knex handle from the caller (lib/data/reorder-suggestions.ts for the
// buying page and the API; the queued alert jobs pass their own), so it carries no "server-only"
// import: the worker runs without the react-server condition. It does no authorization: callers
// decide which company and kitchens may be read.
//
// What is counted, per kitchen and item with a reorder point set (items without one are never
// suggested, so they are not gathered):
// - on hand and reserved: the kitchen's balances summed over its lots (stock_balances)
// - planned use not yet reserved: lines of the kitchen's batches that are planned or reserved
//   (not produced, on hold or cancelled), each line less what is reserved for it, dated by the
//   batch's day; a batch dated before today still counts (it is still to be made)
// - open orders: lines of orders to the kitchen that are sent or partly received, ordered less
//   received, due on the order's deliver-by date or else the day it was sent (company's date)
//   plus the supplier's lead time. Drafts and approved orders are not counted (nothing is on its
//   way yet) but are listed with the item as pending, so the page can say so.
// - offers: active items of active suppliers for the item, with the current pack price (the price
//   row with the latest effective_from on or before today; none: null)
import type { Knex } from "knex";
import type { ItemCategory, StockUnit } from "../../db/types";
import type { OrderStatus } from "../purchasing/order-status";
import {
  groupBySupplier, suggestReorder, type DatedQuantity, type OrderLineSuggestion, type ReorderInput, type ReorderSuggestion,
  type SupplierOffer, type SupplierOrderSuggestion,
} from "./suggest";

export interface ReorderScope {
  companyId: string;
  /** kitchens of that company, already authorized by the caller */
  kitchenIds: readonly string[];
  /** the company's date by default (yyyy-mm-dd) */
  today?: string;
}

export interface ReorderItemRef {
  id: string;
  sku: string;
  name: string;
  category: ItemCategory;
  stockUnit: StockUnit;
  /** natural casings: the put-up one pc is (a hank of 91.44 m); null otherwise */
  putUp: { name: string; metres: string } | null;
}

export interface PendingOrder {
  id: string;
  number: string;
  status: OrderStatus;
  /** still to come on that order, in the item's stock unit */
  quantity: string;
}

export interface ReorderItemFacts {
  /** `${kitchenId}:${itemId}`: the line key given to groupBySupplier */
  key: string;
  item: ReorderItemRef;
  /** what suggestReorder was given */
  input: ReorderInput;
  /** drafts and approved orders for this kitchen holding the item: not counted until sent */
  pendingOrders: PendingOrder[];
  suggestion: ReorderSuggestion;
}

export interface KitchenReorderFacts {
  kitchen: { id: string; code: string; name: string };
  /** every item with a reorder point in the kitchen, by category and name */
  items: ReorderItemFacts[];
  /** the chosen offers of the suggested items, by supplier, raised to each supplier's minimum */
  groups: SupplierOrderSuggestion[];
}

export interface ReorderGathering {
  today: string;
  currency: string;
  /** in the order of the kitchens' names */
  kitchens: KitchenReorderFacts[];
}

interface LevelRow {
  kitchen_id: string; item_id: string; sku: string; name: string; category: ItemCategory; stock_unit: StockUnit;
  put_up: string | null; put_up_metres: string | null; par_level: string | null; reorder_point: string; on_hand: string; reserved: string;
}
interface DatedRow { kitchen_id: string; item_id: string; date: string; quantity: string }
interface OrderRow { kitchen_id: string; item_id: string; order_id: string; number: string; status: OrderStatus; due: string | null; quantity: string }
interface OfferRow {
  id: string; item_id: string; sku: string; pack_label: string; pack_size: string; supplier_id: string; supplier_name: string;
  lead_time_days: number; min_order_value: string | null; pack_price: string | null;
}

/** The levels of the scope that have a reorder point: the items that matter. */
const watchedLevels = (knex: Knex | Knex.Transaction, scope: ReorderScope) =>
  knex("stock_levels as lv")
    .join("items as i", function () {
      this.on("i.company_id", "=", "lv.company_id").andOn("i.id", "=", "lv.item_id");
    })
    .where("lv.company_id", scope.companyId)
    .whereIn("lv.kitchen_id", scope.kitchenIds)
    .whereNotNull("lv.reorder_point")
    .whereNull("i.archived_at");

export async function gatherReorder(knex: Knex | Knex.Transaction, scope: ReorderScope): Promise<ReorderGathering> {
  const company: { currency: string; today: string } | undefined = await knex("companies")
    .where({ id: scope.companyId })
    .first("currency", knex.raw("to_char((now() at time zone time_zone)::date, 'YYYY-MM-DD') as today"));
  if (!company) throw new Error(`No company ${scope.companyId}`);
  const today = scope.today ?? company.today;
  if (scope.kitchenIds.length === 0) return { today, currency: company.currency, kitchens: [] };

  const kitchens: { id: string; code: string; name: string }[] = await knex("kitchens")
    .where({ company_id: scope.companyId })
    .whereIn("id", scope.kitchenIds)
    .orderByRaw("lower(name), code")
    .select("id", "code", "name");

  // 1. levels with on hand and reserved
  const balances = knex("stock_balances")
    .where({ company_id: scope.companyId })
    .whereIn("kitchen_id", scope.kitchenIds)
    .groupBy("kitchen_id", "item_id")
    .select("kitchen_id", "item_id", knex.raw("sum(on_hand) as on_hand"), knex.raw("sum(reserved) as reserved"))
    .as("s");
  const levelsQ = watchedLevels(knex, scope)
    .leftJoin(balances, function () {
      this.on("s.kitchen_id", "=", "lv.kitchen_id").andOn("s.item_id", "=", "lv.item_id");
    })
    .orderBy(["i.category", "i.name", "i.id"])
    .select<LevelRow[]>(
      "lv.kitchen_id", "lv.item_id", "i.sku", "i.name", "i.category", "i.stock_unit", "i.put_up",
      knex.raw("trim_scale(i.put_up_metres)::text as put_up_metres"),
      knex.raw("trim_scale(lv.par_level)::text as par_level"),
      knex.raw("trim_scale(lv.reorder_point)::text as reorder_point"),
      knex.raw("trim_scale(coalesce(s.on_hand, 0))::text as on_hand"),
      knex.raw("trim_scale(coalesce(s.reserved, 0))::text as reserved"),
    );

  // 2. planned use not yet reserved, per kitchen, item and batch day
  const unreserved = "greatest(bl.quantity - coalesce(r.quantity, 0), 0)";
  const plannedQ = knex("batch_lines as bl")
    .join("batches as b", function () {
      this.on("b.company_id", "=", "bl.company_id").andOn("b.id", "=", "bl.batch_id");
    })
    .join("stock_levels as lv", function () {
      this.on("lv.kitchen_id", "=", "b.kitchen_id").andOn("lv.item_id", "=", "bl.item_id");
    })
    .joinRaw("left join lateral (select sum(rv.quantity) as quantity from reservations rv where rv.batch_line_id = bl.id) r on true")
    .where("b.company_id", scope.companyId)
    .whereIn("b.kitchen_id", scope.kitchenIds)
    .whereIn("b.status", ["planned", "reserved"])
    .whereNotNull("lv.reorder_point")
    .groupBy("b.kitchen_id", "bl.item_id", "b.planned_for")
    .havingRaw(`sum(${unreserved}) > 0`)
    .select<DatedRow[]>(
      "b.kitchen_id", "bl.item_id",
      knex.raw("to_char(b.planned_for, 'YYYY-MM-DD') as date"),
      knex.raw(`trim_scale(sum(${unreserved}))::text as quantity`),
    );

  // 3. orders to these kitchens with something still to come (drafts and approved ones too, as pending)
  const ordersQ = knex("purchase_order_lines as l")
    .join("purchase_orders as po", function () {
      this.on("po.company_id", "=", "l.company_id").andOn("po.id", "=", "l.order_id");
    })
    .join("suppliers as s", function () {
      this.on("s.company_id", "=", "po.company_id").andOn("s.id", "=", "po.supplier_id");
    })
    .join("companies as c", "c.id", "po.company_id")
    .join("stock_levels as lv", function () {
      this.on("lv.kitchen_id", "=", "po.kitchen_id").andOn("lv.item_id", "=", "l.item_id");
    })
    .where("po.company_id", scope.companyId)
    .whereIn("po.kitchen_id", scope.kitchenIds)
    .whereIn("po.status", ["draft", "approved", "sent", "partly_received"])
    .whereNotNull("lv.reorder_point")
    .whereRaw("l.quantity_stock > l.received_stock")
    .groupBy("po.kitchen_id", "l.item_id", "po.id", "po.number", "po.status", "po.deliver_by", "po.sent_at", "c.time_zone", "s.lead_time_days")
    .orderBy("po.number")
    .select<OrderRow[]>(
      "po.kitchen_id", "l.item_id", "po.id as order_id", "po.number", "po.status",
      knex.raw("to_char(coalesce(po.deliver_by, (po.sent_at at time zone c.time_zone)::date + s.lead_time_days), 'YYYY-MM-DD') as due"),
      knex.raw("trim_scale(sum(l.quantity_stock - l.received_stock))::text as quantity"),
    );

  // 4. who sells each of these items, at what pack and current price
  const offersQ = knex("supplier_items as si")
    .join("suppliers as s", function () {
      this.on("s.company_id", "=", "si.company_id").andOn("s.id", "=", "si.supplier_id");
    })
    .where({ "si.company_id": scope.companyId, "si.active": true, "s.active": true })
    .whereIn("si.item_id", watchedLevels(knex, scope).select("lv.item_id"))
    .orderBy(["s.name", "si.sku"])
    .select<OfferRow[]>(
      "si.id", "si.item_id", "si.sku", "si.pack_label", "s.id as supplier_id", "s.name as supplier_name", "s.lead_time_days",
      knex.raw("trim_scale(si.pack_size_stock)::text as pack_size"),
      knex.raw("trim_scale(s.min_order_value)::text as min_order_value"),
      knex.raw(
        `(select trim_scale(p.pack_price)::text from supplier_item_prices p
           where p.company_id = si.company_id and p.supplier_item_id = si.id and p.effective_from <= ?::date
           order by p.effective_from desc limit 1) as pack_price`,
        [today],
      ),
    );

  const [levels, planned, orders, offers] = await Promise.all([levelsQ, plannedQ, ordersQ, offersQ]);

  const byKey = <T extends { kitchen_id: string; item_id: string }>(rows: T[]) => {
    const m = new Map<string, T[]>();
    for (const r of rows) {
      const k = `${r.kitchen_id}:${r.item_id}`;
      const list = m.get(k);
      if (list) list.push(r);
      else m.set(k, [r]);
    }
    return m;
  };
  const plannedOf = byKey(planned);
  const ordersOf = byKey(orders);
  const offersOf = new Map<string, SupplierOffer[]>();
  for (const o of offers) {
    const list = offersOf.get(o.item_id) ?? [];
    list.push({
      supplierId: o.supplier_id, supplierName: o.supplier_name, supplierItemId: o.id, sku: o.sku, leadTimeDays: o.lead_time_days,
      minOrderValue: o.min_order_value, packSize: o.pack_size, packLabel: o.pack_label, packPrice: o.pack_price,
    });
    offersOf.set(o.item_id, list);
  }

  const itemsOf = new Map<string, ReorderItemFacts[]>();
  for (const l of levels) {
    const key = `${l.kitchen_id}:${l.item_id}`;
    const kitchenOrders = ordersOf.get(key) ?? [];
    const counted = kitchenOrders.filter((o) => (o.status === "sent" || o.status === "partly_received") && o.due !== null);
    const input: ReorderInput = {
      today,
      onHand: l.on_hand,
      reserved: l.reserved,
      reorderPoint: l.reorder_point,
      parLevel: l.par_level,
      plannedUse: (plannedOf.get(key) ?? []).map((p): DatedQuantity => ({ date: p.date, quantity: p.quantity })),
      openOrders: counted.map((o): DatedQuantity => ({ date: o.due!, quantity: o.quantity })),
      offers: offersOf.get(l.item_id) ?? [],
    };
    const facts: ReorderItemFacts = {
      key,
      item: {
        id: l.item_id, sku: l.sku, name: l.name, category: l.category, stockUnit: l.stock_unit,
        putUp: l.put_up && l.put_up_metres ? { name: l.put_up, metres: l.put_up_metres } : null,
      },
      input,
      pendingOrders: kitchenOrders
        .filter((o) => o.status === "draft" || o.status === "approved")
        .map((o) => ({ id: o.order_id, number: o.number, status: o.status, quantity: o.quantity })),
      suggestion: suggestReorder(input),
    };
    const list = itemsOf.get(l.kitchen_id) ?? [];
    list.push(facts);
    itemsOf.set(l.kitchen_id, list);
  }

  return {
    today,
    currency: company.currency,
    kitchens: kitchens.map((k) => {
      const items = itemsOf.get(k.id) ?? [];
      const lines: OrderLineSuggestion[] = items
        .filter((f) => f.suggestion.chosen !== null)
        .map((f) => ({ key: f.key, itemName: f.item.name, figures: f.suggestion.chosen! }));
      return { kitchen: k, items, groups: groupBySupplier(lines) };
    }),
  };
}
