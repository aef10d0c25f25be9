// lib/gs1/parse properties (fast-check): random label fields, encoded as a scanner would send them
// (GS or a stand-in after variable-length values, optional symbology identifier, or the bracketed
// form, elements in any order), read back exactly. The encoder here is written from the rules of
// GS1 General Specifications 7.8.5 (FNC1/GS only after values not of predefined length) and the
// expected dates from 7.12 (century window) and trade-facts §6 (day 00), independently of the parser.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { gtinCheckDigit } from "@/lib/gs1/gtin";
import { GS, Gs1ParseError, parseGs1, type Gs1Label } from "@/lib/gs1/parse";

const CSET82 = `!"%&'()*+,-./0123456789:;<=>?ABCDEFGHIJKLMNOPQRSTUVWXYZ_abcdefghijklmnopqrstuvwxyz`.split("");
const text = (min: number, max: number) => fc.array(fc.constantFrom(...CSET82), { minLength: min, maxLength: max }).map((a) => a.join(""));
const digits = (min: number, max = min) => fc.array(fc.integer({ min: 0, max: 9 }), { minLength: min, maxLength: max }).map((a) => a.join(""));
const withCheckDigit = (length: number) => digits(length - 1).map((body) => `${body}${gtinCheckDigit(body)}`);

// prefixes whose values have a predefined length (GS1 General Specifications figure 7.8.5-2)
const FIXED_PREFIXES = new Set(["00", "01", "02", "11", "13", "15", "16", "17", "31", "32", "33"]);

interface Element {
  ai: string;
  value: string;
  field: keyof Gs1Label | null;
  expected: string;
}

const pad = (n: number, w = 2) => String(n).padStart(w, "0");

/** A GS1 date within the century window of `year`, with what it must read as. */
const dateOf = (ai: string, field: keyof Gs1Label, currentYear: number) =>
  fc
    .record({ offset: fc.integer({ min: -49, max: 50 }), month: fc.integer({ min: 1, max: 12 }), dayPick: fc.integer({ min: 0, max: 31 }) })
    .map(({ offset, month, dayPick }): Element => {
      const year = currentYear + offset;
      const last = new Date(Date.UTC(year, month, 0)).getUTCDate(); // day 0 of the next month
      const day = dayPick % (last + 1);
      const monthOnly = ai === "11" || ai === "13";
      const expected = day === 0 ? (monthOnly ? `${pad(year, 4)}-${pad(month)}` : `${pad(year, 4)}-${pad(month)}-${pad(last)}`) : `${pad(year, 4)}-${pad(month)}-${pad(day)}`;
      return { ai, value: `${pad(year % 100)}${pad(month)}${pad(day)}`, field, expected };
    });

const weightOf = (prefix: "310" | "320", field: keyof Gs1Label) =>
  fc.record({ n: fc.integer({ min: 0, max: 5 }), value: digits(6) }).map(({ n, value }): Element => {
    const whole = value.slice(0, 6 - n).replace(/^0+(?=\d)/, "") || "0";
    return { ai: `${prefix}${n}`, value, field, expected: n === 0 ? whole : `${whole}.${value.slice(6 - n)}` };
  });

const countOf = (ai: string, field: keyof Gs1Label) =>
  digits(1, 8).map((value): Element => ({ ai, value, field, expected: value.replace(/^0+(?=\d)/, "") }));

const opt = <T>(a: fc.Arbitrary<T>) => fc.option(a, { nil: undefined });

const scenario = fc.integer({ min: 1951, max: 2948 }).chain((currentYear) =>
  fc
    .record({
      logistic: fc.boolean(),
      gtin: withCheckDigit(14),
      sscc: opt(withCheckDigit(18)),
      contained: opt(withCheckDigit(14)),
      tradeItemCount: opt(countOf("37", "tradeItemCount")),
      lot: opt(text(1, 20)),
      productionDate: opt(dateOf("11", "productionDate", currentYear)),
      packagingDate: opt(dateOf("13", "packagingDate", currentYear)),
      bestBefore: opt(dateOf("15", "bestBefore", currentYear)),
      sellBy: opt(dateOf("16", "sellBy", currentYear)),
      expiry: opt(dateOf("17", "expiry", currentYear)),
      kg: opt(weightOf("310", "netWeightKg")),
      lb: opt(weightOf("320", "netWeightLb")),
      count: opt(countOf("30", "count")),
      serial: opt(text(1, 20)), // (21), not read: lands in other
      gross: opt(digits(6)), // (3302), predefined length, not read
      internal: opt(text(1, 30)), // (99), not read
    })
    .map((r) => {
      const els: Element[] = [];
      if (r.logistic) {
        // (00), (02), (37): a logistic unit; never with (01)
        if (r.sscc) els.push({ ai: "00", value: r.sscc, field: "sscc", expected: r.sscc });
        if (r.contained) els.push({ ai: "02", value: r.contained, field: "containedGtin", expected: r.contained });
        if (r.tradeItemCount) els.push(r.tradeItemCount);
      } else {
        els.push({ ai: "01", value: r.gtin, field: "gtin", expected: r.gtin });
      }
      if (r.lot) els.push({ ai: "10", value: r.lot, field: "lot", expected: r.lot });
      for (const d of [r.productionDate, r.packagingDate, r.bestBefore, r.sellBy, r.expiry, r.kg, r.lb, r.count]) if (d) els.push(d);
      if (r.serial) els.push({ ai: "21", value: r.serial, field: null, expected: r.serial });
      if (r.gross) els.push({ ai: "3302", value: r.gross, field: null, expected: r.gross });
      if (r.internal) els.push({ ai: "99", value: r.internal, field: null, expected: r.internal });
      return els;
    })
    .filter((els) => els.length > 0)
    .chain((els) => fc.shuffledSubarray(els, { minLength: els.length, maxLength: els.length }))
    .chain((els) =>
      fc.record({
        els: fc.constant(els),
        today: fc.constant(`${currentYear}-06-15`),
        form: fc.constantFrom("raw", "bracketed"),
        id: fc.constantFrom("", "]C1", "]d2", "]Q3"),
        separator: fc.constantFrom(GS, "|", "~", "{GS}", "#"),
        gsAfterFixed: fc.boolean(),
      }),
    ),
);

function encode(s: { els: Element[]; form: string; id: string; separator: string; gsAfterFixed: boolean }): string {
  if (s.form === "bracketed") return s.id + s.els.map((e) => `(${e.ai})${e.value.replaceAll("(", "\\(")}`).join("");
  let out = "";
  s.els.forEach((e, i) => {
    out += e.ai + e.value;
    const last = i === s.els.length - 1;
    if (!last && (!FIXED_PREFIXES.has(e.ai.slice(0, 2)) || s.gsAfterFixed)) out += s.separator;
  });
  // without an identifier, 8/12/13/14 bare digits with a checking last digit are read as a GTIN
  return s.id === "" && /^(\d{8}|\d{12,14})$/.test(out) ? `]C1${out}` : s.id + out;
}

describe("encode -> parse", () => {
  it("gives every field back, exactly", () => {
    fc.assert(
      fc.property(scenario, (s) => {
        const data = encode(s);
        const got = parseGs1(data, { today: s.today, separator: s.separator === GS ? undefined : s.separator });
        const expected: Record<string, unknown> = {
          sscc: null, gtin: null, containedGtin: null, lot: null, productionDate: null, packagingDate: null, bestBefore: null,
          sellBy: null, expiry: null, netWeightKg: null, netWeightLb: null, count: null, tradeItemCount: null, other: {},
        };
        for (const e of s.els) {
          if (e.field) expected[e.field] = e.expected;
          else (expected.other as Record<string, string>)[e.ai] = e.expected;
        }
        expect(got).toEqual(expected);
      }),
      { numRuns: 500 },
    );
  });

  it("a wrong check digit in (01) is always BAD_CHECK_DIGIT on (01)", () => {
    fc.assert(
      fc.property(digits(13), fc.integer({ min: 1, max: 9 }), (body, shift) => {
        const wrong = (gtinCheckDigit(body) + shift) % 10;
        try {
          parseGs1(`]C101${body}${wrong}`, { today: "2026-12-02" });
          return false;
        } catch (e) {
          return e instanceof Gs1ParseError && e.code === "BAD_CHECK_DIGIT" && e.ai === "01";
        }
      }),
    );
  });
});
