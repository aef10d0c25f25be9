// GET /api/dashboard (lib/data/dashboard.ts) against the real PostgreSQL, on a company built here:
// receipts, use, waste, a transfer and a reversal through POST /api/movements, levels, a supplier, a
// recipe and batches. Sources of the checks:
// - money by the company's cost formula (IAS 2 para. 25: FIFO, or the weighted average, here the
//   moving average; kept per kitchen, a transfer carrying its cost: lib/costing/engine.ts and
//   trade-facts §8), worked out by hand below; each value shown rounded half-even to EUR's 2
//   decimals (ISO 4217; the house rule of DEVELOPERS.md "Units and scales"), a figure made of parts
//   (a kitchen of items, a month of used + wasted) adding the parts as shown, as the reports do.
//   Then cross-checked against GET /api/reports/valuation (today) and /api/reports/usage
//   (groupBy=category), whose own hand-worked checks are tests/integration/reports.test.ts.
// - a cure lot's value = its on hand x the kitchen's unit value of the item (position value /
//   position quantity), rounded once (the Overview's rule, stated in the API description).
// - days left = the lot's date - the company's today in calendar days; cure listed within its
//   largest warning window, default 60 days (lib/alerts/expiry.ts, DEVELOPERS.md "Alerts and scans").
// - below the reorder point and shortages: the figures of Buying > Reorder (lib/reorder) and of the
//   planner (lib/data/batches.ts), compared with their own endpoints; the reorder arithmetic is the
//   purchasing issue's rule, worked out beside the check.
// - usage = use and waste net of reversals, as the formula costed them, per month of the company's
//   time zone and category.
//
// The fixture, by kitchen (unit costs are per the unit typed, stored per stock unit; every receipt
// is posted now, in this order, unless a date is given):
//   K1  cure A  2.5 kg at 6.40/kg (0.0064/g), date today+10; then 100 g of lot A wasted
//       cure B  1 kg at 7.00/kg (0.007/g), date today-3 (past its date)
//       cure C  1 kg at 6.40/kg, date today+61 (beyond 60 days)
//       paprika 1.2 kg at 12.50/kg (0.0125/g), 8 months back; 100 g used 6 months back, 200 g 2 months
//               back, 300 g now, 40 g now and reversed; one receipt, so every formula costs 0.0125/g
//       fennel  100 g at 0.02/g
//   K2  hog casing 3 hanks at 36.55/hank; mace 23 g at 0.005/g; cure D 500 g at 0.006/g, date today+5
//       pepper  P1 1000 g at 0.010/g (best before today+200), then P2 1000 g at 0.016/g (best before
//               today+100); 1500 g used: the ledger draws FEFO, P2's 1000 g then 500 g of P1; then
//               200 g sent to K1 (the ledger moves lot P1: the only one left)
//   K3  cure E  1 kg at 5.00/kg, date today+2, then K3 archived: in no panel
//
// FIFO (the company's default):
//   K1 cure: layers A 2500 @ 0.0064, B 1000 @ 0.007, C 1000 @ 0.0064; the waste takes the oldest:
//     100 x 0.0064 = 0.64; left 2400 x 0.0064 + 1000 x 0.007 + 1000 x 0.0064 = 15.36 + 7.00 + 6.40 = 28.76
//   K2 pepper: the use takes P1's layer first: 1000 x 0.010 + 500 x 0.016 = 18.00 (receipt cost, by
//     the lots drawn, would say 1000 x 0.016 + 500 x 0.010 = 21.00); left 500 @ 0.016 = 8.00; the
//     transfer takes 200 x 0.016 = 3.20 to K1, K2 keeps 300 x 0.016 = 4.80 (receipt cost would say
//     lot P1: 2.00 in K1, 3.00 in K2)
//   K1 = cure 28.76 + paprika 600 x 0.0125 = 7.50 + fennel 2.00 + pepper 3.20 = 41.46
//   K2 = hog 3 x 36.55 = 109.65 + mace 23 x 0.005 = 0.115 -> half-even 0.12 + cure D 3.00 + pepper 4.80
//      = 117.57 (each item rounded, as the valuation report's rows; half-up would also give 0.12, but
//      the kitchen's exact 117.565 rounded once would be 117.56)
//   total 41.46 + 117.57 = 159.03
//   cure lots: K1's unit value 28.76 / 4400 g; B 1000 x 28.76 / 4400 = 6.5363.. -> 6.54 (receipt
//     cost 7.00); A 2400 x 28.76 / 4400 = 15.6872.. -> 15.69 (receipt cost 15.36); C 6.54;
//     K2's D 500 x 3.00 / 500 = 3.00
//   usage this month: spice 300 x 0.0125 = 3.75 (the 40 g use and its reversal cancel) + pepper 18.00
//     = 21.75; cure 0.64; total 22.39. Two months back: spice 200 x 0.0125 = 2.50.
// Moving average:
//   K1 cure: 16.00 + 7.00 + 6.40 = 29.40 for 4500 g; the waste 29.40 x 100 / 4500 = 0.653333 (6 places,
//     VALUE_SCALE); left 28.746667 for 4400 g -> 28.75
//   K2 pepper: 10.00 + 16.00 = 26.00 for 2000 g; the use 26.00 x 1500 / 2000 = 19.50; left 6.50 for
//     500 g; the transfer 6.50 x 200 / 500 = 2.60 to K1, K2 keeps 3.90
//   K1 = 28.75 + 7.50 + 2.00 + 2.60 = 40.85; K2 = 109.65 + 0.12 + 3.00 + 3.90 = 116.67; total 157.52
//   cure lots: B 1000 x 28.746667 / 4400 = 6.5333.. -> 6.53; A 2400 x 28.746667 / 4400 = 15.6800.. ->
//     15.68; D 3.00
//   usage this month: spice 3.75 + 19.50 = 23.25; cure 0.653333 -> 0.65; total 23.90
// The other company has a cure lot dated tomorrow (1 kg at 9.99/kg, its only receipt: 9.99 by
// either formula): it never appears.
import { beforeAll, describe, expect, it, vi } from "vitest";
import { GET as dashboardRoute } from "../../app/api/dashboard/route";
import { GET as batchGet } from "../../app/api/batches/[id]/route";
import { POST as batchCreate } from "../../app/api/batches/route";
import { POST as reverseRoute } from "../../app/api/movements/[id]/reverse/route";
import { POST as moveRoute } from "../../app/api/movements/route";
import { POST as recipeCreate } from "../../app/api/recipes/route";
import { GET as usageRoute } from "../../app/api/reports/usage/route";
import { GET as valuationRoute } from "../../app/api/reports/valuation/route";
import { GET as suggestionsRoute } from "../../app/api/reorder-suggestions/route";
import { PUT as levelsRoute } from "../../app/api/stock-levels/route";
import { db } from "../../db/client";
import { CURE_CAUTION } from "../../lib/cure/caution";
import type { Dashboard } from "../../lib/data/dashboard";
import { createCompany, createUser, tag, uniqueEmail, type TestCompany } from "../support/factory";
import { companyDay } from "../support/deliveries";
import { call } from "../support/http";
import { sessionCookieFor } from "../support/sessions";
import { createItem, type TestItem } from "../support/stock";

// counts the costing engine's runs (the module itself, untouched, does the work): one per request
const costRuns = vi.hoisted(() => ({ count: 0 }));
vi.mock("../../lib/costing/load", async (importOriginal) => {
  const actual = await importOriginal<typeof import("../../lib/costing/load")>();
  return {
    ...actual,
    costCompany: (...args: Parameters<typeof actual.costCompany>) => {
      costRuns.count++;
      return actual.costCompany(...args);
    },
  };
});

let co: TestCompany;
let other: TestCompany;
const cookie: Record<string, string> = {};
let today: string;
const lots: Record<string, string> = {};
const batches: Record<string, string> = {};
let items: Record<"cure" | "paprika" | "fennel" | "mace" | "hog" | "pepper", TestItem>;
let otherLot: string;

const K = (i: number) => co.kitchens[i]!;
const dashboard = (who: string) => call<Dashboard>(dashboardRoute, { path: "/api/dashboard", cookie: cookie[who] });

async function ok<T = any>(p: Promise<{ status: number; body: T }>, status = 201): Promise<T> {
  const r = await p;
  expect(r.status, JSON.stringify(r.body)).toBe(status);
  return r.body;
}

async function move(body: Record<string, unknown>, who = "manager"): Promise<{ movementId: string; lotId: string }> {
  const b = await ok(call(moveRoute, { path: "/api/movements", body, cookie: cookie[who] }));
  return { movementId: b.movements[0].id, lotId: b.movements[0].lot.id };
}

const receipt = (kitchen: string, item: TestItem, quantity: string, unit: string, unitCost: string, date?: number, occurredAt?: string) =>
  move({
    kind: "receipt", kitchen, item: item.sku, quantity, unit, ...(occurredAt ? { occurredAt } : {}),
    lot: { code: `L-${tag()}`, unitCost, ...(date !== undefined ? { date: dayOf(date), dateKind: date < 0 ? "use_by" : "best_before" } : {}) },
  });

const dayOf = (n: number) => {
  const d = new Date(`${today}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + n);
  return d.toISOString().slice(0, 10);
};

/** yyyy-mm of `back` months before the company's this month, and noon UTC on its 15th. */
const monthBack = (back: number) => {
  const [y, m] = today.split("-").map(Number) as [number, number];
  const i = y * 12 + (m - 1) - back;
  return `${Math.floor(i / 12)}-${String((i % 12) + 1).padStart(2, "0")}`;
};
const midMonth = (back: number) => `${monthBack(back)}-15T12:00:00Z`;

beforeAll(async () => {
  co = await createCompany({ kitchens: 3 });
  other = await createCompany();
  today = await companyDay(co.company.id);
  for (const role of ["admin", "manager", "buyer", "kitchen_lead", "accountant"] as const) cookie[role] = await sessionCookieFor(co.users[role].id);
  cookie.otherManager = await sessionCookieFor(other.users.manager.id);
  const idle = await createUser(co.company.id, "kitchen_lead", { kitchenIds: [] });
  cookie.leadWithoutKitchen = await sessionCookieFor(idle.id);

  items = {
    cure: await createItem(co.company.id, { category: "cure" }),
    paprika: await createItem(co.company.id, { category: "spice" }),
    fennel: await createItem(co.company.id, { category: "spice" }),
    mace: await createItem(co.company.id, { category: "spice" }),
    hog: await createItem(co.company.id, { category: "casing" }),
    pepper: await createItem(co.company.id, { category: "spice", trackLots: true, trackDates: true }),
  };

  // K1
  lots.A = (await receipt(K(0).code, items.cure, "2.5", "kg", "6.40", 10)).lotId;
  lots.B = (await receipt(K(0).code, items.cure, "1", "kg", "7.00", -3)).lotId;
  lots.C = (await receipt(K(0).code, items.cure, "1", "kg", "6.40", 61)).lotId;
  lots.paprika = (await receipt(K(0).code, items.paprika, "1.2", "kg", "12.50", undefined, midMonth(8))).lotId;
  await receipt(K(0).code, items.fennel, "100", "g", "0.02");
  await move({ kind: "waste", kitchen: K(0).code, item: items.cure.sku, lot: lots.A, quantity: "100", unit: "g", reason: "Tub lid left off" });
  await move({ kind: "use", kitchen: K(0).code, item: items.paprika.sku, quantity: "100", unit: "g", occurredAt: midMonth(6) });
  await move({ kind: "use", kitchen: K(0).code, item: items.paprika.sku, quantity: "200", unit: "g", occurredAt: midMonth(2) });
  await move({ kind: "use", kitchen: K(0).code, item: items.paprika.sku, quantity: "300", unit: "g" });
  const mistake = await move({ kind: "use", kitchen: K(0).code, item: items.paprika.sku, quantity: "40", unit: "g" });
  await ok(call(reverseRoute, { path: `/api/movements/${mistake.movementId}/reverse`, method: "POST", params: { id: mistake.movementId }, body: { reason: "Typed twice" }, cookie: cookie.manager }));

  // K2
  await receipt(K(1).code, items.hog, "3", "hank", "36.55");
  await receipt(K(1).code, items.mace, "23", "g", "0.005");
  lots.D = (await receipt(K(1).code, items.cure, "500", "g", "0.006", 5)).lotId;
  lots.P1 = (await receipt(K(1).code, items.pepper, "1000", "g", "0.010", 200)).lotId;
  lots.P2 = (await receipt(K(1).code, items.pepper, "1000", "g", "0.016", 100)).lotId;
  await move({ kind: "use", kitchen: K(1).code, item: items.pepper.sku, quantity: "1500", unit: "g" });
  await move({ kind: "transfer", kitchen: K(1).code, toKitchen: K(0).code, item: items.pepper.sku, quantity: "200", unit: "g" });
  // the lots the ledger drew (FEFO), which receipt cost would have valued
  const onHand = await db()("stock_balances").where({ company_id: co.company.id, item_id: items.pepper.id }).where("on_hand", ">", 0).select("kitchen_id", "lot_id", db().raw("trim_scale(on_hand)::text as on_hand"));
  expect(onHand.map((b) => [b.kitchen_id, b.lot_id, b.on_hand]).sort()).toEqual([[K(0).id, lots.P1, "200"], [K(1).id, lots.P1, "300"]].sort());

  // K3, then archived
  lots.E = (await receipt(K(2).code, items.cure, "1", "kg", "5.00", 2)).lotId;
  await db()("kitchens").where({ id: K(2).id }).update({ archived_at: new Date() });

  // another company's cure, dated tomorrow
  const otherCure = await createItem(other.company.id, { category: "cure" });
  otherLot = (await ok(call(moveRoute, {
    path: "/api/movements", cookie: cookie.otherManager,
    body: { kind: "receipt", kitchen: other.kitchens[0]!.code, item: otherCure.sku, quantity: "1", unit: "kg", lot: { code: `O-${tag()}`, unitCost: "9.99", date: dayOf(1), dateKind: "use_by" } },
  }))).movements[0].lot.id;

  // levels: paprika in K1 (reorder point 1 kg, par 2 kg) with a supplier; the hog casing in K2 (reorder point 5 hanks) with none
  for (const [kitchen, item, reorderPoint, parLevel] of [[K(0).code, items.paprika.sku, "1000", "2000"], [K(1).code, items.hog.sku, "5", null]] as const) {
    await ok(call(levelsRoute, { method: "PUT", path: "/api/stock-levels", body: { kitchen, item, reorderPoint, parLevel }, cookie: cookie.manager }), 200);
  }
  const [supplier] = await db()("suppliers")
    .insert({ company_id: co.company.id, name: `Harrowgate Spice ${tag()}`, order_email: uniqueEmail("orders"), lead_time_days: 2 })
    .returning<{ id: string }[]>("id");
  const [si] = await db()("supplier_items")
    .insert({ company_id: co.company.id, supplier_id: supplier!.id, item_id: items.paprika.id, sku: `HS-${tag()}`, pack_label: "500 g bag", pack_quantity: "500", pack_unit: "g", pack_size_stock: "500" })
    .returning<{ id: string }[]>("id");
  await db()("supplier_item_prices").insert({ company_id: co.company.id, supplier_item_id: si!.id, pack_price: "6.00", effective_from: dayOf(-1) });

  // batches using fennel at 10 g/kg of meat: K1 has 100 g of it, K2 none
  const recipe = await ok(call(recipeCreate, {
    path: "/api/recipes", cookie: cookie.manager,
    body: {
      code: `FEN${tag().slice(0, 6).toUpperCase()}`, name: "Fennel sausage", productClass: "comminuted", storage: "keep_refrigerated",
      meatBlock: [{ name: "Pork shoulder", percent: "100" }], lines: [{ item: items.fennel.sku, rate: "10", unit: "g/kg" }],
    },
  }));
  const plan = async (name: string, kitchen: string, day: number, kg: string) => {
    batches[name] = (await ok(call(batchCreate, { path: "/api/batches", cookie: cookie.manager, body: { kitchen, recipe: recipe.code, plannedFor: dayOf(day), meatBlock: { quantity: kg, unit: "kg" } } }))).id;
  };
  await plan("k2", K(1).code, 1, "10"); // 100 g, K2 has none
  await plan("first", K(0).code, 2, "20"); // 200 g of K1's 100 g: 100 g short
  await plan("second", K(0).code, 3, "5"); // 50 g, the first batch takes K1's fennel first: 50 g short
  await plan("later", K(0).code, 8, "5"); // beyond today + 6
});

const setFormula = (f: "fifo" | "average") => db()("companies").where({ id: co.company.id }).update({ cost_formula: f });
const valueByKitchen = (d: Dashboard) => Object.fromEntries(d.stockValue.kitchens.map((k) => [k.kitchen.id, k.value]));
const CATEGORIES = ["cure", "casing", "spice", "ingredient"] as const;

/** The Overview's usage trend beside GET /api/reports/usage by category for the same six months (one kitchen, or all). */
async function usageAsReported(d: Dashboard, kitchen?: string) {
  const q = `from=${d.usageTrend.months[0]!.month}&to=${d.usageTrend.months.at(-1)!.month}&groupBy=category${kitchen ? `&kitchen=${kitchen}` : ""}`;
  const r = await ok(call(usageRoute, { path: `/api/reports/usage?${q}`, cookie: cookie.manager }), 200);
  expect(r.costFormula).toBe(d.costFormula);
  const cost = (month: string, category: string) => r.rows.find((x: { month: string; category: string }) => x.month === month && x.category === category)?.cost ?? "0.00";
  return d.usageTrend.months.map((m) => ({ month: m.month, ...Object.fromEntries(CATEGORIES.map((c) => [c, cost(m.month, c)])) }));
}
const usageShown = (d: Dashboard) => d.usageTrend.months.map((m) => ({ month: m.month, ...Object.fromEntries(CATEGORIES.map((c) => [c, m[c]])) }));

describe.sequential("GET /api/dashboard", () => {
  it("values stock by kitchen at FIFO cost, the company's default, with a total that adds up", async () => {
    const d = await ok(dashboard("manager"), 200);
    expect(d).toMatchObject({ today, currency: "EUR", costFormula: "fifo" });
    expect(d).not.toHaveProperty("costBasis");
    expect(d.kitchens.map((k) => k.id).sort()).toEqual([K(0).id, K(1).id].sort()); // K3 is archived
    // worked in the header: pepper carries FIFO's 0.016/g into K1, not lot P1's receipt cost
    expect(valueByKitchen(d)).toEqual({ [K(0).id]: "41.46", [K(1).id]: "117.57" });
    expect(d.stockValue.total).toBe("159.03");
  });

  it("runs the costing engine once per request", async () => {
    const before = costRuns.count;
    await ok(dashboard("manager"), 200);
    expect(costRuns.count - before).toBe(1);
    await ok(dashboard("kitchen_lead"), 200);
    expect(costRuns.count - before).toBe(2);
  });

  it("gives each kitchen the total of GET /api/reports/valuation for today", async () => {
    const d = await ok(dashboard("manager"), 200);
    const v = await ok(call(valuationRoute, { path: `/api/reports/valuation?asOf=${today}`, cookie: cookie.manager }), 200);
    expect(v.costFormula).toBe("fifo");
    expect(d.stockValue.kitchens.map((k) => k.kitchen.code)).toEqual(expect.arrayContaining([K(0).code, K(1).code]));
    expect(d.stockValue.kitchens.map((k) => [k.kitchen.code, k.value])).toEqual(d.stockValue.kitchens.map((k) => [k.kitchen.code, v.totals.byKitchen[k.kitchen.code]]));
  });

  it("lists cure by days left within the 60-day window, a lot past its date with negative days, not one beyond it", async () => {
    const d = await ok(dashboard("manager"), 200);
    expect(d.cureExpiring.windowDays).toBe(60);
    // values at K1's unit value of the cure under FIFO (28.76 / 4400 g), not each lot's receipt cost (7.00, 15.36)
    expect(d.cureExpiring.lots.map((l) => [l.lot.id, l.daysLeft, l.quantity, l.value, l.kitchen.id])).toEqual([
      [lots.B, -3, "1000", "6.54", K(0).id],
      [lots.D, 5, "500", "3.00", K(1).id],
      [lots.A, 10, "2400", "15.69", K(0).id],
    ]);
    const b = d.cureExpiring.lots[0]!;
    expect(b).toMatchObject({ date: dayOf(-3), dateKind: "use_by", item: { id: items.cure.id, sku: items.cure.sku, category: "cure", stockUnit: "g" } });
    expect(d.cureExpiring.caution).toBe(CURE_CAUTION);
    const listed = d.cureExpiring.lots.map((l) => l.lot.id);
    expect(listed).not.toContain(lots.C); // 61 days out
    expect(listed).not.toContain(lots.E); // archived kitchen
  });

  it("follows the company's own cure window", async () => {
    await db()("companies").where({ id: co.company.id }).update({ expiry_windows: JSON.stringify({ cure: [61, 7], casing: [30] }) });
    try {
      const d = await ok(dashboard("manager"), 200);
      expect(d.cureExpiring.windowDays).toBe(61);
      expect(d.cureExpiring.lots.map((l) => [l.lot.id, l.daysLeft, l.value]).at(-1)).toEqual([lots.C, 61, "6.54"]);
    } finally {
      await db()("companies").where({ id: co.company.id }).update({ expiry_windows: JSON.stringify({ cure: [60, 30, 7], casing: [30, 7], spice: [90, 30] }) });
    }
  });

  it("lists what Buying > Reorder suggests, with the same figures", async () => {
    const d = await ok(dashboard("manager"), 200);
    expect(d.belowReorder.items.map((i) => [i.kitchen.id, i.item.id])).toEqual([[K(0).id, items.paprika.id], [K(1).id, items.hog.id]]);
    const [paprika, hog] = d.belowReorder.items;
    // projected = 600 on hand - 0 reserved - 0 planned + 0 on order = 600 g by today + 2 days, below 1000;
    // par 2000 - 600 = 1400 g, rounded up to 3 bags of 500 g = 1500 g
    expect(paprika).toMatchObject({ onHand: "600", projected: "600", by: dayOf(2), reorderPoint: "1000", parLevel: "2000", suggestedQuantity: "1500" });
    expect(paprika!.supplier).toMatch(/^Harrowgate Spice/);
    // no supplier sells the casing: listed, nothing to suggest (3 hanks against a reorder point of 5)
    expect(hog).toMatchObject({ onHand: "3", projected: "3", by: today, reorderPoint: "5", parLevel: null, suggestedQuantity: null, supplier: null });
    expect(hog!.item.putUp).toEqual({ name: "hank", metres: "91.44" });
    expect(d.belowReorder.caution).toBeNull();

    const page = await ok(call(suggestionsRoute, { path: `/api/reorder-suggestions?kitchen=${K(0).code}`, cookie: cookie.manager }), 200);
    const line = page.kitchens[0].suppliers[0].lines[0];
    expect([line.item.id, line.chosen.projected, line.chosen.quantity, line.chosen.horizon]).toEqual([items.paprika.id, paprika!.projected, paprika!.suggestedQuantity, paprika!.by]);
  });

  it("lists next week's short batch lines as the planner works them out", async () => {
    const d = await ok(dashboard("manager"), 200);
    expect(d.shortages).toMatchObject({ from: today, to: dayOf(6), caution: null });
    expect(d.shortages.lines.map((l) => [l.batch.id, l.plannedFor, l.item.id, l.needed, l.short])).toEqual([
      [batches.k2, dayOf(1), items.fennel.id, "100", "100"],
      [batches.first, dayOf(2), items.fennel.id, "200", "100"],
      [batches.second, dayOf(3), items.fennel.id, "50", "50"],
    ]);
    for (const l of d.shortages.lines) {
      const b = await ok(call(batchGet, { path: `/api/batches/${l.batch.id}`, params: { id: l.batch.id }, cookie: cookie.manager }), 200);
      const planned = b.lines.find((x: { item: { id: string } }) => x.item.id === l.item.id);
      expect([planned.short, planned.suggestions]).toEqual([l.short, l.suggestions]);
    }
    expect(d.shortages.lines[0]!.suggestions).toEqual([{ kind: "buy", quantity: "100" }]);
  });

  it("sums use and waste at FIFO cost per month and category over six months, net of reversals", async () => {
    const d = await ok(dashboard("manager"), 200);
    expect(d.usageTrend.kinds).toEqual(["use", "waste"]);
    expect(d.usageTrend.months.map((m) => m.month)).toEqual([5, 4, 3, 2, 1, 0].map(monthBack));
    const zero = { cure: "0.00", casing: "0.00", spice: "0.00", ingredient: "0.00", total: "0.00" };
    expect(d.usageTrend.months).toEqual([
      { month: monthBack(5), ...zero }, // the use 6 months back is outside the six
      { month: monthBack(4), ...zero },
      { month: monthBack(3), ...zero },
      { month: monthBack(2), ...zero, spice: "2.50", total: "2.50" }, // 200 g x 0.0125
      { month: monthBack(1), ...zero },
      // paprika 3.75 + pepper 18.00 (FIFO; 21.00 by the lots drawn); cure waste 100 g x 0.0064 = 0.64; the transfer is not usage
      { month: monthBack(0), ...zero, spice: "21.75", cure: "0.64", total: "22.39" },
    ]);
  });

  it("shows the usage trend of GET /api/reports/usage?groupBy=category for the same months", async () => {
    const d = await ok(dashboard("manager"), 200);
    expect(usageShown(d)).toEqual(await usageAsReported(d));
  });

  it("follows the company's formula when it is the moving average", async () => {
    await setFormula("average");
    try {
      const d = await ok(dashboard("manager"), 200);
      expect(d.costFormula).toBe("average");
      expect(valueByKitchen(d)).toEqual({ [K(0).id]: "40.85", [K(1).id]: "116.67" });
      expect(d.stockValue.total).toBe("157.52");
      expect(d.cureExpiring.lots.map((l) => [l.lot.id, l.value])).toEqual([[lots.B, "6.53"], [lots.D, "3.00"], [lots.A, "15.68"]]);
      expect(d.usageTrend.months.at(-3)).toMatchObject({ spice: "2.50", total: "2.50" });
      expect(d.usageTrend.months.at(-1)).toEqual({ month: monthBack(0), cure: "0.65", casing: "0.00", spice: "23.25", ingredient: "0.00", total: "23.90" });
      // and the reports agree
      const v = await ok(call(valuationRoute, { path: `/api/reports/valuation?asOf=${today}`, cookie: cookie.manager }), 200);
      expect(v.costFormula).toBe("average");
      expect([v.totals.byKitchen[K(0).code], v.totals.byKitchen[K(1).code]]).toEqual([valueByKitchen(d)[K(0).id], valueByKitchen(d)[K(1).id]]);
      expect(usageShown(d)).toEqual(await usageAsReported(d));
      // the lead's K1 figures too (pepper at the average K2 sent it with)
      const lead = await ok(dashboard("kitchen_lead"), 200);
      expect(lead.stockValue.total).toBe("40.85");
      expect(usageShown(lead)).toEqual(await usageAsReported(lead, K(0).code));
    } finally {
      await setFormula("fifo");
    }
  });

  it("shows a kitchen lead only their own kitchens", async () => {
    const d = await ok(dashboard("kitchen_lead"), 200);
    expect(d.kitchens.map((k) => k.id)).toEqual([K(0).id]);
    // K1's pepper at the 0.016/g FIFO layer it left K2 with: the engine costs every kitchen, the lead sees theirs
    expect(d.stockValue).toEqual({ kitchens: [{ kitchen: { id: K(0).id, code: K(0).code, name: K(0).name }, value: "41.46" }], total: "41.46" });
    expect(d.cureExpiring.lots.map((l) => [l.lot.id, l.value])).toEqual([[lots.B, "6.54"], [lots.A, "15.69"]]);
    expect(d.belowReorder.items.map((i) => i.kitchen.id)).toEqual([K(0).id]);
    expect(d.shortages.lines.map((l) => l.batch.id)).toEqual([batches.first, batches.second]);
    // K1's usage only: K2's pepper is left out
    expect(d.usageTrend.months.at(-1)).toMatchObject({ spice: "3.75", cure: "0.64", total: "4.39" });
    expect(usageShown(d)).toEqual(await usageAsReported(d, K(0).code));
    expect((await dashboard("leadWithoutKitchen")).status).toBe(403);
  });

  it("lets accountants, buyers and admins read every kitchen; asks for a session", async () => {
    for (const who of ["accountant", "buyer", "admin"]) {
      const d = await ok(dashboard(who), 200);
      expect(d.stockValue.total).toBe("159.03");
      expect(d.kitchens).toHaveLength(2);
    }
    expect((await call(dashboardRoute, { path: "/api/dashboard" })).status).toBe(401);
  });

  it("never shows another company's data, nor ours to them", async () => {
    const mine = JSON.stringify(await ok(dashboard("manager"), 200));
    expect(mine).not.toContain(otherLot);
    expect(mine).not.toContain(other.kitchens[0]!.id);
    const theirs = await ok(dashboard("otherManager"), 200);
    expect(theirs.kitchens.map((k) => k.id)).toEqual([other.kitchens[0]!.id]);
    expect(theirs.cureExpiring.lots.map((l) => [l.lot.id, l.daysLeft, l.value])).toEqual([[otherLot, 1, "9.99"]]);
    expect(theirs.stockValue.total).toBe("9.99");
    const text = JSON.stringify(theirs);
    for (const id of [...Object.values(lots), K(0).id, K(1).id]) expect(text).not.toContain(id);
  });
});
