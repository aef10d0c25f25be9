// The stock grid's flat rows (category headers, items, lots), its labels, expiry bands and the
// parsing of typed quantities. Pure: no grid, no database.
import { describe, expect, it } from "vitest";
import {
  buildRows,
  casingLabel,
  daysLeft,
  expiryBand,
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
    expect(stockStatus("5", "5")).toEqual({ tone: "amber", word: "below reorder point" });
    expect(stockStatus("5.000000000001", "5")).toBeNull();
    expect(stockStatus("12", null)).toBeNull();
  });
});
