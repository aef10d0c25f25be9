// How GS1 element strings are split: the length of each Application Identifier (AI) and of its
// value. Pure data, client-safe.
//
// Sources (each rule below names the one it comes from):
// - [PREDEFINED] GS1 General Specifications, section 7.8.5 (figure 7.8.5-2, "Element strings with
//   predefined length using GS1 Application Identifiers"): the two-digit prefixes whose element
//   strings have a predefined length and need no FNC1 (GS) after them. GS1 fixes this table for
//   good, so a reader can split a scan even when it does not know an AI. Lengths here are the data
//   after the AI (the figure counts AI + data: 00 -> 20 = 2 + 18). (23) has been dropped from it
//   since (235) was allocated as a variable-length AI (the GS1 Barcode Syntax Engine, ai.c, notes
//   the same).
// - [AI-LENGTH] GS1 General Specifications, section 3.2 (the AI table) as published in the GS1
//   Barcode Syntax Dictionary (github.com/gs1/gs1-syntax-dictionary): every AI that begins with
//   the same two digits has the same number of digits, so the first two digits tell how long the
//   AI is. Two-digit prefixes that GS1 has not allocated are absent: after one of them a scan
//   cannot be split.
// - [FORMAT] GS1 General Specifications, section 3.2 (the AI table) and the Syntax Dictionary, for the AIs
//   this product reads: (00) N18, (01) N14, (02) N14, each with a mod-10 check digit; (10) X..20;
//   (11) (13) (15) (16) (17) N6 YYMMDD, day 00 allowed; (30) N..8; (37) N..8; (310n) and (320n) N6
//   with n decimals (n = 0..5). trade-facts.md section 6 summarises them.

/** Data characters after the AI for prefixes of predefined length [PREDEFINED]. */
export const PREDEFINED_VALUE_LENGTH: Readonly<Record<string, number>> = {
  "00": 18, // SSCC
  "01": 14, // GTIN
  "02": 14, // GTIN of contained trade items
  "03": 14, // reserved by GS1
  "04": 16, // reserved by GS1
  "11": 6, // production date
  "12": 6, // due date
  "13": 6, // packaging date
  "14": 6, // reserved by GS1
  "15": 6, // best before
  "16": 6, // sell by
  "17": 6, // expiration
  "18": 6, // reserved by GS1
  "19": 6, // reserved by GS1
  "20": 2, // variant
  "31": 6, // 31nn-36nn: trade and logistic measures
  "32": 6,
  "33": 6,
  "34": 6,
  "35": 6,
  "36": 6,
  "41": 13, // 41n: global location numbers
};

/** Digits in the AI itself, by its first two digits [AI-LENGTH]; prefixes of [PREDEFINED] included. */
export const AI_LENGTH_BY_PREFIX: Readonly<Record<string, 2 | 3 | 4>> = (() => {
  const out: Record<string, 2 | 3 | 4> = {};
  const set = (length: 2 | 3 | 4, ...prefixes: string[]) => {
    for (const p of prefixes) out[p] = length;
  };
  // (00)-(04); (10)-(22): batch, dates, variant, serial, CPV; (30) count; (37) count of trade items;
  // (90)-(99) company internal
  set(2, "00", "01", "02", "03", "04", "10", "11", "12", "13", "14", "15", "16", "17", "18", "19", "20", "21", "22", "30", "37");
  set(2, "90", "91", "92", "93", "94", "95", "96", "97", "98", "99");
  // (235) TPX; (240)-(243), (250)-(255); (400)-(403), (410)-(417), (420)-(427); (710)-(715) NHRN
  set(3, "23", "24", "25", "40", "41", "42", "71");
  // (3100)-(3695) measures; (3900)-(3955) amounts and prices; (4300)-(4333) shipping; (7001)-(7040);
  // (7230)-(7242); (8001)-(8030), (8110)-(8112), (8200)
  set(4, "31", "32", "33", "34", "35", "36", "39", "43", "70", "72", "80", "81", "82");
  return out;
})();

/** The longest value of any AI in the Syntax Dictionary ((8030) Z..90, (91)-(99) X..90): a bound for AIs we do not decode. */
export const MAX_UNKNOWN_VALUE_LENGTH = 90;

/** What the AIs this product reads hold [FORMAT]. */
export interface AiSpec {
  title: string;
  kind: "sscc" | "gtin" | "lot" | "date" | "count" | "weight";
  /** Fixed length of the value, or for variable ones the maximum. */
  length: number;
  fixed: boolean;
}

const DATE = (title: string): AiSpec => ({ title, kind: "date", length: 6, fixed: true });
const WEIGHT = (title: string): AiSpec => ({ title, kind: "weight", length: 6, fixed: true });

export const KNOWN_AIS: Readonly<Record<string, AiSpec>> = {
  "00": { title: "SSCC", kind: "sscc", length: 18, fixed: true },
  "01": { title: "GTIN", kind: "gtin", length: 14, fixed: true },
  "02": { title: "contained GTIN", kind: "gtin", length: 14, fixed: true },
  "10": { title: "batch/lot", kind: "lot", length: 20, fixed: false },
  "11": DATE("production date"),
  "13": DATE("packaging date"),
  "15": DATE("best before date"),
  "16": DATE("sell by date"),
  "17": DATE("expiration date"),
  "30": { title: "count", kind: "count", length: 8, fixed: false },
  "37": { title: "count of trade items", kind: "count", length: 8, fixed: false },
  ...Object.fromEntries([0, 1, 2, 3, 4, 5].map((n) => [`310${n}`, WEIGHT(`net weight, kg, ${n} decimals`)])),
  ...Object.fromEntries([0, 1, 2, 3, 4, 5].map((n) => [`320${n}`, WEIGHT(`net weight, lb, ${n} decimals`)])),
};

/** "(01) GTIN", or "(99)" for an AI this product does not read. */
export function aiLabel(ai: string): string {
  const spec = KNOWN_AIS[ai];
  return spec ? `(${ai}) ${spec.title}` : `(${ai})`;
}

/**
 * GS1 AI encodable character set 82 (GS1 General Specifications figure 7.11-1): the characters a
 * batch/lot and most text AIs may hold. Space is not among them.
 */
export const CSET82 = /^[!"%&'()*+,\-./0-9:;<=>?A-Z_a-z]*$/;
