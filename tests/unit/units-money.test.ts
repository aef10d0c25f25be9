// lib/units money: ISO 4217 minor units, half-even; unit costs per stock unit NUMERIC(20,6).
import { describe, expect, it } from "vitest";
import {
  currencyExponent,
  fromMinorUnits,
  lineAmountMinor,
  minorUnits,
  unitCostPerStockUnit,
  UnitError,
  type ItemUnits,
} from "@/lib/units";

const hank: ItemUnits = { stockUnit: "pc", putUp: { name: "hank", metres: "91.44" }, packs: [{ name: "box of 10 hanks", quantity: "10", unit: "hank" }] };
const spice: ItemUnits = { stockUnit: "g" };

describe("minor units", () => {
  it("rounds half-even (EUR, 2 decimals)", () => {
    expect(minorUnits("2.345", "EUR")).toBe(234n);
    expect(minorUnits("2.355", "EUR")).toBe(236n);
    expect(minorUnits("2.3451", "EUR")).toBe(235n);
    expect(minorUnits("-2.345", "EUR")).toBe(-234n);
    expect(minorUnits("-0.004", "EUR")).toBe(0n);
    expect(minorUnits("12345678901234567.89", "usd")).toBe(1234567890123456789n);
  });

  it("uses the ISO 4217 exponent: JPY 0, KWD 3", () => {
    expect(currencyExponent("JPY")).toBe(0);
    expect(minorUnits("1234.5", "JPY")).toBe(1234n);
    expect(minorUnits("1235.5", "JPY")).toBe(1236n);
    expect(minorUnits("1.2345", "KWD")).toBe(1234n);
    expect(minorUnits("10", "GBP")).toBe(1000n);
  });

  it("goes back to decimal strings with the currency's decimals", () => {
    expect(fromMinorUnits(234n, "EUR")).toBe("2.34");
    expect(fromMinorUnits(200n, "EUR")).toBe("2.00");
    expect(fromMinorUnits(-5n, "EUR")).toBe("-0.05");
    expect(fromMinorUnits(1234n, "JPY")).toBe("1234");
    expect(fromMinorUnits(1234n, "KWD")).toBe("1.234");
    expect(fromMinorUnits(1234567890123456789n, "USD")).toBe("12345678901234567.89");
  });

  it("refuses unknown currencies", () => {
    expect(() => minorUnits("1", "XYZ")).toThrow(expect.objectContaining({ code: "UNKNOWN_CURRENCY" }));
    expect(() => fromMinorUnits(1n, "")).toThrow(UnitError);
    expect(() => currencyExponent("toString")).toThrow(UnitError);
  });
});

describe("unit cost per stock unit", () => {
  it("per put-up, per pack, per metre", () => {
    expect(unitCostPerStockUnit("38.00", "hank", hank)).toBe("38.000000");
    expect(unitCostPerStockUnit("350", "box of 10 hanks", hank)).toBe("35.000000");
    expect(unitCostPerStockUnit("0.50", "m", hank)).toBe("45.720000");
  });

  it("per lb of a gram item, half-even at 6 decimals", () => {
    // 12.50 / 453.59237 = 0.02755777...
    expect(unitCostPerStockUnit("12.50", "lb", spice)).toBe("0.027558");
    expect(unitCostPerStockUnit("20", "kg", spice)).toBe("0.020000");
    expect(unitCostPerStockUnit("0.0000025", "g", spice)).toBe("0.000002");
  });

  it("refuses units the item cannot take", () => {
    expect(() => unitCostPerStockUnit("1", "hank", spice)).toThrow(expect.objectContaining({ code: "UNKNOWN_UNIT" }));
  });

  it("line amounts round once, half-even", () => {
    // 2.5 hanks at 38.000000 = 95.00
    expect(lineAmountMinor("2.5", "38.000000", "EUR")).toBe(9500n);
    // 1000 g at 0.027558 = 27.558 -> 27.56
    expect(lineAmountMinor("1000", "0.027558", "USD")).toBe(2756n);
    expect(lineAmountMinor("0.5", "0.05", "EUR")).toBe(2n); // 0.025 -> 0.02 (half-even)
  });
});
