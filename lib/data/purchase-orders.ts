// Purchase orders: a draft for one supplier and one delivery kitchen, approved (a buyer up to the
// company's approval threshold, a manager or admin above it), sent to the supplier by e-mail with
// the order as PDF and CSV, then received (lib/data/deliveries.ts), closed short or cancelled.
// The step rules are lib/purchasing/order-status.ts; the money lib/purchasing/order-money.ts (the
// server computes every total; clients never send one).
//
// Reads need purchasing.read, writes purchasing.manage, approving orders.approve with the order's
// total against the threshold. Everything is scoped to the actor's company: another company's
// order is 404; a supplier, supplier item or kitchen of another company named in a body is 422
// on that field, as if it did not exist. Every step locks the order row (SELECT ... FOR UPDATE)
// before reading its status, so two approvals or two sends at once cannot both happen: the second
// waits, then finds the order already approved or sent (409 ORDER_STATUS).
import "server-only";
import type { Knex } from "knex";
import { db } from "../../db/client";
import type { ItemCategory, StockUnit } from "../../db/types";
import { CURE_CAUTION } from "../cure/caution";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import { can, canSomewhere } from "../auth/permissions";
import { conflict, forbidden, notFound, validation } from "../http/errors";
import { purchaseOrderCancelledEmail, purchaseOrderEmail } from "../mail/purchase-orders";
import { orderCsv, orderPdf, type OrderDocument } from "../purchasing/order-documents";
import { currencyDecimals, lineTotal, moneyText, orderTotal, orderedStock, toMinor } from "../purchasing/order-money";
import { ORDER_STATUS_LABELS, OrderStepError, assertStep, outstanding, type OrderStatus, type OrderStep } from "../purchasing/order-status";
import { dec, plain, toStoredQuantity } from "../units";
import { isUuid } from "../validation/items";
import type { OrderLineInput, PurchaseOrderCreateInput, PurchaseOrderListQuery, PurchaseOrderPatchInput } from "../validation/purchase-orders";
import { addToOutbox, dispatchOutbox } from "./outbox";

// ---------------------------------------------------------------------------------------------
// Shapes

export interface PurchaseOrderSummary {
  id: string;
  number: string;
  status: OrderStatus;
  statusLabel: string;
  supplier: { id: string; name: string };
  kitchen: { id: string; code: string; name: string };
  deliverBy: string | null;
  currency: string;
  total: string;
  lineCount: number;
  createdAt: string;
  createdBy: string | null;
  sentAt: string | null;
}

export interface PurchaseOrderLine {
  id: string;
  lineNo: number;
  supplierItemId: string;
  supplierSku: string;
  description: string;
  packLabel: string;
  item: { id: string; sku: string; name: string; category: ItemCategory; stockUnit: StockUnit; putUp: { name: string; metres: string } | null };
  packs: string;
  packSizeStock: string;
  orderedStock: string;
  receivedStock: string;
  outstandingStock: string;
  packPrice: string;
  lineTotal: string;
}

export type OrderHistoryStep = "created" | "approved" | "sent" | "closed_short" | "cancelled";

export interface PurchaseOrder {
  id: string;
  number: string;
  status: OrderStatus;
  statusLabel: string;
  supplier: { id: string; name: string; contactName: string; orderEmail: string | null; minOrderValue: string | null };
  kitchen: { id: string; code: string; name: string; address: string };
  deliverBy: string | null;
  notes: string;
  currency: string;
  total: string;
  lines: PurchaseOrderLine[];
  cureCaution: string | null;
  history: { step: OrderHistoryStep; at: string; by: string | null; note: string | null }[];
  approvalThreshold: string;
  needsManager: boolean;
  allowed: { edit: boolean; approve: boolean; send: boolean; closeShort: boolean; cancel: boolean };
  createdAt: string;
  updatedAt: string;
}

export interface PurchaseOrderPage {
  orders: PurchaseOrderSummary[];
  total: number;
  page: number;
  perPage: number;
}

interface OrderRow {
  id: string;
  company_id: string;
  number: string;
  supplier_id: string;
  kitchen_id: string;
  status: OrderStatus;
  deliver_by: string | null;
  notes: string;
  total: string;
  created_by: string | null;
  approved_by: string | null;
  approved_at: Date | null;
  sent_by: string | null;
  sent_at: Date | null;
  sent_outbox_email_id: string | null;
  closed_by: string | null;
  closed_at: Date | null;
  close_reason: string | null;
  cancelled_by: string | null;
  cancelled_at: Date | null;
  cancel_reason: string | null;
  cancel_outbox_email_id: string | null;
  created_at: Date;
  updated_at: Date;
}

interface LineRow {
  id: string;
  line_no: number;
  supplier_item_id: string;
  item_id: string;
  supplier_sku: string;
  description: string;
  pack_label: string;
  packs: string;
  pack_size_stock: string;
  quantity_stock: string;
  pack_price: string;
  line_total: string;
  received_stock: string;
  item_sku: string;
  item_name: string;
  item_category: ItemCategory;
  stock_unit: StockUnit;
  put_up: string | null;
  put_up_metres: string | null;
}

interface CompanyFacts {
  name: string;
  currency: string;
  timeZone: string;
  approvalThreshold: string;
  /** the company's date now, yyyy-mm-dd */
  today: string;
  year: number;
}

// ---------------------------------------------------------------------------------------------
// Helpers

/** The step rules' refusal as a 409 the client can branch on. */
function assertOrderStep(step: OrderStep, status: OrderStatus, receivedAnything = false): void {
  try {
    assertStep(step, status, receivedAnything);
  } catch (e) {
    if (e instanceof OrderStepError) throw conflict(e.message, "ORDER_STATUS", { status });
    throw e;
  }
}

function stepAllowed(step: OrderStep, status: OrderStatus, receivedAnything = false): boolean {
  try {
    assertStep(step, status, receivedAnything);
    return true;
  } catch {
    return false;
  }
}

async function companyFacts(trx: Knex | Knex.Transaction, companyId: string): Promise<CompanyFacts> {
  const r = await trx.raw<{ rows: { name: string; currency: string; time_zone: string; approval_threshold: string; today: string; year: number }[] }>(
    `select name, currency, time_zone, approval_threshold::text,
            to_char((now() at time zone time_zone)::date, 'YYYY-MM-DD') as today,
            extract(year from (now() at time zone time_zone))::int as year
       from companies where id = ?`,
    [companyId],
  );
  const c = r.rows[0]!;
  return { name: c.name, currency: c.currency, timeZone: c.time_zone, approvalThreshold: c.approval_threshold, today: c.today, year: c.year };
}

/** The next number of the company's year, under the counter row's lock (safe with orders created at once). */
async function allocateNumber(trx: Knex.Transaction, companyId: string, year: number): Promise<string> {
  const r = await trx.raw<{ rows: { last_no: number }[] }>(
    `insert into purchase_order_numbers (company_id, year, last_no) values (?, ?, 1)
     on conflict (company_id, year) do update set last_no = purchase_order_numbers.last_no + 1
     returning last_no`,
    [companyId, year],
  );
  return `PO-${year}-${String(r.rows[0]!.last_no).padStart(4, "0")}`;
}

/** The delivery kitchen by id or code: of the company and not archived, else 422 on `kitchen`. */
async function deliveryKitchen(trx: Knex.Transaction, companyId: string, ref: string): Promise<{ id: string; code: string }> {
  const q = trx("kitchens").where({ company_id: companyId });
  if (isUuid(ref)) q.where({ id: ref });
  else q.whereRaw("upper(code) = upper(?)", [ref]);
  const k: { id: string; code: string; archived_at: Date | null } | undefined = await q.first("id", "code", "archived_at");
  if (!k) throw validation({ kitchen: ["No kitchen of your company has this id or code."] });
  if (k.archived_at) throw validation({ kitchen: [`Kitchen ${k.code} is archived: choose another delivery kitchen.`] });
  return { id: k.id, code: k.code };
}

function checkDeliverBy(deliverBy: string | null | undefined, today: string): void {
  if (deliverBy && deliverBy < today) throw validation({ deliverBy: [`Choose today (${today}) or a later day.`] });
}

interface ResolvedLine {
  line_no: number;
  supplier_item_id: string;
  item_id: string;
  supplier_sku: string;
  description: string;
  pack_label: string;
  packs: string;
  pack_size_stock: string;
  quantity_stock: string;
  pack_price: string;
  line_total: string;
}

/**
 * The lines as they will be stored: each supplier item of this supplier and active, its item not
 * archived, its pack and the supplier's SKU, description and pack label copied onto the line, the
 * price as sent or else the current price (the latest price effective on or before today). Every
 * problem is collected, each named by its line (lines.N.supplierItem, lines.N.packPrice).
 */
async function resolveLines(trx: Knex.Transaction, companyId: string, supplier: { id: string; name: string }, lines: OrderLineInput[], facts: CompanyFacts): Promise<ResolvedLine[]> {
  const fields: Record<string, string[]> = {};
  const firstLine = new Map<string, number>();
  lines.forEach((l, i) => {
    const before = firstLine.get(l.supplierItem);
    if (before !== undefined) (fields[`lines.${i}.supplierItem`] ??= []).push(`Already on line ${before + 1}: change its packs instead.`);
    else firstLine.set(l.supplierItem, i);
  });
  const rows: {
    id: string; supplier_id: string; item_id: string; sku: string; description: string; pack_label: string; pack_size_stock: string; active: boolean;
    item_sku: string; item_name: string; item_archived_at: Date | null; current_price: string | null;
  }[] = await trx("supplier_items as si")
    .join("items as i", function () {
      this.on("i.company_id", "=", "si.company_id").andOn("i.id", "=", "si.item_id");
    })
    .where("si.company_id", companyId)
    .whereIn("si.id", [...firstLine.keys()])
    .select(
      "si.id", "si.supplier_id", "si.item_id", "si.sku", "si.description", "si.pack_label", "si.pack_size_stock", "si.active",
      "i.sku as item_sku", "i.name as item_name", "i.archived_at as item_archived_at",
      trx.raw(
        `(select p.pack_price from supplier_item_prices p
           where p.company_id = si.company_id and p.supplier_item_id = si.id and p.effective_from <= ?::date
           order by p.effective_from desc limit 1) as current_price`,
        [facts.today],
      ),
    )
    .forShare("si");
  const byId = new Map(rows.map((r) => [r.id, r]));
  const out: ResolvedLine[] = [];
  lines.forEach((l, i) => {
    const si = byId.get(l.supplierItem);
    const bad = (field: string, message: string) => (fields[`lines.${i}.${field}`] ??= []).push(message);
    if (!si || si.supplier_id !== supplier.id) return bad("supplierItem", `Not an item of ${supplier.name}: choose from its items.`);
    if (!si.active) return bad("supplierItem", `${si.sku} is switched off at ${supplier.name}: switch it on, or choose another item.`);
    if (si.item_archived_at) return bad("supplierItem", `Our item ${si.item_sku} is archived: bring it back in the catalogue first.`);
    const price = l.packPrice ?? si.current_price;
    if (price === null) return bad("packPrice", `${si.sku} has no current price: enter the pack price.`);
    const packs = dec(l.packs).toFixed(0);
    out.push({
      line_no: i + 1,
      supplier_item_id: si.id,
      item_id: si.item_id,
      supplier_sku: si.sku,
      description: si.description.trim() || si.item_name,
      pack_label: si.pack_label,
      packs,
      pack_size_stock: si.pack_size_stock,
      quantity_stock: toStoredQuantity(orderedStock(packs, si.pack_size_stock)),
      pack_price: dec(price).toFixed(4),
      line_total: lineTotal(packs, price, facts.currency),
    });
  });
  if (Object.keys(fields).length) throw validation(fields);
  return out;
}

async function writeLines(trx: Knex.Transaction, companyId: string, orderId: string, lines: ResolvedLine[], currency: string): Promise<string> {
  await trx("purchase_order_lines").where({ company_id: companyId, order_id: orderId }).delete();
  await trx("purchase_order_lines").insert(lines.map((l) => ({ ...l, company_id: companyId, order_id: orderId })));
  return orderTotal(lines.map((l) => l.line_total), currency);
}

/** The order row, locked for this transaction; another company's (or no such) order is 404. */
async function lockOrder(trx: Knex.Transaction, companyId: string, id: string): Promise<OrderRow> {
  const row: OrderRow | undefined = isUuid(id)
    ? await trx("purchase_orders").where({ company_id: companyId, id }).forUpdate().first()
    : undefined;
  if (!row) throw notFound("Purchase order");
  return row;
}

async function userName(trx: Knex | Knex.Transaction, companyId: string, id: string | null): Promise<string | null> {
  if (!id) return null;
  const u: { name: string } | undefined = await trx("app_users").where({ company_id: companyId, id }).first("name");
  return u?.name ?? null;
}

// ---------------------------------------------------------------------------------------------
// Reading

function summaryQuery(knex: Knex | Knex.Transaction, companyId: string) {
  return knex("purchase_orders as po")
    .join("suppliers as s", function () {
      this.on("s.company_id", "=", "po.company_id").andOn("s.id", "=", "po.supplier_id");
    })
    .join("kitchens as k", function () {
      this.on("k.company_id", "=", "po.company_id").andOn("k.id", "=", "po.kitchen_id");
    })
    .join("companies as c", "c.id", "po.company_id")
    .leftJoin("app_users as cu", "cu.id", "po.created_by")
    .where("po.company_id", companyId);
}

interface SummaryRow {
  id: string; number: string; status: OrderStatus; supplier_id: string; supplier_name: string; kitchen_id: string; kitchen_code: string; kitchen_name: string;
  deliver_by: string | null; currency: string; total: string; line_count: number; created_at: Date; created_by_name: string | null; sent_at: Date | null;
}

const toSummary = (r: SummaryRow): PurchaseOrderSummary => ({
  id: r.id,
  number: r.number,
  status: r.status,
  statusLabel: ORDER_STATUS_LABELS[r.status],
  supplier: { id: r.supplier_id, name: r.supplier_name },
  kitchen: { id: r.kitchen_id, code: r.kitchen_code, name: r.kitchen_name },
  deliverBy: r.deliver_by,
  currency: r.currency,
  total: moneyText(r.total, r.currency),
  lineCount: Number(r.line_count),
  createdAt: r.created_at.toISOString(),
  createdBy: r.created_by_name,
  sentAt: r.sent_at?.toISOString() ?? null,
});

/** The company's orders, newest first, filtered by status, supplier and delivery kitchen (code), a page at a time. */
export async function listPurchaseOrders(actor: CurrentUser, q: PurchaseOrderListQuery): Promise<PurchaseOrderPage> {
  assertCan(actor, "purchasing.read");
  const base = summaryQuery(db(), actor.companyId);
  if (q.status) base.where("po.status", q.status);
  if (q.supplier) base.where("po.supplier_id", q.supplier);
  const kitchen = q.kitchen;
  if (kitchen) base.whereRaw("upper(k.code) = upper(?)", [kitchen]);
  const [counted] = await base.clone().count<{ n: string }[]>("* as n");
  const rows: SummaryRow[] = await base
    .clone()
    .select(
      "po.id", "po.number", "po.status", "po.supplier_id", "s.name as supplier_name", "po.kitchen_id", "k.code as kitchen_code", "k.name as kitchen_name",
      "po.deliver_by", "c.currency", "po.total", "po.created_at", "cu.name as created_by_name", "po.sent_at",
      db().raw("(select count(*)::int from purchase_order_lines l where l.order_id = po.id) as line_count"),
    )
    .orderBy([{ column: "po.created_at", order: "desc" }, { column: "po.id", order: "desc" }])
    .limit(q.perPage)
    .offset((q.page - 1) * q.perPage);
  return { orders: rows.map(toSummary), total: Number(counted?.n ?? 0), page: q.page, perPage: q.perPage };
}

async function loadOrder(knex: Knex | Knex.Transaction, actor: CurrentUser, id: string): Promise<PurchaseOrder> {
  if (!isUuid(id)) throw notFound("Purchase order");
  const r: (OrderRow & {
    supplier_name: string; contact_name: string; order_email: string | null; min_order_value: string | null;
    kitchen_code: string; kitchen_name: string; kitchen_address: string; currency: string; approval_threshold: string;
    created_by_name: string | null; approved_by_name: string | null; sent_by_name: string | null; closed_by_name: string | null; cancelled_by_name: string | null;
    sent_to: string[] | null;
  }) | undefined = await knex("purchase_orders as po")
    .join("suppliers as s", function () {
      this.on("s.company_id", "=", "po.company_id").andOn("s.id", "=", "po.supplier_id");
    })
    .join("kitchens as k", function () {
      this.on("k.company_id", "=", "po.company_id").andOn("k.id", "=", "po.kitchen_id");
    })
    .join("companies as c", "c.id", "po.company_id")
    .leftJoin("app_users as cu", "cu.id", "po.created_by")
    .leftJoin("app_users as au", "au.id", "po.approved_by")
    .leftJoin("app_users as su", "su.id", "po.sent_by")
    .leftJoin("app_users as xu", "xu.id", "po.closed_by")
    .leftJoin("app_users as nu", "nu.id", "po.cancelled_by")
    .leftJoin("outbox_emails as ob", "ob.id", "po.sent_outbox_email_id")
    .where({ "po.company_id": actor.companyId, "po.id": id })
    .first(
      "po.*",
      "s.name as supplier_name", "s.contact_name", "s.order_email", "s.min_order_value",
      "k.code as kitchen_code", "k.name as kitchen_name", "k.address as kitchen_address", "c.currency", "c.approval_threshold",
      "cu.name as created_by_name", "au.name as approved_by_name", "su.name as sent_by_name", "xu.name as closed_by_name", "nu.name as cancelled_by_name",
      "ob.to_addresses as sent_to",
    );
  if (!r) throw notFound("Purchase order");
  const lineRows: LineRow[] = await knex("purchase_order_lines as l")
    .join("items as i", function () {
      this.on("i.company_id", "=", "l.company_id").andOn("i.id", "=", "l.item_id");
    })
    .where({ "l.company_id": actor.companyId, "l.order_id": id })
    .orderBy("l.line_no")
    .select("l.*", "i.sku as item_sku", "i.name as item_name", "i.category as item_category", "i.stock_unit", "i.put_up", "i.put_up_metres");
  const currency = r.currency;
  const lines: PurchaseOrderLine[] = lineRows.map((l) => ({
    id: l.id,
    lineNo: l.line_no,
    supplierItemId: l.supplier_item_id,
    supplierSku: l.supplier_sku,
    description: l.description,
    packLabel: l.pack_label,
    item: {
      id: l.item_id, sku: l.item_sku, name: l.item_name, category: l.item_category, stockUnit: l.stock_unit,
      putUp: l.put_up && l.put_up_metres ? { name: l.put_up, metres: plain(l.put_up_metres) } : null,
    },
    packs: plain(l.packs),
    packSizeStock: plain(l.pack_size_stock),
    orderedStock: plain(l.quantity_stock),
    receivedStock: plain(l.received_stock),
    outstandingStock: plain(outstanding({ ordered: l.quantity_stock, received: l.received_stock })),
    packPrice: moneyText(l.pack_price, currency),
    lineTotal: moneyText(l.line_total, currency),
  }));
  const history: PurchaseOrder["history"] = [{ step: "created", at: r.created_at.toISOString(), by: r.created_by_name, note: null }];
  if (r.approved_at) history.push({ step: "approved", at: r.approved_at.toISOString(), by: r.approved_by_name, note: null });
  if (r.sent_at) history.push({ step: "sent", at: r.sent_at.toISOString(), by: r.sent_by_name, note: r.sent_to?.length ? `To ${r.sent_to.join(", ")}` : null });
  if (r.closed_at) history.push({ step: "closed_short", at: r.closed_at.toISOString(), by: r.closed_by_name, note: r.close_reason });
  if (r.cancelled_at) history.push({ step: "cancelled", at: r.cancelled_at.toISOString(), by: r.cancelled_by_name, note: r.cancel_reason });

  const receivedAnything = lineRows.some((l) => dec(l.received_stock).gt(0));
  const manage = can(actor, "purchasing.manage");
  const needsManager = toMinor(r.total, currency) > toMinor(r.approval_threshold, currency);
  return {
    id: r.id,
    number: r.number,
    status: r.status,
    statusLabel: ORDER_STATUS_LABELS[r.status],
    supplier: {
      id: r.supplier_id, name: r.supplier_name, contactName: r.contact_name, orderEmail: r.order_email,
      minOrderValue: r.min_order_value === null ? null : moneyText(r.min_order_value, currency),
    },
    kitchen: { id: r.kitchen_id, code: r.kitchen_code, name: r.kitchen_name, address: r.kitchen_address },
    deliverBy: r.deliver_by,
    notes: r.notes,
    currency,
    total: moneyText(r.total, currency),
    lines,
    cureCaution: lines.some((l) => l.item.category === "cure") ? CURE_CAUTION : null,
    history,
    approvalThreshold: moneyText(r.approval_threshold, currency),
    needsManager,
    allowed: {
      edit: manage && stepAllowed("edit", r.status),
      approve: stepAllowed("approve", r.status) && can(actor, "orders.approve", {
        amountMinor: toMinor(r.total, currency), approvalThresholdMinor: toMinor(r.approval_threshold, currency),
      }),
      send: manage && stepAllowed("send", r.status),
      closeShort: manage && stepAllowed("close_short", r.status),
      cancel: manage && stepAllowed("cancel", r.status, receivedAnything),
    },
    createdAt: r.created_at.toISOString(),
    updatedAt: r.updated_at.toISOString(),
  };
}

/** One order of the actor's company with its lines, history and the steps the actor may take. */
export async function getPurchaseOrder(actor: CurrentUser, id: string): Promise<PurchaseOrder> {
  assertCan(actor, "purchasing.read");
  return loadOrder(db(), actor, id);
}

/** What the new-order form offers: active suppliers, each with its active items and their current prices. */
export interface OrderCatalogueSupplier {
  id: string;
  name: string;
  orderEmail: string | null;
  minOrderValue: string | null;
  items: {
    id: string;
    sku: string;
    description: string;
    packLabel: string;
    item: { id: string; sku: string; name: string; category: ItemCategory; stockUnit: StockUnit; putUp: { name: string; metres: string } | null };
    packSizeStock: string;
    /** the latest price effective today or before, or null when none is known */
    currentPrice: string | null;
  }[];
}

export async function orderCatalogue(actor: CurrentUser): Promise<{ currency: string; today: string; suppliers: OrderCatalogueSupplier[] }> {
  assertCan(actor, "purchasing.read");
  const facts = await companyFacts(db(), actor.companyId);
  const suppliers: { id: string; name: string; order_email: string | null; min_order_value: string | null }[] = await db()("suppliers")
    .where({ company_id: actor.companyId, active: true })
    .orderByRaw("lower(name)")
    .select("id", "name", "order_email", "min_order_value");
  const items: {
    id: string; supplier_id: string; sku: string; description: string; pack_label: string; pack_size_stock: string; item_id: string;
    item_sku: string; item_name: string; item_category: ItemCategory; stock_unit: StockUnit; put_up: string | null; put_up_metres: string | null; current_price: string | null;
  }[] = await db()("supplier_items as si")
    .join("items as i", function () {
      this.on("i.company_id", "=", "si.company_id").andOn("i.id", "=", "si.item_id");
    })
    .where({ "si.company_id": actor.companyId, "si.active": true })
    .whereNull("i.archived_at")
    .orderByRaw("lower(si.sku)")
    .select(
      "si.id", "si.supplier_id", "si.sku", "si.description", "si.pack_label", "si.pack_size_stock", "si.item_id",
      "i.sku as item_sku", "i.name as item_name", "i.category as item_category", "i.stock_unit", "i.put_up", "i.put_up_metres",
      db().raw(
        `(select p.pack_price from supplier_item_prices p
           where p.company_id = si.company_id and p.supplier_item_id = si.id and p.effective_from <= ?::date
           order by p.effective_from desc limit 1) as current_price`,
        [facts.today],
      ),
    );
  const bySupplier = new Map<string, OrderCatalogueSupplier["items"]>();
  for (const r of items) {
    const list = bySupplier.get(r.supplier_id) ?? [];
    list.push({
      id: r.id, sku: r.sku, description: r.description.trim() || r.item_name, packLabel: r.pack_label,
      item: {
        id: r.item_id, sku: r.item_sku, name: r.item_name, category: r.item_category, stockUnit: r.stock_unit,
        putUp: r.put_up && r.put_up_metres ? { name: r.put_up, metres: plain(r.put_up_metres) } : null,
      },
      packSizeStock: plain(r.pack_size_stock),
      currentPrice: r.current_price === null ? null : moneyText(r.current_price, facts.currency),
    });
    bySupplier.set(r.supplier_id, list);
  }
  return {
    currency: facts.currency,
    today: facts.today,
    suppliers: suppliers.map((s) => ({
      id: s.id, name: s.name, orderEmail: s.order_email,
      minOrderValue: s.min_order_value === null ? null : moneyText(s.min_order_value, facts.currency),
      items: bySupplier.get(s.id) ?? [],
    })),
  };
}

// ---------------------------------------------------------------------------------------------
// Writing

/**
 * A draft order (also what the reorder suggestion calls to turn its lines into an order). Whole
 * packs; a line without a pack price takes the supplier item's current price.
 */
/** Creates a draft; with `outer`, inside the caller's transaction (several drafts all or nothing). */
export async function createPurchaseOrder(actor: CurrentUser, input: PurchaseOrderCreateInput, outer?: Knex.Transaction): Promise<PurchaseOrder> {
  assertCan(actor, "purchasing.manage");
  const run = <T>(fn: (trx: Knex.Transaction) => Promise<T>) => (outer ? fn(outer) : db().transaction(fn));
  return run(async (trx) => {
    const facts = await companyFacts(trx, actor.companyId);
    const supplier: { id: string; name: string; active: boolean } | undefined = isUuid(input.supplier)
      ? await trx("suppliers").where({ company_id: actor.companyId, id: input.supplier }).forShare().first("id", "name", "active")
      : undefined;
    if (!supplier) throw validation({ supplier: ["No supplier of your company has this id."] });
    if (!supplier.active) throw validation({ supplier: [`${supplier.name} is switched off: switch it on under Buying before ordering from it.`] });
    const kitchen = await deliveryKitchen(trx, actor.companyId, input.kitchen);
    checkDeliverBy(input.deliverBy, facts.today);
    const lines = await resolveLines(trx, actor.companyId, supplier, input.lines, facts);
    const number = await allocateNumber(trx, actor.companyId, facts.year);
    const [row] = await trx("purchase_orders")
      .insert({
        company_id: actor.companyId, number, supplier_id: supplier.id, kitchen_id: kitchen.id, status: "draft",
        deliver_by: input.deliverBy ?? null, notes: input.notes ?? "", created_by: actor.id,
      })
      .returning<{ id: string }[]>("id");
    const total = await writeLines(trx, actor.companyId, row!.id, lines, facts.currency);
    await trx("purchase_orders").where({ id: row!.id }).update({ total });
    return loadOrder(trx, actor, row!.id);
  });
}

/** Changes a draft: the fields sent; `lines` replaces every line (prices as sent, else current). */
export async function updatePurchaseOrder(actor: CurrentUser, id: string, patch: PurchaseOrderPatchInput): Promise<PurchaseOrder> {
  assertCan(actor, "purchasing.manage");
  return db().transaction(async (trx) => {
    const order = await lockOrder(trx, actor.companyId, id);
    assertOrderStep("edit", order.status);
    const facts = await companyFacts(trx, actor.companyId);
    const changes: Record<string, unknown> = { updated_at: trx.fn.now() };
    if (patch.kitchen !== undefined) changes.kitchen_id = (await deliveryKitchen(trx, actor.companyId, patch.kitchen)).id;
    if (patch.deliverBy !== undefined) {
      checkDeliverBy(patch.deliverBy, facts.today);
      changes.deliver_by = patch.deliverBy;
    }
    if (patch.notes !== undefined) changes.notes = patch.notes;
    if (patch.lines !== undefined) {
      const supplier: { id: string; name: string } = await trx("suppliers").where({ company_id: actor.companyId, id: order.supplier_id }).first("id", "name");
      const lines = await resolveLines(trx, actor.companyId, supplier, patch.lines, facts);
      changes.total = await writeLines(trx, actor.companyId, order.id, lines, facts.currency);
    }
    await trx("purchase_orders").where({ company_id: actor.companyId, id: order.id }).update(changes);
    return loadOrder(trx, actor, order.id);
  });
}

/**
 * Approves a draft. A buyer approves up to the company's approval threshold; above it a manager
 * or admin must (403 naming the threshold). The total and the threshold are compared in minor
 * units of the company's currency, as lib/auth/permissions takes them.
 */
export async function approvePurchaseOrder(actor: CurrentUser, id: string): Promise<PurchaseOrder> {
  if (!canSomewhere(actor, "orders.approve")) throw forbidden("Your role may not approve purchase orders (admins, managers and buyers only).");
  return db().transaction(async (trx) => {
    const order = await lockOrder(trx, actor.companyId, id);
    assertOrderStep("approve", order.status);
    const facts = await companyFacts(trx, actor.companyId);
    const amountMinor = toMinor(order.total, facts.currency);
    const approvalThresholdMinor = toMinor(facts.approvalThreshold, facts.currency);
    if (!can(actor, "orders.approve", { amountMinor, approvalThresholdMinor })) {
      throw forbidden(
        `This order comes to ${moneyText(order.total, facts.currency)} ${facts.currency}, above the approval threshold of ${moneyText(facts.approvalThreshold, facts.currency)} ${facts.currency}: a manager must approve it.`,
      );
    }
    await trx("purchase_orders").where({ company_id: actor.companyId, id: order.id })
      .update({ status: "approved", approved_by: actor.id, approved_at: trx.fn.now(), updated_at: trx.fn.now() });
    return loadOrder(trx, actor, order.id);
  });
}

/** The order as the supplier reads it (PDF and CSV); dated the day it was sent, else today. */
async function orderDocument(trx: Knex | Knex.Transaction, actor: CurrentUser, order: OrderRow, facts: CompanyFacts, orderedOn: string): Promise<OrderDocument> {
  const s: { name: string; contact_name: string; order_email: string | null } = await trx("suppliers")
    .where({ company_id: actor.companyId, id: order.supplier_id }).first("name", "contact_name", "order_email");
  const k: { name: string; address: string } = await trx("kitchens").where({ company_id: actor.companyId, id: order.kitchen_id }).first("name", "address");
  const lines: LineRow[] = await trx("purchase_order_lines").where({ company_id: actor.companyId, order_id: order.id }).orderBy("line_no");
  return {
    number: order.number,
    companyName: facts.name,
    supplierName: s.name,
    supplierContact: s.contact_name.trim() || null,
    supplierEmail: s.order_email,
    deliverTo: { name: k.name, address: k.address },
    orderedOn,
    deliverBy: order.deliver_by,
    currency: facts.currency,
    lines: lines.map((l) => ({
      lineNo: l.line_no,
      sku: l.supplier_sku,
      description: l.description,
      packLabel: l.pack_label,
      packs: plain(l.packs),
      packPrice: moneyText(l.pack_price, facts.currency),
      lineTotal: moneyText(l.line_total, facts.currency),
    })),
    total: moneyText(order.total, facts.currency),
    notes: order.notes.trim() || null,
    approvedBy: await userName(trx, actor.companyId, order.approved_by),
  };
}

const dateIn = (d: Date, timeZone: string) =>
  new Intl.DateTimeFormat("en-CA", { timeZone, year: "numeric", month: "2-digit", day: "2-digit" }).format(d);

/** The attachments the supplier gets; also what GET .../pdf and .../csv download. */
async function orderFiles(doc: OrderDocument) {
  return {
    pdf: { filename: `${doc.number}.pdf`, contentType: "application/pdf", content: await orderPdf(doc) },
    csv: { filename: `${doc.number}.csv`, contentType: "text/csv; charset=utf-8", content: new TextEncoder().encode(orderCsv(doc)) },
  };
}

/**
 * Sends an approved order: the e-mail to the supplier's order address with the PDF and CSV
 * attached is written to the outbox in the same transaction as the status change, and handed to
 * the queue after commit. No order e-mail on the supplier: 422 on supplier.orderEmail.
 */
export async function sendPurchaseOrder(actor: CurrentUser, id: string): Promise<PurchaseOrder> {
  const { order, outboxId } = await sendInTransaction(actor, id);
  dispatchOutbox([outboxId]);
  return order;
}

/** The send without the dispatch (the demo seed leaves the e-mail to the worker's sweep). */
export async function sendInTransaction(actor: CurrentUser, id: string): Promise<{ order: PurchaseOrder; outboxId: string }> {
  assertCan(actor, "purchasing.manage");
  return db().transaction(async (trx) => {
    const order = await lockOrder(trx, actor.companyId, id);
    assertOrderStep("send", order.status);
    const facts = await companyFacts(trx, actor.companyId);
    const supplier: { name: string; contact_name: string; order_email: string | null } = await trx("suppliers")
      .where({ company_id: actor.companyId, id: order.supplier_id }).first("name", "contact_name", "order_email");
    if (!supplier.order_email) {
      throw validation({ "supplier.orderEmail": [`${supplier.name} has no order e-mail address: add one to the supplier, then send.`] }, "The supplier has no order e-mail address.");
    }
    // the transaction's now(): the sent_at written below and the date on the documents agree
    const { rows } = await trx.raw<{ rows: { now: Date }[] }>("select now() as now");
    const sentOn = dateIn(rows[0]!.now, facts.timeZone);
    const doc = await orderDocument(trx, actor, order, facts, sentOn);
    const files = await orderFiles(doc);
    const kitchen: { name: string; address: string } = await trx("kitchens").where({ company_id: actor.companyId, id: order.kitchen_id }).first("name", "address");
    const mail = purchaseOrderEmail({
      number: order.number, companyName: facts.name, supplierContact: supplier.contact_name, kitchenName: kitchen.name, kitchenAddress: kitchen.address,
      deliverBy: order.deliver_by, total: doc.total, currency: facts.currency, lineCount: doc.lines.length, notes: order.notes, senderName: actor.name,
    });
    const outboxId = await addToOutbox(trx, { companyId: actor.companyId, to: [supplier.order_email], ...mail, attachments: [files.pdf, files.csv] });
    await trx("purchase_orders").where({ company_id: actor.companyId, id: order.id }).update({
      status: "sent", sent_by: actor.id, sent_at: trx.fn.now(), sent_outbox_email_id: outboxId, updated_at: trx.fn.now(),
    });
    return { order: await loadOrder(trx, actor, order.id), outboxId };
  });
}

/** Closes a sent or partly received order short: the rest will not come. */
export async function closePurchaseOrderShort(actor: CurrentUser, id: string, reason: string): Promise<PurchaseOrder> {
  assertCan(actor, "purchasing.manage");
  return db().transaction(async (trx) => {
    const order = await lockOrder(trx, actor.companyId, id);
    assertOrderStep("close_short", order.status);
    await trx("purchase_orders").where({ company_id: actor.companyId, id: order.id })
      .update({ status: "closed_short", closed_by: actor.id, closed_at: trx.fn.now(), close_reason: reason, updated_at: trx.fn.now() });
    return loadOrder(trx, actor, order.id);
  });
}

/**
 * Cancels a draft, an approved order, or a sent one before anything arrived. A sent order's
 * supplier is told by e-mail, at the address the order went to.
 */
export async function cancelPurchaseOrder(actor: CurrentUser, id: string, reason: string): Promise<PurchaseOrder> {
  assertCan(actor, "purchasing.manage");
  const { order, outboxId } = await db().transaction(async (trx) => {
    const row = await lockOrder(trx, actor.companyId, id);
    const received = await trx("purchase_order_lines").where({ company_id: actor.companyId, order_id: row.id }).where("received_stock", ">", 0).first("id");
    assertOrderStep("cancel", row.status, Boolean(received));
    let outboxId: string | null = null;
    if (row.status === "sent") {
      const facts = await companyFacts(trx, actor.companyId);
      const supplier: { contact_name: string; order_email: string | null } = await trx("suppliers")
        .where({ company_id: actor.companyId, id: row.supplier_id }).first("contact_name", "order_email");
      const sent: { to_addresses: string[] } | undefined = row.sent_outbox_email_id
        ? await trx("outbox_emails").where({ id: row.sent_outbox_email_id }).first("to_addresses")
        : undefined;
      const to = sent?.to_addresses.length ? sent.to_addresses : supplier.order_email ? [supplier.order_email] : [];
      if (to.length) {
        const mail = purchaseOrderCancelledEmail({
          number: row.number, companyName: facts.name, supplierContact: supplier.contact_name,
          sentOn: dateIn(row.sent_at!, facts.timeZone), reason, senderName: actor.name,
        });
        outboxId = await addToOutbox(trx, { companyId: actor.companyId, to, ...mail });
      }
    }
    await trx("purchase_orders").where({ company_id: actor.companyId, id: row.id }).update({
      status: "cancelled", cancelled_by: actor.id, cancelled_at: trx.fn.now(), cancel_reason: reason, cancel_outbox_email_id: outboxId, updated_at: trx.fn.now(),
    });
    return { order: await loadOrder(trx, actor, row.id), outboxId };
  });
  if (outboxId) dispatchOutbox([outboxId]);
  return order;
}

// ---------------------------------------------------------------------------------------------
// Documents

/** The order as PDF or CSV, as the supplier got it (dated the day it was sent; not yet sent: today). */
export async function purchaseOrderFile(actor: CurrentUser, id: string, kind: "pdf" | "csv"): Promise<{ filename: string; contentType: string; content: Uint8Array }> {
  assertCan(actor, "purchasing.read");
  if (!isUuid(id)) throw notFound("Purchase order");
  const order: OrderRow | undefined = await db()("purchase_orders").where({ company_id: actor.companyId, id })
    .first();
  if (!order) throw notFound("Purchase order");
  const facts = await companyFacts(db(), actor.companyId);
  const doc = await orderDocument(db(), actor, order, facts, order.sent_at ? dateIn(order.sent_at, facts.timeZone) : facts.today);
  return (await orderFiles(doc))[kind];
}

// ---------------------------------------------------------------------------------------------
// The approval threshold (a company setting: Settings > Company, and PATCH /api/company)

/** The threshold with the currency's decimals ("500.00"). Everyone who may read buying may read it. */
export async function getApprovalThreshold(actor: CurrentUser): Promise<{ approvalThreshold: string; currency: string }> {
  const facts = await companyFacts(db(), actor.companyId);
  return { approvalThreshold: moneyText(facts.approvalThreshold, facts.currency), currency: facts.currency };
}

/** Admins only; at most as many decimals as the currency has (422 on approvalThreshold). */
export async function updateApprovalThreshold(actor: CurrentUser, value: string): Promise<{ approvalThreshold: string; currency: string }> {
  assertCan(actor, "company.manage");
  const facts = await companyFacts(db(), actor.companyId);
  checkThresholdDecimals(value, facts.currency);
  await db()("companies").where({ id: actor.companyId }).update({ approval_threshold: value });
  return { approvalThreshold: moneyText(value, facts.currency), currency: facts.currency };
}

export function checkThresholdDecimals(value: string, currency: string): void {
  const e = currencyDecimals(currency);
  if (dec(value).decimalPlaces() > e) {
    throw validation({ approvalThreshold: [e === 0 ? `${currency} has no decimals: enter a whole amount.` : `${currency} has ${e} decimals: enter at most ${e}.`] });
  }
}
