// Quantities of plans and recipes for people (display only: rounding here never reaches storage).
// Every value arrives in the item's stock unit (g, ml, m, pc = one put-up) as an exact decimal
// string; lib/units picks the readable unit for the user's metric or US setting. Cure is the
// exception: it is shown in grams exactly as planned, because it was rounded to the kitchen
// scale's resolution toward compliance and the scale weighs in grams.
import { dec, formatMetresOf, formatQuantity, plain, putUpLabel, type ItemUnits, type UnitSystem } from "@/lib/units";

export type UnitsById = Readonly<Record<string, ItemUnits>>;

interface LineItem {
  id: string;
  unit: "g" | "m" | "ml" | "pc";
  category: "casing" | "cure" | "spice" | "ingredient";
}

const plural = (word: string, value: string) => (value === "1" ? word : /(s|x|ch|sh)$/.test(word) ? `${word}es` : `${word}s`);

/** "1.25 kg", "3 oz", "0.454 hanks"; cure "24.9 g" as planned. */
export function quantityText(value: string, item: LineItem, units: UnitsById, system: UnitSystem): string {
  if (item.category === "cure" && item.unit === "g") return `${plain(dec(value))} g`;
  const u = units[item.id] ?? { stockUnit: item.unit };
  const f = formatQuantity(value, u, system);
  if (u.putUp && f.unit === u.putUp.name) return `${f.value} ${plural(putUpLabel(u.putUp), f.value)}`;
  return `${f.value} ${f.label}`;
}

/** The length of a put-up quantity ("41.47 m" / "45.35 yd"), or null for items without put-ups. */
export function lengthText(value: string, item: LineItem, units: UnitsById, system: UnitSystem): string | null {
  const u = units[item.id];
  if (!u?.putUp) return null;
  const f = formatMetresOf(value, u, system);
  return `${f.value} ${f.label}`;
}

/** A length given in metres, for people: "41.47 m" or "45.35 yd". */
export function metresText(metres: string, system: UnitSystem): string {
  const f = formatQuantity(metres, { stockUnit: "m" }, system);
  return `${f.value} ${f.label}`;
}

/** A mass given in grams, for people: "40 kg", "88.185 lb". */
export function gramsText(grams: string, system: UnitSystem): string {
  const f = formatQuantity(grams, { stockUnit: "g" }, system);
  return `${f.value} ${f.label}`;
}

/** The word for a put-up item's put-up, plural when the count is not 1: "hank", "sets". */
export function putUpWord(itemId: string, units: UnitsById, count: number): string {
  const u = units[itemId];
  const word = u?.putUp ? putUpLabel(u.putUp) : "put-up";
  return plural(word, String(count));
}

/** "rounded down to the 0.1 g scale (exact 24.975 g)" and friends. */
export function roundingText(rounding: "exact" | "down" | "up", exact: string, scaleResolutionG: string): string {
  if (rounding === "exact") return `exact, no rounding on the ${scaleResolutionG} g scale`;
  return `rounded ${rounding} to the ${scaleResolutionG} g scale (exact ${plain(dec(exact).toDecimalPlaces(6))} g)`;
}

/** A signed difference for people: "+0.4 g", "−1.2 kg" (a real minus sign), "0 g" when none. */
function signed(value: string, text: (abs: string) => string): string {
  const v = dec(value);
  const body = text(plain(v.abs()));
  return v.isZero() ? body : `${v.isNegative() ? "\u2212" : "+"}${body}`;
}

/** actual - planned of a line, in the item's unit for the user (cure in grams as weighed). */
export function signedQuantityText(value: string, item: LineItem, units: UnitsById, system: UnitSystem): string {
  return signed(value, (abs) => quantityText(abs, item, units, system));
}

/** A signed mass given in grams: "+200 g", "−0.441 lb". */
export function signedGramsText(grams: string, system: UnitSystem): string {
  return signed(grams, (abs) => gramsText(abs, system));
}
