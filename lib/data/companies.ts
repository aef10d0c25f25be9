import "server-only";
import type { z } from "zod";
import { db } from "../../db/client";
import type { CompanyRow } from "../../db/types";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import type { companyUpdateInput } from "../validation/company";

export interface Company {
  id: string;
  name: string;
  timeZone: string;
  currency: string;
}

const toCompany = (c: CompanyRow): Company => ({ id: c.id, name: c.name, timeZone: c.time_zone, currency: c.currency });

export async function getCompany(actor: CurrentUser): Promise<Company> {
  const row: CompanyRow = await db()("companies").where({ id: actor.companyId }).first();
  return toCompany(row);
}

export async function updateCompany(actor: CurrentUser, input: z.infer<typeof companyUpdateInput>): Promise<Company> {
  assertCan(actor, "company.manage");
  const [row] = await db()("companies")
    .where({ id: actor.companyId })
    .update({ name: input.name, time_zone: input.timeZone, currency: input.currency })
    .returning<CompanyRow[]>("*");
  return toCompany(row!);
}
