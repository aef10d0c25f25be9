// Months and days for the report pages' defaults and headings, on top of lib/periods/months.ts
// (YYYY-MM arithmetic). Pure and client-safe: the caller gives "today" as a calendar date
// (yyyy-mm-dd) in the company's time zone (dateInZone in lib/alerts/expiry.ts); nothing here reads a
// clock or a time zone.
import { addMonths, isMonth, monthLabel } from "../periods/months";

const DAY = /^(\d{4})-(\d{2})-(\d{2})$/;

/** The month before the one `today` falls in. */
export function previousMonth(today: string): string {
  return addMonths(today.slice(0, 7), -1);
}

/** The last day of a month, yyyy-mm-dd (leap years included). */
export function lastDayOfMonth(month: string): string {
  if (!isMonth(month)) throw new Error(`Not a month: ${month}`);
  const [y, m] = month.split("-").map(Number) as [number, number];
  const day = new Date(Date.UTC(y, m, 0)).getUTCDate(); // day 0 of the next month
  return `${month}-${String(day).padStart(2, "0")}`;
}

/** The end of last month: the last day before the month `today` falls in. */
export function endOfPreviousMonth(today: string): string {
  return lastDayOfMonth(previousMonth(today));
}

const dayFormat = new Intl.DateTimeFormat("en-GB", { timeZone: "UTC", day: "numeric", month: "long", year: "numeric" });

/** "30 November 2026". */
export function dayWords(day: string): string {
  return DAY.test(day) ? dayFormat.format(new Date(`${day}T00:00:00Z`)) : day;
}

/** "November 2026", or "October to December 2026", or "November 2026 to January 2027". */
export function rangeWords(from: string, to: string): string {
  if (from === to) return monthLabel(from);
  const [a, b] = [monthLabel(from), monthLabel(to)];
  return from.slice(0, 4) === to.slice(0, 4) ? `${a.replace(/ \d{4}$/, "")} to ${b}` : `${a} to ${b}`;
}
