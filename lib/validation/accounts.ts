// The accountant's account mapping (GET/PUT /api/reports/accounts, lib/data/accounts.ts): which
// account code the movement journal books each side of a movement to. Client-safe.
import { z } from "zod";
import { ITEM_CATEGORIES } from "../../db/types";

export const MAPPING_KINDS = ["inventory", "movement"] as const;
export type MappingKind = (typeof MAPPING_KINDS)[number];

/**
 * The other side of a movement: receipt = goods received (a clearing account, cleared against the
 * supplier's invoice); use and waste = expense accounts; loss and gain = count and adjustment
 * differences (and the cost differences the formula leaves). Transfers need none.
 */
export const MOVEMENT_ACCOUNT_KEYS = ["receipt", "use", "waste", "loss", "gain"] as const;
export type MovementAccountKey = (typeof MOVEMENT_ACCOUNT_KEYS)[number];

/** Every key the journal can need, in the order the mapping is shown. */
export const MAPPING_KEYS: readonly { kind: MappingKind; key: string }[] = [
  ...ITEM_CATEGORIES.map((key) => ({ kind: "inventory" as const, key })),
  ...MOVEMENT_ACCOUNT_KEYS.map((key) => ({ kind: "movement" as const, key })),
];

/** Letters, digits, dots and dashes, 1 to 20, starting with a letter or digit (so a spreadsheet never reads it as a formula). */
export const ACCOUNT_CODE = /^[A-Za-z0-9][A-Za-z0-9.-]{0,19}$/;

const entryInput = z
  .object({
    kind: z.enum(MAPPING_KINDS, { error: "inventory or movement." }),
    key: z.string({ error: "A category (inventory) or receipt, use, waste, loss, gain (movement)." }).trim(),
    accountCode: z
      .string({ error: "The account code: 1 to 20 letters, digits, dots or dashes." })
      .trim()
      .regex(ACCOUNT_CODE, "The account code: 1 to 20 letters, digits, dots or dashes, starting with a letter or digit."),
    name: z
      .string()
      .trim()
      .max(100, "The account's name: at most 100 characters.")
      .nullish()
      .transform((v) => (v ? v : null)),
  })
  .superRefine((e, ctx) => {
    const keys: readonly string[] = e.kind === "inventory" ? ITEM_CATEGORIES : MOVEMENT_ACCOUNT_KEYS;
    if (!keys.includes(e.key)) ctx.addIssue({ code: "custom", path: ["key"], message: `For ${e.kind}: one of ${keys.join(", ")}.` });
  });

export const accountMappingInput = z
  .object({
    entries: z.array(entryInput).max(50, "At most 50 entries."),
  })
  .superRefine((b, ctx) => {
    const seen = new Map<string, number>();
    b.entries.forEach((e, i) => {
      const id = `${e.kind}:${e.key}`;
      const first = seen.get(id);
      if (first !== undefined) ctx.addIssue({ code: "custom", path: ["entries", i, "key"], message: `${e.kind} ${e.key} is already mapped by entry ${first}.` });
      else seen.set(id, i);
    });
  });
export type AccountMappingInput = z.infer<typeof accountMappingInput>;

const mappingKey = z.object({ kind: z.enum(MAPPING_KINDS), key: z.string() });

export const accountMappingEntryResponse = z
  .object({
    kind: z.enum(MAPPING_KINDS),
    key: z.string().meta({ description: "inventory: casing, cure, spice or ingredient; movement: receipt, use, waste, loss or gain.", example: "cure" }),
    accountCode: z.string().meta({ example: "1300" }),
    name: z.string().nullable().meta({ example: "Stock - cures" }),
  })
  .meta({ id: "AccountMappingEntry" });

export const accountMappingResponse = z
  .object({
    entries: z.array(accountMappingEntryResponse).meta({ description: "The mapped keys, inventory first, in the order of MAPPING_KEYS." }),
    unmapped: z.array(mappingKey).meta({ description: "Keys the journal may need that have no account code yet." }),
  })
  .meta({ id: "AccountMapping" });
