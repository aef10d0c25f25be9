// Which expiry thresholds a lot has crossed. Pure: the caller gives "today" (a calendar date in
// the company's time zone) and the company's warning windows; jobs/definitions/expiry-scan.ts
// stores an alert for the most urgent threshold crossed (mostUrgentThresholds).
//
// Rules (DEVELOPERS.md "Alerts and scans"):
// - days left = the lot's date - today, in calendar days (a use-by of today is 0 days left).
// - a threshold is crossed when days left <= threshold. A scan raises, per lot and kitchen, only the
//   most urgent threshold crossed (mostUrgentThresholds), and only if no alert of that threshold or
//   a more urgent one is stored: so a lot crossing 60, then 30, then 7 days left makes three alerts,
//   one at a time, while a lot first seen 29 days out under [60, 30, 7] makes one (30), not two.
// - a lot already expired (days left <= 0) has crossed every threshold of its category: it raises
//   the most urgent one not yet stored. There is no separate "expired" threshold; the alert's data
//   says daysLeft (negative: days past its date) and the title says expired.
// - lots without a date and categories without a window (ingredients by default) raise nothing.
import type { DateKind, ItemCategory } from "../../db/types";

export type ExpiryWindows = Partial<Record<ItemCategory, number[]>>;

export const DEFAULT_EXPIRY_WINDOWS: ExpiryWindows = { cure: [60, 30, 7], casing: [30, 7], spice: [90, 30] };

export interface LotWithStock {
  lotId: string;
  kitchenId: string;
  category: ItemCategory;
  /** yyyy-mm-dd, or null for a lot without a date */
  date: string | null;
  dateKind: DateKind | null;
}

export interface CrossedThreshold<L extends LotWithStock = LotWithStock> {
  lot: L;
  thresholdDays: number;
  daysLeft: number;
}

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

function dayNumber(isoDate: string): number {
  const m = ISO_DATE.exec(isoDate);
  if (!m) throw new Error(`Not a yyyy-mm-dd date: ${isoDate}`);
  return Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])) / 86_400_000;
}

/** Calendar days from `today` to `date` (negative when the date has passed). */
export function daysBetween(today: string, date: string): number {
  return dayNumber(date) - dayNumber(today);
}

/** The calendar date (yyyy-mm-dd) an instant falls on in a time zone. */
export function dateInZone(instant: Date, timeZone: string): string {
  const parts = new Intl.DateTimeFormat("en-CA", { timeZone, year: "numeric", month: "2-digit", day: "2-digit" }).formatToParts(instant);
  const get = (type: string) => parts.find((p) => p.type === type)!.value;
  return `${get("year")}-${get("month")}-${get("day")}`;
}

/** Whole positive days, no repeats, largest first; anything else in a stored setting is dropped. */
export function normaliseWindows(raw: unknown): ExpiryWindows {
  const out: ExpiryWindows = {};
  if (!raw || typeof raw !== "object") return out;
  for (const [category, list] of Object.entries(raw as Record<string, unknown>)) {
    if (!Array.isArray(list)) continue;
    const days = [...new Set(list.filter((d): d is number => Number.isInteger(d) && d > 0 && d <= 3650))].sort((a, b) => b - a);
    if (days.length) out[category as ItemCategory] = days;
  }
  return out;
}

/** Per lot (in the lots' order), the most urgent (smallest) threshold it has crossed on `today`. */
export function mostUrgentThresholds<L extends LotWithStock>(lots: readonly L[], today: string, windows: ExpiryWindows): CrossedThreshold<L>[] {
  const out: CrossedThreshold<L>[] = [];
  let last: CrossedThreshold<L> | undefined;
  for (const c of crossedThresholds(lots, today, windows)) {
    // crossedThresholds lists a lot's thresholds together, largest first: keep the last of each lot
    if (last && last.lot === c.lot) out[out.length - 1] = c;
    else out.push(c);
    last = c;
  }
  return out;
}

/** Every threshold each lot has crossed on `today`, in the lots' order, largest threshold first. */
export function crossedThresholds<L extends LotWithStock>(lots: readonly L[], today: string, windows: ExpiryWindows): CrossedThreshold<L>[] {
  const out: CrossedThreshold<L>[] = [];
  for (const lot of lots) {
    if (!lot.date) continue;
    const window = windows[lot.category];
    if (!window?.length) continue;
    const daysLeft = daysBetween(today, lot.date);
    for (const thresholdDays of [...window].sort((a, b) => b - a)) {
      if (daysLeft <= thresholdDays) out.push({ lot, thresholdDays, daysLeft });
    }
  }
  return out;
}
