// lib/reorder: the reorder suggestion shared by the buying page and the alert jobs.
// The rule is the purchasing issue's (projected = on hand - reserved - planned not yet reserved
// within the lead time + open orders due within it; order up to par in whole packs, raised to
// the supplier's minimum order value). Figures below are invented for the tests; the arithmetic
// is checked by hand in each comment and, in the property test, against decimal.js directly.
import Decimal from "decimal.js";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { groupBySupplier, packsFor, suggestReorder, type ReorderInput, type SupplierOffer } from "@/lib/reorder/suggest";
import { dec } from "@/lib/units";

const offer = (over: Partial<SupplierOffer> = {}): SupplierOffer => ({
  supplierId: "s1", supplierName: "Alder Spice Co", supplierItemId: "si1", sku: "P-1",
  leadTimeDays: 5, minOrderValue: null, packSize: "1000", packLabel: "1 kg bag", packPrice: "12.00", ...over,
});

const base = (over: Partial<ReorderInput> = {}): ReorderInput => ({
  today: "2026-12-02", onHand: "2500", reserved: "500", reorderPoint: "3000", parLevel: "6000",
  plannedUse: [], openOrders: [], offers: [offer()], ...over,
});

describe("suggestReorder", () => {
  it("projects within the supplier's lead time and orders up to par in whole packs", () => {
    const r = suggestReorder(base({
      plannedUse: [{ date: "2026-12-04", quantity: "400" }, { date: "2026-12-20", quantity: "900" }], // the second is past 12-07
      openOrders: [{ date: "2026-12-06", quantity: "1000" }, { date: "2026-12-30", quantity: "5000" }],
    }));
    // 2500 - 500 - 400 + 1000 = 2600 < 3000; 6000 - 2600 = 3400 -> 4 packs of 1000 g
    expect(r.suggested).toBe(true);
    expect(r.chosen).toMatchObject({ horizon: "2026-12-07", plannedWithinLeadTime: "400", openOrdersWithinLeadTime: "1000", projected: "2600", shortfall: "3400", packs: 4, quantity: "4000", value: "48", unitPrice: "0.012" });
    expect(r.chosen!.reasons.join(" ")).toMatch(/below the reorder point 3000/);
  });

  it("is not suggested at or above the reorder point (falls below means strictly below)", () => {
    const r = suggestReorder(base({ onHand: "3500" })); // 3500 - 500 = 3000, not below 3000
    expect(r.suggested).toBe(false);
    expect(r.chosen).toBeNull();
    expect(r.offers[0]).toMatchObject({ projected: "3000", suggested: false, packs: 0, quantity: "0" });
  });

  it("orders up to the reorder point when there is no par level", () => {
    const r = suggestReorder(base({ parLevel: null }));
    // 2500 - 500 = 2000; 3000 - 2000 = 1000 -> exactly one pack
    expect(r.chosen).toMatchObject({ shortfall: "1000", packs: 1, quantity: "1000" });
    expect(r.chosen!.reasons.join(" ")).toMatch(/no par level set/);
  });

  it("without a reorder point nothing is suggested and the reason says so", () => {
    const r = suggestReorder(base({ reorderPoint: null }));
    expect(r.suggested).toBe(false);
    expect(r.offers[0]!.reasons).toEqual(["No reorder point is set for this item in this kitchen."]);
  });

  it("preselects the cheapest price per stock unit, not per pack; each supplier uses its own lead time", () => {
    const r = suggestReorder(base({
      plannedUse: [{ date: "2026-12-10", quantity: "600" }],
      offers: [
        offer({ supplierId: "a", supplierName: "Birch Casings", supplierItemId: "a1", leadTimeDays: 2, packSize: "500", packPrice: "7.00" }), // 0.014 per g
        offer({ supplierId: "b", supplierName: "Cedar Provisions", supplierItemId: "b1", leadTimeDays: 10, packSize: "5000", packPrice: "55.00" }), // 0.011 per g
      ],
    }));
    expect(r.chosen!.offer.supplierName).toBe("Cedar Provisions");
    // Cedar counts the batch on 12-10 (within 10 days): 2000 - 600 = 1400; 6000 - 1400 = 4600 -> 1 pack of 5000
    expect(r.chosen).toMatchObject({ projected: "1400", packs: 1, quantity: "5000", unitPrice: "0.011" });
    // Birch (2 days) does not: 2000; 4000 -> 8 packs of 500
    expect(r.offers[1]).toMatchObject({ projected: "2000", packs: 8, quantity: "4000" });
  });

  it("puts priced offers before unpriced ones", () => {
    const r = suggestReorder(base({ offers: [offer({ supplierId: "x", supplierName: "Aaa", packPrice: null }), offer({ supplierId: "y", supplierName: "Zzz" })] }));
    expect(r.offers.map((o) => o.offer.supplierName)).toEqual(["Zzz", "Aaa"]);
    expect(r.offers[1]!.value).toBeNull();
  });

  it("below the reorder point with no supplier: suggested, and says to add one", () => {
    const r = suggestReorder(base({ offers: [] }));
    expect(r).toMatchObject({ suggested: true, chosen: null, projectedToday: "2000" });
    expect(r.reasons[0]).toMatch(/no supplier lists this item/);
  });

  it("property: the packs cover the shortfall and one pack fewer would not (decimal.js as the reference)", () => {
    const qty = fc.integer({ min: 0, max: 10_000_000 }).map((n) => (n / 1000).toFixed(3)); // exact 3-decimal strings
    fc.assert(
      fc.property(qty, qty, qty, qty, fc.integer({ min: 1, max: 100_000 }).map((n) => (n / 100).toFixed(2)), (onHand, reserved, point, extra, packSize) => {
        const par = new Decimal(point).plus(extra).toFixed(3);
        const r = suggestReorder(base({ onHand, reserved, reorderPoint: point, parLevel: par, offers: [offer({ packSize })] }));
        const projected = new Decimal(onHand).minus(reserved);
        expect(dec(r.offers[0]!.projected).eq(projected)).toBe(true);
        expect(r.suggested).toBe(projected.lt(point));
        if (r.suggested) {
          const need = new Decimal(par).minus(projected);
          const packs = r.chosen!.packs;
          expect(new Decimal(packSize).times(packs).gte(need)).toBe(true);
          expect(packs === 1 || new Decimal(packSize).times(packs - 1).lt(need)).toBe(true);
        }
      }),
      { numRuns: 300 },
    );
  });

  it("packsFor refuses an empty pack", () => {
    expect(() => packsFor(dec("1"), dec("0"))).toThrow(RangeError);
    expect(packsFor(dec("0.0001"), dec("1000"))).toBe(1);
  });
});

describe("groupBySupplier: the minimum order value is per order", () => {
  const line = (key: string, over: Partial<SupplierOffer>, input: Partial<ReorderInput> = {}) => {
    const r = suggestReorder(base({ offers: [offer(over)], ...input }));
    return { key, itemName: key, figures: r.chosen! };
  };

  it("raises the line with the largest shortfall value by whole packs until the order reaches the minimum", () => {
    const lines = [
      line("sage", { minOrderValue: "150.00", packSize: "1000", packPrice: "12.00" }), // 2 packs, 24.00, shortfall 4000 x 0.012 = 48
      line("mace", { minOrderValue: "150.00", supplierItemId: "si2", packSize: "100", packPrice: "9.00" }, { reorderPoint: "300", parLevel: "500", onHand: "250", reserved: "0" }), // 3 packs, 27.00, shortfall 250 x 0.09 = 22.5
    ];
    expect([lines[0]!.figures.packs, lines[1]!.figures.packs]).toEqual([4, 3]); // 6000 - 2000 = 4000 -> 4 packs (48.00)
    const [g] = groupBySupplier(lines);
    // total 48 + 27 = 75 < 150: sage (shortfall value 48 > 22.5) gets ceil(75 / 12) = 7 more packs -> 11 packs, 132.00; total 159.00
    expect(g!.lines.find((l) => l.key === "sage")!.figures).toMatchObject({ packs: 11, quantity: "11000", value: "132" });
    expect(g!.lines.find((l) => l.key === "mace")!.figures.packs).toBe(3);
    expect(g!.value).toBe("159");
    expect(g!.reasons[0]).toMatch(/under Alder Spice Co's minimum order of 150/);
    expect(lines[0]!.figures.packs).toBe(4); // the input is not changed
  });

  it("does not raise an order that already reaches the minimum", () => {
    const [g] = groupBySupplier([line("sage", { minOrderValue: "48.00" })]);
    expect(g!.lines[0]!.figures.packs).toBe(4);
    expect(g!.reasons).toEqual([]);
  });

  it("keeps suppliers apart", () => {
    const gs = groupBySupplier([line("a", { supplierId: "s2", supplierName: "Birch Casings" }), line("b", {})]);
    expect(gs.map((g) => g.supplierName)).toEqual(["Alder Spice Co", "Birch Casings"]);
  });
});
