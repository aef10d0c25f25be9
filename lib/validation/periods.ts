// Period closing (/api/periods): the month in the path, the list's range, the reopen body, and the
// answers' shapes (lib/data/periods.ts; a drift fails `tsc` in lib/http/openapi.ts). Client-safe.
import { z } from "zod";
import { MONTH_PATTERN } from "../periods/months";

const monthString = z.string().regex(MONTH_PATTERN, "A month as YYYY-MM, e.g. 2026-03.");
const month = (description: string) => monthString.meta({ description: `${description} YYYY-MM.`, example: "2026-03" });
const timestamp = z.string().meta({ description: "ISO 8601 timestamp in UTC." });

/** The {month} of /api/periods/{month}/close and /reopen. */
export const periodMonthParams = z.object({
  month: month("The calendar month, in the company's time zone."),
});

export const periodListQuery = z.object({
  from: monthString.optional(),
  to: monthString.optional(),
});

export const periodReopenInput = z.object({
  reason: z.string({ error: "Say why the month is reopened." }).trim().min(1, "Say why the month is reopened; it goes on the audit trail.").max(500, "At most 500 characters."),
});

const periodUser = z.object({ id: z.uuid(), name: z.string() }).meta({ id: "PeriodUser" });

export const periodResponse = z
  .object({
    month: month("The month."),
    status: z.enum(["open", "closed"]).meta({ description: "closed: movements dated in the month are refused (409 PERIOD_CLOSED)." }),
    ended: z.boolean().meta({ description: "false for the current month (and any later one): it cannot be closed yet." }),
    closedAt: timestamp.nullable().meta({ description: "When the month was closed; null when open, or when it is closed with a later month (closedWith)." }),
    closedBy: periodUser.nullable(),
    closedWith: monthString.nullable().meta({ description: "A month before the first closed month has no close of its own: it is closed with that month (a movement dated in it would change the stock the closed month began with)." }),
  })
  .meta({ id: "Period" });

export const periodEventResponse = z
  .object({
    id: z.uuid(),
    month: month("The month closed or reopened."),
    action: z.enum(["close", "reopen"]),
    reason: z.string().nullable().meta({ description: "Why it was reopened; null for a close." }),
    user: periodUser.nullable().meta({ description: "Who did it; null once that user is deleted." }),
    at: timestamp,
  })
  .meta({ id: "PeriodEvent" });

export const periodListResponse = z
  .object({
    timeZone: z.string().meta({ description: "The company's time zone: months are calendar months in it.", example: "Europe/London" }),
    currentMonth: month("The company's current month."),
    closedThrough: monthString.nullable().meta({ description: "The latest closed month; every month up to it is closed. null: none." }),
    nextToClose: monthString.nullable().meta({ description: "The month that may be closed next (months close in order); null when it has not ended yet." }),
    periods: z.array(periodResponse).meta({ description: "Newest first." }),
    events: z.array(periodEventResponse).meta({ description: "The audit trail of these months, newest first (at most 500)." }),
  })
  .meta({ id: "PeriodList" });
