// lib/units global units: exact factors from the published definitions, then a float reference.
import { unit as mathUnit } from "mathjs";
import { describe, expect, it } from "vitest";
import { convert, Dec, dec, findGlobalUnit, GLOBAL_UNITS, toStockUnits, UnitError } from "@/lib/units";

const eq = (a: Dec, b: string) => expect(a.toFixed()).toBe(dec(b).toFixed());

describe("exact factors (NIST SP 811 App. B; NIST Handbook 44 App. C)", () => {
  it("mass", () => {
    eq(convert("1", "oz", "g"), "28.349523125"); // NIST HB 44 App. C: 1 oz avdp = 28.349 523 125 g (exact)
    eq(convert("0.25", "oz", "g"), "7.08738078125"); // [calc] from NIST HB 44 App. C
    eq(convert("1", "lb", "g"), "453.59237"); // NIST SP 811 B.8 / HB 44 App. C: 1 lb = 0.453 592 37 kg (exact)
    eq(convert("16", "oz", "lb"), "1"); // NIST HB 44 App. C: 1 lb = 16 oz
    eq(convert("1", "kg", "g"), "1000"); // SI
    eq(convert("1", "mg", "g"), "0.001"); // SI
  });

  it("4 oz per 100 lb is exactly 2.5 g per kg", () => {
    // trade-facts §1 [calc] from NIST HB 44 App. C (the 9 CFR 424.21(c) comminuted rate)
    const perKg = convert("4", "oz", "g").div(convert("100", "lb", "kg"));
    eq(perKg, "2.5");
  });

  it("length", () => {
    eq(convert("1", "yd", "m"), "0.9144"); // NIST SP 811 B.8 / HB 44 App. C: 1 yd = 0.9144 m (exact)
    eq(convert("100", "yd", "m"), "91.44"); // one hank: trade-facts §4, [calc] from NIST HB 44 App. C
    eq(convert("1", "ft", "m"), "0.3048"); // NIST HB 44 App. C: 1 ft = 0.3048 m (exact)
    eq(convert("1", "in", "mm"), "25.4"); // NIST HB 44 App. C: 1 in = 2.54 cm (exact)
    eq(convert("3", "ft", "yd"), "1"); // NIST HB 44 App. C: 1 yd = 3 ft
    eq(convert("36", "in", "yd"), "1"); // NIST HB 44 App. C: 1 yd = 36 in
  });

  it("volume (US customary)", () => {
    eq(convert("1", "gal", "ml"), "3785.411784"); // NIST HB 44 App. C: 1 US gal = 231 in^3 = 3.785 411 784 L (exact)
    eq(convert("1", "tsp", "ml"), "4.92892159375"); // NIST HB 44 App. C: 1 tsp = 1/3 tbsp = 4.928 921 593 75 mL
    eq(convert("1", "tbsp", "tsp"), "3"); // NIST HB 44 App. C: 1 tbsp = 3 tsp
    eq(convert("1", "fl_oz", "tbsp"), "2"); // NIST HB 44 App. C: 1 fl oz = 2 tbsp
    eq(convert("1", "fl_oz", "ml"), "29.5735295625"); // NIST HB 44 App. C: 1 fl oz = 29.573 529 562 5 mL
    eq(convert("1", "gal", "fl_oz"), "128"); // NIST HB 44 App. C: 1 gal = 128 fl oz
    eq(convert("1", "gal", "l"), "3.785411784"); // NIST HB 44 App. C: 1 US gal = 3.785 411 784 L
  });

  it("reads codes case-insensitively with a few aliases", () => {
    for (const [name, code] of [
      ["KG", "kg"], ["Kilogram", "kg"], ["kgs", "kg"], ["gram", "g"], ["Grams", "g"], ["lbs", "lb"], ["pound", "lb"],
      ["ounce", "oz"], ["metre", "m"], ["Meter", "m"], ["litre", "l"], ["LITER", "l"], ["piece", "pc"], ["pcs", "pc"],
      ["ea", "pc"], ["fl oz", "fl_oz"], ["FL_OZ", "fl_oz"], [" yd ", "yd"], ["mL", "ml"],
    ] as const) {
      expect(findGlobalUnit(name)?.code, name).toBe(code);
    }
    expect(findGlobalUnit("hank")).toBeUndefined();
    expect(findGlobalUnit("stone")).toBeUndefined();
  });

  it("refuses conversions across dimensions", () => {
    expect(() => convert("1", "kg", "m")).toThrow(expect.objectContaining({ code: "WRONG_DIMENSION" }));
    expect(() => convert("1", "stone", "kg")).toThrow(expect.objectContaining({ code: "UNKNOWN_UNIT" }));
    expect(() => convert("1", "kg", "m")).toThrow(UnitError);
  });
});

// Reference: mathjs 14.9.1, a general-purpose unit library. It computes in binary floats, so ours
// (exact decimals) must agree to a relative 1e-12, not digit for digit. Its "teaspoon" and
// "tablespoon" are the metric 5 ml and 15 ml spoons, so US spoons are checked above against
// NIST only; its "floz" and "gal" are US customary.
describe("against mathjs (float reference, relative tolerance 1e-12)", () => {
  const mathName: Record<string, string> = {
    mg: "mg", g: "g", kg: "kg", oz: "oz", lb: "lbm",
    mm: "mm", cm: "cm", m: "m", in: "inch", ft: "ft", yd: "yd",
    ml: "ml", l: "l", fl_oz: "floz", gal: "gal",
  };
  const table: [string, string, string][] = [
    ["1", "lb", "g"], ["2.5", "kg", "lb"], ["12", "oz", "kg"], ["750", "g", "oz"], ["0.3", "mg", "oz"], ["3.75", "lb", "oz"],
    ["1", "yd", "m"], ["91.44", "m", "yd"], ["18", "m", "ft"], ["30", "m", "yd"], ["32", "mm", "in"], ["1.25", "in", "cm"], ["7", "ft", "m"],
    ["1", "gal", "l"], ["5", "l", "gal"], ["16", "fl_oz", "ml"], ["250", "ml", "fl_oz"], ["2.5", "gal", "fl_oz"], ["1", "l", "ml"],
  ];
  const cases = table.flatMap(([q, a, b]) => [[q, a, b] as const, [q, b, a] as const]);

  it.each(cases)("%s %s -> %s", (q, from, to) => {
    const ours = convert(q, from, to);
    const ref = mathUnit(Number(q), mathName[from]!).toNumber(mathName[to]!);
    const refDec = new Dec(String(ref)); // the float's shortest decimal (may have an exponent)
    const rel = ours.minus(refDec).abs().div(ours.abs());
    expect(rel.lte("1e-12"), `${ours.toFixed()} vs ${ref}`).toBe(true);
  });

  it("covers every global unit except US spoons and pieces", () => {
    const covered = new Set(cases.flatMap(([, a, b]) => [a, b]));
    for (const code of GLOBAL_UNITS.keys()) {
      if (!["tsp", "tbsp", "pc"].includes(code)) expect(covered.has(code), code).toBe(true);
    }
  });

  it("gives exact decimals where the float reference drifts", () => {
    expect(mathUnit(1, "gal").toNumber("ml")).not.toBe(3785.411784); // 3785.4117840000004
    expect(toStockUnits("1", "gal", { stockUnit: "ml" }).toFixed()).toBe("3785.411784");
  });
});
