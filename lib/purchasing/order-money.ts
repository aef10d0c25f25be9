// The money of a purchase order, exact and the same everywhere: the server stores what these give,
// and the new-order form shows the same figures live before anything is sent. Pure, client-safe.
//
//   line total = packs x pack price, rounded once, half-even, to the currency's decimals
//   order total = the sum of the line totals (each already rounded: the PDF's lines add up to it)
//
// Pack prices are kept as the supplier quotes them (up to 4 decimals, NUMERIC(20,4)); amounts are
// in the company's one currency, major units. A currency missing from the ISO 4217 table
// (lib/units/money.ts) is reckoned with 2 decimals, the most common exponent, so an order can
// still be written; the table is what the company's currency should be in.
import { Dec, ZERO, dec, plain } from "../units/decimal";
import { CURRENCY_EXPONENTS } from "../units/money";

/** The decimals amounts of this currency are shown and rounded with. */
export function currencyDecimals(currency: string): number {
  const code = currency.trim().toUpperCase();
  return Object.hasOwn(CURRENCY_EXPONENTS, code) ? CURRENCY_EXPONENTS[code]! : 2;
}

/** packs x pack price, half-even to the currency's decimals (a string with exactly those decimals). */
export function lineTotal(packs: string | Dec, packPrice: string | Dec, currency: string): string {
  const e = currencyDecimals(currency);
  return dec(packs).times(dec(packPrice)).toDecimalPlaces(e, Dec.ROUND_HALF_EVEN).toFixed(e);
}

/** The sum of line totals, with the currency's decimals. */
export function orderTotal(lineTotals: readonly (string | Dec)[], currency: string): string {
  return lineTotals.reduce<Dec>((sum, t) => sum.plus(dec(t)), ZERO).toFixed(currencyDecimals(currency));
}

/** An amount in minor units (what lib/auth/permissions compares against the approval threshold). */
export function toMinor(amount: string | Dec, currency: string): bigint {
  const e = currencyDecimals(currency);
  return BigInt(dec(amount).times(new Dec(10).pow(e)).toDecimalPlaces(0, Dec.ROUND_HALF_EVEN).toFixed(0));
}

/**
 * An amount as shown: at least the currency's decimals ("12.5" GBP -> "12.50"), more only when the
 * value has them (a pack price of "0.1234" stays "0.1234"). Never rounds.
 */
export function moneyText(amount: string | Dec, currency: string): string {
  const d = dec(amount);
  const e = currencyDecimals(currency);
  return d.decimalPlaces() <= e ? d.toFixed(e) : plain(d);
}

/** packs x pack size: the stock quantity a line orders (exact; stored to 12 decimals by the caller). */
export function orderedStock(packs: string | Dec, packSizeStock: string | Dec): Dec {
  return dec(packs).times(dec(packSizeStock));
}
