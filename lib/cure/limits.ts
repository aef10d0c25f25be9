// The regulatory figures the cure calculator checks against, each with where it was read. Pure
// data, no I/O, client-safe.
//
// How the figures were read (2026-12-02, with the project's search tool; see DEVELOPERS.md "Cure
// calculator"):
// - United States, 9 CFR 424.21(c) (curing agents rows of the chart) and 9 CFR 424.22(b) (bacon):
//   the eCFR text as quoted verbatim in public research notes that retrieved it from ecfr.gov and
//   law.cornell.edu (2026-07/08); the eCFR page itself could not be opened through the search tool.
//   The quotes agree with each other and with trade-facts §2. FSIS's final rule "Removal of Pumped
//   Bacon Sampling Regulations" (90 FR 27973, 1 July 2025, Docket FSIS-2025-0017, effective 1 July
//   2025) amended 424.22(b)(1) by removing FSIS's nitrosamine sampling of pumped bacon; the levels
//   quoted after it (120 / 100 / 40-80 ppm) are the ones encoded here.
// - European Union, Regulation (EC) 1333/2008 Annex II as amended by Regulation (EU) 2023/2108:
//   the annex text reachable through the search tool (eurlexa.com copy of 32023R2108) showed only
//   its first amendments (Part D/E renaming of categories 08.3.4 and 08.3.4.3, the cheese entries
//   of 01.7.2). The meat entries for E 249-250 and E 251-252 could NOT be read there, so every EU
//   figure below comes from a secondary source, is marked unverified and is OFF by default
//   (trade-facts §2). No EU nitrate figure was found at all, so none is encoded.
//   Looked again on 2026-12-02 (third session): the stored copies (eur-lex EN/DE/SV/EL/SL, eurlexa,
//   a Czech reprint) still end before category 08.3; a public code repository quotes the 08.3.2
//   row ("E 249-250 Nitrites 80 ... except sterilised meat products (Fo > 3,00) Period of
//   application: from 9 October 2025"), which agrees with the 80 below but is a quotation, not the
//   annex, so the figures stay unverified and off.
//
// US limits are ppm of the salt on the green weight of the meat block (immersion: meat + pickle,
// FSIS Directive 7620.3 via trade-facts §3). EU limits are mg per kg of the whole batch, as the ion.

export const METHODS = ["comminuted", "dry", "pumped", "immersion"] as const;
export type CureMethod = (typeof METHODS)[number];

export const PRODUCT_CLASSES = ["comminuted", "dry_cured", "immersion_cured", "pumped", "bacon_pumped", "bacon_immersion", "bacon_dry"] as const;
export type ProductClass = (typeof PRODUCT_CLASSES)[number];

export const TABLES = ["us", "eu", "none"] as const;
export type RegulatoryTable = (typeof TABLES)[number];

export const STORAGES = ["keep_refrigerated", "shelf_stable"] as const;
export type Storage = (typeof STORAGES)[number];

export const SALTS = ["sodium", "potassium"] as const;
export type Salt = (typeof SALTS)[number];

export const HEAT_TREATMENTS = ["not_heat_treated", "heat_treated", "sterilised"] as const;
export type HeatTreatment = (typeof HEAT_TREATMENTS)[number];

export type Substance = "nitrite" | "nitrate";
export type CheckKind = "max" | "min" | "target";

/**
 * Which product classes a method can make. A dry or fermented sausage is chopped meat: method
 * comminuted, class comminuted (156.25 ppm), never dry_cured (625 ppm: four times the nitrite).
 */
export const CLASSES_BY_METHOD: Readonly<Record<CureMethod, readonly ProductClass[]>> = {
  comminuted: ["comminuted"],
  dry: ["dry_cured", "bacon_dry"],
  pumped: ["pumped", "bacon_pumped"],
  immersion: ["immersion_cured", "bacon_immersion"],
};

export const DEFAULT_CLASS: Readonly<Record<CureMethod, ProductClass>> = {
  comminuted: "comminuted",
  dry: "dry_cured",
  pumped: "pumped",
  immersion: "immersion_cured",
};

export const METHOD_LABELS: Readonly<Record<CureMethod, string>> = {
  comminuted: "Comminuted (mixed into chopped meat)",
  dry: "Dry cure (rubbed onto cuts)",
  pumped: "Pumped or massaged (injected)",
  immersion: "Immersion (covered in pickle)",
};

export const CLASS_LABELS: Readonly<Record<ProductClass, string>> = {
  comminuted: "Comminuted (dry and fermented sausages included)",
  dry_cured: "Dry cured whole cuts (not sausages)",
  immersion_cured: "Immersion cured (not bacon)",
  pumped: "Pumped or massaged (not bacon)",
  bacon_pumped: "Bacon, pumped or massaged",
  bacon_immersion: "Bacon, immersion cured",
  bacon_dry: "Bacon, dry cured",
};

export const TABLE_LABELS: Readonly<Record<RegulatoryTable, string>> = {
  us: "United States (9 CFR 424.21(c), 424.22(b))",
  eu: "European Union (Reg. 1333/2008 as amended by 2023/2108)",
  none: "None: no regulatory check",
};

/** The day the figures were read (see the header). */
export const READ_ON = "2026-12-02";

export interface Citation {
  /** "9 CFR 424.21(c)", "Regulation (EC) 1333/2008 Annex II, as amended by Regulation (EU) 2023/2108" */
  regulation: string;
  /** the row or paragraph, in the regulation's own words where they were read */
  entry: string;
  readOn: string;
  /** how the text was reached, and how sure the figure is */
  via: string;
}

/** A figure for the salt the cure carries; `derived` when the text gives no figure for that salt. */
interface Figure {
  ppm: string;
  /** half-width of a range ("40 to 80" is 60 +/- 20) */
  tolerance?: string;
  derived?: string;
}

export interface LimitEntry {
  id: string;
  table: "us" | "eu";
  /** a short name of the entry shown with each check */
  entry: string;
  productClasses: readonly ProductClass[];
  substance: Substance;
  kind: CheckKind;
  sodium: Figure;
  /** the potassium salt's figure; absent: same as sodium (the chart's "sodium or potassium" rows) */
  potassium?: Figure;
  /** a statutory maximum blocks; everything else warns with the deviation */
  statutory: boolean;
  /** read in the regulation's own text (or a verbatim quotation of it) */
  verified: boolean;
  /** unverified figures are off unless a caller asks for them */
  onByDefault: boolean;
  /** only for products kept refrigerated */
  storage?: Storage;
  /** only for this EU heat treatment */
  heatTreatment?: HeatTreatment;
  /** alternatives of one required level share a group: meeting any one meets the group */
  group?: string;
  /** what the entry requires besides the level (ascorbate, sucrose and a culture...) */
  conditions?: string;
  basis: "meat_block" | "batch_as_ion";
  citation: Citation;
}

const US_VIA =
  "eCFR text as quoted verbatim in public research notes (retrieved from ecfr.gov and law.cornell.edu, 2026-07/08), found with the search tool; ecfr.gov itself was not reachable through it.";
const US_BACON_VIA = `${US_VIA} 90 FR 27973 (1 July 2025, FSIS-2025-0017) amended 424.22(b)(1) by removing FSIS's nitrosamine sampling of pumped bacon; the levels are as quoted after it.`;
const EU_VIA =
  "UNVERIFIED: not read in the annex text (only its Part D/E renaming of 08.3.4 and the cheese entries could be read through the search tool); figure from a secondary source (a public research note tabulating the annex, 2026-07-21). Off by default.";

const CFR_CHART = "9 CFR 424.21(c)";
const CFR_BACON = "9 CFR 424.22(b)(1)";

// Ounces per 100 lb are exact ppm by mass: 1 oz in 100 lb = 1/1600 = 625 ppm (16 oz = 1 lb).
const US: LimitEntry[] = [
  // Sodium or potassium nitrite, cured products other than bacon ----------------------------
  {
    id: "us-nitrite-comminuted", table: "us", entry: `${CFR_CHART} curing agents, nitrite: 1/4 oz to 100 lb chopped meat`,
    productClasses: ["comminuted"], substance: "nitrite", kind: "max", sodium: { ppm: "156.25" },
    statutory: true, verified: true, onByDefault: true, basis: "meat_block",
    citation: { regulation: CFR_CHART, entry: "Sodium or potassium nitrite: \"1/4 oz to 100 lb chopped meat, meat byproduct or poultry product\" (= 156.25 ppm exactly)", readOn: READ_ON, via: US_VIA },
  },
  {
    id: "us-nitrite-dry-cured", table: "us", entry: `${CFR_CHART} curing agents, nitrite: 1 oz to 100 lb meat (dry cure)`,
    productClasses: ["dry_cured"], substance: "nitrite", kind: "max", sodium: { ppm: "625" },
    statutory: true, verified: true, onByDefault: true, basis: "meat_block",
    citation: { regulation: CFR_CHART, entry: "Sodium or potassium nitrite: \"1 oz to 100 lb meat or poultry product (dry cure)\" (= 625 ppm)", readOn: READ_ON, via: US_VIA },
  },
  {
    id: "us-nitrite-pickle", table: "us", entry: `${CFR_CHART} curing agents, nitrite: 2 lb to 100 gal pickle at 10 percent pump level`,
    productClasses: ["pumped", "immersion_cured"], substance: "nitrite", kind: "max", sodium: { ppm: "200" },
    statutory: true, verified: true, onByDefault: true, basis: "meat_block",
    citation: { regulation: CFR_CHART, entry: "Sodium or potassium nitrite: \"2 lb to 100 gal pickle at 10 percent pump level\" (200 ppm ingoing, trade-facts §2)", readOn: READ_ON, via: US_VIA },
  },
  // Sodium or potassium nitrate: "Cured meat products other than bacon" ------------------------
  {
    id: "us-nitrate-comminuted", table: "us", entry: `${CFR_CHART} curing agents, nitrate: 2 3/4 oz to 100 lb chopped meat`,
    productClasses: ["comminuted"], substance: "nitrate", kind: "max", sodium: { ppm: "1718.75" },
    statutory: true, verified: true, onByDefault: true, basis: "meat_block",
    citation: { regulation: CFR_CHART, entry: "Sodium or potassium nitrate: \"2 3/4 oz to 100 lb chopped meat or poultry\" (= 1718.75 ppm)", readOn: READ_ON, via: US_VIA },
  },
  {
    id: "us-nitrate-dry-cured", table: "us", entry: `${CFR_CHART} curing agents, nitrate: 3 1/2 oz to 100 lb meat (dry cure)`,
    productClasses: ["dry_cured"], substance: "nitrate", kind: "max", sodium: { ppm: "2187.5" },
    statutory: true, verified: true, onByDefault: true, basis: "meat_block",
    citation: { regulation: CFR_CHART, entry: "Sodium or potassium nitrate: \"3 1/2 oz to 100 lb meat or poultry product (dry cure)\" (= 2187.5 ppm)", readOn: READ_ON, via: US_VIA },
  },
  {
    id: "us-nitrate-pickle", table: "us", entry: `${CFR_CHART} curing agents, nitrate: 7 lb to 100 gal pickle`,
    productClasses: ["pumped", "immersion_cured"], substance: "nitrate", kind: "max", sodium: { ppm: "700" },
    statutory: true, verified: true, onByDefault: true, basis: "meat_block",
    citation: { regulation: CFR_CHART, entry: "Sodium or potassium nitrate: \"7 lb to 100 gal pickle\" (700 ppm ingoing, trade-facts §2)", readOn: READ_ON, via: US_VIA },
  },
  {
    id: "us-nitrate-bacon", table: "us", entry: `${CFR_CHART} curing agents, nitrate: cured meat products other than bacon (none in bacon)`,
    productClasses: ["bacon_pumped", "bacon_immersion", "bacon_dry"], substance: "nitrate", kind: "max", sodium: { ppm: "0" },
    statutory: true, verified: true, onByDefault: true, basis: "meat_block",
    citation: { regulation: CFR_CHART, entry: "Sodium or potassium nitrate, products: \"Cured meat products other than bacon\"; nitrites may be used in bacon only under 424.22(b)", readOn: READ_ON, via: US_VIA },
  },
  // Bacon, 9 CFR 424.22(b) --------------------------------------------------------------------
  {
    // The required level is also the most the paragraph allows for pumped bacon (FSIS's "Bacon and
    // Food Safety" fact sheet: "cannot exceed 120 ppm for both pumped and immersion-cured bacon").
    id: "us-bacon-pumped-max", table: "us", entry: `${CFR_BACON} pumped or massaged bacon: 120 ppm ingoing, no more`,
    productClasses: ["bacon_pumped"], substance: "nitrite", kind: "max", sodium: { ppm: "120" }, potassium: { ppm: "148" },
    statutory: true, verified: true, onByDefault: true, basis: "meat_block",
    citation: { regulation: CFR_BACON, entry: "Pumped and/or massaged bacon: \"sodium nitrite shall be used at 120 parts per million (ppm) ingoing or an equivalent amount of potassium nitrite (148 ppm ingoing)\"", readOn: READ_ON, via: US_BACON_VIA },
  },
  {
    id: "us-bacon-pumped-120", table: "us", entry: `${CFR_BACON} pumped or massaged bacon: required 120 ppm with 550 ppm ascorbate or erythorbate`,
    productClasses: ["bacon_pumped"], substance: "nitrite", kind: "target", sodium: { ppm: "120" }, potassium: { ppm: "148" },
    statutory: false, verified: true, onByDefault: true, basis: "meat_block", group: "bacon-pumped-level",
    conditions: "550 ppm sodium ascorbate or sodium erythorbate",
    citation: { regulation: CFR_BACON, entry: "\"sodium nitrite shall be used at 120 ppm ingoing ... (148 ppm ingoing); and 550 ppm of sodium ascorbate or sodium erythorbate (isoascorbate) shall be used\"", readOn: READ_ON, via: US_BACON_VIA },
  },
  {
    id: "us-bacon-pumped-100", table: "us", entry: `${CFR_BACON} pumped or massaged bacon, alternative: 100 ppm`,
    productClasses: ["bacon_pumped"], substance: "nitrite", kind: "target", sodium: { ppm: "100" }, potassium: { ppm: "123" },
    statutory: false, verified: true, onByDefault: true, basis: "meat_block", group: "bacon-pumped-level",
    conditions: "the conditions the paragraph attaches to this alternative (not reproduced here: read 424.22(b)(1))",
    citation: { regulation: CFR_BACON, entry: "Alternative: \"100 ppm ingoing (potassium nitrite at 123 ppm)\"", readOn: READ_ON, via: US_BACON_VIA },
  },
  {
    id: "us-bacon-pumped-40-80", table: "us", entry: `${CFR_BACON} pumped or massaged bacon, alternative: 40 to 80 ppm with sucrose and a lactic culture`,
    productClasses: ["bacon_pumped"], substance: "nitrite", kind: "target",
    sodium: { ppm: "60", tolerance: "20" },
    // the text read gives no potassium figure here: 1.2335 x, truncated (trade-facts §2) = 49 to 98
    potassium: { ppm: "73.5", tolerance: "24.5", derived: "49 to 98 ppm potassium nitrite: 40 and 80 x 1.2335, truncated (trade-facts §2); the text read gives no potassium figure" },
    statutory: false, verified: true, onByDefault: true, basis: "meat_block", group: "bacon-pumped-level",
    conditions: "added sucrose at a minimum of 0.7 percent and an inoculum of lactic acid producing bacteria",
    citation: { regulation: CFR_BACON, entry: "Alternative: \"a predetermined level between 40 and 80 ppm ... plus additional sucrose ... at a minimum of 0.7 percent and an inoculum of lactic acid producing bacteria\"", readOn: READ_ON, via: US_BACON_VIA },
  },
  {
    id: "us-bacon-immersion", table: "us", entry: `${CFR_BACON} immersion cured bacon: at most 120 ppm`,
    productClasses: ["bacon_immersion"], substance: "nitrite", kind: "max", sodium: { ppm: "120" }, potassium: { ppm: "148" },
    statutory: true, verified: true, onByDefault: true, basis: "meat_block",
    citation: { regulation: CFR_BACON, entry: "Immersion cured bacon: \"shall not exceed 120 ppm ingoing\" (potassium nitrite 148 ppm)", readOn: READ_ON, via: US_BACON_VIA },
  },
  {
    id: "us-bacon-dry", table: "us", entry: `${CFR_BACON} dry cured bacon: at most 200 ppm`,
    productClasses: ["bacon_dry"], substance: "nitrite", kind: "max", sodium: { ppm: "200" }, potassium: { ppm: "246" },
    statutory: true, verified: true, onByDefault: true, basis: "meat_block",
    citation: { regulation: CFR_BACON, entry: "Dry cured bacon: \"shall not exceed 200 ppm ingoing (potassium nitrite at 246 ppm ingoing)\"", readOn: READ_ON, via: US_BACON_VIA },
  },
  // FSIS policy, not regulation ----------------------------------------------------------------
  {
    id: "us-keep-refrigerated-min", table: "us", entry: "FSIS policy: at least 120 ppm ingoing nitrite in cured keep-refrigerated products",
    productClasses: PRODUCT_CLASSES, substance: "nitrite", kind: "min", sodium: { ppm: "120" },
    potassium: { ppm: "148", derived: "120 x 1.2335, truncated (trade-facts §2), as 424.22(b) prints it for bacon" },
    statutory: false, verified: false, onByDefault: true, basis: "meat_block", storage: "keep_refrigerated",
    conditions: "policy with exceptions (safety assured another way, e.g. by thermal processing, pH or moisture control), so a warning: a manager may proceed with a reason",
    citation: {
      regulation: "FSIS policy (Processing Inspectors' Calculations Handbook, FSIS Directive 7620.3)",
      entry: "Minimum 120 ppm ingoing nitrite for cured products labelled keep refrigerated",
      readOn: READ_ON,
      via: "trade-facts §2 [sec]; the Directive's PDF was not read. A warning only, so it stays on.",
    },
  },
];

const EU_REG = "Regulation (EC) 1333/2008 Annex II Part E, as amended by Regulation (EU) 2023/2108";

const EU: LimitEntry[] = [
  {
    id: "eu-08.3.1-nitrite", table: "eu", entry: "08.3.1 non-heat-treated meat products, E 249-250 nitrites: 80 mg/kg added, as NO2-",
    productClasses: PRODUCT_CLASSES, substance: "nitrite", kind: "max", sodium: { ppm: "80" },
    statutory: true, verified: false, onByDefault: false, basis: "batch_as_ion", heatTreatment: "not_heat_treated",
    citation: { regulation: EU_REG, entry: "Category 08.3.1, E 249-250 (nitrites), from 9 October 2025: maximum amount added, expressed as NO2- ion", readOn: READ_ON, via: EU_VIA },
  },
  {
    id: "eu-08.3.2-nitrite", table: "eu", entry: "08.3.2 heat-treated meat products (not sterilised), E 249-250 nitrites: 80 mg/kg added, as NO2-",
    productClasses: PRODUCT_CLASSES, substance: "nitrite", kind: "max", sodium: { ppm: "80" },
    statutory: true, verified: false, onByDefault: false, basis: "batch_as_ion", heatTreatment: "heat_treated",
    citation: { regulation: EU_REG, entry: "Category 08.3.2, E 249-250 (nitrites), except sterilised meat products, from 9 October 2025: maximum amount added, expressed as NO2- ion", readOn: READ_ON, via: EU_VIA },
  },
  {
    id: "eu-08.3.2-sterilised-nitrite", table: "eu", entry: "08.3.2 sterilised meat products (Fo > 3.00), E 249-250 nitrites: 55 mg/kg added, as NO2-",
    productClasses: PRODUCT_CLASSES, substance: "nitrite", kind: "max", sodium: { ppm: "55" },
    statutory: true, verified: false, onByDefault: false, basis: "batch_as_ion", heatTreatment: "sterilised",
    citation: { regulation: EU_REG, entry: "Category 08.3.2, E 249-250 (nitrites), only sterilised meat products (Fo > 3.00), from 9 October 2025: maximum amount added, expressed as NO2- ion", readOn: READ_ON, via: EU_VIA },
  },
];

export const LIMITS: readonly LimitEntry[] = [...US, ...EU];

/**
 * Salt to ion, EU (Regulation (EU) 2023/2108 expresses meat limits as the ion; trade-facts §2
 * [pub: the regulation's recitals], also a secondary source: apasa.es 2023-10-18): NaNO2 x 0.67
 * = NO2-, NaNO3 x 0.73 = NO3-. No potassium nitrite factor was read, so potassium salts get no EU
 * ion figure.
 */
export const ION_FACTORS = { nitrite: "0.67", nitrate: "0.73" } as const;

/**
 * Potassium nitrite per sodium nitrite (molar masses 85.10 / 69.00): 1.2335 (trade-facts §2
 * [sec/calc]; 424.22(b) prints 120 -> 148, 100 -> 123, 200 -> 246, truncated).
 */
export const POTASSIUM_NITRITE_FACTOR = "1.2335";
