// Recipe requests. No server imports: the recipe form shares these.
import { z } from "zod";
import { methodOf } from "../cure/method";
import { PRODUCT_CLASSES, STORAGES } from "../cure/limits";
import { cureCalculationResponse } from "./cure";
import { dec } from "../units/decimal";
import { decimalString } from "./common";

export const RATE_UNITS = { "g/kg": "g_per_kg", "%": "percent", "ml/kg": "ml_per_kg" } as const;
export type RateUnitInput = keyof typeof RATE_UNITS;
export type RateUnit = (typeof RATE_UNITS)[RateUnitInput];
export const RATE_BASES = ["meat_block", "pickle"] as const;

const positiveDecimal = (scale: number, what: string) =>
  decimalString({ scale }).refine((q) => !/^0*(\.0*)?$/.test(q), { error: `${what} must be more than zero.` });

const amount = (what: string) =>
  z.object({
    quantity: positiveDecimal(12, `The ${what}`),
    unit: z.string().trim().min(1, "Enter the unit.").max(40),
  });

export const recipeCode = z
  .string()
  .trim()
  .toUpperCase()
  .regex(/^[A-Z0-9][A-Z0-9-]{0,15}$/, "Use 1 to 16 letters, digits or dashes, e.g. BRAT-1 (batch codes start with it).");

const meatComponent = z.object({
  name: z.string().trim().min(1, "Name the meat or fat, e.g. pork shoulder.").max(120),
  percent: positiveDecimal(6, "The share"),
});

const recipeLine = z.object({
  item: z.string().trim().min(1, "Choose the item.").max(80),
  rate: positiveDecimal(12, "The rate"),
  unit: z.enum(Object.keys(RATE_UNITS) as [RateUnitInput, ...RateUnitInput[]], { error: "Give the rate in g/kg, % or ml/kg." }),
  basis: z.enum(RATE_BASES, { error: "A rate is per kg of the meat block or of the pickle." }).default("meat_block"),
});

const versionShape = {
  name: z.string().trim().min(1, "Name the recipe.").max(120),
  productClass: z.enum(PRODUCT_CLASSES, {
    error: `Choose one of: ${PRODUCT_CLASSES.join(", ")} (dry and fermented sausages are comminuted).`,
  }),
  storage: z.enum(STORAGES, { error: "Say whether the product is keep_refrigerated or shelf_stable." }),
  meatBlock: z.array(meatComponent).min(1, "Give the meat block: at least one meat or fat with its share.").max(20),
  lines: z.array(recipeLine).max(60).default([]),
  pickle: z
    .object({
      kgPerKgMeat: positiveDecimal(12, "The pickle per kg of meat"),
      pumpFraction: positiveDecimal(12, "The pump level").optional(),
    })
    .optional(),
  casing: z
    .object({
      item: z.string().trim().min(1).max(80).optional(),
      calibreMinMm: positiveDecimal(2, "The calibre").optional(),
      calibreMaxMm: positiveDecimal(2, "The calibre").optional(),
      linkLength: amount("link length").optional(),
      linkWeight: amount("link weight").optional(),
    })
    .optional(),
  processNotes: z.string().trim().max(4000).default(""),
  changeNote: z.string().trim().max(500).default(""),
};

const versionObject = z.object(versionShape);
type VersionDraft = z.infer<typeof versionObject>;

/** Checks that need no database: shares add up, pickle matches the method, casing is whole. */
function checkVersion(v: VersionDraft, ctx: z.RefinementCtx) {
  const issue = (path: (string | number)[], message: string) => ctx.addIssue({ code: "custom", path, message });
  const total = v.meatBlock.reduce((sum, c) => (/^\d/.test(c.percent) ? sum.plus(dec(c.percent)) : sum), dec("0"));
  if (!total.eq(100)) issue(["meatBlock"], `The meat block's shares add up to ${total.toString()} %, not 100 %.`);

  const method = methodOf(v.productClass);
  const usesPickle = method === "pumped" || method === "immersion";
  if (usesPickle && !v.pickle) issue(["pickle"], "A pumped or immersion-cured product needs its pickle: kg of pickle per kg of meat.");
  if (!usesPickle && v.pickle) issue(["pickle"], "Only pumped and immersion-cured products have a pickle.");
  if (method === "pumped" && v.pickle && !v.pickle.pumpFraction) issue(["pickle", "pumpFraction"], "Give the pump level as a fraction of green weight (10 % is 0.1).");
  if (method !== "pumped" && v.pickle?.pumpFraction) issue(["pickle", "pumpFraction"], "Only a pumped product has a pump level.");
  if (v.pickle?.pumpFraction && dec(v.pickle.pumpFraction).gt(1)) issue(["pickle", "pumpFraction"], "The pump level is at most 1 (100 %).");
  v.lines.forEach((l, i) => {
    if (l.basis === "pickle" && !usesPickle) issue(["lines", i, "basis"], "This product has no pickle: give the rate per kg of the meat block.");
  });

  const c = v.casing;
  if (c) {
    if (!c.item && !c.calibreMinMm) issue(["casing"], "Choose a casing item or give a calibre range.");
    if ((c.calibreMinMm === undefined) !== (c.calibreMaxMm === undefined)) issue(["casing", "calibreMaxMm"], "Give both ends of the calibre range (the same twice for one size).");
    if (c.calibreMinMm && c.calibreMaxMm && dec(c.calibreMaxMm).lt(dec(c.calibreMinMm))) issue(["casing", "calibreMaxMm"], "The upper calibre is below the lower one.");
    if (c.linkLength && c.linkWeight) issue(["casing", "linkWeight"], "Give a link length or a link weight, not both.");
  }
}

export const recipeCreateInput = z.object({ code: recipeCode, ...versionShape }).superRefine(checkVersion);
export type RecipeCreateInput = z.infer<typeof recipeCreateInput>;

export const recipeVersionInput = versionObject.superRefine(checkVersion);
export type RecipeVersionInput = z.infer<typeof recipeVersionInput>;

export const recipeGetQuery = z.object({
  version: z.coerce.number({ error: "Give a version number." }).int().positive().optional(),
});

export const recipeListQuery = z.object({
  includeArchived: z.enum(["true", "false"]).optional(),
});

// ---------------------------------------------------------------------------------------------
// Answers (lib/data/recipes.ts Recipe, RecipeSummary); a drift fails `tsc` in lib/http/openapi.ts.
const decimal = z.string().meta({ description: "Exact decimal string." });
const person = z.object({ id: z.string(), name: z.string() }).nullable();

export const recipeResponse = z
  .object({
    id: z.string(),
    code: z.string(),
    name: z.string(),
    archived: z.boolean(),
    currentVersion: z.number().int(),
    versions: z.array(z.object({ version: z.number().int(), createdAt: z.string(), createdBy: person, changeNote: z.string() })),
    version: z.object({
      version: z.number().int(),
      productClass: z.enum(PRODUCT_CLASSES),
      method: z.enum(["comminuted", "dry", "pumped", "immersion"]),
      storage: z.enum(STORAGES),
      meatBlock: z.array(z.object({ name: z.string(), percent: decimal })),
      lines: z.array(
        z.object({
          position: z.number().int(),
          item: z.object({ id: z.string(), sku: z.string(), name: z.string(), category: z.enum(["casing", "cure", "spice", "ingredient"]), stockUnit: z.enum(["g", "ml", "m", "pc"]) }),
          rate: decimal,
          unit: z.enum(["g/kg", "%", "ml/kg"]),
          basis: z.enum(RATE_BASES),
          perKgMeat: z.object({ quantity: decimal, unit: z.enum(["g", "ml"]) }).meta({ description: "The line for 1 kg of meat block, in the item's stock unit (6 places)." }),
        }),
      ),
      pickle: z.object({ kgPerKgMeat: decimal, pumpFraction: decimal.nullable() }).nullable(),
      casing: z
        .object({
          item: z.object({ id: z.string(), sku: z.string(), name: z.string(), calibreMinMm: decimal, calibreMaxMm: decimal }).nullable(),
          calibreMinMm: decimal.nullable(),
          calibreMaxMm: decimal.nullable(),
          linkLengthM: decimal.nullable(),
          linkWeightG: decimal.nullable(),
        })
        .nullable(),
      fillingGramsPerKgMeat: decimal.meta({ description: "What goes into the casing for 1 kg of meat block: the meat plus the meat-block lines, grams." }),
      processNotes: z.string(),
      changeNote: z.string(),
      createdAt: z.string(),
      createdBy: person,
      cure: cureCalculationResponse.nullable().meta({ description: "The cure check at the recipe's exact rates, on the company's table; null when the recipe has no cure." }),
    }),
  })
  .meta({ id: "Recipe" });

export const recipeListResponse = z
  .object({
    recipes: z.array(
      z.object({
        id: z.string(), code: z.string(), name: z.string(), currentVersion: z.number().int(), productClass: z.enum(PRODUCT_CLASSES),
        storage: z.enum(STORAGES), hasCure: z.boolean(), archived: z.boolean(),
      }),
    ),
  })
  .meta({ id: "RecipeList" });
