// Calendar months as "YYYY-MM" strings: the unit of period closing (lib/data/periods.ts). Pure and
// client-safe. Which month an instant falls in is the company's business (its time zone): the
// database works that out (`occurred_at at time zone companies.time_zone`), never this module.

export const MONTH_PATTERN = /^(\d{4})-(0[1-9]|1[0-2])$/;

export function isMonth(value: string): boolean {
  return MONTH_PATTERN.test(value);
}

/** "2026-03" plus n months (n may be negative). */
export function addMonths(month: string, n: number): string {
  const m = MONTH_PATTERN.exec(month);
  if (!m) throw new Error(`Not a month: ${month}`);
  const index = Number(m[1]) * 12 + (Number(m[2]) - 1) + n;
  const year = Math.floor(index / 12);
  return `${String(year).padStart(4, "0")}-${String(index - year * 12 + 1).padStart(2, "0")}`;
}

/** Months from `from` to `to`, both included, oldest first ([] when from is after to). */
export function monthsBetween(from: string, to: string): string[] {
  const out: string[] = [];
  for (let m = from; m <= to; m = addMonths(m, 1)) out.push(m);
  return out;
}

/** The first day of the month, as the database stores it: "2026-03" -> "2026-03-01". */
export const firstDay = (month: string) => `${month}-01`;

const NAMES = ["January", "February", "March", "April", "May", "June", "July", "August", "September", "October", "November", "December"];

/** "March 2026". */
export function monthLabel(month: string): string {
  const m = MONTH_PATTERN.exec(month);
  if (!m) return month;
  return `${NAMES[Number(m[2]) - 1]} ${m[1]}`;
}
