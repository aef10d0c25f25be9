// lib/units item units: put-ups, packs, density, errors, pickers, display.
import { describe, expect, it } from "vitest";
import {
  assertItemUnits,
  convertForItem,
  dec,
  formatMetresOf,
  formatQuantity,
  fromStockUnits,
  isUnitFor,
  metresOf,
  stockUnitsPer,
  toStockUnits,
  unitsFor,
  type ItemUnits,
  type UnitErrorCode,
} from "@/lib/units";

// A hog casing hank is 100 yd = 91.44 m (trade-facts §4, [sec/calc]; NIST HB 44 App. C for the yard).
const hank: ItemUnits = {
  stockUnit: "pc",
  putUp: { name: "hank", metres: "91.44" },
  packs: [
    { name: "box of 10 hanks", quantity: "10", unit: "hanks" },
    { name: "half hank", quantity: "45.72", unit: "m" },
    { name: "pallet", quantity: "12", unit: "box of 10 hanks" },
  ],
};
// Beef rounds in 30 m sets (trade-facts §4 [sec]), stored with the database's put-up code.
const beefSet: ItemUnits = { stockUnit: "pc", putUp: { name: "beef_set", metres: "30" } };
const spice: ItemUnits = {
  stockUnit: "g",
  packs: [
    { name: "25 lb pail", quantity: "25", unit: "lb" },
    { name: "1 kg bag", quantity: "1", unit: "kg" },
  ],
};
const liquid: ItemUnits = { stockUnit: "g", densityGPerMl: "1.2" };
const brine: ItemUnits = { stockUnit: "ml", densityGPerMl: "1.2" };
const collagen: ItemUnits = { stockUnit: "m" };

const s = (d: { toFixed(): string }) => d.toFixed();

function codeOf(fn: () => unknown): UnitErrorCode | "no error" | "not a UnitError" {
  try {
    fn();
    return "no error";
  } catch (e) {
    return e instanceof Error && e.name === "UnitError" ? (e as Error & { code: UnitErrorCode }).code : "not a UnitError";
  }
}

describe("put-ups", () => {
  it("0.5 hank is 45.72 m and 45.72 m is 0.5 hank", () => {
    expect(s(metresOf("0.5", hank))).toBe("45.72");
    expect(s(toStockUnits("45.72", "m", hank))).toBe("0.5");
    expect(s(toStockUnits("50", "yd", hank))).toBe("0.5"); // 50 yd = 45.72 m, NIST HB 44 App. C
    expect(s(toStockUnits("150", "ft", hank))).toBe("0.5");
  });

  it("the put-up name, its plural and pc are one piece", () => {
    for (const u of ["hank", "hanks", "HANK", "pc", "pcs", "piece"]) expect(s(toStockUnits("3", u, hank)), u).toBe("3");
    for (const u of ["beef_set", "beef set", "set", "sets"]) expect(s(toStockUnits("2", u, beefSet)), u).toBe("2");
    expect(s(toStockUnits("9", "m", beefSet))).toBe("0.3");
  });

  it("packs resolve recursively", () => {
    expect(s(toStockUnits("1", "box of 10 hanks", hank))).toBe("10");
    expect(s(toStockUnits("2", "Box Of 10 Hanks", hank))).toBe("20");
    expect(s(toStockUnits("1", "half hank", hank))).toBe("0.5");
    expect(s(toStockUnits("1", "pallet", hank))).toBe("120");
    expect(s(stockUnitsPer("pallet", hank))).toBe("120");
  });

  it("lengths that do not divide a hank stay exact to 60 digits until stored", () => {
    const v = toStockUnits("10", "m", hank); // 10 / 91.44
    expect(v.times("91.44").toDecimalPlaces(40).toFixed()).toBe("10");
    expect(s(fromStockUnits(toStockUnits("10", "m", hank), "m", hank).toDecimalPlaces(50))).toBe("10");
  });
});

describe("mass, volume and density", () => {
  it("a 25 lb pail of a gram item is 11339.80925 g", () => {
    // 25 x 453.59237 g, NIST HB 44 App. C
    expect(s(toStockUnits("1", "25 lb pail", spice))).toBe("11339.80925");
    expect(s(toStockUnits("3", "1 kg bag", spice))).toBe("3000");
  });

  it("converts volume to mass only through the density", () => {
    expect(s(toStockUnits("1", "l", liquid))).toBe("1200");
    expect(s(fromStockUnits("1200", "l", liquid))).toBe("1");
    expect(s(toStockUnits("1200", "g", brine))).toBe("1000"); // one division: no 0.8333... residue
    expect(s(toStockUnits("1", "tsp", liquid))).toBe("5.9147059125");
  });

  it("round trips toStockUnits / fromStockUnits exactly", () => {
    const cases: [string, string, ItemUnits][] = [
      ["0.25", "oz", spice], ["1.5", "lb", spice], ["7", "25 lb pail", spice], ["0.333", "tsp", liquid], ["2", "gal", liquid],
      ["3.7", "yd", hank], ["13", "ft", hank], ["1.25", "pallet", hank], ["0.1", "in", collagen], ["250", "g", brine],
      ["17", "m", beefSet],
    ];
    for (const [q, u, item] of cases) {
      expect(s(fromStockUnits(toStockUnits(q, u, item), u, item)), `${q} ${u}`).toBe(s(dec(q)));
    }
  });

  it("converts between two units of one item", () => {
    expect(s(convertForItem("1", "box of 10 hanks", "m", hank))).toBe("914.4");
    expect(s(convertForItem("1", "l", "oz", liquid).toDecimalPlaces(6))).toBe("42.328754");
  });
});

describe("errors", () => {
  it.each<[string, ItemUnits, UnitErrorCode]>([
    ["kg", collagen, "WRONG_DIMENSION"],
    ["kg", hank, "WRONG_DIMENSION"],
    ["ml", spice, "WRONG_DIMENSION"], // no density
    ["g", { stockUnit: "ml" }, "WRONG_DIMENSION"],
    ["m", spice, "WRONG_DIMENSION"],
    ["pc", spice, "WRONG_DIMENSION"],
    ["kg", { stockUnit: "pc" }, "WRONG_DIMENSION"],
    ["m", { stockUnit: "pc" }, "WRONG_DIMENSION"],
    ["hank", spice, "UNKNOWN_UNIT"],
    ["stone", spice, "UNKNOWN_UNIT"],
    ["set", hank, "UNKNOWN_UNIT"],
    ["", spice, "UNKNOWN_UNIT"],
  ])("%s for %j is %s", (unit, item, code) => {
    expect(codeOf(() => toStockUnits("1", unit, item))).toBe(code);
    expect(codeOf(() => fromStockUnits("1", unit, item))).toBe(code);
    expect(isUnitFor(unit, item)).toBe(false);
  });

  it("names the unit and the stock unit in the message", () => {
    expect(() => toStockUnits("1", "kg", collagen)).toThrow(/"kg".*stocked in m/);
    expect(() => toStockUnits("1", "ml", spice)).toThrow(/"ml".*stocked in g.*density/);
    expect(() => toStockUnits("1", "hank", spice)).toThrow(/"hank".*stocked in g/);
    expect(() => toStockUnits("1", "kg", hank)).toThrow(/"kg".*pc \(one hank\)/);
  });

  it("refuses a pack cycle", () => {
    const cyclic: ItemUnits = {
      stockUnit: "g",
      packs: [
        { name: "crate", quantity: "4", unit: "case" },
        { name: "case", quantity: "6", unit: "crate" },
      ],
    };
    expect(codeOf(() => toStockUnits("1", "crate", cyclic))).toBe("PACK_CYCLE");
    expect(codeOf(() => assertItemUnits(cyclic))).toBe("PACK_CYCLE");
    expect(codeOf(() => toStockUnits("1", "self", { stockUnit: "g", packs: [{ name: "self", quantity: "2", unit: "self" }] }))).toBe(
      "PACK_CYCLE",
    );
  });

  it("refuses item descriptions that contradict themselves", () => {
    expect(codeOf(() => assertItemUnits({ stockUnit: "m", putUp: { name: "hank", metres: "91.44" } }))).toBe("INVALID_ITEM");
    expect(codeOf(() => assertItemUnits({ stockUnit: "pc", putUp: { name: "hank", metres: "0" } }))).toBe("INVALID_ITEM");
    expect(codeOf(() => assertItemUnits({ stockUnit: "pc", putUp: { name: "yard", metres: "1" } }))).toBe("INVALID_ITEM");
    expect(codeOf(() => assertItemUnits({ stockUnit: "g", packs: [{ name: "kg", quantity: "1", unit: "kg" }] }))).toBe("INVALID_ITEM");
    expect(codeOf(() => assertItemUnits({ stockUnit: "g", densityGPerMl: "-1" }))).toBe("INVALID_ITEM");
    expect(codeOf(() => assertItemUnits({ stockUnit: "g", packs: [{ name: "bag", quantity: "1", unit: "m" }] }))).toBe(
      "WRONG_DIMENSION",
    );
    expect(codeOf(() => assertItemUnits(hank))).toBe("no error");
    // bad sizes never divide by zero, even without assertItemUnits first
    expect(codeOf(() => toStockUnits("1", "m", { stockUnit: "pc", putUp: { name: "hank", metres: "0" } }))).toBe("INVALID_ITEM");
    expect(codeOf(() => fromStockUnits("1", "bag", { stockUnit: "g", packs: [{ name: "bag", quantity: "0", unit: "g" }] }))).toBe("INVALID_ITEM");
    expect(codeOf(() => toStockUnits("1", "l", { stockUnit: "g", densityGPerMl: "0" }))).toBe("INVALID_ITEM");
    expect(codeOf(() => toStockUnits("1", "g", { stockUnit: "kg" as never }))).toBe("INVALID_ITEM");
  });

  it("refuses a number that is not a plain decimal", () => {
    expect(codeOf(() => toStockUnits("1e3", "g", spice))).toBe("INVALID_NUMBER");
  });
});

describe("unitsFor", () => {
  it("offers the put-up, packs and lengths for a casing", () => {
    const units = unitsFor(hank).map((u) => u.unit);
    expect(units.slice(0, 4)).toEqual(["hank", "box of 10 hanks", "half hank", "pallet"]);
    expect(units).toEqual(expect.arrayContaining(["m", "yd", "ft"]));
    expect(units).not.toContain("kg");
    for (const u of units) expect(isUnitFor(u, hank), u).toBe(true);
    expect(unitsFor(beefSet)[0]).toMatchObject({ unit: "beef_set", label: "set", kind: "put-up" });
  });

  it("offers mass units, and volume ones only with a density", () => {
    const plainSpice = unitsFor(spice).map((u) => u.unit);
    expect(plainSpice).toEqual(["25 lb pail", "1 kg bag", "mg", "g", "kg", "oz", "lb"]);
    expect(unitsFor(liquid).map((u) => u.unit)).toContain("tsp");
    expect(unitsFor(brine).map((u) => u.unit)).toEqual(["ml", "l", "tsp", "tbsp", "fl_oz", "gal", "mg", "g", "kg", "oz", "lb"]);
    for (const item of [spice, liquid, brine, collagen]) for (const u of unitsFor(item)) expect(isUnitFor(u.unit, item)).toBe(true);
  });
});

describe("formatQuantity (display only)", () => {
  it("picks g or kg, oz or lb", () => {
    expect(formatQuantity("1500", spice, "metric")).toEqual({ value: "1.5", unit: "kg", label: "kg" });
    expect(formatQuantity("999.94", spice, "metric")).toEqual({ value: "999.9", unit: "g", label: "g" });
    expect(formatQuantity("453.59237", spice, "us")).toEqual({ value: "1", unit: "lb", label: "lb" });
    expect(formatQuantity("100", spice, "us")).toEqual({ value: "3.53", unit: "oz", label: "oz" }); // 3.5273961...
    expect(formatQuantity("11339.80925", spice, "us")).toMatchObject({ value: "25", unit: "lb" });
  });

  it("rounds half-even", () => {
    expect(formatQuantity("0.25", spice, "metric").value).toBe("0.2");
    expect(formatQuantity("0.35", spice, "metric").value).toBe("0.4");
    expect(formatQuantity("1.0125", hank, "metric").value).toBe("1.012");
    expect(formatQuantity("1.0135", hank, "metric").value).toBe("1.014");
    expect(formatQuantity("-0.01", spice, "metric").value).toBe("0");
  });

  it("shows volumes and lengths", () => {
    expect(formatQuantity("2500", brine, "metric")).toMatchObject({ value: "2.5", unit: "l" });
    expect(formatQuantity("3785.411784", brine, "us")).toMatchObject({ value: "1", unit: "gal" });
    expect(formatQuantity("500", brine, "us")).toMatchObject({ value: "16.91", unit: "fl_oz", label: "fl oz" });
    expect(formatQuantity("91.44", collagen, "us")).toMatchObject({ value: "100", unit: "yd" });
    expect(formatQuantity("0.3048", collagen, "us")).toMatchObject({ value: "1", unit: "ft" });
    expect(formatQuantity("12.345", collagen, "metric")).toMatchObject({ value: "12.34", unit: "m" });
  });

  it("shows put-ups, and their metres separately", () => {
    expect(formatQuantity("1.5", hank, "metric")).toEqual({ value: "1.5", unit: "hank", label: "hank" });
    expect(formatQuantity("1.5", hank, "us")).toEqual({ value: "1.5", unit: "hank", label: "hank" });
    expect(formatQuantity("2", beefSet, "metric")).toEqual({ value: "2", unit: "beef_set", label: "set" });
    expect(formatMetresOf("1.5", hank, "metric")).toMatchObject({ value: "137.16", unit: "m" });
    expect(formatMetresOf("1.5", hank, "us")).toMatchObject({ value: "150", unit: "yd" });
    expect(formatQuantity("20", hank, "metric", { unit: "box of 10 hanks" })).toMatchObject({ value: "2", label: "box of 10 hanks" });
    expect(formatQuantity("1", spice, "metric", { unit: "g", decimals: 3 })).toMatchObject({ value: "1" });
  });
});
