// Deliveries: a supplier's delivery note reconciled against open purchase orders, then posted.
//
//   1. In: a CSV (receiveDeliveryCsv: lib/data/uploads.ts streams it, lib/import reads it with the
//      mapping sent, else the one remembered for this supplier, else one proposed from the headers),
//      or lines keyed in (createKeyedDelivery), or lines added one by one (addDeliveryLine: keyed or
//      read from a case label). A row that cannot be read is 422 with its row and column; nothing is
//      written then but the upload record.
//   2. reconcile(): every line matched to the supplier's items (supplier SKU, case-insensitive, else
//      GTIN-14) and to an open order line (the named order, else the supplier's open orders for the
//      kitchen, oldest first): the same supplier item, else another supplier item of the same stock
//      item (a substitute: different_item); then its findings (lib/purchasing/delivery-findings.ts).
//      Run again after every change, so the findings always describe the lines as corrected.
//   3. The buyer accepts, rejects or corrects each line (updateDeliveryLine); an expired line cannot
//      be accepted.
//   4. postDelivery: one transaction with the delivery row locked (a second post, also at the same
//      time, answers the posted delivery and posts nothing): receipts into the delivery's kitchen
//      through the ledger (lots with supplier, lot code, date and the landed unit cost: line value
//      plus its share of the freight by value, over the quantity in stock units), order lines'
//      received_stock, the orders' status (statusAfterReceipt), the delivery posted.
//
// Quantities on a note count the supplier's packs; quantity_stock = packs x pack_size_stock, exact.
import "server-only";
import { randomUUID } from "node:crypto";
import type { Knex } from "knex";
import { db } from "../../db/client";
import type { DateKind, ItemCategory, StockUnit } from "../../db/types";
import { assertCan } from "../auth/assert";
import { can } from "../auth/permissions";
import type { CurrentUser } from "../auth/current-user";
import { CURE_CAUTION } from "../cure/caution";
import { normalizeGtin } from "../gs1/gtin";
import { AppError, conflict, forbidden, notFound, validation } from "../http/errors";
import { importCsv, proposeDateFormat, proposeMapping, proposeNumberFormat, sniffCsv, type CsvProblem, type ImportRow, type RowIssue } from "../import";
import { DEFAULT_RECEIVING_RULES, findingsFor, landedUnitCosts, type DeliveryFinding, type ReceivingRules } from "../purchasing/delivery-findings";
import { DELIVERY_NOTE_FIELDS, dateKindFrom, type DeliveryNoteField } from "../purchasing/delivery-note-fields";
import { moneyText } from "../purchasing/order-money";
import { OPEN_FOR_RECEIPT, statusAfterReceipt, type OrderStatus } from "../purchasing/order-status";
import { dec, Dec, plain, toStoredQuantity, toStoredUnitCost } from "../units";
import { DOCUMENT_FILE_TYPES, IMPORT_FILE_TYPES } from "../uploads/file-types";
import type { z } from "zod";
import type {
  deliveryKeyedInput, deliveryLineInput, deliveryLinePatchInput, deliveryListQuery, deliveryPatchInput, DeliveryListResponse, DeliveryResponse,
} from "../validation/deliveries";
import { deliveryUploadFields } from "../validation/deliveries";
import { csvMapping, type CsvMapping } from "../validation/imports";
import { isUuid } from "../validation/items";
import { inTransaction, postInTransaction } from "./ledger";
import { receiveUpload, uploadFilePath } from "./uploads";

export type Delivery = DeliveryResponse;
export type DeliveryList = DeliveryListResponse;

/** A delivery note CSV has at most this many lines. */
export const MAX_DELIVERY_LINES = 2000;

type Trx = Knex | Knex.Transaction;

interface DeliveryRow {
  id: string;
  company_id: string;
  supplier_id: string;
  kitchen_id: string;
  purchase_order_id: string | null;
  note_number: string | null;
  note_date: string | null;
  upload_id: string | null;
  document_upload_id: string | null;
  freight: string;
  status: "draft" | "posted";
  posted_by: string | null;
  posted_at: Date | null;
  posting_id: string | null;
  created_at: Date;
}

interface LineRow {
  id: string;
  line_no: number;
  row_number: number | null;
  source: "csv" | "keyed" | "scan";
  sku: string | null;
  gtin14: string | null;
  description: string | null;
  quantity: string;
  unit_price: string | null;
  lot_code: string | null;
  date: string | null;
  date_kind: DateKind | null;
  corrected_supplier_item_id: string | null;
  corrected_quantity: string | null;
  corrected_unit_price: string | null;
  corrected_lot_code: string | null;
  corrected_date: string | null;
  corrected_date_kind: DateKind | null;
  supplier_item_id: string | null;
  quantity_stock: string | null;
  purchase_order_line_id: string | null;
  findings: DeliveryFinding[];
  decision: "pending" | "accept" | "reject";
  landed_unit_cost: string | null;
  lot_id: string | null;
}

interface CatalogueEntry {
  id: string;
  sku: string;
  description: string;
  packLabel: string;
  packSizeStock: string;
  gtin14: string | null;
  item: { id: string; sku: string; name: string; category: ItemCategory; stockUnit: StockUnit; trackLots: boolean; trackDates: boolean };
}

interface OrderLineFacts {
  id: string;
  order_id: string;
  order_number: string;
  line_no: number;
  supplier_item_id: string;
  supplier_sku: string;
  item_id: string;
  quantity_stock: string;
  received_stock: string;
  pack_price: string;
  pack_size_stock: string;
}

interface CompanyFacts {
  currency: string;
  today: string;
  rules: ReceivingRules;
}

// ---------------------------------------------------------------------------------------------
// Reading what is on record

async function companyFacts(trx: Trx, companyId: string): Promise<CompanyFacts> {
  const r = await trx("companies")
    .where({ id: companyId })
    .first<{
      currency: string; today: string; tolerance: string; cure: number; casing: number; spice: number; ingredient: number;
    }>(
      "currency", trx.raw("to_char((now() at time zone time_zone)::date, 'YYYY-MM-DD') as today"), trx.raw("trim_scale(receiving_price_tolerance_pct)::text as tolerance"),
      "short_dated_days_cure as cure", "short_dated_days_casing as casing", "short_dated_days_spice as spice", "short_dated_days_ingredient as ingredient",
    );
  return {
    currency: r.currency, today: r.today,
    rules: { priceTolerancePercent: r.tolerance, shortDatedDays: { cure: r.cure, casing: r.casing, spice: r.spice, ingredient: r.ingredient } },
  };
}

async function catalogueOf(trx: Trx, companyId: string, supplierId: string): Promise<CatalogueEntry[]> {
  const rows = await trx("supplier_items as si")
    .join("items as i", function () {
      this.on("i.company_id", "=", "si.company_id").andOn("i.id", "=", "si.item_id");
    })
    .where({ "si.company_id": companyId, "si.supplier_id": supplierId })
    .select<{
      id: string; sku: string; description: string; pack_label: string; pack_size_stock: string; gtin14: string | null;
      item_id: string; item_sku: string; item_name: string; category: ItemCategory; stock_unit: StockUnit; track_lots: boolean; track_dates: boolean;
    }[]>(
      "si.id", "si.sku", "si.description", "si.pack_label", trx.raw("trim_scale(si.pack_size_stock)::text as pack_size_stock"), "si.gtin14",
      "i.id as item_id", "i.sku as item_sku", "i.name as item_name", "i.category", "i.stock_unit", "i.track_lots", "i.track_dates",
    );
  return rows.map((r) => ({
    id: r.id, sku: r.sku, description: r.description, packLabel: r.pack_label, packSizeStock: r.pack_size_stock, gtin14: r.gtin14,
    item: { id: r.item_id, sku: r.item_sku, name: r.item_name, category: r.category, stockUnit: r.stock_unit, trackLots: r.track_lots, trackDates: r.track_dates },
  }));
}

async function loadDelivery(trx: Trx, actor: CurrentUser, id: string, lock = false): Promise<DeliveryRow> {
  if (!isUuid(id)) throw notFound("Delivery");
  const q = trx("deliveries").where({ company_id: actor.companyId, id });
  const row: DeliveryRow | undefined = await (lock ? q.forUpdate() : q).first();
  if (!row) throw notFound("Delivery");
  assertCan(actor, "stock.receive", { kitchenId: row.kitchen_id });
  return row;
}

function assertDraft(d: DeliveryRow): void {
  if (d.status !== "draft") throw conflict(`Delivery note ${d.note_number ?? ""} is already posted; it cannot be changed.`.replace("  ", " "), "DELIVERY_POSTED", { deliveryId: d.id });
}

async function resolveKitchen(trx: Trx, actor: CurrentUser, ref: string): Promise<{ id: string; code: string }> {
  const q = trx("kitchens").where({ company_id: actor.companyId });
  const row: { id: string; code: string; archived_at: Date | null } | undefined = await (isUuid(ref) ? q.where({ id: ref }) : q.whereRaw("upper(code) = upper(?)", [ref])).first();
  if (!row) throw validation({ kitchen: ["No such kitchen in your company."] });
  assertCan(actor, "stock.receive", { kitchenId: row.id });
  if (row.archived_at) throw validation({ kitchen: [`Kitchen ${row.code} is archived.`] });
  return row;
}

async function resolveSupplier(trx: Trx, actor: CurrentUser, id: string): Promise<{ id: string; name: string }> {
  const row = isUuid(id) ? await trx("suppliers").where({ company_id: actor.companyId, id }).first<{ id: string; name: string } | undefined>("id", "name") : undefined;
  if (!row) throw validation({ supplier: ["No such supplier in your company."] });
  return row;
}

async function resolveOrder(trx: Trx, actor: CurrentUser, id: string, supplier: { id: string; name: string }, kitchen: { id: string; code: string }): Promise<string> {
  const row = await trx("purchase_orders").where({ company_id: actor.companyId, id }).first<{ id: string; number: string; supplier_id: string; kitchen_id: string; status: OrderStatus } | undefined>();
  if (!row) throw validation({ order: ["No such purchase order in your company."] });
  if (row.supplier_id !== supplier.id) throw validation({ order: [`${row.number} is not an order to ${supplier.name}.`] });
  if (row.kitchen_id !== kitchen.id) throw validation({ order: [`${row.number} is delivered to another kitchen, not ${kitchen.code}.`] });
  if (!OPEN_FOR_RECEIPT.includes(row.status)) throw validation({ order: [`${row.number} is not open for delivery (it is ${row.status.replace("_", " ")}).`] });
  return row.id;
}

/** A posted delivery with this note number from this supplier: 409 naming it. */
async function assertNoteNotPosted(trx: Trx, companyId: string, supplierId: string, noteNumber: string | null, exceptId?: string): Promise<void> {
  if (!noteNumber) return;
  const q = trx("deliveries").where({ company_id: companyId, supplier_id: supplierId, status: "posted" }).whereRaw("lower(note_number) = lower(?)", [noteNumber]);
  if (exceptId) q.whereNot({ id: exceptId });
  const hit = await q.first<{ id: string; posted_at: Date } | undefined>("id", "posted_at");
  if (hit) {
    throw conflict(`Delivery note ${noteNumber} of this supplier was already posted on ${hit.posted_at.toISOString().slice(0, 10)}; nothing is posted twice.`, "DELIVERY_ALREADY_POSTED", {
      deliveryId: hit.id, fields: { noteNumber: ["Already posted."] },
    });
  }
}

// ---------------------------------------------------------------------------------------------
// Reconciling

/** The order lines a delivery may be matched to, in the order they are drawn on (oldest order first). */
async function candidateOrderLines(trx: Trx, d: DeliveryRow): Promise<OrderLineFacts[]> {
  const q = trx("purchase_order_lines as l")
    .join("purchase_orders as o", function () {
      this.on("o.company_id", "=", "l.company_id").andOn("o.id", "=", "l.order_id");
    })
    .where({ "l.company_id": d.company_id })
    .orderByRaw("o.sent_at nulls last, o.created_at, o.number, l.line_no")
    .select<OrderLineFacts[]>(
      "l.id", "l.order_id", "o.number as order_number", "l.line_no", "l.supplier_item_id", "l.supplier_sku", "l.item_id",
      trx.raw("trim_scale(l.quantity_stock)::text as quantity_stock"), trx.raw("trim_scale(l.received_stock)::text as received_stock"),
      trx.raw("trim_scale(l.pack_price)::text as pack_price"), trx.raw("trim_scale(l.pack_size_stock)::text as pack_size_stock"),
    );
  if (d.purchase_order_id) q.where("o.id", d.purchase_order_id);
  else q.where({ "o.supplier_id": d.supplier_id, "o.kitchen_id": d.kitchen_id }).whereIn("o.status", OPEN_FOR_RECEIPT as OrderStatus[]);
  return q;
}

function findEntry(catalogue: CatalogueEntry[], l: Pick<LineRow, "corrected_supplier_item_id" | "sku" | "gtin14">): CatalogueEntry | null {
  if (l.corrected_supplier_item_id) return catalogue.find((c) => c.id === l.corrected_supplier_item_id) ?? null;
  if (l.sku) {
    const bySku = catalogue.find((c) => c.sku.toLowerCase() === l.sku!.toLowerCase());
    if (bySku) return bySku;
  }
  if (l.gtin14) return catalogue.find((c) => c.gtin14 === l.gtin14) ?? null;
  return null;
}

/** A line as corrected: each correction wins over the note; a date without a kind counts as use-by. */
function effective(l: LineRow) {
  const date = l.corrected_date ?? l.date;
  return {
    quantity: l.corrected_quantity ?? l.quantity,
    notedPrice: l.corrected_unit_price ?? l.unit_price,
    lot: l.corrected_lot_code ?? l.lot_code,
    date,
    dateKind: date ? (l.corrected_date_kind ?? l.date_kind ?? "use_by") : null,
  };
}

/** Works out every line's supplier item, order line and findings again (drafts only). */
async function reconcile(trx: Knex.Transaction, d: DeliveryRow): Promise<void> {
  // one after the other: a transaction is one connection
  const facts = await companyFacts(trx, d.company_id);
  const catalogue = await catalogueOf(trx, d.company_id, d.supplier_id);
  const orderLines = await candidateOrderLines(trx, d);
  const lines: LineRow[] = await trx("delivery_lines").where({ company_id: d.company_id, delivery_id: d.id }).orderBy("line_no");
  const taken = new Map<string, Dec>(); // order line -> what earlier lines of this note already cover
  const left = (ol: OrderLineFacts) => {
    const rest = dec(ol.quantity_stock).minus(dec(ol.received_stock)).minus(taken.get(ol.id) ?? dec("0"));
    return rest.gt(0) ? rest : dec("0");
  };
  for (const l of lines) {
    const entry = findEntry(catalogue, l);
    const e = effective(l);
    const qtyStock = entry ? dec(e.quantity).times(dec(entry.packSizeStock)) : null;
    let match: OrderLineFacts | undefined;
    let substitute = false;
    if (entry) {
      const same = orderLines.filter((o) => o.supplier_item_id === entry.id);
      match = same.find((o) => left(o).gt(0)) ?? same[0];
      if (!match) {
        const alt = orderLines.filter((o) => o.item_id === entry.item.id);
        match = alt.find((o) => left(o).gt(0)) ?? alt[0];
        substitute = Boolean(match);
      }
    }
    const findings = findingsFor({
      item: entry ? entry.item : null,
      quantityStock: qtyStock ? qtyStock.toFixed() : null,
      pricePerStock: entry && e.notedPrice !== null ? dec(e.notedPrice).div(dec(entry.packSizeStock)).toFixed() : null,
      lotCode: e.lot, date: e.date, dateKind: e.dateKind,
      match: match ? { substitute, outstandingStock: left(match).toFixed(), orderedPerStock: dec(match.pack_price).div(dec(match.pack_size_stock)).toFixed() } : null,
      today: facts.today,
    }, facts.rules);
    if (match && qtyStock && l.decision !== "reject") taken.set(match.id, (taken.get(match.id) ?? dec("0")).plus(qtyStock));
    await trx("delivery_lines").where({ id: l.id }).update({
      supplier_item_id: entry?.id ?? null,
      quantity_stock: qtyStock ? toStoredQuantity(qtyStock) : null,
      purchase_order_line_id: match?.id ?? null,
      findings: trx.raw("?::text[]", [findings]),
    });
  }
  await trx("deliveries").where({ id: d.id }).update({ updated_at: trx.fn.now() });
}

// ---------------------------------------------------------------------------------------------
// Describing

export async function describeDelivery(trx: Trx, companyId: string, id: string, duplicate = false): Promise<Delivery> {
  const d = await trx("deliveries as d")
    .join("suppliers as s", "s.id", "d.supplier_id")
    .join("kitchens as k", "k.id", "d.kitchen_id")
    .leftJoin("purchase_orders as o", "o.id", "d.purchase_order_id")
    .leftJoin("uploads as u", "u.id", "d.upload_id")
    .leftJoin("uploads as doc", "doc.id", "d.document_upload_id")
    .leftJoin("app_users as pu", "pu.id", "d.posted_by")
    .join("companies as c", "c.id", "d.company_id")
    .where({ "d.company_id": companyId, "d.id": id })
    .first<(DeliveryRow & {
      supplier_name: string; kitchen_code: string; kitchen_name: string; order_number: string | null; upload_filename: string | null;
      doc_filename: string | null; doc_media_type: string | null; posted_by_name: string | null; currency: string; freight_text: string;
    }) | undefined>(
      "d.*", "s.name as supplier_name", "k.code as kitchen_code", "k.name as kitchen_name", "o.number as order_number", "u.filename as upload_filename",
      "doc.filename as doc_filename", "doc.media_type as doc_media_type", "pu.name as posted_by_name", "c.currency",
      trx.raw("trim_scale(d.freight)::text as freight_text"),
    );
  if (!d) throw notFound("Delivery");
  const catalogue = await catalogueOf(trx, companyId, d.supplier_id);
  const byId = new Map(catalogue.map((c) => [c.id, c]));
  const lines: LineRow[] = await trx("delivery_lines").where({ company_id: companyId, delivery_id: id }).orderBy("line_no");
  const olIds = lines.map((l) => l.purchase_order_line_id).filter((x): x is string => Boolean(x));
  const ols: OrderLineFacts[] = olIds.length
    ? await trx("purchase_order_lines as l").join("purchase_orders as o", "o.id", "l.order_id").whereIn("l.id", olIds).select(
      "l.id", "l.order_id", "o.number as order_number", "l.line_no", "l.supplier_item_id", "l.supplier_sku", "l.item_id",
      trx.raw("trim_scale(l.quantity_stock)::text as quantity_stock"), trx.raw("trim_scale(l.received_stock)::text as received_stock"),
      trx.raw("trim_scale(l.pack_price)::text as pack_price"), trx.raw("trim_scale(l.pack_size_stock)::text as pack_size_stock"),
    )
    : [];
  const olById = new Map(ols.map((o) => [o.id, o]));
  const p = (v: string | null) => (v === null ? null : plain(dec(v)));
  const outLines = lines.map((l) => {
    const entry = l.supplier_item_id ? byId.get(l.supplier_item_id) ?? null : null;
    const ol = l.purchase_order_line_id ? olById.get(l.purchase_order_line_id) ?? null : null;
    const e = effective(l);
    const isSubstitute = l.findings.includes("different_item");
    const unitPrice = e.notedPrice ?? (ol && !isSubstitute ? ol.pack_price : null);
    return {
      id: l.id, lineNo: l.line_no, rowNumber: l.row_number, source: l.source,
      noted: { sku: l.sku, gtin: l.gtin14, description: l.description, quantity: plain(dec(l.quantity)), unitPrice: p(l.unit_price), lot: l.lot_code, date: l.date, dateKind: l.date_kind },
      corrections: {
        supplierItemId: l.corrected_supplier_item_id, quantity: p(l.corrected_quantity), unitPrice: p(l.corrected_unit_price), lot: l.corrected_lot_code,
        date: l.corrected_date, dateKind: l.corrected_date_kind,
      },
      quantity: plain(dec(e.quantity)),
      unitPrice: unitPrice === null ? null : moneyText(unitPrice, d.currency),
      lot: e.lot, date: e.date, dateKind: e.dateKind,
      supplierItem: entry ? { id: entry.id, sku: entry.sku, description: entry.description, packLabel: entry.packLabel, packSizeStock: entry.packSizeStock } : null,
      item: entry ? entry.item : null,
      quantityStock: p(l.quantity_stock),
      orderLine: ol
        ? {
          id: ol.id, orderId: ol.order_id, orderNumber: ol.order_number, lineNo: ol.line_no, supplierItemId: ol.supplier_item_id, sku: ol.supplier_sku,
          orderedStock: ol.quantity_stock, receivedStock: ol.received_stock,
          outstandingStock: plain(Dec.max(dec("0"), dec(ol.quantity_stock).minus(dec(ol.received_stock)))), packPrice: moneyText(ol.pack_price, d.currency), packSizeStock: ol.pack_size_stock,
        }
        : null,
      findings: l.findings,
      decision: l.decision,
      value: unitPrice === null ? null : moneyText(dec(e.quantity).times(dec(unitPrice)), d.currency),
      landedUnitCost: p(l.landed_unit_cost),
      lotId: l.lot_id,
    };
  });
  const count = (x: LineRow["decision"]) => lines.filter((l) => l.decision === x).length;
  return {
    id: d.id, status: d.status,
    supplier: { id: d.supplier_id, name: d.supplier_name },
    kitchen: { id: d.kitchen_id, code: d.kitchen_code, name: d.kitchen_name },
    order: d.purchase_order_id ? { id: d.purchase_order_id, number: d.order_number! } : null,
    noteNumber: d.note_number, noteDate: d.note_date, freight: moneyText(d.freight_text, d.currency), currency: d.currency,
    upload: d.upload_id ? { id: d.upload_id, filename: d.upload_filename! } : null,
    document: d.document_upload_id ? { id: d.document_upload_id, filename: d.doc_filename!, mediaType: d.doc_media_type! } : null,
    createdAt: d.created_at.toISOString(), postedAt: d.posted_at ? d.posted_at.toISOString() : null,
    postedBy: d.posted_by ? { id: d.posted_by, name: d.posted_by_name ?? "" } : null,
    duplicate,
    counts: { lines: lines.length, pending: count("pending"), accepted: count("accept"), rejected: count("reject") },
    cureCaution: outLines.some((l) => l.item?.category === "cure") ? CURE_CAUTION : null,
    lines: outLines,
  };
}

export async function getDelivery(actor: CurrentUser, id: string): Promise<Delivery> {
  await loadDelivery(db(), actor, id);
  return describeDelivery(db(), actor.companyId, id);
}

export async function listDeliveries(actor: CurrentUser, query: z.infer<typeof deliveryListQuery> = {}): Promise<DeliveryList> {
  assertCan(actor, "stock.receive");
  const q = db()("deliveries as d")
    .join("suppliers as s", "s.id", "d.supplier_id")
    .join("kitchens as k", "k.id", "d.kitchen_id")
    .leftJoin("purchase_orders as o", "o.id", "d.purchase_order_id")
    .where("d.company_id", actor.companyId)
    .orderBy([{ column: "d.created_at", order: "desc" }, { column: "d.id", order: "desc" }])
    .limit(200)
    .select<{
      id: string; status: "draft" | "posted"; supplier_id: string; supplier_name: string; kitchen_id: string; kitchen_code: string; purchase_order_id: string | null;
      order_number: string | null; note_number: string | null; lines: string; created_at: Date; posted_at: Date | null;
    }[]>(
      "d.id", "d.status", "d.supplier_id", "s.name as supplier_name", "d.kitchen_id", "k.code as kitchen_code", "d.purchase_order_id", "o.number as order_number",
      "d.note_number", "d.created_at", "d.posted_at", db().raw("(select count(*) from delivery_lines l where l.delivery_id = d.id) as lines"),
    );
  if (query.status) q.where("d.status", query.status);
  if (query.supplier) q.where("d.supplier_id", query.supplier);
  const rows = await q;
  return {
    deliveries: rows.map((r) => ({
      id: r.id, status: r.status, supplier: { id: r.supplier_id, name: r.supplier_name }, kitchen: { id: r.kitchen_id, code: r.kitchen_code },
      order: r.purchase_order_id ? { id: r.purchase_order_id, number: r.order_number! } : null, noteNumber: r.note_number, lines: Number(r.lines),
      createdAt: r.created_at.toISOString(), postedAt: r.posted_at ? r.posted_at.toISOString() : null,
    })),
  };
}

// ---------------------------------------------------------------------------------------------
// Making a delivery

interface NewLine {
  row_number: number | null;
  source: "csv" | "keyed" | "scan";
  sku: string | null;
  gtin14: string | null;
  description: string | null;
  quantity: string;
  unit_price: string | null;
  lot_code: string | null;
  date: string | null;
  date_kind: DateKind | null;
  corrected_supplier_item_id?: string | null;
}

async function insertDelivery(
  trx: Knex.Transaction, actor: CurrentUser,
  head: { supplierId: string; kitchenId: string; orderId: string | null; noteNumber: string | null; noteDate: string | null; uploadId: string | null },
  lines: NewLine[],
): Promise<DeliveryRow> {
  const [d] = await trx("deliveries")
    .insert({
      company_id: actor.companyId, supplier_id: head.supplierId, kitchen_id: head.kitchenId, purchase_order_id: head.orderId, note_number: head.noteNumber,
      note_date: head.noteDate, upload_id: head.uploadId, created_by: actor.id,
    })
    .returning<DeliveryRow[]>("*");
  if (lines.length) {
    await trx("delivery_lines").insert(lines.map((l, i) => ({ company_id: actor.companyId, delivery_id: d!.id, line_no: i + 1, ...l })));
  }
  await reconcile(trx, d!);
  return d!;
}

function gtinOf(text: string | null | undefined, field: string): string | null {
  if (!text) return null;
  const g = normalizeGtin(text.replace(/\s+/g, ""));
  if (!g) throw validation({ [field]: [`"${text}" is not a valid GTIN (8, 12, 13 or 14 digits with a correct check digit).`] });
  return g;
}

async function loadMapping(trx: Trx, companyId: string, supplierId: string): Promise<CsvMapping | null> {
  const row = await trx("supplier_import_mappings").where({ company_id: companyId, supplier_id: supplierId, kind: "delivery_note" }).first("mapping");
  if (!row) return null;
  const parsed = csvMapping.safeParse(row.mapping);
  return parsed.success ? parsed.data : null;
}

async function chooseMapping(path: string, sent: CsvMapping | undefined, remembered: CsvMapping | null): Promise<CsvMapping> {
  if (sent) return sent;
  const sniff = await sniffCsv(path, { headerRow: remembered?.headerRow ?? 1, delimiter: remembered?.delimiter ?? null });
  if (remembered) {
    const names = new Set(sniff.headers.map((h) => h.trim().toLowerCase()));
    if (Object.values(remembered.columns).every((r) => ("header" in r ? names.has(r.header.trim().toLowerCase()) : r.column <= sniff.columnNames.length))) return remembered;
  }
  const p = proposeMapping(sniff.headers, DELIVERY_NOTE_FIELDS);
  if (p.problem) throw new AppError(422, "VALIDATION", p.problem, { fields: { file: [p.problem] }, headers: sniff.headers });
  if (!p.columns.sku && !p.columns.gtin) {
    const msg = "No column for the supplier's SKU or the GTIN was found: send a mapping naming one of them.";
    throw new AppError(422, "VALIDATION", msg, { fields: { mapping: [msg] }, headers: sniff.headers });
  }
  if (p.missingRequired.length) {
    const msg = `No column found for: ${p.missingRequired.join(", ")}. Send a mapping naming it.`;
    throw new AppError(422, "VALIDATION", msg, { fields: { mapping: [msg] }, headers: sniff.headers });
  }
  const valuesOf = (field: DeliveryNoteField) => {
    const m = p.matched.find((x) => x.field === field);
    return m ? sniff.sampleRows.map((r) => r[m.column - 1] ?? "") : [];
  };
  const numbers = proposeNumberFormat([...valuesOf("quantity"), ...valuesOf("unitPrice")], sniff.delimiter);
  const dates = valuesOf("date").length ? proposeDateFormat(valuesOf("date")) : { format: "yyyy-MM-dd" as const };
  return csvMapping.parse({ headerRow: 1, columns: p.columns, delimiter: null, decimal: numbers.format.decimal, thousands: numbers.format.thousands, dateFormat: dates.format });
}

function rowError(problems: CsvProblem[]): AppError {
  const first = problems[0]?.message ?? "The file could not be read.";
  return new AppError(422, "VALIDATION", `The delivery note has ${problems.length === 1 ? "a row" : `${problems.length} rows`} that cannot be read; nothing was posted. ${first}`, {
    fields: { file: problems.slice(0, 20).map((p) => p.message) },
    errors: problems.map((p) => ({ row: p.row, column: p.column, field: p.field ?? null, message: p.message })),
  });
}

export interface DeliveryOutcome {
  status: 200 | 201;
  body: Delivery;
}

/** POST /api/deliveries: the CSV (multipart field `file`) with supplier, kitchen, order?, noteNumber?, noteDate?, mapping?. */
export async function receiveDeliveryCsv(actor: CurrentUser, req: Request): Promise<DeliveryOutcome> {
  const { upload, duplicate, fields } = await receiveUpload(actor, req, "delivery_note", { fields: deliveryUploadFields, allowed: IMPORT_FILE_TYPES });
  if (duplicate) {
    const earlier = await db()("deliveries").where({ company_id: actor.companyId, upload_id: upload.id }).first<DeliveryRow | undefined>();
    if (earlier?.status === "posted") {
      throw conflict(`This file was already posted as delivery note ${earlier.note_number} on ${earlier.posted_at!.toISOString().slice(0, 10)}; nothing is posted twice.`, "DELIVERY_ALREADY_POSTED", {
        deliveryId: earlier.id, fields: { file: ["Already posted."] },
      });
    }
    if (earlier) {
      assertCan(actor, "stock.receive", { kitchenId: earlier.kitchen_id });
      return { status: 200, body: await describeDelivery(db(), actor.companyId, earlier.id, true) };
    }
  }
  const path = uploadFilePath(actor.companyId, upload);
  const id = await inTransaction(async (trx) => {
    const supplier = await resolveSupplier(trx, actor, fields.supplier);
    const kitchen = await resolveKitchen(trx, actor, fields.kitchen);
    const orderId = fields.order ? await resolveOrder(trx, actor, fields.order, supplier, kitchen) : null;
    const mapping = await chooseMapping(path, fields.mapping, await loadMapping(trx, actor.companyId, supplier.id));
    const lines: NewLine[] = [];
    let noteFromFile: { number: string; row: number } | null = null;
    const summary = await importCsv(path, DELIVERY_NOTE_FIELDS, mapping, {
      onRow(row: ImportRow<DeliveryNoteField>, rowNumber: number) {
        const issues: RowIssue<DeliveryNoteField>[] = [];
        if (!row.sku && !row.gtin) issues.push({ field: "sku", message: "the row names neither the supplier's SKU nor a GTIN" });
        let gtin: string | null = null;
        if (row.gtin) {
          gtin = normalizeGtin(row.gtin.replace(/\s+/g, ""));
          if (!gtin) issues.push({ field: "gtin", message: `'${row.gtin}' is not a valid GTIN (check digit or length)` });
        }
        const qty = row.quantity!;
        if (qty.startsWith("-") || !/[1-9]/.test(qty)) issues.push({ field: "quantity", message: `the quantity must be more than 0 (the file says ${qty})` });
        if (row.unitPrice && row.unitPrice.startsWith("-")) issues.push({ field: "unitPrice", message: `the price cannot be negative (${row.unitPrice})` });
        if (row.unitPrice && (row.unitPrice.split(".")[1] ?? "").replace(/0+$/, "").length > 4) issues.push({ field: "unitPrice", message: `the price ${row.unitPrice} has more than 4 decimals` });
        const kind = dateKindFrom(row.dateKind);
        if (kind === null) issues.push({ field: "dateKind", message: `'${row.dateKind}' is not a kind of date: write use by or best before` });
        if (row.noteNumber) {
          if (!noteFromFile) noteFromFile = { number: row.noteNumber, row: rowNumber };
          else if (noteFromFile.number.toLowerCase() !== row.noteNumber.toLowerCase()) {
            issues.push({ field: "noteNumber", message: `another delivery note number (${row.noteNumber}) than row ${noteFromFile.row} (${noteFromFile.number}): send one note per file` });
          }
        }
        if (lines.length >= MAX_DELIVERY_LINES) issues.push({ message: `a delivery note has at most ${MAX_DELIVERY_LINES} lines` });
        if (issues.length) return issues;
        lines.push({
          row_number: rowNumber, source: "csv", sku: row.sku, gtin14: gtin, description: row.description, quantity: qty, unit_price: row.unitPrice,
          lot_code: row.lot, date: row.date, date_kind: row.date ? (kind ?? "use_by") : null,
        });
        return [];
      },
    });
    if (summary.errors.length || !summary.complete) throw rowError(summary.errors.length ? summary.errors : [{ row: 0, column: null, message: "The file could not be read to the end." }]);
    if (lines.length === 0) throw validation({ file: ["The delivery note has no lines."] });
    const noteNumber = fields.noteNumber ?? (noteFromFile as { number: string } | null)?.number ?? null;
    await assertNoteNotPosted(trx, actor.companyId, supplier.id, noteNumber);
    const d = await insertDelivery(trx, actor, { supplierId: supplier.id, kitchenId: kitchen.id, orderId, noteNumber, noteDate: fields.noteDate ?? null, uploadId: upload.id }, lines);
    await trx("supplier_import_mappings")
      .insert({ company_id: actor.companyId, supplier_id: supplier.id, kind: "delivery_note", mapping: JSON.stringify(mapping), updated_by: actor.id })
      .onConflict(["company_id", "supplier_id", "kind"]).merge(["mapping", "updated_by", "updated_at"]);
    return d.id;
  }).catch(async (e: unknown) => {
    if ((e as { code?: string }).code === "23505" && String((e as { constraint?: string }).constraint) === "deliveries_upload") {
      // the same file sent twice at once: answer the delivery the other request made
      const other = await db()("deliveries").where({ company_id: actor.companyId, upload_id: upload.id }).first<{ id: string } | undefined>("id");
      if (other) return other.id;
    }
    throw e;
  });
  return { status: 201, body: await describeDelivery(db(), actor.companyId, id) };
}

async function lineFromInput(trx: Trx, actor: CurrentUser, supplierId: string, l: z.infer<typeof deliveryLineInput>, prefix: string): Promise<NewLine> {
  let chosen: string | null = null;
  if (l.supplierItem) {
    const si = await trx("supplier_items").where({ company_id: actor.companyId, supplier_id: supplierId, id: l.supplierItem }).first("id");
    if (!si) throw validation({ [`${prefix}supplierItem`]: ["Not an item of this supplier."] });
    chosen = l.supplierItem;
  }
  if (l.dateKind && !l.date) throw validation({ [`${prefix}date`]: ["Enter the date this kind refers to."] });
  return {
    row_number: null, source: l.source, sku: l.sku ?? null, gtin14: gtinOf(l.gtin, `${prefix}gtin`), description: l.description ?? null,
    quantity: l.quantity, unit_price: l.unitPrice ?? null, lot_code: l.lot ?? null, date: l.date ?? null, date_kind: l.date ? (l.dateKind ?? "use_by") : null,
    corrected_supplier_item_id: chosen,
  };
}

/** POST /api/deliveries/keyed: a delivery typed in (lines may follow one by one). */
export async function createKeyedDelivery(actor: CurrentUser, input: z.infer<typeof deliveryKeyedInput>): Promise<Delivery> {
  assertCan(actor, "stock.receive");
  const id = await inTransaction(async (trx) => {
    const supplier = await resolveSupplier(trx, actor, input.supplier);
    const kitchen = await resolveKitchen(trx, actor, input.kitchen);
    const orderId = input.order ? await resolveOrder(trx, actor, input.order, supplier, kitchen) : null;
    await assertNoteNotPosted(trx, actor.companyId, supplier.id, input.noteNumber ?? null);
    const lines: NewLine[] = [];
    for (const [i, l] of input.lines.entries()) lines.push(await lineFromInput(trx, actor, supplier.id, l, `lines.${i}.`));
    return (await insertDelivery(trx, actor, { supplierId: supplier.id, kitchenId: kitchen.id, orderId, noteNumber: input.noteNumber ?? null, noteDate: input.noteDate ?? null, uploadId: null }, lines)).id;
  });
  return describeDelivery(db(), actor.companyId, id);
}

/** POST /api/deliveries/{id}/lines: one more line, keyed in or from a case label. */
export async function addDeliveryLine(actor: CurrentUser, id: string, input: z.infer<typeof deliveryLineInput>): Promise<Delivery> {
  await inTransaction(async (trx) => {
    const d = await loadDelivery(trx, actor, id, true);
    assertDraft(d);
    const line = await lineFromInput(trx, actor, d.supplier_id, input, "");
    const last = await trx("delivery_lines").where({ delivery_id: d.id }).max<{ max: number | null }>("line_no as max").first();
    await trx("delivery_lines").insert({ company_id: actor.companyId, delivery_id: d.id, line_no: (last?.max ?? 0) + 1, ...line });
    await reconcile(trx, d);
  });
  return describeDelivery(db(), actor.companyId, id);
}

/** PATCH /api/deliveries/{id}: note number, date, freight. */
export async function updateDelivery(actor: CurrentUser, id: string, input: z.infer<typeof deliveryPatchInput>): Promise<Delivery> {
  await inTransaction(async (trx) => {
    const d = await loadDelivery(trx, actor, id, true);
    assertDraft(d);
    if (input.freight !== undefined) {
      const { currency } = await companyFacts(trx, actor.companyId);
      const decimals = (input.freight.split(".")[1] ?? "").replace(/0+$/, "").length;
      const allowed = moneyText("0", currency).split(".")[1]?.length ?? 0;
      if (decimals > allowed) throw validation({ freight: [`${currency} has ${allowed} decimals: enter at most ${allowed}.`] });
    }
    if (input.noteNumber) await assertNoteNotPosted(trx, actor.companyId, d.supplier_id, input.noteNumber, d.id);
    await trx("deliveries").where({ id: d.id }).update({
      ...(input.noteNumber !== undefined ? { note_number: input.noteNumber } : {}),
      ...(input.noteDate !== undefined ? { note_date: input.noteDate } : {}),
      ...(input.freight !== undefined ? { freight: input.freight } : {}),
      updated_at: trx.fn.now(),
    });
  });
  return describeDelivery(db(), actor.companyId, id);
}

/** PATCH /api/deliveries/{id}/lines/{lineId}: the buyer's decision and corrections; the findings are worked out again. */
export async function updateDeliveryLine(actor: CurrentUser, id: string, lineId: string, input: z.infer<typeof deliveryLinePatchInput>): Promise<Delivery> {
  await inTransaction(async (trx) => {
    const d = await loadDelivery(trx, actor, id, true);
    assertDraft(d);
    const line: LineRow | undefined = isUuid(lineId) ? await trx("delivery_lines").where({ company_id: actor.companyId, delivery_id: d.id, id: lineId }).first() : undefined;
    if (!line) throw notFound("Delivery line");
    const c = input.corrections ?? {};
    if (c.supplierItem) {
      const si = await trx("supplier_items").where({ company_id: actor.companyId, supplier_id: d.supplier_id, id: c.supplierItem }).first("id");
      if (!si) throw validation({ "corrections.supplierItem": ["Not an item of this supplier."] });
    }
    const set = <K extends string>(key: K, v: unknown) => (v === undefined ? {} : { [key]: v });
    await trx("delivery_lines").where({ id: line.id }).update({
      ...set("corrected_supplier_item_id", c.supplierItem), ...set("corrected_quantity", c.quantity), ...set("corrected_unit_price", c.unitPrice),
      ...set("corrected_lot_code", c.lot), ...set("corrected_date", c.date), ...set("corrected_date_kind", c.dateKind),
      ...set("decision", input.decision),
    });
    await reconcile(trx, d);
    const now: LineRow = await trx("delivery_lines").where({ id: line.id }).first();
    if (now.decision === "accept") {
      const problems = acceptProblems(now);
      if (Object.keys(problems).length) throw validation(problems, Object.values(problems)[0]![0]);
    }
  });
  return describeDelivery(db(), actor.companyId, id);
}

/** Why a line cannot be accepted as it stands (field -> messages), keyed without a prefix. */
function acceptProblems(l: LineRow, prefix = ""): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  if (!l.supplier_item_id) out[`${prefix}corrections.supplierItem`] = [`Line ${l.line_no} names no item of this supplier: choose the supplier item first.`];
  if (l.findings.includes("expired")) out[`${prefix}decision`] = [`Line ${l.line_no} is already out of date (${l.corrected_date ?? l.date}): reject it.`];
  return out;
}

/** POST /api/deliveries/{id}/document: the delivery note as PDF or photo (multipart field `file`). */
export async function attachDeliveryDocument(actor: CurrentUser, id: string, req: Request): Promise<Delivery> {
  await loadDelivery(db(), actor, id); // 404 / 403 before a byte is read
  const { upload } = await receiveUpload(actor, req, "delivery_note", { allowed: DOCUMENT_FILE_TYPES });
  await db()("deliveries").where({ company_id: actor.companyId, id }).update({ document_upload_id: upload.id, updated_at: db().fn.now() });
  return describeDelivery(db(), actor.companyId, id);
}

/** The stored delivery note document, for GET /api/deliveries/{id}/document. */
export interface DeliveryDocumentFile {
  path: string;
  filename: string;
  mediaType: string;
  size: number;
}

/**
 * GET /api/deliveries/{id}/document: the attached PDF or photo. Those who read purchasing
 * (purchasing.read, any kitchen) or receive into the delivery's kitchen; 404 for another company's
 * delivery and when none is attached.
 */
export async function deliveryDocument(actor: CurrentUser, id: string): Promise<DeliveryDocumentFile> {
  if (!isUuid(id)) throw notFound("Delivery");
  const d: { kitchen_id: string; document_upload_id: string | null } | undefined = await db()("deliveries")
    .where({ company_id: actor.companyId, id })
    .first("kitchen_id", "document_upload_id");
  if (!d) throw notFound("Delivery");
  if (!can(actor, "purchasing.read") && !can(actor, "stock.receive", { kitchenId: d.kitchen_id })) {
    throw forbidden("Your role may not see deliveries (purchasing.read, or stock.receive in this kitchen).");
  }
  if (!d.document_upload_id) throw new AppError(404, "NOT_FOUND", "No delivery note document is attached to this delivery.");
  const up: { sha256: string; filename: string; media_type: string; size: string } | undefined = await db()("uploads")
    .where({ company_id: actor.companyId, id: d.document_upload_id })
    .first("sha256", "filename", "media_type", "size");
  if (!up) throw new AppError(404, "NOT_FOUND", "No delivery note document is attached to this delivery.");
  return {
    path: uploadFilePath(actor.companyId, { sha256: up.sha256, mediaType: up.media_type }),
    filename: up.filename,
    mediaType: up.media_type,
    size: Number(up.size),
  };
}

// ---------------------------------------------------------------------------------------------
// Posting

/** POST /api/deliveries/{id}/post: receipts, order lines and statuses, all or nothing; a second post answers the first. */
export async function postDelivery(actor: CurrentUser, id: string): Promise<Delivery> {
  await inTransaction(async (trx) => {
    const d = await loadDelivery(trx, actor, id, true);
    if (d.status === "posted") return; // already posted (a replay, or a post that ran at the same time): nothing twice
    await reconcile(trx, d);
    const lines: LineRow[] = await trx("delivery_lines").where({ delivery_id: d.id }).orderBy("line_no");
    const fields: Record<string, string[]> = {};
    if (!d.note_number) fields.noteNumber = ["Enter the delivery note number before posting."];
    if (lines.length === 0) fields.lines = ["The delivery has no lines."];
    const pending = lines.filter((l) => l.decision === "pending");
    for (const l of pending) fields[`lines.${l.line_no - 1}.decision`] = [`Line ${l.line_no}: accept, correct or reject it first.`];
    const catalogue = new Map((await catalogueOf(trx, d.company_id, d.supplier_id)).map((c) => [c.id, c]));
    const accepted = lines.filter((l) => l.decision === "accept");
    const olRows: OrderLineFacts[] = await candidateOrderLines(trx, { ...d });
    const olById = new Map(olRows.map((o) => [o.id, o]));
    const priced: { line: LineRow; entry: CatalogueEntry; qtyStock: Dec; value: Dec }[] = [];
    for (const l of accepted) {
      Object.assign(fields, acceptProblems(l, `lines.${l.line_no - 1}.`));
      const entry = l.supplier_item_id ? catalogue.get(l.supplier_item_id) : undefined;
      if (!entry) continue;
      const e = effective(l);
      if (!e.lot && (entry.item.trackLots || entry.item.category === "cure")) fields[`lines.${l.line_no - 1}.lot`] = [`Line ${l.line_no}: ${entry.item.sku} is tracked by lot: enter the lot code.`];
      if (!e.date && (entry.item.trackDates || entry.item.category === "cure")) fields[`lines.${l.line_no - 1}.date`] = [`Line ${l.line_no}: ${entry.item.sku} is tracked by date: enter the use-by or best-before date.`];
      const ol = l.purchase_order_line_id ? olById.get(l.purchase_order_line_id) : undefined;
      const price = e.notedPrice ?? (ol && !l.findings.includes("different_item") ? ol.pack_price : null);
      if (price === null) fields[`lines.${l.line_no - 1}.unitPrice`] = [`Line ${l.line_no}: the note gives no price and no order line does: enter the price per pack.`];
      else priced.push({ line: l, entry, qtyStock: dec(e.quantity).times(dec(entry.packSizeStock)), value: dec(e.quantity).times(dec(price)) });
    }
    if (Object.keys(fields).length) {
      const first = Object.values(fields)[0]![0]!;
      throw validation(fields, pending.length ? `${pending.length} line${pending.length === 1 ? "" : "s"} still to decide (${pending.map((l) => l.line_no).join(", ")}).` : first);
    }
    const supplier = await trx("suppliers").where({ id: d.supplier_id }).first<{ name: string }>("name");
    const kitchen = await trx("kitchens").where({ id: d.kitchen_id }).first<{ code: string }>("code");
    const costs = landedUnitCosts(priced.map((p) => ({ value: p.value.toFixed(), quantityStock: p.qtyStock.toFixed() })), d.freight);
    const postingId = randomUUID();
    const received = new Map<string, Dec>();
    for (const [i, p] of priced.entries()) {
      const e = effective(p.line);
      const unitCost = toStoredUnitCost(costs[i]!);
      const code = e.lot ?? undefined;
      const existing = code ? await trx("lots").where({ company_id: d.company_id, item_id: p.entry.item.id, code }).first<{ id: string } | undefined>("id") : undefined;
      const rows = await postInTransaction(trx, actor, {
        kind: "receipt", kitchen: kitchen.code, item: p.entry.item.id, quantity: toStoredQuantity(p.qtyStock), unit: p.entry.item.stockUnit,
        supplier: supplier.name, reason: `Delivery note ${d.note_number}`,
        lot: existing ? existing.id : { code, date: e.date ?? undefined, dateKind: e.dateKind ?? undefined, unitCost },
      }, postingId);
      const lotId = rows[0]!.lot_id;
      await trx("lots").where({ id: lotId }).whereNull("supplier_id").update({ supplier_id: d.supplier_id });
      await trx("delivery_lines").where({ id: p.line.id }).update({ landed_unit_cost: unitCost, lot_id: lotId });
      if (p.line.purchase_order_line_id) received.set(p.line.purchase_order_line_id, (received.get(p.line.purchase_order_line_id) ?? dec("0")).plus(p.qtyStock));
    }
    const orderIds = new Set<string>();
    for (const [olId, qty] of received) {
      const [row] = await trx("purchase_order_lines").where({ id: olId }).update({ received_stock: trx.raw("received_stock + ?::numeric", [toStoredQuantity(qty)]) }).returning<{ order_id: string }[]>("order_id");
      orderIds.add(row!.order_id);
    }
    for (const orderId of orderIds) {
      const order = await trx("purchase_orders").where({ id: orderId }).forUpdate().first<{ status: OrderStatus }>("status");
      if (!OPEN_FOR_RECEIPT.includes(order.status)) continue;
      const ls = await trx("purchase_order_lines").where({ order_id: orderId }).select<{ quantity_stock: string; received_stock: string }[]>("quantity_stock", "received_stock");
      const status = statusAfterReceipt(ls.map((l) => ({ ordered: l.quantity_stock, received: l.received_stock })));
      await trx("purchase_orders").where({ id: orderId }).update({ status, updated_at: trx.fn.now() });
    }
    await trx("deliveries").where({ id: d.id }).update({ status: "posted", posted_by: actor.id, posted_at: trx.fn.now(), posting_id: postingId, updated_at: trx.fn.now() });
  }).catch((e: unknown) => {
    if ((e as { code?: string; constraint?: string }).code === "23505" && (e as { constraint?: string }).constraint === "deliveries_note_posted") {
      throw conflict("A delivery note with this number from this supplier was posted meanwhile; nothing is posted twice.", "DELIVERY_ALREADY_POSTED", { fields: { noteNumber: ["Already posted."] } });
    }
    throw e;
  });
  return describeDelivery(db(), actor.companyId, id);
}
