// Each test builds its own data here, straight into the test database (never the demo seed).
// Names, codes and e-mails carry a random tag, so test files can run side by side.
// Plain knex only (no server-only modules), so the browser suites can use it too; sessions and
// loaded users are in ./sessions.ts.
// env: DATABASE_URL (set by db/test.sh)
import { randomUUID } from "node:crypto";
import { db } from "../../db/client";
import { ROLES, type Role } from "../../db/types";
import { hashPassword } from "../../lib/auth/password";

/** The password of every user the factory makes. */
export const TEST_PASSWORD = "brine-and-pepper-42";

// argon2 is deliberately slow: hash the shared password once per test file.
let passwordHash: Promise<string> | undefined;
const testPasswordHash = () => (passwordHash ??= hashPassword(TEST_PASSWORD));

/** A short random tag (lower-case letters and digits). */
export const tag = () => randomUUID().replace(/-/g, "").slice(0, 10);

/** A fresh e-mail address nobody else in the run uses. */
export const uniqueEmail = (prefix = "person") => `${prefix}-${tag()}@tests.hankandlot.test`;

export interface TestKitchen {
  id: string;
  code: string;
  name: string;
}

export interface TestUser {
  id: string;
  email: string;
  name: string;
  role: Role;
  kitchenIds: string[];
}

export interface TestCompany {
  company: { id: string; name: string; timeZone: string };
  kitchens: TestKitchen[];
  /** One user per role; the kitchen lead is assigned the first kitchen (if any). */
  users: Record<Role, TestUser>;
  password: string;
}

export async function createCompany(opts: { kitchens?: number; name?: string; timeZone?: string } = {}): Promise<TestCompany> {
  const t = tag();
  const [company] = await db()("companies")
    .insert({ name: opts.name ?? `Test Larder ${t}`, time_zone: opts.timeZone ?? "Europe/London", currency: "EUR" })
    .returning<{ id: string; name: string; time_zone: string }[]>(["id", "name", "time_zone"]);
  const kitchens: TestKitchen[] = [];
  for (let i = 1; i <= (opts.kitchens ?? 1); i++) {
    const [k] = await db()("kitchens")
      .insert({ company_id: company!.id, code: `K${i}-${t.slice(0, 6).toUpperCase()}`, name: `Kitchen ${i} ${t}` })
      .returning<TestKitchen[]>(["id", "code", "name"]);
    kitchens.push(k!);
  }
  const users = {} as Record<Role, TestUser>;
  for (const role of ROLES) {
    users[role] = await createUser(company!.id, role, { kitchenIds: role === "kitchen_lead" && kitchens[0] ? [kitchens[0].id] : [] });
  }
  return { company: { id: company!.id, name: company!.name, timeZone: company!.time_zone }, kitchens, users, password: TEST_PASSWORD };
}

export async function createUser(
  companyId: string,
  role: Role,
  opts: { kitchenIds?: string[]; email?: string; disabled?: boolean; timeZone?: string } = {},
): Promise<TestUser> {
  const email = opts.email ?? uniqueEmail(role.replace("_", "-"));
  const name = `${role} ${tag()}`;
  const [user] = await db()("app_users")
    .insert({
      company_id: companyId, email, name, role, password_hash: await testPasswordHash(),
      time_zone: opts.timeZone ?? null, disabled_at: opts.disabled ? new Date() : null,
    })
    .returning<{ id: string }[]>("id");
  const kitchenIds = opts.kitchenIds ?? [];
  if (kitchenIds.length) {
    await db()("user_kitchens").insert(kitchenIds.map((kitchen_id) => ({ company_id: companyId, user_id: user!.id, kitchen_id })));
  }
  return { id: user!.id, email, name, role, kitchenIds };
}
