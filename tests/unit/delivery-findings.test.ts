// The delivery rules (lib/purchasing/delivery-findings.ts), pure: findings per line and the landed
// cost with freight. Thresholds are the purchasing issue's company defaults (tolerance 2 %; short
// dated under 90 days for cure, 60 casing, 180 spice). decimal.js sums checked by hand beside each.
import { describe, expect, it } from "vitest";
import { DEFAULT_RECEIVING_RULES, daysBetween, findingsFor, landedUnitCosts, type LineFacts } from "@/lib/purchasing/delivery-findings";

const base: LineFacts = {
  item: { category: "spice", trackLots: false, trackDates: false },
  quantityStock: "10000", pricePerStock: "0.0125", lotCode: "L1", date: "2027-06-01", dateKind: "best_before",
  match: { substitute: false, outstandingStock: "10000", orderedPerStock: "0.0125" }, today: "2026-12-02",
};
const f = (over: Partial<LineFacts>) => findingsFor({ ...base, ...over }, DEFAULT_RECEIVING_RULES);

describe("findings", () => {
  it("as ordered, and the order side alone decides it", () => {
    expect(f({})).toEqual(["as_ordered"]);
    expect(f({ pricePerStock: null })).toEqual(["as_ordered"]); // no price on the note: nothing to compare
  });
  it("price tolerance is exclusive: 2 % is fine, 2.0001 % is not", () => {
    expect(f({ pricePerStock: "0.01275" })).toEqual(["as_ordered"]); // 0.01275 / 0.0125 = 1.02
    expect(f({ pricePerStock: "0.0127500125" })).toEqual(["price_differs"]);
    expect(f({ match: { ...base.match!, orderedPerStock: "0" }, pricePerStock: "0.01" })).toEqual(["price_differs"]);
  });
  it("days left against the category minimum; a date in the past is expired", () => {
    expect(daysBetween("2026-12-02", "2027-03-02")).toBe(90); // Dec 29 + Jan 31 + Feb 28 + 2
    const cure = { category: "cure" as const, trackLots: true, trackDates: true };
    expect(f({ item: cure, date: "2027-03-01" })).toEqual(["as_ordered", "short_dated"]); // 89 days
    expect(f({ item: cure, date: "2027-03-02" })).toEqual(["as_ordered"]); // 90 days
    expect(f({ item: cure, date: "2026-12-01" })).toEqual(["as_ordered", "expired"]);
    expect(f({ item: cure, date: "2026-12-02" })).toEqual(["as_ordered", "short_dated"]); // today is still in date
    expect(f({ item: cure, lotCode: null, date: null })).toEqual(["as_ordered", "lot_missing", "date_missing"]);
  });
  it("no order line: not on order, never as ordered", () => {
    expect(f({ match: null })).toEqual(["not_on_order"]);
    expect(f({ match: null, item: null, quantityStock: null })).toEqual(["not_on_order"]);
  });
});

describe("landed unit costs", () => {
  it("spreads freight by value, exactly", () => {
    // values 125 and 758 (883); freight 17.66 = 0.02 x 883: shares 2.50 and 15.16
    const [a, b] = landedUnitCosts([{ value: "125", quantityStock: "10000" }, { value: "758", quantityStock: "20" }], "17.66");
    expect(a!.toFixed()).toBe("0.01275"); // 127.50 / 10000
    expect(b!.toFixed()).toBe("38.658"); // 773.16 / 20
  });
  it("by quantity when nothing has a value", () => {
    const [a, b] = landedUnitCosts([{ value: "0", quantityStock: "30" }, { value: "0", quantityStock: "10" }], "8");
    expect([a!.toFixed(), b!.toFixed()]).toEqual(["0.2", "0.2"]); // 8 / 40 per unit
  });
});
