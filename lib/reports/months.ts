// Months and days for the report pages' defaults and headings. Pure and client-safe: the caller
// gives "today" as a calendar date (yyyy-mm-dd) in the company's time zone (dateInZone in
// lib/alerts/expiry.ts); nothing here reads a clock or a time zone.

const MONTH = /^(\d{4})-(0[1-9]|1[0-2])$/;
const DAY = /^(\d{4})-(\d{2})-(\d{2})$/;

export const isMonth = (s: string) => MONTH.test(s);

/** "2026-03" plus n months (n may be negative). */
export function shiftMonth(month: string, n: number): string {
  const m = MONTH.exec(month);
  if (!m) throw new Error(`Not a month: ${month}`);
  const index = Number(m[1]) * 12 + Number(m[2]) - 1 + n;
  const year = Math.floor(index / 12);
  return `${String(year).padStart(4, "0")}-${String(index - year * 12 + 1).padStart(2, "0")}`;
}

/** The month before the one `today` falls in. */
export function previousMonth(today: string): string {
  return shiftMonth(today.slice(0, 7), -1);
}

/** The last day of a month, yyyy-mm-dd (leap years included). */
export function lastDayOfMonth(month: string): string {
  if (!MONTH.test(month)) throw new Error(`Not a month: ${month}`);
  const [y, m] = month.split("-").map(Number) as [number, number];
  const day = new Date(Date.UTC(y, m, 0)).getUTCDate(); // day 0 of the next month
  return `${month}-${String(day).padStart(2, "0")}`;
}

/** The day before the month `today` falls in starts: the end of last month. */
export function endOfPreviousMonth(today: string): string {
  return lastDayOfMonth(previousMonth(today));
}

/** Months from `from` to `to`, both included, oldest first ([] when from is after to). */
export function monthsFromTo(from: string, to: string): string[] {
  const out: string[] = [];
  for (let m = from; m <= to; m = shiftMonth(m, 1)) out.push(m);
  return out;
}

const monthFormat = new Intl.DateTimeFormat("en-GB", { timeZone: "UTC", month: "long", year: "numeric" });
const dayFormat = new Intl.DateTimeFormat("en-GB", { timeZone: "UTC", day: "numeric", month: "long", year: "numeric" });

/** "November 2026". */
export function monthWords(month: string): string {
  return MONTH.test(month) ? monthFormat.format(new Date(`${month}-01T00:00:00Z`)) : month;
}

/** "30 November 2026". */
export function dayWords(day: string): string {
  return DAY.test(day) ? dayFormat.format(new Date(`${day}T00:00:00Z`)) : day;
}

/** "November 2026", or "October to December 2026", or "November 2026 to January 2027". */
export function rangeWords(from: string, to: string): string {
  if (from === to) return monthWords(from);
  const [a, b] = [monthWords(from), monthWords(to)];
  return from.slice(0, 4) === to.slice(0, 4) ? `${a.replace(/ \d{4}$/, "")} to ${b}` : `${a} to ${b}`;
}
