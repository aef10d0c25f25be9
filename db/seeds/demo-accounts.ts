// The demo company's account mapping for the movement journal (invented codes in the style of a
// small kitchen's chart of accounts). Loaded by db/seeds/load-demo.ts when the company has none.
import type { Knex } from "knex";

export const DEMO_ACCOUNTS: readonly { kind: "inventory" | "movement"; key: string; accountCode: string; name: string }[] = [
  { kind: "inventory", key: "cure", accountCode: "1300", name: "Stock - cures" },
  { kind: "inventory", key: "casing", accountCode: "1310", name: "Stock - casings" },
  { kind: "inventory", key: "spice", accountCode: "1320", name: "Stock - spices" },
  { kind: "inventory", key: "ingredient", accountCode: "1330", name: "Stock - other ingredients" },
  { kind: "movement", key: "receipt", accountCode: "2150", name: "Goods received, not yet invoiced" },
  { kind: "movement", key: "use", accountCode: "5010", name: "Materials used in production" },
  { kind: "movement", key: "waste", accountCode: "5080", name: "Waste and spoilage" },
  { kind: "movement", key: "loss", accountCode: "5090", name: "Stock count losses" },
  { kind: "movement", key: "gain", accountCode: "4890", name: "Stock count gains" },
];

/** Writes the demo mapping; the caller checked that the company has none. Returns the entries written. */
export async function loadDemoAccounts(trx: Knex.Transaction, companyId: string): Promise<number> {
  await trx("account_mappings").insert(DEMO_ACCOUNTS.map((a) => ({ company_id: companyId, kind: a.kind, key: a.key, account_code: a.accountCode, name: a.name })));
  return DEMO_ACCOUNTS.length;
}
