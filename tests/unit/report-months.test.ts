// The report pages' defaults (lib/reports/months.ts): last month and the end of last month from the
// company's "today". Calendar facts (Gregorian calendar, common knowledge): January follows
// December of the year before; February has 29 days in 2028 (divisible by 4), 28 in 2027 and 2100
// (a century not divisible by 400), 29 in 2000 (divisible by 400).
import { describe, expect, it } from "vitest";
import { dayWords, endOfPreviousMonth, lastDayOfMonth, previousMonth, rangeWords } from "../../lib/reports/months";

describe("report months", () => {
  it("last month, across a year's turn", () => {
    expect(previousMonth("2026-12-02")).toBe("2026-11");
    expect(previousMonth("2027-01-01")).toBe("2026-12");
  });

  it("the last day of a month, leap years included", () => {
    expect(lastDayOfMonth("2026-11")).toBe("2026-11-30");
    expect(lastDayOfMonth("2026-12")).toBe("2026-12-31");
    expect(lastDayOfMonth("2028-02")).toBe("2028-02-29");
    expect(lastDayOfMonth("2027-02")).toBe("2027-02-28");
    expect(lastDayOfMonth("2100-02")).toBe("2100-02-28");
    expect(lastDayOfMonth("2000-02")).toBe("2000-02-29");
    expect(endOfPreviousMonth("2028-03-01")).toBe("2028-02-29");
    expect(endOfPreviousMonth("2027-01-15")).toBe("2026-12-31");
  });

  it("ranges and words", () => {
    expect(dayWords("2026-11-30")).toBe("30 November 2026");
    expect(rangeWords("2026-11", "2026-11")).toBe("November 2026");
    expect(rangeWords("2026-10", "2026-12")).toBe("October to December 2026");
    expect(rangeWords("2026-11", "2027-01")).toBe("November 2026 to January 2027");
    expect(() => lastDayOfMonth("2026-13")).toThrow();
  });
});
