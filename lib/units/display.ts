// Showing quantities. The ONLY rounding here is for display: never store what these return.
//
// Rule (display only, half-even): the readable unit is chosen from the value's size, then the
// value is rounded half-even to a fixed number of decimals per unit, chosen so one step in the
// last place is about 1 g, 1 ml or 1 cm or finer (0.1 g / 0.1 ml in g and ml, the resolution of
// a kitchen scale); trailing zeros are dropped ("1.500" -> "1.5"):
//   g 1, kg 3, oz 2, lb 3 | ml 1, l 3, fl oz 2, gal 4 | m 2, ft 2, yd 2 | put-ups and pc 3.
// Cure quantities that are checked against a limit are rounded by the cure module toward
// compliance, not here.
import { dec, Dec, plain } from "./decimal";
import { findGlobalUnit, type GlobalUnitCode } from "./global-units";
import { fromStockUnits, metresOf, putUpLabel, type ItemUnits } from "./item-units";

export type UnitSystem = "metric" | "us";

export const DISPLAY_DECIMALS: Readonly<Record<GlobalUnitCode, number>> = {
  mg: 0, g: 1, kg: 3, oz: 2, lb: 3,
  mm: 0, cm: 1, m: 2, in: 1, ft: 2, yd: 2,
  ml: 1, l: 3, tsp: 2, tbsp: 2, fl_oz: 2, gal: 4,
  pc: 3,
};
const PUT_UP_DECIMALS = 3;

export interface FormattedQuantity {
  /** rounded half-even for display, plain decimal, no trailing zeros */
  value: string;
  /** the unit code or the put-up's name, usable with toStockUnits */
  unit: string;
  /** what to print after the number ("fl oz", "set") */
  label: string;
}

export interface FormatOptions {
  /** show in this unit instead of choosing one (a global unit code or the item's put-up/pack) */
  unit?: string;
  /** override the decimals of the rule above */
  decimals?: number;
}

const LB_IN_G = new Dec("453.59237");
const GAL_IN_ML = new Dec("3785.411784");
const YD_IN_M = new Dec("0.9144");

/** The readable unit for a value in the item's stock unit. Decided on the unrounded value. */
function chooseUnit(value: Dec, item: ItemUnits, system: UnitSystem): string {
  const size = value.abs();
  switch (item.stockUnit) {
    case "g":
      return system === "metric" ? (size.lt(1000) ? "g" : "kg") : size.lt(LB_IN_G) ? "oz" : "lb";
    case "ml":
      return system === "metric" ? (size.lt(1000) ? "ml" : "l") : size.lt(GAL_IN_ML) ? "fl_oz" : "gal";
    case "m":
      return system === "metric" ? "m" : size.lt(YD_IN_M) ? "ft" : "yd";
    case "pc":
      return item.putUp ? item.putUp.name : "pc";
  }
}

function roundForDisplay(v: Dec, decimals: number): string {
  return plain(v.toDecimalPlaces(decimals, Dec.ROUND_HALF_EVEN));
}

/**
 * A stock quantity (in the item's stock unit) for people: { value: "1.5", unit: "kg", label: "kg" }.
 * A put-up item shows put-ups; show its length with formatMetresOf.
 */
export function formatQuantity(value: string | Dec, item: ItemUnits, system: UnitSystem, opts: FormatOptions = {}): FormattedQuantity {
  const v = dec(value);
  const unit = opts.unit ?? chooseUnit(v, item, system);
  const shown = fromStockUnits(v, unit, item);
  const putUp = item.putUp && unit === item.putUp.name ? item.putUp : null;
  let label = unit;
  let decimals = PUT_UP_DECIMALS;
  if (putUp) label = putUpLabel(putUp);
  else {
    // a pack is shown as named, with the put-up precision
    const g = findGlobalUnit(unit);
    if (g) {
      label = g.label;
      decimals = DISPLAY_DECIMALS[g.code];
    }
  }
  return { value: roundForDisplay(shown, opts.decimals ?? decimals), unit, label };
}

/** The derived length of a put-up (or metre) item, for people: metric m, us yd (ft below 1 yd). */
export function formatMetresOf(value: string | Dec, item: ItemUnits, system: UnitSystem, opts: FormatOptions = {}): FormattedQuantity {
  return formatQuantity(metresOf(value, item), { stockUnit: "m" }, system, opts);
}
