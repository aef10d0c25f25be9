// Price variance (issue 7): what each delivered line cost per stock unit against what was ordered
// and against the supplier's price list on the day, with the value of the difference, per supplier
// and month. reports.read (the CSV: reports.export too); company-scoped.
//
// Where each price lives, and in which unit:
//   ordered   purchase_order_lines.pack_price per the order line's own pack (its pack_size_stock
//             snapshot), for the order line the delivery line was matched to (purchase_order_line_id);
//   delivered the pack price the posting booked: delivery_lines.corrected_unit_price, else
//             unit_price (the note's), else the order line's unless the line is a substitute
//             (postDelivery's rule), per the delivered supplier item's pack;
//   list      supplier_item_prices.pack_price of the delivered supplier item, the row with the
//             latest effective_from on or before the delivery's day, per that supplier item's pack.
// Each becomes a price per stock unit with exactPerStockUnit (pack price / pack size in stock
// units, exact); freight and the landed cost are not prices and stay out.
//
// A delivery's day and month are when it was booked (deliveries.posted_at) in the company's time
// zone; only posted deliveries and their accepted lines count (rejected lines post nothing).
// Quantity = delivery_lines.quantity_stock, what went into stock.
//
// Money: (delivered - ordered) x quantity and (delivered - list) x quantity, exact (Dec); each
// line's value rounded half-even to the currency's decimals when sent (as lib/purchasing/
// order-money rounds line totals); group and report totals add the exact line values and round
// once at the end. A missing comparison is null, never 0, and counted (withoutOrder,
// withoutListPrice) instead of added.
import "server-only";
import { db } from "../../db/client";
import type { ItemCategory, StockUnit } from "../../db/types";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import { toCsv, type CsvCell } from "../csv";
import { CURE_CAUTION } from "../cure/caution";
import { notFound } from "../http/errors";
import { currencyDecimals } from "../purchasing/order-money";
import { exactPerStockUnit, pricePerStockUnit } from "../purchasing/unit-prices";
import { buyingUnit, pricePerBuyingUnit, type PricedItem } from "../reorder/price-per";
import { Dec, ZERO, dec, plain } from "../units";
import type {
  PriceVarianceGroup, PriceVarianceQuery, PriceVarianceReportShape, PriceVarianceRow, PriceVarianceTotals,
} from "../validation/price-variance";

export type PriceVarianceReport = PriceVarianceReportShape;

interface LineRow {
  delivery_id: string;
  note_number: string;
  delivered_on: string;
  month: string;
  line_no: number;
  supplier_id: string;
  supplier_name: string;
  kitchen_code: string;
  item_id: string;
  item_sku: string;
  item_name: string;
  category: ItemCategory;
  stock_unit: StockUnit;
  put_up: string | null;
  put_up_metres: string | null;
  supplier_sku: string;
  pack_label: string;
  pack_size_stock: string;
  packs: string;
  quantity_stock: string;
  noted_price: string | null;
  substitute: boolean;
  order_number: string | null;
  ol_pack_price: string | null;
  ol_pack_size_stock: string | null;
  list_pack_price: string | null;
  list_effective_from: string | null;
}

/** Exact figures of a line, before anything is rounded for sending. */
interface Exact {
  value: Dec;
  order: Dec | null;
  list: Dec | null;
}

/** The one rounding of money: half-even to the currency's decimals. */
function money(v: Dec, currency: string): string {
  const e = currencyDecimals(currency);
  return v.toDecimalPlaces(e, Dec.ROUND_HALF_EVEN).toFixed(e);
}

const perBuying = (exact: Dec | null, item: PricedItem, system: CurrentUser["unitSystem"]) =>
  exact === null ? null : pricePerBuyingUnit(exact.toFixed(), item, system).amount.toDecimalPlaces(4, Dec.ROUND_HALF_EVEN).toFixed(4);

function sums(lines: readonly Exact[], currency: string): PriceVarianceTotals {
  const order = lines.flatMap((l) => (l.order ? [l.order] : []));
  const list = lines.flatMap((l) => (l.list ? [l.list] : []));
  const add = (vs: Dec[]) => vs.reduce((s, v) => s.plus(v), ZERO);
  return {
    lines: lines.length,
    deliveredValue: money(add(lines.map((l) => l.value)), currency),
    orderVariance: order.length ? money(add(order), currency) : null,
    orderCompared: order.length,
    withoutOrder: lines.length - order.length,
    listVariance: list.length ? money(add(list), currency) : null,
    listCompared: list.length,
    withoutListPrice: lines.length - list.length,
  };
}

/** GET /api/reports/price-variance: every accepted line of the deliveries posted in from..to, compared per stock unit. */
export async function getPriceVariance(actor: CurrentUser, query: PriceVarianceQuery): Promise<PriceVarianceReport> {
  assertCan(actor, "reports.read");
  if (query.format === "csv") assertCan(actor, "reports.export");
  const knex = db();
  const company: { time_zone: string; currency: string } = await knex("companies").where({ id: actor.companyId }).first("time_zone", "currency");
  const tz = company.time_zone;
  const currency = company.currency;

  let supplier: { id: string; name: string } | null = null;
  if (query.supplier) {
    supplier = (await knex("suppliers").where({ company_id: actor.companyId, id: query.supplier }).first<{ id: string; name: string } | undefined>("id", "name")) ?? null;
    if (!supplier) throw notFound("Supplier");
  }

  const q = knex("deliveries as d")
    .join("delivery_lines as l", function () {
      this.on("l.company_id", "=", "d.company_id").andOn("l.delivery_id", "=", "d.id");
    })
    .join("supplier_items as si", function () {
      this.on("si.company_id", "=", "l.company_id").andOn("si.id", "=", "l.supplier_item_id");
    })
    .join("items as i", function () {
      this.on("i.company_id", "=", "si.company_id").andOn("i.id", "=", "si.item_id");
    })
    .join("suppliers as s", function () {
      this.on("s.company_id", "=", "d.company_id").andOn("s.id", "=", "d.supplier_id");
    })
    .join("kitchens as k", function () {
      this.on("k.company_id", "=", "d.company_id").andOn("k.id", "=", "d.kitchen_id");
    })
    .leftJoin("purchase_order_lines as ol", function () {
      this.on("ol.company_id", "=", "l.company_id").andOn("ol.id", "=", "l.purchase_order_line_id");
    })
    .leftJoin("purchase_orders as o", function () {
      this.on("o.company_id", "=", "ol.company_id").andOn("o.id", "=", "ol.order_id");
    })
    // the list price in effect on the delivery's day (the company's date of posted_at)
    .joinRaw(
      `left join lateral (select p.pack_price, p.effective_from from supplier_item_prices p
                          where p.company_id = si.company_id and p.supplier_item_id = si.id
                            and p.effective_from <= (d.posted_at at time zone ?)::date
                          order by p.effective_from desc limit 1) as lp on true`,
      [tz],
    )
    .where({ "d.company_id": actor.companyId, "d.status": "posted", "l.decision": "accept" })
    // the months' bounds are the company's midnights
    .whereRaw("d.posted_at >= (?::date)::timestamp at time zone ?", [`${query.from}-01`, tz])
    .whereRaw("d.posted_at < ((?::date) + interval '1 month')::timestamp at time zone ?", [`${query.to}-01`, tz])
    .orderByRaw("lower(s.name), s.id, d.posted_at, d.id, l.line_no")
    .select<LineRow[]>(
      "d.id as delivery_id", "d.note_number",
      knex.raw("to_char(d.posted_at at time zone ?, 'YYYY-MM-DD') as delivered_on", [tz]),
      knex.raw("to_char(d.posted_at at time zone ?, 'YYYY-MM') as month", [tz]),
      "l.line_no", "s.id as supplier_id", "s.name as supplier_name", "k.code as kitchen_code",
      "i.id as item_id", "i.sku as item_sku", "i.name as item_name", "i.category", "i.stock_unit", "i.put_up",
      knex.raw("trim_scale(i.put_up_metres)::text as put_up_metres"),
      "si.sku as supplier_sku", "si.pack_label", knex.raw("trim_scale(si.pack_size_stock)::text as pack_size_stock"),
      knex.raw("trim_scale(coalesce(l.corrected_quantity, l.quantity))::text as packs"),
      knex.raw("trim_scale(l.quantity_stock)::text as quantity_stock"),
      knex.raw("trim_scale(coalesce(l.corrected_unit_price, l.unit_price))::text as noted_price"),
      knex.raw("'different_item' = any(l.findings) as substitute"),
      "o.number as order_number",
      knex.raw("trim_scale(ol.pack_price)::text as ol_pack_price"), knex.raw("trim_scale(ol.pack_size_stock)::text as ol_pack_size_stock"),
      knex.raw("trim_scale(lp.pack_price)::text as list_pack_price"), knex.raw("lp.effective_from::text as list_effective_from"),
    );
  if (query.supplier) q.where("d.supplier_id", query.supplier);
  const lines = await q;

  const rows: PriceVarianceRow[] = [];
  const exact: Exact[] = [];
  for (const r of lines) {
    const orderLine = r.ol_pack_price !== null && r.ol_pack_size_stock !== null ? { price: r.ol_pack_price, size: r.ol_pack_size_stock } : null;
    // postDelivery's rule: the note's price (as corrected), else the order line's unless a substitute
    const packPrice = r.noted_price ?? (orderLine && !r.substitute ? orderLine.price : null);
    if (packPrice === null) continue; // posting refuses an accepted line without a price, so a posted one has one
    const qty = dec(r.quantity_stock);
    const delivered = exactPerStockUnit(packPrice, r.pack_size_stock);
    const ordered = orderLine ? exactPerStockUnit(orderLine.price, orderLine.size) : null;
    const listed = r.list_pack_price !== null ? exactPerStockUnit(r.list_pack_price, r.pack_size_stock) : null;
    const e: Exact = {
      value: delivered.times(qty),
      order: ordered ? delivered.minus(ordered).times(qty) : null,
      list: listed ? delivered.minus(listed).times(qty) : null,
    };
    exact.push(e);
    const item: PricedItem = { stockUnit: r.stock_unit, putUp: r.put_up && r.put_up_metres ? { name: r.put_up, metres: r.put_up_metres } : null };
    rows.push({
      deliveryId: r.delivery_id, noteNumber: r.note_number, deliveredOn: r.delivered_on, month: r.month, lineNo: r.line_no,
      supplierId: r.supplier_id, supplierName: r.supplier_name, kitchenCode: r.kitchen_code,
      itemId: r.item_id, itemSku: r.item_sku, itemName: r.item_name, category: r.category, stockUnit: r.stock_unit,
      supplierSku: r.supplier_sku, packLabel: r.pack_label, packs: r.packs, deliveredPackPrice: plain(packPrice), quantity: plain(qty),
      orderNumber: r.order_number, substitute: Boolean(orderLine) && r.substitute,
      orderedUnitPrice: orderLine ? pricePerStockUnit(orderLine.price, orderLine.size) : null,
      deliveredUnitPrice: pricePerStockUnit(packPrice, r.pack_size_stock),
      listUnitPrice: r.list_pack_price !== null ? pricePerStockUnit(r.list_pack_price, r.pack_size_stock) : null,
      listEffectiveFrom: r.list_effective_from,
      buyingUnit: buyingUnit(item, actor.unitSystem).label,
      orderedPerBuyingUnit: perBuying(ordered, item, actor.unitSystem),
      deliveredPerBuyingUnit: perBuying(delivered, item, actor.unitSystem)!,
      listPerBuyingUnit: perBuying(listed, item, actor.unitSystem),
      deliveredValue: money(e.value, currency),
      orderVariance: e.order ? money(e.order, currency) : null,
      listVariance: e.list ? money(e.list, currency) : null,
    });
  }

  // rows come by supplier then time, so a supplier's months are consecutive
  const groups: PriceVarianceGroup[] = [];
  let start = 0;
  for (let i = 1; i <= rows.length; i++) {
    const a = rows[start]!;
    const b = rows[i];
    if (b && b.supplierId === a.supplierId && b.month === a.month) continue;
    groups.push({ supplierId: a.supplierId, supplierName: a.supplierName, month: a.month, ...sums(exact.slice(start, i), currency) });
    start = i;
  }

  return {
    from: query.from, to: query.to, supplier, currency, timeZone: tz, rounding: "half-even",
    rows, groups, totals: sums(exact, currency),
    cureCaution: rows.some((r) => r.category === "cure") ? CURE_CAUTION : null,
  };
}

/** The CSV's columns: [row field, heading]. One line per row, the same figures as the JSON (empty = null). */
export function priceVarianceColumns(currency: string): [keyof PriceVarianceRow, string][] {
  return [
    ["month", "Month"], ["deliveredOn", "Delivered on"], ["supplierName", "Supplier"], ["noteNumber", "Delivery note"], ["lineNo", "Line"],
    ["kitchenCode", "Kitchen"], ["itemSku", "Item SKU"], ["itemName", "Item"], ["category", "Category"], ["supplierSku", "Supplier SKU"],
    ["packLabel", "Pack"], ["packs", "Packs"], ["deliveredPackPrice", `Pack price (${currency})`], ["quantity", "Quantity (stock unit)"],
    ["stockUnit", "Stock unit"], ["orderNumber", "Order"], ["substitute", "Substitute"],
    ["orderedUnitPrice", `Ordered ${currency} per stock unit`], ["deliveredUnitPrice", `Delivered ${currency} per stock unit`],
    ["listUnitPrice", `List ${currency} per stock unit`], ["listEffectiveFrom", "List price from"], ["buyingUnit", "Buying unit"],
    ["orderedPerBuyingUnit", `Ordered ${currency} per buying unit`], ["deliveredPerBuyingUnit", `Delivered ${currency} per buying unit`],
    ["listPerBuyingUnit", `List ${currency} per buying unit`], ["deliveredValue", `Delivered value (${currency})`],
    ["orderVariance", `Over order (${currency})`], ["listVariance", `Over list (${currency})`],
    ["supplierId", "Supplier id"], ["itemId", "Item id"], ["deliveryId", "Delivery id"],
  ];
}

function cell(v: PriceVarianceRow[keyof PriceVarianceRow]): CsvCell {
  if (typeof v === "boolean") return v ? "yes" : "no";
  return v; // decimal strings go out as written (a spreadsheet reads them as numbers); null is an empty cell
}

/** The rows as CSV (RFC 4180; text that a spreadsheet would run is neutralised by lib/csv.ts). */
export function priceVarianceCsv(report: PriceVarianceReport): string {
  const columns = priceVarianceColumns(report.currency);
  return toCsv(columns.map(([, h]) => h), report.rows.map((r) => columns.map(([k]) => cell(r[k]))));
}
