// The planner's weeks (components/planning/dates.ts) against date-fns, an independent reference:
// startOfWeek(date, { weekStartsOn }) with 1 = Monday (ISO 8601 weeks), 0 = Sunday, 6 = Saturday.
// Days are plain yyyy-mm-dd; the reference gets a local Date at noon, so no time zone or daylight-
// saving change can move its day either.
import { addDays as fnsAddDays, format, startOfWeek } from "date-fns";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { addDays, dayOfWeek, defaultWeek, isIsoDay, weekDays, weekRange, weekStartOf, weekWord, type WeekStart } from "../../components/planning/dates";

const STARTS_ON: Record<WeekStart, 0 | 1 | 6> = { sunday: 0, monday: 1, saturday: 6 };
const FIRST_DAYS = Object.keys(STARTS_ON) as WeekStart[];

const local = (day: string) => {
  const [y, m, d] = day.split("-").map(Number) as [number, number, number];
  return new Date(y, m - 1, d, 12);
};
const reference = (day: string, firstDay: WeekStart) => format(startOfWeek(local(day), { weekStartsOn: STARTS_ON[firstDay] }), "yyyy-MM-dd");

describe("weekStartOf", () => {
  it("agrees with date-fns startOfWeek on every day from 2024 to 2031, for each first day", () => {
    // leap days, year ends and both daylight-saving changes of every year are in the range
    let day = "2024-01-01";
    let checked = 0;
    while (day < "2032-01-01") {
      for (const firstDay of FIRST_DAYS) expect(weekStartOf(day, firstDay), `${day} ${firstDay}`).toBe(reference(day, firstDay));
      day = addDays(day, 1);
      checked++;
    }
    expect(checked).toBe(2922); // 8 years, 2 of them leap years
  });

  it("agrees with date-fns on any day from 1970 to 2200 (property)", () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 84_000 }), fc.constantFrom(...FIRST_DAYS), (n, firstDay) => {
        const day = format(fnsAddDays(local("1970-01-01"), n), "yyyy-MM-dd");
        expect(weekStartOf(day, firstDay)).toBe(reference(day, firstDay));
      }),
    );
  });

  it("snaps any day of a week to its first day; the first day is its own", () => {
    // Wednesday 9 December 2026: the week from Monday 7, Sunday 6 or Saturday 5 December
    expect(weekStartOf("2026-12-09", "monday")).toBe("2026-12-07");
    expect(weekStartOf("2026-12-09", "sunday")).toBe("2026-12-06");
    expect(weekStartOf("2026-12-09", "saturday")).toBe("2026-12-05");
    // a Sunday is the last day of a week from Monday, the first of a week from Sunday
    expect(weekStartOf("2026-12-13", "monday")).toBe("2026-12-07");
    expect(weekStartOf("2026-12-13", "sunday")).toBe("2026-12-13");
    expect(weekStartOf("2026-12-13", "saturday")).toBe("2026-12-12");
    // across a year end
    expect(weekStartOf("2027-01-01", "monday")).toBe("2026-12-28");
    for (const firstDay of FIRST_DAYS) {
      const start = weekStartOf("2026-12-09", firstDay);
      expect(weekDays(start).map((d) => weekStartOf(d, firstDay))).toEqual(Array(7).fill(start));
      expect(weekDays(start).map((d) => dayOfWeek(d, firstDay))).toEqual([0, 1, 2, 3, 4, 5, 6]);
    }
  });
});

describe("the week the planner opens on", () => {
  it("is this week for the first three days of the week, next week from the fourth", () => {
    // week from Monday 7 December 2026: Mon-Wed this week, Thu-Sun the week from 14 December
    expect(["07", "08", "09"].map((d) => defaultWeek(`2026-12-${d}`, "monday"))).toEqual(Array(3).fill("2026-12-07"));
    expect(["10", "11", "12", "13"].map((d) => defaultWeek(`2026-12-${d}`, "monday"))).toEqual(Array(4).fill("2026-12-14"));
    // week from Sunday 6 December: Sun-Tue this week, from Wednesday 9 the week from 13 December
    expect(defaultWeek("2026-12-08", "sunday")).toBe("2026-12-06");
    expect(defaultWeek("2026-12-09", "sunday")).toBe("2026-12-13");
    // week from Saturday 5 December: Sat-Mon this week, from Tuesday 8 the week from 12 December
    expect(defaultWeek("2026-12-07", "saturday")).toBe("2026-12-05");
    expect(defaultWeek("2026-12-08", "saturday")).toBe("2026-12-12");
  });

  it("names this, next and last week by the company's first day", () => {
    expect(weekWord("2026-12-13", "2026-12-13", "sunday")).toBe("This week");
    expect(weekWord("2026-12-14", "2026-12-13", "monday")).toBe("Next week"); // Sunday 13 ends the week from Monday 7
    expect(weekWord("2026-12-06", "2026-12-13", "sunday")).toBe("Last week");
    expect(weekWord("2026-12-27", "2026-12-13", "sunday")).toBeNull();
  });
});

describe("days", () => {
  it("reads only real calendar days", () => {
    expect(isIsoDay("2028-02-29")).toBe(true);
    expect(isIsoDay("2027-02-29")).toBe(false);
    expect(isIsoDay("2026-13-01")).toBe(false);
    expect(isIsoDay("9 Dec 2026")).toBe(false);
    expect(isIsoDay(undefined)).toBe(false);
  });

  it("writes a week from its first day as a range", () => {
    expect(weekRange("2026-12-06")).toBe("6 – 12 December 2026");
    expect(weekRange("2026-11-28")).toBe("28 November – 4 December 2026");
    expect(weekRange("2026-12-27")).toBe("27 December 2026 – 2 January 2027");
  });
});
