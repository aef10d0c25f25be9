// Reorder suggestions: the query and body schemas of /api/reorder-suggestions and the answers'
// shapes (lib/data/reorder-suggestions.ts; a drift fails `tsc` in lib/http/openapi.ts). Client-safe.
// Whether a supplier item is of the company, active and priced needs the database, so lib/data
// checks that (422 on lines.N.supplierItemId / lines.N.packPrice).
import { z } from "zod";
import { ITEM_CATEGORIES, STOCK_UNITS } from "../../db/types";
import { ORDER_STATUSES } from "../purchasing/order-status";
import { packPrice, purchaseOrderResponse, wholePacks } from "./purchase-orders";

const kitchenRef = z.string({ error: "Name the kitchen by its id or code." }).trim().min(1, "Name the kitchen by its id or code.").max(100, "At most 100 characters.");

/** GET /api/reorder-suggestions: one kitchen, or every kitchen the user may see when left out. */
export const reorderSuggestionsQuery = z.object({
  kitchen: kitchenRef.optional(),
});
export type ReorderSuggestionsQuery = z.infer<typeof reorderSuggestionsQuery>;

export const reorderOrderLineInput = z.object({
  /** the supplier item chosen for the stock item (its supplier gets the order) */
  supplierItemId: z.uuid({ error: "Choose one of the suggested supplier items." }),
  packs: wholePacks,
  /** left out: the supplier item's current price (needed when it has none) */
  packPrice: packPrice.optional(),
});

/** POST /api/reorder-suggestions/orders: one draft per supplier named by the lines. */
export const reorderOrdersInput = z.object({
  kitchen: kitchenRef,
  lines: z
    .array(reorderOrderLineInput, { error: "Send the lines as a list." })
    .min(1, "Choose at least one line to order.")
    .max(500, "At most 500 lines at once."),
});
export type ReorderOrdersInput = z.infer<typeof reorderOrdersInput>;

// ---------------------------------------------------------------------------------------------
// Answers

const id = z.uuid();
const isoDate = (description: string, example = "2026-12-09") => z.string().meta({ description: `${description} yyyy-mm-dd.`, example });
const decimal = (description: string, example?: string) =>
  z.string().meta({ description: `${description} A decimal string.`, ...(example ? { example } : {}) });
const quantity = (description: string, example?: string) => decimal(`${description} In the item's stock unit.`, example);

const itemRef = z
  .object({
    id, sku: z.string(), name: z.string(), category: z.enum(ITEM_CATEGORIES), stockUnit: z.enum(STOCK_UNITS),
    putUp: z.object({ name: z.string(), metres: z.string() }).nullable().meta({ description: "Natural casings: the put-up one pc is (a hank of 91.44 m); null otherwise." }),
  })
  .meta({ id: "ReorderItem", description: "Our stock item." });

const supplierRef = z
  .object({
    id,
    name: z.string(),
    leadTimeDays: z.number().int().meta({ description: "Whole days from order to delivery: the projection looks this far ahead." }),
    minOrderValue: decimal("The supplier's minimum order value in the company's currency; null: none.", "150.00").nullable(),
  })
  .meta({ id: "ReorderSupplier" });

const pendingOrder = z
  .object({
    id,
    number: z.string().meta({ example: "PO-2026-0004" }),
    status: z.enum(ORDER_STATUSES).meta({ description: "draft or approved: not counted until it is sent." }),
    quantity: quantity("Still to come on that order.", "2000"),
  })
  .meta({ id: "ReorderPendingOrder" });

export const reorderOfferResponse = z
  .object({
    supplierItemId: id,
    supplier: supplierRef,
    sku: z.string().meta({ description: "The supplier's SKU." }),
    packLabel: z.string().meta({ example: "bundle of 5 hanks" }),
    packSize: quantity("One pack.", "5"),
    packPrice: decimal("The current price of one pack (the latest effective on or before today), with at least the currency's decimals; null: no price known.", "189.50").nullable(),
    unitPrice: decimal("packPrice / packSize: the price per stock unit (per g, m, ml or pc), exact; null without a price. Offers are compared on it.", "37.9").nullable(),
    horizon: isoDate("today + the supplier's lead time: the last day the projection counts."),
    plannedWithinLeadTime: quantity("Planned batch use not yet reserved, dated up to the horizon.", "400"),
    openOrdersWithinLeadTime: quantity("Still to come on sent or partly received orders due up to the horizon.", "1000"),
    projected: quantity("on hand - reserved - planned within the lead time + open orders within it.", "2600"),
    suggested: z.boolean().meta({ description: "projected < reorder point, with this supplier's lead time." }),
    shortfall: quantity("(par level, or the reorder point without one) - projected; 0 when not suggested.", "3400"),
    packs: z.number().int().meta({ description: "Whole packs covering the shortfall (0 when not suggested); the chosen offer's packs include any raise to the supplier's minimum order." }),
    quantity: quantity("packs x packSize.", "4000"),
    value: decimal("packs x packPrice rounded half-even to the currency's decimals, as the order line will be; null without a price.", "48.00").nullable(),
    reasons: z.array(z.string()).meta({ description: "Why, in words, with the figures in the stock unit." }),
  })
  .meta({ id: "ReorderOffer" });

const levels = {
  onHand: quantity("On hand in the kitchen.", "2500"),
  reserved: quantity("Reserved for batches.", "500"),
  reorderPoint: quantity("The kitchen's reorder point for the item.", "3000"),
  parLevel: quantity("The kitchen's par level; null: none (orders then fill up to the reorder point).", "6000").nullable(),
  projectedToday: quantity("The projection for today alone (lead time 0).", "2000"),
  pendingOrders: z.array(pendingOrder).meta({ description: "Drafts and approved orders to this kitchen holding the item: not counted until sent." }),
};

export const reorderLineResponse = z
  .object({
    item: itemRef,
    ...levels,
    chosen: reorderOfferResponse.meta({ description: "The preselected offer: the cheapest per stock unit among the offers that suggest ordering (priced before unpriced, then shorter lead time)." }),
    minimumRaise: z.number().int().meta({ description: "Packs added to the chosen offer so the order reaches the supplier's minimum order value (0: none)." }),
    alternatives: z.array(reorderOfferResponse).meta({ description: "The other active offers for the item, cheapest per stock unit first, each with its own lead time and figures (suggested false: not needed within that lead time)." }),
  })
  .meta({ id: "ReorderLine" });

export const reorderUnsourcedResponse = z
  .object({ item: itemRef, ...levels, reasons: z.array(z.string()) })
  .meta({ id: "ReorderUnsourced", description: "Below the reorder point, but no active supplier lists the item." });

export const reorderSupplierGroupResponse = z
  .object({
    supplier: supplierRef,
    deliverBy: isoDate("today + the supplier's lead time: the delivery date a draft made from this group asks for."),
    value: decimal("The sum of the priced lines' values, with the currency's decimals.", "159.00"),
    belowMinimum: z.boolean().meta({ description: "The value is still below the supplier's minimum order value (e.g. the lines have no price)." }),
    reasons: z.array(z.string()),
    lines: z.array(reorderLineResponse),
  })
  .meta({ id: "ReorderSupplierGroup" });

export const reorderSuggestionsResponse = z
  .object({
    today: isoDate("The company's date the suggestion is made on."),
    currency: z.string().meta({ description: "The company's currency (ISO 4217).", example: "EUR" }),
    cureCaution: z.string().nullable().meta({ description: "The cure caution, when a suggested item is a curing salt; null otherwise. Show it with the list." }),
    kitchens: z.array(
      z.object({
        kitchen: z.object({ id, code: z.string(), name: z.string() }),
        watched: z.number().int().meta({ description: "Items with a reorder point in this kitchen (only these are ever suggested)." }),
        suppliers: z.array(reorderSupplierGroupResponse).meta({ description: "The suggested lines by the chosen supplier, by supplier name." }),
        unsourced: z.array(reorderUnsourcedResponse),
      }),
    ),
  })
  .meta({ id: "ReorderSuggestions" });

export const reorderOrdersResponse = z
  .object({
    orders: z.array(purchaseOrderResponse).meta({ description: "The drafts made, one per supplier, in the order the suppliers first appear in the lines." }),
  })
  .meta({ id: "ReorderOrders" });
