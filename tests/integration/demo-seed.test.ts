import { execFile } from "node:child_process";
import { promisify } from "node:util";
import knexFactory, { type Knex } from "knex";
import { register as registerCjs } from "tsx/cjs/api";
import { register as registerEsm } from "tsx/esm/api";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { closeDb } from "../../db/client";
import { DEMO_COMPANIES, DEMO_PASSWORD } from "../../db/seeds/demo-data";
import { DEMO_ITEMS, SUPPLIERS } from "../../db/seeds/demo-stock-catalogue";
import { loadDemo, type DemoLoad } from "../../db/seeds/load-demo";
import { hashPassword, verifyPassword } from "../../lib/auth/password";
import { getStock } from "../../lib/data/stock";
import { listSupplierItems, listSuppliers } from "../../lib/data/suppliers";
import { isValidGtin } from "../../lib/gs1/gtin";
import { dec } from "../../lib/units";
import { tag } from "../support/factory";
import { currentUser } from "../support/sessions";

// The demo seed must run on an EMPTY database, so it gets one of its own: created through the
// cluster's superuser, which db/pg.sh sets up with trust authentication on 127.0.0.1.
const appUrl = new URL(process.env.DATABASE_URL!);
const adminUrl = Object.assign(new URL(appUrl), { username: "postgres", password: "", pathname: "/postgres" });
let admin: Knex;

/** A new, migrated database owned by the app's role. */
async function freshDatabase(): Promise<{ knex: Knex; url: string; drop: () => Promise<void> }> {
  const name = `hl_test_seed_${tag()}`;
  await admin.raw(`create database ?? owner ??`, [name, appUrl.username]);
  const url = Object.assign(new URL(appUrl), { pathname: `/${name}` }).toString();
  const knex = knexFactory({ client: "pg", connection: url, pool: { min: 0, max: 2 } });
  const drop = async () => {
    await knex.destroy();
    await admin.raw(`drop database if exists ?? with (force)`, [name]);
  };
  // knex imports the .ts migrations itself, outside vitest's transform: tsx loads them
  const unCjs = registerCjs();
  const unEsm = registerEsm();
  try {
    await knex.migrate.latest({ directory: "db/migrations", loadExtensions: [".ts"] });
  } catch (e) {
    await drop();
    throw e;
  } finally {
    unCjs();
    await unEsm();
  }
  return { knex, url, drop };
}

let seedDb: Knex;
let dropSeedDb: (() => Promise<void>) | undefined;
let loaded: DemoLoad;
let loadSeconds: number;
let planWarnings: unknown[][];

beforeAll(async () => {
  admin = knexFactory({ client: "pg", connection: adminUrl.toString(), pool: { min: 0, max: 1 } });
  let url: string;
  ({ knex: seedDb, url, drop: dropSeedDb } = await freshDatabase());
  // the demo stock is posted through lib/data, whose handle (db/client.ts) is opened on first use
  // from DATABASE_URL: point it at the seed's own database before anything here opens it
  process.env.DATABASE_URL = url;
  const warn = vi.spyOn(console, "warn");
  const started = performance.now();
  loaded = await loadDemo(seedDb);
  loadSeconds = (performance.now() - started) / 1000;
  planWarnings = [...warn.mock.calls];
  warn.mockRestore();
}, 180_000);

afterAll(async () => {
  await closeDb();
  await dropSeedDb?.();
  await admin?.destroy();
});

const countOf = async (knex: Knex, table: string, where: Record<string, unknown> = {}) =>
  Number((await knex(table).where(where).count<{ n: string }[]>("* as n"))[0]!.n);

describe("loadDemo on an empty database", () => {
  it("loads the two demo companies, their kitchens and one user per role", async () => {
    expect(loaded.companies).toBe(true);
    expect(loaded.stock).not.toBeNull();

    const companies = await seedDb("companies").orderBy("name");
    expect(companies.map((c) => c.name).sort()).toEqual(["Ferngill Larder", "Quillmoor Provisions"]);
    const first = companies.find((c) => c.name === "Quillmoor Provisions")!;
    expect(first).toMatchObject({ time_zone: "Europe/London", currency: "GBP" });

    const kitchens = await seedDb("kitchens").where({ company_id: first.id }).orderBy("code");
    expect(kitchens.map((k) => k.code)).toEqual(["LANE", "ROPE", "YARD"]);

    // the sign-ins README.md documents
    const users = await seedDb("app_users").where({ company_id: first.id });
    expect(Object.fromEntries(users.map((u) => [u.role, u.email]))).toEqual({
      admin: "admin@hankandlot.test",
      manager: "manager@hankandlot.test",
      buyer: "buyer@hankandlot.test",
      kitchen_lead: "lead@hankandlot.test",
      accountant: "accountant@hankandlot.test",
    });
    const second = companies.find((c) => c.name === "Ferngill Larder")!;
    expect(await seedDb("app_users").where({ company_id: second.id }).pluck("email")).toEqual(["other@hankandlot.test"]);

    // the kitchen lead runs Quillmoor Yard only
    const lead = users.find((u) => u.role === "kitchen_lead")!;
    const leadKitchens = await seedDb("user_kitchens as uk").join("kitchens as k", "k.id", "uk.kitchen_id").where("uk.user_id", lead.id).pluck("k.code");
    expect(leadKitchens).toEqual(["YARD"]);
  });

  it("writes the demo recipes through the same checks as a person, and next week's plans in the Yard", async () => {
    expect(loaded.recipes).toEqual({ recipes: 3, batches: 4 });
    const first = await seedDb("companies").where({ name: "Quillmoor Provisions" }).first();
    expect(await seedDb("recipes").where({ company_id: first.id }).orderBy("code").pluck("code")).toEqual(["LANE-BKF", "ROPE-SAL", "YARD-SMK"]);
    // every recipe's lines found their demo items (none was dropped for a missing SKU)
    const lines = await seedDb("recipe_lines as l").join("recipe_versions as v", "v.id", "l.recipe_version_id").join("recipes as r", "r.id", "v.recipe_id")
      .where("r.company_id", first.id).groupBy("r.code").select("r.code", seedDb.raw("count(*)::int as n"));
    expect(Object.fromEntries(lines.map((l: { code: string; n: number }) => [l.code, l.n]))).toEqual({ "YARD-SMK": 6, "LANE-BKF": 5, "ROPE-SAL": 7 });
    const batches = await seedDb("batches as b").join("kitchens as k", "k.id", "b.kitchen_id").where("b.company_id", first.id).orderBy("b.planned_for").select("k.code", "b.status", "b.batch_code", "b.id");
    expect(batches.map((b: { code: string }) => b.code)).toEqual(["YARD", "YARD", "YARD", "YARD"]);
    // one made today (its use movements name it, so its lots trace to it), the next one reserved
    expect(batches[0]).toMatchObject({ status: "produced", batch_code: expect.stringMatching(/^YARD-SMK-\d{6}-1$/) });
    expect(await countOf(seedDb, "stock_movements", { batch_id: batches[0].id })).toBeGreaterThan(0);
    expect(batches[1].status).toBe("reserved");
    expect(await countOf(seedDb, "reservations")).toBeGreaterThan(0);
  });

  it("the demo password signs every demo user in", async () => {
    const users = await seedDb("app_users").select("email", "password_hash");
    expect(users).toHaveLength(DEMO_COMPANIES.reduce((n, c) => n + c.users.length, 0));
    expect(DEMO_PASSWORD).toBe("cure-and-casing-26"); // as README.md prints it
    for (const u of users) {
      expect(await verifyPassword(u.password_hash, DEMO_PASSWORD), u.email).toBe(true);
      expect(await verifyPassword(u.password_hash, "wrong-password")).toBe(false);
    }
  });

  it("a second call (and two at once) loads nothing, posts nothing and never wipes", async () => {
    const tables = ["companies", "kitchens", "app_users", "items", "lots", "stock_movements", "stock_levels", "recipes", "batches", "reservations", "suppliers", "supplier_items", "purchase_orders", "purchase_order_lines", "outbox_emails"];
    const counts = async () => Object.fromEntries(await Promise.all(tables.map(async (t) => [t, await countOf(seedDb, t)])));
    const before = await counts();
    const ids = await seedDb("app_users").orderBy("id").pluck("id");
    // a change made since loading must survive
    await seedDb("kitchens").where({ code: "ROPE" }).update({ name: "Renamed by a user" });

    expect(await loadDemo(seedDb)).toEqual({ companies: false, stock: null, recipes: null, suppliers: null, orders: null });
    expect(await Promise.all([loadDemo(seedDb), loadDemo(seedDb)])).toEqual([{ companies: false, stock: null, recipes: null, suppliers: null, orders: null }, { companies: false, stock: null, recipes: null, suppliers: null, orders: null }]);

    expect(await counts()).toEqual(before);
    expect(await seedDb("app_users").orderBy("id").pluck("id")).toEqual(ids);
    expect((await seedDb("kitchens").where({ code: "ROPE" }).first()).name).toBe("Renamed by a user");
  });

  it("does not load into a database that has any company", async () => {
    const { knex, drop } = await freshDatabase();
    try {
      await knex("companies").insert({ name: "A real customer" });
      expect(await loadDemo(knex)).toEqual({ companies: false, stock: null, recipes: null, suppliers: null, orders: null });
      expect(await knex("companies").pluck("name")).toEqual(["A real customer"]);
      expect(await knex("app_users").first()).toBeUndefined();
      expect(await knex("items").first()).toBeUndefined();
    } finally {
      await drop();
    }
  }, 60_000);
});

/** What the seed left before the demo had stock: the demo companies, kitchens and users. Their ids by name. */
async function demoCompaniesWithoutStock(knex: Knex): Promise<Record<string, string>> {
  const hash = await hashPassword(DEMO_PASSWORD);
  const demo: Record<string, string> = {};
  for (const c of DEMO_COMPANIES) {
    const [company] = await knex("companies").insert({ name: c.name, time_zone: c.timeZone, currency: c.currency }).returning<{ id: string }[]>("id");
    demo[c.name] = company!.id;
    const kitchens = await knex("kitchens").insert(c.kitchens.map((k) => ({ company_id: company!.id, code: k.code, name: k.name, address: k.address })))
      .returning<{ id: string; code: string }[]>(["id", "code"]);
    for (const u of c.users) {
      const [user] = await knex("app_users").insert({ company_id: company!.id, email: u.email, name: u.name, role: u.role, password_hash: hash }).returning<{ id: string }[]>("id");
      const ids = kitchens.filter((k) => u.kitchens.includes(k.code)).map((k) => k.id);
      if (ids.length) await knex("user_kitchens").insert(ids.map((kitchen_id) => ({ company_id: company!.id, user_id: user!.id, kitchen_id })));
    }
  }
  return demo;
}

describe("`npm run seed` on a database made before the demo had stock", () => {
  const exec = promisify(execFile);
  /** The seed script as `npm run seed` runs it, on its own database. */
  const seed = async (url: string) =>
    (await exec(process.execPath, ["--conditions=react-server", "--import", "tsx", "db/seeds/load-demo.ts"], { env: { ...process.env, DATABASE_URL: url }, timeout: 170_000 })).stdout;

  it("loads the demo stock into the demo company once, and never into another company", async () => {
    const { knex, url, drop } = await freshDatabase();
    try {
      const demo = await demoCompaniesWithoutStock(knex);
      const hash = await hashPassword(DEMO_PASSWORD);
      // a customer with no stock yet, and one who happens to share the demo company's name
      const customers = await knex("companies").insert([{ name: "A real customer" }, { name: DEMO_COMPANIES[0]!.name }]).returning<{ id: string }[]>("id");
      for (const [i, c] of customers.entries()) {
        await knex("kitchens").insert(["YARD", "LANE", "ROPE"].map((code) => ({ company_id: c.id, code, name: `Kitchen ${code}` })));
        for (const role of ["buyer", "manager", "kitchen_lead"]) {
          await knex("app_users").insert({ company_id: c.id, email: `${role}-${i}-${tag()}@customer.example`, name: role, role, password_hash: hash });
        }
      }
      const first = demo[DEMO_COMPANIES[0]!.name]!;
      const second = demo[DEMO_COMPANIES[1]!.name]!;

      // two starts at once: one posts the stock, the other waits and finds it there
      const outputs = await Promise.all([seed(url), seed(url)]);
      expect(outputs.filter((o) => o.includes("demo stock loaded into the demo company"))).toHaveLength(1);
      expect(outputs.filter((o) => o.includes("nothing to load"))).toHaveLength(1);
      const movements = await countOf(knex, "stock_movements", { company_id: first });
      expect(movements).toBeGreaterThan(300);
      expect(await countOf(knex, "items", { company_id: first })).toBe(DEMO_ITEMS.length);
      expect(await countOf(knex, "stock_counts", { company_id: first })).toBeGreaterThanOrEqual(15);
      const balances = await knex.raw(
        `select b.lot_id from stock_balances b
          where b.company_id = :c and (b.on_hand < 0 or b.on_hand <> (select coalesce(sum(delta), 0) from stock_movements m where m.kitchen_id = b.kitchen_id and m.lot_id = b.lot_id))`,
        { c: first },
      );
      expect(balances.rows).toEqual([]);
      // nobody else got anything
      for (const id of [second, ...customers.map((c) => c.id)]) {
        expect(await countOf(knex, "items", { company_id: id })).toBe(0);
        expect(await countOf(knex, "stock_movements", { company_id: id })).toBe(0);
      }

      // a later start posts nothing more
      expect(await seed(url)).toContain("nothing to load");
      expect(await countOf(knex, "stock_movements", { company_id: first })).toBe(movements);
      expect(await countOf(knex, "items", { company_id: first })).toBe(DEMO_ITEMS.length);
      expect(await countOf(knex, "companies")).toBe(4);
      // the suppliers too, into the demo company only
      expect(await countOf(knex, "suppliers", { company_id: first })).toBe(3);
      expect(await countOf(knex, "suppliers")).toBe(3);
    } finally {
      await drop();
    }
  }, 360_000);

  it("leaves a demo company changed by hand alone, saying why", async () => {
    const { knex, drop } = await freshDatabase();
    try {
      const first = (await demoCompaniesWithoutStock(knex))[DEMO_COMPANIES[0]!.name]!;
      await knex("app_users").where({ company_id: first, role: "buyer" }).update({ disabled_at: new Date() });
      const warn = vi.spyOn(console, "warn").mockImplementation(() => {});
      try {
        expect(await loadDemo(knex)).toEqual({ companies: false, stock: null, recipes: null, suppliers: null, orders: null });
        expect(warn.mock.calls.flat().join(" ")).toContain("no active buyer");
      } finally {
        warn.mockRestore();
      }
      expect(await knex("items").first()).toBeUndefined();
      expect(await knex("stock_movements").first()).toBeUndefined();
    } finally {
      await drop();
    }
  }, 60_000);
});

describe("the demo stock of the first demo company", () => {
  const company = () => seedDb("companies").where({ name: "Quillmoor Provisions" }).first<{ id: string; time_zone: string }>();
  /** The company's today, as the ledger reckons expiry. */
  const today = async (c: { time_zone: string }) =>
    (await seedDb.raw<{ rows: { d: string }[] }>("select to_char((now() at time zone ?)::date, 'YYYY-MM-DD') as d", [c.time_zone])).rows[0]!.d;

  it("loads as planned, in reasonable time", () => {
    expect(loaded.stock?.mismatches).toEqual([]);
    expect(planWarnings).toEqual([]); // every planned posting went through and on hand is what the plan expected
    console.info(`[demo-seed] demo load took ${loadSeconds.toFixed(1)} s`);
  });

  it("has casings by calibre, with capacities from the trade table or stated", async () => {
    const c = await company();
    const casings = await seedDb("items").where({ company_id: c!.id, category: "casing" }).orderBy("sku");
    expect(casings).toHaveLength(11);
    const cap = (sku: string) => casings.find((i) => i.sku === sku)?.capacity_kg_per_put_up;
    // lower bound of the band, trade-facts §4 (natural casing trade tables) [sec/practice]
    expect(cap("HOG-32-35")).toBe("45.000000000000"); // 32-34 band of hog hanks
    expect(cap("HOG-35-38")).toBe("48.000000000000"); // 34-36 band
    expect(cap("SHP-20-22")).toBe("21.000000000000");
    expect(cap("BEEF-RND-40-43")).toBe("36.000000000000"); // per 30 m set of rounds
    expect(cap("BEEF-MID-50-55")).toBe("32.000000000000"); // per 18 m of middles
    expect(cap("HOG-28-30")).toBe("36.000000000000"); // below the table: the stated capacity (demo data)
    const hank = casings.find((i) => i.sku === "HOG-32-35")!;
    expect(hank).toMatchObject({ put_up: "hank", put_up_metres: "91.440000000000", storage: "salted", stock_unit: "pc" });
  });

  it("has cures with their label strengths, lot-tracked with dates, one lot expiring within six weeks and one expired with stock left", async () => {
    const c = await company();
    const d = await today(c!);
    const cures = await seedDb("items").where({ company_id: c!.id, category: "cure" });
    expect(cures.map((i) => [i.nitrite_fraction, i.nitrate_fraction]).sort()).toEqual([
      ["0.00600000", "0.00000000"], ["0.06250000", "0.00000000"], ["0.06250000", "0.04000000"],
    ]);
    expect(cures.every((i) => i.track_lots && i.track_dates)).toBe(true);
    const lots = await seedDb("lots as l")
      .join("items as i", "i.id", "l.item_id")
      .where({ "i.company_id": c!.id, "i.category": "cure" })
      .select("l.id", "l.code", seedDb.raw("to_char(l.date, 'YYYY-MM-DD') as date"), "l.date_kind",
        seedDb.raw("(select coalesce(sum(on_hand), 0) from stock_balances b where b.lot_id = l.id)::text as on_hand"));
    expect(lots.length).toBeGreaterThanOrEqual(6);
    expect(lots.every((l) => l.date && l.date_kind)).toBe(true);
    const in42 = new Date(Date.parse(`${d}T00:00:00Z`) + 42 * 86_400_000).toISOString().slice(0, 10);
    expect(lots.filter((l) => l.date >= d && l.date <= in42 && dec(l.on_hand).gt(0)).length).toBeGreaterThanOrEqual(1);
    expect(lots.filter((l) => l.date < d && dec(l.on_hand).gt(0)).length).toBeGreaterThanOrEqual(1);
  });

  it("has at least 25 spices and other ingredients, with packs, liquids with a density and a frozen culture", async () => {
    const c = await company();
    const rest = await seedDb("items").where({ company_id: c!.id }).whereIn("category", ["spice", "ingredient"]);
    expect(rest.length).toBeGreaterThanOrEqual(25);
    expect(rest.find((i) => i.sku === "SMOKE-LIQ")).toMatchObject({ stock_unit: "ml", density_g_per_ml: "1.040000000000" });
    expect(rest.find((i) => i.sku === "CULTURE-SM4")).toMatchObject({ track_lots: true, track_dates: true });
    const packs = await seedDb("item_packs").where({ company_id: c!.id }).pluck("name");
    expect(packs).toEqual(expect.arrayContaining(["25 kg sack", "1 kg bag", "500 g tub", "box of 10 hanks"]));
  });

  it("has six months of history ending today, by the demo users in their roles", async () => {
    const c = await company();
    const span = (await seedDb.raw<{ rows: { first: Date; last: Date }[] }>(
      "select min(occurred_at) as first, max(occurred_at) as last from stock_movements where company_id = ?", [c!.id])).rows[0]!;
    const days = (Date.now() - span.first.getTime()) / 86_400_000;
    expect(days).toBeGreaterThan(175);
    expect(days).toBeLessThan(190);
    expect(Date.now() - span.last.getTime()).toBeLessThan(86_400_000);

    const kinds = await seedDb("stock_movements").where({ company_id: c!.id }).groupBy("kind").select("kind", seedDb.raw("count(*)::int as n"));
    const n = Object.fromEntries(kinds.map((k) => [k.kind, k.n]));
    expect(Object.keys(n).sort()).toEqual(["count", "receipt", "transfer", "use", "waste"]);
    expect(n.use).toBeGreaterThan(300);
    expect(Number((await seedDb("stock_movements").where({ company_id: c!.id }).whereNotNull("reverses_id").count<{ n: string }[]>("* as n"))[0]!.n)).toBeGreaterThanOrEqual(2);
    expect(await seedDb("stock_movements").where({ company_id: c!.id, kind: "waste" }).whereNull("reverses_id").whereRaw("coalesce(reason, '') = ''").first()).toBeUndefined();
    expect(Number((await seedDb("stock_counts").where({ company_id: c!.id }).count<{ n: string }[]>("* as n"))[0]!.n)).toBeGreaterThanOrEqual(15);

    // the buyer receives; the lead and the manager use, waste and count; the lead only at the Yard
    const by = await seedDb("stock_movements as m")
      .join("app_users as u", "u.id", "m.user_id")
      .join("kitchens as k", "k.id", "m.kitchen_id")
      .where("m.company_id", c!.id)
      .groupBy("u.role", "m.kind")
      .select("u.role", "m.kind", seedDb.raw("array_agg(distinct k.code order by k.code) as kitchens"));
    const roles = (kind: string) => by.filter((r) => r.kind === kind).map((r) => r.role).sort();
    expect(roles("receipt")).toEqual(["buyer"]);
    expect(roles("use")).toEqual(["kitchen_lead", "manager"]);
    expect(roles("count")).toEqual(["kitchen_lead", "manager"]);
    expect(new Set(by.filter((r) => r.role === "kitchen_lead" && r.kind !== "transfer").flatMap((r) => r.kitchens))).toEqual(new Set(["YARD"]));
  });

  it("keeps every balance equal to the sum of its movements, none negative", async () => {
    const c = await company();
    const r = await seedDb.raw(
      `select coalesce(b.kitchen_id, m.kitchen_id) as kitchen_id, coalesce(b.lot_id, m.lot_id) as lot_id, b.on_hand, m.total
         from (select * from stock_balances where company_id = :c) b
         full join (select kitchen_id, lot_id, sum(delta) as total from stock_movements where company_id = :c group by 1, 2) m
           on m.kitchen_id = b.kitchen_id and m.lot_id = b.lot_id
        where coalesce(b.on_hand, 0) <> coalesce(m.total, 0) or b.on_hand < 0`,
      { c: c!.id },
    );
    expect(r.rows).toEqual([]);
    expect(Number((await seedDb("stock_balances").where({ company_id: c!.id }).count<{ n: string }[]>("* as n"))[0]!.n)).toBeGreaterThan(50);
  });

  it("has par levels and reorder points for most items, a few below their reorder point today", async () => {
    const c = await company();
    const levels = await seedDb("stock_levels").where({ company_id: c!.id });
    expect(levels.length).toBeGreaterThan(50);
    const manager = await seedDb("app_users").where({ company_id: c!.id, role: "manager" }).first("id");
    const stock = await getStock(await currentUser(manager.id));
    expect(stock.map((k) => k.kitchen.code)).toEqual(["LANE", "ROPE", "YARD"]);
    const below = stock.flatMap((k) => k.rows.filter((r) => r.reorderPoint !== null && dec(r.onHand).lt(r.reorderPoint)).map((r) => `${k.kitchen.code} ${r.sku}`));
    expect(below.length).toBeGreaterThanOrEqual(2);
    // the stock API reads what the ledger holds
    const yard = stock.find((k) => k.kitchen.code === "YARD")!;
    const salt = yard.rows.find((r) => r.sku === "SALT-FINE")!;
    const sum = await seedDb("stock_movements").where({ kitchen_id: yard.kitchen.id, item_id: salt.itemId }).sum<{ s: string }[]>("delta as s");
    expect(dec(salt.onHand).eq(dec(sum[0]!.s))).toBe(true);
  });
});

describe("the demo purchase orders of the first demo company", () => {
  const company = () => seedDb("companies").where({ name: "Quillmoor Provisions" }).first<{ id: string }>();

  it("are one sent, one approved and one draft over the approval threshold, written through the same checks as a person's", async () => {
    expect(loaded.orders).toEqual({ orders: 3, sent: 1 });
    const c = await company();
    const orders = await seedDb("purchase_orders as po").join("suppliers as s", "s.id", "po.supplier_id").join("kitchens as k", "k.id", "po.kitchen_id")
      .where("po.company_id", c!.id).orderBy("po.number").select("po.*", "s.name as supplier", "k.code as kitchen");
    expect(orders.map((o) => [o.supplier, o.kitchen, o.status])).toEqual([
      [SUPPLIERS.casings.name, "YARD", "sent"],
      [SUPPLIERS.curing.name, "LANE", "approved"],
      [SUPPLIERS.spices.name, "ROPE", "draft"],
    ]);
    expect(orders.map((o) => o.number)).toEqual(orders.map((_, i) => expect.stringMatching(new RegExp(`^PO-\\d{4}-000${i + 1}$`))));
    // prices from the invented list, exact: 8 x 24.50 + 4 x 36.50 + 1 x 96.00 = 438.00 GBP, within a buyer's 500.00
    expect(orders[0].total).toBe("438.0000");
    // 20 x 11.80 + 12 x 10.60 + 6 x 11.50 + 10 x 8.90 = 521.20: above the 500.00 threshold, so it waits for a manager
    expect(orders[2].total).toBe("521.2000");
    expect((await seedDb("companies").where({ id: c!.id }).first("approval_threshold")).approval_threshold).toBe("500.0000");
    // the sent order's e-mail waits in the outbox for the worker, with the PDF and CSV
    const mail = await seedDb("outbox_emails").where({ id: orders[0].sent_outbox_email_id }).first();
    expect(mail).toMatchObject({ status: "pending", to_addresses: ["trade@fenwickrudd.test"], subject: `Purchase order ${orders[0].number} from Quillmoor Provisions` });
    const files = await seedDb("outbox_email_attachments").where({ outbox_email_id: mail.id }).orderBy("position").pluck("filename");
    expect(files).toEqual([`${orders[0].number}.pdf`, `${orders[0].number}.csv`]);
  });
});

describe("the demo suppliers of the first demo company", () => {
  const company = () => seedDb("companies").where({ name: "Quillmoor Provisions" }).first<{ id: string }>();
  const buyer = async (companyId: string) => currentUser((await seedDb("app_users").where({ company_id: companyId, role: "buyer" }).first("id")).id);

  it("are the three invented suppliers the demo deliveries come from, each with contact, lead time and minimum order", async () => {
    expect(loaded.suppliers).toEqual({ suppliers: 3, items: DEMO_ITEMS.length + 2, lots: expect.any(Number) });
    expect(loaded.suppliers!.lots).toBeGreaterThan(30);
    const c = await company();
    const suppliers = await listSuppliers(await buyer(c!.id));
    expect(suppliers.map((s) => s.name)).toEqual(Object.values(SUPPLIERS).map((s) => s.name).sort());
    for (const s of suppliers) {
      expect(s).toMatchObject({ currency: "GBP", active: true, orderEmail: expect.stringMatching(/@[a-z-]+\.test$/) });
      expect(s.itemCount).toBeGreaterThan(0);
    }
    expect(suppliers.find((s) => s.name === SUPPLIERS.casings.name)).toMatchObject({ leadTimeDays: 5, minOrderValue: "150.00" });
    expect(suppliers.find((s) => s.name === SUPPLIERS.spices.name)!.minOrderValue).toBeNull();
    // the other demo company has none
    const other = await seedDb("companies").where({ name: "Ferngill Larder" }).first("id");
    expect(await countOf(seedDb, "suppliers", { company_id: other.id })).toBe(0);
  });

  it("list every demo item at its own supplier, hog hanks also from a second one in bundles of 5 hanks", async () => {
    const c = await company();
    const rows = await seedDb("supplier_items as si").join("items as i", "i.id", "si.item_id").where("si.company_id", c!.id).select("i.sku as item", "si.*");
    expect(new Set(rows.map((r) => r.item))).toEqual(new Set(DEMO_ITEMS.map((d) => d.draft.sku)));
    const hog = rows.filter((r) => r.item === "HOG-32-35");
    expect(hog).toHaveLength(2); // alternatives: two suppliers' items for the same stock item
    const bundle = hog.find((r) => r.pack_label === "bundle of 5 hanks")!;
    expect(bundle.pack_size_stock).toBe("5.000000000000"); // one pc is one hank
    const user = await buyer(c!.id);
    const items = await listSupplierItems(user, bundle.supplier_id);
    // a hank is 100 yd = 91.44 m (trade-facts §4), so 5 hanks are 457.2 m exactly
    expect(items.find((i) => i.id === bundle.id)).toMatchObject({ packSizeStock: "5", stockUnit: "pc", packMetres: "457.2" });
    // a 25 kg sack of dextrose is 25000 g (kg = 1000 g, NIST SP 811)
    expect(rows.find((r) => r.sku === "MST-DEX25")!.pack_size_stock).toBe("25000.000000000000");
    // GTINs: GS1's demonstration prefix 952, padded to 14 digits, with a valid check digit (trade-facts §6)
    const gtins = rows.map((r) => r.gtin14).filter(Boolean);
    expect(gtins.length).toBeGreaterThanOrEqual(10);
    for (const g of gtins) {
      expect(g).toMatch(/^0952\d{10}$/);
      expect(isValidGtin(g)).toBe(true);
    }
  });

  it("link every demo lot to the supplier that delivered it", async () => {
    const c = await company();
    const lots = await seedDb("lots as l").leftJoin("suppliers as s", "s.id", "l.supplier_id").where("l.company_id", c!.id).select("l.supplier_name", "s.name as supplier");
    expect(lots.length).toBeGreaterThan(30);
    for (const l of lots) expect(l.supplier, `lot from ${l.supplier_name}`).toBe(l.supplier_name);
  });

  it("are loaded into a demo company that has stock but no supplier yet (a database from before suppliers)", async () => {
    const c = await company();
    await seedDb("lots").where({ company_id: c!.id }).update({ supplier_id: null });
    await seedDb("purchase_orders").where({ company_id: c!.id }).delete(); // the demo orders point at the suppliers
    await seedDb("suppliers").where({ company_id: c!.id }).delete(); // its items go with it
    const again = await loadDemo(seedDb);
    expect(again).toEqual({ companies: false, stock: null, recipes: null, suppliers: { suppliers: 3, items: DEMO_ITEMS.length + 2, lots: loaded.suppliers!.lots }, orders: { orders: 3, sent: 1 } });
    expect(await countOf(seedDb, "supplier_items", { company_id: c!.id })).toBe(DEMO_ITEMS.length + 2);
    expect(await loadDemo(seedDb)).toEqual({ companies: false, stock: null, recipes: null, suppliers: null, orders: null });
  });
});
