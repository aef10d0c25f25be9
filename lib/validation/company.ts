import { z } from "zod";
import { ROLES } from "../../db/types";
import { TABLES } from "../cure/limits";
import { separatorProblem } from "../gs1/parse";
import { dec } from "../units";
import { email, decimalString, role, timeZone, uuid } from "./common";

/** The day a company's planning week starts on (companies.week_start; Monday unless it says otherwise). */
export const WEEK_STARTS = ["monday", "sunday", "saturday"] as const;
export type WeekStart = (typeof WEEK_STARTS)[number];
export const weekStart = z.enum(WEEK_STARTS, { error: "Choose the first day of the week: monday, sunday or saturday." });

/** The approval threshold of purchase orders: an amount of the company's currency, major units (companies.approval_threshold). */
export const approvalThreshold = z
  .string({ error: "Send the threshold as a decimal string, e.g. \"500.00\"." })
  .trim()
  .regex(/^\d{1,16}(\.\d{1,4})?$/, { error: "Use a plain amount such as 500 or 500.00, without the currency sign." });

/** Receiving checks on deliveries (companies.receiving_price_tolerance_pct, short_dated_days_*). */
const shortDatedDays = z.number({ error: "Days as a whole number, e.g. 90." }).int("Days as a whole number, e.g. 90.").min(0).max(3650);
export const receivingSettings = z.object({
  /** a delivered price further than this percent from the ordered one is flagged (default 2) */
  priceTolerancePercent: z.string({ error: "Send the percent as a decimal string, e.g. \"2\"." }).trim().regex(/^\d{1,3}(\.\d{1,2})?$/, "A percent such as 2 or 2.5.")
    .refine((v) => Number.parseFloat(v) <= 100, "At most 100 %.").optional(),
  /** the least remaining life a delivered lot may have, per category, in days (0: no check) */
  shortDatedDays: z.object({ cure: shortDatedDays, casing: shortDatedDays, spice: shortDatedDays, ingredient: shortDatedDays }).partial().optional(),
});

/** The expiry scan's warning windows per category (companies.expiry_windows): days before a lot's date, at most five each; [] = no warning. */
const warningDays = z
  .array(z.number({ error: "Days as whole numbers, e.g. 60, 30, 7." }).int("Days as whole numbers, e.g. 60, 30, 7.").min(1, "At least 1 day.").max(3650, "At most 3650 days."), { error: "A list of days, e.g. [60, 30, 7]." })
  .max(5, "At most five warnings per category.")
  .refine((a) => new Set(a).size === a.length, "Each number of days once.");
export const expiryWindows = z.object({ cure: warningDays, casing: warningDays, spice: warningDays, ingredient: warningDays }).partial();

/** The stand-in scanners type for GS on case labels (companies.scan_separator): the rule of POST /api/gs1/parse's `separator`. */
export const scanSeparator = z
  .string({ error: "The stand-in is a string, e.g. \"|\", or null for none." })
  .superRefine((s, ctx) => {
    const problem = separatorProblem(s);
    if (problem) ctx.addIssue({ code: "custom", message: problem });
  });

export const companyUpdateInput = z.object({
  name: z.string().trim().min(1, "Enter the company name.").max(120),
  timeZone,
  currency: z.string().trim().toUpperCase().regex(/^[A-Z]{3}$/, "Use a three-letter ISO 4217 code, e.g. EUR."),
  /** left out: unchanged (clients written before the setting keep working) */
  weekStart: weekStart.optional(),
  /** buyers approve purchase orders up to this total, managers above it; left out: unchanged */
  approvalThreshold: approvalThreshold.optional(),
  /** receiving checks for deliveries; left out: unchanged */
  receiving: receivingSettings.optional(),
  /** the cost formula (IAS 2): fifo or average; left out: unchanged; changeable only while no month is closed */
  costFormula: z.enum(["fifo", "average"], { error: "fifo or average." }).optional(),
  /** warning windows of the expiry scan per category; a category left out: unchanged */
  expiryWindows: expiryWindows.optional(),
  /** what scanners type instead of GS; null: none; left out: unchanged */
  scanSeparator: scanSeparator.nullable().optional(),
});

/** The cure calculator's company settings (Settings > Company). */
export const companyCureSettingsInput = z.object({
  regulatoryTable: z.enum(TABLES, { error: "Choose the table: us, eu or none." }),
  scaleResolutionG: decimalString({ scale: 4 }).refine((v) => dec(v).isPositive() && !dec(v).isZero() && dec(v).lte(100), {
    error: "The scale resolution is in grams, more than 0 and at most 100 (e.g. 0.1).",
  }),
});

export const kitchenCode = z
  .string()
  .trim()
  .toUpperCase()
  .regex(/^[A-Z0-9][A-Z0-9-]{0,11}$/, "Use 1 to 12 letters, digits or dashes, e.g. NORTH-1.");

const kitchenFields = {
  code: kitchenCode,
  name: z.string().trim().min(1, "Enter the kitchen's name.").max(120),
  address: z.string().trim().max(500),
  timeZone: timeZone.nullable(),
};
export const kitchenCreateInput = z.object({
  ...kitchenFields,
  address: kitchenFields.address.default(""),
  timeZone: kitchenFields.timeZone.default(null),
});
// No defaults here: zod 4 still applies .default() under .partial(), which would blank the address
// and time zone of every PATCH that leaves them out.
export const kitchenUpdateInput = z.object(kitchenFields).partial().extend({ archived: z.boolean().optional() });

export const invitationCreateInput = z
  .object({
    email,
    name: z.string().trim().min(1, "Enter the person's name.").max(120),
    role,
    kitchenIds: z.array(uuid).max(100).default([]),
  })
  .refine((v) => v.role !== "kitchen_lead" || v.kitchenIds.length > 0, {
    path: ["kitchenIds"],
    error: "A kitchen lead needs at least one kitchen.",
  });

export const userUpdateInput = z
  .object({
    name: z.string().trim().min(1, "Enter the person's name.").max(120, "At most 120 characters."),
    role,
    kitchenIds: z.array(uuid).max(100),
    disabled: z.boolean(),
  })
  .partial();

export const profileUpdateInput = z.object({
  name: z.string().trim().min(1, "Enter your name.").max(120),
  timeZone: timeZone.nullable(),
  unitSystem: z.enum(["metric", "us"]),
});

export { ROLES };
