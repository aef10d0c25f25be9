// GS1 dates (YYMMDD) to ISO 8601. Pure, client-safe.
//
// - Century: GS1 General Specifications section 7.12 ("Determination of century in dates"): the
//   two-digit year is placed so the date falls from 49 years before to 50 years after the current
//   year (a difference of 51 or more goes back a century, of -50 or less forward one). "today"
//   is a parameter so the answer does not depend on the clock.
// - Day 00: allowed in (11), (13), (15), (16), (17) (GS1 Syntax Dictionary: N6,yymmd0) and
//   means no day is given. GS1 reads an expiration date (17) as the last day of that month; this
//   product does the same for best before (15) and sell by (16), and reports production (11) and
//   packaging (13) dates as the month alone, "YYYY-MM" (trade-facts.md section 6).

export type DayZero = "last-day" | "month";

export class Gs1DateError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "Gs1DateError";
  }
}

/** The four-digit year for a two-digit GS1 year, within -49..+50 years of currentYear (GS1 GS 7.12). */
export function gs1Year(yy: number, currentYear: number): number {
  if (!Number.isInteger(yy) || yy < 0 || yy > 99) throw new Gs1DateError("the year must be two digits");
  let year = Math.floor(currentYear / 100) * 100 + yy;
  if (year - currentYear >= 51) year -= 100;
  else if (year - currentYear <= -50) year += 100;
  return year;
}

const isLeap = (y: number) => (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0;

export function daysInMonth(year: number, month: number): number {
  return [31, isLeap(year) ? 29 : 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31][month - 1]!;
}

const pad = (n: number, width: number) => String(n).padStart(width, "0");

/**
 * "YYYY-MM-DD" for a GS1 YYMMDD, or "YYYY-MM" when the day is 00 and dayZero is "month".
 * Throws Gs1DateError for a month outside 01-12 or a day the month does not have.
 */
export function gs1Date(yymmdd: string, currentYear: number, dayZero: DayZero): string {
  if (!/^\d{6}$/.test(yymmdd)) throw new Gs1DateError("a date is six digits, YYMMDD");
  const yy = Number(yymmdd.slice(0, 2));
  const mm = Number(yymmdd.slice(2, 4));
  const dd = Number(yymmdd.slice(4, 6));
  if (mm < 1 || mm > 12) throw new Gs1DateError(`month ${yymmdd.slice(2, 4)} does not exist (YYMMDD ${yymmdd})`);
  const year = gs1Year(yy, currentYear);
  const last = daysInMonth(year, mm);
  if (dd > last) throw new Gs1DateError(`${year}-${pad(mm, 2)} has no day ${yymmdd.slice(4, 6)} (YYMMDD ${yymmdd})`);
  if (dd === 0) {
    return dayZero === "month" ? `${pad(year, 4)}-${pad(mm, 2)}` : `${pad(year, 4)}-${pad(mm, 2)}-${pad(last, 2)}`;
  }
  return `${pad(year, 4)}-${pad(mm, 2)}-${pad(dd, 2)}`;
}

/** The calendar year of "today": a Date (its UTC year) or an ISO date string "YYYY-MM-DD". */
export function yearOf(today: Date | string): number {
  if (typeof today === "string") {
    const m = /^(\d{4})-\d{2}-\d{2}/.exec(today);
    if (!m) throw new Gs1DateError(`today must be an ISO date, YYYY-MM-DD (got ${JSON.stringify(today)})`);
    return Number(m[1]);
  }
  const y = today.getUTCFullYear();
  if (!Number.isFinite(y)) throw new Gs1DateError("today is not a valid date");
  return y;
}
