// lib/units/decimal: strict parsing, storing (half-even) and plain strings.
import Decimal from "decimal.js";
import { describe, expect, it } from "vitest";
import { Dec, dec, plain, toStored, toStoredQuantity, toStoredUnitCost, UnitError } from "@/lib/units";

describe("dec", () => {
  it("parses plain decimal strings exactly", () => {
    expect(dec("12.5").eq(new Dec("12.5"))).toBe(true);
    expect(dec("-0.000000000001").toFixed()).toBe("-0.000000000001");
    // 0.1 + 0.2 is exact here, unlike binary floats
    expect(dec("0.1").plus(dec("0.2")).eq(dec("0.3"))).toBe(true);
  });

  it.each(["1e3", "1E-2", "NaN", "Infinity", "-Infinity", "", " 1", "1 ", "1.", ".5", "+1", "1,5", "0x10", "1.2.3", "--1"])(
    "refuses %j with INVALID_NUMBER",
    (s) => {
      expect(() => dec(s)).toThrow(UnitError);
      try {
        dec(s);
      } catch (e) {
        expect((e as UnitError).code).toBe("INVALID_NUMBER");
      }
    },
  );

  it("refuses JS numbers (a type error, and at run time)", () => {
    // @ts-expect-error a number has already passed through binary floating point
    expect(() => dec(0.1)).toThrow(UnitError);
    expect(() => dec(new Dec(NaN))).toThrow(UnitError);
  });

  it("re-wraps other Decimal instances so the 60-digit configuration applies", () => {
    const other = new Decimal("1");
    const d = dec(other);
    expect(d.constructor).toBe(Dec);
    expect(other.div("3").toFixed().length).toBe(22); // decimal.js default: 20 digits
    expect(d.div("3").toFixed().length).toBe(62); // "0." + 60 digits
  });

  it("is configured with precision 60 and half-even", () => {
    expect(Dec.precision).toBe(60);
    expect(Dec.rounding).toBe(Decimal.ROUND_HALF_EVEN);
  });
});

describe("toStored", () => {
  it("rounds half-even to 12 decimals by default", () => {
    expect(toStored("0.0000000000125")).toBe("0.000000000012");
    expect(toStored("0.0000000000135")).toBe("0.000000000014");
    expect(toStored("0.00000000001250001")).toBe("0.000000000013");
    expect(toStored("-0.0000000000125")).toBe("-0.000000000012");
    expect(toStored("1")).toBe("1.000000000000");
  });

  it("never writes an exponent and never -0", () => {
    expect(toStored("0.0000000000001")).toBe("0.000000000000");
    expect(toStored("-0.0000000000001")).toBe("0.000000000000");
    expect(toStored(dec("123456789012345678"))).toBe("123456789012345678.000000000000");
  });

  it("rounds to other scales", () => {
    expect(toStored("2.5", 0)).toBe("2");
    expect(toStored("3.5", 0)).toBe("4");
    expect(toStored("0.0275577905", 6)).toBe("0.027558");
    expect(toStoredUnitCost("0.0000005")).toBe("0.000000");
    expect(toStoredUnitCost("0.0000015")).toBe("0.000002");
  });

  it("refuses values that overflow the column", () => {
    expect(toStoredQuantity("999999999999999999.999999999999")).toBe("999999999999999999.999999999999");
    expect(() => toStoredQuantity("999999999999999999.9999999999995")).toThrow(UnitError);
    expect(() => toStoredUnitCost("100000000000000")).toThrow(UnitError);
  });
});

describe("plain", () => {
  it("gives the shortest plain string", () => {
    expect(plain("12.500000000000")).toBe("12.5");
    expect(plain("-0.000000000000")).toBe("0");
    expect(plain("0")).toBe("0");
    expect(plain("100")).toBe("100");
    expect(plain(dec("1").div(dec("1000000000000000000000000")))).toBe("0.000000000000000000000001");
    expect(plain(dec("1000000000000000000000000000"))).toBe("1000000000000000000000000000");
  });
});
