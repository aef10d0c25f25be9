// Loads the demo companies into an EMPTY database only; never wipes or touches existing data.
//   node --import tsx db/seeds/load-demo.ts                 load if empty
//   node --import tsx db/seeds/load-demo.ts --print-sign-ins   print the demo sign-ins and exit
// env: DATABASE_URL
import type { Knex } from "knex";
import { closeDb, db } from "../client";
import { hashPassword } from "../../lib/auth/password";
import { DEMO_COMPANIES, DEMO_PASSWORD } from "./demo-data";

export async function loadDemo(knex: Knex): Promise<boolean> {
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
