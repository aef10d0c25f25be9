import "server-only";
import type { z } from "zod";
import { db } from "../../db/client";
import type { KitchenRow } from "../../db/types";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import { conflict, notFound } from "../http/errors";
import type { kitchenCreateInput, kitchenUpdateInput } from "../validation/company";

export interface Kitchen {
  id: string;
  code: string;
  name: string;
  address: string;
  timeZone: string | null;
  archived: boolean;
}

const toKitchen = (k: KitchenRow): Kitchen => ({
  id: k.id, code: k.code, name: k.name, address: k.address, timeZone: k.time_zone, archived: k.archived_at !== null,
});

/** Every kitchen of the company (everyone reads availability across kitchens). */
export async function listKitchens(actor: CurrentUser, opts: { includeArchived?: boolean } = {}): Promise<Kitchen[]> {
  const q = db()("kitchens").where({ company_id: actor.companyId }).orderBy("code");
  if (!opts.includeArchived) q.whereNull("archived_at");
  return (await q).map(toKitchen);
}

/**
 * One kitchen of the actor's company. Another company's kitchen is 404 (its existence is not
 * revealed); with `forAction`, a kitchen outside the actor's reach for that action is 403.
 */
export async function getKitchen(actor: CurrentUser, id: string, forAction?: Parameters<typeof assertCan>[1]): Promise<Kitchen> {
  const row: KitchenRow | undefined = await db()("kitchens").where({ company_id: actor.companyId, id }).first();
  if (!row) throw notFound("Kitchen");
  if (forAction) assertCan(actor, forAction, { kitchenId: id });
  return toKitchen(row);
}

const isUniqueViolation = (e: unknown) => (e as { code?: string }).code === "23505";

export async function createKitchen(actor: CurrentUser, input: z.infer<typeof kitchenCreateInput>): Promise<Kitchen> {
  assertCan(actor, "kitchens.manage");
  try {
    const [row] = await db()("kitchens")
      .insert({ company_id: actor.companyId, code: input.code, name: input.name, address: input.address, time_zone: input.timeZone })
      .returning<KitchenRow[]>("*");
    return toKitchen(row!);
  } catch (e) {
    if (isUniqueViolation(e)) throw conflict(`A kitchen with code ${input.code} already exists.`, "CONFLICT", { fields: { code: ["Already used."] } });
    throw e;
  }
}

export async function updateKitchen(actor: CurrentUser, id: string, input: z.infer<typeof kitchenUpdateInput>): Promise<Kitchen> {
  const current: KitchenRow | undefined = await db()("kitchens").where({ company_id: actor.companyId, id }).first();
  if (!current) throw notFound("Kitchen");
  assertCan(actor, "kitchens.manage");
  const patch: Partial<KitchenRow> = {};
  if (input.code !== undefined) patch.code = input.code;
  if (input.name !== undefined) patch.name = input.name;
  if (input.address !== undefined) patch.address = input.address;
  if (input.timeZone !== undefined) patch.time_zone = input.timeZone;
  if (input.archived !== undefined) patch.archived_at = input.archived ? new Date() : null;
  if (Object.keys(patch).length === 0) return toKitchen(current); // knex refuses an empty UPDATE
  try {
    const [row] = await db()("kitchens").where({ company_id: actor.companyId, id }).update(patch).returning<KitchenRow[]>("*");
    return toKitchen(row!);
  } catch (e) {
    if (isUniqueViolation(e)) throw conflict(`A kitchen with code ${input.code} already exists.`, "CONFLICT", { fields: { code: ["Already used."] } });
    throw e;
  }
}
