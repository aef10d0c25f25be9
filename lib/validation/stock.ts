import { z } from "zod";
import { MOVEMENT_KINDS } from "../../db/types";

const flag = z.enum(["true", "false"]).transform((v) => v === "true");

export const stockQuery = z.object({ kitchen: z.string().trim().min(1).max(40).optional() });

export const lotsQuery = z.object({
  expiringWithinDays: z.coerce.number({ error: "A whole number of days." }).int().min(0).max(3650).default(30),
  includeExpired: flag.default(false),
  kitchen: z.string().trim().min(1).max(40).optional(),
});

export const movementsQuery = z.object({
  kitchen: z.string().trim().min(1).max(40).optional(),
  item: z.string().trim().min(1).max(80).optional(),
  lot: z.uuid().optional(),
  kind: z.enum(MOVEMENT_KINDS).optional(),
  from: z.iso.datetime({ offset: true }).optional(),
  to: z.iso.datetime({ offset: true }).optional(),
  limit: z.coerce.number().int().min(1).max(1000).default(100),
  /** The `nextCursor` of the previous page. */
  cursor: z.string().max(200).optional(),
  format: z.enum(["json", "csv"]).default("json"),
});
