// Default stuffing capacity of a natural casing put-up (kg of filling: meat plus water, salt and
// spices), from the natural casing trade association tables as reproduced in trade-facts §4.
// Pure: no I/O.
//
// Rules (trade-facts §4):
// - The band is chosen by the calibre's LOWER bound, and bands are half-open [from, to): a 32/35 mm
//   hog casing falls in the 32-34 band.
// - The default is the LOWER bound of the band's capacity range: it never under-orders casing.
// - Outside the table there is no default: the person enters the capacity (returns undefined).
// - Hanks: the tables' basis is the "91 m" hank, read as the nominal 91.44 m hank; a hank within
//   the trade's tolerance (88 to 92 m) uses the table. Beef: rounds are tabled per 30 m set,
//   middles per 18 m; a beef set of 30 m reads the rounds table, of 18 m the middles table, and
//   any other length (9 m sets, say) has no default.
import { dec } from "../units";
import type { CasingKind, PutUpKind } from "./put-ups";

export interface CapacityBand {
  /** calibre in mm, inclusive */
  fromMm: string;
  /** calibre in mm, exclusive */
  toMm: string;
  /** the band's capacity range in kg per put-up; the default is `kg` (the lower bound) */
  kg: string;
  kgHigh: string;
}

export interface CapacityTable {
  id: "hog_hank" | "sheep_hank" | "beef_rounds_30m" | "beef_middles_18m";
  casingKind: CasingKind;
  putUp: PutUpKind;
  /** what one put-up is in this table */
  basis: string;
  source: string;
  bands: readonly CapacityBand[];
}

const band = (fromMm: string, toMm: string, kg: string, kgHigh: string): CapacityBand => ({ fromMm, toMm, kg, kgHigh });

export const CAPACITY_TABLES: readonly CapacityTable[] = [
  {
    id: "hog_hank", casingKind: "natural_hog", putUp: "hank", basis: "one hank (91.44 m)",
    source: "trade table as reproduced by an exporter, trade-facts §4 [practice]",
    bands: [band("30", "32", "41", "45"), band("32", "34", "45", "48"), band("34", "36", "48", "52"), band("36", "38", "52", "57")],
  },
  {
    id: "sheep_hank", casingKind: "natural_sheep", putUp: "hank", basis: "one hank (91.44 m)",
    source: "trade table as reproduced by an exporter, trade-facts §4 [practice]",
    bands: [band("20", "22", "21", "23"), band("22", "24", "25", "27")],
  },
  {
    id: "beef_rounds_30m", casingKind: "natural_beef", putUp: "beef_set", basis: "one 30 m set of beef rounds",
    source: "natural casing trade association tables, trade-facts §4 [sec]",
    bands: [band("35", "38", "30", "30"), band("38", "40", "33", "34"), band("40", "43", "36", "37"), band("43", "46", "39", "40")],
  },
  {
    id: "beef_middles_18m", casingKind: "natural_beef", putUp: "beef_set", basis: "one 18 m set of beef middles",
    source: "natural casing trade association tables, trade-facts §4 [sec]",
    bands: [band("45", "50", "29", "32"), band("50", "55", "32", "36"), band("55", "60", "36", "41")],
  },
];

/** The trade's tolerance of a hank's length, metres (trade-facts §4: about 88-92 m). */
export const HANK_TOLERANCE_METRES = { min: "88", max: "92" } as const;

export interface CasingPutUp {
  casingKind: CasingKind;
  putUp: PutUpKind | null | undefined;
  /** length of one put-up; for a hank, absent means the nominal 91.44 m */
  putUpMetres?: string | null;
}

/** The table that applies to this casing and put-up, if any. */
export function capacityTableFor(c: CasingPutUp): CapacityTable | undefined {
  if (!c.putUp) return undefined;
  if (c.putUp === "hank") {
    if (c.putUpMetres != null) {
      const m = dec(c.putUpMetres);
      if (m.lt(HANK_TOLERANCE_METRES.min) || m.gt(HANK_TOLERANCE_METRES.max)) return undefined;
    }
    return CAPACITY_TABLES.find((t) => t.putUp === "hank" && t.casingKind === c.casingKind);
  }
  if (c.putUp === "beef_set" && c.casingKind === "natural_beef" && c.putUpMetres != null) {
    const m = dec(c.putUpMetres);
    if (m.eq(30)) return CAPACITY_TABLES.find((t) => t.id === "beef_rounds_30m");
    if (m.eq(18)) return CAPACITY_TABLES.find((t) => t.id === "beef_middles_18m");
  }
  return undefined;
}

/** The band a calibre falls in, chosen by its lower bound in half-open bands. */
export function capacityBand(table: CapacityTable, calibreMinMm: string): CapacityBand | undefined {
  const lower = dec(calibreMinMm);
  return table.bands.find((b) => lower.gte(b.fromMm) && lower.lt(b.toMm));
}

/**
 * The planning default in kg of filling per put-up (the lower bound of the band's capacity), as
 * a decimal string; undefined outside the table, where the person must enter it.
 */
export function defaultCapacityKg(c: CasingPutUp & { calibreMinMm: string }): string | undefined {
  const table = capacityTableFor(c);
  return table ? capacityBand(table, c.calibreMinMm)?.kg : undefined;
}
