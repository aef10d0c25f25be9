// The demo company's catalogue, suppliers and house recipes (Quillmoor Provisions). Every supplier,
// brand, label and lot code here is invented; cure strengths are what each invented label states.
// Tests never use this data. Pure data: no I/O.
import type { ItemDraft } from "../../lib/validation/items";

export type SupplierKey = "casings" | "spices" | "curing";

/** The invented suppliers and the weekday each delivers (0 = Sunday). */
export const SUPPLIERS: Record<SupplierKey, { name: string; weekday: number; lotPrefix: string }> = {
  curing: { name: "Haverby Curing Supplies", weekday: 1, lotPrefix: "HV" },
  casings: { name: "Fenwick & Rudd Casings", weekday: 2, lotPrefix: "FR" },
  spices: { name: "Marlowe Spice Traders", weekday: 4, lotPrefix: "MST" },
};

export interface DemoItem {
  draft: ItemDraft;
  supplier: SupplierKey;
  /** what the buyer orders: a pack name or the put-up ("hank") */
  orderUnit: string;
  /** price per orderUnit, GBP, as on the invented price list */
  orderCost: string;
  /** use, waste and count quantities are multiples of this step (stock units) */
  step: string;
  /** dated lots: best-before this many days after receipt */
  shelfDays?: number;
  /** casings without a put-up: kg of filling per piece, for planning use */
  kgPerPiece?: string;
}

const hank = (sku: string, name: string, kind: "natural_hog" | "natural_sheep", min: string, max: string, cost: string, capacity?: string): DemoItem => ({
  draft: {
    sku, name, category: "casing", unit: "pc", casingKind: kind, calibreMinMm: min, calibreMaxMm: max, putUp: "hank",
    trackLots: true, trackDates: false, storage: "salted",
    // outside the trade table the capacity is stated (the supplier's sheet); inside, the table's default applies
    ...(capacity ? { capacityKgPerPutUp: capacity } : {}),
    packs: [{ name: "box of 10 hanks", quantity: "10", unit: "hank" }],
  },
  supplier: "casings", orderUnit: "hank", orderCost: cost, step: "0.25",
});

const spice = (sku: string, name: string, form: string, cost: string, pack = "1 kg bag"): DemoItem => ({
  draft: {
    sku, name, category: "spice", unit: "g", form, trackLots: false, trackDates: false,
    packs: pack === "500 g tub" ? [{ name: "500 g tub", quantity: "500", unit: "g" }] : [{ name: "1 kg bag", quantity: "1", unit: "kg" }, { name: "5 kg sack", quantity: "5", unit: "kg" }],
  },
  supplier: "spices", orderUnit: pack, orderCost: cost, step: "1",
});

export const DEMO_ITEMS: readonly DemoItem[] = [
  // ---- casings: natural by the hank (91.44 m) or beef set; manufactured by stick, piece
  hank("HOG-28-30", "Hog casings 28/30 mm, salted", "natural_hog", "28", "30", "21.50", "36"), // below the table: stated 36 kg per hank
  hank("HOG-30-32", "Hog casings 30/32 mm, salted", "natural_hog", "30", "32", "23.00"), // table: 41 kg
  hank("HOG-32-35", "Hog casings 32/35 mm, salted", "natural_hog", "32", "35", "24.50"), // table: 45 kg
  hank("HOG-35-38", "Hog casings 35/38 mm, salted", "natural_hog", "35", "38", "26.00"), // table (34-36 band): 48 kg
  hank("SHP-20-22", "Sheep casings 20/22 mm, salted", "natural_sheep", "20", "22", "34.00"), // table: 21 kg
  hank("SHP-22-24", "Sheep casings 22/24 mm, salted", "natural_sheep", "22", "24", "36.50"), // table: 25 kg
  {
    draft: {
      sku: "BEEF-RND-40-43", name: "Beef rounds 40/43 mm, 30 m set, salted", category: "casing", unit: "pc", casingKind: "natural_beef",
      calibreMinMm: "40", calibreMaxMm: "43", putUp: "beef_set", putUpMetres: "30", trackLots: true, trackDates: false, storage: "salted",
      packs: [{ name: "bundle of 5 sets", quantity: "5", unit: "set" }],
    },
    supplier: "casings", orderUnit: "bundle of 5 sets", orderCost: "92.50", step: "0.25", // table: 36 kg per 30 m set
  },
  {
    draft: {
      sku: "BEEF-MID-50-55", name: "Beef middles 50/55 mm, 18 m set, salted", category: "casing", unit: "pc", casingKind: "natural_beef",
      calibreMinMm: "50", calibreMaxMm: "55", putUp: "beef_set", putUpMetres: "18", trackLots: true, trackDates: false, storage: "salted",
      packs: [{ name: "bundle of 5 sets", quantity: "5", unit: "set" }],
    },
    supplier: "casings", orderUnit: "bundle of 5 sets", orderCost: "118.00", step: "0.25", // table: 32 kg per 18 m set
  },
  {
    // shirred stick of 15 m; capacity stated (the invented maker's sheet): 4.8 kg per stick
    draft: {
      sku: "COL-21", name: "Collagen casing 21 mm, shirred stick 15 m", category: "casing", unit: "pc", casingKind: "collagen",
      calibreMinMm: "21", calibreMaxMm: "21", putUp: "stick", putUpMetres: "15", capacityKgPerPutUp: "4.8", trackLots: false, trackDates: false, storage: "dry",
      packs: [{ name: "case of 50 sticks", quantity: "50", unit: "stick" }],
    },
    supplier: "casings", orderUnit: "case of 50 sticks", orderCost: "96.00", step: "1",
  },
  {
    draft: {
      sku: "COL-26", name: "Collagen casing 26 mm, shirred stick 15 m", category: "casing", unit: "pc", casingKind: "collagen",
      calibreMinMm: "26", calibreMaxMm: "26", putUp: "stick", putUpMetres: "15", capacityKgPerPutUp: "7.4", trackLots: false, trackDates: false, storage: "dry",
      packs: [{ name: "case of 50 sticks", quantity: "50", unit: "stick" }],
    },
    supplier: "casings", orderUnit: "case of 50 sticks", orderCost: "112.00", step: "1",
  },
  {
    // pre-tied pieces of 50 cm: one pc is one piece (about 1.3 kg of filling each, the maker's figure)
    draft: {
      sku: "FIB-60", name: "Fibrous casing 60 mm, pre-tied 50 cm pieces", category: "casing", unit: "pc", casingKind: "fibrous",
      calibreMinMm: "60", calibreMaxMm: "60", trackLots: false, trackDates: false, storage: "dry",
      packs: [{ name: "box of 100 pieces", quantity: "100", unit: "pc" }],
    },
    supplier: "casings", orderUnit: "box of 100 pieces", orderCost: "48.00", step: "1", kgPerPiece: "1.3",
  },

  // ---- cures: the fractions are the invented labels' own; always lot- and date-tracked
  {
    draft: {
      sku: "CURE-1", name: "Brackwater Cure No. 1 (6.25 % sodium nitrite)", category: "cure", unit: "g", nitriteFraction: "0.0625", nitrateFraction: "0",
      packs: [{ name: "1 kg tub", quantity: "1", unit: "kg" }, { name: "5 kg pail", quantity: "5", unit: "kg" }],
    },
    supplier: "curing", orderUnit: "1 kg tub", orderCost: "6.40", step: "0.5", shelfDays: 730,
  },
  {
    draft: {
      sku: "CURE-2", name: "Brackwater Cure No. 2 (6.25 % nitrite + 4 % nitrate)", category: "cure", unit: "g", nitriteFraction: "0.0625", nitrateFraction: "0.04",
      packs: [{ name: "1 kg tub", quantity: "1", unit: "kg" }, { name: "5 kg pail", quantity: "5", unit: "kg" }],
    },
    supplier: "curing", orderUnit: "1 kg tub", orderCost: "7.90", step: "0.5", shelfDays: 730,
  },
  {
    draft: {
      sku: "CURE-EU06", name: "Saltcote nitrite curing salt (0.6 % sodium nitrite)", category: "cure", unit: "g", nitriteFraction: "0.006", nitrateFraction: "0",
      packs: [{ name: "5 kg bag", quantity: "5", unit: "kg" }, { name: "25 kg sack", quantity: "25", unit: "kg" }],
    },
    supplier: "curing", orderUnit: "5 kg bag", orderCost: "5.20", step: "0.5", shelfDays: 540,
  },

  // ---- spices (not lot-tracked: each receipt still keeps the supplier's lot code)
  spice("PEP-BLK-GR", "Black pepper, ground", "ground", "11.80"),
  spice("PEP-BLK-WH", "Black pepper, whole", "whole", "10.40"),
  spice("PEP-WHT", "White pepper, ground", "ground", "16.20"),
  spice("NUTMEG", "Nutmeg, ground", "ground", "11.50", "500 g tub"),
  spice("MACE", "Mace, ground", "ground", "19.00", "500 g tub"),
  spice("CORIANDER", "Coriander, ground", "ground", "6.30"),
  spice("FENNEL", "Fennel seed, whole", "whole", "7.10"),
  spice("PAPRIKA-SW", "Paprika, sweet", "ground", "8.20"),
  spice("PAPRIKA-SM", "Paprika, smoked", "ground", "10.60"),
  spice("GARLIC-PWD", "Garlic powder", "powder", "7.40"),
  spice("CARAWAY", "Caraway seed, whole", "whole", "8.00", "500 g tub"),
  spice("MARJORAM", "Marjoram, rubbed", "dried leaf", "14.10"),
  spice("SAGE", "Sage, rubbed", "dried leaf", "12.30"),
  spice("THYME", "Thyme, rubbed", "dried leaf", "12.00"),
  spice("CHILLI-FLK", "Chilli flakes", "flakes", "9.20"),
  spice("ALLSPICE", "Allspice, ground", "ground", "6.10", "500 g tub"),
  spice("JUNIPER", "Juniper berries, whole", "whole", "6.60", "500 g tub"),
  spice("GINGER", "Ginger, ground", "ground", "9.00"),
  spice("CARDAMOM", "Cardamom, green, ground", "ground", "24.50", "500 g tub"),
  spice("MUSTARD", "Mustard seed, yellow", "whole", "5.10"),

  // ---- other ingredients
  {
    draft: { sku: "SALT-FINE", name: "Salt, fine (PDV)", category: "ingredient", unit: "g", form: "fine crystal", trackLots: false, trackDates: false, packs: [{ name: "25 kg sack", quantity: "25", unit: "kg" }] },
    supplier: "spices", orderUnit: "25 kg sack", orderCost: "8.90", step: "1",
  },
  {
    draft: { sku: "SALT-SEA", name: "Sea salt, coarse", category: "ingredient", unit: "g", form: "coarse flake", trackLots: false, trackDates: false, packs: [{ name: "25 kg sack", quantity: "25", unit: "kg" }, { name: "5 kg tub", quantity: "5", unit: "kg" }] },
    supplier: "spices", orderUnit: "25 kg sack", orderCost: "21.75", step: "1",
  },
  {
    draft: { sku: "DEXTROSE", name: "Dextrose", category: "ingredient", unit: "g", form: "powder", trackLots: false, trackDates: false, packs: [{ name: "25 kg sack", quantity: "25", unit: "kg" }, { name: "5 kg bag", quantity: "5", unit: "kg" }] },
    supplier: "curing", orderUnit: "5 kg bag", orderCost: "7.60", step: "1",
  },
  {
    draft: { sku: "SUGAR", name: "Sugar, granulated", category: "ingredient", unit: "g", form: "granulated", trackLots: false, trackDates: false, packs: [{ name: "25 kg sack", quantity: "25", unit: "kg" }, { name: "5 kg bag", quantity: "5", unit: "kg" }] },
    supplier: "spices", orderUnit: "5 kg bag", orderCost: "5.40", step: "1",
  },
  {
    draft: { sku: "ASCORBATE", name: "Sodium ascorbate", category: "ingredient", unit: "g", form: "powder", trackLots: false, trackDates: false, packs: [{ name: "1 kg bag", quantity: "1", unit: "kg" }] },
    supplier: "curing", orderUnit: "1 kg bag", orderCost: "17.80", step: "1",
  },
  {
    // kept frozen (-18 C); one sachet sets 100 kg of meat
    draft: {
      sku: "CULTURE-SM4", name: "Kellan SM-4 starter culture (keep frozen)", category: "ingredient", unit: "g", form: "freeze-dried, keep frozen",
      trackLots: true, trackDates: true, packs: [{ name: "25 g sachet", quantity: "25", unit: "g" }, { name: "box of 10 sachets", quantity: "10", unit: "25 g sachet" }],
    },
    supplier: "curing", orderUnit: "25 g sachet", orderCost: "6.50", step: "0.5", shelfDays: 365,
  },
  {
    draft: {
      sku: "SMOKE-LIQ", name: "Ashgrove liquid smoke, hickory style", category: "ingredient", unit: "ml", form: "liquid", densityGPerMl: "1.04",
      trackLots: false, trackDates: false, packs: [{ name: "1 l bottle", quantity: "1", unit: "l" }, { name: "5 l jerrycan", quantity: "5", unit: "l" }],
    },
    supplier: "curing", orderUnit: "1 l bottle", orderCost: "13.90", step: "5",
  },
  {
    draft: {
      sku: "WINE-RED", name: "Red wine for cooking (12 %)", category: "ingredient", unit: "ml", form: "liquid",
      trackLots: false, trackDates: false, packs: [{ name: "750 ml bottle", quantity: "750", unit: "ml" }, { name: "case of 6 bottles", quantity: "6", unit: "750 ml bottle" }],
    },
    supplier: "spices", orderUnit: "case of 6 bottles", orderCost: "41.40", step: "5",
  },
];

/**
 * House recipes, per kg of meat block (trade-facts §4: recipes are written per kg of meat). Cure
 * rates: 2.5 g/kg of a 6.25 % cure is 156.25 ppm ingoing nitrite (trade-facts §1); bacon takes
 * 2 g/kg (125 ppm); the 0.6 % curing salt is used at the salting rate. Liquids in ml per kg.
 */
export interface Product {
  key: string;
  name: string;
  casing?: string;
  /** meat block per batch, kg: [min, max] (whole kg) */
  batchKg: [number, number];
  perKg: Record<string, string>;
}

export const PRODUCTS: Record<string, Product> = {
  cumberland: { key: "cumberland", name: "Cumberland-style coil", casing: "HOG-32-35", batchKg: [25, 45], perKg: { "SALT-FINE": "18", "PEP-BLK-GR": "4", MACE: "0.5", THYME: "0.5" } },
  breakfast: { key: "breakfast", name: "Breakfast links", casing: "HOG-28-30", batchKg: [20, 35], perKg: { "SALT-FINE": "18", "PEP-WHT": "3", SAGE: "1.5", NUTMEG: "0.5", GINGER: "0.5" } },
  chipolata: { key: "chipolata", name: "Chipolatas", casing: "SHP-20-22", batchKg: [10, 20], perKg: { "SALT-FINE": "17", "PEP-WHT": "2.5", NUTMEG: "0.4", SUGAR: "3" } },
  bratwurst: { key: "bratwurst", name: "Bratwurst", casing: "COL-26", batchKg: [20, 35], perKg: { "SALT-FINE": "17", "PEP-WHT": "2.5", MACE: "0.5", CARAWAY: "1", MARJORAM: "1.5" } },
  snack: { key: "snack", name: "Smoked snack sticks", casing: "COL-21", batchKg: [12, 25], perKg: { "CURE-1": "2.5", "SALT-FINE": "16", "CHILLI-FLK": "3", "GARLIC-PWD": "2", MUSTARD: "1.5" } },
  mortadella: { key: "mortadella", name: "Mortadella", casing: "FIB-60", batchKg: [25, 40], perKg: { "CURE-1": "2.5", "SALT-FINE": "16", CORIANDER: "1", CARDAMOM: "0.2", ASCORBATE: "0.5" } },
  kielbasa: { key: "kielbasa", name: "Smoked kielbasa", casing: "BEEF-RND-40-43", batchKg: [25, 40], perKg: { "CURE-1": "2.5", "SALT-FINE": "16", MARJORAM: "2", "GARLIC-PWD": "3", "SMOKE-LIQ": "1.5" } },
  finocchiona: {
    key: "finocchiona", name: "Fennel salami", casing: "BEEF-MID-50-55", batchKg: [20, 35],
    perKg: { "CURE-2": "2.5", "SALT-FINE": "25", FENNEL: "4", "PEP-BLK-WH": "3", "CULTURE-SM4": "0.25", "WINE-RED": "20", DEXTROSE: "3" },
  },
  chorizo: {
    key: "chorizo", name: "Dry chorizo", casing: "HOG-35-38", batchKg: [15, 30],
    perKg: { "CURE-EU06": "26", "PAPRIKA-SM": "18", "PAPRIKA-SW": "8", "GARLIC-PWD": "4", "CHILLI-FLK": "1.5", DEXTROSE: "3", "CULTURE-SM4": "0.25" },
  },
  chorizoFresco: { key: "chorizoFresco", name: "Cooking chorizo", casing: "HOG-32-35", batchKg: [8, 15], perKg: { "CURE-EU06": "22", "PAPRIKA-SM": "15", "PAPRIKA-SW": "6", "GARLIC-PWD": "3", "CHILLI-FLK": "1" } },
  frankfurter: {
    key: "frankfurter", name: "Frankfurters", casing: "SHP-22-24", batchKg: [20, 35],
    perKg: { "CURE-1": "2.5", "SALT-FINE": "15", CORIANDER: "1.5", "PAPRIKA-SW": "2", ASCORBATE: "0.5", "SMOKE-LIQ": "2" },
  },
  game: { key: "game", name: "Venison and juniper sausage", casing: "HOG-30-32", batchKg: [12, 22], perKg: { "SALT-FINE": "17", JUNIPER: "2", ALLSPICE: "1", THYME: "1", "PEP-BLK-GR": "3", "WINE-RED": "15" } },
  bacon: { key: "bacon", name: "Dry-cured bacon (per kg of belly)", batchKg: [15, 30], perKg: { "SALT-SEA": "25", SUGAR: "10", "CURE-1": "2", "PEP-BLK-WH": "2", JUNIPER: "1" } },
};

/** Filling = meat block plus salt, spices and added water: planning factor for casing use. */
export const FILLING_PER_KG_MEAT = "1.08";

export type KitchenCode = "YARD" | "LANE" | "ROPE";
export const KITCHEN_CODES: readonly KitchenCode[] = ["YARD", "LANE", "ROPE"];

export interface KitchenPlan {
  /** batches per week of each product */
  products: Record<string, string>;
  /** suppliers delivering straight to this kitchen; everything else comes from YARD by transfer */
  suppliers: readonly SupplierKey[];
  /** who posts use, waste and counts ("lead" only where the lead is assigned) */
  staff: "lead" | "manager";
  /** items without stored levels (the rest have a par level and a reorder point) */
  noLevels: readonly string[];
  /** levels raised this week for a large order: these items end below their new reorder point */
  raised: readonly string[];
}

export const KITCHEN_PLANS: Record<KitchenCode, KitchenPlan> = {
  YARD: {
    products: { cumberland: "0.6", breakfast: "0.4", chipolata: "0.3", bratwurst: "0.3", snack: "0.3", mortadella: "0.2", kielbasa: "0.3", finocchiona: "0.35", chorizo: "0.25" },
    suppliers: ["curing", "casings", "spices"],
    staff: "lead",
    noLevels: ["CARDAMOM", "WINE-RED"],
    raised: ["MACE", "PEP-BLK-WH"],
  },
  LANE: {
    products: { frankfurter: "0.5", kielbasa: "0.3", game: "0.3", bacon: "0.5" },
    suppliers: ["curing", "casings", "spices"],
    staff: "manager",
    noLevels: ["ALLSPICE"],
    raised: ["CORIANDER"],
  },
  ROPE: {
    products: { cumberland: "0.4", chipolata: "0.4", chorizoFresco: "0.3" },
    suppliers: ["spices"],
    staff: "manager",
    noLevels: [],
    raised: [],
  },
};

export const WASTE_REASONS: Record<string, readonly string[]> = {
  casing: ["Torn while flushing", "Holes found while stuffing", "Tangled hank, could not be run"],
  cure: ["Spilled on the bench; discarded under the cure handling rule", "Tub lid cracked; contents discarded"],
  spice: ["Bag split on the shelf", "Damp got in; clumped", "Dropped while weighing"],
  ingredient: ["Spilled while weighing", "Container damaged", "Left open; discarded"],
};
