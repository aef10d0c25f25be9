// Reorder suggestions through their endpoints, on a kitchen set up through the API: stock received,
// reorder points and par levels set, batches planned (one reserved, one cancelled), orders drafted,
// approved and sent. The rule checked is the purchasing issue's, as lib/reorder/suggest.ts states
// it (source for every figure below: that rule; the arithmetic is worked out beside each check):
//   projected = on hand - reserved - planned use not yet reserved (batches dated within the
//               supplier's lead time) + open order quantities due within it
//   suggested when projected < reorder point; packs = ceil((par, else reorder point) - projected)
//   / pack size); the supplier's minimum order value raises the order by whole packs; the
//   cheapest price per stock unit is preselected.
// Recipe rates are plain arithmetic: 10 g of paprika per kg of meat block, so 40 kg takes 400 g.
import { randomUUID } from "node:crypto";
import { addDays, formatISO, parseISO } from "date-fns";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as cancelBatchRoute } from "../../app/api/batches/[id]/cancel/route";
import { POST as reserveRoute } from "../../app/api/batches/[id]/reserve/route";
import { POST as batchCreate } from "../../app/api/batches/route";
import { POST as itemCreate } from "../../app/api/items/route";
import { POST as moveRoute } from "../../app/api/movements/route";
import { POST as approveRoute } from "../../app/api/purchase-orders/[id]/approve/route";
import { POST as sendRoute } from "../../app/api/purchase-orders/[id]/send/route";
import { POST as orderCreate } from "../../app/api/purchase-orders/route";
import { POST as recipeCreate } from "../../app/api/recipes/route";
import { POST as ordersRoute } from "../../app/api/reorder-suggestions/orders/route";
import { GET as suggestionsRoute } from "../../app/api/reorder-suggestions/route";
import { PUT as levelsRoute } from "../../app/api/stock-levels/route";
import { db } from "../../db/client";
import type { Role } from "../../db/types";
import { createCompany, tag, uniqueEmail, type TestCompany } from "../support/factory";
import { call } from "../support/http";
import { sessionCookieFor } from "../support/sessions";

let co: TestCompany;
let other: TestCompany;
const cookie = {} as Record<Role, string>;
let otherBuyer: string;
let today: string;
const day = (n: number) => formatISO(addDays(parseISO(today), n), { representation: "date" });
const K = (i: number) => co.kitchens[i]!;

const post = (handler: Parameters<typeof call>[0], path: string, body: unknown, who: string, extra: { params?: Record<string, string>; idempotencyKey?: string } = {}) =>
  call(handler, { path, body, cookie: who, ...extra });

async function ok<T = any>(p: Promise<{ status: number; body: T }>, status = 201): Promise<T> {
  const r = await p;
  expect(r.status, JSON.stringify(r.body)).toBe(status);
  return r.body;
}

async function item(name: string): Promise<string> {
  const sku = `${name.slice(0, 3).toUpperCase()}-${tag().toUpperCase()}`;
  await ok(post(itemCreate, "/api/items", { sku, name, category: "spice", unit: "g", trackLots: false }, cookie.manager));
  return sku;
}

async function receive(kitchen: string, sku: string, grams: string) {
  await ok(post(moveRoute, "/api/movements", { kind: "receipt", kitchen, item: sku, quantity: grams, unit: "g", lot: { code: `L${tag()}`, unitCost: "0.01" } }, cookie.manager));
}

async function levels(kitchen: string, sku: string, reorderPoint: string, parLevel: string | null) {
  await ok(call(levelsRoute, { method: "PUT", path: "/api/stock-levels", body: { kitchen, item: sku, reorderPoint, parLevel }, cookie: cookie.manager }), 200);
}

async function supplier(companyId: string, name: string, leadTimeDays: number, opts: { minOrderValue?: string; active?: boolean } = {}): Promise<string> {
  const [row] = await db()("suppliers")
    .insert({
      company_id: companyId, name: `${name} ${tag()}`, contact_name: "Wren Halloway", order_email: uniqueEmail("orders"), lead_time_days: leadTimeDays,
      min_order_value: opts.minOrderValue ?? null, active: opts.active ?? true,
    })
    .returning<{ id: string }[]>("id");
  return row!.id;
}

async function offer(companyId: string, supplierId: string, sku: string, packLabel: string, packGrams: string, price: string | null, active = true): Promise<string> {
  const i: { id: string } = await db()("items").where({ company_id: companyId, sku }).first("id");
  const [row] = await db()("supplier_items")
    .insert({
      company_id: companyId, supplier_id: supplierId, item_id: i.id, sku: `SI-${tag()}`.toUpperCase(), pack_label: packLabel,
      pack_quantity: packGrams, pack_unit: "g", pack_size_stock: packGrams, active,
    })
    .returning<{ id: string }[]>("id");
  // an older price and a future one: only the latest effective today or before is current
  if (price !== null) {
    await db()("supplier_item_prices").insert([
      { company_id: companyId, supplier_item_id: row!.id, pack_price: "999.00", effective_from: day(-30) },
      { company_id: companyId, supplier_item_id: row!.id, pack_price: price, effective_from: day(-1) },
      { company_id: companyId, supplier_item_id: row!.id, pack_price: "0.01", effective_from: day(3) },
    ]);
  }
  return row!.id;
}

async function batch(kitchen: string, recipe: string, plannedFor: string, kg: string): Promise<string> {
  const b = await ok(post(batchCreate, "/api/batches", { kitchen, recipe, plannedFor, meatBlock: { quantity: kg, unit: "kg" } }, cookie.manager));
  return b.id as string;
}

/** A purchase order through its endpoints, taken as far as `to`. */
async function order(supplierId: string, kitchen: string, lines: { supplierItem: string; packs: string }[], to: "draft" | "sent", deliverBy?: string) {
  const o = await ok(post(orderCreate, "/api/purchase-orders", { supplier: supplierId, kitchen, lines, ...(deliverBy ? { deliverBy } : {}) }, cookie.buyer));
  if (to === "sent") {
    await ok(post(approveRoute, `/api/purchase-orders/${o.id}/approve`, undefined, cookie.buyer, { params: { id: o.id } }), 200);
    await ok(post(sendRoute, `/api/purchase-orders/${o.id}/send`, undefined, cookie.buyer, { params: { id: o.id } }), 200);
  }
  return o as { id: string; number: string };
}

const get = (who: string, query = "") => call(suggestionsRoute, { path: `/api/reorder-suggestions${query}`, cookie: who });
const draftOrders = (who: string, body: unknown, idempotencyKey?: string) => post(ordersRoute, "/api/reorder-suggestions/orders", body, who, { idempotencyKey });
const orderCount = async (companyId: string) => Number((await db()("purchase_orders").where({ company_id: companyId }).count<{ n: string }[]>("* as n"))[0]!.n);

let paprika: string;
let mace: string;
let sage: string;
let salt: string;
let alder: string; // lead 5 days, minimum order 150.00
let birch: string; // lead 10 days, no minimum
let dunmore: string; // lead 3 days, sells mace without a price
let alderBag: string; // paprika, 1 kg bag at 12.00
let birchSack: string; // paprika, 5 kg sack at 55.00
let alderMace: string; // mace, 1 kg bag at 30.00 (0.030 per g)
let birchTub: string; // mace, 100 g tub at 3.50 (0.035 per g)
let dunmoreMace: string; // mace, 250 g, no price
let draftNumber: string;
let otherOffer: string;

beforeAll(async () => {
  [co, other] = await Promise.all([createCompany({ kitchens: 2 }), createCompany({ kitchens: 1 })]);
  for (const role of ["admin", "manager", "buyer", "kitchen_lead", "accountant"] as Role[]) cookie[role] = await sessionCookieFor(co.users[role].id);
  otherBuyer = await sessionCookieFor(other.users.buyer.id);
  today = (await db().raw<{ rows: { today: string }[] }>("select to_char((now() at time zone time_zone)::date, 'YYYY-MM-DD') as today from companies where id = ?", [co.company.id])).rows[0]!.today;

  [paprika, mace, sage, salt] = [await item("Paprika"), await item("Mace"), await item("Sage"), await item("Salt")];
  await receive(K(0).code, paprika, "2500");
  await receive(K(0).code, mace, "200");
  await receive(K(0).code, salt, "9000");
  await levels(K(0).code, paprika, "3000", "6000");
  await levels(K(0).code, mace, "500", "1000");
  await levels(K(0).code, sage, "100", null);
  await levels(K(0).code, salt, "1000", "5000");
  await levels(K(1).code, paprika, "1000", "2000");

  alder = await supplier(co.company.id, "Alder Spice Co", 5, { minOrderValue: "150.00" });
  birch = await supplier(co.company.id, "Birch Provisions", 10);
  dunmore = await supplier(co.company.id, "Dunmore Mill", 3);
  const cedar = await supplier(co.company.id, "Cedar Wholesale", 1, { active: false });
  alderBag = await offer(co.company.id, alder, paprika, "1 kg bag", "1000", "12.00");
  birchSack = await offer(co.company.id, birch, paprika, "5 kg sack", "5000", "55.00");
  alderMace = await offer(co.company.id, alder, mace, "1 kg bag", "1000", "30.00");
  birchTub = await offer(co.company.id, birch, mace, "100 g tub", "100", "3.50");
  dunmoreMace = await offer(co.company.id, dunmore, mace, "250 g pouch", "250", null);
  await offer(co.company.id, birch, mace, "500 g bag, discontinued", "500", "10.00", false); // 0.02 per g, but switched off
  await offer(co.company.id, cedar, mace, "1 kg bag", "1000", "5.00"); // its supplier is switched off
  await offer(co.company.id, alder, salt, "25 kg sack", "25000", "9.00");

  // paprika at 10 g per kg of meat block
  const recipe = await ok(post(recipeCreate, "/api/recipes", {
    code: `RO${tag().slice(0, 8).toUpperCase()}`, name: "Paprika sausage", productClass: "comminuted", storage: "keep_refrigerated",
    meatBlock: [{ name: "Pork shoulder", percent: "100" }], lines: [{ item: paprika, rate: "10", unit: "g/kg" }],
  }, cookie.manager));
  const a = await batch(K(0).code, recipe.code, day(1), "40"); // 400 g, reserved below
  await ok(post(reserveRoute, `/api/batches/${a}/reserve`, undefined, cookie.manager, { params: { id: a } }), 200);
  await batch(K(0).code, recipe.code, day(5), "30"); // 300 g on Alder's last day (inclusive)
  await batch(K(0).code, recipe.code, day(6), "50"); // 500 g: after Alder's 5 days, within Birch's 10
  const d = await batch(K(0).code, recipe.code, day(3), "20"); // 200 g, cancelled: never counted
  await ok(post(cancelBatchRoute, `/api/batches/${d}/cancel`, undefined, cookie.manager, { params: { id: d } }), 200);
  await batch(K(1).code, recipe.code, day(2), "100"); // 1000 g in the other kitchen

  // orders of paprika: 1 bag due on day 3 (both horizons); 3 bags due on day 7 of which 1 arrived
  // (Birch's horizon only); a sack sent today without a date: due today + Birch's 10 days; a
  // draft (pending, not counted); and a sent order to the other kitchen (not this kitchen's)
  await order(alder, K(0).code, [{ supplierItem: alderBag, packs: "1" }], "sent", day(3));
  const partly = await order(alder, K(0).code, [{ supplierItem: alderBag, packs: "3" }], "sent", day(7));
  // deliveries are not built yet: a partial receipt is what they will write on the line and order
  await db()("purchase_order_lines").where({ order_id: partly.id }).update({ received_stock: "1000" });
  await db()("purchase_orders").where({ id: partly.id }).update({ status: "partly_received" });
  await order(birch, K(0).code, [{ supplierItem: birchSack, packs: "1" }], "sent");
  draftNumber = (await order(alder, K(0).code, [{ supplierItem: alderBag, packs: "2" }], "draft")).number;
  await order(alder, K(1).code, [{ supplierItem: alderBag, packs: "5" }], "sent", day(1));

  // the other company: a supplier item of its own
  const os = await supplier(other.company.id, "Elsewhere Foods", 2);
  await db()("items").insert({ company_id: other.company.id, sku: "ELSE-1", name: "Else", category: "spice", stock_unit: "g" });
  otherOffer = await offer(other.company.id, os, "ELSE-1", "1 kg bag", "1000", "10.00");
});

type Line = {
  item: { sku: string };
  onHand: string; reserved: string; projectedToday: string; minimumRaise: number;
  chosen: Record<string, any>; alternatives: Record<string, any>[]; pendingOrders: { number: string; status: string; quantity: string }[];
};
const linesOf = (k: { suppliers: { lines: Line[] }[] }) => k.suppliers.flatMap((g) => g.lines);

describe("GET /api/reorder-suggestions", () => {
  it("projects with each supplier's lead time: planned unreserved batches and open orders within it, and not beyond", async () => {
    const body = await ok(get(cookie.buyer, `?kitchen=${K(0).code}`), 200);
    expect(body.today).toBe(today);
    expect(body.kitchens).toHaveLength(1);
    const k = body.kitchens[0];
    expect(k.kitchen.id).toBe(K(0).id);
    expect(k.watched).toBe(4); // paprika, mace, sage, salt have a reorder point
    const p = linesOf(k).find((l) => l.item.sku === paprika)!;
    // the reserved batch is in "reserved" (400 g), not again in planned
    expect(p).toMatchObject({ onHand: "2500", reserved: "400" });
    const [alderFigures, birchFigures] = [p.chosen, ...p.alternatives].sort((a, b) => a.supplier.leadTimeDays - b.supplier.leadTimeDays) as [Record<string, any>, Record<string, any>];
    // Alder, 5 days (horizon day 5, inclusive): planned 300 (day 5; not day 6's 500, not the
    // cancelled 200, not the other kitchen's 1000); on order 1000 (day 3; not day 7's, not the sack
    // due day 10, not the draft, not the other kitchen's). 2500 - 400 - 300 + 1000 = 2800 < 3000
    expect(alderFigures).toMatchObject({
      supplierItemId: alderBag, horizon: day(5), plannedWithinLeadTime: "300", openOrdersWithinLeadTime: "1000", projected: "2800", suggested: true,
      shortfall: "3200", // 6000 - 2800
    });
    // Birch, 10 days: planned 300 + 500; on order 1000 + (3000 - 1000 received) + the sack's 5000,
    // sent today without a date and so due today + 10 days. 2500 - 400 - 800 + 8000 = 9300: enough
    expect(birchFigures).toMatchObject({
      supplierItemId: birchSack, horizon: day(10), plannedWithinLeadTime: "800", openOrdersWithinLeadTime: "8000", projected: "9300", suggested: false, packs: 0,
    });
    // Birch is cheaper per gram (55.00 / 5000 g = 0.011 against 12.00 / 1000 g = 0.012), but only
    // Alder's projection falls below the reorder point, so Alder is chosen
    expect(birchFigures.unitPrice).toBe("0.011");
    expect(alderFigures.unitPrice).toBe("0.012");
    expect(p.chosen.supplier.id).toBe(alder);
    // the draft is listed, not counted
    expect(p.pendingOrders).toEqual([expect.objectContaining({ number: draftNumber, status: "draft", quantity: "2000" })]);
    expect(p.chosen.reasons.join(" ")).toMatch(/below the reorder point 3000/);
  });

  it("preselects the cheapest price per stock unit, not per pack; switched-off items and suppliers are not offered; unpriced come last", async () => {
    const k = (await ok(get(cookie.buyer, `?kitchen=${K(0).id}`), 200)).kitchens[0];
    const m = linesOf(k).find((l) => l.item.sku === mace)!;
    // 200 g on hand, reorder point 500: every supplier suggests (no batches, no orders)
    // Alder 30.00 / 1000 g = 0.03 per g; Birch 3.50 / 100 g = 0.035 per g (cheaper per pack)
    expect(m.chosen).toMatchObject({ supplierItemId: alderMace, unitPrice: "0.03", packPrice: "30.00", shortfall: "800", packs: 1, quantity: "1000", value: "30.00" });
    expect(m.alternatives.map((a) => a.supplierItemId)).toEqual([birchTub, dunmoreMace]);
    // Birch: ceil(800 / 100) = 8 tubs, 8 x 3.50 = 28.00
    expect(m.alternatives[0]).toMatchObject({ unitPrice: "0.035", packs: 8, quantity: "800", value: "28.00", suggested: true });
    expect(m.alternatives[1]).toMatchObject({ unitPrice: null, packPrice: null, value: null, packs: 4 }); // ceil(800 / 250)
  });

  it("raises an order under the supplier's minimum by whole packs of its line with the largest shortfall value", async () => {
    const k = (await ok(get(cookie.buyer, `?kitchen=${K(0).code}`), 200)).kitchens[0];
    const g = k.suppliers.find((s: { supplier: { id: string } }) => s.supplier.id === alder)!;
    expect(g.supplier).toMatchObject({ leadTimeDays: 5, minOrderValue: "150.00" });
    expect(g.deliverBy).toBe(day(5));
    // paprika ceil(3200 / 1000) = 4 bags (48.00) and mace 1 bag (30.00): 78.00 < 150.00. Shortfall
    // values: paprika 3200 x 0.012 = 38.4, mace 800 x 0.03 = 24, so paprika takes
    // ceil((150 - 78) / 12) = 6 more bags: 10 bags, 120.00; the order is 150.00
    const p = g.lines.find((l: Line) => l.item.sku === paprika)!;
    expect(p.chosen).toMatchObject({ packs: 10, quantity: "10000", value: "120.00" });
    expect(p.minimumRaise).toBe(6);
    expect(g.lines.find((l: Line) => l.item.sku === mace)!.chosen.packs).toBe(1);
    expect(g).toMatchObject({ value: "150.00", belowMinimum: false });
    expect(g.reasons.join(" ")).toMatch(/minimum order of 150/);
    // salt (9000 g, reorder point 1000) is not suggested; sage has no supplier
    expect(linesOf(k).map((l) => l.item.sku).sort()).toEqual([mace, paprika].sort());
    expect(k.unsourced.map((u: Line) => u.item.sku)).toEqual([sage]);
    expect(k.unsourced[0]).toMatchObject({ projectedToday: "0", reorderPoint: "100", parLevel: null });
  });

  it("is scoped to the kitchen asked for, or every kitchen in reach; other companies' kitchens are 404", async () => {
    const k1 = (await ok(get(cookie.buyer, `?kitchen=${K(1).code}`), 200)).kitchens;
    expect(k1.map((k: { kitchen: { id: string } }) => k.kitchen.id)).toEqual([K(1).id]);
    // K2: nothing on hand, 1000 g planned on day 2, 5 bags due day 1: 0 - 0 - 1000 + 5000 = 4000
    expect(linesOf(k1[0])).toEqual([]);
    const all = (await ok(get(cookie.accountant), 200)).kitchens.map((k: { kitchen: { id: string } }) => k.kitchen.id).sort();
    expect(all).toEqual([K(0).id, K(1).id].sort());
    expect((await get(otherBuyer, `?kitchen=${K(0).id}`)).status).toBe(404);
    expect((await get(otherBuyer, `?kitchen=${K(0).code}`)).status).toBe(404);
    expect((await get(cookie.buyer, "?kitchen=NO-SUCH")).status).toBe(404);
    expect((await ok(get(otherBuyer), 200)).kitchens.map((k: { kitchen: { id: string } }) => k.kitchen.id)).toEqual([other.kitchens[0]!.id]);
  });

  it("needs purchasing.read: a kitchen lead may not see it", async () => {
    expect((await get(cookie.kitchen_lead, `?kitchen=${K(0).code}`)).status).toBe(403);
    expect((await get("", `?kitchen=${K(0).code}`)).status).toBe(401);
  });
});

describe("POST /api/reorder-suggestions/orders", () => {
  it("makes one draft per supplier with the chosen lines, and the same Idempotency-Key makes nothing new", async () => {
    const before = await orderCount(co.company.id);
    const key = randomUUID();
    const body = {
      kitchen: K(0).code,
      lines: [
        { supplierItemId: alderBag, packs: "10" }, // paprika from Alder, as suggested
        { supplierItemId: birchTub, packs: "8" }, // mace from Birch instead of Alder
      ],
    };
    const r = await draftOrders(cookie.buyer, body, key);
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    expect(r.body.orders).toHaveLength(2);
    const [a, b] = r.body.orders;
    expect(a).toMatchObject({
      status: "draft", supplier: { id: alder }, kitchen: { id: K(0).id }, deliverBy: day(5), total: "120.00", // 10 x 12.00
      lines: [{ supplierItemId: alderBag, packs: "10", orderedStock: "10000", packPrice: "12.00", lineTotal: "120.00" }],
    });
    expect(b).toMatchObject({
      status: "draft", supplier: { id: birch }, kitchen: { id: K(0).id }, deliverBy: day(10), total: "28.00", // 8 x 3.50
      lines: [{ supplierItemId: birchTub, packs: "8", orderedStock: "800", packPrice: "3.50", lineTotal: "28.00" }],
    });
    expect(await orderCount(co.company.id)).toBe(before + 2);

    const again = await draftOrders(cookie.buyer, body, key);
    expect(again.status).toBe(201);
    expect(again.body).toEqual(r.body);
    expect(await orderCount(co.company.id)).toBe(before + 2);

    // the drafts now show as pending against their items (still not counted: not sent)
    const k = (await ok(get(cookie.buyer, `?kitchen=${K(0).code}`), 200)).kitchens[0];
    const p = linesOf(k).find((l) => l.item.sku === paprika)!;
    expect(p.pendingOrders.map((o) => o.number)).toContain(a.number);
    expect(p.chosen.projected).toBe("2800");
  });

  it("checks every line before making any draft, naming the request's own line", async () => {
    const before = await orderCount(co.company.id);
    const r = await draftOrders(cookie.buyer, {
      kitchen: K(0).code,
      lines: [
        { supplierItemId: alderBag, packs: "2" },
        { supplierItemId: dunmoreMace, packs: "4" }, // no current price, none sent
        { supplierItemId: otherOffer, packs: "1" }, // another company's
        { supplierItemId: alderBag, packs: "1" }, // twice
        { supplierItemId: birchTub, packs: "2.5" }, // not whole packs
      ],
    });
    expect(r.status).toBe(422);
    expect(Object.keys(r.body.error.details.fields).sort()).toEqual(["lines.4.packs"]);
    const r2 = await draftOrders(cookie.buyer, {
      kitchen: K(0).code,
      lines: [{ supplierItemId: alderBag, packs: "2" }, { supplierItemId: dunmoreMace, packs: "4" }, { supplierItemId: otherOffer, packs: "1" }, { supplierItemId: alderBag, packs: "1" }],
    });
    expect(r2.status).toBe(422);
    expect(r2.body.error.details.fields).toEqual({
      "lines.1.packPrice": [expect.stringMatching(/no current price/)],
      "lines.2.supplierItemId": ["No supplier item of your company has this id."],
      "lines.3.supplierItemId": [expect.stringMatching(/Already on line 1/)],
    });
    expect(await orderCount(co.company.id)).toBe(before);
    // with the pack price sent, the unpriced item can be ordered
    const r3 = await draftOrders(cookie.buyer, { kitchen: K(0).code, lines: [{ supplierItemId: dunmoreMace, packs: "4", packPrice: "9.75" }] });
    expect(r3.status, JSON.stringify(r3.body)).toBe(201);
    expect(r3.body.orders[0]).toMatchObject({ supplier: { id: dunmore }, deliverBy: day(3), total: "39.00" }); // 4 x 9.75
  });

  it("needs purchasing.manage, and a kitchen of the user's company", async () => {
    const body = { kitchen: K(0).code, lines: [{ supplierItemId: alderBag, packs: "1" }] };
    expect((await draftOrders(cookie.accountant, body)).status).toBe(403);
    expect((await draftOrders(cookie.kitchen_lead, body)).status).toBe(403);
    const before = await orderCount(co.company.id);
    const foreign = await draftOrders(otherBuyer, { kitchen: K(0).id, lines: [{ supplierItemId: otherOffer, packs: "1" }] });
    expect(foreign.status).toBe(422);
    expect(Object.keys(foreign.body.error.details.fields)).toEqual(["kitchen"]);
    const theirs = await draftOrders(otherBuyer, { kitchen: other.kitchens[0]!.code, lines: [{ supplierItemId: alderBag, packs: "1" }] });
    expect(theirs.status).toBe(422);
    expect(theirs.body.error.details.fields).toEqual({ "lines.0.supplierItemId": ["No supplier item of your company has this id."] });
    expect(await orderCount(co.company.id)).toBe(before);
    const manager = await draftOrders(cookie.manager, body);
    expect(manager.status, JSON.stringify(manager.body)).toBe(201);
  });
});
