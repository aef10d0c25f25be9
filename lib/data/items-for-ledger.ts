import "server-only";
import type { Knex } from "knex";
import type { ItemPackRow, ItemRow } from "../../db/types";
import { notFound } from "../http/errors";
import type { ItemUnits } from "../units";
import { itemUnitsOf } from "./items";

export interface LedgerItem {
  row: ItemRow;
  units: ItemUnits;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** An item of the company by id or SKU, with what lib/units needs to convert its quantities. */
export async function loadItemForLedger(trx: Knex | Knex.Transaction, companyId: string, ref: string): Promise<LedgerItem> {
  const q = trx("items").where({ company_id: companyId });
  const row: ItemRow | undefined = await (UUID.test(ref) ? q.where({ id: ref }) : q.where({ sku: ref })).first();
  if (!row) throw notFound("Item");
  const packs: ItemPackRow[] = await trx("item_packs").where({ item_id: row.id });
  return { row, units: itemUnitsOf(row, packs) };
}
