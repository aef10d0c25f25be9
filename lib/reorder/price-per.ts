// A price per stock unit (per g, m, ml or pc, as lib/reorder compares offers) restated per the unit
// a buyer thinks in: per kg (per lb in US units) for items stocked in grams, per litre (per gallon)
// for millilitres, per metre (per yard) for metres, per hank / set / strand for put-ups, per piece
// otherwise. Exact: the factor comes from lib/units (stockUnitsPer); rounding happens only when
// shown (priceText, half-even to 4 decimals, at least the currency's). Pure, client-safe.
import { Dec, dec, putUpLabel, stockUnitsPer, type ItemUnits, type StockUnit, type UnitSystem } from "../units";
import { moneyText } from "../purchasing/order-money";

export interface PricedItem {
  stockUnit: StockUnit;
  putUp: { name: string; metres: string } | null;
}

const BUYING_UNIT: Record<StockUnit, Record<UnitSystem, string>> = {
  g: { metric: "kg", us: "lb" },
  ml: { metric: "l", us: "gal" },
  m: { metric: "m", us: "yd" },
  pc: { metric: "pc", us: "pc" },
};

const LABELS: Record<string, string> = { kg: "kg", lb: "lb", l: "l", gal: "gal", m: "m", yd: "yd", pc: "piece" };

/** The unit a price is quoted per, and what to call it. */
export function buyingUnit(item: PricedItem, system: UnitSystem): { unit: string; label: string } {
  if (item.stockUnit === "pc" && item.putUp) return { unit: item.putUp.name, label: putUpLabel(item.putUp) };
  const unit = BUYING_UNIT[item.stockUnit][system];
  return { unit, label: LABELS[unit] ?? unit };
}

/** The exact price of one buying unit from the price of one stock unit. */
export function pricePerBuyingUnit(unitPrice: string, item: PricedItem, system: UnitSystem): { amount: Dec; label: string } {
  const { unit, label } = buyingUnit(item, system);
  const units: ItemUnits = item.putUp ? { stockUnit: item.stockUnit, putUp: item.putUp } : { stockUnit: item.stockUnit };
  return { amount: dec(unitPrice).times(stockUnitsPer(unit, units)), label };
}

/** "12.50 / kg" (the amount shown half-even to 4 decimals, at least the currency's). */
export function priceText(unitPrice: string, item: PricedItem, system: UnitSystem, currency: string): { amount: string; label: string } {
  const { amount, label } = pricePerBuyingUnit(unitPrice, item, system);
  return { amount: moneyText(amount.toDecimalPlaces(4, Dec.ROUND_HALF_EVEN), currency), label };
}
