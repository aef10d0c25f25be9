import { describe, expect, it } from "vitest";
import { crossedThresholds, dateInZone, daysBetween, DEFAULT_EXPIRY_WINDOWS, mostUrgentThresholds, normaliseWindows, type LotWithStock } from "../../lib/alerts/expiry";

// The windows are the product's planning defaults (issue 6: cure 60/30/7, casings 30/7, spices
// 90/30 days), not trade figures; "days left" counts calendar days to the printed date.
const TODAY = "2026-12-02";
const lot = (date: string | null, category: LotWithStock["category"] = "cure"): LotWithStock => ({
  lotId: `lot-${date}-${category}`, kitchenId: "k1", category, date, dateKind: date ? "best_before" : null,
});
const thresholds = (l: LotWithStock, today = TODAY) => crossedThresholds([l], today, DEFAULT_EXPIRY_WINDOWS).map((c) => c.thresholdDays);

describe("daysBetween and dateInZone", () => {
  it("counts calendar days, across a month and a year end", () => {
    expect(daysBetween("2026-12-02", "2026-12-02")).toBe(0);
    expect(daysBetween("2026-12-02", "2027-01-31")).toBe(60);
    expect(daysBetween("2026-12-02", "2026-11-30")).toBe(-2);
    expect(daysBetween("2028-02-28", "2028-03-01")).toBe(2); // 2028 is a leap year
  });

  it("takes the date in the company's time zone", () => {
    const instant = new Date("2026-12-02T23:30:00Z");
    expect(dateInZone(instant, "Europe/London")).toBe("2026-12-02");
    expect(dateInZone(instant, "Europe/Vienna")).toBe("2026-12-03");
    expect(dateInZone(instant, "America/Chicago")).toBe("2026-12-02");
  });
});

describe("crossedThresholds", () => {
  it("a cure lot 65 days out crosses nothing; 60 crosses 60; 59 crosses 60; 29 crosses 60 and 30; 7 crosses all three", () => {
    expect(thresholds(lot("2027-02-05"))).toEqual([]); // 65 days
    expect(thresholds(lot("2027-01-31"))).toEqual([60]); // exactly 60: crossed
    expect(thresholds(lot("2027-01-30"))).toEqual([60]); // 59
    expect(thresholds(lot("2026-12-31"))).toEqual([60, 30]); // 29
    expect(thresholds(lot("2026-12-09"))).toEqual([60, 30, 7]); // 7
  });

  it("an expired lot has crossed every threshold of its category, with negative days left", () => {
    const [first, ...rest] = crossedThresholds([lot("2026-11-30")], TODAY, DEFAULT_EXPIRY_WINDOWS);
    expect(first).toMatchObject({ thresholdDays: 60, daysLeft: -2 });
    expect(rest.map((c) => c.thresholdDays)).toEqual([30, 7]);
  });

  it("uses each category's own window; ingredients and undated lots raise nothing", () => {
    expect(thresholds(lot("2026-12-31", "casing"))).toEqual([30]);
    expect(thresholds(lot("2027-02-28", "spice"))).toEqual([90]); // 88 days
    expect(thresholds(lot("2026-12-03", "ingredient"))).toEqual([]);
    expect(thresholds(lot(null))).toEqual([]);
  });

  it("moves with the injected today: the same lot crosses more thresholds as days pass", () => {
    const l = lot("2027-01-15");
    expect(thresholds(l, "2026-11-01")).toEqual([]); // 75 days
    expect(thresholds(l, "2026-11-20")).toEqual([60]); // 56
    expect(thresholds(l, "2027-01-10")).toEqual([60, 30, 7]); // 5
  });
});

describe("normaliseWindows", () => {
  it("keeps whole positive days, largest first, without repeats", () => {
    expect(normaliseWindows({ cure: [7, 60, 30, 30], casing: [], spice: [0, -3, 1.5, 14], ingredient: "x" })).toEqual({ cure: [60, 30, 7], spice: [14] });
    expect(normaliseWindows(null)).toEqual({});
  });
});

describe("mostUrgentThresholds", () => {
  it("keeps, per lot, the smallest threshold crossed (the one a scan raises)", () => {
    const lots = [lot("2026-12-31"), lot("2027-02-05"), lot("2026-11-30"), lot("2027-01-31", "casing")];
    // 29 days: 60 and 30 crossed -> 30; 65 days: none; expired: all three -> 7; casing 60 days: none of 30/7
    expect(mostUrgentThresholds(lots, TODAY, DEFAULT_EXPIRY_WINDOWS).map((c) => [c.lot.date, c.thresholdDays])).toEqual([
      ["2026-12-31", 30],
      ["2026-11-30", 7],
    ]);
  });
});
