// How prices read on screen (client-safe): exact decimal strings from the API, shown with the
// currency's decimals (more only where the price has them), a change in percent with its sign as a
// word-like symbol, and the one comparison unit that suits the person's unit system.
import { amountText } from "@/components/purchasing/order-format";
import { CURRENCY_EXPONENTS, dec, plain, type StockUnit, type UnitSystem } from "@/lib/units";

/** "199.0000" EUR -> "€199.00"; "0.0125" -> "€0.0125" (a price's own decimals beyond the currency's are kept). */
export function priceText(value: string, currency: string): string {
  const exponent = Object.hasOwn(CURRENCY_EXPONENTS, currency) ? CURRENCY_EXPONENTS[currency]! : 2;
  const d = dec(value);
  const shown = d.decimalPlaces() > exponent ? plain(d) : d.toFixed(exponent);
  return amountText(shown, currency);
}

/** "+5.0 %", "−5.0 %" (a true minus), "0.0 %". */
export function percentText(changePercent: string): string {
  if (changePercent.startsWith("-")) return `−${changePercent.slice(1)} %`;
  return changePercent === "0.0" ? "0.0 %" : `+${changePercent} %`;
}

/**
 * Which of the comparison units (per kg and lb, l and gal, m and yd, or per hank and m and yd) to
 * show first: the put-up for casings in put-ups, else the unit of the person's system.
 */
export function preferredUnitIndex(units: readonly { unit: string }[], stockUnit: StockUnit, system: UnitSystem): number {
  if (units.length <= 1 || (stockUnit === "pc" && units[0]!.unit !== "pc")) return 0;
  const wanted = system === "us" ? ["lb", "gal", "yd"] : ["kg", "l", "m"];
  const i = units.findIndex((u) => wanted.includes(u.unit));
  return i < 0 ? 0 : i;
}

/** For a casing in put-ups, the length unit of the person's system to show beside the put-up. */
export function lengthUnitIndex(units: readonly { unit: string }[], system: UnitSystem): number | null {
  const i = units.findIndex((u) => u.unit === (system === "us" ? "yd" : "m"));
  return i < 0 ? null : i;
}
