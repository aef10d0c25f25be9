// The column mapping of a CSV import: set once per supplier (and file layout) and kept, so the
// next file of the same layout imports without asking. Which column holds each target field, by
// header text or by column number (1 = the first column, as a spreadsheet counts), and how the
// file writes numbers and dates. No server imports: the mapping screen validates with this too.
import { z } from "zod";
import { DATE_FORMATS } from "../import/dates";
import { DECIMAL_SEPARATORS, THOUSANDS_SEPARATORS } from "../import/numbers";

export const CSV_DELIMITERS = [",", ";", "\t", "|"] as const;

export const csvColumnRef = z.union([
  z.object({ header: z.string().trim().min(1, "Name the column.").max(200, "At most 200 characters.") }).strict(),
  z.object({ column: z.number().int("A whole column number.").min(1, "Columns count from 1.").max(1000, "At most column 1000.") }).strict(),
], { error: "Give the column as {\"header\": \"Price\"} or {\"column\": 3}." });

export const csvMapping = z
  .object({
    /** The row with the column names (1 = the first row); 0: the file has none (map by column number). */
    headerRow: z.number().int().min(0).max(50).default(1),
    /** target field key -> the file's column */
    columns: z.record(z.string().min(1).max(60), csvColumnRef),
    /** null or absent: detected from the file */
    delimiter: z.enum(CSV_DELIMITERS, { error: "Choose comma, semicolon, tab or |." }).nullish(),
    decimal: z.enum(DECIMAL_SEPARATORS, { error: "Choose '.' or ','." }).default("."),
    thousands: z.enum(THOUSANDS_SEPARATORS, { error: "Choose none, ',', '.', ' ' or \"'\"." }).default(""),
    dateFormat: z.enum(DATE_FORMATS, { error: `Choose one of ${DATE_FORMATS.join(", ")}.` }).default("yyyy-MM-dd"),
  })
  .superRefine((m, ctx) => {
    if (m.decimal === m.thousands) ctx.addIssue({ code: "custom", path: ["thousands"], message: "The thousands separator must differ from the decimal separator." });
    if (m.headerRow === 0) {
      for (const [key, ref] of Object.entries(m.columns)) {
        if ("header" in ref) ctx.addIssue({ code: "custom", path: ["columns", key], message: "The file has no header row: choose the column by number." });
      }
    }
  });

export type CsvMapping = z.infer<typeof csvMapping>;
export type CsvMappingInput = z.input<typeof csvMapping>;
