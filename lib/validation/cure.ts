// The cure calculator's request (POST /api/calculations/cure) and answer. No server imports: the
// calculator page shares them. The arithmetic and the limits live in lib/cure.
import { z } from "zod";
import type { CureCalculation } from "../cure/calculate";
import { CLASSES_BY_METHOD, HEAT_TREATMENTS, METHODS, PRODUCT_CLASSES, SALTS, STORAGES, TABLES } from "../cure/limits";
import { findGlobalUnit } from "../units";
import { decimalString } from "./common";

const isZero = (q: string) => /^0*(\.0*)?$/.test(q);

const massUnit = z
  .string({ error: "Enter the unit: g, kg, oz or lb." })
  .trim()
  .min(1, "Enter the unit: g, kg, oz or lb.")
  .max(40)
  .refine((u) => findGlobalUnit(u)?.dimension === "mass", { error: "Use a mass unit: g, kg, oz or lb (weigh it: volumes are unreliable)." });

const massAmount = (what: string) =>
  z.object({
    quantity: decimalString({ scale: 12 }).refine((q) => !isZero(q), { error: `The ${what} must be more than zero.` }),
    unit: massUnit,
  });

const fraction = (what: string) =>
  z
    .string({ error: `Enter the ${what} fraction from the label as a decimal string (6.25 % is "0.0625"; "0" if none).` })
    .trim()
    .regex(/^(0(\.\d{1,8})?|1(\.0{1,8})?)$/, { error: `The ${what} fraction is from 0 to 1 with at most 8 decimals (6.25 % is "0.0625").` });

export const cureLineInput = z.object({
  /** grams (or `unit`) of this cure; left out for the one cure of an inverse calculation */
  quantity: decimalString({ scale: 12 })
    .refine((q) => !isZero(q), { error: "The cure quantity must be more than zero." })
    .optional(),
  unit: massUnit.optional(),
  nitriteFraction: fraction("nitrite"),
  nitrateFraction: fraction("nitrate").optional(),
  nitriteSalt: z.enum(SALTS, { error: "sodium or potassium" }).optional(),
  nitrateSalt: z.enum(SALTS, { error: "sodium or potassium" }).optional(),
  name: z.string().trim().max(120).optional(),
});
export type CureLineInput = z.infer<typeof cureLineInput>;

export const cureCalculationInput = z
  .object({
    method: z.enum(METHODS, { error: "Choose the method: comminuted, dry, pumped or immersion." }),
    productClass: z
      .enum(PRODUCT_CLASSES, {
        error: "Choose the product class: comminuted, dry_cured, immersion_cured, pumped, bacon_pumped, bacon_immersion or bacon_dry.",
      })
      .optional(),
    storage: z.enum(STORAGES, { error: "Choose keep_refrigerated or shelf_stable." }).optional(),
    table: z.enum(TABLES, { error: "Choose the table: us, eu or none." }).optional(),
    meatBlock: massAmount("meat block"),
    cures: z.array(cureLineInput).min(1, "Give at least one cure.").max(10, "At most 10 cures.").optional(),
    cure: cureLineInput.optional(),
    pickle: massAmount("pickle").optional(),
    pumpFraction: decimalString({ scale: 6 }).optional(),
    batchMass: massAmount("batch mass").optional(),
    heatTreatment: z.enum(HEAT_TREATMENTS, { error: "Choose not_heat_treated, heat_treated or sterilised." }).optional(),
    targetNitritePpm: decimalString({ scale: 4 }).optional(),
  })
  .superRefine((v, ctx) => {
    const issue = (path: (string | number)[], message: string) => ctx.addIssue({ code: "custom", path, message });
    if (v.cures && v.cure) issue(["cure"], "Send either cures (a list) or cure (one), not both.");
    if (!v.cures && !v.cure) issue(["cures"], "Give at least one cure with its nitrite fraction.");
    if (v.table === "eu" && !v.batchMass) issue(["batchMass"], "EU limits are per kg of the whole batch: give the batch mass.");
    if (v.method === "pumped") {
      if (!v.pickle) issue(["pickle"], "A pumped cure needs the pickle's weight.");
      if (!v.pumpFraction) issue(["pumpFraction"], "A pumped cure needs the pump level as a fraction (10 % is \"0.1\").");
    }
    if (v.method === "immersion" && !v.pickle) issue(["pickle"], "An immersion cure needs the pickle's weight.");
    const lines: [string[], z.infer<typeof cureLineInput>][] = v.cures ? v.cures.map((c, i) => [["cures", String(i)], c]) : v.cure ? [[["cure"], v.cure]] : [];
    if (v.productClass && !CLASSES_BY_METHOD[v.method].includes(v.productClass)) {
      issue(
        ["productClass"],
        v.method === "comminuted"
          ? "Chopped and ground products (dry and fermented sausages included) are comminuted: the chopped-meat limit applies."
          : `A ${v.method} cure makes ${CLASSES_BY_METHOD[v.method].join(" or ")} products.`,
      );
    }
    for (const [path, c] of lines) {
      // nitrite + nitrate above 1 is refused exactly in lib/cure
      if (isZero(c.nitriteFraction) && (c.nitrateFraction === undefined || isZero(c.nitrateFraction))) {
        issue([...path, "nitriteFraction"], "A cure carries nitrite or nitrate: both cannot be 0.");
      }
      if (v.targetNitritePpm === undefined && c.quantity === undefined) issue([...path, "quantity"], "Enter how much of this cure is used (or give a target ppm to find it).");
    }
    if (v.targetNitritePpm !== undefined) {
      if (isZero(v.targetNitritePpm)) issue(["targetNitritePpm"], "The target must be more than 0 ppm.");
      if (lines.length !== 1) issue([v.cures ? "cures" : "cure"], "To find the cure for a target ppm, give exactly one cure, without a quantity.");
      else if (lines[0]![1].quantity !== undefined) issue([...lines[0]![0], "quantity"], "Leave the quantity out: it is what the calculator finds.");
    }
  });
export type CureCalculationInput = z.infer<typeof cureCalculationInput>;

// ---------------------------------------------------------------------------------------------
// The answer (documents the endpoint; lib/cure's CureCalculation is the type the route returns).

const ppm = (description: string) => z.string().meta({ description: `${description} A decimal string to 4 places.`, example: "156.2500" });

const citation = z.object({
  regulation: z.string(),
  entry: z.string().meta({ description: "The row or paragraph, in the regulation's words where they were read." }),
  readOn: z.string().meta({ description: "The day the figure was read.", example: "2026-12-02" }),
  via: z.string().meta({ description: "How the text was reached, and how sure the figure is." }),
});

export const cureCheckResponse = z
  .object({
    id: z.string(),
    table: z.enum(["us", "eu"]),
    entry: z.string().meta({ description: "The entry of the table this check used." }),
    productClass: z.enum(PRODUCT_CLASSES),
    substance: z.enum(["nitrite", "nitrate"]),
    kind: z.enum(["max", "min", "target"]).meta({ description: "max: ppm <= limit; min: ppm >= limit; target: a required level, |ppm - limit| <= tolerance." }),
    limitPpm: z.string().meta({ example: "156.25" }),
    tolerancePpm: z.string().optional().meta({ description: "A range's half-width (40 to 80 ppm is 60 +/- 20)." }),
    ppm: ppm("This batch's value under this entry."),
    deviationPpm: z.string().meta({ description: "ppm - limitPpm, signed, 4 places rounded away from zero.", example: "+0.0000" }),
    within: z.boolean().meta({ description: "Decided on exact values, before any rounding for display." }),
    severity: z.enum(["block", "warn"]).meta({ description: "What a miss does: verified statutory maxima block; minima, required levels and unverified figures warn." }),
    salt: z.enum(["sodium", "potassium", "sodium_equivalent", "mixed"]),
    basis: z.enum(["meat_block", "batch_as_ion"]).meta({ description: "US: ppm on the meat block's green weight. EU: mg per kg of the whole batch, as the ion." }),
    verified: z.boolean().meta({ description: "false: the figure was not read in the regulation's own text." }),
    group: z.string().optional().meta({ description: "Alternatives of one required level share a group." }),
    groupMet: z.boolean().optional().meta({ description: "Whether any alternative of the group is met." }),
    conditions: z.string().optional(),
    derived: z.string().optional().meta({ description: "How a potassium figure was derived where the text gives none." }),
    citation,
  })
  .meta({ id: "CureCheck" });

export const cureCalculationResponse = z
  .object({
    method: z.enum(METHODS),
    productClass: z.enum(PRODUCT_CLASSES),
    table: z.enum(TABLES),
    storage: z.enum(STORAGES).nullable(),
    meatBlockGrams: z.string(),
    pickleGrams: z.string().nullable(),
    batchGrams: z.string().nullable(),
    nitritePpm: ppm("Ingoing nitrite on the meat block, as sodium nitrite (potassium nitrite / 1.2335)."),
    nitratePpm: ppm("Ingoing nitrate salts on the meat block."),
    nitriteBySalt: z.object({ sodium: z.string(), potassium: z.string() }),
    euIonsMgPerKg: z
      .object({ nitrite: z.string().nullable(), nitrate: z.string().nullable() })
      .nullable()
      .meta({ description: "With a batch mass: mg per kg of the whole batch as NO2- (NaNO2 x 0.67) and NO3- (NaNO3 x 0.73); null for potassium salts." }),
    requiredCure: z
      .object({
        quantity: z.string().meta({ description: "Grams, rounded to the company's scale resolution toward compliance.", example: "2.5" }),
        unit: z.literal("g"),
        exactQuantity: z.string().meta({ description: "Grams before rounding, 6 places." }),
        scaleResolutionG: z.string(),
        rounding: z.enum(["exact", "down", "up"]),
        targetNitritePpm: z.string(),
      })
      .nullable(),
    checks: z.array(cureCheckResponse),
    blocked: z.boolean().meta({ description: "A verified statutory maximum is exceeded: this formulation must not be used." }),
    warnings: z.number().int().meta({ description: "Minima, required levels (no alternative met) and unverified figures missed." }),
    notes: z.array(z.string()),
    caution: z.string().meta({ description: "Shown wherever cure is computed: toxic in overdose; keep apart and labelled; local rules govern." }),
  })
  .meta({ id: "CureCalculation" });

// The documented answer stays what lib/cure returns: a drift fails `tsc`.
type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;
export const cureResponseMatches: Same<z.infer<typeof cureCalculationResponse>, CureCalculation> = true;
