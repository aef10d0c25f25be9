// The casing calculator's request. No server imports: the page's form shares it.
import { z } from "zod";
import { decimalString } from "./common";

const amount = (what: string) =>
  z.object({
    quantity: decimalString({ scale: 12 }).refine((q) => !/^0*(\.0*)?$/.test(q), { error: `The ${what} must be more than zero.` }),
    unit: z.string().trim().min(1, "Enter the unit, e.g. kg or lb.").max(40),
  });

export const casingCalculationInput = z
  .object({
    /** Everything stuffed: meat block plus water, salt, cure and spices (trade-facts §4). */
    fillingMass: amount("filling mass"),
    /** A casing item by id or SKU: its capacity per put-up, or its calibre for a manufactured casing. */
    item: z.string().trim().min(1).max(80).optional(),
    /** Without an item: the stuffed diameter in mm (a manufactured casing, planned as a cylinder). */
    calibreMm: decimalString({ scale: 2 }).optional(),
    /** Overrides the item's capacity per put-up, kg of filling. */
    capacityKg: decimalString({ scale: 6 }).optional(),
    /** Share of the ideal cylinder that is filled (manufactured casings); default 0.9. */
    fillFactor: decimalString({ scale: 4 }).optional(),
    /** g/cm^3 of the filling; default 1.03. */
    density: decimalString({ scale: 4 }).optional(),
    /** Link length (e.g. 15 cm) or link weight (e.g. 100 g). */
    link: z
      .union([z.object({ length: amount("link length") }).strict(), z.object({ weight: amount("link weight") }).strict()], {
        error: "Give the link as {length: {quantity, unit}} or {weight: {quantity, unit}}.",
      })
      .optional(),
  })
  .superRefine((v, ctx) => {
    if (!v.item && !v.calibreMm) ctx.addIssue({ code: "custom", path: ["item"], message: "Choose a casing item, or give a calibre in mm." });
    if (v.item && v.calibreMm) ctx.addIssue({ code: "custom", path: ["calibreMm"], message: "Give a casing item or a calibre, not both." });
    if (!v.item && v.capacityKg) ctx.addIssue({ code: "custom", path: ["capacityKg"], message: "A capacity per put-up belongs to a casing item." });
  });
export type CasingCalculationInput = z.infer<typeof casingCalculationInput>;

const decimal = z.string().meta({ description: "Exact decimal string." });
/** The calculator's answer (lib/data/casing-calculation.ts CasingCalculation). */
export const casingCalculationResponse = z.object({
  fillingKg: decimal,
  casing: z
    .object({ itemId: z.string(), sku: z.string(), name: z.string(), calibreMinMm: decimal, calibreMaxMm: decimal, putUp: z.string().nullable() })
    .nullable(),
  basis: z.discriminatedUnion("kind", [
    z.object({ kind: z.literal("capacity"), capacityKgPerPutUp: decimal, putUpMetres: decimal, source: z.string() }),
    z.object({ kind: z.literal("cylinder"), calibreMm: decimal, fillFactor: decimal, density: decimal, putUpMetres: decimal.nullable(), source: z.string() }),
  ]),
  kgPerMetre: decimal.meta({ description: "kg of filling a metre holds, 6 decimals." }),
  metres: decimal.meta({ description: "Metres of casing, 4 decimals (half-even)." }),
  putUps: decimal.nullable().meta({ description: "Put-ups (hanks, sets, strands), 4 decimals; null when the casing has no put-up length." }),
  putUpsToOpen: z.number().int().nullable().meta({ description: "Whole put-ups to open (rounded up)." }),
  links: z
    .object({ count: z.number().int(), gramsPerLink: decimal, metresPerLink: decimal, leftoverGrams: decimal })
    .nullable()
    .meta({ description: "Whole links (rounded down) and the filling left over." }),
}).meta({ id: "CasingCalculation" });
