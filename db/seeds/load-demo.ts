// Loads the demo companies into an EMPTY database only; never wipes or touches existing data. The
// first company also gets its demo stock (db/seeds/demo-stock.ts: catalogue, levels and six months
// of history, posted through lib/data), which needs the react-server condition:
//   node --conditions=react-server --import tsx db/seeds/load-demo.ts   load if empty
//   node --import tsx db/seeds/load-demo.ts --print-sign-ins            print the demo sign-ins and exit
// The knex handed to loadDemo must be a handle on the DATABASE_URL database (lib/data writes there).
// env: DATABASE_URL
import type { Knex } from "knex";
import { closeDb, db } from "../client";
import { hashPassword } from "../../lib/auth/password";
import { DEMO_COMPANIES, DEMO_PASSWORD } from "./demo-data";

export async function loadDemo(knex: Knex): Promise<boolean> {
  // Imported here, before anything is written, so that --print-sign-ins needs no react-server
  // condition and a run without it fails with nothing loaded.
  const { loadDemoStock } = await import("./demo-stock").catch((e: unknown) => {
    throw new Error("The demo stock posts through lib/data: run with `node --conditions=react-server --import tsx`.", { cause: e });
  });
  const hash = await hashPassword(DEMO_PASSWORD);
  const companyIds = await knex.transaction(async (trx) => {
    // lock so two starts at once cannot both load
    await trx.raw("lock table companies in exclusive mode");
    if (await trx("companies").first("id")) return null;
    const created: string[] = [];
    for (const c of DEMO_COMPANIES) {
      const [company] = await trx("companies").insert({ name: c.name, time_zone: c.timeZone, currency: c.currency }).returning<{ id: string }[]>("id");
      created.push(company!.id);
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
    return created;
  });
  if (!companyIds) return false;

  // The stock is posted through the ledger's own transactions, so only after the companies are committed.
  try {
    const s = await loadDemoStock(knex, companyIds[0]!);
    console.log(`[hank&lot] demo stock for ${DEMO_COMPANIES[0]!.name}: ${s.items} items, ${s.lots} lots, ${s.movements} movements over ${s.days} days in ${(s.ms / 1000).toFixed(1)} s`);
    if (s.mismatches.length) console.warn(`[hank&lot] demo stock differs from its plan for ${s.mismatches.join(", ")}`);
  } catch (e) {
    console.error("[hank&lot] the demo companies were loaded but their stock was not; to start again from empty, stop and delete the state folder (.data).");
    throw e;
  }
  return true;
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
    console.log(loaded ? "[hank&lot] demo companies loaded" : "[hank&lot] database already has data; demo not loaded");
    await closeDb();
  }
}
