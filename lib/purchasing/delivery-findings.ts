// What is wrong (or right) with one delivered line, as pure rules (no I/O): the data layer
// (lib/data/deliveries.ts) gathers the figures, this decides the findings. Several can apply.
//
// Quantities are exact decimals in the item's stock unit; prices are compared per stock unit, so a
// different pack of the same item (an alternative) compares fairly with what was ordered.
import type { DateKind, ItemCategory } from "../../db/types";
import { Dec, dec } from "../units/decimal";

export const DELIVERY_FINDINGS = [
  "as_ordered", "short", "over", "different_item", "not_on_order", "price_differs", "lot_missing", "date_missing", "expired", "short_dated",
] as const;
export type DeliveryFinding = (typeof DELIVERY_FINDINGS)[number];

/** How the delivery screen words each finding (our own words). */
export const FINDING_LABELS: Record<DeliveryFinding, string> = {
  as_ordered: "Matches the order",
  short: "Less than ordered",
  over: "More than ordered",
  different_item: "Substitute for the ordered item",
  not_on_order: "Not on any open order",
  price_differs: "Price off the order",
  lot_missing: "No lot code",
  date_missing: "No date",
  expired: "Already out of date",
  short_dated: "Too little life left",
};

export interface ReceivingRules {
  /** |delivered - ordered| / ordered above this percent is price_differs (default 2) */
  priceTolerancePercent: string;
  /** the least remaining life in days per category (0: no check) */
  shortDatedDays: Record<ItemCategory, number>;
}

export const DEFAULT_RECEIVING_RULES: ReceivingRules = {
  priceTolerancePercent: "2",
  shortDatedDays: { cure: 90, casing: 60, spice: 180, ingredient: 0 },
};

export interface LineFacts {
  /** null: the line names no supplier item we know */
  item: { category: ItemCategory; trackLots: boolean; trackDates: boolean } | null;
  /** delivered, in the item's stock unit (null when the item is unknown) */
  quantityStock: string | null;
  /** per stock unit as delivered (null: no price on the note) */
  pricePerStock: string | null;
  lotCode: string | null;
  date: string | null;
  dateKind: DateKind | null;
  /** the order line it was matched to */
  match: {
    /** true: the delivered supplier item is another one for the same stock item */
    substitute: boolean;
    /** what is still to come on the order line before this line (earlier lines of the note taken off) */
    outstandingStock: string;
    /** the ordered pack price per stock unit */
    orderedPerStock: string;
  } | null;
  /** the company's today, yyyy-mm-dd */
  today: string;
}

/** Whole days from `from` to `to` (yyyy-mm-dd, UTC calendar days). */
export function daysBetween(from: string, to: string): number {
  return Math.round((Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / 86_400_000);
}

/** |a - b| / b x 100, exact; b = 0 counts any difference as infinite. */
export function priceDeviationPercent(delivered: Dec, ordered: Dec): Dec | null {
  if (ordered.isZero()) return delivered.isZero() ? dec("0") : null;
  return delivered.minus(ordered).abs().div(ordered).times(100);
}

export function findingsFor(f: LineFacts, rules: ReceivingRules): DeliveryFinding[] {
  const out: DeliveryFinding[] = [];
  if (!f.match) out.push("not_on_order");
  else {
    if (f.match.substitute) out.push("different_item");
    if (f.quantityStock !== null) {
      const q = dec(f.quantityStock);
      const o = dec(f.match.outstandingStock);
      if (q.lt(o)) out.push("short");
      else if (q.gt(o)) out.push("over");
    }
    if (f.pricePerStock !== null) {
      const dev = priceDeviationPercent(dec(f.pricePerStock), dec(f.match.orderedPerStock));
      if (dev === null || dev.gt(dec(rules.priceTolerancePercent))) out.push("price_differs");
    }
  }
  // as ordered: the order side is right (the item, the quantity, the price); lot and date are judged apart
  if (f.match && out.length === 0) out.push("as_ordered");
  const lotNeeded = f.item ? f.item.trackLots || f.item.category === "cure" : false;
  if (!f.lotCode && lotNeeded) out.push("lot_missing");
  const dateNeeded = f.item ? f.item.trackDates || f.item.category === "cure" : false;
  if (!f.date && dateNeeded) out.push("date_missing");
  if (f.date) {
    const left = daysBetween(f.today, f.date);
    if (left < 0) out.push("expired");
    else if (f.item && left < (rules.shortDatedDays[f.item.category] ?? 0)) out.push("short_dated");
  }
  return out;
}

/**
 * Landed unit costs per stock unit, exact (rounded only when stored): each accepted line's value
 * (quantity x pack price) plus its share of the freight, the freight spread by value, over the
 * quantity in stock units. With no value at all (every price 0) the freight is spread by quantity.
 */
export function landedUnitCosts(lines: readonly { value: string; quantityStock: string }[], freight: string): Dec[] {
  const f = dec(freight);
  const totalValue = lines.reduce((s, l) => s.plus(dec(l.value)), dec("0"));
  const totalQty = lines.reduce((s, l) => s.plus(dec(l.quantityStock)), dec("0"));
  return lines.map((l) => {
    const share = totalValue.isZero() ? (totalQty.isZero() ? dec("0") : f.times(dec(l.quantityStock)).div(totalQty)) : f.times(dec(l.value)).div(totalValue);
    return dec(l.value).plus(share).div(dec(l.quantityStock));
  });
}
