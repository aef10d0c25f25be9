// Ledger requests. No server imports: forms and the grid share these.
import { z } from "zod";
import { DATE_KINDS, MOVEMENT_KINDS } from "../../db/types";
import { decimalString, uuid } from "./common";

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, "Use a date as yyyy-mm-dd.");

export const newLotInput = z.object({
  code: z.string().trim().min(1, "Enter the supplier's lot code.").max(80).optional(),
  date: isoDate.optional(),
  dateKind: z.enum(DATE_KINDS, { error: "Say whether the date is use_by or best_before." }).optional(),
  /** Per the movement's unit as typed (e.g. per hank, per kg); stored per stock unit. */
  unitCost: decimalString({ scale: 6 }),
});

export const movementInput = z
  .object({
    kind: z.enum(MOVEMENT_KINDS, { error: `Choose one of: ${MOVEMENT_KINDS.join(", ")}.` }),
    kitchen: z.string().trim().min(1, "Name the kitchen by its code.").max(40),
    item: z.string().trim().min(1, "Name the item by id or SKU.").max(80),
    quantity: decimalString({ scale: 12, signed: true }),
    unit: z.string().trim().min(1, "Enter the unit, e.g. kg or hank.").max(40),
    lot: z.union([uuid, newLotInput]).optional(),
    toKitchen: z.string().trim().min(1).max(40).optional(),
    supplier: z.string().trim().max(120).optional(),
    reason: z.string().trim().max(500).optional(),
    occurredAt: z.iso.datetime({ offset: true, error: "Use an ISO date-time, e.g. 2026-12-01T08:30:00Z." }).optional(),
  })
  .superRefine((v, ctx) => {
    const issue = (path: string, message: string) => ctx.addIssue({ code: "custom", path: [path], message });
    const q = Number.parseFloat(v.quantity); // sign and zero only: the exact value is never taken from a float
    const negative = v.quantity.startsWith("-");
    const zero = /^-?0*(\.0*)?$/.test(v.quantity);
    if (v.kind === "adjustment") {
      if (zero) issue("quantity", "An adjustment is a signed, non-zero quantity.");
    } else if (v.kind === "count") {
      if (negative && !zero) issue("quantity", "A count is the quantity counted: zero or more.");
    } else if (negative || zero || Number.isNaN(q)) {
      issue("quantity", `A ${v.kind} needs a quantity above zero.`);
    }
    if (v.kind === "transfer" && !v.toKitchen) issue("toKitchen", "Name the kitchen the stock goes to.");
    if (v.kind !== "transfer" && v.toKitchen) issue("toKitchen", "Only a transfer goes to another kitchen.");
    if (v.kind === "transfer" && v.toKitchen && v.toKitchen.toUpperCase() === v.kitchen.toUpperCase()) {
      issue("toKitchen", "A transfer goes to another kitchen, not the same one.");
    }
    if (v.kind === "waste" && !v.reason) issue("reason", "Say why it was wasted.");
    if (v.kind !== "receipt" && v.lot !== undefined && typeof v.lot !== "string") {
      issue("lot", "Only a receipt creates a lot; name an existing lot by its id.");
    }
    if (v.kind !== "receipt" && v.supplier) issue("supplier", "Only a receipt has a supplier.");
    if (v.kind === "receipt" && v.lot === undefined) issue("lot", "A receipt needs its lot: {code, date, dateKind, unitCost} or an existing lot's id.");
  });
export type MovementInput = z.infer<typeof movementInput>;

export const reverseInput = z.object({ reason: z.string().trim().max(500).optional() });

export const countSheetInput = z.object({
  kitchen: z.string().trim().min(1, "Name the kitchen by its code.").max(40),
  lines: z
    .array(
      z.object({
        item: z.string().trim().min(1, "Name the item by id or SKU.").max(80),
        lot: uuid.optional(),
        counted: decimalString({ scale: 12 }),
        unit: z.string().trim().min(1, "Enter the unit.").max(40),
      }),
    )
    .min(1, "A count needs at least one line.")
    .max(5000, "At most 5000 lines in one count."),
  note: z.string().trim().max(500).optional(),
  countedAt: z.iso.datetime({ offset: true }).optional(),
});

export const stockLevelInput = z.object({
  kitchen: z.string().trim().min(1, "Name the kitchen by its code.").max(40),
  item: z.string().trim().min(1, "Name the item by id or SKU.").max(80),
  /** Both in `unit` (default: the item's stock unit); null clears the level. */
  parLevel: decimalString({ scale: 12 }).nullable(),
  reorderPoint: decimalString({ scale: 12 }).nullable(),
  unit: z.string().trim().min(1).max(40).optional(),
});

export const transferRequestInput = z
  .object({
    fromKitchen: z.string().trim().min(1, "Name the kitchen asked, by its code.").max(40),
    toKitchen: z.string().trim().min(1, "Name your kitchen, by its code.").max(40),
    item: z.string().trim().min(1, "Name the item by id or SKU.").max(80),
    quantity: decimalString({ scale: 12 }).refine((q) => !/^0*(\.0*)?$/.test(q), "Ask for a quantity above zero."),
    unit: z.string().trim().min(1, "Enter the unit.").max(40),
    note: z.string().trim().max(500).optional(),
    /** the planned batch whose shortage this is for (toKitchen is its kitchen): one open request per batch and item */
    batch: uuid.optional(),
  })
  .refine((v) => v.fromKitchen.toUpperCase() !== v.toKitchen.toUpperCase(), { path: ["fromKitchen"], message: "Ask another kitchen than your own." });

/** lot: the lot to send, by id; left out, the ledger draws first-expired-first-out. */
export const transferFulfilInput = z.object({ lot: z.uuid({ error: "Name the lot by its id, or leave it out to send first expired first out." }).optional() });
export const transferDeclineInput = z.object({ reason: z.string().trim().min(1, "Say why the request is declined.").max(500) });
export const transferRequestsQuery = z.object({
  status: z.enum(["open", "fulfilled", "declined", "cancelled"]).optional(),
  kitchen: z.string().trim().min(1).max(40).optional(),
});
