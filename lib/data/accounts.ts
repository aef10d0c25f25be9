// The account mapping the accountant keeps for the movement journal (lib/data/journal.ts): one
// inventory account per item category, and the account on the other side of each kind of movement
// (lib/validation/accounts.ts, MAPPING_KEYS). Read with reports.read; replaced whole, all or
// nothing, with accounts.manage (admins and accountants). Company-scoped.
import "server-only";
import type { Knex } from "knex";
import { db } from "../../db/client";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import { MAPPING_KEYS, type AccountMappingInput, type MappingKind } from "../validation/accounts";

export interface AccountMappingEntry {
  kind: MappingKind;
  key: string;
  accountCode: string;
  name: string | null;
}

export interface AccountMapping {
  entries: AccountMappingEntry[];
  unmapped: { kind: MappingKind; key: string }[];
}

const order = (kind: string, key: string) => MAPPING_KEYS.findIndex((k) => k.kind === kind && k.key === key);

/** The company's mapping as stored (knex from the caller: the journal reads it too). */
export async function loadAccountMapping(k: Knex | Knex.Transaction, companyId: string): Promise<AccountMapping> {
  const rows: { kind: MappingKind; key: string; account_code: string; name: string | null }[] = await k("account_mappings")
    .where({ company_id: companyId })
    .select("kind", "key", "account_code", "name");
  const entries = rows
    .map((r) => ({ kind: r.kind, key: r.key, accountCode: r.account_code, name: r.name }))
    .sort((a, b) => order(a.kind, a.key) - order(b.kind, b.key));
  const unmapped = MAPPING_KEYS.filter((m) => !entries.some((e) => e.kind === m.kind && e.key === m.key)).map((m) => ({ kind: m.kind, key: m.key }));
  return { entries, unmapped };
}

export async function getAccountMapping(actor: CurrentUser): Promise<AccountMapping> {
  assertCan(actor, "reports.read");
  return loadAccountMapping(db(), actor.companyId);
}

/**
 * Replaces the whole mapping with these entries (a key left out becomes unmapped), in one
 * transaction. The body's schema (accountMappingInput) already refused a bad entry with 422
 * naming it (entries.N.field), duplicates included, so nothing is written then.
 */
export async function putAccountMapping(actor: CurrentUser, entries: AccountMappingInput["entries"]): Promise<AccountMapping> {
  assertCan(actor, "accounts.manage");
  await db().transaction(async (trx) => {
    // two replacements at once: the second waits and then replaces the first's (never a duplicate key)
    await trx.raw("select pg_advisory_xact_lock(hashtext(?))", [`account_mappings:${actor.companyId}`]);
    await trx("account_mappings").where({ company_id: actor.companyId }).delete();
    if (entries.length) {
      await trx("account_mappings").insert(entries.map((e) => ({
        company_id: actor.companyId, kind: e.kind, key: e.key, account_code: e.accountCode, name: e.name ?? null, updated_by: actor.id, updated_at: trx.fn.now(),
      })));
    }
  });
  return loadAccountMapping(db(), actor.companyId);
}
