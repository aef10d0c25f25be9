// Recipes and their versions through the route handlers, against the real PostgreSQL.
// Check values: 2.5 g of a 6.25 % nitrite cure per kg of meat block = 156.25 ppm ingoing nitrite,
// within the 9 CFR 424.21(c) comminuted maximum of 156.25 ppm (trade-facts §1-§3 [calc]);
// 3 g/kg of it = 187.5 ppm, over that maximum. A 70:30 lean to fat block is common practice.
import { randomUUID } from "node:crypto";
import { beforeAll, describe, expect, it } from "vitest";
import { GET as recipeGet } from "../../app/api/recipes/[id]/route";
import { POST as versionPost } from "../../app/api/recipes/[id]/versions/route";
import { GET as recipesList, POST as recipeCreate } from "../../app/api/recipes/route";
import { POST as itemCreate } from "../../app/api/items/route";
import { db } from "../../db/client";
import { createCompany, tag, type TestCompany } from "../support/factory";
import { call } from "../support/http";
import { sessionCookieFor } from "../support/sessions";

let a: TestCompany;
let b: TestCompany;
const cookie: Record<string, string> = {};
const sku = (p: string) => `${p}-${tag().toUpperCase()}`;
const code = () => `R${tag().slice(0, 8).toUpperCase()}`;
const items: Record<string, string> = {};

const create = (body: Record<string, unknown>, who = "kitchen_lead", key?: string) =>
  call(recipeCreate, { path: "/api/recipes", body, cookie: cookie[who], headers: key ? { "Idempotency-Key": key } : undefined });
const get = (ref: string, who = "kitchen_lead", query = "") => call(recipeGet, { path: `/api/recipes/${ref}${query}`, params: { id: ref }, cookie: cookie[who] });
const fieldsOf = (res: { body: { error?: { details?: { fields?: Record<string, string[]> } } } }) => Object.keys(res.body.error?.details?.fields ?? {}).sort();

beforeAll(async () => {
  [a, b] = await Promise.all([createCompany(), createCompany()]);
  for (const role of ["admin", "manager", "buyer", "kitchen_lead", "accountant"] as const) cookie[role] = await sessionCookieFor(a.users[role].id);
  cookie.otherAdmin = await sessionCookieFor(b.users.admin.id);
  const make = async (key: string, body: Record<string, unknown>) => {
    const res = await call(itemCreate, { path: "/api/items", body: { sku: sku(key), ...body }, cookie: cookie.admin });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    items[key] = res.body.sku;
  };
  await make("cure", { name: "Pink cure 6.25 %", category: "cure", unit: "g", nitriteFraction: "0.0625", nitrateFraction: "0" });
  await make("salt", { name: "Fine salt", category: "ingredient", unit: "g" });
  await make("pepper", { name: "White pepper", category: "spice", unit: "g" });
  await make("water", { name: "Ice water", category: "ingredient", unit: "ml", densityGPerMl: "1" });
  await make("wine", { name: "Red wine", category: "ingredient", unit: "ml" });
  await make("hog", { name: "Hog 32/35", category: "casing", unit: "pc", casingKind: "natural_hog", calibreMinMm: "32", calibreMaxMm: "35", putUp: "hank" });
});

const farmhouse = (over: Record<string, unknown> = {}) => ({
  code: code(),
  name: "Smoked farmhouse sausage",
  productClass: "comminuted",
  storage: "keep_refrigerated",
  meatBlock: [{ name: "Pork shoulder, lean", percent: "70" }, { name: "Back fat", percent: "30" }],
  lines: [
    { item: items.salt, rate: "18", unit: "g/kg" },
    { item: items.cure, rate: "2.5", unit: "g/kg" },
    { item: items.pepper, rate: "0.3", unit: "%" },
    { item: items.water, rate: "100", unit: "ml/kg" },
  ],
  casing: { item: items.hog, calibreMinMm: "32", calibreMaxMm: "36", linkWeight: { quantity: "120", unit: "g" } },
  processNotes: "Grind 4.5 mm; stuff below 4 °C; smoke to 68 °C core.",
  ...over,
});

describe("a recipe and its first version", () => {
  it("keeps the meat block, lines per kg of meat and the cure check at 156.25 ppm, within the comminuted maximum", async () => {
    const body = farmhouse();
    const res = await create(body);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const v = res.body.version;
    expect(res.body).toMatchObject({ code: body.code, name: body.name, currentVersion: 1, archived: false, versions: [{ version: 1 }] });
    expect(v).toMatchObject({
      version: 1, productClass: "comminuted", method: "comminuted", storage: "keep_refrigerated",
      meatBlock: [{ name: "Pork shoulder, lean", percent: "70" }, { name: "Back fat", percent: "30" }],
      casing: { item: { sku: items.hog }, calibreMinMm: "32", calibreMaxMm: "36", linkWeightG: "120", linkLengthM: null },
      createdBy: { id: a.users.kitchen_lead.id },
    });
    expect(v.lines.map((l: { perKgMeat: unknown }) => l.perKgMeat)).toEqual([
      { quantity: "18", unit: "g" }, { quantity: "2.5", unit: "g" }, { quantity: "3", unit: "g" }, { quantity: "100", unit: "ml" },
    ]);
    // 1000 g meat + 18 + 2.5 + 3 + 100 ml x 1 g/ml
    expect(v.fillingGramsPerKgMeat).toBe("1123.5");
    expect(v.cure.nitritePpm).toBe("156.2500");
    const max = v.cure.checks.find((c: { kind: string; substance: string }) => c.kind === "max" && c.substance === "nitrite");
    expect(max).toMatchObject({ table: "us", limitPpm: "156.25", within: true });
    expect(v.cure.blocked).toBe(false);
    expect(v.cure.caution).toMatch(/toxic/i);
  });

  it("is read back by id or code, and listed", async () => {
    const body = farmhouse();
    const made = await create(body);
    const byCode = await get(body.code.toLowerCase());
    expect(byCode.status).toBe(200);
    expect(byCode.body.id).toBe(made.body.id);
    const list = await call(recipesList, { path: "/api/recipes", cookie: cookie.accountant });
    expect(list.body.recipes).toContainEqual(expect.objectContaining({ code: body.code, hasCure: true, currentVersion: 1 }));
  });

  it("answers a replayed create once (Idempotency-Key)", async () => {
    const key = randomUUID();
    const body = farmhouse();
    const first = await create(body, "kitchen_lead", key);
    const again = await create(body, "kitchen_lead", key);
    expect(again.status).toBe(201);
    expect(again.body.id).toBe(first.body.id);
    expect(await db()("recipes").where({ company_id: a.company.id, code: body.code }).count("* as n").first()).toEqual({ n: "1" });
  });
});

describe("a potassium nitrite cure", () => {
  it("reads 2.368 g/kg of a 6.25 % potassium nitrite cure as 148 ppm potassium nitrite, within the comminuted maximum and at the keep-refrigerated minimum", async () => {
    // The cure item says its salt (trade-facts §2: "a cure item records which salt it carries"), and
    // the recipe's check counts it as potassium nitrite (lib/cure/calculate.ts, limits.ts):
    // - ppm = cure x nitrite fraction x 1,000,000 / meat block (FSIS Directive 7620.3 ch. 3, trade-facts §3)
    //   = 2.368 g x 0.0625 x 1,000,000 / 1000 g = 148 ppm potassium nitrite [calc];
    // - 9 CFR 424.21(c)'s comminuted row is "sodium or potassium nitrite: 1/4 oz to 100 lb chopped
    //   meat" (= 156.25 ppm) at one figure, so 148 ppm potassium nitrite is compared with 156.25;
    // - as sodium nitrite, 148 / 1.2335 = 119.98378... ppm (1.2335, trade-facts §2 [sec/calc]);
    // - the keep-refrigerated minimum (FSIS policy, 120 ppm sodium nitrite) is 148 ppm for potassium
    //   nitrite: 120 x 1.2335 = 148.02, truncated to 148 (trade-facts §2), so 148 meets it exactly.
    // Read as sodium nitrite instead, the same rate would give nitriteBySalt.sodium 148 and salt "sodium".
    const potassium = await call(itemCreate, {
      path: "/api/items", cookie: cookie.admin,
      body: { sku: sku("KNO2"), name: "Potassium nitrite cure 6.25 %", category: "cure", unit: "g", nitriteFraction: "0.0625", nitrateFraction: "0", nitriteSalt: "potassium" },
    });
    expect(potassium.status, JSON.stringify(potassium.body)).toBe(201);
    const res = await create(farmhouse({ lines: [{ item: items.salt, rate: "18", unit: "g/kg" }, { item: potassium.body.sku, rate: "2.368", unit: "g/kg" }] }));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const read = await get(res.body.code);
    for (const cure of [res.body.version.cure, read.body.version.cure]) {
      expect(cure).toMatchObject({ nitriteBySalt: { sodium: "0.0000", potassium: "148.0000" }, nitritePpm: "119.9838", blocked: false, warnings: 0 });
      const byId = (id: string) => cure.checks.find((c: { id: string }) => c.id === id);
      expect(byId("us-nitrite-comminuted")).toMatchObject({ salt: "potassium", limitPpm: "156.25", ppm: "148.0000", deviationPpm: "-8.2500", within: true, severity: "block" });
      expect(byId("us-keep-refrigerated-min")).toMatchObject({ salt: "potassium", limitPpm: "148", ppm: "148.0000", within: true });
    }
  });
});

describe("pumped products: lines per kg of pickle", () => {
  it("2 lb of sodium nitrite in 1,000 lb of pickle at a 10 % pump is 200 ppm, within the pumped maximum", async () => {
    // trade-facts §3 check value [calc]: 2 lb NaNO2 / 1,000 lb pickle = 2 g per kg of pickle;
    // ppm = nitrite in the pickle x pump fraction x 1,000,000 / pickle weight (FSIS Directive 7620.3 ch. 3)
    const nitrite = await call(itemCreate, {
      path: "/api/items", cookie: cookie.admin,
      body: { sku: sku("NANO2"), name: "Sodium nitrite, pure", category: "cure", unit: "g", nitriteFraction: "1", nitrateFraction: "0" },
    });
    expect(nitrite.status, JSON.stringify(nitrite.body)).toBe(201);
    const res = await create(farmhouse({
      productClass: "pumped", storage: "keep_refrigerated", casing: undefined,
      pickle: { kgPerKgMeat: "0.12", pumpFraction: "0.1" },
      lines: [{ item: nitrite.body.sku, rate: "2", unit: "g/kg", basis: "pickle" }, { item: items.salt, rate: "80", unit: "g/kg", basis: "pickle" }],
    }));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.version).toMatchObject({ method: "pumped", pickle: { kgPerKgMeat: "0.12", pumpFraction: "0.1" } });
    // 1 kg of meat makes 0.12 kg of pickle: 0.24 g of nitrite and 9.6 g of salt in it
    expect(res.body.version.lines.map((l: { perKgMeat: { quantity: string } }) => l.perKgMeat.quantity)).toEqual(["0.24", "9.6"]);
    expect(res.body.version.cure.nitritePpm).toBe("200.0000");
    const max = res.body.version.cure.checks.find((c: { kind: string; substance: string; table: string }) => c.kind === "max" && c.substance === "nitrite" && c.table === "us");
    expect(max).toMatchObject({ limitPpm: "200", within: true });
  });

  it("puts the cure of a pumped product into the pickle, not on the meat", async () => {
    const res = await create(farmhouse({ productClass: "pumped", casing: undefined, pickle: { kgPerKgMeat: "0.12", pumpFraction: "0.1" }, lines: [{ item: items.cure, rate: "2", unit: "g/kg" }] }));
    expect(res.status).toBe(422);
    expect(fieldsOf(res)).toEqual(["lines.0.basis"]);
  });
});

describe("versions", () => {
  it("writes a change as version 2 and leaves version 1 as it was", async () => {
    const body = farmhouse();
    const made = await create(body);
    const v2 = await call(versionPost, {
      path: `/api/recipes/${made.body.id}/versions`, params: { id: made.body.id }, cookie: cookie.manager,
      body: { ...body, code: undefined, lines: [{ item: items.salt, rate: "20", unit: "g/kg" }, { item: items.cure, rate: "2.4", unit: "g/kg" }], changeNote: "Less cure, more salt" },
    });
    expect(v2.status, JSON.stringify(v2.body)).toBe(201);
    expect(v2.body.currentVersion).toBe(2);
    expect(v2.body.version.cure.nitritePpm).toBe("150.0000");
    expect(v2.body.versions.map((v: { version: number; changeNote: string }) => [v.version, v.changeNote])).toEqual([[1, ""], [2, "Less cure, more salt"]]);
    const v1 = await get(made.body.id, "kitchen_lead", "?version=1");
    expect(v1.body.version.lines.find((l: { item: { sku: string } }) => l.item.sku === items.cure).rate).toBe("2.5");
    expect((await get(made.body.id, "kitchen_lead", "?version=3")).status).toBe(404);
  });

  it("refuses to change a written version in the database itself", async () => {
    const made = await create(farmhouse());
    await expect(db()("recipe_versions").where({ recipe_id: made.body.id }).update({ process_notes: "changed" })).rejects.toThrow(/never changed/);
    await expect(db()("recipe_lines").whereIn("recipe_version_id", db()("recipe_versions").select("id").where({ recipe_id: made.body.id })).update({ rate: "9" })).rejects.toThrow(/never changed/);
  });
});

describe("bad input: 422 naming the field, nothing written", () => {
  it("refuses a cure over the statutory maximum (3 g/kg of 6.25 % = 187.5 ppm > 156.25)", async () => {
    const body = farmhouse({ lines: [{ item: items.cure, rate: "3", unit: "g/kg" }] });
    const res = await create(body);
    expect(res.status).toBe(422);
    expect(fieldsOf(res)).toEqual(["lines.0.rate"]);
    expect(res.body.error.details.fields["lines.0.rate"][0]).toMatch(/187\.5000 ppm is over the 156\.25 ppm maximum/);
    expect(await db()("recipes").where({ company_id: a.company.id, code: body.code }).first()).toBeUndefined();
  });

  it.each([
    ["shares that do not add up to 100", { meatBlock: [{ name: "Lean", percent: "70" }, { name: "Fat", percent: "20" }] }, ["meatBlock"]],
    ["an unknown product class", { productClass: "salami" }, ["productClass"]],
    ["a pumped product without its pickle", { productClass: "pumped", lines: [] }, ["pickle"]],
    ["a pickle for a comminuted product", { pickle: { kgPerKgMeat: "0.1" } }, ["pickle"]],
    ["a bad code", { code: "no spaces allowed" }, ["code"]],
  ])("%s", async (_what, over, fields) => {
    const res = await create(farmhouse(over));
    expect(res.status).toBe(422);
    expect(fieldsOf(res)).toEqual(fields);
  });

  it("names the line: unknown item, a volume rate without density, a casing as a line, cure by volume", async () => {
    const res = await create(farmhouse({
      lines: [
        { item: "NO-SUCH-SKU", rate: "1", unit: "g/kg" },
        { item: items.wine, rate: "20", unit: "ml/kg" },
        { item: items.hog, rate: "1", unit: "g/kg" },
        { item: items.cure, rate: "2", unit: "ml/kg" },
      ],
    }));
    expect(res.status).toBe(422);
    expect(fieldsOf(res)).toEqual(["lines.0.item", "lines.1.unit", "lines.2.item", "lines.3.unit"]);
  });

  it("refuses a casing item outside the recipe's calibre range", async () => {
    const res = await create(farmhouse({ casing: { item: items.hog, calibreMinMm: "20", calibreMaxMm: "24" } }));
    expect(res.status).toBe(422);
    expect(fieldsOf(res)).toEqual(["casing.item"]);
    expect(res.body.error.details.fields["casing.item"][0]).toMatch(/outside the recipe's calibre range 20-24 mm/);
  });

  it("refuses a code already taken", async () => {
    const body = farmhouse();
    await create(body);
    const res = await create({ ...farmhouse(), code: body.code });
    expect(res.status).toBe(422);
    expect(fieldsOf(res)).toEqual(["code"]);
  });
});

describe("who may", () => {
  it("leads, managers and admins write recipes; buyers neither read nor write; the accountant reads", async () => {
    expect((await create(farmhouse(), "buyer")).status).toBe(403);
    expect((await create(farmhouse(), "accountant")).status).toBe(403);
    const made = await create(farmhouse(), "admin");
    expect((await get(made.body.id, "buyer")).status).toBe(403);
    expect((await get(made.body.id, "accountant")).status).toBe(200);
    expect((await get(made.body.id, "otherAdmin")).status).toBe(404);
    expect((await call(recipeGet, { path: `/api/recipes/${made.body.id}`, params: { id: made.body.id } })).status).toBe(401);
  });
});
