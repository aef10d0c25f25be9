// Calendar months as YYYY-MM (lib/periods/months.ts): the arithmetic period closing relies on.
// Expected values are the Gregorian calendar's (twelve months a year; common practice).
import { describe, expect, it } from "vitest";
import { addMonths, firstDay, isMonth, monthLabel, monthsBetween } from "@/lib/periods/months";

describe("months", () => {
  it("add and subtract across year ends", () => {
    expect(addMonths("2026-03", 1)).toBe("2026-04");
    expect(addMonths("2026-12", 1)).toBe("2027-01");
    expect(addMonths("2026-01", -1)).toBe("2025-12");
    expect(addMonths("2026-03", -15)).toBe("2024-12");
    expect(addMonths("2026-03", 24)).toBe("2028-03");
    expect(addMonths("2026-03", 0)).toBe("2026-03");
  });

  it("list a range oldest first, both ends included", () => {
    expect(monthsBetween("2025-11", "2026-02")).toEqual(["2025-11", "2025-12", "2026-01", "2026-02"]);
    expect(monthsBetween("2026-02", "2026-02")).toEqual(["2026-02"]);
    expect(monthsBetween("2026-03", "2026-02")).toEqual([]);
  });

  it("accept only YYYY-MM with a month 01-12", () => {
    for (const ok of ["2026-01", "2026-12", "1999-07"]) expect(isMonth(ok), ok).toBe(true);
    for (const bad of ["2026-00", "2026-13", "2026-3", "26-03", "2026-03-01", "march", ""]) expect(isMonth(bad), bad).toBe(false);
    expect(() => addMonths("2026-13", 1)).toThrow();
  });

  it("name and store them", () => {
    expect(monthLabel("2026-03")).toBe("March 2026");
    expect(monthLabel("2025-12")).toBe("December 2025");
    expect(firstDay("2026-03")).toBe("2026-03-01");
  });
});
