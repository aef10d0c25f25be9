// The company's house limits (stricter cure limits of its own). Admins set them; every planner reads them.
import "server-only";
import type { Knex } from "knex";
import { db } from "../../db/client";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import type { HouseLimit } from "../cure/house";
import type { ProductClass } from "../cure/limits";
import { validation } from "../http/errors";
import { dec, plain } from "../units";

export async function loadHouseLimits(k: Knex | Knex.Transaction, companyId: string): Promise<HouseLimit[]> {
  const rows: { product_class: ProductClass; substance: "nitrite" | "nitrate"; kind: "max" | "min"; limit_ppm: string; note: string }[] = await k("house_limits")
    .where({ company_id: companyId }).orderBy(["product_class", "substance", "kind"]).select("product_class", "substance", "kind", "limit_ppm", "note");
  return rows.map((r) => ({ productClass: r.product_class, substance: r.substance, kind: r.kind, limitPpm: plain(dec(r.limit_ppm)), note: r.note }));
}

export async function listHouseLimits(actor: CurrentUser): Promise<HouseLimit[]> {
  assertCan(actor, "planning.read");
  return loadHouseLimits(db(), actor.companyId);
}

/** Replaces the company's house limits with these (all or nothing). */
export async function setHouseLimits(actor: CurrentUser, limits: HouseLimit[]): Promise<HouseLimit[]> {
  assertCan(actor, "company.manage");
  const seen = new Set<string>();
  limits.forEach((l, i) => {
    const key = `${l.productClass}|${l.substance}|${l.kind}`;
    if (seen.has(key)) throw validation({ [`limits.${i}`]: ["This class, substance and kind is set twice."] });
    seen.add(key);
  });
  limits.forEach((l, i) => {
    if (l.kind !== "min") return;
    const max = limits.find((m) => m.kind === "max" && m.productClass === l.productClass && m.substance === l.substance);
    if (max && dec(max.limitPpm).lt(dec(l.limitPpm))) throw validation({ [`limits.${i}.limitPpm`]: ["A minimum above the maximum for the same class and substance."] });
  });
  await db().transaction(async (trx) => {
    await trx("house_limits").where({ company_id: actor.companyId }).delete();
    if (limits.length) {
      await trx("house_limits").insert(limits.map((l) => ({
        company_id: actor.companyId, product_class: l.productClass, substance: l.substance, kind: l.kind, limit_ppm: l.limitPpm, note: l.note, updated_by: actor.id,
      })));
    }
  });
  return loadHouseLimits(db(), actor.companyId);
}
