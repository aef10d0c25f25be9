// How buying figures read on screen. Client-safe; money stays a decimal string (never a float).
import { dec, formatMetresOf, formatQuantity, putUpLabel, type ItemUnits, type UnitSystem } from "@/lib/units";

/** "£1,250.00" from "1250.00" and GBP: the currency's symbol (Intl) in front of the exact amount. */
export function moneyText(amount: string, currency: string): string {
  let symbol = currency;
  try {
    symbol = new Intl.NumberFormat("en-GB", { style: "currency", currency }).formatToParts(0).find((p) => p.type === "currency")?.value ?? currency;
  } catch {
    // a code Intl does not know: shown as the code
  }
  const [whole, fraction] = amount.split(".");
  const grouped = whole!.replace(/\B(?=(\d{3})+(?!\d))/g, ",");
  const sep = /^[A-Z]{3}$/.test(symbol) ? " " : "";
  return `${symbol}${sep}${grouped}${fraction !== undefined ? `.${fraction}` : ""}`;
}

export const leadTimeText = (days: number) => (days === 0 ? "same day" : days === 1 ? "1 day" : `${days} days`);

const plural = (word: string, value: string) => (value === "1" ? word : /(s|x|ch|sh)$/.test(word) ? `${word}es` : `${word}s`);

/**
 * One pack in our stock unit, for people: "5 hanks", "11.34 kg" / "25 lb". With the item's units
 * a put-up reads as its name; without them, the stock unit as stored.
 */
export function packStockText(packSizeStock: string, stockUnit: string, units: ItemUnits | undefined, system: UnitSystem): string {
  if (!units) return `${packSizeStock} ${stockUnit}`;
  const f = formatQuantity(dec(packSizeStock), units, system);
  if (units.putUp && f.unit === units.putUp.name) return `${f.value} ${plural(putUpLabel(units.putUp), f.value)}`;
  return `${f.value} ${f.label}`;
}

/** The pack's length ("457.2 m" / "500 yd"), for casings in put-ups; null otherwise. */
export function packLengthText(packSizeStock: string, units: ItemUnits | undefined, system: UnitSystem): string | null {
  if (!units?.putUp) return null;
  const f = formatMetresOf(dec(packSizeStock), units, system);
  return `${f.value} ${f.label}`;
}
