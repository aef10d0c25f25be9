// Suppliers and supplier items through their route handlers (app/api/suppliers), against the real
// PostgreSQL: create, edit, list; packs converted exactly to the item's stock unit; GTINs checked
// and padded; duplicates; the permission matrix; tenancy.
import { randomUUID } from "node:crypto";
import { beforeAll, describe, expect, it } from "vitest";
import { PATCH as itemPatch } from "../../app/api/items/[id]/route";
import { POST as itemCreate } from "../../app/api/items/route";
import { GET as supplierItemGet, PATCH as supplierItemPatch } from "../../app/api/suppliers/[id]/items/[supplierItemId]/route";
import { GET as supplierItemsList, POST as supplierItemCreate } from "../../app/api/suppliers/[id]/items/route";
import { GET as supplierGet, PATCH as supplierPatch } from "../../app/api/suppliers/[id]/route";
import { GET as suppliersList, POST as supplierCreate } from "../../app/api/suppliers/route";
import { db } from "../../db/client";
import { ROLES, type Role } from "../../db/types";
import { gtinCheckDigit } from "../../lib/gs1/gtin";
import { createCompany, tag, type TestCompany } from "../support/factory";
import { call } from "../support/http";
import { sessionCookieFor } from "../support/sessions";
import { createItem, type TestItem } from "../support/stock";

let a: TestCompany;
let b: TestCompany;
const cookie: Record<string, string> = {};
let hank: TestItem; // natural hog casing: stocked in pc, one pc = one hank of 91.44 m
let metres: { id: string; sku: string }; // collagen casing stocked in metres
let pepper: TestItem; // a spice stocked in g
let otherCompanyItem: TestItem;

beforeAll(async () => {
  [a, b] = await Promise.all([createCompany(), createCompany()]);
  for (const role of ROLES) cookie[role] = await sessionCookieFor(a.users[role].id);
  cookie.otherAdmin = await sessionCookieFor(b.users.admin.id);
  hank = await createItem(a.company.id, { category: "casing" });
  pepper = await createItem(a.company.id, { category: "spice" });
  otherCompanyItem = await createItem(b.company.id, { category: "spice" });
  const col = await call(itemCreate, {
    path: "/api/items", cookie: cookie.buyer,
    body: { sku: `COL-${tag().toUpperCase()}`, name: "Collagen 26 mm by the metre", category: "casing", unit: "m", casingKind: "collagen", calibreMinMm: "26" },
  });
  expect(col.status, JSON.stringify(col.body)).toBe(201);
  metres = col.body;
});

const name = (prefix = "Supplier") => `${prefix} ${tag()}`;
const fieldsOf = (res: { body: { error?: { details?: { fields?: Record<string, string[]> } } } }) => res.body.error?.details?.fields ?? {};

const createSupplier = (body: Record<string, unknown>, who = "buyer", idempotencyKey?: string) =>
  call(supplierCreate, { path: "/api/suppliers", body, cookie: cookie[who], idempotencyKey });
const getSupplier = (id: string, who = "buyer") => call(supplierGet, { path: `/api/suppliers/${id}`, params: { id }, cookie: cookie[who] });
const patchSupplier = (id: string, body: Record<string, unknown>, who = "buyer") =>
  call(supplierPatch, { method: "PATCH", path: `/api/suppliers/${id}`, params: { id }, body, cookie: cookie[who] });
const listSuppliers = (query = "", who = "buyer") => call(suppliersList, { path: `/api/suppliers${query}`, cookie: cookie[who] });

const createSI = (supplierId: string, body: Record<string, unknown>, who = "buyer", idempotencyKey?: string) =>
  call(supplierItemCreate, { path: `/api/suppliers/${supplierId}/items`, params: { id: supplierId }, body, cookie: cookie[who], idempotencyKey });
const listSI = (supplierId: string, query = "", who = "buyer") =>
  call(supplierItemsList, { path: `/api/suppliers/${supplierId}/items${query}`, params: { id: supplierId }, cookie: cookie[who] });
const getSI = (supplierId: string, id: string, who = "buyer") =>
  call(supplierItemGet, { path: `/api/suppliers/${supplierId}/items/${id}`, params: { id: supplierId, supplierItemId: id }, cookie: cookie[who] });
const patchSI = (supplierId: string, id: string, body: Record<string, unknown>, who = "buyer") =>
  call(supplierItemPatch, { method: "PATCH", path: `/api/suppliers/${supplierId}/items/${id}`, params: { id: supplierId, supplierItemId: id }, body, cookie: cookie[who] });

const supplierBody = (extra: Record<string, unknown> = {}) => ({ name: name(), leadTimeDays: 3, ...extra });
async function newSupplier(extra: Record<string, unknown> = {}): Promise<string> {
  const res = await createSupplier(supplierBody(extra));
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.id;
}
const sku = (prefix = "S") => `${prefix}-${tag().toUpperCase()}`;

describe("suppliers: create, edit, list", () => {
  it("a buyer adds a supplier in the company's currency; the minimum order keeps the currency's decimals", async () => {
    const body = { name: name("Brine & Barrel"), contactName: "Ada Quern", orderEmail: " Orders@Brine.Example ", phone: "+44 1632 960 001", leadTimeDays: 4, minOrderValue: "150", notes: "Tuesdays only." };
    const res = await createSupplier(body);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    // the factory's companies trade in EUR: 2 decimals (ISO 4217)
    expect(res.body).toMatchObject({
      name: body.name, contactName: "Ada Quern", orderEmail: "orders@brine.example", phone: "+44 1632 960 001", leadTimeDays: 4,
      minOrderValue: "150.00", currency: "EUR", notes: "Tuesdays only.", active: true, itemCount: 0,
    });
    const row = await db()("suppliers").where({ id: res.body.id }).first();
    expect(row).toMatchObject({ company_id: a.company.id, min_order_value: "150.0000", order_email: "orders@brine.example" });
    expect((await getSupplier(res.body.id, "accountant")).body).toEqual(res.body);
  });

  it("defaults: no contact, no e-mail, no minimum; the same Idempotency-Key adds it once", async () => {
    const key = randomUUID();
    const body = supplierBody();
    const first = await createSupplier(body, "manager", key);
    const again = await createSupplier(body, "manager", key);
    expect(first.status).toBe(201);
    expect(again.status).toBe(201);
    expect(again.body.id).toBe(first.body.id);
    expect(first.body).toMatchObject({ contactName: "", orderEmail: null, phone: "", minOrderValue: null, notes: "" });
    expect(await db()("suppliers").where({ company_id: a.company.id, name: body.name }).count<{ n: string }[]>("* as n")).toEqual([{ n: "1" }]);
  });

  it("refuses a name the company already has, whatever the case: 409 naming the field", async () => {
    const body = supplierBody();
    expect((await createSupplier(body)).status).toBe(201);
    const dup = await createSupplier({ ...body, name: body.name.toUpperCase() });
    expect(dup.status).toBe(409);
    expect(Object.keys(fieldsOf(dup))).toEqual(["name"]);
    // another company may use it
    expect((await createSupplier(body, "otherAdmin")).status).toBe(201);
  });

  it("refuses bad fields with 422 naming each: numbers as strings, money as a number, too many decimals, a bad e-mail", async () => {
    const res = await createSupplier({ name: "", leadTimeDays: "3", minOrderValue: 150, orderEmail: "not-an-address" });
    expect(res.status).toBe(422);
    expect(Object.keys(fieldsOf(res)).sort()).toEqual(["leadTimeDays", "minOrderValue", "name", "orderEmail"]);
    expect((await createSupplier(supplierBody({ leadTimeDays: 400 }))).status).toBe(422);
    expect((await createSupplier(supplierBody({ leadTimeDays: 1.5 }))).status).toBe(422);
    // EUR has 2 decimals (ISO 4217): 150.005 cannot be paid
    const cents = await createSupplier(supplierBody({ minOrderValue: "150.005" }));
    expect(cents.status).toBe(422);
    expect(fieldsOf(cents).minOrderValue?.[0]).toMatch(/EUR has 2 decimals/);
  });

  it("edits only the fields sent; null clears the e-mail and the minimum; inactive suppliers leave the list", async () => {
    const id = await newSupplier({ orderEmail: "a@b.example", minOrderValue: "99.5", contactName: "Ivo" });
    const res = await patchSupplier(id, { leadTimeDays: 10, orderEmail: null, minOrderValue: null });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body).toMatchObject({ leadTimeDays: 10, orderEmail: null, minOrderValue: null, contactName: "Ivo" });
    const renamed = name("Renamed");
    expect((await patchSupplier(id, { name: renamed }, "admin")).body.name).toBe(renamed);

    expect((await patchSupplier(id, { active: false })).body.active).toBe(false);
    expect((await listSuppliers()).body.suppliers.map((s: { id: string }) => s.id)).not.toContain(id);
    expect((await listSuppliers("?inactive=true")).body.suppliers.map((s: { id: string }) => s.id)).toContain(id);
    expect((await listSuppliers("?inactive=maybe")).status).toBe(422);
  });

  it("lists by name with the number of active items, searchable by name or contact", async () => {
    const t = tag();
    const zed = (await createSupplier({ name: `Zed ${t}`, leadTimeDays: 1, contactName: `Mira ${t}` })).body.id;
    const abe = (await createSupplier({ name: `abe ${t}`, leadTimeDays: 1 })).body.id;
    expect((await createSI(abe, { sku: "P1", item: pepper.sku, packQuantity: "1", packUnit: "kg" })).status).toBe(201);
    const off = await createSI(abe, { sku: "P2", item: pepper.sku, packQuantity: "5", packUnit: "kg" });
    await patchSI(abe, off.body.id, { active: false });
    const res = await listSuppliers(`?q=${t}`);
    expect(res.status).toBe(200);
    expect(res.body.suppliers.map((s: { id: string; itemCount: number }) => [s.id, s.itemCount])).toEqual([[abe, 1], [zed, 0]]);
    expect((await listSuppliers(`?q=Mira ${t}`)).body.suppliers.map((s: { id: string }) => s.id)).toEqual([zed]);
  });
});

describe("supplier items: packs converted exactly to the stock unit", () => {
  let supplier: string;
  beforeAll(async () => {
    supplier = await newSupplier();
  });

  it("\"bundle of 5 hanks\" of a hog casing is 5 pc, 457.2 m exactly", async () => {
    const res = await createSI(supplier, { sku: sku("FR"), description: "Hog 32/35 salted", item: hank.sku, packLabel: "bundle of 5 hanks", packQuantity: "5", packUnit: "hank" });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    // a hank is 100 yd = 91.44 m (trade-facts §4; yd = 0.9144 m exactly, NIST SP 811): 5 x 91.44 = 457.2
    expect(res.body).toMatchObject({
      supplierId: supplier, packLabel: "bundle of 5 hanks", packQuantity: "5", packUnit: "hank", packSizeStock: "5", stockUnit: "pc", packMetres: "457.2",
      gtin: null, active: true, item: { id: hank.id, sku: hank.sku, category: "casing", stockUnit: "pc", archived: false },
    });
    const row = await db()("supplier_items").where({ id: res.body.id }).first();
    expect(row).toMatchObject({ company_id: a.company.id, item_id: hank.id, pack_quantity: "5.000000000000", pack_size_stock: "5.000000000000" });
  });

  it("for an item stocked in metres, a carton of 500 yd is 457.2 m exactly; hanks do not convert (422 naming both units)", async () => {
    // yd = 0.9144 m exactly (NIST SP 811 / Handbook 44 App. C): 500 yd = 457.2 m
    const res = await createSI(supplier, { sku: sku("COL"), item: metres.id, packLabel: "carton of 500 yd", packQuantity: "500", packUnit: "yd" });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ packSizeStock: "457.2", stockUnit: "m", packMetres: "457.2" });

    // a hank is the put-up of a natural casing stocked in hanks; this item has none
    const bad = await createSI(supplier, { sku: sku("COL"), item: metres.sku, packLabel: "bundle of 5 hanks", packQuantity: "5", packUnit: "hank" });
    expect(bad.status).toBe(422);
    expect(Object.keys(fieldsOf(bad))).toEqual(["packUnit"]);
    expect(fieldsOf(bad).packUnit![0]).toContain('"hank"');
    expect(fieldsOf(bad).packUnit![0]).toContain(`does not convert to m, the stock unit of ${metres.sku}`);
    // a mass unit for a casing: both units and dimensions named
    const kg = await createSI(supplier, { sku: sku("COL"), item: hank.sku, packQuantity: "2", packUnit: "kg" });
    expect(kg.status).toBe(422);
    expect(fieldsOf(kg).packUnit![0]).toMatch(/"kg" does not convert to pc \(one hank\).*mass unit/);
  });

  it("a 25 lb pail of a spice stocked in grams is 11339.80925 g; the item's own packs work as units; the label defaults", async () => {
    // 1 lb = 453.59237 g exactly (NIST SP 811): 25 lb = 11339.80925 g
    const lb = await createSI(supplier, { sku: sku("PEP"), item: pepper.sku, packLabel: "25 lb pail", packQuantity: "25", packUnit: "lb" });
    expect(lb.status, JSON.stringify(lb.body)).toBe(201);
    expect(lb.body).toMatchObject({ packSizeStock: "11339.80925", stockUnit: "g", packMetres: null });
    const noLabel = await createSI(supplier, { sku: sku("PEP"), item: pepper.id, packQuantity: "2.5", packUnit: "kg" });
    expect(noLabel.body).toMatchObject({ packLabel: "2.5 kg", packSizeStock: "2500" });
    // the casing's own "box of 10 hanks" pack (items API), two of them: 20 hanks
    expect((await call(itemPatch, { method: "PATCH", path: `/api/items/${hank.id}`, params: { id: hank.id }, cookie: cookie.buyer, body: { packs: [{ name: "box of 10 hanks", quantity: "10", unit: "hank" }] } })).status).toBe(200);
    const boxes = await createSI(supplier, { sku: sku("FR"), item: hank.id, packLabel: "2 boxes", packQuantity: "2", packUnit: "box of 10 hanks" });
    expect(boxes.body).toMatchObject({ packSizeStock: "20", packMetres: "1828.8" }); // 20 x 91.44 m
  });

  it("refuses an unknown item, another company's item and an archived item: 422 on item", async () => {
    for (const item of ["NO-SUCH-SKU", otherCompanyItem.sku, otherCompanyItem.id, randomUUID()]) {
      const res = await createSI(supplier, { sku: sku(), item, packQuantity: "1", packUnit: "kg" });
      expect(res.status, item).toBe(422);
      expect(Object.keys(fieldsOf(res))).toEqual(["item"]);
    }
    const old = await createItem(a.company.id, { category: "spice" });
    await db()("items").where({ id: old.id }).update({ archived_at: new Date() });
    const archived = await createSI(supplier, { sku: sku(), item: old.sku, packQuantity: "1", packUnit: "kg" });
    expect(archived.status).toBe(422);
    expect(fieldsOf(archived).item![0]).toMatch(/archived/);
  });

  it("refuses a zero pack, a number for a decimal and a missing unit: 422 naming each", async () => {
    const res = await createSI(supplier, { sku: "", item: pepper.sku, packQuantity: 5 });
    expect(res.status).toBe(422);
    expect(Object.keys(fieldsOf(res)).sort()).toEqual(["packQuantity", "packUnit", "sku"]);
    expect((await createSI(supplier, { sku: sku(), item: pepper.sku, packQuantity: "0", packUnit: "kg" })).status).toBe(422);
  });
});

describe("supplier items: GTINs and duplicates", () => {
  let supplier: string;
  let second: string;
  beforeAll(async () => {
    [supplier, second] = await Promise.all([newSupplier(), newSupplier()]);
  });

  it("a GTIN-12 (UPC-A) is stored padded to 14 digits; spaces as printed are fine", async () => {
    // UPC-A 0 36000 29145 2: check digit 2 by the mod-10 rule (trade-facts §6), padded with two zeros
    expect(gtinCheckDigit("03600029145")).toBe(2);
    const res = await createSI(supplier, { sku: sku(), item: pepper.sku, packQuantity: "1", packUnit: "kg", gtin: "0 36000 29145 2" });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.gtin).toBe("00036000291452");
    expect((await db()("supplier_items").where({ id: res.body.id }).first()).gtin14).toBe("00036000291452");
    // a GTIN-13 from trade-facts §6: 629104150021 + check digit 3
    const ean = await createSI(supplier, { sku: sku(), item: pepper.sku, packQuantity: "5", packUnit: "kg", gtin: "6291041500213" });
    expect(ean.body.gtin).toBe("06291041500213");
  });

  it("a bad GTIN is 422 naming gtin: wrong check digit, wrong length, letters", async () => {
    // 12345678901234 has a wrong check digit (trade-facts §6: 12345678901231 is the valid one)
    for (const gtin of ["12345678901234", "036000291453", "1234567", "03600029145A"]) {
      const res = await createSI(supplier, { sku: sku(), item: pepper.sku, packQuantity: "1", packUnit: "kg", gtin });
      expect(res.status, gtin).toBe(422);
      expect(Object.keys(fieldsOf(res)), gtin).toEqual(["gtin"]);
    }
    expect((await createSI(supplier, { sku: sku(), item: pepper.sku, packQuantity: "1", packUnit: "kg", gtin: "12345678901231" })).body.gtin).toBe("12345678901231");
  });

  it("a supplier's SKU is unique per supplier whatever the case (409 on sku); another supplier may use it", async () => {
    const code = sku("dup");
    expect((await createSI(supplier, { sku: code, item: pepper.sku, packQuantity: "1", packUnit: "kg" })).status).toBe(201);
    const dup = await createSI(supplier, { sku: code.toLowerCase(), item: hank.sku, packQuantity: "1", packUnit: "hank" });
    expect(dup.status).toBe(409);
    expect(Object.keys(fieldsOf(dup))).toEqual(["sku"]);
    expect((await createSI(second, { sku: code, item: pepper.sku, packQuantity: "1", packUnit: "kg" })).status).toBe(201);
  });

  it("a GTIN names one item of a supplier (409 on gtin); the same pack may come through another supplier", async () => {
    const body = `952${tag().replace(/\D/g, "").padEnd(9, "7").slice(0, 9)}`;
    const gtin = `${body}${gtinCheckDigit(body)}`;
    expect((await createSI(supplier, { sku: sku(), item: pepper.sku, packQuantity: "1", packUnit: "kg", gtin })).status).toBe(201);
    const dup = await createSI(supplier, { sku: sku(), item: pepper.sku, packQuantity: "1", packUnit: "kg", gtin });
    expect(dup.status).toBe(409);
    expect(Object.keys(fieldsOf(dup))).toEqual(["gtin"]);
    expect((await createSI(second, { sku: sku(), item: pepper.sku, packQuantity: "1", packUnit: "kg", gtin })).status).toBe(201);
  });

  it("the same Idempotency-Key adds the supplier item once", async () => {
    const key = randomUUID();
    const body = { sku: sku(), item: pepper.sku, packQuantity: "1", packUnit: "kg" };
    const first = await createSI(supplier, body, "buyer", key);
    const again = await createSI(supplier, body, "buyer", key);
    expect(first.status).toBe(201);
    expect(again.body.id).toBe(first.body.id);
  });
});

describe("supplier items: edit and list", () => {
  it("edits the fields sent; a new pack or item converts again; null clears the GTIN; inactive ones leave the list", async () => {
    const supplier = await newSupplier();
    const created = await createSI(supplier, { sku: sku(), item: hank.sku, packLabel: "bundle of 5 hanks", packQuantity: "5", packUnit: "hank", gtin: "6291041500213" });
    const id = created.body.id;
    const repacked = await patchSI(supplier, id, { packLabel: "bundle of 2 hanks", packQuantity: "2" });
    expect(repacked.status, JSON.stringify(repacked.body)).toBe(200);
    // 2 hanks x 91.44 m (trade-facts §4)
    expect(repacked.body).toMatchObject({ packLabel: "bundle of 2 hanks", packQuantity: "2", packUnit: "hank", packSizeStock: "2", packMetres: "182.88", gtin: "06291041500213" });
    const moved = await patchSI(supplier, id, { item: pepper.sku, packUnit: "kg", packLabel: "", description: "now pepper", gtin: null });
    expect(moved.body).toMatchObject({ item: { id: pepper.id }, packLabel: "2 kg", packSizeStock: "2000", packMetres: null, gtin: null, description: "now pepper" });
    // a unit that does not convert for the item: 422, nothing changed
    const bad = await patchSI(supplier, id, { packUnit: "m" });
    expect(bad.status).toBe(422);
    expect(Object.keys(fieldsOf(bad))).toEqual(["packUnit"]);
    expect((await getSI(supplier, id)).body).toMatchObject({ packUnit: "kg", packSizeStock: "2000" });

    expect((await patchSI(supplier, id, { active: false })).body.active).toBe(false);
    expect((await listSI(supplier)).body.supplierItems).toEqual([]);
    expect((await listSI(supplier, "?inactive=true")).body.supplierItems.map((i: { id: string }) => i.id)).toEqual([id]);
  });

  it("lists a supplier's items by its SKU", async () => {
    const supplier = await newSupplier();
    for (const code of ["b-2", "A-1", "c-3"]) await createSI(supplier, { sku: code, item: pepper.sku, packQuantity: "1", packUnit: "kg" });
    const res = await listSI(supplier, "", "accountant");
    expect(res.status).toBe(200);
    expect(res.body.supplierItems.map((i: { sku: string }) => i.sku)).toEqual(["A-1", "b-2", "c-3"]);
  });

  it("an item whose units change converts its supplier items' packs again, or refuses the change", async () => {
    const supplier = await newSupplier();
    const casing = await createItem(a.company.id, { category: "casing" });
    // 182.88 m of a 91.44 m hank is 2 hanks
    const byLength = await createSI(supplier, { sku: sku(), item: casing.sku, packLabel: "reel of 182.88 m", packQuantity: "182.88", packUnit: "m" });
    expect(byLength.body.packSizeStock).toBe("2");
    // half-length hanks (a supplier's own put-up): the same reel is now 4 of them
    const changed = await call(itemPatch, { method: "PATCH", path: `/api/items/${casing.id}`, params: { id: casing.id }, cookie: cookie.buyer, body: { putUpMetres: "45.72", capacityKgPerPutUp: "22" } });
    expect(changed.status, JSON.stringify(changed.body)).toBe(200);
    expect((await getSI(supplier, byLength.body.id)).body).toMatchObject({ packSizeStock: "4", packMetres: "182.88" }); // 182.88 / 45.72

    const spice = await createItem(a.company.id, { category: "spice" });
    await createSI(supplier, { sku: sku(), item: spice.sku, packLabel: "25 lb pail", packQuantity: "25", packUnit: "lb" });
    const toMl = await call(itemPatch, { method: "PATCH", path: `/api/items/${spice.id}`, params: { id: spice.id }, cookie: cookie.buyer, body: { unit: "ml" } });
    expect(toMl.status).toBe(422);
    expect(fieldsOf(toMl).supplierItems?.[0]).toMatch(/25 lb pail.*no longer convert/);
    expect((await db()("items").where({ id: spice.id }).first()).stock_unit).toBe("g");
  });
});

describe("who may do what", () => {
  const readers: Role[] = ["admin", "manager", "buyer", "accountant"];
  const managers: Role[] = ["admin", "manager", "buyer"];

  it.each(ROLES.map((r) => [r]))("%s", async (role) => {
    const supplier = await newSupplier();
    const si = (await createSI(supplier, { sku: sku(), item: pepper.sku, packQuantity: "1", packUnit: "kg" })).body.id;
    const read = readers.includes(role) ? 200 : 403;
    const write = managers.includes(role);
    expect((await listSuppliers("", role)).status).toBe(read);
    expect((await getSupplier(supplier, role)).status).toBe(read);
    expect((await listSI(supplier, "", role)).status).toBe(read);
    expect((await getSI(supplier, si, role)).status).toBe(read);
    expect((await createSupplier(supplierBody(), role)).status).toBe(write ? 201 : 403);
    expect((await patchSupplier(supplier, { notes: `by ${role}` }, role)).status).toBe(write ? 200 : 403);
    expect((await createSI(supplier, { sku: sku(), item: pepper.sku, packQuantity: "1", packUnit: "kg" }, role)).status).toBe(write ? 201 : 403);
    expect((await patchSI(supplier, si, { description: `by ${role}` }, role)).status).toBe(write ? 200 : 403);
  });
});

describe("tenancy", () => {
  it("another company's supplier and its items are 404 everywhere, and never listed", async () => {
    const supplier = await newSupplier();
    const si = (await createSI(supplier, { sku: sku(), item: pepper.sku, packQuantity: "1", packUnit: "kg" })).body.id;
    const other = "otherAdmin";
    expect((await getSupplier(supplier, other)).status).toBe(404);
    expect((await patchSupplier(supplier, { name: "Taken over" }, other)).status).toBe(404);
    expect((await listSI(supplier, "", other)).status).toBe(404);
    expect((await createSI(supplier, { sku: sku(), item: otherCompanyItem.sku, packQuantity: "1", packUnit: "kg" }, other)).status).toBe(404);
    expect((await getSI(supplier, si, other)).status).toBe(404);
    expect((await patchSI(supplier, si, { active: false }, other)).status).toBe(404);
    expect((await listSuppliers("?inactive=true", other)).body.suppliers.map((s: { id: string }) => s.id)).not.toContain(supplier);
    expect((await db()("suppliers").where({ id: supplier }).first()).name).not.toBe("Taken over");
  });

  it("a supplier item is reached only through its own supplier; ids that are not UUIDs are 404", async () => {
    const [one, two] = await Promise.all([newSupplier(), newSupplier()]);
    const si = (await createSI(one, { sku: sku(), item: pepper.sku, packQuantity: "1", packUnit: "kg" })).body.id;
    expect((await getSI(two, si)).status).toBe(404);
    expect((await patchSI(two, si, { description: "x" })).status).toBe(404);
    expect((await getSupplier("not-a-uuid")).status).toBe(404);
    expect((await getSI(one, "not-a-uuid")).status).toBe(404);
  });

  it("a lot may point only at a supplier of its own company (composite foreign key)", async () => {
    const otherSupplier = (await createSupplier(supplierBody(), "otherAdmin")).body.id;
    const ours = await newSupplier();
    const lot = { company_id: a.company.id, item_id: pepper.id, received_on: "2026-11-30", unit_cost: "0.01" };
    await expect(db()("lots").insert({ ...lot, code: `L-${tag()}`, supplier_id: otherSupplier })).rejects.toMatchObject({ code: "23503" });
    await expect(db()("lots").insert({ ...lot, code: `L-${tag()}`, supplier_id: ours })).resolves.toBeDefined();
  });
});
