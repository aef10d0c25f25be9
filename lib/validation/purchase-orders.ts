// Purchase orders: request schemas (the new-order form, the routes and other callers share them)
// and the answers' shapes (lib/data/purchase-orders.ts; a drift fails `tsc` in lib/http/openapi.ts).
// Client-safe. Whether a supplier item belongs to the supplier, is active and has a price needs the
// database, so lib/data checks that (422 on lines.N.supplierItem / lines.N.packPrice).
import { z } from "zod";
import { ITEM_CATEGORIES, STOCK_UNITS } from "../../db/types";
import { ORDER_STATUSES } from "../purchasing/order-status";
import { dec } from "../units";

const isoDate = z.string({ error: "Use a date as yyyy-mm-dd." }).regex(/^\d{4}-\d{2}-\d{2}$/, "Use a date as yyyy-mm-dd.")
  .refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)) && new Date(`${s}T00:00:00Z`).toISOString().startsWith(s), { error: "No such date." });

export const MAX_ORDER_PACKS = 100_000;
export const WHOLE_PACKS_MESSAGE = "Order whole packs, e.g. \"3\": suppliers sell these items by the pack.";

/**
 * Packs ordered: a whole number from 1, sent as a string like every quantity. Whole packs are the
 * rule (a supplier ships packs; the reorder suggestion rounds up to whole packs), so "2.5" is 422
 * on lines.N.packs with a sentence saying so.
 */
export const wholePacks = z
  .string({ error: "Send the packs as a string, e.g. \"3\"." })
  .trim()
  .superRefine((s, ctx) => {
    if (!/^\d{1,18}(\.\d{1,12})?$/.test(s)) {
      ctx.addIssue({ code: "custom", message: "Use a plain number of packs, e.g. \"3\"." });
      return;
    }
    const n = dec(s);
    if (!n.isInteger()) ctx.addIssue({ code: "custom", message: WHOLE_PACKS_MESSAGE });
    else if (n.lt(1)) ctx.addIssue({ code: "custom", message: "Order at least one pack." });
    else if (n.gt(MAX_ORDER_PACKS)) ctx.addIssue({ code: "custom", message: `At most ${MAX_ORDER_PACKS} packs on one line.` });
  });

/** A pack price in the company's currency, major units, as the supplier quotes it: up to 4 decimals, 0 allowed (a free sample). */
export const packPrice = z
  .string({ error: "Send the pack price as a decimal string, e.g. \"12.50\"." })
  .trim()
  .regex(/^\d{1,16}(\.\d{1,4})?$/, { error: "Use a plain price such as 12 or 12.50 (at most 4 decimals), without the currency sign." });

const reference = z.string({ error: "Choose the delivery kitchen (its id or code)." }).trim().min(1, "Choose the delivery kitchen (its id or code).").max(100, "At most 100 characters.");
const notes = z.string({ error: "Enter the notes as text." }).trim().max(2000, "At most 2000 characters.");
const reason = z.string({ error: "Say why, in a few words." }).trim().min(1, "Say why, in a few words.").max(500, "At most 500 characters.");

export const orderLineInput = z.object({
  /** the supplier item (the supplier's SKU and pack), of the order's supplier */
  supplierItem: z.uuid({ error: "Choose one of the supplier's items." }),
  packs: wholePacks,
  /** left out: the supplier item's current price */
  packPrice: packPrice.optional(),
});
export type OrderLineInput = z.infer<typeof orderLineInput>;

const lines = z
  .array(orderLineInput, { error: "Send the lines as a list." })
  .min(1, "Add at least one line.")
  .max(200, "At most 200 lines on one order.");

export const purchaseOrderCreateInput = z.object({
  supplier: z.uuid({ error: "Choose the supplier." }),
  /** the delivery kitchen, by id or code */
  kitchen: reference,
  lines,
  deliverBy: isoDate.nullable().optional(),
  notes: notes.optional(),
});
export type PurchaseOrderCreateInput = z.infer<typeof purchaseOrderCreateInput>;

/** A draft's changes: the fields sent; lines replace every line. The supplier stays (start a new order for another). */
export const purchaseOrderPatchInput = z
  .object({
    kitchen: reference,
    lines,
    deliverBy: isoDate.nullable(),
    notes,
  })
  .partial();
export type PurchaseOrderPatchInput = z.infer<typeof purchaseOrderPatchInput>;

export const purchaseOrderReasonInput = z.object({ reason });
export type PurchaseOrderReasonInput = z.infer<typeof purchaseOrderReasonInput>;

/** GET /api/purchase-orders */
export const purchaseOrderListQuery = z.object({
  status: z.enum(ORDER_STATUSES, { error: `One of ${ORDER_STATUSES.join(", ")}.` }).optional(),
  supplier: z.uuid({ error: "A supplier's id." }).optional(),
  /** the delivery kitchen's code */
  kitchen: z.string().trim().min(1).max(40).optional(),
  page: z.coerce.number({ error: "A whole page number from 1." }).int("A whole page number from 1.").min(1, "A whole page number from 1.").max(100_000).default(1),
  perPage: z.coerce.number({ error: "A whole number from 1 to 100." }).int("A whole number from 1 to 100.").min(1, "A whole number from 1 to 100.").max(100, "A whole number from 1 to 100.").default(25),
});
export type PurchaseOrderListQuery = z.infer<typeof purchaseOrderListQuery>;

// ---------------------------------------------------------------------------------------------
// Answers

const id = z.uuid();
const timestamp = z.iso.datetime({ offset: true }).meta({ description: "ISO 8601 timestamp in UTC." });
const decimal = (description: string, example?: string) =>
  z.string().meta({ description: `${description} A decimal string.`, ...(example ? { example } : {}) });
const status = z.enum(ORDER_STATUSES).meta({ description: "draft, approved, sent, partly_received, received, closed_short or cancelled." });

export const purchaseOrderSummaryResponse = z
  .object({
    id,
    number: z.string().meta({ description: "Unique in the company: PO-year-sequence.", example: "PO-2026-0001" }),
    status,
    statusLabel: z.string().meta({ example: "Sent to supplier" }),
    supplier: z.object({ id, name: z.string() }),
    kitchen: z.object({ id, code: z.string(), name: z.string() }).meta({ description: "The delivery kitchen." }),
    deliverBy: z.string().nullable().meta({ description: "Asked-for delivery date (yyyy-mm-dd); null: none asked.", example: "2026-12-09" }),
    currency: z.string().meta({ description: "The company's currency (ISO 4217).", example: "GBP" }),
    total: decimal("The order total, with the currency's decimals.", "410.20"),
    lineCount: z.number().int(),
    createdAt: timestamp,
    createdBy: z.string().nullable().meta({ description: "The name of who created it; null when that user is gone." }),
    sentAt: timestamp.nullable(),
  })
  .meta({ id: "PurchaseOrderSummary" });

export const purchaseOrderListResponse = z
  .object({
    orders: z.array(purchaseOrderSummaryResponse),
    total: z.number().int().meta({ description: "Orders matching the filters, over all pages." }),
    page: z.number().int(),
    perPage: z.number().int(),
  })
  .meta({ id: "PurchaseOrderList" });

export const purchaseOrderLineResponse = z
  .object({
    id,
    lineNo: z.number().int(),
    supplierItemId: id,
    supplierSku: z.string().meta({ description: "The supplier's SKU as on the order." }),
    description: z.string(),
    packLabel: z.string().meta({ example: "bundle of 5 hanks" }),
    item: z
      .object({
        id, sku: z.string(), name: z.string(), category: z.enum(ITEM_CATEGORIES), stockUnit: z.enum(STOCK_UNITS),
        putUp: z.object({ name: z.string(), metres: z.string() }).nullable().meta({ description: "Natural casings: the put-up one pc is (a hank of 91.44 m); null otherwise." }),
      })
      .meta({ description: "Our stock item." }),
    packs: decimal("Packs ordered (whole packs).", "2"),
    packSizeStock: decimal("One pack in the item's stock unit, as when the line was written.", "5"),
    orderedStock: decimal("packs x pack size, in the item's stock unit.", "10"),
    receivedStock: decimal("Received so far, in the item's stock unit.", "0"),
    outstandingStock: decimal("Still to come (never negative), in the item's stock unit.", "10"),
    packPrice: decimal("Price of one pack in the company's currency, at least its decimals.", "189.50"),
    lineTotal: decimal("packs x pack price, rounded half-even to the currency's decimals.", "379.00"),
  })
  .meta({ id: "PurchaseOrderLine" });

export const purchaseOrderResponse = z
  .object({
    id,
    number: z.string().meta({ example: "PO-2026-0001" }),
    status,
    statusLabel: z.string(),
    supplier: z.object({
      id,
      name: z.string(),
      contactName: z.string(),
      orderEmail: z.string().nullable().meta({ description: "Where the order is e-mailed; sending needs one." }),
      minOrderValue: decimal("The supplier's minimum order value; null: none. Not enforced: the order page says when the total is below it.").nullable(),
    }),
    kitchen: z.object({ id, code: z.string(), name: z.string(), address: z.string() }).meta({ description: "The delivery kitchen." }),
    deliverBy: z.string().nullable(),
    notes: z.string(),
    currency: z.string(),
    total: decimal("Sum of the line totals, with the currency's decimals.", "410.20"),
    lines: z.array(purchaseOrderLineResponse),
    cureCaution: z.string().nullable().meta({ description: "The cure caution, when a line is a curing salt; null otherwise. Show it with the order." }),
    history: z
      .array(
        z.object({
          step: z.enum(["created", "approved", "sent", "closed_short", "cancelled"]),
          at: timestamp,
          by: z.string().nullable().meta({ description: "The person's name; null when that user is gone." }),
          note: z.string().nullable().meta({ description: "The reason of a close or cancellation; the address an order was sent to." }),
        }),
      )
      .meta({ description: "The steps taken, oldest first." }),
    approvalThreshold: decimal("The company's approval threshold: buyers approve orders up to it, managers above it.", "500.00"),
    needsManager: z.boolean().meta({ description: "The total is above the threshold: a manager or admin must approve." }),
    allowed: z
      .object({ edit: z.boolean(), approve: z.boolean(), send: z.boolean(), closeShort: z.boolean(), cancel: z.boolean() })
      .meta({ description: "The steps the signed-in user may take on the order now." }),
    createdAt: timestamp,
    updatedAt: timestamp,
  })
  .meta({ id: "PurchaseOrder" });
