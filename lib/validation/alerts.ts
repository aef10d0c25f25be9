// Alerts: the query and body schemas of /api/alerts and the answers' shapes (lib/data/alerts.ts;
// a drift fails `tsc` in lib/http/openapi.ts). Client-safe.
import { z } from "zod";

export const ALERT_KINDS = ["expiry", "reorder", "shortage"] as const;
export type AlertKind = (typeof ALERT_KINDS)[number];

const flag = z.enum(["true", "false"], { error: "true or false." }).transform((v) => v === "true");

/** GET /api/alerts */
export const alertListQuery = z.object({
  kind: z.enum(ALERT_KINDS, { error: `One of ${ALERT_KINDS.join(", ")}.` }).optional(),
  kitchen: z.string().trim().min(1, "Name the kitchen by its id or code.").max(100, "At most 100 characters.").optional(),
  includeAcknowledged: flag.default(false),
  includeCleared: flag.default(false),
  limit: z.coerce.number({ error: "A whole number from 1 to 500." }).int("A whole number from 1 to 500.").min(1, "At least 1.").max(500, "At most 500.").default(200),
});
export type AlertListQuery = z.infer<typeof alertListQuery>;

export const MAX_SNOOZE_HOURS = 30 * 24;

/** POST /api/alerts/:id/snooze: either until (an instant) or hours from now. */
export const alertSnoozeInput = z
  .object({
    until: z.iso.datetime({ offset: true, error: "An ISO 8601 date and time with its offset, e.g. 2026-12-03T08:00:00+01:00." }).optional(),
    hours: z
      .number({ error: "A whole number of hours." })
      .int("A whole number of hours.")
      .min(1, "At least 1 hour.")
      .max(MAX_SNOOZE_HOURS, `At most ${MAX_SNOOZE_HOURS} hours (30 days).`)
      .optional(),
  })
  .superRefine((v, ctx) => {
    if ((v.until === undefined) === (v.hours === undefined)) {
      ctx.addIssue({ code: "custom", path: ["until"], message: "Send either until or hours." });
    }
  });
export type AlertSnoozeInput = z.infer<typeof alertSnoozeInput>;

// ---------------------------------------------------------------------------------------------
// Answers

export const alertResponse = z
  .object({
    id: z.uuid(),
    kind: z.enum(ALERT_KINDS),
    kitchen: z.object({ id: z.uuid(), code: z.string(), name: z.string() }),
    subjectType: z.string().meta({ description: "What the alert is about: lot (expiry), item (reorder), batch (shortage)." }),
    subjectId: z.uuid(),
    thresholdDays: z.number().int().meta({ description: "Expiry: the warning window crossed, in days. Reorder and shortage: 0." }),
    title: z.string(),
    detail: z.string(),
    data: z.record(z.string(), z.unknown()).meta({
      description:
        "Expiry: lotId, lotCode, itemId, itemSku, itemName, category, quantity (decimal string, stock unit, on hand when raised), unit, date, dateKind, daysLeft (when raised; negative: past its date), kitchenName. " +
        "Reorder (when raised, decimal strings in the stock unit): itemId, sku, name, category, unit, kitchenName, onHand, reserved, reorderPoint, parLevel, projected, projectedBy (today + the supplier's lead time), suggestedQuantity, packs, packLabel, supplierId, supplierName, supplierItemId (the last six null when no supplier lists the item). " +
        "Shortage: batchId, recipeCode, recipeName, plannedFor, status, kitchenName, categories (of the lines short), lines (position, itemId, sku, name, category, unit, quantity, reserved, available, plannedBefore, short, suggestions).",
    }),
    createdAt: z.string().meta({ description: "When the scan raised it, ISO 8601." }),
    clearedAt: z.string().nullable().meta({ description: "Reorder and shortage: when a later scan found the need gone (a return is a new alert); null while it holds. Expiry: always null." }),
    acknowledgedAt: z.string().nullable().meta({ description: "When you acknowledged it; null: not yet. Per user." }),
    snoozedUntil: z.string().nullable().meta({ description: "Hidden from your unread count until then; null: not snoozed. Per user." }),
    unread: z.boolean().meta({ description: "Not acknowledged and not snoozed now." }),
    caution: z.string().nullable().meta({ description: "Alerts about cure (a shortage with a cure line among those short) carry the cure caution; null otherwise." }),
  })
  .meta({ id: "Alert" });

export const alertListResponse = z
  .object({
    alerts: z.array(alertResponse),
    unreadCount: z.number().int().meta({ description: "Your unread alerts in every kitchen you may see, whatever the filters." }),
  })
  .meta({ id: "AlertList" });
