// Prices per unit, for comparing suppliers who sell the same item in different packs: a pack price
// over the pack's size in the item's stock unit, then per kg / per metre / per hank as the item's
// unit family allows. Exact with Dec until the one rounding, half-even, where a figure is sent:
// per stock unit to 6 decimals (the scale of unit costs, NUMERIC(20,6)), per display unit to 4
// (the scale of pack prices, NUMERIC(20,4)), a change in percent to 1 decimal. Pure, client-safe.
import { dec, Dec, getGlobalUnit, putUpLabel, stockUnitsPer, type GlobalUnitCode, type ItemUnits } from "../units";

export interface ComparisonUnit {
  /** usable with lib/units (a global unit code or the item's put-up) */
  unit: string;
  /** what to print after "per" */
  label: string;
}

export interface UnitPrice extends ComparisonUnit {
  /** the price of one `unit`, 4 decimals half-even */
  price: string;
}

const globalUnit = (code: GlobalUnitCode): ComparisonUnit => ({ unit: code, label: getGlobalUnit(code).label });

/**
 * The units a price is compared in, metric first: mass per kg and lb, volume per l and gal, length
 * per m and yd; a casing in put-ups per put-up (hank) and per m and yd of casing; pieces per pc.
 */
export function comparisonUnits(units: ItemUnits): ComparisonUnit[] {
  switch (units.stockUnit) {
    case "g":
      return [globalUnit("kg"), globalUnit("lb")];
    case "ml":
      return [globalUnit("l"), globalUnit("gal")];
    case "m":
      return [globalUnit("m"), globalUnit("yd")];
    case "pc":
      return units.putUp ? [{ unit: units.putUp.name, label: putUpLabel(units.putUp) }, globalUnit("m"), globalUnit("yd")] : [globalUnit("pc")];
  }
}

/** The exact price of one stock unit (pack price / pack size in stock units). */
export function exactPerStockUnit(packPrice: string | Dec, packSizeStock: string | Dec): Dec {
  return dec(packPrice).div(dec(packSizeStock));
}

/** Per stock unit, rounded half-even to 6 decimals (as unit costs are kept). */
export function pricePerStockUnit(packPrice: string | Dec, packSizeStock: string | Dec): string {
  return exactPerStockUnit(packPrice, packSizeStock).toDecimalPlaces(6, Dec.ROUND_HALF_EVEN).toFixed(6);
}

/** The price per each comparison unit of the item, 4 decimals half-even, from the exact figure. */
export function unitPrices(packPrice: string | Dec, packSizeStock: string | Dec, units: ItemUnits): UnitPrice[] {
  const perStock = exactPerStockUnit(packPrice, packSizeStock);
  return comparisonUnits(units).map((u) => ({ ...u, price: perStock.times(stockUnitsPer(u.unit, units)).toDecimalPlaces(4, Dec.ROUND_HALF_EVEN).toFixed(4) }));
}

export type PriceDirection = "up" | "down" | "same" | "new";

export function priceDirection(oldPrice: string | null, newPrice: string): PriceDirection {
  if (oldPrice === null) return "new";
  const c = dec(newPrice).cmp(dec(oldPrice));
  return c > 0 ? "up" : c < 0 ? "down" : "same";
}

/** (new - old) / old in percent, exact, then half-even to 1 decimal ("12.5", "-3.0"); null without an old price. */
export function changePercent(oldPrice: string | null, newPrice: string): string | null {
  if (oldPrice === null) return null;
  const old = dec(oldPrice);
  if (old.isZero()) return null;
  const pct = dec(newPrice).minus(old).div(old).times(100).toDecimalPlaces(1, Dec.ROUND_HALF_EVEN);
  return pct.isZero() ? "0.0" : pct.toFixed(1); // a fall of under 0.05 % reads 0.0, not -0.0
}
