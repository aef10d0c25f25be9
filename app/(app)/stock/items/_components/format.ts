// How catalogue values read on screen. Client-safe; exact (percentages are fractions x 100, no rounding).
import type { ItemCategory } from "@/db/types";
import { CASING_KIND_LABELS, PUT_UP_LABELS, STORAGE_LABELS } from "@/lib/casing/put-ups";
import type { Salt } from "@/lib/cure/limits";
import type { Item } from "@/lib/data/items";
import { dec, plain } from "@/lib/units";

export const CATEGORY_LABELS: Record<ItemCategory, { one: string; many: string }> = {
  casing: { one: "Casing", many: "Casings" },
  cure: { one: "Cure", many: "Cures" },
  spice: { one: "Spice", many: "Spices" },
  ingredient: { one: "Ingredient", many: "Ingredients" },
};

export const STOCK_UNIT_LABELS = { g: "g (grams)", m: "m (metres)", ml: "ml (millilitres)", pc: "pc (pieces)" } as const;

/** "0.0625" -> "6.25" (exact). */
export const percentOf = (fraction: string) => plain(dec(fraction).times(100));

/** " potassium" after a potassium salt's percentage; sodium, the common salt, goes unsaid. */
export const saltNote = (salt: Salt) => (salt === "potassium" ? " potassium" : "");

/** "6.25" -> "0.0625" (exact), or undefined when it is not a plain decimal. */
export function fractionOf(percent: string): string | undefined {
  try {
    return plain(dec(percent).div(100));
  } catch {
    return undefined;
  }
}

export function calibreText(c: NonNullable<Item["casing"]>): string {
  return c.calibreMinMm === c.calibreMaxMm ? `${c.calibreMinMm} mm` : `${c.calibreMinMm}/${c.calibreMaxMm} mm`;
}

export function putUpText(c: NonNullable<Item["casing"]>): string {
  if (!c.putUp) return "By length";
  const parts = [`${PUT_UP_LABELS[c.putUp]} ${c.putUpMetres} m`];
  if (c.capacityKgPerPutUp) parts.push(`${c.capacityKgPerPutUp} kg`);
  return parts.join(" · ");
}

export function categoryDetail(item: Item): string | null {
  if (item.casing) return `${CASING_KIND_LABELS[item.casing.kind]} · ${STORAGE_LABELS[item.casing.storage].toLowerCase()}`;
  if (item.category === "spice" || item.category === "ingredient") return item.form;
  return null;
}
