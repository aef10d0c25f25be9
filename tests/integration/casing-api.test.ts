// POST /api/calculations/casing through its route handler, against the real PostgreSQL.
// Check values: 32/35 mm hog hank = 45 kg of filling per 91.44 m hank (trade-facts §4: capacity
// table [practice]; hank = 100 yd, 1 yd = 0.9144 m, NIST SP 811); 1 lb = 0.45359237 kg (NIST SP 811).
import { evaluate } from "mathjs";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as casingCalc } from "../../app/api/calculations/casing/route";
import { POST as itemCreate } from "../../app/api/items/route";
import { db } from "../../db/client";
import { createCompany, tag, type TestCompany } from "../support/factory";
import { call } from "../support/http";
import { sessionCookieFor } from "../support/sessions";

let a: TestCompany;
let b: TestCompany;
const cookie: Record<string, string> = {};
const sku = (p: string) => `${p}-${tag().toUpperCase()}`;
let hog: string;
let sheepOutside: string;
let collagen: string;
let cure: string;

const calc = (body: Record<string, unknown>, who = "kitchen_lead") => call(casingCalc, { path: "/api/calculations/casing", body, cookie: cookie[who] });
const fieldsOf = (res: { body: { error?: { details?: { fields?: Record<string, string[]> } } } }) => Object.keys(res.body.error?.details?.fields ?? {}).sort();

beforeAll(async () => {
  [a, b] = await Promise.all([createCompany(), createCompany()]);
  for (const role of ["admin", "buyer", "kitchen_lead", "accountant"] as const) cookie[role] = await sessionCookieFor(a.users[role].id);
  cookie.otherLead = await sessionCookieFor(b.users.kitchen_lead.id);
  const make = async (body: Record<string, unknown>) => {
    const res = await call(itemCreate, { path: "/api/items", body: { sku: sku("C"), ...body }, cookie: cookie.admin });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body.sku as string;
  };
  hog = await make({ name: "Hog 32/35", category: "casing", unit: "pc", casingKind: "natural_hog", calibreMinMm: "32", calibreMaxMm: "35", putUp: "hank" });
  // the items API asks for a capacity outside the table; a row without one (older data) is written directly
  sheepOutside = sku("SHEEP");
  await db()("items").insert({
    company_id: a.company.id, sku: sheepOutside, name: "Sheep 26/28", category: "casing", stock_unit: "pc", track_lots: true, track_dates: true,
    casing_kind: "natural_sheep", calibre_min_mm: "26", calibre_max_mm: "28", put_up: "hank", put_up_metres: "91.44", storage: "salted",
  });
  collagen = await make({ name: "Collagen 21", category: "casing", unit: "m", casingKind: "collagen", calibreMinMm: "21" });
  cure = await make({ name: "Cure", category: "cure", unit: "g", nitriteFraction: "0.0625", nitrateFraction: "0" });
});

describe("a natural casing item: capacity per put-up", () => {
  it("plans 90 kg of filling in 32/35 mm hog as 2 hanks, 182.88 m, from the table's 45 kg", async () => {
    const res = await calc({ fillingMass: { quantity: "90", unit: "kg" }, item: hog });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body).toMatchObject({
      fillingKg: "90", metres: "182.88", putUps: "2", putUpsToOpen: 2,
      basis: { kind: "capacity", capacityKgPerPutUp: "45", putUpMetres: "91.44" },
      casing: { sku: hog, calibreMinMm: "32", calibreMaxMm: "35", putUp: "hank" },
    });
    // the items API stored the table default (45 kg) on the item when it was created
    expect(res.body.basis.source).toBe("The item's capacity per hank.");
  });

  it("takes pounds exactly: 200 lb is 90.718474 kg, a third hank to open", async () => {
    // 200 lb = 90.718474 kg (NIST SP 811: 1 lb = 0.45359237 kg) -> 2.0159... hanks -> 3 to open
    const res = await calc({ fillingMass: { quantity: "200", unit: "lb" }, item: hog });
    expect(res.body.fillingKg).toBe("90.718474");
    expect(res.body.putUpsToOpen).toBe(3);
  });

  it("counts links by weight and by length", async () => {
    const byWeight = await calc({ fillingMass: { quantity: "90", unit: "kg" }, item: hog, link: { weight: { quantity: "100", unit: "g" } } });
    expect(byWeight.body.links).toEqual({ count: 900, gramsPerLink: "100", metresPerLink: "0.2032", leftoverGrams: "0" });
    const byLength = await calc({ fillingMass: { quantity: "90", unit: "kg" }, item: hog, link: { length: { quantity: "20.32", unit: "cm" } } });
    expect(byLength.body.links).toMatchObject({ count: 900, gramsPerLink: "100" });
  });

  it("uses a capacity the person enters over the table's", async () => {
    const res = await calc({ fillingMass: { quantity: "96", unit: "kg" }, item: hog, capacityKg: "48" });
    expect(res.body).toMatchObject({ putUps: "2", basis: { capacityKgPerPutUp: "48", source: "The capacity you entered." } });
  });

  it("asks for a capacity when the calibre is outside the table (no ideal cylinder for natural casings)", async () => {
    const res = await calc({ fillingMass: { quantity: "10", unit: "kg" }, item: sheepOutside });
    expect(res.status).toBe(422);
    expect(fieldsOf(res)).toEqual(["capacityKg"]);
  });
});

describe("a manufactured casing: cylinder with a fill factor", () => {
  it("matches mathjs for 21 mm collagen at density 1.03 and fill 0.9", async () => {
    const res = await calc({ fillingMass: { quantity: "10", unit: "kg" }, item: collagen });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.basis).toMatchObject({ kind: "cylinder", calibreMm: "21", fillFactor: "0.9", density: "1.03", putUpMetres: null });
    expect(res.body.putUpsToOpen).toBeNull();
    // mathjs 14.9.1 (general-purpose unit library, binary floats) as the outside reference
    const ref = evaluate("10 kg / (1.03 g/cm^3 * pi * (21 mm / 2)^2 * 0.9)").toNumber("m");
    expect(Math.abs(Number(res.body.metres) - ref)).toBeLessThan(0.0001);
  });

  it("plans a bare calibre with the given fill factor", async () => {
    const res = await calc({ fillingMass: { quantity: "5", unit: "kg" }, calibreMm: "38", fillFactor: "0.95" });
    const ref = evaluate("5 kg / (1.03 g/cm^3 * pi * (38 mm / 2)^2 * 0.95)").toNumber("m");
    expect(Math.abs(Number(res.body.metres) - ref)).toBeLessThan(0.0001);
  });
});

describe("bad input: 422 naming the field", () => {
  it.each([
    [{ fillingMass: { quantity: "0", unit: "kg" }, calibreMm: "21" }, ["fillingMass.quantity"]],
    [{ fillingMass: { quantity: "5", unit: "m" }, calibreMm: "21" }, ["fillingMass.unit"]],
    [{ fillingMass: { quantity: "5", unit: "kg" } }, ["item"]],
    [{ fillingMass: { quantity: "5", unit: "kg" }, calibreMm: "21", fillFactor: "1.2" }, ["fillFactor"]],
    [{ fillingMass: { quantity: "5", unit: "kg" }, calibreMm: "21", link: { length: { quantity: "2", unit: "kg" } } }, ["link.length.unit"]],
    [{ fillingMass: { quantity: 5, unit: "kg" }, calibreMm: "21" }, ["fillingMass.quantity"]],
  ])("%j", async (body, fields) => {
    const res = await calc(body as Record<string, unknown>);
    expect(res.status).toBe(422);
    expect(fieldsOf(res)).toEqual(fields);
  });

  it("refuses an item that is not a casing", async () => {
    const res = await calc({ fillingMass: { quantity: "5", unit: "kg" }, item: cure });
    expect(res.status).toBe(422);
    expect(fieldsOf(res)).toEqual(["item"]);
  });
});

describe("who may calculate", () => {
  it("needs a session; a buyer (no planning) is refused; another company's item is not found", async () => {
    expect((await call(casingCalc, { path: "/api/calculations/casing", body: { fillingMass: { quantity: "5", unit: "kg" }, calibreMm: "21" } })).status).toBe(401);
    expect((await calc({ fillingMass: { quantity: "5", unit: "kg" }, calibreMm: "21" }, "buyer")).status).toBe(403);
    expect((await calc({ fillingMass: { quantity: "5", unit: "kg" }, calibreMm: "21" }, "accountant")).status).toBe(200);
    expect((await calc({ fillingMass: { quantity: "5", unit: "kg" }, item: hog }, "otherLead")).status).toBe(404);
  });
});
