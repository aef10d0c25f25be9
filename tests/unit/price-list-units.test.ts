// Price lists, the pure parts: the fields proposed from real price-list headers, prices per unit
// for comparing suppliers (per kg / metre / hank), and the change in percent (half-even, 1 decimal),
// checked against an outside reference (BigInt rational arithmetic) with fast-check.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { proposeMapping } from "@/lib/import";
import { PRICE_LIST_FIELDS } from "@/lib/purchasing/price-list-fields";
import { changePercent, comparisonUnits, pricePerStockUnit, priceDirection, unitPrices } from "@/lib/purchasing/unit-prices";
import type { ItemUnits } from "@/lib/units";

// a hank is 100 yd = 91.44 m (trade-facts §4); 1 yd = 0.9144 m and 1 lb = 0.45359237 kg exactly (NIST HB 44 App. C)
const hank: ItemUnits = { stockUnit: "pc", putUp: { name: "hank", metres: "91.44" } };
const spice: ItemUnits = { stockUnit: "g" };
const liquid: ItemUnits = { stockUnit: "ml" };
const collagen: ItemUnits = { stockUnit: "m" };
const clips: ItemUnits = { stockUnit: "pc" };

describe("the fields proposed from a price list's headers", () => {
  const columnsOf = (headers: string[]) => proposeMapping(headers, PRICE_LIST_FIELDS);

  it("English, German and French headers", () => {
    expect(columnsOf(["SKU", "Description", "Pack price", "Currency"]).columns).toEqual({
      sku: { header: "SKU" }, description: { header: "Description" }, price: { header: "Pack price" }, currency: { header: "Currency" },
    });
    expect(columnsOf(["Artikelnummer", "Bezeichnung", "Preis", "Gültig ab"]).columns).toEqual({
      sku: { header: "Artikelnummer" }, description: { header: "Bezeichnung" }, price: { header: "Preis" }, effectiveFrom: { header: "Gültig ab" },
    });
    expect(columnsOf(["Code article", "Désignation", "Prix unitaire (€)", "Conditionnement", "Quantité", "Unité", "EAN"]).columns).toEqual({
      sku: { header: "Code article" }, description: { header: "Désignation" }, price: { header: "Prix unitaire (€)" }, pack: { header: "Conditionnement" },
      packQuantity: { header: "Quantité" }, packUnit: { header: "Unité" }, gtin: { header: "EAN" },
    });
  });

  it("a header that only contains a field's name, and a required field no header names", () => {
    const p = columnsOf(["Item code", "Unit price EUR", "Qty", "UoM", "Valid from"]);
    expect(p.columns).toEqual({ sku: { header: "Item code" }, price: { header: "Unit price EUR" }, packQuantity: { header: "Qty" }, packUnit: { header: "UoM" }, effectiveFrom: { header: "Valid from" } });
    const q = columnsOf(["Bestell-Nr.", "Bezeichnung", "Preis", "Einheit"]);
    expect(q.missingRequired).toEqual(["sku"]);
    expect(q.unusedHeaders).toEqual(["Bestell-Nr."]);
  });

  it("nothing that looks like a price list", () => {
    expect(columnsOf(["Contact", "Phone", "E-mail"]).problem).toMatch(/^No matching columns: none of this file's columns \("Contact", "Phone", "E-mail"\)/);
  });
});

describe("prices per unit", () => {
  it("compares casings in put-ups per hank and per metre and yard of casing", () => {
    expect(comparisonUnits(hank)).toEqual([{ unit: "hank", label: "hank" }, { unit: "m", label: "m" }, { unit: "yd", label: "yd" }]);
    // a bundle of 5 hanks for 38.00: 7.60 a hank; 7.60 / 91.44 m = 0.083114... a metre; 7.60 / 100 yd a yard
    expect(unitPrices("38.00", "5", hank)).toEqual([
      { unit: "hank", label: "hank", price: "7.6000" }, { unit: "m", label: "m", price: "0.0831" }, { unit: "yd", label: "yd", price: "0.0760" },
    ]);
    expect(pricePerStockUnit("38.00", "5")).toBe("7.600000");
  });

  it("mass per kg and lb, volume per l and gal, metres per m and yd, pieces per pc", () => {
    // a 25 lb pail (11,339.80925 g) for 100.00: 100 / 11.33980925 = 8.81849... a kg, exactly 4 a lb
    expect(unitPrices("100.00", "11339.80925", spice)).toEqual([{ unit: "kg", label: "kg", price: "8.8185" }, { unit: "lb", label: "lb", price: "4.0000" }]);
    // a 1 US gal jug (3,785.411784 ml) for 3.7854: 3.7854 / 3.785411784 = 0.999997 a litre
    expect(unitPrices("3.7854", "3785.411784", liquid)).toEqual([{ unit: "l", label: "l", price: "1.0000" }, { unit: "gal", label: "gal", price: "3.7854" }]);
    // 50 m for 22.00: 0.44 a metre, 0.44 x 0.9144 = 0.402336 a yard
    expect(unitPrices("22.00", "50", collagen)).toEqual([{ unit: "m", label: "m", price: "0.4400" }, { unit: "yd", label: "yd", price: "0.4023" }]);
    expect(unitPrices("12.00", "1000", clips)).toEqual([{ unit: "pc", label: "pc", price: "0.0120" }]);
  });

  it("rounds per stock unit half-even to 6 decimals (a third of a cent stays exact until then)", () => {
    expect(pricePerStockUnit("1.00", "3")).toBe("0.333333");
    expect(pricePerStockUnit("0.0001", "2")).toBe("0.000050");
    expect(pricePerStockUnit("0.000005", "1")).toBe("0.000005");
    expect(pricePerStockUnit("0.0000025", "1")).toBe("0.000002"); // half-even: ...25 -> ...2
    expect(pricePerStockUnit("0.0000035", "1")).toBe("0.000004");
  });
});

describe("the change in percent", () => {
  it("up, down, same, new", () => {
    expect(priceDirection(null, "5")).toBe("new");
    expect(priceDirection("5.00", "5")).toBe("same");
    expect(priceDirection("5", "5.01")).toBe("up");
    expect(priceDirection("5", "4.99")).toBe("down");
    expect(changePercent(null, "5")).toBeNull();
  });

  it("rounds half-even to 1 decimal; a tiny fall reads 0.0", () => {
    expect(changePercent("400", "401")).toBe("0.2"); // +0.25 %
    expect(changePercent("2000", "2007")).toBe("0.4"); // +0.35 %
    expect(changePercent("400", "399")).toBe("-0.2"); // -0.25 %
    expect(changePercent("189.50", "199.00")).toBe("5.0"); // +5.013 %
    expect(changePercent("14.20", "13.49")).toBe("-5.0"); // exactly -5 %
    expect(changePercent("100000", "99999")).toBe("0.0");
    expect(changePercent("3", "4")).toBe("33.3");
  });

  it("agrees with exact rational arithmetic (BigInt, half-even) for any two prices", () => {
    /** (new - old) / old x 100 to 1 decimal, half-even, from prices in ten-thousandths. */
    const reference = (oldUnits: bigint, newUnits: bigint): string => {
      const num = (newUnits - oldUnits) * 1000n; // tenths of a percent, as num / old
      const neg = num < 0n;
      const a = neg ? -num : num;
      let q = a / oldUnits;
      const r = a % oldUnits;
      if (r * 2n > oldUnits || (r * 2n === oldUnits && q % 2n === 1n)) q += 1n;
      const s = `${q / 10n}.${q % 10n}`;
      return neg && q !== 0n ? `-${s}` : s;
    };
    const price = fc.bigInt({ min: 1n, max: 10n ** 12n });
    const asText = (units: bigint) => `${units / 10000n}.${String(units % 10000n).padStart(4, "0")}`;
    fc.assert(fc.property(price, price, (o, n) => changePercent(asText(o), asText(n)) === reference(o, n)), { numRuns: 2000 });
  });
});
