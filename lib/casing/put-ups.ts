// What a casing is and how it is put up: pure domain facts, no I/O. Sources: trade-facts §4.
import { CASING_KINDS, CASING_STORAGE, PUT_UPS } from "../../db/types";

export type CasingKind = (typeof CASING_KINDS)[number];
export type PutUpKind = (typeof PUT_UPS)[number];
export type CasingStorage = (typeof CASING_STORAGE)[number];

/** A hank of natural hog or sheep casing: 100 yd = 91.44 m (trade association definition; yd = 0.9144 m exactly). */
export const HANK_METRES = "91.44";

export const NATURAL_CASING_KINDS: readonly CasingKind[] = ["natural_hog", "natural_sheep", "natural_beef"];

export const isNaturalCasing = (kind: CasingKind): boolean => NATURAL_CASING_KINDS.includes(kind);

/** Natural casings are kept salted (or in brine); manufactured casings dry. [practice] */
export const defaultStorage = (kind: CasingKind): CasingStorage => (isNaturalCasing(kind) ? "salted" : "dry");

/**
 * The casing kinds a put-up is defined for. A hank is the hog/sheep measure and a set the beef one
 * (by definition); strands, sticks and boxes are left open.
 */
export const PUT_UP_KINDS: Readonly<Record<PutUpKind, readonly CasingKind[] | null>> = {
  hank: ["natural_hog", "natural_sheep"],
  beef_set: ["natural_beef"],
  tubed_strand: null,
  stick: null,
  box: null,
};

export const putUpFits = (putUp: PutUpKind, kind: CasingKind): boolean => PUT_UP_KINDS[putUp]?.includes(kind) ?? true;

export const CASING_KIND_LABELS: Readonly<Record<CasingKind, string>> = {
  natural_hog: "Natural hog",
  natural_sheep: "Natural sheep",
  natural_beef: "Natural beef",
  collagen: "Collagen",
  fibrous: "Fibrous",
  cellulose: "Cellulose",
};

export const PUT_UP_LABELS: Readonly<Record<PutUpKind, string>> = {
  hank: "Hank",
  beef_set: "Beef set",
  tubed_strand: "Tubed strand",
  stick: "Shirred stick",
  box: "Box",
};

export const STORAGE_LABELS: Readonly<Record<CasingStorage, string>> = { salted: "Salted", brine: "In brine", dry: "Dry" };
