// Reorder suggestions: one pure function shared by the buying page and the queued alert jobs, so
// both say the same thing. No I/O; callers gather the figures (lib/reorder/gather.ts) and pass
// them in. Quantities are exact decimal strings in the item's stock unit; money in the company's
// currency, exact.
//
// For one kitchen and one item, for each supplier that lists it (the purchasing issue's rule; the
// reorder point itself is the company's setting, textbook form in trade-facts §8):
//   projected = on hand - reserved - planned use not yet reserved (batches dated within the
//               supplier's lead time) + open order quantities due within it
//   suggested when projected < reorder point
//   quantity  = (par level, or the reorder point when there is no par) - projected,
//               rounded up to whole packs (suggestReorder), then raised to the supplier's
//               minimum order value over all the lines going to that supplier (groupBySupplier:
//               the minimum is per order, so one line is not raised when others already reach it)
// The supplier with the cheapest current price per stock unit is preselected; the others stay
// listed as alternatives with their own figures.
import { Dec, ZERO, dec, plain } from "../units/decimal";
import { addDays, formatISO, parseISO } from "date-fns";

export interface DatedQuantity {
  /** ISO date (yyyy-MM-dd) the quantity is needed (planned batch) or due (open order) */
  date: string;
  quantity: string;
}

export interface SupplierOffer {
  supplierId: string;
  supplierName: string;
  supplierItemId: string;
  sku: string;
  leadTimeDays: number;
  /** the supplier's minimum order value, or null */
  minOrderValue: string | null;
  /** one pack in the item's stock unit */
  packSize: string;
  packLabel: string;
  /** current price of one pack, or null when no price is known */
  packPrice: string | null;
}

export interface ReorderInput {
  /** ISO date the suggestion is made on */
  today: string;
  onHand: string;
  reserved: string;
  reorderPoint: string | null;
  parLevel: string | null;
  /** planned batch use not yet reserved, by batch date */
  plannedUse: DatedQuantity[];
  /** quantities on open purchase orders not yet received, by due date */
  openOrders: DatedQuantity[];
  offers: SupplierOffer[];
}

export interface OfferFigures {
  offer: SupplierOffer;
  /** the last day counted: today + lead time */
  horizon: string;
  plannedWithinLeadTime: string;
  openOrdersWithinLeadTime: string;
  projected: string;
  suggested: boolean;
  /** what the projection needs to reach the target (0 when not suggested) */
  shortfall: string;
  packs: number;
  /** packs x pack size */
  quantity: string;
  /** price per stock unit, or null without a price */
  unitPrice: string | null;
  /** packs x pack price, or null without a price */
  value: string | null;
  reasons: string[];
}

export interface ReorderSuggestion {
  /** the projection without any supplier (lead time 0): what is left today */
  projectedToday: string;
  suggested: boolean;
  /** the preselected offer (cheapest per stock unit among the suggesting ones), or null */
  chosen: OfferFigures | null;
  offers: OfferFigures[];
  reasons: string[];
}

const sumWithin = (rows: DatedQuantity[], horizon: string): Dec =>
  rows.filter((r) => r.date <= horizon).reduce((s, r) => s.plus(dec(r.quantity)), ZERO);

/** Whole packs needed to cover `need` (need > 0), at least one. */
export function packsFor(need: Dec, packSize: Dec): number {
  if (!packSize.gt(0)) throw new RangeError("A pack must hold more than zero.");
  const packs = need.div(packSize).ceil();
  return Math.max(1, packs.toNumber());
}

function figuresFor(input: ReorderInput, offer: SupplierOffer): OfferFigures {
  const reasons: string[] = [];
  const horizon = formatISO(addDays(parseISO(input.today), offer.leadTimeDays), { representation: "date" });
  const planned = sumWithin(input.plannedUse, horizon);
  const incoming = sumWithin(input.openOrders, horizon);
  const projected = dec(input.onHand).minus(dec(input.reserved)).minus(planned).plus(incoming);
  const point = input.reorderPoint === null ? null : dec(input.reorderPoint);
  const target = input.parLevel !== null ? dec(input.parLevel) : point;
  const packSize = dec(offer.packSize);
  const unitPrice = offer.packPrice === null ? null : dec(offer.packPrice).div(packSize);

  const suggested = point !== null && projected.lt(point);
  let packs = 0;
  let shortfall = ZERO;
  if (suggested && target !== null) {
    shortfall = target.minus(projected);
    packs = packsFor(shortfall, packSize);
    reasons.push(
      `Projected ${plain(projected)} by ${horizon} (on hand ${plain(dec(input.onHand))} − reserved ${plain(dec(input.reserved))} − planned ${plain(planned)} + on order ${plain(incoming)}) is below the reorder point ${plain(point!)}.`,
    );
    reasons.push(
      `${input.parLevel !== null ? "Par level" : "Reorder point (no par level set)"} ${plain(target)} − projected ${plain(projected)} = ${plain(shortfall)}, rounded up to ${packs} × ${offer.packLabel}.`,
    );
    if (offer.packPrice === null) reasons.push(`No current price from ${offer.supplierName}.`);
  } else if (point === null) {
    reasons.push("No reorder point is set for this item in this kitchen.");
  }
  const quantity = packSize.times(packs);
  return {
    offer,
    horizon,
    plannedWithinLeadTime: plain(planned),
    openOrdersWithinLeadTime: plain(incoming),
    projected: plain(projected),
    suggested,
    shortfall: plain(shortfall),
    packs,
    quantity: plain(quantity),
    unitPrice: unitPrice === null ? null : plain(unitPrice),
    value: offer.packPrice === null ? null : plain(dec(offer.packPrice).times(packs)),
    reasons,
  };
}

/** Cheapest per stock unit first; priced before unpriced; then shorter lead time, then name. */
function compareOffers(a: OfferFigures, b: OfferFigures): number {
  if (a.unitPrice !== null && b.unitPrice !== null) {
    const c = dec(a.unitPrice).comparedTo(dec(b.unitPrice));
    if (c !== 0) return c;
  } else if (a.unitPrice !== b.unitPrice) {
    return a.unitPrice === null ? 1 : -1;
  }
  if (a.offer.leadTimeDays !== b.offer.leadTimeDays) return a.offer.leadTimeDays - b.offer.leadTimeDays;
  return a.offer.supplierName.localeCompare(b.offer.supplierName) || a.offer.sku.localeCompare(b.offer.sku);
}

export function suggestReorder(input: ReorderInput): ReorderSuggestion {
  const offers = input.offers.map((o) => figuresFor(input, o)).sort(compareOffers);
  const projectedToday = plain(
    dec(input.onHand).minus(dec(input.reserved)).minus(sumWithin(input.plannedUse, input.today)).plus(sumWithin(input.openOrders, input.today)),
  );
  const reasons: string[] = [];
  const point = input.reorderPoint === null ? null : dec(input.reorderPoint);
  const todayShort = point !== null && dec(projectedToday).lt(point);
  const chosen = offers.find((o) => o.suggested) ?? null;
  if (offers.length === 0 && todayShort) reasons.push("Below the reorder point, but no supplier lists this item: add one on the supplier's page.");
  return { projectedToday, suggested: chosen !== null || (offers.length === 0 && todayShort), chosen, offers, reasons };
}

export interface OrderLineSuggestion {
  /** caller's key, e.g. kitchen and item */
  key: string;
  itemName: string;
  figures: OfferFigures;
}

export interface SupplierOrderSuggestion {
  supplierId: string;
  supplierName: string;
  minOrderValue: string | null;
  lines: OrderLineSuggestion[];
  /** sum of priced lines after raising */
  value: string;
  reasons: string[];
}

/**
 * Groups chosen lines by supplier and raises a group whose priced total is under the supplier's
 * minimum order value: the extra packs go to the line with the largest shortfall value (shortfall x
 * price per stock unit), as many whole packs as reach the minimum. Returns new figures; the
 * input is not changed.
 */
export function groupBySupplier(lines: OrderLineSuggestion[]): SupplierOrderSuggestion[] {
  const groups = new Map<string, OrderLineSuggestion[]>();
  for (const l of lines) {
    const g = groups.get(l.figures.offer.supplierId) ?? [];
    g.push({ ...l, figures: { ...l.figures, reasons: [...l.figures.reasons] } });
    groups.set(l.figures.offer.supplierId, g);
  }
  const out: SupplierOrderSuggestion[] = [];
  for (const [supplierId, g] of groups) {
    const first = g[0]!.figures.offer;
    const reasons: string[] = [];
    const total = () => g.reduce((s, l) => (l.figures.value === null ? s : s.plus(dec(l.figures.value))), ZERO);
    const min = first.minOrderValue === null ? null : dec(first.minOrderValue);
    const priced = g.filter((l) => l.figures.offer.packPrice !== null && dec(l.figures.offer.packPrice).gt(0));
    if (min !== null && total().lt(min) && priced.length > 0) {
      const before = total();
      const target = [...priced].sort((a, b) => {
        const va = dec(a.figures.shortfall).times(dec(a.figures.unitPrice!));
        const vb = dec(b.figures.shortfall).times(dec(b.figures.unitPrice!));
        return vb.comparedTo(va) || a.key.localeCompare(b.key);
      })[0]!;
      const price = dec(target.figures.offer.packPrice!);
      const extra = min.minus(before).div(price).ceil().toNumber();
      const packs = target.figures.packs + extra;
      target.figures = {
        ...target.figures,
        packs,
        quantity: plain(dec(target.figures.offer.packSize).times(packs)),
        value: plain(price.times(packs)),
        reasons: [...target.figures.reasons, `Raised by ${extra} to ${packs} packs so the order to ${first.supplierName} reaches its minimum of ${plain(min)} (it was ${plain(before)}).`],
      };
      reasons.push(`Order total ${plain(before)} was under ${first.supplierName}'s minimum order of ${plain(min)}.`);
    }
    if (g.some((l) => l.figures.offer.packPrice === null)) reasons.push("Some lines have no current price: the order total leaves them out.");
    out.push({ supplierId, supplierName: first.supplierName, minOrderValue: first.minOrderValue, lines: g, value: plain(total()), reasons });
  }
  return out.sort((a, b) => a.supplierName.localeCompare(b.supplierName));
}
