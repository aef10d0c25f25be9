// Suppliers and supplier items: request schemas (forms, actions and routes share them) and the
// answers' shapes (lib/data/suppliers.ts; a drift fails `tsc` in lib/http/openapi.ts). Client-safe.
// The pack's conversion to the item's stock unit needs the item, so it happens in lib/data
// (422 on packUnit naming both units); a GTIN is checked here (422 on gtin).
import { z } from "zod";
import { ITEM_CATEGORIES, STOCK_UNITS } from "../../db/types";
import { isValidGtin, normalizeGtin } from "@/lib/gs1/gtin";
import { dec } from "../units";
import { decimalString, email } from "./common";

// ---------------------------------------------------------------------------------------------
// Suppliers

const supplierName = z.string({ error: "Enter the supplier's name." }).trim().min(1, "Enter the supplier's name.").max(120, "At most 120 characters.");
const contactName = z.string({ error: "Enter the contact's name as text." }).trim().max(120, "At most 120 characters.");
/** Digits, spaces and + ( ) - . / as people write phone numbers; "ext" allowed. */
const phone = z
  .string({ error: "Enter the phone number as text." })
  .trim()
  .max(40, "At most 40 characters.")
  .regex(/^[0-9+()\-./ ]*(?:(?:ext\.?|x) ?[0-9]+)?$/i, "Use digits, spaces and + ( ) - . / only, e.g. +44 1632 960 123.");
const leadTimeDays = z
  .number({ error: "Enter the lead time in whole days, from 0 to 365." })
  .int("Enter the lead time in whole days, from 0 to 365.")
  .min(0, "Enter the lead time in whole days, from 0 to 365.")
  .max(365, "Enter the lead time in whole days, from 0 to 365.");
/**
 * An amount of the company's currency, in major units ("150.00"); at most as many decimals as the
 * currency has (checked in lib/data, which knows the currency), never more than 4 (NUMERIC(20,4)).
 */
export const moneyAmount = z
  .string({ error: "Send the amount as a decimal string, e.g. \"150.00\"." })
  .trim()
  .regex(/^\d{1,16}(\.\d{1,4})?$/, { error: "Use a plain amount such as 150 or 150.00, without the currency sign." });
const notes = z.string({ error: "Enter the notes as text." }).trim().max(2000, "At most 2000 characters.");
const flag = z.boolean({ error: "Send true or false." });

export const supplierCreateInput = z.object({
  name: supplierName,
  contactName: contactName.optional(),
  /** where orders are e-mailed; null or left out: none */
  orderEmail: email.nullable().optional(),
  phone: phone.optional(),
  leadTimeDays,
  /** null or left out: no minimum */
  minOrderValue: moneyAmount.nullable().optional(),
  notes: notes.optional(),
  active: flag.optional(),
});
export type SupplierCreateInput = z.infer<typeof supplierCreateInput>;

export const supplierPatchInput = z
  .object({
    name: supplierName,
    contactName,
    orderEmail: email.nullable(),
    phone,
    leadTimeDays,
    minOrderValue: moneyAmount.nullable(),
    notes,
    active: flag,
  })
  .partial();
export type SupplierPatchInput = z.infer<typeof supplierPatchInput>;

/** GET /api/suppliers */
export const supplierListQuery = z.object({
  q: z.string().trim().max(100, "At most 100 characters.").optional(),
  inactive: z.enum(["true", "false"], { error: "Send true or false." }).optional(),
});

// ---------------------------------------------------------------------------------------------
// Supplier items

/** The supplier's own code, as printed on its price list and delivery notes (any printable text). */
const supplierSku = z
  .string({ error: "Enter the supplier's SKU." })
  .trim()
  .min(1, "Enter the supplier's SKU.")
  .max(60, "At most 60 characters.")
  .regex(/^[^\u0000-\u001f\u007f]+$/, "Use printable characters only.");
const description = z.string({ error: "Enter the description as text." }).trim().max(200, "At most 200 characters.");
/** Our stock item, by id or SKU. */
const itemRef = z.string({ error: "Choose our item (its id or SKU)." }).trim().min(1, "Choose our item (its id or SKU).").max(100, "At most 100 characters.");
const packLabel = z.string({ error: "Describe the pack as text, e.g. \"bundle of 5 hanks\"." }).trim().max(80, "At most 80 characters.");
const packQuantity = decimalString({ scale: 12 }).refine((s) => dec(s).gt(0), { error: "Must be more than 0." });
const packUnit = z
  .string({ error: "Enter the unit the pack's size is in, e.g. hank or kg." })
  .trim()
  .min(1, "Enter the unit the pack's size is in, e.g. hank or kg.")
  .max(30, "At most 30 characters.");

export const GTIN_MESSAGE = "Not a valid GTIN: type the 8, 12, 13 or 14 digits under the barcode (the last one is a check digit).";

/** A GTIN-8/12/13/14 as printed (spaces allowed), with a correct check digit; stored padded to 14. */
export const gtinInput = z
  .string({ error: GTIN_MESSAGE })
  .trim()
  .max(20, GTIN_MESSAGE)
  .refine((s) => normalizeGtin(s) !== null, { error: GTIN_MESSAGE });

/** The 14-digit form of a checked GTIN (gtinInput has already refused anything else). */
export function gtin14Of(s: string): string {
  const g = normalizeGtin(s);
  if (g === null || !isValidGtin(g)) throw new Error(`not a GTIN: ${s}`);
  return g;
}

export const supplierItemCreateInput = z.object({
  sku: supplierSku,
  description: description.optional(),
  item: itemRef,
  /** what the supplier calls the pack; left out: "5 hank" from the quantity and unit */
  packLabel: packLabel.optional(),
  packQuantity,
  packUnit,
  gtin: gtinInput.nullable().optional(),
  active: flag.optional(),
});
export type SupplierItemCreateInput = z.infer<typeof supplierItemCreateInput>;

export const supplierItemPatchInput = z
  .object({
    sku: supplierSku,
    description,
    item: itemRef,
    packLabel,
    packQuantity,
    packUnit,
    gtin: gtinInput.nullable(),
    active: flag,
  })
  .partial();
export type SupplierItemPatchInput = z.infer<typeof supplierItemPatchInput>;

/** GET /api/suppliers/{id}/items */
export const supplierItemListQuery = z.object({
  inactive: z.enum(["true", "false"], { error: "Send true or false." }).optional(),
});

// ---------------------------------------------------------------------------------------------
// Answers

const id = z.uuid();
const timestamp = z.iso.datetime({ offset: true }).meta({ description: "ISO 8601 timestamp in UTC." });
const decimal = (description: string, example?: string) =>
  z.string().meta({ description: `${description} A decimal string.`, ...(example ? { example } : {}) });

export const supplierResponse = z
  .object({
    id,
    name: z.string().meta({ example: "Fenwick & Rudd Casings" }),
    contactName: z.string(),
    orderEmail: z.string().nullable().meta({ description: "Where orders are e-mailed; null: none." }),
    phone: z.string(),
    leadTimeDays: z.number().int().meta({ description: "Days from order to delivery.", example: 3 }),
    minOrderValue: decimal("Minimum order value in the company's currency, with the currency's decimals; null: no minimum.", "150.00").nullable(),
    currency: z.string().meta({ description: "The company's currency (ISO 4217): every supplier trades in it.", example: "GBP" }),
    notes: z.string(),
    active: z.boolean(),
    itemCount: z.number().int().meta({ description: "Active supplier items." }),
    createdAt: timestamp,
    updatedAt: timestamp,
  })
  .meta({ id: "Supplier" });

export const supplierListResponse = z.object({ suppliers: z.array(supplierResponse) }).meta({ id: "SupplierList" });

export const supplierItemResponse = z
  .object({
    id,
    supplierId: id,
    sku: z.string().meta({ description: "The supplier's SKU (unique per supplier, whatever the case).", example: "FR-H3235-B5" }),
    description: z.string(),
    item: z
      .object({ id, sku: z.string(), name: z.string(), category: z.enum(ITEM_CATEGORIES), stockUnit: z.enum(STOCK_UNITS), archived: z.boolean() })
      .meta({ description: "Our stock item. Supplier items of the same item are alternatives for it." }),
    packLabel: z.string().meta({ example: "bundle of 5 hanks" }),
    packQuantity: decimal("The pack as entered, in packUnit.", "5"),
    packUnit: z.string().meta({ example: "hank" }),
    packSizeStock: decimal("One pack in the item's stock unit, exact to 12 decimals.", "5"),
    stockUnit: z.enum(STOCK_UNITS),
    packMetres: decimal("One pack's length in metres, for casings (put-ups or metres); null otherwise.", "457.2").nullable(),
    gtin: z.string().nullable().meta({ description: "GTIN-14 (a GTIN-8/12/13 padded with leading zeros); null when not known.", example: "00036000291452" }),
    active: z.boolean(),
    createdAt: timestamp,
    updatedAt: timestamp,
  })
  .meta({ id: "SupplierItem" });

export const supplierItemListResponse = z.object({ supplierItems: z.array(supplierItemResponse) }).meta({ id: "SupplierItemList" });
