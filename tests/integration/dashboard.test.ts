// GET /api/dashboard (lib/data/dashboard.ts) against the real PostgreSQL, on a company built here:
// receipts, use, waste and a reversal through POST /api/movements, levels, a supplier, a recipe and
// batches. Sources of the checks:
// - stock value = on hand x the lot's unit cost at receipt (the "at receipt cost"), money
//   rounded once, half-even, to EUR's 2 decimals (ISO 4217; the house rule of DEVELOPERS.md
//   "Units and scales"); worked out by hand below from the receipts.
// - days left = the lot's date - the company's today in calendar days; cure listed within its
//   largest warning window, default 60 days (lib/alerts/expiry.ts, DEVELOPERS.md "Alerts and scans").
// - below the reorder point and shortages: the figures of Buying > Reorder (lib/reorder) and of the
//   planner (lib/data/batches.ts), compared with their own endpoints; the reorder arithmetic is the
//   purchasing issue's rule, worked out beside the check.
// - usage = -(sum of use and waste deltas x unit cost) per month of the company's time zone.
//
// The fixture, by kitchen (unit costs are per the unit typed, stored per stock unit):
//   K1  cure A  2.5 kg at 6.40/kg (0.0064/g), date today+10; 100 g wasted -> 2400 g x 0.0064 = 15.36
//       cure B  1 kg at 7.00/kg, date today-3 (past its date)          -> 1000 g x 0.007  =  7.00
//       cure C  1 kg at 6.40/kg, date today+61 (beyond 60 days)        -> 1000 g x 0.0064 =  6.40
//       paprika 1.2 kg at 12.50/kg (0.0125/g); 100 + 200 + 300 g used  ->  600 g x 0.0125 =  7.50
//       fennel  100 g at 0.02/g                                        ->  100 g x 0.02   =  2.00
//                                                                          K1 exact 38.26 -> 38.26
//   K2  hog casing 3 hanks at 36.55/hank                               ->    3 x 36.55    = 109.65
//       mace    23 g at 0.005/g                                        ->   23 x 0.005    =   0.115
//       cure D  500 g at 0.006/g, date today+5                         ->  500 x 0.006    =   3.00
//                K2 exact 112.765 -> half-even 112.76 (half-up would say 112.77)
//   K3  cure E  1 kg at 5.00/kg, date today+2, then K3 archived: in no panel
//   total = 38.26 + 112.76 = 151.02 (the values shown, added)
// The other company has a cure lot dated tomorrow: it never appears.
import { beforeAll, describe, expect, it } from "vitest";
import { GET as dashboardRoute } from "../../app/api/dashboard/route";
import { GET as batchGet } from "../../app/api/batches/[id]/route";
import { POST as batchCreate } from "../../app/api/batches/route";
import { POST as reverseRoute } from "../../app/api/movements/[id]/reverse/route";
import { POST as moveRoute } from "../../app/api/movements/route";
import { POST as recipeCreate } from "../../app/api/recipes/route";
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

let co: TestCompany;
let other: TestCompany;
const cookie: Record<string, string> = {};
let today: string;
const lots: Record<string, string> = {};
const batches: Record<string, string> = {};
let items: Record<"cure" | "paprika" | "fennel" | "mace" | "hog", TestItem>;
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

describe("GET /api/dashboard", () => {
  it("values stock by kitchen at receipt cost, exactly, with a total that adds up", async () => {
    const d = await ok(dashboard("manager"), 200);
    expect(d).toMatchObject({ today, currency: "EUR", costBasis: "receipt" });
    expect(d.kitchens.map((k) => k.id).sort()).toEqual([K(0).id, K(1).id].sort()); // K3 is archived
    const value = Object.fromEntries(d.stockValue.kitchens.map((k) => [k.kitchen.id, k.value]));
    expect(value).toEqual({ [K(0).id]: "38.26", [K(1).id]: "112.76" });
    expect(d.stockValue.total).toBe("151.02");
  });

  it("lists cure by days left within the 60-day window, a lot past its date with negative days, not one beyond it", async () => {
    const d = await ok(dashboard("manager"), 200);
    expect(d.cureExpiring.windowDays).toBe(60);
    expect(d.cureExpiring.lots.map((l) => [l.lot.id, l.daysLeft, l.quantity, l.value, l.kitchen.id])).toEqual([
      [lots.B, -3, "1000", "7.00", K(0).id],
      [lots.D, 5, "500", "3.00", K(1).id],
      [lots.A, 10, "2400", "15.36", K(0).id],
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
      expect(d.cureExpiring.lots.map((l) => [l.lot.id, l.daysLeft]).at(-1)).toEqual([lots.C, 61]);
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

  it("sums use and waste at receipt cost per month and category over six months, net of reversals", async () => {
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
      // 300 g x 0.0125 = 3.75 (the 40 g use and its reversal cancel); cure waste 100 g x 0.0064 = 0.64
      { month: monthBack(0), ...zero, spice: "3.75", cure: "0.64", total: "4.39" },
    ]);
  });

  it("shows a kitchen lead only their own kitchens", async () => {
    const d = await ok(dashboard("kitchen_lead"), 200);
    expect(d.kitchens.map((k) => k.id)).toEqual([K(0).id]);
    expect(d.stockValue).toEqual({ kitchens: [{ kitchen: { id: K(0).id, code: K(0).code, name: K(0).name }, value: "38.26" }], total: "38.26" });
    expect(d.cureExpiring.lots.map((l) => l.lot.id)).toEqual([lots.B, lots.A]);
    expect(d.belowReorder.items.map((i) => i.kitchen.id)).toEqual([K(0).id]);
    expect(d.shortages.lines.map((l) => l.batch.id)).toEqual([batches.first, batches.second]);
    // K1's usage only: the same as the company's here, since K2 used nothing
    expect(d.usageTrend.months.at(-1)).toMatchObject({ spice: "3.75", cure: "0.64" });
    expect((await dashboard("leadWithoutKitchen")).status).toBe(403);
  });

  it("lets accountants, buyers and admins read every kitchen; asks for a session", async () => {
    for (const who of ["accountant", "buyer", "admin"]) {
      const d = await ok(dashboard(who), 200);
      expect(d.stockValue.total).toBe("151.02");
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
