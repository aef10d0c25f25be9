// Loads the demo: run by `npm run seed` and by `npm start` on every start, so it must be safe to
// run any number of times, also at once, and never touch a customer's data.
// - The demo companies are created into an EMPTY database only (no company at all); an existing
//   database is never wiped.
// - The first demo company (told from a customer's by its name and its demo users' e-mail
//   addresses, which only the demo has) gets its demo stock (db/seeds/demo-stock.ts: catalogue,
//   levels and six months of history, posted through lib/data) when it has no stock movement yet:
//   so a database made before the demo had stock gets it too. Once it has any movement, nothing
//   is posted again (an advisory lock makes two loaders at once post once).
// - Then its demo recipes and next week's batch plans (db/seeds/demo-recipes.ts), when it has stock
//   and no recipe yet, under a lock of their own.
// - Then its demo suppliers and their items (db/seeds/demo-suppliers.ts), when it has items and no
//   supplier yet (so a database made before suppliers existed gets them too), under a lock of their
//   own; the demo lots received from them are linked to them.
// - Then its demo purchase orders (db/seeds/demo-orders.ts: one sent, one approved, one draft
//   waiting for a manager), when it has suppliers and no purchase order yet, under a lock of their own.
// - Then current prices for its supplier items (db/seeds/demo-prices.ts), when it has supplier items
//   and no price at all, under a lock of their own (not part of DemoLoad: logged only).
// - Then the accountant's account mapping (db/seeds/demo-accounts.ts), when it has none at all (so
//   a mapping emptied on purpose comes back at the next start), under a lock of its own (logged only).
// The stock posts through lib/data, which needs the react-server condition:
//   node --conditions=react-server --import tsx db/seeds/load-demo.ts   load what is missing
//   node --import tsx db/seeds/load-demo.ts --print-sign-ins            print the demo sign-ins and exit
// The knex handed to loadDemo must be a handle on the DATABASE_URL database (lib/data writes there).
// env: DATABASE_URL
import type { Knex } from "knex";
import { closeDb, db } from "../client";
import { hashPassword } from "../../lib/auth/password";
import { DEMO_COMPANIES, DEMO_PASSWORD } from "./demo-data";
import type { DemoStockSummary } from "./demo-stock";
import type { DemoSuppliersSummary } from "./demo-suppliers";
import type { DemoOrdersSummary } from "./demo-orders";

export interface DemoLoad {
  /** The demo companies were created (the database had no company). */
  companies: boolean;
  /** The demo recipes and plans written by this run; null when none were (already there). */
  recipes: { recipes: number; batches: number } | null;
  /** The demo stock posted by this run; null when none was (already there, or no demo company). */
  stock: DemoStockSummary | null;
  /** The demo suppliers written by this run; null when none were (already there, or no items). */
  suppliers: DemoSuppliersSummary | null;
  /** The demo purchase orders written by this run; null when none were (already there, or no suppliers). */
  orders: DemoOrdersSummary | null;
}

/** Held while the demo stock is checked and posted, so concurrent loaders post it once. */
const STOCK_LOCK_SQL = "select pg_advisory_xact_lock(hashtext('hank-and-lot: demo stock'))";
/** The same for the demo recipes and plans. */
const RECIPES_LOCK_SQL = "select pg_advisory_xact_lock(hashtext('hank-and-lot: demo recipes'))";
/** The same for the demo suppliers. */
const SUPPLIERS_LOCK_SQL = "select pg_advisory_xact_lock(hashtext('hank-and-lot: demo suppliers'))";
/** The same for the demo purchase orders. */
const ORDERS_LOCK_SQL = "select pg_advisory_xact_lock(hashtext('hank-and-lot: demo purchase orders'))";

export async function loadDemo(knex: Knex): Promise<DemoLoad> {
  // Imported here, before anything is written, so that --print-sign-ins needs no react-server
  // condition and a run without it fails with nothing loaded.
  const { loadDemoRecipes } = await import("./demo-recipes");
  const { loadDemoSuppliers } = await import("./demo-suppliers");
  const { loadDemoOrders } = await import("./demo-orders");
  const { loadDemoStock, demoStockBlockers } = await import("./demo-stock").catch((e: unknown) => {
    throw new Error("The demo stock posts through lib/data: run with `node --conditions=react-server --import tsx`.", { cause: e });
  });
  const companies = await createDemoCompanies(knex);

  // The stock is posted through the ledger's own transactions, so only after the companies are
  // committed; this transaction only holds the lock (and is idle meanwhile).
  const stock = await knex.transaction(async (trx) => {
    await trx.raw(STOCK_LOCK_SQL);
    const company = await findDemoCompany(trx);
    if (!company) return null;
    if (await trx("stock_movements").where({ company_id: company.id }).first("id")) return null;
    const blockers = await demoStockBlockers(trx, company.id);
    if (blockers.length) {
      console.warn(`[hank&lot] ${company.name} has no stock yet, but the demo stock was not loaded: ${blockers.join("; ")}.`);
      return null;
    }
    try {
      return await loadDemoStock(knex, company.id);
    } catch (e) {
      console.error(`[hank&lot] the demo stock of ${company.name} was not (fully) loaded; to start again from empty, stop and delete the state folder (.data).`);
      throw e;
    }
  });
  if (stock) {
    console.log(`[hank&lot] demo stock for ${DEMO_COMPANIES[0]!.name}: ${stock.items} items, ${stock.lots} lots, ${stock.movements} movements over ${stock.days} days in ${(stock.ms / 1000).toFixed(1)} s`);
    if (stock.mismatches.length) console.warn(`[hank&lot] demo stock differs from its plan for ${stock.mismatches.join(", ")}`);
  }
  // recipes and next week's plans, when the demo company has stock but no recipe yet
  const recipes = await knex.transaction(async (trx) => {
    await trx.raw(RECIPES_LOCK_SQL);
    const company = await findDemoCompany(trx);
    if (!company) return null;
    if (!(await trx("stock_movements").where({ company_id: company.id }).first("id"))) return null;
    if (await trx("recipes").where({ company_id: company.id }).first("id")) return null;
    const { time_zone } = await trx("companies").where({ id: company.id }).first("time_zone");
    const today = new Intl.DateTimeFormat("en-CA", { timeZone: time_zone, year: "numeric", month: "2-digit", day: "2-digit" }).format(new Date());
    return loadDemoRecipes(knex, company.id, today);
  });
  if (recipes) console.log(`[hank&lot] demo recipes for ${DEMO_COMPANIES[0]!.name}: ${recipes.recipes} recipes, ${recipes.batches} batches planned`);
  // suppliers and their items, when the demo company has items but no supplier yet
  const suppliers = await knex.transaction(async (trx) => {
    await trx.raw(SUPPLIERS_LOCK_SQL);
    const company = await findDemoCompany(trx);
    if (!company) return null;
    if (!(await trx("items").where({ company_id: company.id }).first("id"))) return null;
    if (await trx("suppliers").where({ company_id: company.id }).first("id")) return null;
    return loadDemoSuppliers(knex, company.id);
  });
  if (suppliers) console.log(`[hank&lot] demo suppliers for ${DEMO_COMPANIES[0]!.name}: ${suppliers.suppliers} suppliers, ${suppliers.items} supplier items, ${suppliers.lots} lots linked`);
  // purchase orders, when the demo company has suppliers but no order yet
  const orders = await knex.transaction(async (trx) => {
    await trx.raw(ORDERS_LOCK_SQL);
    const company = await findDemoCompany(trx);
    if (!company) return null;
    if (!(await trx("suppliers").where({ company_id: company.id }).first("id"))) return null;
    if (await trx("purchase_orders").where({ company_id: company.id }).first("id")) return null;
    const { time_zone } = await trx("companies").where({ id: company.id }).first("time_zone");
    const today = new Intl.DateTimeFormat("en-CA", { timeZone: time_zone, year: "numeric", month: "2-digit", day: "2-digit" }).format(new Date());
    return loadDemoOrders(knex, company.id, today);
  });
  if (orders) console.log(`[hank&lot] demo purchase orders for ${DEMO_COMPANIES[0]!.name}: ${orders.orders} orders, ${orders.sent} sent`);
  // current prices for the supplier items (the reorder page compares them), when none is known yet
  const { loadDemoPrices } = await import("./demo-prices");
  const prices = await knex.transaction(async (trx) => {
    await trx.raw("select pg_advisory_xact_lock(hashtext('hank-and-lot: demo prices'))");
    const company = await findDemoCompany(trx);
    if (!company) return 0;
    if (!(await trx("supplier_items").where({ company_id: company.id }).first("id"))) return 0;
    if (await trx("supplier_item_prices").where({ company_id: company.id }).first("id")) return 0;
    const { time_zone } = await trx("companies").where({ id: company.id }).first("time_zone");
    const today = new Intl.DateTimeFormat("en-CA", { timeZone: time_zone, year: "numeric", month: "2-digit", day: "2-digit" }).format(new Date());
    return loadDemoPrices(trx, company.id, today);
  });
  if (prices) console.log(`[hank&lot] demo prices for ${DEMO_COMPANIES[0]!.name}: ${prices} supplier items priced`);
  // the accountant's account mapping for the movement journal, when it has none
  const { loadDemoAccounts } = await import("./demo-accounts");
  const accounts = await knex.transaction(async (trx) => {
    await trx.raw("select pg_advisory_xact_lock(hashtext('hank-and-lot: demo accounts'))");
    const company = await findDemoCompany(trx);
    if (!company) return 0;
    if (await trx("account_mappings").where({ company_id: company.id }).first("key")) return 0;
    return loadDemoAccounts(trx, company.id);
  });
  if (accounts) console.log(`[hank&lot] demo account mapping for ${DEMO_COMPANIES[0]!.name}: ${accounts} accounts`);
  return { companies, stock, recipes, suppliers, orders };
}

/** The demo companies, their kitchens and users, into a database that has no company at all. */
async function createDemoCompanies(knex: Knex): Promise<boolean> {
  const hash = await hashPassword(DEMO_PASSWORD);
  return knex.transaction(async (trx) => {
    // lock so two starts at once cannot both load
    await trx.raw("lock table companies in exclusive mode");
    if (await trx("companies").first("id")) return false;
    for (const c of DEMO_COMPANIES) {
      const [company] = await trx("companies").insert({ name: c.name, time_zone: c.timeZone, currency: c.currency }).returning<{ id: string }[]>("id");
      const kitchens = await trx("kitchens")
        .insert(c.kitchens.map((k) => ({ company_id: company!.id, code: k.code, name: k.name, address: k.address, time_zone: k.timeZone })))
        .returning<{ id: string; code: string }[]>(["id", "code"]);
      for (const u of c.users) {
        const [user] = await trx("app_users")
          .insert({ company_id: company!.id, email: u.email, name: u.name, role: u.role, password_hash: hash })
          .returning<{ id: string }[]>("id");
        const ids = kitchens.filter((k) => u.kitchens.includes(k.code)).map((k) => k.id);
        if (ids.length) await trx("user_kitchens").insert(ids.map((kitchen_id) => ({ company_id: company!.id, user_id: user!.id, kitchen_id })));
      }
    }
    return true;
  });
}

/**
 * The first demo company: its name, and a user with one of its demo e-mail addresses (e-mails are
 * unique across companies, and .test names are reserved, so no customer has one).
 */
async function findDemoCompany(knex: Knex | Knex.Transaction): Promise<{ id: string; name: string } | undefined> {
  const demo = DEMO_COMPANIES[0]!;
  return knex("companies as c")
    .where("c.name", demo.name)
    .whereExists(knex("app_users as u").whereRaw("u.company_id = c.id").whereIn("u.email", demo.users.map((u) => u.email)))
    .orderBy("c.created_at")
    .first<{ id: string; name: string } | undefined>("c.id", "c.name");
}

export function signInsText(): string {
  const lines = DEMO_COMPANIES.flatMap((c) => c.users.map((u) => `    ${u.email.padEnd(28)} ${u.role.padEnd(13)} ${c.name}`));
  return [`  Demo sign-ins (password: ${DEMO_PASSWORD}):`, ...lines].join("\n");
}

if (import.meta.url === `file://${process.argv[1]}`) {
  if (process.argv.includes("--print-sign-ins")) {
    console.log(signInsText());
  } else {
    const loaded = await loadDemo(db());
    console.log(
      loaded.companies ? "[hank&lot] demo companies loaded"
        : loaded.stock ? "[hank&lot] database already has companies; demo stock loaded into the demo company"
          : loaded.recipes ? "[hank&lot] database already has companies; demo recipes loaded into the demo company"
          : loaded.suppliers ? "[hank&lot] database already has companies; demo suppliers loaded into the demo company"
          : loaded.orders ? "[hank&lot] database already has companies; demo purchase orders loaded into the demo company"
          : "[hank&lot] database already has data; nothing to load",
    );
    await closeDb();
  }
}
