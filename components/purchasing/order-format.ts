// How purchase order figures read on screen (client-safe). Money stays the exact decimal string the
// API sent, grouped by thousands and led by the currency's symbol; quantities in the user's units.
import type { OrderStatus } from "@/lib/purchasing/order-status";
import { dec, formatQuantity, putUpLabel, type ItemUnits, type StockUnit, type UnitSystem } from "@/lib/units";

/** "£1,250.00" from "1250.00" GBP; a code Intl does not know is written out ("XTS 12.00"). */
export function amountText(amount: string, currency: string): string {
  let symbol = currency;
  try {
    symbol = new Intl.NumberFormat("en-GB", { style: "currency", currency }).formatToParts(0).find((p) => p.type === "currency")?.value ?? currency;
  } catch {
    // unknown to Intl: the code itself
  }
  const negative = amount.startsWith("-");
  const [whole, fraction] = (negative ? amount.slice(1) : amount).split(".");
  const grouped = whole!.replace(/\B(?=(\d{3})+(?!\d))/g, ",");
  return `${negative ? "−" : ""}${symbol}${/^[A-Z]{3}$/.test(symbol) ? " " : ""}${grouped}${fraction !== undefined ? `.${fraction}` : ""}`;
}

const plural = (word: string, value: string) => (value === "1" ? word : /(s|x|ch|sh)$/.test(word) ? `${word}es` : `${word}s`);

/** A stock quantity for people: "3 kg", "10 hanks", "750 ml" (display rounding only). */
export function stockText(value: string, item: { stockUnit: StockUnit; putUp: { name: string; metres: string } | null }, system: UnitSystem): string {
  const units: ItemUnits = item.putUp ? { stockUnit: item.stockUnit, putUp: item.putUp } : { stockUnit: item.stockUnit };
  const f = formatQuantity(dec(value), units, system);
  if (units.putUp && f.unit === units.putUp.name) return `${f.value} ${plural(putUpLabel(units.putUp), f.value)}`;
  return `${f.value} ${f.label}`;
}

/** The badge tone of each status: a word always goes with it. */
export const STATUS_TONES: Record<OrderStatus, "neutral" | "herb" | "amber" | "ember"> = {
  draft: "neutral",
  approved: "amber",
  sent: "herb",
  partly_received: "amber",
  received: "herb",
  closed_short: "neutral",
  cancelled: "ember",
};
