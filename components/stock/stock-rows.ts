// The stock grid's rows and words, as pure functions (client-safe, no React, no I/O), so the grid,
// the printable count sheet and the unit tests share them.
//
// ag-grid Community has no row grouping, tree data or master/detail, so the grid gets one flat
// list: a header row per category, the category's items under it, and a tracked item's lots under
// the item. Each row carries its group (and a lot its parent item); the grid hides rows of a
// collapsed group or item with an external filter and keeps the hierarchy through sorting.
import type { DateKind, ItemCategory } from "@/db/types";
import type { StockLot, StockRow } from "@/lib/data/stock";
import {
  dec,
  DIMENSION_OF_BASE,
  findGlobalUnit,
  formatMetresOf,
  formatQuantity,
  plain,
  stockUnitsPer,
  toStockUnits,
  toStoredQuantity,
  unitsFor,
  UnitError,
  type ItemUnits,
  type UnitSystem,
} from "@/lib/units";

export const GROUPS: readonly { category: ItemCategory; label: string }[] = [
  { category: "casing", label: "Casings" },
  { category: "cure", label: "Cures" },
  { category: "spice", label: "Spices & seasonings" },
  { category: "ingredient", label: "Other ingredients" },
];

export const groupLabel = (category: ItemCategory) => GROUPS.find((g) => g.category === category)?.label ?? category;

interface RowBase {
  /** Unique and stable across refetches: the grid's row id. */
  id: string;
  group: ItemCategory;
  /** What the quick search matches. */
  search: string;
}

export interface GroupRow extends RowBase {
  kind: "group";
  label: string;
  itemCount: number;
}

export interface ItemRow extends RowBase {
  kind: "item";
  item: StockRow;
  /** The label people read: a casing by calibre ("32/35 mm hog, hank"), else the item's name. */
  label: string;
  /** Editable in the grid; plain decimal strings in the stock unit. */
  parLevel: string | null;
  reorderPoint: string | null;
  /** The count typed for an item that is not tracked by lot. */
  counted: string | null;
}

export interface LotRow extends RowBase {
  kind: "lot";
  parentId: string;
  item: StockRow;
  lot: StockLot;
  counted: string | null;
}

export type GridRow = GroupRow | ItemRow | LotRow;

export const groupRowId = (category: ItemCategory) => `group:${category}`;
export const itemRowId = (itemId: string) => `item:${itemId}`;
export const lotRowId = (itemId: string, lotId: string) => `lot:${itemId}:${lotId}`;

// ---------------------------------------------------------------------------------------------
// Casings

const KIND_WORDS: Record<string, string> = {
  natural_hog: "hog",
  natural_sheep: "sheep",
  natural_beef: "beef",
  collagen: "collagen",
  fibrous: "fibrous",
  cellulose: "cellulose",
};

const PUT_UP_WORDS: Record<string, { one: string; many: string }> = {
  hank: { one: "hank", many: "hanks" },
  beef_set: { one: "set", many: "sets" },
  tubed_strand: { one: "strand", many: "strands" },
  stick: { one: "stick", many: "sticks" },
  box: { one: "box", many: "boxes" },
};

/** "32/35 mm hog, hank" (or "by length" for casings stocked in metres). */
export function casingLabel(c: NonNullable<StockRow["casing"]>): string {
  const calibre = c.calibreMinMm === c.calibreMaxMm ? `${c.calibreMinMm} mm` : `${c.calibreMinMm}/${c.calibreMaxMm} mm`;
  const kind = KIND_WORDS[c.kind] ?? c.kind.replace(/_/g, " ");
  const putUp = c.putUp ? (PUT_UP_WORDS[c.putUp]?.one ?? c.putUp.replace(/_/g, " ")) : "by length";
  return `${calibre} ${kind}, ${putUp}`;
}

/** Casings by calibre (then kind, then name); everything else by name. Exact decimal compare. */
export function compareItems(a: StockRow, b: StockRow): number {
  if (a.casing && b.casing) {
    const byMin = dec(a.casing.calibreMinMm).comparedTo(dec(b.casing.calibreMinMm));
    if (byMin) return byMin;
    const byMax = dec(a.casing.calibreMaxMm).comparedTo(dec(b.casing.calibreMaxMm));
    if (byMax) return byMax;
    const byKind = a.casing.kind.localeCompare(b.casing.kind);
    if (byKind) return byKind;
  }
  return a.name.localeCompare(b.name) || a.sku.localeCompare(b.sku);
}

// ---------------------------------------------------------------------------------------------
// Quantities

/** What lib/units needs to know about an item to show its quantities. */
export function itemUnitsOf(row: Pick<StockRow, "unit" | "casing">): ItemUnits {
  const c = row.casing;
  return {
    stockUnit: row.unit,
    putUp: row.unit === "pc" && c?.putUp && c.metresPerPutUp ? { name: c.putUp, metres: c.metresPerPutUp } : null,
  };
}

const isOne = (value: string) => value === "1";

/** The word after a number of the item's stock unit: "g", "m", "ml", "pc", "hank"/"hanks". */
export function stockUnitWord(row: Pick<StockRow, "unit" | "casing">, value?: string): string {
  const putUp = itemUnitsOf(row).putUp;
  if (putUp) {
    const words = PUT_UP_WORDS[putUp.name];
    if (words) return value !== undefined && !isOne(value) ? words.many : words.one;
    return putUp.name.replace(/_/g, " ");
  }
  return row.unit;
}

/**
 * A stock quantity for people, in their unit system (rounded for display only, half-even, by
 * lib/units): "1.25 kg", "3 hanks". Put-up items also give their length ("274.32 m").
 */
export function quantityText(value: string, row: Pick<StockRow, "unit" | "casing">, system: UnitSystem): { main: string; length: string | null } {
  const units = itemUnitsOf(row);
  const f = formatQuantity(value, units, system);
  const main = units.putUp ? `${f.value} ${stockUnitWord(row, f.value)}` : `${f.value} ${f.label}`;
  if (!units.putUp) return { main, length: null };
  const m = formatMetresOf(value, units, system);
  return { main, length: `${m.value} ${m.label}` };
}

/** A typed quantity exactly as stored (stock unit), with its word: "480 g", "2.5 hanks". */
export const stockUnitText = (value: string, row: Pick<StockRow, "unit" | "casing">) => `${value} ${stockUnitWord(row, value)}`;

// ---------------------------------------------------------------------------------------------
// Typed quantities

const PLAIN = /^\d{1,18}(\.\d{1,12})?$/;

export type ParsedQuantity = { ok: true; value: string | null } | { ok: false; message: string };

/** The number part of a typed quantity: "12,5" -> "12.5", ".5" -> "0.5"; null when it is not one. */
function plainNumber(raw: string): string | null {
  let s = raw;
  if (/^\d+,\d+$/.test(s)) s = s.replace(",", ".");
  if (/^[.,]\d+$/.test(s)) s = `0.${s.slice(1)}`;
  return PLAIN.test(s) ? dec(s).toFixed() : null;
}

const NOT_A_NUMBER = "Enter a plain number, 0 or more, e.g. 12.5 (at most 12 decimals).";
const NEGATIVE = "A quantity cannot be negative: enter 0 or more.";

/**
 * A quantity typed into the grid: a plain decimal, zero or more ("12.5"; a decimal comma "12,5" is
 * read as a point); empty clears. Returns the canonical string ("012.50" -> "12.5") the API takes.
 * No unit: the filters compare in the stock unit (a unit is read by parseQuantityEntry).
 */
export function parseQuantityInput(raw: unknown): ParsedQuantity {
  if (raw === null || raw === undefined) return { ok: true, value: null };
  const s = String(raw).trim();
  if (s === "") return { ok: true, value: null };
  const value = plainNumber(s);
  if (value === null) return { ok: false, message: s.startsWith("-") ? NEGATIVE : NOT_A_NUMBER };
  return { ok: true, value };
}

/** A quantity typed for one item, with the unit it was typed in. */
export interface QuantityEntry {
  /** the number as typed, canonical ("2.5") */
  quantity: string;
  /** the unit as typed, for the API ("lb", "fl oz", "ft"); null: the item's stock unit */
  unit: string | null;
  /** exactly, in the item's stock unit: lib/units, unrounded (60 significant digits at most) */
  inStock: string;
}

export type ParsedEntry =
  | { ok: true; entry: QuantityEntry | null }
  | { ok: false; message: string; field: "quantity" | "unit" };

type EntryItem = Pick<StockRow, "unit" | "casing">;

// a number, then (with or without a blank) a unit made of letters, blanks, dots and underscores
const ENTRY = /^(\d*[.,]?\d+|\d+[.,]?)\s*([A-Za-z][A-Za-z ._]*)?$/;

const DIMENSION_WORDS: Record<string, string> = { mass: "weight", length: "length", volume: "volume", count: "count" };

/** The units this item can be typed in, for messages: "g, mg, kg, oz or lb", "hanks, m, ft, yd…". */
export function acceptedUnitsText(row: EntryItem): string {
  let labels: string[];
  try {
    labels = unitsFor(itemUnitsOf(row)).map((c) => (c.kind === "put-up" ? stockUnitWord(row, "2") : c.label));
  } catch {
    labels = [stockUnitWord(row, "2")];
  }
  const stock = stockUnitWord(row, "2");
  const ordered = [stock, ...labels.filter((l) => l !== stock)];
  return ordered.length === 1 ? ordered[0]! : `${ordered.slice(0, -1).join(", ")} or ${ordered.at(-1)}`;
}

/** What the item is counted in, in words: "g (weight)", "hanks". */
function countedInText(row: EntryItem): string {
  const units = itemUnitsOf(row);
  return units.putUp ? `${stockUnitWord(row, "2")} (or their length)` : `${row.unit} (${DIMENSION_WORDS[DIMENSION_OF_BASE[row.unit]]})`;
}

/** An example of a typed quantity with a unit, for this item. */
export function entryExample(row: EntryItem): string {
  if (itemUnitsOf(row).putUp) return `1.5 ${stockUnitWord(row, "1.5")} or 12 ft`;
  return { g: "2.5 lb", m: "12 ft", ml: "250 ml", pc: "6 pc" }[row.unit];
}

/**
 * A quantity typed into the grid for one item: a plain number in its stock unit ("480"), or a
 * number and a unit of the same dimension ("2.5 lb", "300 g", "12 ft", "1.5 hanks"), converted
 * exactly to the stock unit by lib/units (mass <-> volume never: the grid knows no densities).
 * Empty clears. Negative numbers, words, exponents and other dimensions are refused with a message
 * that names the units the item takes.
 */
export function parseQuantityEntry(raw: unknown, row: EntryItem): ParsedEntry {
  if (raw === null || raw === undefined) return { ok: true, entry: null };
  const s = String(raw).trim();
  if (s === "") return { ok: true, entry: null };
  const m = ENTRY.exec(s);
  const quantity = m ? plainNumber(m[1]!.replace(/[.,]$/, "")) : null;
  if (!m || quantity === null) {
    if (s.startsWith("-")) return { ok: false, field: "quantity", message: NEGATIVE };
    return {
      ok: false,
      field: "quantity",
      message: `Enter a plain number, 0 or more, in ${stockUnitWord(row, "2")} (e.g. 12.5), or a number and a unit (e.g. ${entryExample(row)}); at most 12 decimals.`,
    };
  }
  const typedUnit = m[2]?.trim().replace(/\.$/, "") ?? "";
  if (!typedUnit) return { ok: true, entry: { quantity, unit: null, inStock: quantity } };
  const units = itemUnitsOf(row);
  try {
    const inStock = toStockUnits(quantity, typedUnit, units);
    // typed in the stock unit under any of its names ("g", "grams", "hanks", "pc"): kept as a plain number
    const isStockUnit = stockUnitsPer(typedUnit, units).eq(1);
    return { ok: true, entry: { quantity, unit: isStockUnit ? null : typedUnit, inStock: isStockUnit ? quantity : inStock.toFixed() } };
  } catch (e) {
    if (!(e instanceof UnitError)) throw e;
    const g = findGlobalUnit(typedUnit);
    const message = e.code === "WRONG_DIMENSION" && g
      ? `"${typedUnit}" is a ${DIMENSION_WORDS[g.dimension]} unit, and this item is counted in ${countedInText(row)}: use ${acceptedUnitsText(row)}.`
      : `"${typedUnit}" is not a unit for this item: use ${acceptedUnitsText(row)}.`;
    return { ok: false, field: "unit", message };
  }
}

/** The text a typed entry is kept and edited as: "480" (stock unit) or "2.5 lb". */
export const entryText = (e: QuantityEntry): string => (e.unit === null ? e.quantity : `${e.quantity} ${e.unit}`);

/**
 * An entry in the stock unit as the database keeps it: rounded half-even to NUMERIC(30,12) by
 * lib/units (toStoredQuantity), exactly what the server stores for the same typed value.
 */
export const entryAsStored = (e: QuantityEntry): string => plain(toStoredQuantity(e.inStock));

// ---------------------------------------------------------------------------------------------
// Dates and status

/** Whole days from `today` to `date` (both yyyy-mm-dd, calendar dates; negative once past). */
export function daysLeft(date: string, today: string): number {
  const at = (d: string) => Date.UTC(Number(d.slice(0, 4)), Number(d.slice(5, 7)) - 1, Number(d.slice(8, 10)));
  return Math.round((at(date) - at(today)) / 86_400_000);
}

export type Tone = "herb" | "amber" | "ember" | "neutral";

/**
 * The expiry band of a dated lot: herb above 30 days ("in date"), amber from 30 days down to the
 * date itself ("12 days", "today": a lot is still in date on its date), ember once past ("expired").
 */
export function expiryBand(days: number): { tone: Tone; word: string } {
  if (days < 0) return { tone: "ember", word: "expired" };
  if (days > 30) return { tone: "herb", word: "in date" };
  if (days === 0) return { tone: "amber", word: "today" };
  return { tone: "amber", word: days === 1 ? "1 day" : `${days} days` };
}

export const DATE_KIND_WORDS: Record<DateKind, string> = { use_by: "use by", best_before: "best before" };

const dayFormat = new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "short", year: "numeric", timeZone: "UTC" });
/** A calendar date (yyyy-mm-dd) for people: "20 Jun 2027". */
export const formatDay = (d: string) => dayFormat.format(new Date(Date.UTC(Number(d.slice(0, 4)), Number(d.slice(5, 7)) - 1, Number(d.slice(8, 10)))));

/** The earliest dated lot of an item (the one FEFO takes first). */
export function firstDatedLot(item: StockRow): StockLot | null {
  let first: StockLot | null = null;
  for (const lot of item.lots) if (lot.date && (!first || lot.date < first.date!)) first = lot;
  return first;
}

/**
 * Stock against the reorder point, on what is available (on hand less reserved): "out" when
 * nothing is available, "to reorder" at or under it (short: it sits under the reorder point in a
 * narrow column), else nothing to flag.
 */
export function stockStatus(available: string, reorderPoint: string | null): { tone: Tone; word: string } | null {
  const a = dec(available);
  if (a.lte(0)) return { tone: "ember", word: "out" };
  if (reorderPoint !== null && a.lte(dec(reorderPoint))) return { tone: "amber", word: "to reorder" };
  return null;
}

/** Exact comparison of a decimal cell value with a typed filter value (null when either is not a number). */
export function compareDecimal(cell: string | null | undefined, typed: string): number | null {
  const t = parseQuantityInput(typed);
  if (!t.ok || t.value === null || cell === null || cell === undefined) return null;
  return dec(cell).comparedTo(dec(t.value));
}

// ---------------------------------------------------------------------------------------------
// Rows

export interface PendingCounts {
  get(rowId: string): string | undefined;
}

/** One flat list: each category's header, its items in order, and each tracked item's lots. */
export function buildRows(items: readonly StockRow[], pending?: PendingCounts): GridRow[] {
  const out: GridRow[] = [];
  for (const g of GROUPS) {
    const members = items.filter((i) => i.category === g.category).sort(compareItems);
    if (!members.length) continue;
    const header: GroupRow = { kind: "group", id: groupRowId(g.category), group: g.category, label: g.label, itemCount: members.length, search: "" };
    out.push(header);
    const texts: string[] = [g.label];
    for (const item of members) {
      const label = item.casing ? casingLabel(item.casing) : item.name;
      const own = [item.sku, item.name, label, g.label, item.cure ? "cure curing salt" : ""].join(" ");
      const lotText = item.lots.map((l) => l.code).join(" ");
      const id = itemRowId(item.itemId);
      out.push({
        kind: "item", id, group: g.category, item, label, search: `${own} ${lotText}`,
        parLevel: item.parLevel, reorderPoint: item.reorderPoint, counted: pending?.get(id) ?? null,
      });
      texts.push(own, lotText);
      if (item.trackLots) {
        for (const lot of item.lots) {
          const lid = lotRowId(item.itemId, lot.lotId);
          out.push({
            kind: "lot", id: lid, parentId: id, group: g.category, item, lot,
            search: `${own} ${lot.code} ${lot.date ?? ""}`, counted: pending?.get(lid) ?? null,
          });
        }
      }
    }
    header.search = texts.join(" ");
  }
  return out;
}

/**
 * Puts sorted rows back into their hierarchy: groups in their fixed order, items in the sorted
 * order within their group, each item's lots (in sorted order) right under it.
 */
export function restoreHierarchy<T>(rows: readonly T[], dataOf: (row: T) => GridRow): T[] {
  const groups: T[] = [];
  const items = new Map<ItemCategory, T[]>();
  const lots = new Map<string, T[]>();
  for (const r of rows) {
    const d = dataOf(r);
    if (d.kind === "group") groups.push(r);
    else if (d.kind === "item") (items.get(d.group) ?? items.set(d.group, []).get(d.group)!).push(r);
    else (lots.get(d.parentId) ?? lots.set(d.parentId, []).get(d.parentId)!).push(r);
  }
  const order = (c: ItemCategory) => GROUPS.findIndex((g) => g.category === c);
  groups.sort((a, b) => order(dataOf(a).group) - order(dataOf(b).group));
  const out: T[] = [];
  const placed = new Set<T>();
  const place = (r: T) => {
    out.push(r);
    placed.add(r);
  };
  for (const g of groups) {
    place(g);
    for (const item of items.get(dataOf(g).group) ?? []) {
      place(item);
      for (const lot of lots.get(dataOf(item).id) ?? []) place(lot);
    }
  }
  // anything whose header or parent is not among the rows keeps its place at the end
  for (const r of rows) if (!placed.has(r)) out.push(r);
  return out;
}

