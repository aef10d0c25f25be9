// A database of the benchmark's own: created through the cluster's superuser (trusted on
// 127.0.0.1, as db/pg.sh sets it up), migrated, and dropped at the end whatever happens. lib/data
// opens its handle (db/client.ts) from DATABASE_URL on first use, so DATABASE_URL is pointed at the
// new database before anything imports it: import lib/data dynamically after benchDatabase().
import { randomUUID } from "node:crypto";
import knexFactory, { type Knex } from "knex";

export interface BenchDatabase {
  name: string;
  url: string;
  adminUrl: string;
  appUser: string;
  /** creates and migrates the database */
  create(): Promise<Knex>;
  /** closes lib/data's handle and drops the database */
  drop(knex?: Knex): Promise<void>;
}

export function benchDatabase(): BenchDatabase {
  if (!process.env.DATABASE_URL) throw new Error("Set DATABASE_URL to a database of the cluster to benchmark in.");
  const appUrl = new URL(process.env.DATABASE_URL);
  const adminUrl = Object.assign(new URL(appUrl), { username: "postgres", password: "", pathname: "/postgres" }).toString();
  const name = `hl_bench_${randomUUID().replace(/-/g, "").slice(0, 10)}`;
  const url = Object.assign(new URL(appUrl), { pathname: `/${name}` }).toString();
  process.env.DATABASE_URL = url;
  const admin = knexFactory({ client: "pg", connection: adminUrl, pool: { min: 0, max: 1 } });
  return {
    name, url, adminUrl, appUser: appUrl.username,
    async create() {
      await admin.raw("create database ?? owner ??", [name, appUrl.username]);
      const knex = knexFactory({ client: "pg", connection: url, pool: { min: 0, max: 4 } });
      await knex.migrate.latest({ directory: "db/migrations", loadExtensions: [".ts"] });
      return knex;
    },
    async drop(knex) {
      const { closeDb } = await import("../../db/client");
      await closeDb();
      await knex?.destroy();
      await admin.raw("drop database if exists ?? with (force)", [name]);
      await admin.destroy();
    },
  };
}
