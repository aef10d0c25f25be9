// Reading a GS1 case label: what a scanner sends for a GS1-128, GS1 DataMatrix or GS1 QR symbol
// (or the human-readable line under it) turned into the fields purchasing needs. Pure,
// client-safe; no floats (weights are decimal strings cut from the digits).
//
// Accepted input (trade-facts.md section 6; GS1 General Specifications on symbology identifiers,
// FNC1 separators (7.8) and check digits (7.9); the GS1 Barcode Syntax Engine's scan-data handling):
// - element strings as scanned: "0112345678901231" "10" "ABC" <GS> "17" "261231" ..., where GS
//   (ASCII 29) is how a scanner transmits FNC1, the end of a variable-length value that is not last;
// - optionally led by an AIM symbology identifier: ]C1 (GS1-128), ]d2 (GS1 DataMatrix), ]Q3
//   (GS1 QR Code), ]e0 (GS1 DataBar / composite), ]J1 (GS1 DotCode). ]E0, ]E4 (EAN-13/UPC-A,
//   EAN-8) and ]I1 (ITF-14) carry a bare GTIN. Any other ]xx is dropped and the data read as it is;
// - a stand-in for GS (options.separator) for keyboard-wedge scanners that cannot type ASCII 29
//   into a browser field; GS itself is always accepted too;
// - the bracketed human-readable form "(01)12345678901231(10)ABC" ("\(" is a "(" inside a value);
// - a bare GTIN-8/12/13/14 (8, 12, 13 or 14 digits with a correct check digit and no identifier):
//   the ITF-14 on a case or the EAN/UPC on a retail pack, which scanners send without an AI. An
//   all-digit element string of exactly those lengths whose last digit happens to check is read as
//   a GTIN; send it with its symbology identifier or in brackets to have it read as AIs.
//
// Every AI is split with GS1's table of predefined lengths and the AI length implied by its first
// two digits (lib/gs1/ai-table.ts), so AIs this product does not read are kept in `other` instead of
// breaking the scan. Pairs that can never be valid in one symbol are refused: (37) with (01), (01)
// with (02), two different (310n) or (320n). Every value must be in GS1 character set 82, so a
// stand-in separator nobody configured is reported instead of silently swallowing what follows it.
// Mandatory pairs (e.g. (10) needs (01) or (02)) are not checked: a label spreads its data over
// several barcodes, which are scanned one at a time.
import { AI_LENGTH_BY_PREFIX, aiLabel, CSET82, KNOWN_AIS, MAX_UNKNOWN_VALUE_LENGTH, PREDEFINED_VALUE_LENGTH } from "./ai-table";
import { Gs1DateError, gs1Date, yearOf } from "./dates";
import { gtinCheckDigit, hasValidCheckDigit, isValidGtin } from "./gtin";

/** ASCII 29, Group Separator: FNC1 as a scanner transmits it. */
export const GS = "\u001d";

/** What a scan says. Dates ISO 8601; weights and counts exact decimal strings; absent fields null. */
export interface Gs1Label {
  /** (00) Serial Shipping Container Code, 18 digits. */
  sscc: string | null;
  /** (01) GTIN of the trade item, 14 digits (a bare GTIN-8/12/13 is padded with leading zeros). */
  gtin: string | null;
  /** (02) GTIN of the trade items contained in a logistic unit, 14 digits. */
  containedGtin: string | null;
  /** (10) batch or lot, as printed. */
  lot: string | null;
  /** (11) "YYYY-MM-DD", or "YYYY-MM" when the label gives no day (day 00). */
  productionDate: string | null;
  /** (13) "YYYY-MM-DD", or "YYYY-MM" when the label gives no day. */
  packagingDate: string | null;
  /** (15) "YYYY-MM-DD"; day 00 is read as the last day of the month. */
  bestBefore: string | null;
  /** (16) "YYYY-MM-DD"; day 00 is read as the last day of the month. */
  sellBy: string | null;
  /** (17) "YYYY-MM-DD"; day 00 is read as the last day of the month. */
  expiry: string | null;
  /** (310n) kg with the label's n decimals, e.g. "12.50". */
  netWeightKg: string | null;
  /** (320n) lb with the label's n decimals. */
  netWeightLb: string | null;
  /** (30) variable count, without leading zeros. */
  count: string | null;
  /** (37) count of trade items in a logistic unit, without leading zeros. */
  tradeItemCount: string | null;
  /** Every other AI, its value as scanned: {"21": "SN123", "3302": "001000"}. */
  other: Record<string, string>;
}

export interface Gs1ParseOptions {
  /** Stand-in for GS that the scanner types instead of ASCII 29, e.g. "|" (see separatorProblem). */
  separator?: string;
  /** Today, for the century of two-digit years: a Date (its UTC year) or "YYYY-MM-DD". Default: now. */
  today?: Date | string;
}

export type Gs1ErrorCode =
  | "EMPTY" // nothing to read
  | "NO_AI" // the data does not begin with an AI
  | "UNKNOWN_AI" // a prefix GS1 has not allocated, or an AI of the wrong number of digits
  | "TOO_SHORT" // a fixed-length value cut short
  | "TOO_LONG" // a value longer than its AI allows (often a missing GS)
  | "EMPTY_VALUE" // an AI with no value
  | "NOT_NUMERIC" // a numeric AI with other characters
  | "INVALID_CHARACTER" // a character the AI may not hold
  | "BAD_CHECK_DIGIT" // (00), (01), (02) or a bare GTIN whose check digit is wrong
  | "INVALID_DATE" // a month or day that does not exist
  | "NOT_ALLOWED_TOGETHER" // (37) with (01), (01) with (02), two (310n)...
  | "DUPLICATE_AI" // the same AI twice with different values
  | "DATA_AFTER_END" // characters after a complete value that do not begin an AI
  | "BAD_BRACKETS" // a malformed "(AI)value" form
  | "BAD_SEPARATOR"; // an unusable stand-in separator

/** A scan that cannot be read, naming the AI (when there is one) and what is wrong. */
export class Gs1ParseError extends Error {
  constructor(
    readonly code: Gs1ErrorCode,
    message: string,
    /** The AI concerned, e.g. "01"; null when the problem is not in one AI. */
    readonly ai: string | null = null,
    /** Index into the input where the element concerned begins, when known. */
    readonly position: number | null = null,
  ) {
    super(message);
    this.name = "Gs1ParseError";
  }
}

interface Element {
  ai: string;
  value: string;
  /** index of the AI's first character in the original input */
  at: number;
}

// ---------------------------------------------------------------------------------------------

/**
 * Why a stand-in separator cannot be used, or null when it can. It must be 1 to 8 characters and
 * hold at least one character that GS1 data never contains (outside character set 82, e.g. | ~ ^ #
 * { } or GS itself), so it can never be mistaken for part of a lot or another value.
 */
export function separatorProblem(separator: string): string | null {
  if (separator.length < 1 || separator.length > 8) return "The separator is 1 to 8 characters.";
  if ([...separator].every((c) => CSET82.test(c))) {
    return "The separator must contain a character that never occurs in GS1 data, such as | ~ ^ # { or }: letters, digits and the punctuation a lot may hold would be mistaken for data.";
  }
  return null;
}

/** Splits a scan into its elements and reads them. Throws Gs1ParseError. */
export function parseGs1(input: string, options: Gs1ParseOptions = {}): Gs1Label {
  if (options.separator !== undefined) {
    const problem = separatorProblem(options.separator);
    if (problem) throw new Gs1ParseError("BAD_SEPARATOR", problem);
  }
  const currentYear = yearOf(options.today ?? new Date());
  if (typeof input !== "string" || input.trim() === "") throw new Gs1ParseError("EMPTY", "The scan is empty.");

  // keyboard-wedge scanners end with Enter or Tab; spaces and line ends are never GS1 data
  const offset = input.length - input.trimStart().length;
  let data = input.trim();
  let at = offset;
  let symbology: string | null = null;
  const id = /^\][A-Za-z][0-9A-Za-z]/.exec(data);
  if (id) {
    symbology = id[0].slice(1);
    data = data.slice(3);
    at += 3;
    if (data.trim() === "") throw new Gs1ParseError("EMPTY", `Nothing follows the symbology identifier ]${symbology}.`);
  }

  if (symbology === "E0" || symbology === "E4" || symbology === "I1") return bareGtin(data, symbology, at);
  const gs1Symbology = symbology !== null && ["C1", "d2", "Q3", "e0", "J1"].includes(symbology);
  if (!gs1Symbology && /^(\d{8}|\d{12,14})$/.test(data) && isValidGtin(data)) return bareGtin(data, symbology, at);

  const elements = data.startsWith("(") ? splitBracketed(data, at) : splitElementString(data, at, options.separator);
  return readElements(elements, currentYear);
}

// ---------------------------------------------------------------------------------------------

function emptyLabel(): Gs1Label {
  return {
    sscc: null, gtin: null, containedGtin: null, lot: null, productionDate: null, packagingDate: null, bestBefore: null,
    sellBy: null, expiry: null, netWeightKg: null, netWeightLb: null, count: null, tradeItemCount: null, other: {},
  };
}

/** ]E0 (EAN-13, UPC-A as 13 digits), ]E4 (EAN-8), ]I1 (ITF-14), or digits without an identifier. */
function bareGtin(data: string, symbology: string | null, at: number): Gs1Label {
  const length = symbology === "E4" ? 8 : symbology === "E0" ? 13 : symbology === "I1" ? 14 : data.length;
  const what = symbology === "E4" ? "An EAN-8" : symbology === "E0" ? "An EAN-13 or UPC-A" : symbology === "I1" ? "An ITF-14" : "A GTIN";
  if (!/^\d+$/.test(data)) throw new Gs1ParseError("NOT_NUMERIC", `${what} scan holds digits only.`, null, at);
  if (data.length < length) throw new Gs1ParseError("TOO_SHORT", `${what} scan has ${length} digits; this one has ${data.length}.`, null, at);
  if (data.length > length) {
    throw new Gs1ParseError("DATA_AFTER_END", `${what} scan ends after ${length} digits; "${data.slice(length)}" follows.`, null, at + length);
  }
  if (!hasValidCheckDigit(data)) {
    throw new Gs1ParseError("BAD_CHECK_DIGIT", `${what} ${data} has a wrong check digit: it should end in ${gtinCheckDigit(data.slice(0, -1))}.`, null, at);
  }
  return { ...emptyLabel(), gtin: data.padStart(14, "0") };
}

/** Unbracketed data: AIs and values run together, variable-length values ended by GS (or the stand-in). */
function splitElementString(data: string, at: number, separator: string | undefined): Element[] {
  const separators = separator && separator !== GS ? [GS, separator] : [GS];
  const separatorAt = (i: number) => separators.find((s) => data.startsWith(s, i))?.length ?? 0;
  const elements: Element[] = [];
  let previous: string | null = null;
  let i = 0;
  while (i < data.length) {
    // a separator in first position (FNC1 sent as GS), after a fixed-length value or at the end: harmless
    const skip = separatorAt(i);
    if (skip) {
      i += skip;
      continue;
    }
    const start = i;
    const prefix = data.slice(i, i + 2);
    const aiLength = /^\d\d$/.test(prefix) ? AI_LENGTH_BY_PREFIX[prefix] : undefined;
    const ai = aiLength ? data.slice(i, i + aiLength) : "";
    if (!aiLength || !/^\d+$/.test(ai) || ai.length < aiLength) {
      const rest = data.slice(i, i + 20);
      if (previous !== null) {
        throw new Gs1ParseError(
          "DATA_AFTER_END",
          `${aiLabel(previous)} is complete, but "${rest}" after it does not begin a GS1 Application Identifier.`,
          previous,
          at + start,
        );
      }
      if (/^\d\d$/.test(prefix)) {
        throw new Gs1ParseError("UNKNOWN_AI", `No GS1 Application Identifier begins with ${prefix}, so the scan cannot be read.`, prefix, at + start);
      }
      throw new Gs1ParseError("NO_AI", `The scan does not begin with a GS1 Application Identifier: "${rest}".`, null, at + start);
    }
    i += aiLength;
    const fixed = PREDEFINED_VALUE_LENGTH[prefix];
    let end = i;
    while (end < data.length && (fixed === undefined || end - i < fixed) && !separatorAt(end)) end++;
    const value = data.slice(i, end);
    if (fixed !== undefined && value.length < fixed) {
      const cut = end < data.length ? " before a separator" : "";
      throw new Gs1ParseError("TOO_SHORT", `${aiLabel(ai)} is too short: ${fixed} digits are needed, the scan has ${value.length}${cut}.`, ai, at + start);
    }
    elements.push({ ai, value, at: at + start });
    previous = ai;
    i = end;
  }
  if (elements.length === 0) throw new Gs1ParseError("EMPTY", "The scan holds only separators.");
  return elements;
}

/** "(01)12345678901231(10)ABC": each AI in brackets, its value up to the next "(" ("\(" is a literal one). */
function splitBracketed(data: string, at: number): Element[] {
  const elements: Element[] = [];
  let i = 0;
  while (i < data.length) {
    while (i < data.length && /\s/.test(data[i]!)) i++;
    if (i >= data.length) break;
    if (data[i] !== "(") throw new Gs1ParseError("BAD_BRACKETS", `Expected "(" to begin an AI at "${data.slice(i, i + 20)}".`, null, at + i);
    const close = data.indexOf(")", i);
    if (close < 0) throw new Gs1ParseError("BAD_BRACKETS", `An AI bracket is not closed: "${data.slice(i, i + 20)}".`, null, at + i);
    const ai = data.slice(i + 1, close).trim();
    if (!/^\d{2,4}$/.test(ai)) throw new Gs1ParseError("BAD_BRACKETS", `"(${ai})" is not an AI: an AI is 2 to 4 digits.`, null, at + i);
    const expected = AI_LENGTH_BY_PREFIX[ai.slice(0, 2)];
    if (expected !== undefined && expected !== ai.length) {
      throw new Gs1ParseError("UNKNOWN_AI", `(${ai}) is not a GS1 Application Identifier: those beginning ${ai.slice(0, 2)} have ${expected} digits.`, ai, at + i);
    }
    let j = close + 1;
    let value = "";
    while (j < data.length) {
      if (data[j] === "\\" && data[j + 1] === "(") {
        value += "(";
        j += 2;
        continue;
      }
      if (data[j] === "(") break;
      value += data[j];
      j++;
    }
    value = value.trim();
    if (value === "") throw new Gs1ParseError("EMPTY_VALUE", `${aiLabel(ai)} has no value.`, ai, at + i);
    const fixed = PREDEFINED_VALUE_LENGTH[ai.slice(0, 2)];
    if (fixed !== undefined && value.length < fixed) {
      throw new Gs1ParseError("TOO_SHORT", `${aiLabel(ai)} is too short: ${fixed} digits are needed, the scan has ${value.length}.`, ai, at + i);
    }
    if (fixed !== undefined && value.length > fixed) {
      throw new Gs1ParseError("TOO_LONG", `${aiLabel(ai)} is too long: ${fixed} digits are needed, the scan has ${value.length}.`, ai, at + i);
    }
    elements.push({ ai, value, at: at + i });
    i = j;
  }
  return elements;
}

// ---------------------------------------------------------------------------------------------

const digitsOnly = (s: string) => /^\d+$/.test(s);
const withoutLeadingZeros = (s: string) => s.replace(/^0+(?=\d)/, "");

/** "001250" with 2 decimals -> "12.50": the label's own digits, never through a float. */
function decimalFromDigits(digits: string, decimals: number): string {
  const whole = withoutLeadingZeros(digits.slice(0, digits.length - decimals) || "0");
  return decimals === 0 ? whole : `${whole}.${digits.slice(digits.length - decimals)}`;
}

function readElements(elements: Element[], currentYear: number): Gs1Label {
  const label = emptyLabel();
  const seen = new Map<string, Element>();
  const fail = (code: Gs1ErrorCode, el: Element, what: string): never => {
    throw new Gs1ParseError(code, `${aiLabel(el.ai)}: ${what}`, el.ai, el.at);
  };
  // Every AI's value is drawn from GS1 character set 82 (or its subsets 39 and 64: GS1 General
  // Specifications 7.11). A character outside it is most often a scanner's stand-in for GS that was
  // not configured, which would otherwise swallow the AIs after it silently.
  const checkCharacters = (el: Element) => {
    if (CSET82.test(el.value)) return;
    const bad = [...el.value].find((c) => !CSET82.test(c))!;
    const control = /[\u0000-\u001f\u007f]/.test(bad);
    const shown = control ? `control character ${bad.charCodeAt(0)}` : bad === " " ? "a space" : `"${bad}"`;
    const hint = control ? "" : ` If your scanner sends ${shown} between fields, choose it as the separator.`;
    fail("INVALID_CHARACTER", el, `${shown} cannot be part of a GS1 value (letters, digits and ! " % & ' ( ) * + , - . / : ; < = > ? _ only).${hint}`);
  };
  const tooLong = (el: Element, max: number, unit: string) =>
    fail("TOO_LONG", el, `at most ${max} ${unit}, the scan has ${el.value.length}. If another AI follows it, the GS separator between them is missing; if your scanner types a stand-in for GS, choose it as the separator.`);

  for (const el of elements) {
    const prior = seen.get(el.ai);
    if (prior) {
      // an AI may repeat only with the same value (the GS1 Barcode Syntax Engine's association check)
      if (prior.value !== el.value) fail("DUPLICATE_AI", el, `appears twice with different values ("${prior.value}" and "${el.value}").`);
      continue;
    }
    seen.set(el.ai, el);
    if (el.value === "") fail("EMPTY_VALUE", el, "has no value.");
    checkCharacters(el);
    const spec = KNOWN_AIS[el.ai];
    const fixed = PREDEFINED_VALUE_LENGTH[el.ai.slice(0, 2)];

    if (!spec) {
      // every predefined-length AI is numeric (N) in the GS1 Syntax Dictionary
      if (fixed !== undefined && !digitsOnly(el.value)) fail("NOT_NUMERIC", el, `holds digits only, the scan has "${el.value}".`);
      if (el.value.length > MAX_UNKNOWN_VALUE_LENGTH) tooLong(el, MAX_UNKNOWN_VALUE_LENGTH, "characters");
      label.other[el.ai] = el.value;
      continue;
    }

    switch (spec.kind) {
      case "sscc":
      case "gtin": {
        if (!digitsOnly(el.value)) fail("NOT_NUMERIC", el, `holds ${spec.length} digits, the scan has "${el.value}".`);
        if (!hasValidCheckDigit(el.value)) {
          const expected = gtinCheckDigit(el.value.slice(0, -1));
          fail("BAD_CHECK_DIGIT", el, `the check digit is wrong: ${el.value} should end in ${expected}.`);
        }
        if (el.ai === "00") label.sscc = el.value;
        else if (el.ai === "01") label.gtin = el.value;
        else label.containedGtin = el.value;
        break;
      }
      case "lot": {
        if (el.value.length > spec.length) tooLong(el, spec.length, "characters");
        label.lot = el.value;
        break;
      }
      case "date": {
        if (!digitsOnly(el.value)) fail("NOT_NUMERIC", el, `is a date YYMMDD, the scan has "${el.value}".`);
        let iso = "";
        try {
          iso = gs1Date(el.value, currentYear, el.ai === "11" || el.ai === "13" ? "month" : "last-day");
        } catch (e) {
          if (e instanceof Gs1DateError) fail("INVALID_DATE", el, `${e.message}.`);
          throw e;
        }
        if (el.ai === "11") label.productionDate = iso;
        else if (el.ai === "13") label.packagingDate = iso;
        else if (el.ai === "15") label.bestBefore = iso;
        else if (el.ai === "16") label.sellBy = iso;
        else label.expiry = iso;
        break;
      }
      case "count": {
        if (!digitsOnly(el.value)) fail("NOT_NUMERIC", el, `holds digits only, the scan has "${el.value}".`);
        if (el.value.length > spec.length) tooLong(el, spec.length, "digits");
        if (el.ai === "30") label.count = withoutLeadingZeros(el.value);
        else label.tradeItemCount = withoutLeadingZeros(el.value);
        break;
      }
      case "weight": {
        if (!digitsOnly(el.value)) fail("NOT_NUMERIC", el, `holds 6 digits, the scan has "${el.value}".`);
        const weight = decimalFromDigits(el.value, Number(el.ai[3]));
        const field = el.ai.startsWith("310") ? "netWeightKg" : "netWeightLb";
        const twin = [...seen.keys()].find((k) => k !== el.ai && k.slice(0, 3) === el.ai.slice(0, 3));
        if (twin) fail("NOT_ALLOWED_TOGETHER", el, `a label states one net weight per unit; (${twin}) is already there.`);
        label[field] = weight;
        break;
      }
    }
  }

  // pairs GS1 forbids (GS1 Syntax Dictionary "ex=": 01 ex=02,255,37; 310n ex=310n; trade-facts §6)
  const together = (a: string, b: string, why: string) => {
    const el = seen.get(a);
    if (el && seen.has(b)) fail("NOT_ALLOWED_TOGETHER", el, why);
  };
  together("37", "01", "counts the trade items in a logistic unit and goes with (00) and (02), never with (01).");
  together("02", "01", "names the contents of a logistic unit and cannot stand with (01), the GTIN of a trade item.");
  return label;
}
