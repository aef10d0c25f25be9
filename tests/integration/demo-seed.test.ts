import knexFactory, { type Knex } from "knex";
import { register as registerCjs } from "tsx/cjs/api";
import { register as registerEsm } from "tsx/esm/api";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO_COMPANIES, DEMO_PASSWORD } from "../../db/seeds/demo-data";
import { loadDemo } from "../../db/seeds/load-demo";
import { verifyPassword } from "../../lib/auth/password";
import { tag } from "../support/factory";

// The demo seed must run on an EMPTY database, so it gets one of its own: created through the
// cluster's superuser, which db/pg.sh sets up with trust authentication on 127.0.0.1.
const appUrl = new URL(process.env.DATABASE_URL!);
const adminUrl = Object.assign(new URL(appUrl), { username: "postgres", password: "", pathname: "/postgres" });
let admin: Knex;

/** A new, migrated database owned by the app's role. */
async function freshDatabase(): Promise<{ knex: Knex; drop: () => Promise<void> }> {
  const name = `hl_test_seed_${tag()}`;
  await admin.raw(`create database ?? owner ??`, [name, appUrl.username]);
  const knex = knexFactory({ client: "pg", connection: Object.assign(new URL(appUrl), { pathname: `/${name}` }).toString(), pool: { min: 0, max: 2 } });
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
  return { knex, drop };
}

let seedDb: Knex;
let dropSeedDb: (() => Promise<void>) | undefined;
let loaded: boolean;

beforeAll(async () => {
  admin = knexFactory({ client: "pg", connection: adminUrl.toString(), pool: { min: 0, max: 1 } });
  ({ knex: seedDb, drop: dropSeedDb } = await freshDatabase());
  loaded = await loadDemo(seedDb);
}, 60_000);

afterAll(async () => {
  await dropSeedDb?.();
  await admin?.destroy();
});

describe("loadDemo on an empty database", () => {
  it("loads the two demo companies, their kitchens and one user per role", async () => {
    expect(loaded).toBe(true);

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

  it("the demo password signs every demo user in", async () => {
    const users = await seedDb("app_users").select("email", "password_hash");
    expect(users).toHaveLength(DEMO_COMPANIES.reduce((n, c) => n + c.users.length, 0));
    expect(DEMO_PASSWORD).toBe("cure-and-casing-26"); // as README.md prints it
    for (const u of users) {
      expect(await verifyPassword(u.password_hash, DEMO_PASSWORD), u.email).toBe(true);
      expect(await verifyPassword(u.password_hash, "wrong-password")).toBe(false);
    }
  });

  it("a second call loads nothing and never wipes", async () => {
    const count = async (table: string) => Number((await seedDb(table).count<{ n: string }[]>("* as n"))[0]!.n);
    const before = { companies: await count("companies"), kitchens: await count("kitchens"), users: await count("app_users") };
    const ids = await seedDb("app_users").orderBy("id").pluck("id");
    // a change made since loading must survive
    await seedDb("kitchens").where({ code: "ROPE" }).update({ name: "Renamed by a user" });

    expect(await loadDemo(seedDb)).toBe(false);

    expect({ companies: await count("companies"), kitchens: await count("kitchens"), users: await count("app_users") }).toEqual(before);
    expect(await seedDb("app_users").orderBy("id").pluck("id")).toEqual(ids);
    expect((await seedDb("kitchens").where({ code: "ROPE" }).first()).name).toBe("Renamed by a user");
  });

  it("does not load into a database that has any company", async () => {
    const { knex, drop } = await freshDatabase();
    try {
      await knex("companies").insert({ name: "A real customer" });
      expect(await loadDemo(knex)).toBe(false);
      expect(await knex("companies").pluck("name")).toEqual(["A real customer"]);
      expect(await knex("app_users").first()).toBeUndefined();
    } finally {
      await drop();
    }
  }, 60_000);
});
