// GET /api/reports/usage and /api/reports/valuation on a small ledger worked by hand, under both
// cost formulas (IAS 2 para. 25: FIFO, or the moving weighted average; per kitchen; a transfer
// carries its cost). The textbook checks of the engine itself are in tests/unit/costing-engine.test.ts.
//
// One spice in grams, Europe/London, kitchens A and B (all costs per g):
//   1 Oct  A receipt L1 1000 g @ 0.010 = 10.00      5 Oct  A receipt L2 1000 g @ 0.016 = 16.00
//  10 Oct  A use 1500 g      FIFO 1000 x 0.010 + 500 x 0.016 = 18.00   average 26.00 / 2000 x 1500 = 19.50
//  20 Oct  A waste 100 g     FIFO 100 x 0.016 = 1.60                   average (26 - 19.5) / 500 x 100 = 1.30
//   3 Nov  A -> B 200 g      FIFO 200 x 0.016 = 3.20                   average 5.20 / 400 x 200 = 2.60
//  10 Nov  A count 150 (200 on hand): -50 g   FIFO -0.80               average 2.60 / 200 x 50 = -0.65
//  15 Nov  B use 100 g       FIFO 1.60                                 average 2.60 / 200 x 100 = 1.30
// End of October: A 400 g, FIFO 6.40, average 5.20. End of November: A 150 g (FIFO 2.40, average
// 1.95), B 100 g (FIFO 1.60, average 1.30).
import Papa from "papaparse";
import { beforeAll, describe, expect, it } from "vitest";
import { GET as usageRoute } from "../../app/api/reports/usage/route";
import { GET as valuationRoute } from "../../app/api/reports/valuation/route";
import { db } from "../../db/client";
import { postMovement } from "../../lib/data/ledger";
import { createCompany, tag, type TestCompany } from "../support/factory";
import { buildRequest, call } from "../support/http";
import { currentUser, sessionCookieFor } from "../support/sessions";
import { createItem } from "../support/stock";

let co: TestCompany;
let other: TestCompany;
let sku: string;
const cookie: Record<string, string> = {};
const at = (day: string) => `${day}T10:00:00Z`;

beforeAll(async () => {
  co = await createCompany({ kitchens: 2 });
  other = await createCompany({ kitchens: 1 });
  const item = await createItem(co.company.id, { category: "spice", trackLots: true, trackDates: true });
  sku = item.sku;
  const m = await currentUser(co.users.manager.id);
  const [A, B] = [co.kitchens[0]!.code, co.kitchens[1]!.code];
  const [r1] = await postMovement(m, { kind: "receipt", kitchen: A, item: sku, quantity: "1000", unit: "g", occurredAt: at("2026-10-01"), lot: { code: `L1-${tag()}`, date: "2027-03-01", dateKind: "best_before", unitCost: "0.010" } } as never);
  const [r2] = await postMovement(m, { kind: "receipt", kitchen: A, item: sku, quantity: "1000", unit: "g", occurredAt: at("2026-10-05"), lot: { code: `L2-${tag()}`, date: "2027-06-01", dateKind: "best_before", unitCost: "0.016" } } as never);
  await postMovement(m, { kind: "use", kitchen: A, item: sku, quantity: "1500", unit: "g", occurredAt: at("2026-10-10") } as never);
  await postMovement(m, { kind: "waste", kitchen: A, item: sku, quantity: "100", unit: "g", reason: "spilt", occurredAt: at("2026-10-20") } as never);
  await postMovement(m, { kind: "transfer", kitchen: A, toKitchen: B, item: sku, quantity: "200", unit: "g", occurredAt: at("2026-11-03") } as never);
  await postMovement(m, { kind: "count", kitchen: A, item: sku, lot: r2!.lot.id, quantity: "150", unit: "g", occurredAt: at("2026-11-10") } as never);
  await postMovement(m, { kind: "use", kitchen: B, item: sku, quantity: "100", unit: "g", occurredAt: at("2026-11-15") } as never);
  expect(r1!.lot.id).not.toBe(r2!.lot.id);
  for (const role of ["accountant", "manager", "admin", "buyer", "kitchen_lead"] as const) cookie[role] = await sessionCookieFor(co.users[role].id);
  cookie.other = await sessionCookieFor(other.users.accountant.id);
});

const usage = (who: string, query: string) => call(usageRoute, { path: `/api/reports/usage?${query}`, cookie: cookie[who] });
const valuation = (who: string, query: string) => call(valuationRoute, { path: `/api/reports/valuation?${query}`, cookie: cookie[who] });
const setFormula = (f: "fifo" | "average") => db()("companies").where({ id: co.company.id }).update({ cost_formula: f });

describe.sequential("the usage report", () => {
  it("FIFO: per month and item, used and wasted apart, count differences apart, totals that add up", async () => {
    await setFormula("fifo");
    const r = await usage("accountant", "from=2026-10&to=2026-11");
    expect(r.status, JSON.stringify(r.body)).toBe(200);
    expect(r.body.costFormula).toBe("fifo");
    expect(r.body.rows.map((x: Record<string, unknown>) => [x.month, x.usedQuantity, x.usedCost, x.wastedQuantity, x.wastedCost, x.cost, x.countDifferenceQuantity, x.countDifferenceCost])).toEqual([
      ["2026-10", "1500", "18.00", "100", "1.60", "19.60", "0", "0.00"],
      ["2026-11", "100", "1.60", "0", "0.00", "1.60", "-50", "-0.80"],
    ]);
    expect(r.body.rows[0]).toMatchObject({ unit: "g", category: "spice", item: { sku } });
    expect(r.body.totals).toEqual({ usedCost: "19.60", wastedCost: "1.60", cost: "21.20", countDifferenceCost: "-0.80" });
  });

  it("average: the same movements at the moving average", async () => {
    await setFormula("average");
    const r = await usage("manager", "from=2026-10&to=2026-11");
    expect(r.body.rows.map((x: Record<string, unknown>) => [x.month, x.usedCost, x.wastedCost, x.countDifferenceCost])).toEqual([
      ["2026-10", "19.50", "1.30", "0.00"],
      ["2026-11", "1.30", "0.00", "-0.65"],
    ]);
    await setFormula("fifo");
  });

  it("one kitchen, by kitchen, by category; one month; cost only where units would mix", async () => {
    const b = await usage("accountant", `from=2026-11&to=2026-11&kitchen=${co.kitchens[1]!.code}`);
    expect(b.body.kitchen.code).toBe(co.kitchens[1]!.code);
    expect(b.body.rows.map((x: Record<string, unknown>) => [x.month, x.usedQuantity, x.cost])).toEqual([["2026-11", "100", "1.60"]]);
    const k = await usage("accountant", "from=2026-10&to=2026-11&groupBy=kitchen");
    expect(k.body.rows.map((x: { month: string; kitchen: { code: string }; cost: string; countDifferenceCost: string }) => [x.month, x.kitchen.code, x.cost, x.countDifferenceCost])).toEqual([
      ["2026-10", co.kitchens[0]!.code, "19.60", "0.00"],
      ["2026-11", co.kitchens[0]!.code, "0.00", "-0.80"],
      ["2026-11", co.kitchens[1]!.code, "1.60", "0.00"],
    ]);
    const c = await usage("accountant", "from=2026-10&to=2026-10&groupBy=category");
    expect(c.body.rows).toEqual([{ month: "2026-10", category: "spice", usedCost: "18.00", wastedCost: "1.60", cost: "19.60", countDifferenceCost: "0.00" }]);
    expect(c.body.rows[0]).not.toHaveProperty("quantity");
  });

  it("CSV parsed back with papaparse equals the JSON rows; a BOM when asked; text cells neutralised", async () => {
    const json = (await usage("accountant", "from=2026-10&to=2026-11")).body;
    const res = await usageRoute(buildRequest({ path: "/api/reports/usage?from=2026-10&to=2026-11&format=csv&bom=true", cookie: cookie.accountant }), { params: Promise.resolve({}) });
    expect(res.headers.get("content-type")).toBe("text/csv; charset=utf-8");
    // the raw bytes: Response.text() would drop the byte order mark
    const text = new TextDecoder("utf-8", { ignoreBOM: true }).decode(await res.arrayBuffer());
    expect(text.charCodeAt(0)).toBe(0xfeff);
    const parsed = Papa.parse<Record<string, string>>(text.slice(1), { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.data.map((r) => [r.month, r.sku, r.used_quantity, r.used_cost, r.wasted_cost, r.cost, r.count_difference_quantity, r.count_difference_cost, r.currency])).toEqual(
      json.rows.map((r: Record<string, string>) => [r.month, sku, r.usedQuantity, r.usedCost, r.wastedCost, r.cost, r.countDifferenceQuantity, r.countDifferenceCost, "EUR"]),
    );
    const sum = parsed.data.reduce((s, r) => s + Math.round(Number(r.cost) * 100), 0);
    expect((sum / 100).toFixed(2)).toBe(json.totals.cost);
  });

  it("refuses bad ranges naming the field, other roles, and another company's kitchen", async () => {
    for (const [q, field] of [["from=2026-13&to=2026-11", "from"], ["from=2026-11&to=2026-10", "to"], ["from=2020-01&to=2026-11", "to"], ["to=2026-11", "from"], ["from=2026-10&to=2026-11&groupBy=lot", "groupBy"]] as const) {
      const r = await usage("accountant", q);
      expect(r.status, q).toBe(422);
      expect(Object.keys(r.body.error.details.fields), q).toContain(field);
    }
    expect((await usage("buyer", "from=2026-10&to=2026-11")).status).toBe(403);
    expect((await usage("kitchen_lead", "from=2026-10&to=2026-11")).status).toBe(403);
    expect((await usage("other", `from=2026-10&to=2026-11&kitchen=${co.kitchens[0]!.code}`)).status).toBe(404);
    expect((await usage("other", "from=2026-10&to=2026-11")).body.rows).toEqual([]);
  });
});

describe.sequential("the valuation", () => {
  it("at a past date and now, per kitchen and item, under both formulas", async () => {
    const oct = await valuation("accountant", "asOf=2026-10-31");
    expect(oct.status, JSON.stringify(oct.body)).toBe(200);
    expect(oct.body.rows.map((r: { kitchen: { code: string }; quantity: string; value: string }) => [r.kitchen.code, r.quantity, r.value])).toEqual([[co.kitchens[0]!.code, "400", "6.40"]]);
    const nov = await valuation("accountant", "asOf=2026-11-30");
    expect(nov.body.rows.map((r: { kitchen: { code: string }; quantity: string; value: string }) => [r.kitchen.code, r.quantity, r.value])).toEqual([
      [co.kitchens[0]!.code, "150", "2.40"],
      [co.kitchens[1]!.code, "100", "1.60"],
    ]);
    expect(nov.body.totals).toEqual({ value: "4.00", byCategory: { spice: "4.00" }, byKitchen: { [co.kitchens[0]!.code]: "2.40", [co.kitchens[1]!.code]: "1.60" } });
    // before anything was received: nothing
    expect((await valuation("accountant", "asOf=2026-09-30")).body.rows).toEqual([]);
    await setFormula("average");
    const avg = await valuation("accountant", "asOf=2026-11-30");
    expect(avg.body.rows.map((r: { value: string }) => r.value)).toEqual(["1.95", "1.30"]);
    await setFormula("fifo");
    // today's valuation holds exactly what the ledger's balances hold
    const today = new Date().toISOString().slice(0, 10);
    const now = await valuation("accountant", `asOf=${today}`);
    const balances: { kitchen_id: string; q: string }[] = await db()("stock_balances").where({ company_id: co.company.id }).groupBy("kitchen_id").select("kitchen_id").sum({ q: "on_hand" }) as never;
    expect(now.body.rows.map((r: { kitchen: { id: string }; quantity: string }) => [r.kitchen.id, Number(r.quantity)]).sort()).toEqual(balances.map((b: { kitchen_id: string; q: string }) => [b.kitchen_id, Number(b.q)]).sort());
  });

  it("CSV equals the JSON; bad day 422; 403 for the buyer", async () => {
    const json = (await valuation("accountant", "asOf=2026-11-30")).body;
    const res = await valuationRoute(buildRequest({ path: "/api/reports/valuation?asOf=2026-11-30&format=csv", cookie: cookie.accountant }), { params: Promise.resolve({}) });
    const text = await res.text();
    const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true });
    expect(parsed.data.map((r) => [r.kitchen_code, r.sku, r.quantity, r.unit, r.value])).toEqual(
      json.rows.map((r: { kitchen: { code: string }; item: { sku: string }; quantity: string; unit: string; value: string }) => [r.kitchen.code, r.item.sku, r.quantity, r.unit, r.value]),
    );
    expect((await valuation("accountant", "asOf=2026-02-30")).status).toBe(422);
    expect((await valuation("buyer", "asOf=2026-11-30")).status).toBe(403);
  });
});
