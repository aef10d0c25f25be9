// POST /api/calculations/cure through its route handler, against the real PostgreSQL (the company's
// table and scale resolution come from the companies row). Check values: 2.5 g/kg of a 6.25 % cure
// = 156.25 ppm, within the 156.25 ppm comminuted maximum (trade-facts §1 [calc]; 9 CFR 424.21(c):
// 1/4 oz to 100 lb chopped meat); 120 ppm needs 1.92 g/kg of it (trade-facts §3 [calc]).
import { beforeAll, describe, expect, it } from "vitest";
import { POST as cureCalc } from "../../app/api/calculations/cure/route";
import { db } from "../../db/client";
import { getCureSettings, updateCureSettings } from "../../lib/data/companies";
import { createCompany, type TestCompany } from "../support/factory";
import { call } from "../support/http";
import { currentUser, sessionCookieFor } from "../support/sessions";

let a: TestCompany;
let eu: TestCompany;
const cookie: Record<string, string> = {};

const calc = (body: unknown, who = "kitchen_lead") => call(cureCalc, { path: "/api/calculations/cure", body, cookie: cookie[who] });
const fieldsOf = (res: { body: { error?: { details?: { fields?: Record<string, string[]> } } } }) => Object.keys(res.body.error?.details?.fields ?? {}).sort();

const pink = { quantity: "2.5", unit: "g", nitriteFraction: "0.0625" };
const base = { method: "comminuted", storage: "keep_refrigerated", meatBlock: { quantity: "1", unit: "kg" }, cures: [pink] };

beforeAll(async () => {
  [a, eu] = await Promise.all([createCompany(), createCompany()]);
  for (const role of ["admin", "manager", "buyer", "kitchen_lead", "accountant"] as const) cookie[role] = await sessionCookieFor(a.users[role].id);
  cookie.euLead = await sessionCookieFor(eu.users.kitchen_lead.id);
  await db()("companies").where({ id: eu.company.id }).update({ regulatory_table: "eu", scale_resolution_g: "0.01" });
});

describe("POST /api/calculations/cure", () => {
  it("needs a session", async () => {
    const res = await call(cureCalc, { path: "/api/calculations/cure", body: base });
    expect(res.status).toBe(401);
  });

  it("lets those who read plans calculate (kitchen lead, accountant, manager, admin), not a buyer", async () => {
    for (const who of ["kitchen_lead", "accountant", "manager", "admin"]) expect((await calc(base, who)).status, who).toBe(200);
    const res = await calc(base, "buyer");
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe("FORBIDDEN");
  });

  it("2.5 g/kg of a 6.25 % cure: 156.2500 ppm within the US comminuted maximum, with the caution (9 CFR 424.21(c))", async () => {
    const res = await calc(base);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body).toMatchObject({ method: "comminuted", productClass: "comminuted", table: "us", nitritePpm: "156.2500", nitratePpm: "0.0000", blocked: false, warnings: 0, requiredCure: null });
    const max = res.body.checks.find((c: { id: string }) => c.id === "us-nitrite-comminuted");
    expect(max).toMatchObject({ table: "us", kind: "max", substance: "nitrite", limitPpm: "156.25", ppm: "156.2500", within: true, severity: "block" });
    expect(max.citation).toMatchObject({ regulation: "9 CFR 424.21(c)", readOn: "2026-12-02" });
    expect(res.body.checks.find((c: { id: string }) => c.id === "us-keep-refrigerated-min")).toMatchObject({ kind: "min", within: true });
    expect(res.body.caution).toMatch(/toxic in overdose/);
  });

  it("accepts a single cure object, and names its fields as cure.*", async () => {
    const { cures: _, ...rest } = base;
    expect((await calc({ ...rest, cure: pink })).body.nitritePpm).toBe("156.2500");
    const res = await calc({ ...rest, cure: { quantity: "2.5", unit: "g" } });
    expect(res.status).toBe(422);
    expect(fieldsOf(res)).toEqual(["cure.nitriteFraction"]);
  });

  it("uses the company's scale resolution for the cure needed, rounding toward compliance", async () => {
    const inverse = { ...base, targetNitritePpm: "120", cures: [{ nitriteFraction: "0.0625" }] };
    // the US company's default 0.1 g: 1.92 g rounds up to 2.0 g over the keep-refrigerated floor
    expect((await calc(inverse)).body.requiredCure).toMatchObject({ quantity: "2", exactQuantity: "1.92", scaleResolutionG: "0.1", rounding: "up" });
    const res = await calc({ ...inverse, table: "us" }, "euLead"); // a company with a 0.01 g scale
    expect(res.body.requiredCure).toMatchObject({ quantity: "1.92", rounding: "exact", scaleResolutionG: "0.01" });
  });

  it("blocks a formulation over the statutory maximum, and warns under the keep-refrigerated floor", async () => {
    const over = await calc({ ...base, cures: [{ ...pink, quantity: "2.6" }] });
    expect(over.body).toMatchObject({ blocked: true, nitritePpm: "162.5000" });
    const under = await calc({ ...base, cures: [{ ...pink, quantity: "1.5" }] });
    expect(under.body).toMatchObject({ blocked: false, warnings: 1 });
  });

  it("table none: no check, and says so", async () => {
    const res = await calc({ ...base, table: "none" });
    expect(res.body.checks).toEqual([]);
    expect(res.body.notes.join(" ")).toMatch(/no regulatory check was made/);
  });
});

describe("bad input is 422 naming the field", () => {
  it("a cure without its nitrite fraction", async () => {
    const res = await calc({ ...base, cures: [{ quantity: "2.5", unit: "g" }] });
    expect(res.status).toBe(422);
    expect(fieldsOf(res)).toEqual(["cures.0.nitriteFraction"]);
  });

  it("a zero or negative meat block, or one in a volume unit", async () => {
    expect(fieldsOf(await calc({ ...base, meatBlock: { quantity: "0", unit: "kg" } }))).toEqual(["meatBlock.quantity"]);
    expect(fieldsOf(await calc({ ...base, meatBlock: { quantity: "-1", unit: "kg" } }))).toEqual(["meatBlock.quantity"]);
    expect(fieldsOf(await calc({ ...base, meatBlock: { quantity: "1", unit: "l" } }))).toEqual(["meatBlock.unit"]);
  });

  it("an unknown product class, table or method; a class the method cannot make", async () => {
    expect(fieldsOf(await calc({ ...base, productClass: "salami" }))).toEqual(["productClass"]);
    expect(fieldsOf(await calc({ ...base, table: "uk" }))).toEqual(["table"]);
    expect(fieldsOf(await calc({ ...base, method: "smoked" }))).toEqual(["method"]);
    const res = await calc({ ...base, productClass: "dry_cured" });
    expect(fieldsOf(res)).toEqual(["productClass"]);
    expect(res.body.error.details.fields.productClass[0]).toMatch(/dry and fermented sausages included/);
  });

  it("table eu without a batch mass, sent or from the company's setting", async () => {
    expect(fieldsOf(await calc({ ...base, table: "eu" }))).toEqual(["batchMass"]);
    const res = await calc(base, "euLead");
    expect(res.status).toBe(422);
    expect(fieldsOf(res)).toEqual(["batchMass"]);
    const ok = await calc({ ...base, batchMass: { quantity: "1.1", unit: "kg" } }, "euLead");
    expect(ok.status, JSON.stringify(ok.body)).toBe(200);
    expect(ok.body).toMatchObject({ table: "eu", checks: [], blocked: false, euIonsMgPerKg: { nitrite: "95.1705" } });
    expect(ok.body.notes.join(" ")).toMatch(/unverified and were not applied/);
  });

  it("a JSON number for a quantity, a pumped cure without pickle or pump level", async () => {
    expect(fieldsOf(await calc({ ...base, meatBlock: { quantity: 1, unit: "kg" } }))).toEqual(["meatBlock.quantity"]);
    expect(fieldsOf(await calc({ ...base, method: "pumped" }))).toEqual(["pickle", "pumpFraction"]);
  });
});

describe("the company's cure settings", () => {
  it("default to the US table and a 0.1 g scale; only an admin changes them", async () => {
    const admin = await currentUser(a.users.admin.id);
    expect(await getCureSettings(admin)).toEqual({ regulatoryTable: "us", scaleResolutionG: "0.1" });
    const manager = await currentUser(a.users.manager.id);
    await expect(updateCureSettings(manager, { regulatoryTable: "none", scaleResolutionG: "1" })).rejects.toMatchObject({ status: 403 });
    const other = await currentUser(eu.users.admin.id);
    expect(await updateCureSettings(other, { regulatoryTable: "eu", scaleResolutionG: "0.05" })).toEqual({ regulatoryTable: "eu", scaleResolutionG: "0.05" });
    // the other company's setting is untouched
    expect(await getCureSettings(admin)).toEqual({ regulatoryTable: "us", scaleResolutionG: "0.1" });
    await db()("companies").where({ id: eu.company.id }).update({ scale_resolution_g: "0.01" });
  });
});
