// Batch plan requests. No server imports: the planner's forms share these.
import { z } from "zod";
import { decimalString, uuid } from "./common";
import { PRODUCT_CLASSES } from "../cure/limits";
import { cureCalculationResponse } from "./cure";

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, "Use a date as yyyy-mm-dd.");
const amount = (what: string) =>
  z.object({
    quantity: decimalString({ scale: 12 }).refine((q) => !/^0*(\.0*)?$/.test(q), { error: `The ${what} must be more than zero.` }),
    unit: z.string().trim().min(1, "Enter the unit, e.g. kg or lb.").max(40),
  });

export const batchCreateInput = z
  .object({
    kitchen: z.string().trim().min(1, "Name the kitchen by its code.").max(40),
    recipe: z.string().trim().min(1, "Choose the recipe (id or code).").max(100),
    /** default: the recipe's current version */
    version: z.number({ error: "Give the version as a whole number." }).int().positive().optional(),
    plannedFor: isoDate,
    /** the meat block's green weight ... */
    meatBlock: amount("meat block").optional(),
    /** ... or links: count x weight is the filling mass, from which the meat block follows */
    links: z.object({ count: z.number().int().positive().max(1_000_000), weight: amount("link weight") }).optional(),
    /** a casing item other than the recipe's (within its calibre range) */
    casing: z.string().trim().min(1).max(80).optional(),
    note: z.string().trim().max(1000).default(""),
    /** a manager planning past a house limit (never a statutory one) says why */
    overrideReason: z.string().trim().min(1, "Say why the house limit is overridden.").max(1000).optional(),
  })
  .superRefine((v, ctx) => {
    if (!v.meatBlock && !v.links) ctx.addIssue({ code: "custom", path: ["meatBlock"], message: "Give the meat block weight, or a link count and link weight." });
    if (v.meatBlock && v.links) ctx.addIssue({ code: "custom", path: ["links"], message: "Give the meat block or the links, not both." });
  });
export type BatchCreateInput = z.infer<typeof batchCreateInput>;

export const batchChangeInput = z
  .object({
    plannedFor: isoDate.optional(),
    meatBlock: amount("meat block").optional(),
    links: z.object({ count: z.number().int().positive().max(1_000_000), weight: amount("link weight") }).optional(),
    casing: z.string().trim().min(1).max(80).optional(),
    note: z.string().trim().max(1000).optional(),
    overrideReason: z.string().trim().min(1, "Say why the house limit is overridden.").max(1000).optional(),
  })
  .superRefine((v, ctx) => {
    if (v.meatBlock && v.links) ctx.addIssue({ code: "custom", path: ["links"], message: "Give the meat block or the links, not both." });
  });
export type BatchChangeInput = z.infer<typeof batchChangeInput>;

export const batchListQuery = z.object({
  kitchen: z.string().trim().min(1).max(40).optional(),
  from: isoDate.optional(),
  to: isoDate.optional(),
  status: z.enum(["planned", "reserved", "produced", "on_hold", "cancelled"]).optional(),
});

export const batchReserveAllInput = z.object({
  kitchen: z.string().trim().min(1, "Name the kitchen by its code.").max(40),
  from: isoDate,
  to: isoDate,
});

export const batchIdList = z.array(uuid);

export const batchProduceInput = z.object({
  /** the meat block actually weighed */
  actualMeatBlock: amount("actual meat block"),
  /** what was actually weighed per line (default: the planned quantity) and from which lots (default: the reserved ones, then FEFO) */
  lines: z
    .array(
      z.object({
        position: z.number({ error: "Name the batch line by its position." }).int().positive(),
        quantity: decimalString({ scale: 12 }).optional(),
        unit: z.string().trim().min(1).max(40).optional(),
        lots: z.array(z.object({ lot: uuid, quantity: decimalString({ scale: 12 }) })).max(20).optional(),
      }),
    )
    .max(80)
    .default([]),
  note: z.string().trim().max(1000).optional(),
});
export type BatchProduceInput = z.infer<typeof batchProduceInput>;

export const holdReleaseInput = z.object({
  reason: z.string().trim().min(1, "Say why the hold is released (the corrective action taken).").max(1000),
});

// ---------------------------------------------------------------------------------------------
// Answers (lib/data/batches.ts Batch); a drift fails `tsc` in lib/http/openapi.ts.
const decimal = z.string().meta({ description: "Exact decimal string." });
const kitchenRef = z.object({ id: z.string(), code: z.string() });

export const batchResponse = z
  .object({
    id: z.string(),
    kitchen: z.object({ id: z.string(), code: z.string(), name: z.string() }),
    recipe: z.object({ id: z.string(), code: z.string(), name: z.string(), version: z.number().int() }),
    plannedFor: z.string().meta({ example: "2026-12-07" }),
    status: z.enum(["planned", "reserved", "produced", "on_hold", "cancelled"]),
    meatBlockG: decimal,
    fillingG: decimal.meta({ description: "Meat block plus the meat-block lines, grams: what goes into the casing." }),
    links: z.object({ count: z.number().int(), weightG: decimal }).nullable(),
    casing: z
      .object({ itemId: z.string(), metres: decimal, putUps: decimal.nullable(), putUpsToOpen: z.number().int().nullable(), source: z.string() })
      .nullable(),
    lines: z.array(
      z.object({
        position: z.number().int(),
        role: z.enum(["cure", "ingredient", "casing"]),
        item: z.object({ id: z.string(), sku: z.string(), name: z.string(), category: z.enum(["casing", "cure", "spice", "ingredient"]), unit: z.enum(["g", "m", "ml", "pc"]) }),
        quantity: decimal.meta({ description: "To weigh or use, in the stock unit; cure rounded to the kitchen scale toward compliance." }),
        exactQuantity: decimal,
        rounding: z.enum(["exact", "down", "up"]),
        reserved: decimal,
        lots: z.array(z.object({ lotId: z.string(), code: z.string(), date: z.string().nullable(), dateKind: z.string().nullable(), quantity: decimal })),
        available: decimal.meta({ description: "The kitchen's available stock in lots still in date on the production day." }),
        plannedBefore: decimal.meta({ description: "What batches planned (not yet reserved) ahead of this one in the kitchen still need of the item: they are counted first." }),
        short: decimal.nullable().meta({ description: "What this batch would lack once the batches ahead of it have taken theirs; null when nothing is short." }),
        suggestions: z.array(
          z.union([
            z.object({ kind: z.literal("transfer"), kitchen: kitchenRef, quantity: decimal }),
            z.object({ kind: z.literal("buy"), quantity: decimal }),
          ]),
        ),
        openRequests: z
          .array(z.object({ id: z.string(), fromKitchen: kitchenRef, quantity: decimal, requestedAt: z.string() }))
          .meta({ description: "Transfer requests asked for this batch and item that are still open (POST /api/transfer-requests with batch); at most one." }),
      }),
    ),
    cure: cureCalculationResponse.nullable().meta({ description: "The cure verdict on the rounded amounts, as planned." }),
    shortLines: z.number().int(),
    batchCode: z.string().nullable(),
    note: z.string(),
    notes: z.array(z.string()),
    caution: z.string().nullable(),
    createdAt: z.string(),
    createdBy: z.object({ id: z.string(), name: z.string() }).nullable(),
    houseChecks: z
      .array(z.object({ productClass: z.enum(PRODUCT_CLASSES), substance: z.enum(["nitrite", "nitrate"]), kind: z.enum(["max", "min"]), limitPpm: z.string(), note: z.string(), ppm: z.string(), within: z.boolean() }))
      .meta({ description: "The company's own limits for this product class, checked on the planned cure." }),
    override: z.object({ reason: z.string(), by: z.object({ id: z.string(), name: z.string() }).nullable() }).nullable()
      .meta({ description: "A manager's reason for planning past a house limit." }),
    production: z
      .object({
        batchCode: z.string().meta({ description: "RECIPE-YYMMDD-N (the day it was made), given at production.", example: "YARD-SMK-261207-1" }),
        producedAt: z.string(),
        producedBy: z.object({ id: z.string(), name: z.string() }).nullable(),
        actualMeatBlockG: decimal,
        lines: z.array(
          z.object({
            position: z.number().int(),
            item: z.object({ id: z.string(), sku: z.string(), name: z.string(), unit: z.string() }),
            planned: decimal,
            actual: decimal,
            variance: decimal.meta({ description: "actual - planned, signed, stock unit." }),
            lots: z.array(z.object({ lotId: z.string(), code: z.string(), quantity: decimal })),
          }),
        ),
        cure: cureCalculationResponse.nullable().meta({ description: "The cure check on the weights actually used." }),
        hold: z
          .object({
            reason: z.string(),
            releasedAt: z.string().nullable(),
            releasedBy: z.object({ id: z.string(), name: z.string() }).nullable(),
            releaseReason: z.string().nullable(),
          })
          .nullable()
          .meta({ description: "Set when the actual cure was over a statutory maximum: the batch is held until a manager releases it with a reason." }),
      })
      .nullable()
      .meta({ description: "What was made; null until the batch is produced." }),
  })
  .meta({ id: "Batch" });

export const batchListResponse = z.object({ batches: z.array(batchResponse) }).meta({ id: "BatchList" });

const BATCH_STATUSES = ["planned", "reserved", "produced", "on_hold", "cancelled"] as const;

export const reserveAllResponse = z
  .object({
    counts: z
      .object({ reserved: z.number().int(), alreadyReserved: z.number().int(), short: z.number().int(), skipped: z.number().int() })
      .meta({ description: "How many batches had each outcome." }),
    batches: z.array(
      z.object({
        batchId: z.string(),
        recipeCode: z.string(),
        plannedFor: z.string().meta({ example: "2026-12-08" }),
        outcome: z.enum(["reserved", "already_reserved", "short", "skipped"]).meta({
          description: "reserved: stock held now; already_reserved: every line was held already, nothing posted; short: nothing held, `short` names the lines; skipped: produced, on hold or cancelled (see status).",
        }),
        status: z.enum(BATCH_STATUSES).meta({ description: "The batch's status after the call." }),
        reserved: z.boolean().meta({ description: "Every line is held for the batch (reserved now or already)." }),
        short: z.array(z.object({ position: z.number().int(), sku: z.string(), needed: decimal, available: decimal, unit: z.string() }))
          .meta({ description: "With outcome short: each line short, what it needs and what could be held, in the stock unit." }),
      }),
    ).meta({ description: "Every batch of the kitchen planned in the range, by production day." }),
  })
  .meta({ id: "ReserveAllResult" });

export const traceQuery = z.object({ format: z.enum(["json", "csv"], { error: "format is json or csv." }).optional() });

export const lotTraceResponse = z
  .object({
    lot: z.object({
      id: z.string(), code: z.string(), item: z.object({ id: z.string(), sku: z.string(), name: z.string(), unit: z.string() }),
      supplier: z.string().nullable(), receivedOn: z.string(), date: z.string().nullable(), dateKind: z.string().nullable(),
    }),
    movements: z.array(z.object({ kind: z.string(), kitchen: z.string(), otherKitchen: z.string().nullable(), quantity: decimal, occurredAt: z.string(), batchCode: z.string().nullable() })),
    batches: z.array(z.object({
      batchId: z.string(), batchCode: z.string(), recipe: z.object({ code: z.string(), name: z.string(), version: z.number().int() }), kitchen: z.string(),
      producedAt: z.string(), quantity: decimal, status: z.string(),
    })),
    onHand: z.array(z.object({ kitchen: z.string(), quantity: decimal })),
    note: z.string().meta({ description: "Shipments to customers are outside the product; the report says so." }),
  })
  .meta({ id: "LotTrace" });

export const batchTraceResponse = z
  .object({
    batch: z.object({
      id: z.string(), batchCode: z.string(), recipe: z.object({ code: z.string(), name: z.string(), version: z.number().int() }), kitchen: z.string(),
      producedAt: z.string(), status: z.string(), actualMeatBlockG: decimal,
    }),
    lots: z.array(z.object({
      lotId: z.string(), code: z.string(), item: z.object({ sku: z.string(), name: z.string(), unit: z.string() }), supplier: z.string().nullable(),
      receivedOn: z.string(), date: z.string().nullable(), dateKind: z.string().nullable(), quantity: decimal,
    })),
    note: z.string(),
  })
  .meta({ id: "BatchTrace" });
