// Reorder suggestions for the buying page and the API: who may read them and for which kitchens,
// the figures of lib/reorder (gather + suggest) shaped for the page, and turning chosen lines into
// draft purchase orders, one per supplier.
//
// Reading needs purchasing.read in the kitchen; making drafts purchasing.manage in it. A kitchen
// of another company is 404 in the query and 422 on `kitchen` in a body (as for purchase orders);
// a supplier item of another company is 422 on its line, as if it did not exist.
//
// The drafts of one request are made in one transaction: all of them or none. Everything a draft
// checks is checked for all lines first, so the error names the request's own line.
import "server-only";
import { addDays, formatISO, parseISO } from "date-fns";
import { db } from "../../db/client";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import { can, canSomewhere } from "../auth/permissions";
import { CURE_CAUTION } from "../cure/caution";
import { AppError, forbidden, notFound, validation } from "../http/errors";
import { lineTotal, moneyText, orderTotal, toMinor } from "../purchasing/order-money";
import { gatherReorder, type PendingOrder, type ReorderItemFacts, type ReorderItemRef } from "../reorder/gather";
import type { OfferFigures } from "../reorder/suggest";
import { isUuid } from "../validation/items";
import type { ReorderOrdersInput } from "../validation/reorder";
import { createPurchaseOrder, type PurchaseOrder } from "./purchase-orders";

export type { PendingOrder, ReorderItemRef };

export interface ReorderSupplierRef {
  id: string;
  name: string;
  leadTimeDays: number;
  minOrderValue: string | null;
}

export interface ReorderOffer {
  supplierItemId: string;
  supplier: ReorderSupplierRef;
  sku: string;
  packLabel: string;
  packSize: string;
  packPrice: string | null;
  unitPrice: string | null;
  horizon: string;
  plannedWithinLeadTime: string;
  openOrdersWithinLeadTime: string;
  projected: string;
  suggested: boolean;
  shortfall: string;
  packs: number;
  quantity: string;
  value: string | null;
  reasons: string[];
}

interface LevelFigures {
  item: ReorderItemRef;
  onHand: string;
  reserved: string;
  reorderPoint: string;
  parLevel: string | null;
  projectedToday: string;
  pendingOrders: PendingOrder[];
}

export interface ReorderLine extends LevelFigures {
  chosen: ReorderOffer;
  minimumRaise: number;
  alternatives: ReorderOffer[];
}

export interface ReorderUnsourced extends LevelFigures {
  reasons: string[];
}

export interface ReorderSupplierGroup {
  supplier: ReorderSupplierRef;
  deliverBy: string;
  value: string;
  belowMinimum: boolean;
  reasons: string[];
  lines: ReorderLine[];
}

export interface KitchenReorder {
  kitchen: { id: string; code: string; name: string };
  watched: number;
  suppliers: ReorderSupplierGroup[];
  unsourced: ReorderUnsourced[];
}

export interface ReorderSuggestions {
  today: string;
  currency: string;
  cureCaution: string | null;
  kitchens: KitchenReorder[];
}

interface KitchenRow {
  id: string;
  code: string;
  name: string;
  archived_at: Date | null;
}

async function findKitchen(companyId: string, ref: string): Promise<KitchenRow | undefined> {
  const q = db()("kitchens").where({ company_id: companyId });
  if (isUuid(ref)) q.where({ id: ref });
  else q.whereRaw("upper(code) = upper(?)", [ref]);
  return q.first("id", "code", "name", "archived_at");
}

const supplierOf = (o: OfferFigures["offer"], currency: string): ReorderSupplierRef => ({
  id: o.supplierId,
  name: o.supplierName,
  leadTimeDays: o.leadTimeDays,
  minOrderValue: o.minOrderValue === null ? null : moneyText(o.minOrderValue, currency),
});

function offerOf(f: OfferFigures, currency: string): ReorderOffer {
  const o = f.offer;
  return {
    supplierItemId: o.supplierItemId,
    supplier: supplierOf(o, currency),
    sku: o.sku,
    packLabel: o.packLabel,
    packSize: f.offer.packSize,
    packPrice: o.packPrice === null ? null : moneyText(o.packPrice, currency),
    unitPrice: f.unitPrice,
    horizon: f.horizon,
    plannedWithinLeadTime: f.plannedWithinLeadTime,
    openOrdersWithinLeadTime: f.openOrdersWithinLeadTime,
    projected: f.projected,
    suggested: f.suggested,
    shortfall: f.shortfall,
    packs: f.packs,
    quantity: f.quantity,
    // as the order line will be: packs x pack price, rounded once to the currency's decimals
    value: o.packPrice === null ? null : lineTotal(String(f.packs), o.packPrice, currency),
    reasons: f.reasons,
  };
}

const levelsOf = (f: ReorderItemFacts): LevelFigures => ({
  item: f.item,
  onHand: f.input.onHand,
  reserved: f.input.reserved,
  reorderPoint: f.input.reorderPoint!,
  parLevel: f.input.parLevel,
  projectedToday: f.suggestion.projectedToday,
  pendingOrders: f.pendingOrders,
});

/** The kitchens to read: the one named (404 outside the company or archived, 403 outside reach), else every open kitchen in reach. */
async function kitchensToRead(actor: CurrentUser, ref: string | undefined): Promise<string[]> {
  if (!canSomewhere(actor, "purchasing.read")) throw forbidden("Your role may not see buying (admins, managers, buyers and accountants only).");
  if (ref !== undefined) {
    const k = await findKitchen(actor.companyId, ref);
    if (!k || k.archived_at) throw notFound("Kitchen");
    assertCan(actor, "purchasing.read", { kitchenId: k.id });
    return [k.id];
  }
  const all: { id: string }[] = await db()("kitchens").where({ company_id: actor.companyId }).whereNull("archived_at").select("id");
  return all.map((k) => k.id).filter((kitchenId) => can(actor, "purchasing.read", { kitchenId }));
}

/** What to reorder in one kitchen (by id or code), or in every kitchen the user may see. */
export async function getReorderSuggestions(actor: CurrentUser, kitchenRef?: string): Promise<ReorderSuggestions> {
  const kitchenIds = await kitchensToRead(actor, kitchenRef);
  const g = await gatherReorder(db(), { companyId: actor.companyId, kitchenIds });
  const { currency, today } = g;
  let cure = false;
  const kitchens = g.kitchens.map((k): KitchenReorder => {
    const byKey = new Map(k.items.map((f) => [f.key, f]));
    const suppliers = k.groups.map((grp): ReorderSupplierGroup => {
      const first = grp.lines[0]!.figures.offer;
      const lines = grp.lines.map((l): ReorderLine => {
        const f = byKey.get(l.key)!;
        const before = f.suggestion.chosen!;
        if (f.item.category === "cure") cure = true;
        return {
          ...levelsOf(f),
          chosen: offerOf(l.figures, currency),
          minimumRaise: l.figures.packs - before.packs,
          alternatives: f.suggestion.offers.filter((o) => o !== before).map((o) => offerOf(o, currency)),
        };
      });
      const values = lines.map((l) => l.chosen.value).filter((v): v is string => v !== null);
      const value = orderTotal(values, currency);
      return {
        supplier: supplierOf(first, currency),
        deliverBy: formatISO(addDays(parseISO(today), first.leadTimeDays), { representation: "date" }),
        value,
        belowMinimum: first.minOrderValue !== null && toMinor(value, currency) < toMinor(first.minOrderValue, currency),
        reasons: grp.reasons,
        lines,
      };
    });
    const unsourced = k.items
      .filter((f) => f.suggestion.suggested && f.suggestion.chosen === null)
      .map((f): ReorderUnsourced => {
        if (f.item.category === "cure") cure = true;
        return { ...levelsOf(f), reasons: f.suggestion.reasons };
      });
    return { kitchen: k.kitchen, watched: k.items.length, suppliers, unsourced };
  });
  return { today, currency, cureCaution: cure ? CURE_CAUTION : null, kitchens };
}

// ---------------------------------------------------------------------------------------------
// Drafts from the chosen lines

interface SupplierItemCheck {
  id: string;
  supplier_id: string;
  supplier_name: string;
  supplier_active: boolean;
  lead_time_days: number;
  sku: string;
  active: boolean;
  item_sku: string;
  item_archived_at: Date | null;
  current_price: string | null;
}

/**
 * One draft purchase order per supplier of the lines, delivered to the kitchen, asking for
 * delivery by today + the supplier's lead time (the day the suggestion looked ahead to). Lines
 * keep the order they were sent in within each draft.
 */
export async function createReorderOrders(actor: CurrentUser, input: ReorderOrdersInput): Promise<{ orders: PurchaseOrder[] }> {
  if (!canSomewhere(actor, "purchasing.manage")) throw forbidden("Your role may not draft orders (admins, managers and buyers only).");
  const kitchen = await findKitchen(actor.companyId, input.kitchen);
  if (!kitchen) throw validation({ kitchen: ["No kitchen of your company has this id or code."] });
  if (kitchen.archived_at) throw validation({ kitchen: [`Kitchen ${kitchen.code} is archived: choose another delivery kitchen.`] });
  assertCan(actor, "purchasing.manage", { kitchenId: kitchen.id });

  const fields: Record<string, string[]> = {};
  const bad = (i: number, field: string, message: string) => (fields[`lines.${i}.${field}`] ??= []).push(message);
  const seen = new Map<string, number>();
  input.lines.forEach((l, i) => {
    const before = seen.get(l.supplierItemId);
    if (before !== undefined) bad(i, "supplierItemId", `Already on line ${before + 1}: change its packs instead.`);
    else seen.set(l.supplierItemId, i);
  });

  const { rows: [facts] } = await db().raw<{ rows: { today: string }[] }>(
    "select to_char((now() at time zone time_zone)::date, 'YYYY-MM-DD') as today from companies where id = ?",
    [actor.companyId],
  );
  const today = facts!.today;
  const checks: SupplierItemCheck[] = await db()("supplier_items as si")
    .join("suppliers as s", function () {
      this.on("s.company_id", "=", "si.company_id").andOn("s.id", "=", "si.supplier_id");
    })
    .join("items as i", function () {
      this.on("i.company_id", "=", "si.company_id").andOn("i.id", "=", "si.item_id");
    })
    .where("si.company_id", actor.companyId)
    .whereIn("si.id", [...seen.keys()])
    .select(
      "si.id", "si.supplier_id", "s.name as supplier_name", "s.active as supplier_active", "s.lead_time_days", "si.sku", "si.active",
      "i.sku as item_sku", "i.archived_at as item_archived_at",
      db().raw(
        `(select p.pack_price from supplier_item_prices p
           where p.company_id = si.company_id and p.supplier_item_id = si.id and p.effective_from <= ?::date
           order by p.effective_from desc limit 1) as current_price`,
        [today],
      ),
    );
  const byId = new Map(checks.map((c) => [c.id, c]));

  // the lines by supplier, suppliers in the order they first appear
  const groups = new Map<string, { supplier: SupplierItemCheck; lines: { index: number; line: ReorderOrdersInput["lines"][number] }[] }>();
  input.lines.forEach((l, i) => {
    if (seen.get(l.supplierItemId) !== i) return;
    const c = byId.get(l.supplierItemId);
    if (!c) return bad(i, "supplierItemId", "No supplier item of your company has this id.");
    if (!c.supplier_active) return bad(i, "supplierItemId", `${c.supplier_name} is switched off: choose another supplier for this item.`);
    if (!c.active) return bad(i, "supplierItemId", `${c.sku} is switched off at ${c.supplier_name}: choose another supplier for this item.`);
    if (c.item_archived_at) return bad(i, "supplierItemId", `Our item ${c.item_sku} is archived: bring it back in the catalogue first.`);
    if (l.packPrice === undefined && c.current_price === null) return bad(i, "packPrice", `${c.sku} has no current price at ${c.supplier_name}: send the pack price.`);
    const g = groups.get(c.supplier_id) ?? { supplier: c, lines: [] };
    g.lines.push({ index: i, line: l });
    groups.set(c.supplier_id, g);
  });
  if (Object.keys(fields).length) throw validation(fields);

  const orders = await db().transaction(async (trx) => {
    const made: PurchaseOrder[] = [];
    for (const g of groups.values()) {
      try {
        made.push(
          await createPurchaseOrder(actor, {
            supplier: g.supplier.supplier_id,
            kitchen: kitchen.id,
            deliverBy: formatISO(addDays(parseISO(today), g.supplier.lead_time_days), { representation: "date" }),
            lines: g.lines.map(({ line }) => ({ supplierItem: line.supplierItemId, packs: line.packs, ...(line.packPrice !== undefined ? { packPrice: line.packPrice } : {}) })),
          }, trx),
        );
      } catch (e) {
        throw renumber(e, g.lines.map((l) => l.index));
      }
    }
    return made;
  });
  return { orders };
}

/** A draft's field errors ("lines.0.packPrice", "supplier") named by the request's own lines. */
function renumber(e: unknown, indexes: number[]): unknown {
  if (!(e instanceof AppError) || e.code !== "VALIDATION") return e;
  const given = (e.details as { fields?: Record<string, string[]> } | undefined)?.fields ?? {};
  const out: Record<string, string[]> = {};
  for (const [key, messages] of Object.entries(given)) {
    const m = /^lines\.(\d+)\.(.+)$/.exec(key);
    const target = m
      ? `lines.${indexes[Number(m[1])] ?? 0}.${m[2] === "supplierItem" ? "supplierItemId" : m[2]}`
      : key === "supplier"
        ? `lines.${indexes[0]}.supplierItemId`
        : key;
    (out[target] ??= []).push(...messages);
  }
  return validation(out, e.message);
}
