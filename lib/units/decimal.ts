// Exact decimal arithmetic for quantities and money. Binary floats never hold a quantity: every
// value is a Dec (decimal.js, 60 significant digits, so sums and products of NUMERIC(30,12) values
// and the exact unit factors never round) and rounding happens only in toStored (storing) and in
// display.ts / money.ts (showing, minor units), always half-even.
import Decimal from "decimal.js";
import { UnitError } from "./errors";

export const Dec = Decimal.clone({
  precision: 60,
  rounding: Decimal.ROUND_HALF_EVEN,
  // plain notation from toString() too, so no exponent ever leaks into a string by accident
  toExpNeg: -9e15,
  toExpPos: 9e15,
});
export type Dec = Decimal;

/** Dec values are immutable, so these are safe to share (use them instead of dec(0): no numbers). */
export const ZERO = new Dec(0);
export const ONE = new Dec(1);

/** Quantities: NUMERIC(30,12) in the item's stock unit. */
export const QUANTITY_SCALE = 12;
export const QUANTITY_PRECISION = 30;
/** Unit costs: NUMERIC(20,6) per stock unit. */
export const UNIT_COST_SCALE = 6;
export const UNIT_COST_PRECISION = 20;

// Same shape as decimalString() in lib/validation/common.ts: optional minus, digits, optional fraction.
const DECIMAL = /^-?\d+(?:\.\d+)?$/;
const MAX_LENGTH = 100;

export function isDecimalString(s: string): boolean {
  return s.length <= MAX_LENGTH && DECIMAL.test(s);
}

/**
 * Parses a plain decimal string ("12.5", "-0.25") or passes a Dec through. Refuses exponents,
 * NaN, Infinity, blanks, "1." and ".5". A JS number is a type error (and refused at run time):
 * it has already gone through binary floating point.
 */
export function dec(x: string | Dec): Dec {
  if (typeof x === "string") {
    if (!isDecimalString(x)) {
      throw new UnitError("INVALID_NUMBER", `"${x.slice(0, 40)}" is not a plain decimal number (e.g. "12.5").`);
    }
    return new Dec(x);
  }
  if (Decimal.isDecimal(x)) {
    if (!x.isFinite()) throw new UnitError("INVALID_NUMBER", "NaN and Infinity are not quantities.");
    // re-wrap values from another Decimal clone (clones share one prototype, so instanceof cannot
    // tell them apart) so that later arithmetic uses this configuration
    return x.constructor === Dec ? x : new Dec(x);
  }
  throw new UnitError("INVALID_NUMBER", `Expected a decimal string, got ${typeof x}.`);
}

/**
 * The value rounded half-even to `scale` decimals, as a plain string with exactly `scale` decimals
 * (what a NUMERIC(p, scale) column holds). With `precision`, refuses values whose integer part
 * would overflow NUMERIC(precision, scale). Use at the moment a value is stored.
 */
export function toStored(value: string | Dec, scale: number = QUANTITY_SCALE, precision?: number): string {
  assertScale(scale);
  const rounded = dec(value).toDecimalPlaces(scale, Decimal.ROUND_HALF_EVEN);
  if (precision !== undefined && rounded.abs().gte(new Dec(10).pow(precision - scale))) {
    throw new UnitError("INVALID_NUMBER", `${plain(rounded)} is too large to store (NUMERIC(${precision},${scale})).`);
  }
  return (rounded.isZero() ? new Dec(0) : rounded).toFixed(scale);
}

/** A stock quantity as stored: NUMERIC(30,12), half-even. */
export const toStoredQuantity = (value: string | Dec) => toStored(value, QUANTITY_SCALE, QUANTITY_PRECISION);
/** A unit cost as stored: NUMERIC(20,6), half-even. */
export const toStoredUnitCost = (value: string | Dec) => toStored(value, UNIT_COST_SCALE, UNIT_COST_PRECISION);

/**
 * The shortest plain decimal string, unrounded: no exponent, no trailing zeros, "-0" -> "0".
 * For API responses ("12.500000000000" from the database -> "12.5").
 */
export function plain(value: string | Dec): string {
  const d = dec(value);
  return d.isZero() ? "0" : d.toFixed();
}

export function assertScale(scale: number): void {
  if (!Number.isInteger(scale) || scale < 0 || scale > 30) {
    throw new UnitError("INVALID_NUMBER", `A scale must be a whole number from 0 to 30, not ${scale}.`);
  }
}
