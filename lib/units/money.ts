// Money. Amounts on documents are integers in the currency's minor unit (ISO 4217 exponent);
// unit costs are NUMERIC(20,6) per stock unit. Both are rounded half-even, here and only here.
import { dec, Dec, toStored, UNIT_COST_PRECISION, UNIT_COST_SCALE } from "./decimal";
import { UnitError } from "./errors";
import { stockUnitsPer, type ItemUnits } from "./item-units";

/** ISO 4217 minor-unit exponents of the currencies a kitchen is likely to trade in. */
export const CURRENCY_EXPONENTS: Readonly<Record<string, number>> = {
  EUR: 2, USD: 2, GBP: 2, CHF: 2, CAD: 2, AUD: 2, NZD: 2, SEK: 2, NOK: 2, DKK: 2, PLN: 2, CZK: 2,
  HUF: 2, RON: 2, BGN: 2, MXN: 2, BRL: 2, ZAR: 2, CNY: 2, HKD: 2, SGD: 2, INR: 2, TRY: 2, ILS: 2,
  JPY: 0, KRW: 0, ISK: 0, CLP: 0, VND: 0,
  KWD: 3, BHD: 3, OMR: 3, JOD: 3, TND: 3,
};

/** The ISO 4217 exponent of a currency code ("eur" is accepted); UNKNOWN_CURRENCY otherwise. */
export function currencyExponent(currency: string): number {
  const code = typeof currency === "string" ? currency.trim().toUpperCase() : "";
  const e = Object.hasOwn(CURRENCY_EXPONENTS, code) ? CURRENCY_EXPONENTS[code] : undefined;
  if (e === undefined) throw new UnitError("UNKNOWN_CURRENCY", `Unknown currency "${String(currency)}".`, { currency: String(currency) });
  return e;
}

/** An amount ("2.345") in minor units of the currency, half-even (EUR: 234n). */
export function minorUnits(amount: string | Dec, currency: string): bigint {
  const e = currencyExponent(currency);
  return BigInt(dec(amount).times(new Dec(10).pow(e)).toDecimalPlaces(0, Dec.ROUND_HALF_EVEN).toFixed(0));
}

/** Minor units back to a decimal string with the currency's decimals (234n EUR -> "2.34"). */
export function fromMinorUnits(minor: bigint, currency: string): string {
  const e = currencyExponent(currency);
  if (typeof minor !== "bigint") throw new UnitError("INVALID_NUMBER", `Expected minor units as a bigint, got ${typeof minor}.`);
  return new Dec(minor.toString()).div(new Dec(10).pow(e)).toFixed(e);
}

/**
 * The cost per stock unit, NUMERIC(20,6) half-even, of a price given per typed unit:
 * 38.00 per hank of a hank item -> "38.000000"; 12.50 per lb of a gram item -> "0.027558".
 */
export function unitCostPerStockUnit(costPerEnteredUnit: string | Dec, enteredUnit: string, item: ItemUnits): string {
  return toStored(dec(costPerEnteredUnit).div(stockUnitsPer(enteredUnit, item)), UNIT_COST_SCALE, UNIT_COST_PRECISION);
}

/** quantity (stock units) x unit cost in minor units, half-even once on the product. */
export function lineAmountMinor(quantity: string | Dec, unitCost: string | Dec, currency: string): bigint {
  return minorUnits(dec(quantity).times(dec(unitCost)), currency);
}
