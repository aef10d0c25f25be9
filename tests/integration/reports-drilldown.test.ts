// The usage report's drill-down (lib/data/reports.ts usageMovements, the page
// /reports/usage/movements): one item's movements of a month with what the cost formula made of
// each, and totals equal to the usage report's row. The ledger is tests/integration/reports.test.ts's,
// worked by hand there (IAS 2 para. 25: FIFO, or the moving weighted average; per kitchen):
//
// One spice in grams, Europe/London, kitchens A and B (all costs per g):
//   1 Oct  A receipt L1 1000 g @ 0.010 = +10.00      5 Oct  A receipt L2 1000 g @ 0.016 = +16.00
//  10 Oct  A use 1500 g      FIFO 1000 x 0.010 + 500 x 0.016 = 18.00              average 26.00 / 2000 x 1500 = 19.50 (0.013)
//  20 Oct  A waste 100 g     FIFO 100 x 0.016 = 1.60                               average 6.50 / 500 x 100 = 1.30 (0.013)
//   3 Nov  A -> B 200 g      FIFO 200 x 0.016 = 3.20 out of A and into B
//  10 Nov  A count 150 (200 on hand): -50 g   FIFO -0.80
//  15 Nov  B use 100 g       FIFO 1.60
import { beforeAll, describe, expect, it } from "vitest";
import { GET as usageRoute } from "../../app/api/reports/usage/route";
import { db } from "../../db/client";
import type { CurrentUser } from "../../lib/auth/current-user";
import { postMovement } from "../../lib/data/ledger";
import { usageMovements } from "../../lib/data/reports";
import { createCompany, tag, type TestCompany } from "../support/factory";
import { call } from "../support/http";
import { currentUser, sessionCookieFor } from "../support/sessions";
import { createItem } from "../support/stock";

let co: TestCompany;
let other: TestCompany;
let item: { id: string; sku: string };
let accountant: CurrentUser;
let A: string;
let B: string;
const at = (day: string) => `${day}T10:00:00Z`;

beforeAll(async () => {
  co = await createCompany({ kitchens: 2 });
  other = await createCompany({ kitchens: 1 });
  await db()("companies").where({ id: co.company.id }).update({ cost_formula: "fifo" });
  item = await createItem(co.company.id, { category: "spice", trackLots: true, trackDates: true });
  const m = await currentUser(co.users.manager.id);
  [A, B] = [co.kitchens[0]!.code, co.kitchens[1]!.code];
  await postMovement(m, { kind: "receipt", kitchen: A, item: item.sku, quantity: "1000", unit: "g", occurredAt: at("2026-10-01"), lot: { code: `L1-${tag()}`, date: "2027-03-01", dateKind: "best_before", unitCost: "0.010" } } as never);
  const [r2] = await postMovement(m, { kind: "receipt", kitchen: A, item: item.sku, quantity: "1000", unit: "g", occurredAt: at("2026-10-05"), lot: { code: `L2-${tag()}`, date: "2027-06-01", dateKind: "best_before", unitCost: "0.016" } } as never);
  await postMovement(m, { kind: "use", kitchen: A, item: item.sku, quantity: "1500", unit: "g", occurredAt: at("2026-10-10") } as never);
  await postMovement(m, { kind: "waste", kitchen: A, item: item.sku, quantity: "100", unit: "g", reason: "spilt", occurredAt: at("2026-10-20") } as never);
  await postMovement(m, { kind: "transfer", kitchen: A, toKitchen: B, item: item.sku, quantity: "200", unit: "g", occurredAt: at("2026-11-03") } as never);
  await postMovement(m, { kind: "count", kitchen: A, item: item.sku, lot: r2!.lot.id, quantity: "150", unit: "g", occurredAt: at("2026-11-10") } as never);
  await postMovement(m, { kind: "use", kitchen: B, item: item.sku, quantity: "100", unit: "g", occurredAt: at("2026-11-15") } as never);
  accountant = await currentUser(co.users.accountant.id);
});

const shape = (r: Awaited<ReturnType<typeof usageMovements>>) =>
  r.movements.map((m) => [m.kind, m.kitchen.code, m.quantity, m.value, m.unitCost, m.countsAs]);

describe.sequential("the usage drill-down", () => {
  it("October in kitchen A under FIFO: the receipts, the use and the waste, each costed; totals as the report's row", async () => {
    const r = await usageMovements(accountant, { month: "2026-10", item: item.id, kitchen: A });
    expect(r.costFormula).toBe("fifo");
    expect(r.kitchen?.code).toBe(A);
    // the use drew both lots (FEFO: L1 1000 g, L2 500 g), so the ledger holds it as two movements of one
    // posting; which of the two FIFO costs first follows the posting's order, the sum does not
    const uses = r.movements.filter((m) => m.kind === "use");
    const others = r.movements.filter((m) => m.kind !== "use");
    expect(others.map((m) => [m.kind, m.kitchen.code, m.quantity, m.value, m.unitCost, m.countsAs])).toEqual([
      ["receipt", A, "1000", "10.00", "0.01", null],
      ["receipt", A, "1000", "16.00", "0.016", null],
      ["waste", A, "-100", "-1.60", "0.016", "wasted"],
    ]);
    expect(uses.map((m) => m.lot.code.slice(0, 3)).sort()).toEqual(["L1-", "L2-"]);
    expect(uses.every((m) => m.countsAs === "used" && m.basis === "formula")).toBe(true);
    expect(uses.reduce((s, m) => s + Number(m.quantity), 0)).toBe(-1500); // small integers: exact as numbers
    expect(uses.reduce((s, m) => s + Math.round(Number(m.value) * 100), 0)).toBe(-1800); // cents
    expect(r.movements.map((m) => m.kind)).toEqual(["receipt", "receipt", "use", "use", "waste"]);
    expect(others[2]!.reason).toBe("spilt");
    expect(others[0]!.lot.code).toMatch(/^L1-/);
    expect(r.totals).toEqual({ usedQuantity: "1500", wastedQuantity: "100", countDifferenceQuantity: "0", usedCost: "18.00", wastedCost: "1.60", cost: "19.60", countDifferenceCost: "0.00" });
  });

  it("November in every kitchen: the transfer's two legs at the same cost, the count and B's use; the totals equal the usage report's row", async () => {
    const r = await usageMovements(accountant, { month: "2026-11", item: item.sku.toLowerCase() });
    expect(r.kitchen).toBeNull();
    expect(shape(r)).toEqual([
      ["transfer", A, "-200", "-3.20", "0.016", null],
      ["transfer", B, "200", "3.20", "0.016", null],
      ["count", A, "-50", "-0.80", "0.016", "countDifference"],
      ["use", B, "-100", "-1.60", "0.016", "used"],
    ]);
    expect(r.movements[0]!.otherKitchen?.code).toBe(B);
    expect(r.movements[1]!.otherKitchen?.code).toBe(A);
    const cookie = await sessionCookieFor(co.users.accountant.id);
    const report = await call(usageRoute, { path: "/api/reports/usage?from=2026-11&to=2026-11", cookie });
    const row = report.body.rows.find((x: { item: { id: string } }) => x.item.id === item.id);
    expect(r.totals).toEqual({
      usedQuantity: row.usedQuantity, wastedQuantity: row.wastedQuantity, countDifferenceQuantity: row.countDifferenceQuantity,
      usedCost: row.usedCost, wastedCost: row.wastedCost, cost: row.cost, countDifferenceCost: row.countDifferenceCost,
    });
  });

  it("the moving average: the use and the waste at 0.013 a gram", async () => {
    await db()("companies").where({ id: co.company.id }).update({ cost_formula: "average" });
    try {
      const r = await usageMovements(accountant, { month: "2026-10", item: item.id, kitchen: A });
      // the two legs of the use each at the average 0.013: 500 g 6.50 and 1000 g 13.00 (19.50 in all)
      const uses = shape(r).filter((m) => m[0] === "use").sort((x, y) => Number(y[2]) - Number(x[2]));
      expect(uses).toEqual([
        ["use", A, "-500", "-6.50", "0.013", "used"],
        ["use", A, "-1000", "-13.00", "0.013", "used"],
      ]);
      expect(shape(r).at(-1)).toEqual(["waste", A, "-100", "-1.30", "0.013", "wasted"]);
      expect(r.totals.cost).toBe("20.80");
    } finally {
      await db()("companies").where({ id: co.company.id }).update({ cost_formula: "fifo" });
    }
  });

  it("a month without movements is empty; other roles 403; another company's item or kitchen 404", async () => {
    const empty = await usageMovements(accountant, { month: "2026-10", item: item.id, kitchen: B });
    expect(empty.movements).toEqual([]);
    expect(empty.totals.cost).toBe("0.00");
    await expect(usageMovements(await currentUser(co.users.buyer.id), { month: "2026-10", item: item.id })).rejects.toMatchObject({ status: 403 });
    await expect(usageMovements(await currentUser(co.users.kitchen_lead.id), { month: "2026-10", item: item.id })).rejects.toMatchObject({ status: 403 });
    const stranger = await currentUser(other.users.accountant.id);
    await expect(usageMovements(stranger, { month: "2026-10", item: item.id })).rejects.toMatchObject({ status: 404 });
    await expect(usageMovements(stranger, { month: "2026-10", item: item.sku })).rejects.toMatchObject({ status: 404 });
    await expect(usageMovements(accountant, { month: "2026-10", item: item.id, kitchen: other.kitchens[0]!.code })).rejects.toMatchObject({ status: 404 });
  });
});
