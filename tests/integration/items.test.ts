// The catalogue through its route handlers (app/api/items), against the real PostgreSQL.
import { beforeAll, describe, expect, it } from "vitest";
import { GET as itemGet, PATCH as itemPatch } from "../../app/api/items/[id]/route";
import { GET as itemsList, POST as itemCreate } from "../../app/api/items/route";
import { db } from "../../db/client";
import type { ItemPackRow, ItemRow } from "../../db/types";
import { createCompany, tag, type TestCompany } from "../support/factory";
import { call } from "../support/http";
import { sessionCookieFor } from "../support/sessions";

let a: TestCompany;
let b: TestCompany;
const cookie: Record<string, string> = {};
beforeAll(async () => {
  [a, b] = await Promise.all([createCompany(), createCompany()]);
  for (const role of ["admin", "manager", "buyer", "kitchen_lead", "accountant"] as const) cookie[role] = await sessionCookieFor(a.users[role].id);
  cookie.otherAdmin = await sessionCookieFor(b.users.admin.id);
});

const sku = (prefix: string) => `${prefix}-${tag().toUpperCase()}`;
const create = (body: Record<string, unknown>, who = "buyer") => call(itemCreate, { path: "/api/items", body, cookie: cookie[who] });
const get = (ref: string, who = "buyer") => call(itemGet, { path: `/api/items/${ref}`, params: { id: ref }, cookie: cookie[who] });
const patch = (ref: string, body: Record<string, unknown>, who = "buyer") =>
  call(itemPatch, { method: "PATCH", path: `/api/items/${ref}`, params: { id: ref }, cookie: cookie[who], body });
const fieldsOf = (res: { body: { error?: { details?: { fields?: Record<string, string[]> } } } }) => Object.keys(res.body.error?.details?.fields ?? {}).sort();

const hogHank = () => ({ sku: sku("HOG"), name: "Hog casing 32/35", category: "casing", unit: "pc", casingKind: "natural_hog", calibreMinMm: "32", calibreMaxMm: "35", putUp: "hank" });
const pinkCure = () => ({ sku: sku("CURE"), name: "Curing salt #1", category: "cure", unit: "g", nitriteFraction: "0.0625", nitrateFraction: "0" });
const pepper = () => ({ sku: sku("PEP"), name: "Black pepper, ground", category: "spice", unit: "g", form: "ground" });

describe("creating each category", () => {
  it("a natural hog hank: 91.44 m per hank and 45 kg for 32/35 mm by default", async () => {
    const body = hogHank();
    const res = await create({ ...body, packs: [{ name: "box of 10 hanks", quantity: "10", unit: "hank" }] });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    // a hank is 100 yd = 91.44 m; 32/35 mm hog falls in the 32-34 band, 45-48 kg: the lower bound
    // (natural casing trade association tables as reproduced in trade-facts §4; [practice]/[sec])
    expect(res.body).toMatchObject({
      sku: body.sku, category: "casing", stockUnit: "pc", trackLots: true, trackDates: true, archived: false, cure: null,
      casing: { kind: "natural_hog", calibreMinMm: "32", calibreMaxMm: "35", putUp: "hank", putUpMetres: "91.44", capacityKgPerPutUp: "45", storage: "salted" },
      packs: [{ name: "box of 10 hanks", quantity: "10", unit: "hank", stockQuantity: "10" }],
      itemUnits: { stockUnit: "pc", putUp: { name: "hank", metres: "91.44" }, densityGPerMl: null, packs: [{ name: "box of 10 hanks", quantity: "10", unit: "hank" }] },
    });
    const row: ItemRow = await db()("items").where({ id: res.body.id }).first();
    expect(row).toMatchObject({ company_id: a.company.id, put_up_metres: "91.440000000000", capacity_kg_per_put_up: "45.000000000000", storage: "salted" });
  });

  it("a manufactured casing in metres, stored dry", async () => {
    const res = await create({ sku: sku("COL"), name: "Collagen 26 mm", category: "casing", unit: "m", casingKind: "collagen", calibreMinMm: "26" });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.casing).toEqual({ kind: "collagen", calibreMinMm: "26", calibreMaxMm: "26", putUp: null, putUpMetres: null, capacityKgPerPutUp: null, storage: "dry" });
  });

  it("a cure with its label's fractions, its marker and tracked lots and dates", async () => {
    const res = await create({ ...pinkCure(), nitrateFraction: "0.04" }, "manager");
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ category: "cure", stockUnit: "g", trackLots: true, trackDates: true, cure: { nitriteFraction: "0.0625", nitrateFraction: "0.04" } });
    // no salt named: sodium, the common cure (trade-facts §1)
    expect(res.body.cure).toMatchObject({ nitriteSalt: "sodium", nitrateSalt: "sodium" });
  });

  it("a potassium nitrite cure: the salt as on the label, echoed and stored", async () => {
    // potassium nitrite converts differently (1.2335 x the sodium figure), so a cure item records its salt (trade-facts §2)
    const res = await create({ ...pinkCure(), name: "Potassium nitrite cure 6.25 %", nitriteSalt: "potassium" });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.cure).toEqual({ nitriteFraction: "0.0625", nitrateFraction: "0", nitriteSalt: "potassium", nitrateSalt: "sodium" });
    const row: ItemRow = await db()("items").where({ id: res.body.id }).first();
    expect(row).toMatchObject({ nitrite_salt: "potassium", nitrate_salt: "sodium" });
    expect((await get(res.body.sku)).body.cure).toMatchObject({ nitriteSalt: "potassium" });
  });

  it("a spice and a liquid ingredient with a density", async () => {
    const spice = await create(pepper(), "admin");
    expect(spice.status, JSON.stringify(spice.body)).toBe(201);
    expect(spice.body).toMatchObject({ category: "spice", form: "ground", densityGPerMl: null, casing: null, cure: null });
    const liquid = await create({ sku: sku("SMOKE"), name: "Liquid smoke", category: "ingredient", unit: "g", form: "liquid", densityGPerMl: "1.05", trackLots: true, trackDates: false });
    expect(liquid.status, JSON.stringify(liquid.body)).toBe(201);
    expect(liquid.body).toMatchObject({ densityGPerMl: "1.05", trackLots: true, trackDates: false, itemUnits: { densityGPerMl: "1.05" } });
  });
});

describe("packs", () => {
  it("stores a 25 lb pail of a gram item as exactly 11339.80925 g (NIST: 1 lb = 453.59237 g), with what was typed", async () => {
    const res = await create({ ...pepper(), packs: [{ name: "25 lb pail", quantity: "25", unit: "lb" }, { name: "1 kg bag", quantity: "1", unit: "kg" }] });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.packs).toEqual([
      { name: "1 kg bag", quantity: "1", unit: "kg", stockQuantity: "1000" },
      { name: "25 lb pail", quantity: "25", unit: "lb", stockQuantity: "11339.80925" },
    ]);
    const rows: ItemPackRow[] = await db()("item_packs").where({ item_id: res.body.id }).orderBy("name");
    expect(rows.map((r) => [r.name, r.quantity, r.unit, r.stock_quantity])).toEqual([
      ["1 kg bag", "1.000000000000", "kg", "1000.000000000000"],
      ["25 lb pail", "25.000000000000", "lb", "11339.809250000000"],
    ]);
  });

  it("names the pack whose unit is unknown, and stores nothing", async () => {
    const body = { ...pepper(), packs: [{ name: "tub", quantity: "3", unit: "scoops" }] };
    const res = await create(body);
    expect(res.status).toBe(422);
    expect(fieldsOf(res)).toEqual(["packs.0.unit"]);
    expect(await db()("items").where({ company_id: a.company.id, sku: body.sku }).first()).toBeUndefined();
  });

  it("are replaced as a whole by a PATCH, and a kept pack keeps its row", async () => {
    const created = await create({ ...pepper(), packs: [{ name: "sack", quantity: "25", unit: "kg" }, { name: "tin", quantity: "500", unit: "g" }] });
    const sackId = (await db()("item_packs").where({ item_id: created.body.id, name: "sack" }).first()).id;
    const res = await patch(created.body.id, { packs: [{ name: "sack", quantity: "20", unit: "kg" }, { name: "case", quantity: "4", unit: "sack" }] });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.packs).toEqual([
      { name: "case", quantity: "4", unit: "sack", stockQuantity: "80000" },
      { name: "sack", quantity: "20", unit: "kg", stockQuantity: "20000" },
    ]);
    expect((await db()("item_packs").where({ item_id: created.body.id, name: "sack" }).first()).id).toBe(sackId);
  });
});

describe("refusals", () => {
  it("an SKU used twice in the company: 409 naming sku; another company may use it", async () => {
    const body = pepper();
    expect((await create(body)).status).toBe(201);
    const dup = await create({ ...body, name: "Other pepper" });
    expect(dup.status).toBe(409);
    expect(dup.body.error).toMatchObject({ code: "CONFLICT", details: { fields: { sku: [expect.any(String)] } } });
    const elsewhere = await create(body, "otherAdmin");
    expect(elsewhere.status).toBe(201);
  });

  it("a cure without its fractions: 422 naming both (never assumed 6.25 %)", async () => {
    const { nitriteFraction: _n, nitrateFraction: _t, ...body } = pinkCure();
    const res = await create(body);
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe("VALIDATION");
    expect(fieldsOf(res)).toEqual(["nitrateFraction", "nitriteFraction"]);
  });

  it("a salt on an item that is not a cure, or a salt that is neither sodium nor potassium: 422 naming the field", async () => {
    const spice = await create({ ...pepper(), nitriteSalt: "sodium" });
    expect(spice.status).toBe(422);
    expect(spice.body.error.details.fields).toEqual({ nitriteSalt: ["Only for cures."] });
    const casing = await create({ ...hogHank(), nitrateSalt: "potassium" });
    expect(casing.status).toBe(422);
    expect(fieldsOf(casing)).toEqual(["nitrateSalt"]);
    const calcium = await create({ ...pinkCure(), nitriteSalt: "calcium" });
    expect(calcium.status).toBe(422);
    expect(fieldsOf(calcium)).toEqual(["nitriteSalt"]);
  });

  it("the database holds the salts in shape too: a cure always has them (sodium when left out), other items never", async () => {
    // a plain insert, as tests/support/stock.ts and the benchmark do: the trigger fills sodium for a cure only
    const base = { company_id: a.company.id, stock_unit: "g", track_lots: true, track_dates: true };
    const [cure] = await db()("items").insert({ ...base, sku: sku("RAW"), name: "Raw cure", category: "cure", nitrite_fraction: "0.0625", nitrate_fraction: "0" }).returning<ItemRow[]>("*");
    expect(cure).toMatchObject({ nitrite_salt: "sodium", nitrate_salt: "sodium" });
    const [spice] = await db()("items").insert({ ...base, sku: sku("RAW"), name: "Raw spice", category: "spice" }).returning<ItemRow[]>("*");
    expect(spice).toMatchObject({ nitrite_salt: null, nitrate_salt: null });
    await expect(db()("items").where({ id: spice!.id }).update({ nitrite_salt: "sodium" })).rejects.toMatchObject({ constraint: "items_cure_salts" });
    await expect(db()("items").where({ id: cure!.id }).update({ nitrite_salt: null })).rejects.toMatchObject({ constraint: "items_cure_salts" });
    await expect(db()("items").where({ id: cure!.id }).update({ nitrate_salt: "calcium" })).rejects.toMatchObject({ constraint: "items_nitrate_salt" });
  });

  it("a cure with lot tracking off: 422 naming trackLots", async () => {
    const res = await create({ ...pinkCure(), trackLots: false });
    expect(res.status).toBe(422);
    expect(fieldsOf(res)).toEqual(["trackLots"]);
  });

  it("a decimal sent as a JSON number: 422 naming the field", async () => {
    const res = await create({ ...pinkCure(), nitriteFraction: 0.0625 });
    expect(res.status).toBe(422);
    expect(fieldsOf(res)).toEqual(["nitriteFraction"]);
    const pack = await create({ ...pepper(), packs: [{ name: "pail", quantity: 25, unit: "lb" }] });
    expect(fieldsOf(pack)).toEqual(["packs.0.quantity"]);
  });

  it("a natural casing outside the capacity table without a capacity: 422 naming capacityKgPerPutUp", async () => {
    const res = await create({ ...hogHank(), calibreMinMm: "40", calibreMaxMm: "42" });
    expect(res.status).toBe(422);
    expect(fieldsOf(res)).toEqual(["capacityKgPerPutUp"]);
  });

  it("kitchen leads and accountants may not add or change items: 403", async () => {
    const existing = await create(pepper());
    for (const who of ["kitchen_lead", "accountant"]) {
      const res = await create(pepper(), who);
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe("FORBIDDEN");
      expect((await patch(existing.body.id, { name: "Renamed" }, who)).status).toBe(403);
    }
  });
});

describe("reading", () => {
  it("by id or SKU, for every role", async () => {
    const created = await create(pinkCure());
    for (const who of ["admin", "manager", "buyer", "kitchen_lead", "accountant"]) {
      const bySku = await get(created.body.sku, who);
      expect(bySku.status, who).toBe(200);
      expect(bySku.body).toEqual(created.body);
    }
    expect((await get(created.body.id)).body.id).toBe(created.body.id);
    expect((await get("NO-SUCH-SKU")).status).toBe(404);
  });

  it("another company's item is 404, by id and by SKU, and PATCH is 404 too", async () => {
    const created = await create(pepper());
    expect((await get(created.body.id, "otherAdmin")).status).toBe(404);
    expect((await get(created.body.sku, "otherAdmin")).status).toBe(404);
    const res = await patch(created.body.id, { name: "Taken over" }, "otherAdmin");
    expect(res.status).toBe(404);
    expect((await get(created.body.id)).body.name).toBe(created.body.name);
  });

  it("lists by category and search, archived only on request", async () => {
    const casing = await create({ ...hogHank(), name: `Findable hog ${tag()}` });
    const spice = await create(pepper());
    const list = await call(itemsList, { path: "/api/items?category=casing", cookie: cookie.kitchen_lead });
    expect(list.status).toBe(200);
    const ids = list.body.items.map((i: { id: string }) => i.id);
    expect(ids).toContain(casing.body.id);
    expect(ids).not.toContain(spice.body.id);
    expect(list.body.items.every((i: { category: string }) => i.category === "casing")).toBe(true);

    const found = await call(itemsList, { path: `/api/items?q=${encodeURIComponent(casing.body.name.toUpperCase())}`, cookie: cookie.buyer });
    expect(found.body.items.map((i: { id: string }) => i.id)).toEqual([casing.body.id]);

    expect((await patch(casing.body.id, { archived: true })).body.archived).toBe(true);
    const open = await call(itemsList, { path: "/api/items?category=casing", cookie: cookie.buyer });
    expect(open.body.items.map((i: { id: string }) => i.id)).not.toContain(casing.body.id);
    const all = await call(itemsList, { path: "/api/items?category=casing&archived=true", cookie: cookie.buyer });
    expect(all.body.items.map((i: { id: string }) => i.id)).toContain(casing.body.id);

    expect((await call(itemsList, { path: "/api/items?category=salt", cookie: cookie.buyer })).status).toBe(422);
    const others = await call(itemsList, { path: "/api/items", cookie: cookie.otherAdmin });
    expect(others.body.items.map((i: { id: string }) => i.id)).not.toContain(casing.body.id);
  });
});

describe("changing", () => {
  it("re-derives the capacity when the calibre changes, and checks the whole item", async () => {
    const created = await create(hogHank());
    const wider = await patch(created.body.id, { calibreMinMm: "34", calibreMaxMm: "36" });
    expect(wider.status, JSON.stringify(wider.body)).toBe(200);
    // 34-36 mm hog hank: 48-52 kg, lower bound 48 (trade-facts §4 [practice])
    expect(wider.body.casing).toMatchObject({ calibreMinMm: "34", capacityKgPerPutUp: "48" });
    const bad = await patch(created.body.id, { unit: "m" });
    expect(bad.status).toBe(422);
    expect(fieldsOf(bad)).toEqual(["unit"]);
  });

  it("a spice becomes a cure only with its fractions", async () => {
    const created = await create({ ...pepper(), trackLots: false });
    const refused = await patch(created.body.sku, { category: "cure" });
    expect(refused.status).toBe(422);
    expect(fieldsOf(refused)).toEqual(["nitrateFraction", "nitriteFraction"]);
    const cure = await patch(created.body.sku, { category: "cure", nitriteFraction: "0.0625", nitrateFraction: "0" });
    expect(cure.status, JSON.stringify(cure.body)).toBe(200);
    expect(cure.body).toMatchObject({ category: "cure", form: null, trackLots: true, trackDates: true, cure: { nitriteFraction: "0.0625" } });
  });

  it("a cure's salt changes by PATCH; null takes sodium again; a salt on a spice is 422", async () => {
    const created = await create(pinkCure());
    const potassium = await patch(created.body.id, { nitriteSalt: "potassium", nitrateSalt: "potassium" });
    expect(potassium.status, JSON.stringify(potassium.body)).toBe(200);
    expect(potassium.body.cure).toEqual({ nitriteFraction: "0.0625", nitrateFraction: "0", nitriteSalt: "potassium", nitrateSalt: "potassium" });
    // other changes keep the salt
    expect((await patch(created.body.id, { nitriteFraction: "0.06" })).body.cure).toMatchObject({ nitriteFraction: "0.06", nitriteSalt: "potassium" });
    const cleared = await patch(created.body.id, { nitrateSalt: null });
    expect(cleared.body.cure).toMatchObject({ nitriteSalt: "potassium", nitrateSalt: "sodium" });
    const spice = await create(pepper());
    const refused = await patch(spice.body.id, { nitriteSalt: "potassium" });
    expect(refused.status).toBe(422);
    expect(fieldsOf(refused)).toEqual(["nitriteSalt"]);
    // a cure turned into a spice leaves its salts behind
    const becameSpice = await patch(created.body.id, { category: "spice" });
    expect(becameSpice.status, JSON.stringify(becameSpice.body)).toBe(200);
    expect(becameSpice.body.cure).toBeNull();
    expect(await db()("items").where({ id: created.body.id }).first("nitrite_salt", "nitrate_salt")).toEqual({ nitrite_salt: null, nitrate_salt: null });
  });

  it("category and stock unit are fixed once the item has a lot: 409", async () => {
    const created = await create(pepper());
    await db()("lots").insert({ company_id: a.company.id, item_id: created.body.id, code: "L1", received_on: "2026-12-01", unit_cost: "0.01" });
    const unit = await patch(created.body.id, { unit: "ml" });
    expect(unit.status).toBe(409);
    expect(unit.body.error).toMatchObject({ code: "ITEM_HAS_LOTS", details: { fields: { unit: [expect.any(String)] } } });
    const category = await patch(created.body.id, { category: "ingredient" });
    expect(category.status).toBe(409);
    // other changes still go through
    expect((await patch(created.body.id, { name: "Black pepper, coarse", form: "cracked" })).body).toMatchObject({ name: "Black pepper, coarse", form: "cracked", category: "spice" });
  });

  it("an SKU changed to one in use: 409", async () => {
    const one = await create(pepper());
    const two = await create(pepper());
    const res = await patch(two.body.id, { sku: one.body.sku });
    expect(res.status).toBe(409);
    expect(res.body.error.details.fields.sku).toBeDefined();
  });
});
