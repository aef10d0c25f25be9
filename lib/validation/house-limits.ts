// House limit requests. No server imports.
import { z } from "zod";
import { PRODUCT_CLASSES } from "../cure/limits";
import { decimalString } from "./common";

export const houseLimitsInput = z.object({
  limits: z
    .array(
      z.object({
        productClass: z.enum(PRODUCT_CLASSES, { error: `Choose one of: ${PRODUCT_CLASSES.join(", ")}.` }),
        substance: z.enum(["nitrite", "nitrate"], { error: "nitrite or nitrate." }),
        kind: z.enum(["max", "min"], { error: "max or min." }),
        limitPpm: decimalString({ scale: 4 }).refine((v) => !/^0*(\.0*)?$/.test(v), { error: "A limit above 0 ppm." }),
        note: z.string().trim().max(300).default(""),
      }),
    )
    .max(40),
});

export const houseLimitsResponse = z
  .object({
    limits: z.array(z.object({ productClass: z.enum(PRODUCT_CLASSES), substance: z.enum(["nitrite", "nitrate"]), kind: z.enum(["max", "min"]), limitPpm: z.string(), note: z.string() })),
  })
  .meta({ id: "HouseLimits" });
