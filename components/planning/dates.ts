// Days and weeks of the planner. Dates travel as yyyy-mm-dd and are computed at noon UTC, so no
// time zone or daylight-saving change can move a day. A week starts on the company's first day
// (companies.week_start: Monday unless the company chose Sunday or Saturday) and has seven days.
import type { WeekStart } from "@/lib/validation/company";

export type { WeekStart };

const at = (day: string) => new Date(`${day}T12:00:00Z`);
const iso = (d: Date) => d.toISOString().slice(0, 10);

export const isIsoDay = (s: unknown): s is string => typeof s === "string" && /^\d{4}-\d{2}-\d{2}$/.test(s) && !Number.isNaN(at(s).getTime()) && iso(at(s)) === s;

export function addDays(day: string, n: number): string {
  const d = at(day);
  d.setUTCDate(d.getUTCDate() + n);
  return iso(d);
}

/** getUTCDay() of each first day (Sunday 0 ... Saturday 6: the numbering of date-fns' weekStartsOn). */
const FIRST_DAY_INDEX: Record<WeekStart, number> = { sunday: 0, monday: 1, saturday: 6 };

/** Which day of its week a day is: 0 on the first day ... 6 on the last. */
export const dayOfWeek = (day: string, firstDay: WeekStart): number => (at(day).getUTCDay() - FIRST_DAY_INDEX[firstDay] + 7) % 7;

/** The first day of the week a day falls in (any day of the week snaps to it). */
export const weekStartOf = (day: string, firstDay: WeekStart): string => addDays(day, -dayOfWeek(day, firstDay));

/** The seven days from a week's first day. */
export const weekDays = (start: string): string[] => Array.from({ length: 7 }, (_, i) => addDays(start, i));

/**
 * The week the planner opens on. In the first three days of the week (Monday to Wednesday for a
 * week from Monday) a kitchen lead is still running this week's batches; from the fourth their
 * planning is for next week, so that is shown.
 */
export function defaultWeek(today: string, firstDay: WeekStart): string {
  const start = weekStartOf(today, firstDay);
  return dayOfWeek(today, firstDay) >= 3 ? addDays(start, 7) : start;
}

/** Today's date (yyyy-mm-dd) in a time zone. */
export function todayIn(timeZone: string): string {
  return new Intl.DateTimeFormat("en-CA", { timeZone, year: "numeric", month: "2-digit", day: "2-digit" }).format(new Date());
}

const longDay = new Intl.DateTimeFormat("en-GB", { timeZone: "UTC", weekday: "long", day: "numeric", month: "long" });
const shortDay = new Intl.DateTimeFormat("en-GB", { timeZone: "UTC", weekday: "short", day: "numeric", month: "short" });
const fullDay = new Intl.DateTimeFormat("en-GB", { timeZone: "UTC", weekday: "long", day: "numeric", month: "long", year: "numeric" });
const plainDay = new Intl.DateTimeFormat("en-GB", { timeZone: "UTC", day: "numeric", month: "short", year: "numeric" });

/** "Tuesday 8 December" */
export const dayLong = (day: string) => longDay.format(at(day));
/** "Tue 8 Dec" */
export const dayShort = (day: string) => shortDay.format(at(day));
/** "Tuesday 8 December 2026" */
export const dayFull = (day: string) => fullDay.format(at(day));
const mediumDay = new Intl.DateTimeFormat("en-GB", { timeZone: "UTC", weekday: "short", day: "numeric", month: "short", year: "numeric" });
/** "Tue 8 Dec 2026" */
export const dayMedium = (day: string) => mediumDay.format(at(day));
/** "8 Dec 2026" */
export const dayPlain = (day: string) => plainDay.format(at(day));

/** A week from its first day: "7 – 13 December 2026", "28 December 2026 – 3 January 2027" */
export function weekRange(start: string): string {
  const a = at(start);
  const b = at(addDays(start, 6));
  const fmt = (d: Date, o: Intl.DateTimeFormatOptions) => new Intl.DateTimeFormat("en-GB", { timeZone: "UTC", ...o }).format(d);
  if (a.getUTCFullYear() !== b.getUTCFullYear()) return `${fmt(a, { day: "numeric", month: "long", year: "numeric" })} – ${fmt(b, { day: "numeric", month: "long", year: "numeric" })}`;
  if (a.getUTCMonth() !== b.getUTCMonth()) return `${fmt(a, { day: "numeric", month: "long" })} – ${fmt(b, { day: "numeric", month: "long", year: "numeric" })}`;
  return `${a.getUTCDate()} – ${fmt(b, { day: "numeric", month: "long", year: "numeric" })}`;
}

/** Which week a week's first day is, seen from today: "This week", "Next week", "Last week" or null. */
export function weekWord(start: string, today: string, firstDay: WeekStart): string | null {
  const diff = Math.round((at(start).getTime() - at(weekStartOf(today, firstDay)).getTime()) / (7 * 86_400_000));
  return diff === 0 ? "This week" : diff === 1 ? "Next week" : diff === -1 ? "Last week" : null;
}

/** A moment (ISO timestamp) in a time zone: "8 Dec 2026, 14:05". Explicit parts, so server and browser agree. */
export function momentText(iso: string, timeZone: string): string {
  return new Intl.DateTimeFormat("en-GB", {
    timeZone, day: "numeric", month: "short", year: "numeric", hour: "2-digit", minute: "2-digit", hourCycle: "h23",
  }).format(new Date(iso));
}
