// Deliveries (lib/data/deliveries.ts): the requests and the answers' shapes. Client-safe: the
// delivery screens validate with these too. Quantities on a note count the supplier's packs;
// unit prices are per pack, in the company's currency.
import { z } from "zod";
import { DATE_KINDS, ITEM_CATEGORIES, STOCK_UNITS } from "../../db/types";
import { DELIVERY_FINDINGS } from "../purchasing/delivery-findings";
import { decimalString, uuid } from "./common";
import { csvMapping } from "./imports";

const DATE_MESSAGE = "Use a date as yyyy-mm-dd.";
const isoDate = z
  .string({ error: DATE_MESSAGE })
  .trim()
  .regex(/^\d{4}-\d{2}-\d{2}$/, DATE_MESSAGE)
  .refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)) && new Date(`${s}T00:00:00Z`).toISOString().startsWith(s), { error: "No such date." });

const blankAsMissing = (v: unknown) => (typeof v === "string" && v.trim() === "" ? undefined : v);
const packs = decimalString({ scale: 12 }).refine((v) => /[1-9]/.test(v), { error: "Enter a quantity above zero (packs as the note counts them)." });
const price = decimalString({ scale: 4 }).meta({ description: "Per pack, at most 4 decimals." });
const noteNumber = z.string().trim().min(1, "Enter the delivery note number.").max(80, "At most 80 characters.");
const ref = z.string().trim().min(1).max(80);

export const DELIVERY_DECISIONS = ["pending", "accept", "reject"] as const;

/** POST /api/deliveries: the text fields beside the CSV in the multipart body. */
export const deliveryUploadFields = z.object({
  supplier: z.preprocess(blankAsMissing, uuid),
  kitchen: z.preprocess(blankAsMissing, ref.meta({ description: "Kitchen id or code." })),
  order: z.preprocess(blankAsMissing, uuid.optional()),
  noteNumber: z.preprocess(blankAsMissing, noteNumber.optional()),
  noteDate: z.preprocess(blankAsMissing, isoDate.optional()),
  mapping: z.preprocess(
    blankAsMissing,
    z
      .string()
      .transform((s, ctx) => {
        try {
          return JSON.parse(s) as unknown;
        } catch {
          ctx.addIssue({ code: "custom", message: "Send the mapping as JSON." });
          return z.NEVER;
        }
      })
      .pipe(csvMapping)
      .optional(),
  ),
});
export type DeliveryUploadFields = z.infer<typeof deliveryUploadFields>;

/** A line keyed in or read from a case label. */
export const deliveryLineInput = z
  .object({
    source: z.enum(["keyed", "scan"]).default("keyed"),
    supplierItem: uuid.optional().meta({ description: "The supplier item, when chosen from the list." }),
    sku: z.string().trim().min(1).max(60).optional(),
    gtin: z.string().trim().min(1).max(20).optional(),
    description: z.string().trim().max(500).optional(),
    quantity: packs,
    unitPrice: price.optional(),
    lot: z.string().trim().min(1).max(80).optional(),
    date: isoDate.optional(),
    dateKind: z.enum(DATE_KINDS, { error: "Say whether the date is use_by or best_before." }).optional(),
  })
  .superRefine((v, ctx) => {
    if (!v.supplierItem && !v.sku && !v.gtin) ctx.addIssue({ code: "custom", path: ["sku"], message: "Name the supplier's SKU, the GTIN or the supplier item." });
  });

/** POST /api/deliveries/keyed */
export const deliveryKeyedInput = z.object({
  supplier: uuid,
  kitchen: ref,
  order: uuid.optional(),
  noteNumber: noteNumber.optional(),
  noteDate: isoDate.optional(),
  lines: z.array(deliveryLineInput).max(500).default([]),
});

/** PATCH /api/deliveries/{id} */
export const deliveryPatchInput = z.object({
  noteNumber: noteNumber.optional(),
  noteDate: isoDate.nullable().optional(),
  freight: decimalString({ scale: 4 }).optional().meta({ description: "Freight on the note, spread over the accepted lines by value." }),
});

/** PATCH /api/deliveries/{id}/lines/{lineId} */
export const deliveryLinePatchInput = z.object({
  decision: z.enum(DELIVERY_DECISIONS).optional(),
  corrections: z
    .object({
      supplierItem: uuid.nullable().optional(),
      quantity: packs.nullable().optional(),
      unitPrice: price.nullable().optional(),
      lot: z.string().trim().min(1).max(80).nullable().optional(),
      date: isoDate.nullable().optional(),
      dateKind: z.enum(DATE_KINDS).nullable().optional(),
    })
    .optional()
    .meta({ description: "What the buyer changes; null takes a correction back (the note's value counts again)." }),
});

export const deliveryListQuery = z.object({
  status: z.enum(["draft", "posted"]).optional(),
  supplier: uuid.optional(),
});

// ---------------------------------------------------------------------------------------------
// Answers

const id = z.uuid();
const date = z.string().meta({ description: "yyyy-mm-dd" });
const decimal = (description: string) => z.string().meta({ description: `${description} A decimal string.` });

export const deliveryLineResponse = z
  .object({
    id,
    lineNo: z.number().int(),
    rowNumber: z.number().int().nullable().meta({ description: "The CSV row (the header is row 1); null when keyed in or scanned." }),
    source: z.enum(["csv", "keyed", "scan"]),
    noted: z.object({
      sku: z.string().nullable(), gtin: z.string().nullable(), description: z.string().nullable(),
      quantity: decimal("Packs."), unitPrice: decimal("Per pack.").nullable(), lot: z.string().nullable(), date: date.nullable(), dateKind: z.enum(DATE_KINDS).nullable(),
    }).meta({ description: "As the note says." }),
    corrections: z.object({
      supplierItemId: id.nullable(), quantity: z.string().nullable(), unitPrice: z.string().nullable(), lot: z.string().nullable(), date: date.nullable(), dateKind: z.enum(DATE_KINDS).nullable(),
    }),
    quantity: decimal("Packs, as corrected."),
    unitPrice: decimal("Per pack as corrected, else as noted, else the ordered price.").nullable(),
    lot: z.string().nullable(),
    date: date.nullable(),
    dateKind: z.enum(DATE_KINDS).nullable(),
    supplierItem: z.object({ id, sku: z.string(), description: z.string(), packLabel: z.string(), packSizeStock: z.string() }).nullable(),
    item: z.object({
      id, sku: z.string(), name: z.string(), category: z.enum(ITEM_CATEGORIES), stockUnit: z.enum(STOCK_UNITS), trackLots: z.boolean(), trackDates: z.boolean(),
    }).nullable(),
    quantityStock: decimal("In the item's stock unit.").nullable(),
    orderLine: z.object({
      id, orderId: id, orderNumber: z.string(), lineNo: z.number().int(), supplierItemId: id, sku: z.string(),
      orderedStock: z.string(), receivedStock: z.string(), outstandingStock: z.string(), packPrice: z.string(), packSizeStock: z.string(),
    }).nullable(),
    findings: z.array(z.enum(DELIVERY_FINDINGS)),
    decision: z.enum(DELIVERY_DECISIONS),
    value: decimal("quantity x unit price.").nullable(),
    landedUnitCost: decimal("Per stock unit, after posting.").nullable(),
    lotId: id.nullable(),
  })
  .meta({ id: "DeliveryLine" });

export const deliveryResponse = z
  .object({
    id,
    status: z.enum(["draft", "posted"]),
    supplier: z.object({ id, name: z.string() }),
    kitchen: z.object({ id, code: z.string(), name: z.string() }),
    order: z.object({ id, number: z.string() }).nullable(),
    noteNumber: z.string().nullable(),
    noteDate: date.nullable(),
    freight: z.string(),
    currency: z.string(),
    upload: z.object({ id, filename: z.string() }).nullable(),
    document: z.object({ id, filename: z.string(), mediaType: z.string() }).nullable(),
    createdAt: z.string(),
    postedAt: z.string().nullable(),
    postedBy: z.object({ id, name: z.string() }).nullable(),
    duplicate: z.boolean().meta({ description: "This CSV was sent before: the delivery made from it then is answered." }),
    counts: z.object({ lines: z.number().int(), pending: z.number().int(), accepted: z.number().int(), rejected: z.number().int() }),
    cureCaution: z.string().nullable(),
    lines: z.array(deliveryLineResponse),
  })
  .meta({ id: "Delivery" });

export const deliveryListResponse = z
  .object({
    deliveries: z.array(
      z.object({
        id, status: z.enum(["draft", "posted"]), supplier: z.object({ id, name: z.string() }), kitchen: z.object({ id, code: z.string() }),
        order: z.object({ id, number: z.string() }).nullable(), noteNumber: z.string().nullable(), lines: z.number().int(), createdAt: z.string(), postedAt: z.string().nullable(),
      }),
    ),
  })
  .meta({ id: "DeliveryList" });

export type DeliveryLineResponse = z.infer<typeof deliveryLineResponse>;
export type DeliveryResponse = z.infer<typeof deliveryResponse>;
export type DeliveryListResponse = z.infer<typeof deliveryListResponse>;
