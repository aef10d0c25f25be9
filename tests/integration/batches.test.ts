// Batch plans, shortages and reservations through the route handlers, against the real PostgreSQL.
// Check values and sources:
// - 2.5 g/kg of a 6.25 % nitrite cure = 156.25 ppm, the 9 CFR 424.21(c) comminuted maximum;
//   1.92 g/kg = 120 ppm, the FSIS keep-refrigerated minimum (trade-facts §2-§3 [calc]/[sec]).
// - rounding cure to the 0.1 g scale toward compliance: down under a maximum, up over a minimum,
//   verdict on the rounded amount (trade-facts §2).
// - 32/35 mm hog hank: 45 kg of filling per 91.44 m (trade-facts §4 [practice]).
// - FEFO: the earliest expiry first (WHO GDP Annex 5, trade-facts §5); lots expiring on or before
//   the production day are skipped (the rule).
import { randomUUID } from "node:crypto";
import fc from "fast-check";
import Papa from "papaparse";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as cancelRoute } from "../../app/api/batches/[id]/cancel/route";
import { POST as produceRoute } from "../../app/api/batches/[id]/produce/route";
import { POST as releaseHoldRoute } from "../../app/api/batches/[id]/release-hold/route";
import { GET as traceBatchRoute } from "../../app/api/trace/batches/[id]/route";
import { GET as traceLotRoute } from "../../app/api/trace/lots/[id]/route";
import { POST as releaseRoute } from "../../app/api/batches/[id]/release/route";
import { POST as reserveRoute } from "../../app/api/batches/[id]/reserve/route";
import { GET as batchGet, PATCH as batchPatch } from "../../app/api/batches/[id]/route";
import { POST as reserveAllRoute } from "../../app/api/batches/reserve-all/route";
import { GET as batchesList, POST as batchCreate } from "../../app/api/batches/route";
import { PUT as houseLimitsRoute } from "../../app/api/house-limits/route";
import { POST as itemCreate } from "../../app/api/items/route";
import { POST as moveRoute } from "../../app/api/movements/route";
import { POST as recipeCreate } from "../../app/api/recipes/route";
import { GET as stockRoute } from "../../app/api/stock/route";
import { PUT as levelsRoute } from "../../app/api/stock-levels/route";
import { db } from "../../db/client";
import { createCompany, tag, type TestCompany } from "../support/factory";
import { buildRequest, call } from "../support/http";
import { sessionCookieFor } from "../support/sessions";
import { ledgerMismatches } from "../support/stock";

let co: TestCompany;
let other: TestCompany;
const cookie: Record<string, string> = {};
const sku = (p: string) => `${p}-${tag().toUpperCase()}`;
const K = (i: number) => co.kitchens[i]!.code;
const day = (n: number) => new Date(Date.now() + n * 86400_000).toISOString().slice(0, 10);

const post = (handler: Parameters<typeof call>[0], path: string, body: unknown, who = "kitchen_lead", params?: Record<string, string>) =>
  call(handler, { path, body, cookie: cookie[who], params });
const plan = (body: Record<string, unknown>, who = "kitchen_lead") => post(batchCreate, "/api/batches", body, who);
const reserve = (id: string, who = "kitchen_lead") => call(reserveRoute, { path: `/api/batches/${id}/reserve`, params: { id }, cookie: cookie[who], method: "POST" });
const release = (id: string, who = "kitchen_lead") => call(releaseRoute, { path: `/api/batches/${id}/release`, params: { id }, cookie: cookie[who], method: "POST" });
const getBatch = (id: string, who = "kitchen_lead") => call(batchGet, { path: `/api/batches/${id}`, params: { id }, cookie: cookie[who] });

async function item(body: Record<string, unknown>) {
  const res = await post(itemCreate, "/api/items", { sku: sku("I"), ...body }, "admin");
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as { id: string; sku: string };
}
async function receive(itemSku: string, quantity: string, unit: string, kitchen: string, lot: Record<string, unknown> = {}) {
  const res = await post(moveRoute, "/api/movements", { kind: "receipt", kitchen, item: itemSku, quantity, unit, lot: { unitCost: "0.01", ...lot } }, "admin");
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.movements[0].lot.id as string;
}
async function recipe(lines: Record<string, unknown>[], over: Record<string, unknown> = {}) {
  const res = await post(recipeCreate, "/api/recipes", {
    code: `R${tag().slice(0, 8).toUpperCase()}`, name: "Farmhouse", productClass: "comminuted", storage: "keep_refrigerated",
    meatBlock: [{ name: "Lean pork", percent: "70" }, { name: "Back fat", percent: "30" }], lines, ...over,
  }, "manager");
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.code as string;
}
const cureItem = () => item({ name: `Pink cure ${tag()}`, category: "cure", unit: "g", nitriteFraction: "0.0625", nitrateFraction: "0" });
const lotDate = (n: number) => ({ code: `L${tag()}`, date: day(n), dateKind: "best_before" });
const reservedOf = async (lotId: string, kitchenId = co.kitchens[0]!.id) =>
  (await db()("stock_balances").where({ kitchen_id: kitchenId, lot_id: lotId }).first("reserved"))?.reserved as string;

let salt: { id: string; sku: string };
let hog: { id: string; sku: string };

beforeAll(async () => {
  co = await createCompany({ kitchens: 3 });
  other = await createCompany();
  for (const role of ["admin", "manager", "buyer", "kitchen_lead", "accountant"] as const) cookie[role] = await sessionCookieFor(co.users[role].id);
  cookie.other = await sessionCookieFor(other.users.admin.id);
  salt = await item({ name: "Fine salt", category: "ingredient", unit: "g", trackLots: false });
  hog = await item({ name: "Hog 32/35", category: "casing", unit: "pc", casingKind: "natural_hog", calibreMinMm: "32", calibreMaxMm: "35", putUp: "hank" });
});

describe("a batch plan", () => {
  it("turns 10 kg of meat into the exact bill of materials, casing and the cure verdict", async () => {
    const cure = await cureItem();
    const code = await recipe([{ item: salt.sku, rate: "18", unit: "g/kg" }, { item: cure.sku, rate: "2.5", unit: "g/kg" }], {
      casing: { item: hog.sku, calibreMinMm: "32", calibreMaxMm: "35" },
    });
    const res = await plan({ kitchen: K(0), recipe: code, plannedFor: day(3), meatBlock: { quantity: "10", unit: "kg" } });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const b = res.body;
    expect(b).toMatchObject({ status: "planned", plannedFor: day(3), meatBlockG: "10000", recipe: { code, version: 1 }, kitchen: { code: K(0) } });
    expect(b.lines.map((l: { item: { sku: string }; quantity: string; role: string }) => [l.item.sku, l.role, l.quantity])).toEqual([
      [salt.sku, "ingredient", "180"],
      [cure.sku, "cure", "25"],
      // filling 10,000 + 180 + 25 = 10,205 g; 10.205 / 45 kg per hank
      [hog.sku, "casing", "0.226777777778"],
    ]);
    expect(b.casing).toMatchObject({ itemId: hog.id, putUpsToOpen: 1, metres: "20.7366" }); // 10.205/45 x 91.44 = 20.73656 m, 4 places half-even
    expect(b.fillingG).toBe("10205");
    expect(b.cure.nitritePpm).toBe("156.2500");
    expect(b.cure.blocked).toBe(false);
    expect(b.caution).toMatch(/toxic/i);
  });

  it("rounds cure DOWN to the 0.1 g scale under the maximum: 9.99 kg x 2.5 g/kg = 24.975 g -> 24.9 g", async () => {
    const cure = await cureItem();
    const code = await recipe([{ item: cure.sku, rate: "2.5", unit: "g/kg" }]);
    const res = await plan({ kitchen: K(0), recipe: code, plannedFor: day(2), meatBlock: { quantity: "9.99", unit: "kg" } });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const line = res.body.lines[0];
    expect(line).toMatchObject({ quantity: "24.9", exactQuantity: "24.975", rounding: "down" });
    // 24.9 x 0.0625 x 1e6 / 9990 = 155.7808 ppm: within 156.25 (25.0 g would be 156.4064, over)
    expect(res.body.cure.nitritePpm).toBe("155.7808");
  });

  it("rounds cure UP over the 120 ppm keep-refrigerated minimum: 9.99 kg x 1.92 g/kg = 19.1808 g -> 19.2 g", async () => {
    const cure = await cureItem();
    const code = await recipe([{ item: cure.sku, rate: "1.92", unit: "g/kg" }]);
    const res = await plan({ kitchen: K(0), recipe: code, plannedFor: day(2), meatBlock: { quantity: "9.99", unit: "kg" } });
    expect(res.body.lines[0]).toMatchObject({ quantity: "19.2", rounding: "up" });
    // 19.2 x 0.0625 x 1e6 / 9990 = 120.1201 ppm, at or above the 120 ppm minimum (19.1 g: 119.4995)
    expect(res.body.cure.nitritePpm).toBe("120.1201");
    const min = res.body.cure.checks.find((c: { kind: string }) => c.kind === "min");
    expect(min).toMatchObject({ limitPpm: "120", within: true });
  });

  it("plans from links: 100 links of 120 g = 12 kg of filling, the meat block follows", async () => {
    const code = await recipe([{ item: salt.sku, rate: "20", unit: "g/kg" }]);
    const res = await plan({ kitchen: K(0), recipe: code, plannedFor: day(2), links: { count: 100, weight: { quantity: "120", unit: "g" } } });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    // filling per kg of meat = 1,020 g, so meat = 12,000 / 1.02 g
    expect(Number(res.body.meatBlockG)).toBeCloseTo(12000 / 1.02, 6);
    expect(Number(res.body.fillingG)).toBeCloseTo(12000, 6);
    expect(res.body.links).toEqual({ count: 100, weightG: "120" });
  });

  it("cannot be saved over a statutory maximum (a recipe written while no table applied)", async () => {
    const cure = await cureItem();
    await db()("companies").where({ id: co.company.id }).update({ regulatory_table: "none" });
    let code: string;
    try {
      code = await recipe([{ item: cure.sku, rate: "3", unit: "g/kg" }]);
    } finally {
      await db()("companies").where({ id: co.company.id }).update({ regulatory_table: "us" });
    }
    const res = await plan({ kitchen: K(0), recipe: code, plannedFor: day(2), meatBlock: { quantity: "10", unit: "kg" } });
    expect(res.status).toBe(422);
    expect(res.body.error.details.fields.recipe[0]).toMatch(/over the 156\.25 ppm maximum/);
    expect(await db()("batches").where({ company_id: co.company.id, recipe_id: db()("recipes").select("id").where({ code }) })).toHaveLength(0);
  });

  it.each([
    [{ meatBlock: { quantity: "0", unit: "kg" } }, "meatBlock.quantity"],
    [{ meatBlock: { quantity: "10", unit: "m" } }, "meatBlock.unit"],
    [{ meatBlock: { quantity: "-1", unit: "kg" } }, "meatBlock.quantity"],
    [{ plannedFor: day(-2) }, "plannedFor"],
    [{ casing: "__salt__" }, "casing"],
  ])("refuses bad input %j naming the field", async (over, field) => {
    const code = await recipe([{ item: salt.sku, rate: "20", unit: "g/kg" }], { casing: { calibreMinMm: "32", calibreMaxMm: "35" } });
    const body = { kitchen: K(0), recipe: code, plannedFor: day(2), meatBlock: { quantity: "10", unit: "kg" }, ...over };
    if ("casing" in body) body.casing = salt.sku;
    const res = await plan(body);
    expect(res.status).toBe(422);
    expect(Object.keys(res.body.error.details.fields)).toEqual([field]);
  });

  it("refuses a casing outside the recipe's calibre range", async () => {
    const sheep = await item({ name: "Sheep 22/24", category: "casing", unit: "pc", casingKind: "natural_sheep", calibreMinMm: "22", calibreMaxMm: "24", putUp: "hank" });
    const code = await recipe([{ item: salt.sku, rate: "20", unit: "g/kg" }], { casing: { calibreMinMm: "32", calibreMaxMm: "35" } });
    const res = await plan({ kitchen: K(0), recipe: code, plannedFor: day(2), meatBlock: { quantity: "10", unit: "kg" }, casing: sheep.sku });
    expect(res.status).toBe(422);
    expect(res.body.error.details.fields.casing[0]).toMatch(/outside the recipe's calibre range 32-35 mm/);
  });
});

describe("shortages and reservations", () => {
  it("shows a shortage with a transfer suggestion from a kitchen with room above its par, and buying the rest", async () => {
    const cure = await cureItem();
    await receive(cure.sku, "10", "g", K(0), lotDate(60));
    await receive(cure.sku, "20", "g", K(1), lotDate(60)); // 20 g, par 15: 5 g to spare
    const level = await call(levelsRoute, { method: "PUT", path: "/api/stock-levels", cookie: cookie.manager, body: { kitchen: K(1), item: cure.sku, parLevel: "15", reorderPoint: null, unit: "g" } });
    expect(level.status, JSON.stringify(level.body)).toBe(200);
    const code = await recipe([{ item: cure.sku, rate: "2", unit: "g/kg" }]);
    const res = await plan({ kitchen: K(0), recipe: code, plannedFor: day(4), meatBlock: { quantity: "10", unit: "kg" } });
    const line = res.body.lines[0];
    expect(line).toMatchObject({ quantity: "20", available: "10", short: "10" });
    expect(line.suggestions).toEqual([
      { kind: "transfer", kitchen: { id: co.kitchens[1]!.id, code: K(1) }, quantity: "5" },
      { kind: "buy", quantity: "5" },
    ]);
    expect(res.body.shortLines).toBe(1);
    const refused = await reserve(res.body.id);
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe("SHORTAGE");
    expect(refused.body.error.details.lines).toEqual([{ position: 1, sku: cure.sku, needed: "20", available: "10", unit: "g" }]);
    expect(await db()("reservations").where({ batch_id: res.body.id })).toHaveLength(0);
  });

  it("counts batches planned ahead in the same kitchen first, so two plans that do not fit together show it", async () => {
    const cure = await cureItem();
    await receive(cure.sku, "30", "g", K(0), lotDate(60));
    const code = await recipe([{ item: cure.sku, rate: "2", unit: "g/kg" }]);
    const first = await plan({ kitchen: K(0), recipe: code, plannedFor: day(3), meatBlock: { quantity: "10", unit: "kg" } });
    const second = await plan({ kitchen: K(0), recipe: code, plannedFor: day(4), meatBlock: { quantity: "10", unit: "kg" } });
    expect(first.body.lines[0]).toMatchObject({ available: "30", plannedBefore: "0", short: null });
    expect(second.body.lines[0]).toMatchObject({ available: "30", plannedBefore: "20", short: "10" });
    // once the first is reserved it has taken its stock: the second sees what is left
    await reserve(first.body.id);
    expect((await getBatch(second.body.id)).body.lines[0]).toMatchObject({ available: "10", plannedBefore: "0", short: "10" });
  });

  it("reserves FEFO, skipping a lot that expires on the production day; available drops at once; release gives it back", async () => {
    const cure = await cureItem();
    const onTheDay = await receive(cure.sku, "50", "g", K(0), lotDate(5));
    const later = await receive(cure.sku, "10", "g", K(0), lotDate(40));
    const sooner = await receive(cure.sku, "15", "g", K(0), lotDate(20));
    const code = await recipe([{ item: cure.sku, rate: "2", unit: "g/kg" }]);
    const planned = await plan({ kitchen: K(0), recipe: code, plannedFor: day(5), meatBlock: { quantity: "10", unit: "kg" } });
    expect(planned.body.lines[0]).toMatchObject({ quantity: "20", available: "25", short: null });
    const res = await reserve(planned.body.id);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.status).toBe("reserved");
    expect(res.body.lines[0].lots.map((l: { lotId: string; quantity: string }) => [l.lotId, l.quantity])).toEqual([[sooner, "15"], [later, "5"]]);
    expect([await reservedOf(onTheDay), await reservedOf(sooner), await reservedOf(later)].map(Number)).toEqual([0, 15, 5]);
    const stock = await call(stockRoute, { path: `/api/stock?kitchen=${K(0)}`, cookie: cookie.kitchen_lead });
    const row = stock.body.rows.find((r: { sku: string }) => r.sku === cure.sku);
    expect(row).toMatchObject({ onHand: "75", reserved: "20", available: "55" });
    // reserving again holds nothing more
    expect((await reserve(planned.body.id)).body.lines[0].reserved).toBe("20");
    const released = await release(planned.body.id);
    expect(released.body).toMatchObject({ status: "planned" });
    expect(released.body.lines[0].reserved).toBe("0");
    expect(Number(await reservedOf(sooner))).toBe(0);
    expect(await ledgerMismatches(co.company.id)).toEqual([]);
  });

  it("two leads reserving the last cure lot at once: one wins, the other sees a shortage, nothing negative", async () => {
    const cure = await cureItem();
    const lot = await receive(cure.sku, "30", "g", K(0), lotDate(30));
    const code = await recipe([{ item: cure.sku, rate: "2", unit: "g/kg" }]);
    const a = await plan({ kitchen: K(0), recipe: code, plannedFor: day(3), meatBlock: { quantity: "10", unit: "kg" } });
    const b = await plan({ kitchen: K(0), recipe: code, plannedFor: day(3), meatBlock: { quantity: "10", unit: "kg" } }, "manager");
    const [ra, rb] = await Promise.all([reserve(a.body.id), reserve(b.body.id, "manager")]);
    expect([ra.status, rb.status].sort()).toEqual([200, 409]);
    expect(Number(await reservedOf(lot))).toBe(20);
    const bal = await db()("stock_balances").where({ lot_id: lot }).first();
    expect(Number(bal.on_hand) - Number(bal.reserved)).toBe(10);
  });

  it("changing a plan releases its reservation and works the lines out again", async () => {
    const cure = await cureItem();
    const lot = await receive(cure.sku, "100", "g", K(0), lotDate(30));
    const code = await recipe([{ item: cure.sku, rate: "2", unit: "g/kg" }]);
    const planned = await plan({ kitchen: K(0), recipe: code, plannedFor: day(3), meatBlock: { quantity: "10", unit: "kg" } });
    await reserve(planned.body.id);
    expect(Number(await reservedOf(lot))).toBe(20);
    const changed = await call(batchPatch, {
      method: "PATCH", path: `/api/batches/${planned.body.id}`, params: { id: planned.body.id }, cookie: cookie.kitchen_lead,
      body: { plannedFor: day(4), meatBlock: { quantity: "15", unit: "kg" } },
    });
    expect(changed.status, JSON.stringify(changed.body)).toBe(200);
    expect(changed.body).toMatchObject({ status: "planned", plannedFor: day(4), meatBlockG: "15000" });
    expect(changed.body.lines[0]).toMatchObject({ quantity: "30", reserved: "0" });
    expect(Number(await reservedOf(lot))).toBe(0);
    // only the day: the size stays
    const moved = await call(batchPatch, { method: "PATCH", path: `/api/batches/${planned.body.id}`, params: { id: planned.body.id }, cookie: cookie.kitchen_lead, body: { plannedFor: day(5) } });
    expect(moved.body).toMatchObject({ plannedFor: day(5), meatBlockG: "15000" });
    const past = await call(batchPatch, { method: "PATCH", path: `/api/batches/${planned.body.id}`, params: { id: planned.body.id }, cookie: cookie.kitchen_lead, body: { plannedFor: day(-3) } });
    expect(Object.keys(past.body.error.details.fields)).toEqual(["plannedFor"]);
    expect(await ledgerMismatches(co.company.id)).toEqual([]);
  });

  it("cancelling releases; reserve-all reserves each planned batch of the week all or nothing", async () => {
    const cure = await cureItem();
    await receive(cure.sku, "30", "g", K(2), lotDate(30));
    const code = await recipe([{ item: cure.sku, rate: "2", unit: "g/kg" }]);
    const one = await plan({ kitchen: K(2), recipe: code, plannedFor: day(6), meatBlock: { quantity: "10", unit: "kg" } }, "manager");
    const two = await plan({ kitchen: K(2), recipe: code, plannedFor: day(7), meatBlock: { quantity: "10", unit: "kg" } }, "manager");
    const all = await post(reserveAllRoute, "/api/batches/reserve-all", { kitchen: K(2), from: day(6), to: day(12) }, "manager");
    expect(all.status, JSON.stringify(all.body)).toBe(200);
    expect(all.body.batches.map((x: { batchId: string; reserved: boolean }) => [x.batchId, x.reserved])).toEqual([[one.body.id, true], [two.body.id, false]]);
    const cancelled = await call(cancelRoute, { path: `/api/batches/${one.body.id}/cancel`, params: { id: one.body.id }, cookie: cookie.manager, method: "POST" });
    expect(cancelled.body.status).toBe("cancelled");
    expect((await reserve(two.body.id, "manager")).status).toBe(200);
    const week = await call(batchesList, { path: `/api/batches?kitchen=${K(2)}&from=${day(6)}&to=${day(12)}`, cookie: cookie.accountant });
    expect(week.body.batches.map((x: { status: string }) => x.status)).toEqual(["cancelled", "reserved"]);
  });
});

describe("FEFO allocation (property, against the database)", () => {
  it("takes lots in expiry order, skips lots dated on or before the day, exhausts each lot before the next", async () => {
    const code = { recipe: "" };
    await fc.assert(
      fc.asyncProperty(
        fc.array(fc.record({ days: fc.option(fc.integer({ min: 1, max: 60 }), { nil: null }), grams: fc.integer({ min: 1, max: 40 }) }), { minLength: 1, maxLength: 6 }),
        fc.integer({ min: 1, max: 12 }),
        async (lots, dayOffset) => {
          const cure = await item({ name: `Spice ${tag()}`, category: "spice", unit: "g", trackLots: true, trackDates: false });
          const ids: { id: string; date: string | null; grams: number }[] = [];
          for (const l of lots) {
            const id = await receive(cure.sku, String(l.grams), "g", K(1), l.days === null ? { code: `U${tag()}` } : { code: `D${tag()}`, date: day(l.days), dateKind: "use_by" });
            ids.push({ id, date: l.days === null ? null : day(l.days), grams: l.grams });
          }
          code.recipe = await recipe([{ item: cure.sku, rate: "1", unit: "g/kg" }]);
          const plannedFor = day(dayOffset);
          const usable = ids.filter((l) => l.date === null || l.date > plannedFor);
          const total = usable.reduce((s, l) => s + l.grams, 0);
          const needKg = Math.max(1, Math.min(total, 50));
          const p = await plan({ kitchen: K(1), recipe: code.recipe, plannedFor, meatBlock: { quantity: String(needKg), unit: "kg" } }, "manager");
          const r = await reserve(p.body.id, "manager");
          if (total < needKg) {
            expect(r.status).toBe(409);
            return;
          }
          expect(r.status).toBe(200);
          // expected order: dated lots by date, then undated; ties by receipt order (received in sequence)
          const order = usable.map((l, i) => ({ ...l, i })).sort((x, y) => (x.date === y.date ? x.i - y.i : x.date === null ? 1 : y.date === null ? -1 : x.date < y.date ? -1 : 1));
          let left = needKg;
          const expected: [string, string][] = [];
          for (const l of order) {
            if (left <= 0) break;
            const take = Math.min(l.grams, left);
            expected.push([l.id, String(take)]);
            left -= take;
          }
          const got = r.body.lines[0].lots.map((l: { lotId: string; quantity: string }) => [l.lotId, l.quantity]).sort();
          expect(got).toEqual(expected.sort());
          await release(p.body.id, "manager");
        },
      ),
      { numRuns: 15 },
    );
  });
});

describe("scope", () => {
  it("a kitchen lead plans only in their own kitchen; a buyer cannot read plans; another company sees nothing", async () => {
    const code = await recipe([{ item: salt.sku, rate: "20", unit: "g/kg" }]);
    const body = { kitchen: K(1), recipe: code, plannedFor: day(2), meatBlock: { quantity: "10", unit: "kg" } };
    expect((await plan(body)).status).toBe(403);
    const mine = await plan({ ...body, kitchen: K(0) });
    expect(mine.status).toBe(201);
    expect((await getBatch(mine.body.id, "buyer")).status).toBe(403);
    expect((await getBatch(mine.body.id, "other")).status).toBe(404);
    expect((await plan({ ...body, kitchen: K(0) }, "other")).status).toBe(404);
  });
});

describe("production, holds and traceability", () => {
  const produce = (id: string, body: Record<string, unknown>, who = "kitchen_lead", key?: string) =>
    call(produceRoute, { path: `/api/batches/${id}/produce`, params: { id }, body, cookie: cookie[who], idempotencyKey: key });

  it("posts use movements from the reserved lots in one go, gives a batch code and the variance; a replay posts nothing more", async () => {
    const cure = await cureItem();
    const early = await receive(cure.sku, "15", "g", K(0), lotDate(20));
    const late = await receive(cure.sku, "50", "g", K(0), lotDate(40));
    await receive(salt.sku, "5", "kg", K(0));
    const code = await recipe([{ item: salt.sku, rate: "18", unit: "g/kg" }, { item: cure.sku, rate: "2", unit: "g/kg" }]);
    const planned = await plan({ kitchen: K(0), recipe: code, plannedFor: day(1), meatBlock: { quantity: "10", unit: "kg" } });
    expect((await reserve(planned.body.id)).status).toBe(200);
    const key = randomUUID();
    // the meat came in at 10.2 kg; the cure weighed was 20.4 g (line 2); salt as planned
    const body = { actualMeatBlock: { quantity: "10.2", unit: "kg" }, lines: [{ position: 2, quantity: "20.4", unit: "g" }] };
    const res = await produce(planned.body.id, body, "kitchen_lead", key);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.status).toBe("produced");
    const p = res.body.production;
    // the recipe's code, the day it was made (the company's today, Europe/London) and a running number
    const madeOn = new Intl.DateTimeFormat("en-CA", { timeZone: "Europe/London" }).format(new Date());
    expect(p.batchCode).toBe(`${code}-${madeOn.slice(2).replace(/-/g, "")}-1`);
    expect(p.actualMeatBlockG).toBe("10200");
    expect(p.lines.map((l: { item: { sku: string }; planned: string; actual: string; variance: string }) => [l.item.sku, l.planned, l.actual, l.variance])).toEqual([
      [salt.sku, "180", "180", "0"],
      [cure.sku, "20", "20.4", "0.4"],
    ]);
    // reserved lots first (15 g of the early lot, 5 g of the late one), the extra 0.4 g FEFO from what is left (the late lot)
    expect(p.lines[1].lots.map((l: { lotId: string; quantity: string }) => [l.lotId, l.quantity]).sort()).toEqual([[early, "15"], [late, "5.4"]].sort());
    // 20.4 g x 0.0625 x 1e6 / 10,200 g = 125 ppm, checked again on the actual weights
    expect(p.cure.nitritePpm).toBe("125.0000");
    expect(p.hold).toBeNull();
    expect(Number(await reservedOf(early))).toBe(0);
    const again = await produce(planned.body.id, body, "kitchen_lead", key);
    expect(again.body.production.batchCode).toBe(p.batchCode);
    // salt, the early lot, the late lot's reserved 5 g and its extra 0.4 g: four movements under one posting
    const uses = await db()("stock_movements").where({ batch_id: planned.body.id });
    expect(uses).toHaveLength(4);
    expect(new Set(uses.map((u: { posting_id: string }) => u.posting_id)).size).toBe(1);
    expect((await produce(planned.body.id, body)).status).toBe(409);
    expect(await ledgerMismatches(co.company.id)).toEqual([]);
  });

  it("puts a batch over the statutory maximum on hold; only a manager releases it, with a reason on record", async () => {
    const cure = await cureItem();
    await receive(cure.sku, "100", "g", K(0), lotDate(30));
    const code = await recipe([{ item: cure.sku, rate: "2.5", unit: "g/kg" }]);
    const planned = await plan({ kitchen: K(0), recipe: code, plannedFor: day(1), meatBlock: { quantity: "10", unit: "kg" } });
    // 30 g weighed instead of 25: 187.5 ppm > 156.25 (9 CFR 424.21(c) comminuted)
    const res = await produce(planned.body.id, { actualMeatBlock: { quantity: "10", unit: "kg" }, lines: [{ position: 1, quantity: "30" }] });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.status).toBe("on_hold");
    expect(res.body.production.cure.nitritePpm).toBe("187.5000");
    expect(res.body.production.hold.reason).toMatch(/187\.5000 ppm is over the 156\.25 ppm maximum.*HACCP plan's corrective action/);
    const byLead = await call(releaseHoldRoute, { path: `/api/batches/${planned.body.id}/release-hold`, params: { id: planned.body.id }, body: { reason: "Reworked" }, cookie: cookie.kitchen_lead });
    expect(byLead.status).toBe(403);
    const noReason = await call(releaseHoldRoute, { path: `/api/batches/${planned.body.id}/release-hold`, params: { id: planned.body.id }, body: { reason: " " }, cookie: cookie.manager });
    expect(noReason.status).toBe(422);
    const released = await call(releaseHoldRoute, {
      path: `/api/batches/${planned.body.id}/release-hold`, params: { id: planned.body.id }, body: { reason: "Diluted into a 12 kg rework batch per HACCP CA-3" }, cookie: cookie.manager,
    });
    expect(released.status, JSON.stringify(released.body)).toBe(200);
    expect(released.body.status).toBe("produced");
    expect(released.body.production.hold).toMatchObject({ releaseReason: "Diluted into a 12 kg rework batch per HACCP CA-3", releasedBy: { id: co.users.manager.id } });
    const audit = await db()("audit_events").where({ subject_id: planned.body.id });
    expect(audit).toMatchObject([{ action: "batch.hold_released", actor_id: co.users.manager.id, reason: "Diluted into a 12 kg rework batch per HACCP CA-3" }]);
    await expect(db()("audit_events").where({ subject_id: planned.body.id }).update({ reason: "x" })).rejects.toThrow(/append-only/);
  });

  it("refuses to use an expired lot by name in production (LOT_EXPIRED), and a line that does not exist", async () => {
    const cure = await cureItem();
    await receive(cure.sku, "100", "g", K(0), lotDate(30));
    const code = await recipe([{ item: cure.sku, rate: "2", unit: "g/kg" }]);
    const planned = await plan({ kitchen: K(0), recipe: code, plannedFor: day(1), meatBlock: { quantity: "10", unit: "kg" } });
    const [expired] = await db()("lots").insert({ company_id: co.company.id, item_id: cure.id, code: `OLD${tag()}`, received_on: day(-90), date: day(-1), date_kind: "use_by", unit_cost: "0.01" }).returning("id");
    await db()("stock_balances").insert({ company_id: co.company.id, kitchen_id: co.kitchens[0]!.id, item_id: cure.id, lot_id: expired.id, on_hand: "0" });
    const res = await produce(planned.body.id, { actualMeatBlock: { quantity: "10", unit: "kg" }, lines: [{ position: 1, lots: [{ lot: expired.id, quantity: "20" }] }] });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe("LOT_EXPIRED");
    expect((await produce(planned.body.id, { actualMeatBlock: { quantity: "10", unit: "kg" }, lines: [{ position: 9, quantity: "1" }] })).body.error.details.fields).toHaveProperty(["lines.0.position"]);
    expect(await db()("stock_movements").where({ batch_id: planned.body.id })).toHaveLength(0);
    expect((await getBatch(planned.body.id)).body.status).toBe("planned");
  });

  it("traces a lot forward to its batches and a batch back to its lots, as JSON and CSV", async () => {
    const cure = await cureItem();
    const lot = await receive(cure.sku, "100", "g", K(0), { ...lotDate(30), code: `TRACE-${tag()}` });
    const code = await recipe([{ item: cure.sku, rate: "2", unit: "g/kg" }]);
    const made: string[] = [];
    for (const kg of ["10", "5"]) {
      const p = await plan({ kitchen: K(0), recipe: code, plannedFor: day(1), meatBlock: { quantity: kg, unit: "kg" } });
      const r = await produce(p.body.id, { actualMeatBlock: { quantity: kg, unit: "kg" } });
      expect(r.status, JSON.stringify(r.body)).toBe(200);
      made.push(r.body.production.batchCode);
    }
    const forward = await call(traceLotRoute, { path: `/api/trace/lots/${lot}`, params: { id: lot }, cookie: cookie.manager });
    expect(forward.status, JSON.stringify(forward.body)).toBe(200);
    expect(forward.body.batches.map((b: { batchCode: string; quantity: string }) => [b.batchCode, b.quantity])).toEqual([[made[0], "20"], [made[1], "10"]]);
    expect(forward.body.onHand).toEqual([{ kitchen: K(0), quantity: "70" }]);
    expect(forward.body.note).toMatch(/Shipments to customers are not recorded/);
    const batchId = forward.body.batches[0].batchId;
    const back = await call(traceBatchRoute, { path: `/api/trace/batches/${batchId}`, params: { id: batchId }, cookie: cookie.accountant });
    expect(back.body.lots).toEqual([expect.objectContaining({ lotId: lot, quantity: "20", supplier: null })]);
    const csv = await traceLotRoute(buildRequest({ path: `/api/trace/lots/${lot}?format=csv`, cookie: cookie.manager }), { params: Promise.resolve({ id: lot }) });
    expect(csv.headers.get("content-type")).toMatch(/text\/csv/);
    // papaparse (a general-purpose CSV library) reads back what we wrote
    const parsed = Papa.parse<Record<string, string>>(await csv.text(), { header: true, skipEmptyLines: true });
    expect(parsed.data.map((r) => [r.batch_code, r.quantity_used])).toEqual([[made[0], "20"], [made[1], "10"]]);
    expect((await call(traceLotRoute, { path: `/api/trace/lots/${lot}`, params: { id: lot }, cookie: cookie.other })).status).toBe(404);
    expect((await call(traceLotRoute, { path: `/api/trace/lots/${lot}`, params: { id: lot }, cookie: cookie.buyer })).status).toBe(403);
  });
});

describe("house limits", () => {
  it("a plan over a house maximum needs a manager's reason, which is audited; a statutory limit never can be overridden", async () => {
    const set = await call(houseLimitsRoute, { method: "PUT", path: "/api/house-limits", cookie: cookie.admin, body: { limits: [{ productClass: "comminuted", substance: "nitrite", kind: "max", limitPpm: "150", note: "Our own ceiling" }] } });
    expect(set.status, JSON.stringify(set.body)).toBe(200);
    expect((await call(houseLimitsRoute, { method: "PUT", path: "/api/house-limits", cookie: cookie.manager, body: { limits: [] } })).status).toBe(403);
    try {
      const cure = await cureItem();
      const code = await recipe([{ item: cure.sku, rate: "2.5", unit: "g/kg" }]);
      const body = { kitchen: K(0), recipe: code, plannedFor: day(2), meatBlock: { quantity: "10", unit: "kg" } };
      // 156.25 ppm: within the statutory 156.25, over the house 150
      const refused = await plan(body);
      expect(refused.status).toBe(422);
      expect(refused.body.error.details.fields.overrideReason[0]).toMatch(/nitrite 156\.2500 ppm is over the house maximum of 150 ppm/);
      expect((await plan({ ...body, overrideReason: "Trial batch agreed with the HACCP lead" })).status).toBe(403);
      const ok = await plan({ ...body, overrideReason: "Trial batch agreed with the HACCP lead" }, "manager");
      expect(ok.status, JSON.stringify(ok.body)).toBe(201);
      expect(ok.body.houseChecks).toEqual([expect.objectContaining({ limitPpm: "150", ppm: "156.2500", within: false })]);
      expect(ok.body.override).toMatchObject({ reason: "Trial batch agreed with the HACCP lead", by: { id: co.users.manager.id } });
      expect(await db()("audit_events").where({ subject_id: ok.body.id })).toMatchObject([{ action: "batch.house_limit_overridden", actor_id: co.users.manager.id }]);
      // a reason with nothing to override is refused
      const low = await recipe([{ item: cure.sku, rate: "2", unit: "g/kg" }]);
      const noNeed = await plan({ ...body, recipe: low, overrideReason: "just because" }, "manager");
      expect(Object.keys(noNeed.body.error.details.fields)).toEqual(["overrideReason"]);
    } finally {
      await call(houseLimitsRoute, { method: "PUT", path: "/api/house-limits", cookie: cookie.admin, body: { limits: [] } });
    }
  });
});
