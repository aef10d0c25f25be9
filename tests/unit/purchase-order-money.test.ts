// The money of a purchase order (lib/purchasing/order-money.ts) and the packs a line may order
// (lib/validation/purchase-orders.ts). Line totals round once, half-even, to the currency's ISO 4217
// decimals (DEVELOPERS.md "Money on documents"; ISO 4217: EUR 2, JPY 0, KWD 3); checked against
// exact integer arithmetic on minor units (BigInt), an outside computation.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { currencyDecimals, lineTotal, moneyText, orderTotal, orderedStock, toMinor } from "@/lib/purchasing/order-money";
import { purchaseOrderCreateInput, wholePacks } from "@/lib/validation/purchase-orders";

describe("line totals", () => {
  it("round half-even once, to the currency's decimals", () => {
    expect(lineTotal("1", "2.345", "EUR")).toBe("2.34"); // a tie goes to the even cent
    expect(lineTotal("1", "2.355", "EUR")).toBe("2.36");
    expect(lineTotal("3", "0.005", "EUR")).toBe("0.02"); // 0.015
    expect(lineTotal("7", "1.2345", "GBP")).toBe("8.64"); // 8.6415
    expect(lineTotal("3", "1234.5", "JPY")).toBe("3704"); // 3703.5 -> even
    expect(lineTotal("2", "1.2345", "KWD")).toBe("2.469");
    expect(lineTotal("2", "189.50", "USD")).toBe("379.00");
  });

  it("agree with integer arithmetic on ten-thousandths for any whole packs and 4-decimal price", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 100_000 }), fc.bigInt({ min: 0n, max: 10n ** 12n }), (packs, priceTenThousandths) => {
        const price = `${priceTenThousandths / 10000n}.${String(priceTenThousandths % 10000n).padStart(4, "0")}`;
        // the exact product in ten-thousandths of the major unit, then to cents half-even by hand
        const product = BigInt(packs) * priceTenThousandths;
        const cents = product / 100n;
        const rest = product % 100n;
        const rounded = rest > 50n || (rest === 50n && cents % 2n === 1n) ? cents + 1n : cents;
        const expected = `${rounded / 100n}.${String(rounded % 100n).padStart(2, "0")}`;
        expect(lineTotal(String(packs), price, "EUR")).toBe(expected);
      }),
      { numRuns: 500 },
    );
  });

  it("the order total is the sum of the rounded lines, so the document's lines add up to it", () => {
    const lines = [lineTotal("1", "0.005", "EUR"), lineTotal("1", "0.005", "EUR"), lineTotal("1", "0.005", "EUR")];
    expect(lines).toEqual(["0.00", "0.00", "0.00"]); // each 0.005 rounds to the even cent, 0
    expect(orderTotal(lines, "EUR")).toBe("0.00");
    expect(orderTotal(["37.50", "379.00"], "GBP")).toBe("416.50");
    expect(orderTotal([], "JPY")).toBe("0");
  });
});

describe("amounts as shown and compared", () => {
  it("show at least the currency's decimals, more only when the value has them", () => {
    expect(moneyText("12.5", "GBP")).toBe("12.50");
    expect(moneyText("12.5000", "GBP")).toBe("12.50");
    expect(moneyText("0.1234", "GBP")).toBe("0.1234");
    expect(moneyText("500", "JPY")).toBe("500");
  });

  it("compare in minor units, and reckon an unknown currency with 2 decimals", () => {
    expect(toMinor("500.00", "EUR")).toBe(50000n);
    expect(toMinor("500.11", "EUR") > toMinor("500", "EUR")).toBe(true);
    expect(toMinor("1.2345", "KWD")).toBe(1234n);
    expect(currencyDecimals("XTS")).toBe(2);
    expect(currencyDecimals("jpy")).toBe(0);
  });

  it("orders packs x pack size exactly in the stock unit", () => {
    expect(orderedStock("2", "5").toString()).toBe("10");
    expect(orderedStock("3", "453.59237").toString()).toBe("1360.77711"); // 3 lb in g (NIST SP 811: 1 lb = 453.59237 g)
  });
});

describe("packs on a line", () => {
  it("are whole packs from 1, sent as strings", () => {
    expect(wholePacks.safeParse("3").success).toBe(true);
    expect(wholePacks.safeParse("3.000").success).toBe(true);
    expect(wholePacks.safeParse("2.5").error?.issues[0]?.message).toBe("Order whole packs, e.g. \"3\": suppliers sell these items by the pack.");
    expect(wholePacks.safeParse("0").error?.issues[0]?.message).toBe("Order at least one pack.");
    expect(wholePacks.safeParse("1e3").error?.issues[0]?.message).toBe("Use a plain number of packs, e.g. \"3\".");
    expect(wholePacks.safeParse(3).success).toBe(false);
  });

  it("name the line that is wrong", () => {
    const r = purchaseOrderCreateInput.safeParse({
      supplier: "0b8c4f4e-3f7e-4a51-9d7e-2f1d8f0f6a10", kitchen: "YARD",
      lines: [{ supplierItem: "0b8c4f4e-3f7e-4a51-9d7e-2f1d8f0f6a11", packs: "1" }, { supplierItem: "0b8c4f4e-3f7e-4a51-9d7e-2f1d8f0f6a12", packs: "1.5", packPrice: "12.345678" }],
      deliverBy: "2026-02-30",
    });
    expect(r.success).toBe(false);
    const paths = r.error!.issues.map((i) => i.path.join("."));
    expect(paths).toEqual(expect.arrayContaining(["lines.1.packs", "lines.1.packPrice", "deliverBy"]));
    expect(paths).not.toContain("lines.0.packs");
  });
});
