// lib/reorder/price-per: a price per stock unit restated per the unit a buyer thinks in, exactly,
// with the factors of lib/units (NIST SP 811 / Handbook 44 App. C via trade-facts §7: 1 lb =
// 453.59237 g, 1 yd = 0.9144 m, 1 US gal = 3785.411784 ml) and the hank as a casing's put-up
// (trade-facts §4: one pc of a hog casing is one hank of 100 yd = 91.44 m).
import { describe, expect, it } from "vitest";
import { buyingUnit, pricePerBuyingUnit, priceText } from "@/lib/reorder/price-per";

const spice = { stockUnit: "g" as const, putUp: null };
const hog = { stockUnit: "pc" as const, putUp: { name: "hank", metres: "91.44" } };
const collagen = { stockUnit: "m" as const, putUp: null };
const smoke = { stockUnit: "ml" as const, putUp: null };
const labels = { stockUnit: "pc" as const, putUp: null };

describe("price per buying unit", () => {
  it("grams: per kg in metric, per lb in US units", () => {
    // 12.00 per 1 kg bag = 0.012 per g -> 12 per kg; 0.012 x 453.59237 = 5.44310844 per lb
    expect(pricePerBuyingUnit("0.012", spice, "metric").amount.toString()).toBe("12");
    expect(pricePerBuyingUnit("0.012", spice, "us").amount.toString()).toBe("5.44310844");
    expect(priceText("0.012", spice, "us", "EUR")).toEqual({ amount: "5.4431", label: "lb" }); // shown half-even to 4 decimals
    expect(priceText("0.012", spice, "metric", "EUR")).toEqual({ amount: "12.00", label: "kg" });
  });

  it("put-ups: per hank (one pc is one hank)", () => {
    // 189.50 per bundle of 5 hanks = 37.9 per pc = per hank
    expect(buyingUnit(hog, "metric")).toEqual({ unit: "hank", label: "hank" });
    expect(priceText("37.9", hog, "us", "GBP")).toEqual({ amount: "37.90", label: "hank" });
  });

  it("metres: per m, per yd in US units; millilitres: per l, per gal; plain pieces: per piece", () => {
    // 0.5 per m x 0.9144 = 0.4572 per yd; 0.004 per ml x 3785.411784 = 15.141647136 per gal
    expect(priceText("0.5", collagen, "metric", "USD")).toEqual({ amount: "0.50", label: "m" });
    expect(priceText("0.5", collagen, "us", "USD")).toEqual({ amount: "0.4572", label: "yd" });
    expect(priceText("0.004", smoke, "metric", "USD")).toEqual({ amount: "4.00", label: "l" });
    expect(priceText("0.004", smoke, "us", "USD")).toEqual({ amount: "15.1416", label: "gal" });
    expect(priceText("0.25", labels, "metric", "JPY")).toEqual({ amount: "0.25", label: "piece" }); // JPY has no decimals: more only when the value has them
  });
});
