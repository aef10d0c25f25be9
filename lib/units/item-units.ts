// Units that depend on the item: a casing's put-up (hank, set, strand...), its purchase packs, and
// mass <-> volume through a density. Every conversion is a ratio num/den of exact decimals,
// applied as quantity x num / den with ONE division at the end, so 45.72 m of a 91.44 m hank is
// exactly 0.5 and 1200 g of a 1.2 g/ml liquid is exactly 1000 ml. Nothing here rounds to a scale:
// the caller rounds with toStored when it stores. (fromStockUnits drops 10 guard digits: see there.)
import { dec, Dec, isDecimalString, ONE } from "./decimal";
import { UnitError } from "./errors";
import {
  DIMENSION_OF_BASE,
  findGlobalUnit,
  globalUnitsOf,
  normaliseUnitName,
  type BaseUnit,
  type Dimension,
  type GlobalUnit,
} from "./global-units";

export type StockUnit = BaseUnit;

export interface PutUp {
  /** "hank", "set", "strand", "stick", "box" (or the stored code: "beef_set", "tubed_strand") */
  name: string;
  /** length of one put-up in metres, decimal string (a hank: "91.44") */
  metres: string;
}

export interface Pack {
  /** "box of 10 hanks", "25 lb pail", "1 kg bag" */
  name: string;
  /** decimal string, in `unit` */
  quantity: string;
  /** any unit this item resolves: a global unit, the put-up, or another pack */
  unit: string;
}

export interface ItemUnits {
  stockUnit: StockUnit;
  /** only with stockUnit "pc": one piece = one put-up */
  putUp?: PutUp | null;
  /** grams per millilitre; lets mass and volume convert (recipes given by volume) */
  densityGPerMl?: string | null;
  packs?: readonly Pack[] | null;
}

/** stock units per ONE of the typed unit = num / den */
interface Ratio {
  num: Dec;
  den: Dec;
}

const unitRatio = (num: Dec, den: Dec = ONE): Ratio => ({ num, den });

/** The names a person may type for the put-up: "hank"/"hanks"; "beef_set" also "beef set", "set", "sets". */
function putUpNames(putUp: PutUp): string[] {
  const full = normaliseUnitName(putUp.name);
  const last = full.split(" ").pop() ?? full;
  const names = new Set<string>();
  for (const n of [full, last]) {
    names.add(n);
    names.add(/(s|x|ch|sh)$/.test(n) ? `${n}es` : `${n}s`);
  }
  return [...names];
}

/** What the put-up is called on screen: the last word of its name ("beef_set" -> "set"). */
export function putUpLabel(putUp: PutUp): string {
  const full = normaliseUnitName(putUp.name);
  return full.split(" ").pop() ?? full;
}

function invalid(message: string): UnitError {
  return new UnitError("INVALID_ITEM", message);
}

/** A size from the item's description: a positive decimal, or INVALID_ITEM (never a division by 0). */
function positive(s: unknown, what: string): Dec {
  if (typeof s !== "string" || !isDecimalString(s) || !new Dec(s).gt(0)) throw invalid(`${what} must be a positive decimal, not "${String(s)}".`);
  return new Dec(s);
}

function describeStock(item: ItemUnits): string {
  return item.putUp ? `pc (one ${putUpLabel(item.putUp)})` : item.stockUnit;
}

function wrongDimension(unit: string, dim: Dimension, item: ItemUnits, why = ""): UnitError {
  const stockDim = DIMENSION_OF_BASE[item.stockUnit];
  const extra = item.putUp && dim !== "length" ? `; a ${putUpLabel(item.putUp)} converts only to pieces and lengths` : "";
  return new UnitError(
    "WRONG_DIMENSION",
    `"${unit}" is a ${dim} unit and this item is stocked in ${describeStock(item)} (${stockDim})${why}${extra}.`,
    { unit, dimension: dim, stockUnit: item.stockUnit },
  );
}

function unknownUnit(unit: string, item: ItemUnits): UnitError {
  return new UnitError("UNKNOWN_UNIT", `Unknown unit "${unit}" for an item stocked in ${describeStock(item)}.`, {
    unit,
    stockUnit: item.stockUnit,
  });
}

/** Ratio of a global unit to the item's stock unit, or a WRONG_DIMENSION error. */
function globalRatio(unit: string, g: GlobalUnit, item: ItemUnits): Ratio {
  const f = new Dec(g.factor);
  const stockDim = DIMENSION_OF_BASE[item.stockUnit];
  if (item.putUp) {
    if (g.dimension === "count") return unitRatio(ONE);
    if (g.dimension === "length") return unitRatio(f, positive(item.putUp.metres, "The length per put-up"));
    throw wrongDimension(unit, g.dimension, item);
  }
  if (g.dimension === stockDim) return unitRatio(f);
  const density = item.densityGPerMl != null ? positive(item.densityGPerMl, "The density") : null;
  if (stockDim === "mass" && g.dimension === "volume") {
    if (!density) throw wrongDimension(unit, g.dimension, item, ": volume converts to mass only through a density, and this item has none");
    return unitRatio(f.times(density));
  }
  if (stockDim === "volume" && g.dimension === "mass") {
    if (!density) throw wrongDimension(unit, g.dimension, item, ": mass converts to volume only through a density, and this item has none");
    return unitRatio(f, density);
  }
  throw wrongDimension(unit, g.dimension, item);
}

function findPack(item: ItemUnits, norm: string): Pack | undefined {
  return item.packs?.find((p) => normaliseUnitName(p.name) === norm);
}

function ratioFor(unit: string, item: ItemUnits, seen: readonly string[]): Ratio {
  if (!Object.hasOwn(DIMENSION_OF_BASE, item.stockUnit)) throw invalid(`"${String(item.stockUnit)}" is not a stock unit (g, m, ml or pc).`);
  if (item.putUp && item.stockUnit !== "pc") throw invalid(`An item with a put-up (${item.putUp.name}) is stocked in pieces (pc), not ${item.stockUnit}.`);
  if (typeof unit !== "string") throw unknownUnit(String(unit), item);
  const norm = normaliseUnitName(unit);
  if (item.putUp && putUpNames(item.putUp).includes(norm)) return unitRatio(ONE);
  const pack = findPack(item, norm);
  if (pack) {
    if (seen.includes(norm)) {
      throw new UnitError("PACK_CYCLE", `The pack "${pack.name}" is defined in terms of itself (${[...seen, norm].join(" -> ")}).`, {
        unit,
      });
    }
    const inner = ratioFor(pack.unit, item, [...seen, norm]);
    return unitRatio(positive(pack.quantity, `The size of the pack "${pack.name}"`).times(inner.num), inner.den);
  }
  const g = findGlobalUnit(unit);
  if (g) return globalRatio(unit, g, item);
  throw unknownUnit(unit, item);
}


/**
 * Throws INVALID_ITEM / PACK_CYCLE / UNKNOWN_UNIT / WRONG_DIMENSION when an item's unit
 * description cannot be used: a put-up on an item not stocked in pieces, names that shadow a unit
 * or each other, non-positive sizes, packs that do not resolve. Call it where items are saved.
 */
export function assertItemUnits(item: ItemUnits): void {
  if (!Object.hasOwn(DIMENSION_OF_BASE, item.stockUnit)) throw invalid(`"${String(item.stockUnit)}" is not a stock unit (g, m, ml or pc).`);
  const taken = new Set<string>();
  if (item.putUp) {
    if (item.stockUnit !== "pc") throw invalid(`An item with a put-up (${item.putUp.name}) is stocked in pieces (pc), not ${item.stockUnit}.`);
    if (!normaliseUnitName(item.putUp.name)) throw invalid("The put-up needs a name.");
    positive(item.putUp.metres, "The length per put-up");
    for (const n of putUpNames(item.putUp)) {
      if (findGlobalUnit(n)) throw invalid(`The put-up name "${item.putUp.name}" is also the unit "${n}".`);
      taken.add(n);
    }
  }
  if (item.densityGPerMl != null) positive(item.densityGPerMl, "The density");
  for (const p of item.packs ?? []) {
    const n = normaliseUnitName(p.name);
    if (!n) throw invalid("A pack needs a name.");
    if (findGlobalUnit(n)) throw invalid(`The pack name "${p.name}" is also a unit.`);
    if (taken.has(n)) throw invalid(`The pack name "${p.name}" is used twice (or is the put-up's name).`);
    taken.add(n);
    positive(p.quantity, `The size of the pack "${p.name}"`);
  }
  for (const p of item.packs ?? []) ratioFor(p.name, item, []);
}

/** Exact: `quantity` of `unit` in the item's stock unit (unrounded; round with toStored to store). */
export function toStockUnits(quantity: string | Dec, unit: string, item: ItemUnits): Dec {
  const r = ratioFor(unit, item, []);
  return dec(quantity).times(r.num).div(r.den);
}

/**
 * Significant digits fromStockUnits keeps. A length typed for a put-up item (10 m of a 91.44 m
 * hank) or a mass for a volume item has no finite decimal in the stock unit: toStockUnits keeps it
 * to 60 digits, and the way back drops the last 10 of them as guard digits, so every quantity of
 * up to 50 significant digits (NUMERIC(30,12) has 30) comes back exactly as typed. Far below any
 * stored or shown scale; not a rounding of the kind toStored does.
 */
export const FROM_STOCK_DIGITS = 50;

/** The reverse: a value in the item's stock unit expressed in `unit` (see FROM_STOCK_DIGITS). */
export function fromStockUnits(value: string | Dec, unit: string, item: ItemUnits): Dec {
  const r = ratioFor(unit, item, []);
  return dec(value).times(r.den).div(r.num).toSignificantDigits(FROM_STOCK_DIGITS, Dec.ROUND_HALF_EVEN);
}

/** `quantity` of `from` in `to`, for the same item, with a single division. */
export function convertForItem(quantity: string | Dec, from: string, to: string, item: ItemUnits): Dec {
  const a = ratioFor(from, item, []);
  const b = ratioFor(to, item, []);
  return dec(quantity).times(a.num).times(b.den).div(a.den.times(b.num));
}

/** Stock units in ONE of `unit` (the pack size, the put-up, a factor): exact. */
export function stockUnitsPer(unit: string, item: ItemUnits): Dec {
  return toStockUnits(ONE, unit, item);
}

/** Metres of a value held in the item's stock unit: put-ups x length per put-up, or metres as they are. */
export function metresOf(value: string | Dec, item: ItemUnits): Dec {
  return fromStockUnits(value, "m", item);
}

/** True when `unit` resolves for this item (for form validation without try/catch). */
export function isUnitFor(unit: string, item: ItemUnits): boolean {
  try {
    ratioFor(unit, item, []);
    return true;
  } catch (e) {
    if (e instanceof UnitError) return false;
    throw e;
  }
}

export interface UnitChoice {
  /** what to send and keep as the entered unit: a global unit code, the put-up's or a pack's name */
  unit: string;
  /** what the picker shows */
  label: string;
  kind: "put-up" | "pack" | "unit";
  dimension: Dimension;
}

/**
 * The units a person may pick for this item, most useful first: the put-up, the packs, then
 * every global unit of the stock dimension (metric first), then those reached through a density.
 * For a put-up item "pc" is accepted when typed but not offered beside the put-up it equals.
 */
export function unitsFor(item: ItemUnits): UnitChoice[] {
  assertItemUnits(item);
  const out: UnitChoice[] = [];
  const stockDim = DIMENSION_OF_BASE[item.stockUnit];
  if (item.putUp) out.push({ unit: item.putUp.name, label: putUpLabel(item.putUp), kind: "put-up", dimension: "count" });
  for (const p of item.packs ?? []) out.push({ unit: p.name, label: p.name, kind: "pack", dimension: stockDim });
  const dims: Dimension[] = item.putUp
    ? ["length"]
    : item.densityGPerMl && stockDim === "mass"
      ? ["mass", "volume"]
      : item.densityGPerMl && stockDim === "volume"
        ? ["volume", "mass"]
        : [stockDim];
  for (const d of dims) {
    for (const g of globalUnitsOf(d)) out.push({ unit: g.code, label: g.label, kind: "unit", dimension: g.dimension });
  }
  return out;
}

