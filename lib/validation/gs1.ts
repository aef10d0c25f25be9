// Reading a GS1 case label (POST /api/gs1/parse): the request and the answer. No server imports:
// the scan field shares them. The splitting and decoding live in lib/gs1.
import { z } from "zod";
import { separatorProblem, type Gs1Label } from "../gs1/parse";

/** A GS1 DataMatrix holds at most 2335 characters; a scan is never longer. */
export const GS1_SCAN_MAX_CHARS = 2500;

export const gs1ParseInput = z.object({
  data: z
    .string({ error: "Scan or type the label's data." })
    .min(1, "Scan or type the label's data.")
    .max(GS1_SCAN_MAX_CHARS, `A scan is at most ${GS1_SCAN_MAX_CHARS} characters.`),
  separator: z
    .string({ error: "The separator is a string, e.g. \"|\"." })
    .superRefine((s, ctx) => {
      const problem = separatorProblem(s);
      if (problem) ctx.addIssue({ code: "custom", message: problem });
    })
    .optional(),
});
export type Gs1ParseInput = z.infer<typeof gs1ParseInput>;

const isoDay = (description: string) => z.string().nullable().meta({ description: `${description} YYYY-MM-DD.`, example: "2027-03-31" });
const isoDayOrMonth = (description: string) =>
  z.string().nullable().meta({ description: `${description} YYYY-MM-DD, or YYYY-MM when the label gives no day (day 00).`, example: "2026-11" });
const decimal = (description: string, example: string) => z.string().nullable().meta({ description: `${description} An exact decimal string.`, example });

/** What a scan says (lib/gs1/parse.ts Gs1Label); absent fields are null. */
export const gs1LabelResponse = z
  .object({
    sscc: z.string().nullable().meta({ description: "(00) Serial Shipping Container Code, 18 digits.", example: "106141411234567897" }),
    gtin: z.string().nullable().meta({ description: "(01) GTIN, 14 digits; a bare GTIN-8/12/13 (EAN/UPC, ITF-14 scans) is padded with leading zeros.", example: "12345678901231" }),
    containedGtin: z.string().nullable().meta({ description: "(02) GTIN of the trade items in a logistic unit, 14 digits." }),
    lot: z.string().nullable().meta({ description: "(10) batch or lot, as printed.", example: "L2611-07" }),
    productionDate: isoDayOrMonth("(11) production date,"),
    packagingDate: isoDayOrMonth("(13) packaging date,"),
    bestBefore: isoDay("(15) best before; day 00 is read as the last day of the month."),
    sellBy: isoDay("(16) sell by; day 00 is read as the last day of the month."),
    expiry: isoDay("(17) expiration (use by); day 00 is read as the last day of the month."),
    netWeightKg: decimal("(310n) net weight in kg with the label's n decimals.", "12.50"),
    netWeightLb: decimal("(320n) net weight in lb with the label's n decimals.", "27.56"),
    count: decimal("(30) variable count, whole number.", "12"),
    tradeItemCount: decimal("(37) count of trade items in a logistic unit, whole number.", "40"),
    other: z
      .record(z.string(), z.string())
      .meta({ description: "Every other AI with its value as scanned, keyed by AI.", example: { "21": "SN0042", "3302": "001350" } }),
  })
  .meta({ id: "Gs1Label" });

// The documented answer stays what lib/gs1 returns: a drift fails `tsc`.
type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;
export const gs1LabelResponseMatches: Same<z.infer<typeof gs1LabelResponse>, Gs1Label> = true;
