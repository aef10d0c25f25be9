// The stock grid's flat rows (category headers, items, lots), its labels, expiry bands and the
// parsing of typed quantities. Pure: no grid, no database.
import { describe, expect, it } from "vitest";
import {
  acceptedUnitsText,
  buildRows,
  casingLabel,
  daysLeft,
  entryAsStored,
  entryText,
  expiryBand,
  parseQuantityEntry,
  parseQuantityInput,
  quantityText,
  restoreHierarchy,
  stockStatus,
  type GridRow,
} from "@/components/stock/stock-rows";
import type { StockRow } from "@/lib/data/stock";

function row(over: Partial<StockRow> & Pick<StockRow, "itemId" | "sku" | "name" | "category">): StockRow {
  return {
    unit: "g", trackLots: false, trackDates: false, casing: null, cure: null, parLevel: null, reorderPoint: null,
    onHand: "0", reserved: "0", available: "0", lots: [], ...over,
  };
}

const lot = (lotId: string, code: string, date: string | null = null) => ({
  lotId, code, date, dateKind: date ? ("use_by" as const) : null, receivedOn: "2026-11-01", onHand: "10", reserved: "0", available: "10", unitCost: "1",
});

const hog = (itemId: string, min: string, max: string, name = "Hog casing") =>
  row({
    itemId, sku: `HOG-${min}`, name, category: "casing", unit: "pc", onHand: "3.5",
    casing: { kind: "natural_hog", calibreMinMm: min, calibreMaxMm: max, putUp: "hank", metresPerPutUp: "91.44" },
  });

describe("buildRows", () => {
  const items = [
    row({ itemId: "p", sku: "PEP", name: "Pepper, black", category: "spice" }),
    hog("h2", "36", "38"),
    row({ itemId: "c", sku: "CURE1", name: "Cure #1", category: "cure", trackLots: true, trackDates: true, cure: { nitriteFraction: "0.0625", nitrateFraction: "0" }, lots: [lot("l1", "A1", "2027-01-01"), lot("l2", "A2", "2027-03-01")] }),
    hog("h1", "32", "35"),
    row({ itemId: "w", sku: "WTR", name: "Ice", category: "ingredient" }),
  ];

  it("puts category headers in trade order, casings by calibre, lots under their item", () => {
    const rows = buildRows(items);
    expect(rows.map((r) => r.id)).toEqual([
      "group:casing", "item:h1", "item:h2",
      "group:cure", "item:c", "lot:c:l1", "lot:c:l2",
      "group:spice", "item:p",
      "group:ingredient", "item:w",
    ]);
    const header = rows[0] as Extract<GridRow, { kind: "group" }>;
    expect(header.label).toBe("Casings");
    expect(header.itemCount).toBe(2);
    expect(rows.find((r) => r.id === "group:spice")).toMatchObject({ label: "Spices & seasonings" });
    expect(rows.find((r) => r.id === "group:ingredient")).toMatchObject({ label: "Other ingredients" });
  });

  it("labels casings by calibre, kind and put-up", () => {
    const rows = buildRows(items);
    expect(rows.find((r) => r.id === "item:h1")).toMatchObject({ label: "32/35 mm hog, hank" });
    expect(casingLabel({ kind: "natural_beef", calibreMinMm: "40", calibreMaxMm: "40", putUp: "beef_set", metresPerPutUp: "18" })).toBe("40 mm beef, set");
  });

  it("leaves out empty categories and fills pending counts in by row id", () => {
    const rows = buildRows([items[0]!], { get: (id) => (id === "item:p" ? "480" : undefined) });
    expect(rows.map((r) => r.id)).toEqual(["group:spice", "item:p"]);
    expect(rows[1]).toMatchObject({ counted: "480" });
  });

  it("lets a header's search text cover its items and an item's cover its lot codes", () => {
    const rows = buildRows(items);
    expect(rows.find((r) => r.id === "group:cure")!.search).toContain("CURE1");
    expect(rows.find((r) => r.id === "item:c")!.search).toContain("A2");
    // a lot matches its own code, not its sibling's
    expect(rows.find((r) => r.id === "lot:c:l1")!.search).not.toContain("A2");
  });
});

describe("restoreHierarchy", () => {
  it("keeps sorted items inside their category and lots under their item", () => {
    const rows = buildRows([
      row({ itemId: "a", sku: "A", name: "Allspice", category: "spice" }),
      row({ itemId: "b", sku: "B", name: "Bay", category: "spice", trackLots: true, lots: [lot("1", "L1"), lot("2", "L2")] }),
      row({ itemId: "x", sku: "X", name: "Cure", category: "cure" }),
    ]);
    // as a column sort might leave them: headers and lots scattered
    const scrambled = [...rows].reverse();
    const restored = restoreHierarchy(scrambled, (r) => r).map((r) => r.id);
    expect(restored).toEqual(["group:cure", "item:x", "group:spice", "item:b", "lot:b:2", "lot:b:1", "item:a"]);
  });
});

describe("quantities for people", () => {
  it("shows put-up casings in put-ups and metres", () => {
    expect(quantityText("3.5", hog("h", "32", "35"), "metric")).toEqual({ main: "3.5 hanks", length: "320.04 m" });
    expect(quantityText("1", hog("h", "32", "35"), "us")).toEqual({ main: "1 hank", length: "100 yd" });
  });

  it("shows mass in the person's unit system", () => {
    const spice = row({ itemId: "p", sku: "P", name: "Pepper", category: "spice" });
    expect(quantityText("1250", spice, "metric").main).toBe("1.25 kg");
    expect(quantityText("480", spice, "metric")).toEqual({ main: "480 g", length: null });
  });
});

describe("parseQuantityInput", () => {
  it("takes plain decimals of zero or more and gives them back canonical", () => {
    expect(parseQuantityInput("12.50")).toEqual({ ok: true, value: "12.5" });
    expect(parseQuantityInput(" 0 ")).toEqual({ ok: true, value: "0" });
    expect(parseQuantityInput("12,5")).toEqual({ ok: true, value: "12.5" });
    expect(parseQuantityInput(".5")).toEqual({ ok: true, value: "0.5" });
    expect(parseQuantityInput("")).toEqual({ ok: true, value: null });
    expect(parseQuantityInput(null)).toEqual({ ok: true, value: null });
  });

  it("refuses negatives, words, exponents and too many decimals", () => {
    for (const bad of ["-1", "abc", "1e3", "1.2.3", "0.1234567890123", "12 kg", "NaN"]) {
      expect(parseQuantityInput(bad).ok, bad).toBe(false);
    }
    expect(parseQuantityInput("-1")).toMatchObject({ message: expect.stringContaining("negative") });
  });
});

describe("parseQuantityEntry: a count or level typed with a unit", () => {
  const pepper = row({ itemId: "p", sku: "PEP", name: "Pepper", category: "spice" });
  const twine = row({ itemId: "t", sku: "TW", name: "Twine", category: "ingredient", unit: "m" });
  const brine = row({ itemId: "b", sku: "BR", name: "Brine", category: "ingredient", unit: "ml" });
  const hank = hog("h", "32", "35");
  const ok = (raw: string, item: typeof pepper) => {
    const r = parseQuantityEntry(raw, item);
    if (!r.ok) throw new Error(`${raw}: ${r.message}`);
    return r.entry!;
  };

  it("takes a plain number in the stock unit, as before", () => {
    expect(ok("480", pepper)).toEqual({ quantity: "480", unit: null, inStock: "480" });
    expect(ok(" 12,50 ", pepper)).toEqual({ quantity: "12.5", unit: null, inStock: "12.5" });
    expect(ok(".5", hank)).toEqual({ quantity: "0.5", unit: null, inStock: "0.5" });
    expect(parseQuantityEntry("", pepper)).toEqual({ ok: true, entry: null });
    expect(parseQuantityEntry(null, pepper)).toEqual({ ok: true, entry: null });
  });

  it("converts a unit of the same dimension exactly (NIST factors, no float)", () => {
    expect(ok("2.5 lb", pepper)).toEqual({ quantity: "2.5", unit: "lb", inStock: "1133.980925" });
    expect(ok("1 oz", pepper).inStock).toBe("28.349523125");
    expect(ok("0.3 kg", pepper).inStock).toBe("300");
    expect(ok("1,5 kg", pepper).inStock).toBe("1500");
    expect(ok("2.5lb", pepper)).toMatchObject({ unit: "lb", inStock: "1133.980925" });
    expect(ok("3 pounds", pepper).inStock).toBe("1360.77711");
    expect(ok("12 ft", twine)).toEqual({ quantity: "12", unit: "ft", inStock: "3.6576" });
    expect(ok("1 gal", brine).inStock).toBe("3785.411784");
    expect(ok("2 fl. oz.", brine).inStock).toBe("59.147059125");
  });

  it("keeps the stock unit under any of its names as a plain number", () => {
    expect(ok("300 g", pepper)).toEqual({ quantity: "300", unit: null, inStock: "300" });
    expect(ok("300 grams", pepper)).toEqual({ quantity: "300", unit: null, inStock: "300" });
    expect(ok("1.5 hank", hank)).toEqual({ quantity: "1.5", unit: null, inStock: "1.5" });
    expect(ok("1.5 hanks", hank)).toEqual({ quantity: "1.5", unit: null, inStock: "1.5" });
    expect(ok("2 pc", hank)).toEqual({ quantity: "2", unit: null, inStock: "2" });
  });

  it("takes a length for a put-up casing: 12 ft of a 91.44 m hank is exactly 0.04 hank", () => {
    expect(ok("12 ft", hank)).toEqual({ quantity: "12", unit: "ft", inStock: "0.04" });
    expect(ok("45.72 m", hank).inStock).toBe("0.5");
    expect(ok("100 yd", hank).inStock).toBe("1");
    // no finite decimal: kept exact to 60 digits, rounded only as stored (half-even, 12 decimals)
    const ten = ok("10 m", hank);
    expect(ten.inStock.startsWith("0.10936132983377077865266841644794400699912510936132983")).toBe(true);
    expect(entryAsStored(ten)).toBe("0.109361329834");
  });

  it("gives the entry back as the grid keeps it and as the database will store it", () => {
    expect(entryText(ok("2.5 lb", pepper))).toBe("2.5 lb");
    expect(entryText(ok("480", pepper))).toBe("480");
    expect(entryText(ok("1.5 hanks", hank))).toBe("1.5");
    expect(entryAsStored(ok("2.5 lb", pepper))).toBe("1133.980925");
    // what the cell holds reads back to the same entry (undo puts it back through the parser)
    const again = parseQuantityEntry(entryText(ok("2.5 lb", pepper)), pepper);
    expect(again).toEqual({ ok: true, entry: { quantity: "2.5", unit: "lb", inStock: "1133.980925" } });
  });

  it("refuses another dimension, naming the unit, the item's unit and what it takes", () => {
    const litres = parseQuantityEntry("2 l", pepper);
    expect(litres).toMatchObject({ ok: false, field: "unit" });
    expect(litres.ok ? "" : litres.message).toBe('"l" is a volume unit, and this item is counted in g (weight): use g, mg, kg, oz or lb.');
    const kilos = parseQuantityEntry("2 kg", hank);
    expect(kilos).toMatchObject({ ok: false, field: "unit" });
    expect(kilos.ok ? "" : kilos.message).toContain('"kg" is a weight unit');
    expect(kilos.ok ? "" : kilos.message).toContain("hanks");
    expect(kilos.ok ? "" : kilos.message).toContain("ft");
    expect(parseQuantityEntry("3 m", pepper)).toMatchObject({ ok: false, field: "unit", message: expect.stringContaining("length unit") });
    expect(parseQuantityEntry("3 pc", pepper)).toMatchObject({ ok: false, field: "unit", message: expect.stringContaining("count unit") });
  });

  it("refuses unknown units, negatives, words and exponents", () => {
    expect(parseQuantityEntry("2 tubs", pepper)).toMatchObject({ ok: false, field: "unit", message: '"tubs" is not a unit for this item: use g, mg, kg, oz or lb.' });
    expect(parseQuantityEntry("-2 kg", pepper)).toMatchObject({ ok: false, field: "quantity", message: expect.stringContaining("negative") });
    for (const bad of ["lots", "1e3", "1.2.3", "kg 2", "2 kg 3", "0.1234567890123 kg", "NaN", "Infinity"]) {
      expect(parseQuantityEntry(bad, pepper), bad).toMatchObject({ ok: false, field: "quantity", message: expect.stringContaining("Enter a plain number") });
    }
    expect(parseQuantityEntry("lots", hank)).toMatchObject({ message: expect.stringContaining("1.5 hanks or 12 ft") });
  });

  it("lists the units an item takes, its stock unit first", () => {
    expect(acceptedUnitsText(pepper)).toBe("g, mg, kg, oz or lb");
    expect(acceptedUnitsText(hank)).toBe("hanks, mm, cm, m, in, ft or yd");
  });
});

describe("expiry and stock status", () => {
  it("counts calendar days and bands them with a word", () => {
    expect(daysLeft("2026-12-14", "2026-12-02")).toBe(12);
    expect(daysLeft("2027-03-01", "2026-12-02")).toBe(89);
    expect(daysLeft("2026-11-30", "2026-12-02")).toBe(-2);
    expect(expiryBand(31)).toEqual({ tone: "herb", word: "in date" });
    expect(expiryBand(30)).toEqual({ tone: "amber", word: "30 days" });
    expect(expiryBand(12)).toEqual({ tone: "amber", word: "12 days" });
    expect(expiryBand(1)).toEqual({ tone: "amber", word: "1 day" });
    expect(expiryBand(0)).toEqual({ tone: "amber", word: "today" });
    expect(expiryBand(-1)).toEqual({ tone: "ember", word: "expired" });
  });

  it("flags out and below the reorder point on what is available", () => {
    expect(stockStatus("0", "5")).toEqual({ tone: "ember", word: "out" });
    expect(stockStatus("0", null)).toEqual({ tone: "ember", word: "out" });
    expect(stockStatus("5", "5")).toEqual({ tone: "amber", word: "to reorder" });
    expect(stockStatus("5.000000000001", "5")).toBeNull();
    expect(stockStatus("12", null)).toBeNull();
  });
});
