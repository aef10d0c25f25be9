// Units that mean the same for every item, with EXACT factors to their base unit. Sources: NIST
// SP 811 Appendix B and NIST Handbook 44 Appendix C; the US customary definitions are exact:
//   1 lb = 0.45359237 kg, 1 oz = 1/16 lb, 1 yd = 0.9144 m, 1 ft = 1/3 yd, 1 in = 25.4 mm,
//   1 US gal = 231 in^3 = 3.785411784 L, 1 US fl oz = 1/128 gal, 1 tbsp = 1/2 fl oz, 1 tsp = 1/3 tbsp.
// Spoons are US customary (not the 5 ml / 15 ml metric spoons): recipes from the trade are US.
import { dec, Dec } from "./decimal";
import { UnitError } from "./errors";

export type Dimension = "mass" | "length" | "volume" | "count";
export type BaseUnit = "g" | "m" | "ml" | "pc";

export const BASE_UNIT: Readonly<Record<Dimension, BaseUnit>> = { mass: "g", length: "m", volume: "ml", count: "pc" };
export const DIMENSION_OF_BASE: Readonly<Record<BaseUnit, Dimension>> = { g: "mass", m: "length", ml: "volume", pc: "count" };

export type GlobalUnitCode =
  | "mg" | "g" | "kg" | "oz" | "lb"
  | "mm" | "cm" | "m" | "in" | "ft" | "yd"
  | "ml" | "l" | "tsp" | "tbsp" | "fl_oz" | "gal"
  | "pc";

export interface GlobalUnit {
  code: GlobalUnitCode;
  dimension: Dimension;
  /** how many base units one of this unit is, exact, as a decimal string */
  factor: string;
  /** what a person reads ("fl oz") */
  label: string;
  system: "metric" | "us" | "both";
  aliases: readonly string[];
}

const units: readonly GlobalUnit[] = [
  { code: "mg", dimension: "mass", factor: "0.001", label: "mg", system: "metric", aliases: ["milligram", "milligrams"] },
  { code: "g", dimension: "mass", factor: "1", label: "g", system: "metric", aliases: ["gram", "grams", "gramme", "grammes"] },
  { code: "kg", dimension: "mass", factor: "1000", label: "kg", system: "metric", aliases: ["kgs", "kilo", "kilos", "kilogram", "kilograms"] },
  { code: "oz", dimension: "mass", factor: "28.349523125", label: "oz", system: "us", aliases: ["ounce", "ounces"] },
  { code: "lb", dimension: "mass", factor: "453.59237", label: "lb", system: "us", aliases: ["lbs", "pound", "pounds"] },

  { code: "mm", dimension: "length", factor: "0.001", label: "mm", system: "metric", aliases: ["millimetre", "millimetres", "millimeter", "millimeters"] },
  { code: "cm", dimension: "length", factor: "0.01", label: "cm", system: "metric", aliases: ["centimetre", "centimetres", "centimeter", "centimeters"] },
  { code: "m", dimension: "length", factor: "1", label: "m", system: "metric", aliases: ["metre", "metres", "meter", "meters"] },
  { code: "in", dimension: "length", factor: "0.0254", label: "in", system: "us", aliases: ["inch", "inches"] },
  { code: "ft", dimension: "length", factor: "0.3048", label: "ft", system: "us", aliases: ["foot", "feet"] },
  { code: "yd", dimension: "length", factor: "0.9144", label: "yd", system: "us", aliases: ["yds", "yard", "yards"] },

  { code: "ml", dimension: "volume", factor: "1", label: "ml", system: "metric", aliases: ["millilitre", "millilitres", "milliliter", "milliliters"] },
  { code: "l", dimension: "volume", factor: "1000", label: "l", system: "metric", aliases: ["litre", "litres", "liter", "liters"] },
  { code: "tsp", dimension: "volume", factor: "4.92892159375", label: "tsp", system: "us", aliases: ["teaspoon", "teaspoons"] },
  { code: "tbsp", dimension: "volume", factor: "14.78676478125", label: "tbsp", system: "us", aliases: ["tablespoon", "tablespoons"] },
  { code: "fl_oz", dimension: "volume", factor: "29.5735295625", label: "fl oz", system: "us", aliases: ["fl oz", "fl. oz", "fl. oz.", "floz", "fluid ounce", "fluid ounces"] },
  { code: "gal", dimension: "volume", factor: "3785.411784", label: "gal", system: "us", aliases: ["gallon", "gallons"] },

  { code: "pc", dimension: "count", factor: "1", label: "pc", system: "both", aliases: ["pcs", "piece", "pieces", "ea", "each"] },
];

export const GLOBAL_UNITS: ReadonlyMap<GlobalUnitCode, GlobalUnit> = new Map(units.map((u) => [u.code, u]));

const byName = new Map<string, GlobalUnit>();
for (const u of units) {
  for (const name of [u.code, u.label, ...u.aliases]) byName.set(normaliseUnitName(name), u);
}

/** Case-insensitive, blanks trimmed and collapsed, "_" read as a blank ("FL_OZ" = "fl oz"). */
export function normaliseUnitName(name: string): string {
  return name.trim().toLowerCase().replace(/[\s_]+/g, " ");
}

/** The global unit a typed name means, or undefined. */
export function findGlobalUnit(name: string): GlobalUnit | undefined {
  return byName.get(normaliseUnitName(name));
}

export function getGlobalUnit(code: GlobalUnitCode): GlobalUnit {
  const u = GLOBAL_UNITS.get(code);
  if (!u) throw new UnitError("UNKNOWN_UNIT", `Unknown unit "${code}".`);
  return u;
}

/** The exact factor of a global unit to its base unit, as a Dec. */
export function factorOf(code: GlobalUnitCode): Dec {
  return new Dec(getGlobalUnit(code).factor);
}

/** Global units of one dimension, in the table's order (metric first, small to large). */
export function globalUnitsOf(dimension: Dimension): GlobalUnit[] {
  return units.filter((u) => u.dimension === dimension);
}

/**
 * `quantity` of one global unit in another of the same dimension: quantity x factor(from) /
 * factor(to), one division, unrounded. Item-specific units (put-ups, packs, density): item-units.ts.
 */
export function convert(quantity: string | Dec, from: string, to: string): Dec {
  const a = findGlobalUnit(from);
  const b = findGlobalUnit(to);
  if (!a) throw new UnitError("UNKNOWN_UNIT", `Unknown unit "${from}".`, { unit: from });
  if (!b) throw new UnitError("UNKNOWN_UNIT", `Unknown unit "${to}".`, { unit: to });
  if (a.dimension !== b.dimension) {
    throw new UnitError("WRONG_DIMENSION", `"${from}" is a ${a.dimension} unit and "${to}" a ${b.dimension} unit.`, { unit: from, to });
  }
  return dec(quantity).times(a.factor).div(b.factor);
}
