// Par level and reorder point per item per kitchen, in the item's stock unit.
import "server-only";
import type { z } from "zod";
import { db } from "../../db/client";
import type { KitchenRow } from "../../db/types";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import { notFound, validation } from "../http/errors";
import { plain, toStockUnits, toStored, UnitError } from "../units";
import type { stockLevelInput } from "../validation/movements";
import { loadItemForLedger } from "./items-for-ledger";

export interface StockLevel {
  kitchen: string;
  itemId: string;
  sku: string;
  unit: string;
  parLevel: string | null;
  reorderPoint: string | null;
}

export async function setStockLevel(actor: CurrentUser, input: z.infer<typeof stockLevelInput>): Promise<StockLevel> {
  const kitchen: KitchenRow | undefined = await db()("kitchens").where({ company_id: actor.companyId }).whereRaw("upper(code) = upper(?)", [input.kitchen]).first();
  if (!kitchen) throw notFound("Kitchen");
  assertCan(actor, "levels.manage", { kitchenId: kitchen.id });
  const item = await loadItemForLedger(db(), actor.companyId, input.item);
  const unit = input.unit ?? item.row.stock_unit;
  const inStock = (v: string | null, field: string) => {
    if (v === null) return null;
    try {
      return toStockUnits(v, unit, item.units);
    } catch (e) {
      if (e instanceof UnitError) throw validation({ [input.unit ? "unit" : field]: [e.message] });
      throw e;
    }
  };
  const par = inStock(input.parLevel, "parLevel");
  const reorder = inStock(input.reorderPoint, "reorderPoint");
  if (par && reorder && reorder.gt(par)) throw validation({ reorderPoint: ["The reorder point must not be above the par level."] });
  const row = {
    company_id: actor.companyId, kitchen_id: kitchen.id, item_id: item.row.id,
    par_level: par ? toStored(par) : null, reorder_point: reorder ? toStored(reorder) : null,
    updated_by: actor.id, updated_at: new Date(),
  };
  await db()("stock_levels").insert(row).onConflict(["kitchen_id", "item_id"]).merge();
  return {
    kitchen: kitchen.code, itemId: item.row.id, sku: item.row.sku, unit: item.row.stock_unit,
    parLevel: par ? plain(toStored(par)) : null, reorderPoint: reorder ? plain(toStored(reorder)) : null,
  };
}
