// The movement journal: query and answer of GET /api/reports/journal (lib/data/journal.ts).
// Client-safe.
import { z } from "zod";
import { ITEM_CATEGORIES, MOVEMENT_KINDS, STOCK_UNITS } from "../../db/types";
import { MAPPING_KINDS } from "./accounts";
import { MAX_REPORT_MONTHS, usageQueryFields } from "./reports";

/** The query's fields (the OpenAPI document shows these); journalQuery adds the range checks. */
export const journalQueryFields = usageQueryFields.pick({ from: true, to: true, kitchen: true, bom: true }).extend({
  format: z.enum(["json", "csv"], { error: "json or csv." }).default("json"),
});

export const journalQuery = journalQueryFields.superRefine((q, ctx) => {
  if (q.from > q.to) ctx.addIssue({ code: "custom", path: ["to"], message: "to: the last month comes after from." });
  const months = (Number(q.to.slice(0, 4)) - Number(q.from.slice(0, 4))) * 12 + Number(q.to.slice(5)) - Number(q.from.slice(5)) + 1;
  if (months > MAX_REPORT_MONTHS) ctx.addIssue({ code: "custom", path: ["to"], message: `to: at most ${MAX_REPORT_MONTHS} months in one journal.` });
});
export type JournalQuery = z.infer<typeof journalQuery>;

const money = (description: string) => z.string().meta({ description: `${description} A decimal string with the currency's decimals, never negative.`, example: "18.00" });
const mappingKey = z.object({
  kind: z.enum(MAPPING_KINDS),
  key: z.string().meta({ description: "inventory: the item's category; movement: receipt, use, waste, loss or gain.", example: "spice" }),
});

export const journalLineResponse = z
  .object({
    side: z.enum(["debit", "credit"]),
    account: z.string().nullable().meta({ description: "The account code from the mapping; null when that key is unmapped.", example: "1320" }),
    accountName: z.string().nullable().meta({ description: "The account's name from the mapping, if it has one." }),
    mapping: mappingKey.meta({ description: "Which mapping key chose the account." }),
    amount: money("The amount on that side."),
  })
  .meta({ id: "JournalLine" });

export const journalEntryResponse = z
  .object({
    date: z.string().meta({ description: "YYYY-MM-DD: the day the movement happened, in the company's time zone.", example: "2026-10-10" }),
    movementId: z.uuid(),
    postingId: z.uuid(),
    reversesId: z.uuid().nullable().meta({ description: "Set on a reversal: the movement it reverses (its entry has the sides swapped)." }),
    kind: z.enum(MOVEMENT_KINDS),
    kitchen: z.object({ id: z.uuid(), code: z.string(), name: z.string() }),
    item: z.object({ id: z.uuid(), sku: z.string(), name: z.string(), category: z.enum(ITEM_CATEGORIES) }),
    quantity: z.string().meta({ description: "The signed change of on hand, in the stock unit.", example: "-1500" }),
    unit: z.enum(STOCK_UNITS),
    value: z.string().meta({ description: "The signed change of the inventory account (the movement's value by the cost formula), rounded half-even to the currency's decimals.", example: "-18.00" }),
    amount: money("The entry's debits (= its credits)."),
    description: z.string().meta({ example: "Use 1500 g PEP-BLK Black pepper (YARD)" }),
    lines: z.array(journalLineResponse).meta({ description: "Debits first. Two lines; three for a receipt (or its reversal) whose value differs from quantity x its unit cost." }),
  })
  .meta({ id: "JournalEntry" });

export const journalAccountResponse = z
  .object({
    account: z.string().nullable().meta({ description: "The account code; null for an unmapped key (one row per key)." }),
    name: z.string().nullable(),
    mappings: z.array(mappingKey).meta({ description: "The mapping keys booked to this account in the journal." }),
    debit: money("Sum of the debit lines."),
    credit: money("Sum of the credit lines."),
    net: z.string().meta({ description: "debit - credit (negative: a credit balance).", example: "-2.40" }),
  })
  .meta({ id: "JournalAccount" });

export const journalResponse = z
  .object({
    from: z.string(),
    to: z.string(),
    kitchen: z.object({ id: z.uuid(), code: z.string(), name: z.string() }).nullable(),
    currency: z.string(),
    costFormula: z.enum(["fifo", "average"]),
    entries: z.array(journalEntryResponse),
    byAccount: z.array(journalAccountResponse).meta({ description: "Per account code (sorted), then the unmapped keys." }),
    unmapped: z.array(mappingKey.extend({ lines: z.number().int().meta({ description: "Journal lines without an account for this key." }) }))
      .meta({ description: "Mapping keys this journal needed that have no account code: set them with PUT /api/reports/accounts." }),
    transfersLeftOut: z.number().int().meta({ description: "Transfer legs in the range with no entry of their own: the value stays in the same inventory account (only a leg pair that does not net to zero books the difference, on its arriving leg)." }),
    totals: z.object({ debit: money("Sum of every debit line."), credit: money("Sum of every credit line (always equal to debit).") }),
  })
  .meta({ id: "Journal" });
