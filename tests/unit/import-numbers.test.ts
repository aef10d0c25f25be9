// lib/import/numbers: numbers in CSV cells read to exact decimal strings under the mapping's
// decimal and thousands separators. Outside references: Intl.NumberFormat (ICU's CLDR locale data:
// how de-DE, fr-FR, de-CH and en-US write numbers; exact for decimal strings, ECMA-402 NumberFormat
// v3) and decimal.js (the value survives exactly, compared with Decimal.eq).
import Decimal from "decimal.js";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { describeNumberFormat, parseDecimal, parseInteger, proposeNumberFormat, type NumberFormat } from "@/lib/import/numbers";

const DOT: NumberFormat = { decimal: ".", thousands: "" };
const DOT_COMMA: NumberFormat = { decimal: ".", thousands: "," };
const COMMA_DOT: NumberFormat = { decimal: ",", thousands: "." };
const COMMA_SPACE: NumberFormat = { decimal: ",", thousands: " " };
const DOT_APOS: NumberFormat = { decimal: ".", thousands: "'" };

const ok = (text: string, f: NumberFormat, signed = false) => {
  const r = parseDecimal(text, f, { signed });
  if (!r.ok) throw new Error(`${text}: ${r.message}`);
  return r.value;
};
const refused = (text: string, f: NumberFormat, signed = false) => {
  const r = parseDecimal(text, f, { signed });
  if (r.ok) throw new Error(`${text} was read as ${r.value}`);
  return r.message;
};

describe("parseDecimal", () => {
  it("reads each separator pairing into a plain decimal string, digits as written", () => {
    expect(ok("12.40", DOT)).toBe("12.40");
    expect(ok("1,234.5", DOT_COMMA)).toBe("1234.5");
    expect(ok("1.234,50", COMMA_DOT)).toBe("1234.50");
    expect(ok("1 234 567,125", COMMA_SPACE)).toBe("1234567.125");
    expect(ok("1'234.50", DOT_APOS)).toBe("1234.50");
    expect(ok("1\u2019234.50", DOT_APOS)).toBe("1234.50"); // typographic apostrophe
    expect(ok("0,5", COMMA_DOT)).toBe("0.5");
    expect(ok(",5", COMMA_DOT)).toBe("0.5");
    expect(ok("7", COMMA_DOT)).toBe("7");
    expect(ok("1234", COMMA_DOT)).toBe("1234"); // grouping is optional
  });

  it("accepts spaces, no-break spaces, a currency sign and a plus around the number", () => {
    expect(ok("  12.5 ", DOT)).toBe("12.5");
    expect(ok("\u00a012,50\u00a0€", COMMA_DOT)).toBe("12.50");
    expect(ok("€ 1.234,00", COMMA_DOT)).toBe("1234.00");
    expect(ok("$1,234.00", DOT_COMMA)).toBe("1234.00");
    expect(ok("£0.89", DOT)).toBe("0.89");
    expect(ok("+3", DOT)).toBe("3");
  });

  it("refuses what is not a number in that format, naming the format", () => {
    expect(refused("12,5.0", COMMA_DOT)).toBe("'12,5.0' is not a number with decimal ',' and thousands '.'");
    expect(refused("1,234.5", DOT)).toBe("'1,234.5' is not a number with decimal '.' and no thousands separator");
    expect(refused("12.34.5", COMMA_DOT)).toMatch(/not a number/); // groups of three only
    expect(refused("1.23", COMMA_DOT)).toMatch(/not a number/);
    expect(refused("12.", DOT)).toMatch(/not a number/);
    expect(refused("1e5", DOT)).toMatch(/not a number/);
    expect(refused("NaN", DOT)).toMatch(/not a number/);
    expect(refused("Infinity", DOT)).toMatch(/not a number/);
    expect(refused("0x10", DOT)).toMatch(/not a number/);
    expect(refused("12 kg", DOT)).toMatch(/not a number/);
    expect(refused("1 234'567,5", { decimal: ",", thousands: " " })).toMatch(/not a number/);
    expect(refused("", DOT)).toBe("empty");
    expect(describeNumberFormat(COMMA_SPACE)).toBe("decimal ',' and thousands ' ' (space)");
  });

  it("refuses negative numbers unless the field is signed; a negative zero is zero", () => {
    expect(refused("-5", DOT)).toBe("'-5' is negative; this column takes no negative numbers");
    expect(ok("-5,5", COMMA_DOT, true)).toBe("-5.5");
    expect(ok("\u22125.5", DOT, true)).toBe("-5.5"); // U+2212 minus sign
    expect(ok("-0.00", DOT)).toBe("0.00");
  });

  it("refuses more than 18 digits before or after the separator", () => {
    expect(ok("123456789012345678.5", DOT)).toBe("123456789012345678.5");
    expect(refused("1234567890123456789", DOT)).toMatch(/more than 18 digits/);
    expect(refused("0.1234567890123456789", DOT)).toMatch(/more than 18 decimals/);
  });

  it("parseInteger takes whole numbers only", () => {
    expect(parseInteger("1.000", COMMA_DOT)).toEqual({ ok: true, value: "1000" });
    expect(parseInteger("12,00", COMMA_DOT)).toEqual({ ok: true, value: "12" });
    expect(parseInteger("007", DOT)).toEqual({ ok: true, value: "7" });
    expect(parseInteger("12,5", COMMA_DOT)).toEqual({ ok: false, message: "'12,5' is not a whole number" });
  });
});

describe("against Intl.NumberFormat (how locales write numbers) and decimal.js", () => {
  // The locale's own separators, in the format a person would choose in the mapping.
  const locales: [string, NumberFormat][] = [
    ["en-US", DOT_COMMA],
    ["de-DE", COMMA_DOT],
    ["fr-FR", COMMA_SPACE], // groups with U+202F narrow no-break space
    ["de-CH", DOT_APOS],
  ];
  const decimalStrings = fc
    .tuple(fc.bigInt({ min: 0n, max: 10n ** 15n }), fc.integer({ min: 0, max: 6 }), fc.boolean())
    .map(([n, scale, negative]) => {
      const digits = n.toString().padStart(scale + 1, "0");
      const s = scale === 0 ? digits : `${digits.slice(0, -scale)}.${digits.slice(-scale)}`;
      return negative && n !== 0n ? `-${s}` : s;
    });

  for (const [locale, format] of locales) {
    it(`reads what ${locale} writes, exactly`, () => {
      fc.assert(
        fc.property(decimalStrings, fc.boolean(), (s, grouping) => {
          const scale = s.includes(".") ? s.split(".")[1]!.length : 0;
          // a decimal string is formatted exactly (no float) by NumberFormat v3
          const written = new Intl.NumberFormat(locale, { minimumFractionDigits: scale, maximumFractionDigits: scale, useGrouping: grouping }).format(s as unknown as number);
          const r = parseDecimal(written, format, { signed: true });
          expect(r.ok, `${locale} wrote ${JSON.stringify(written)} for ${s}`).toBe(true);
          if (r.ok) expect(new Decimal(r.value).eq(new Decimal(s)), `${written} -> ${r.value}, expected ${s}`).toBe(true);
        }),
        { numRuns: 300 },
      );
    });
  }

  it("refuses another locale's writing where it would change the value (de-DE's 1.234,5 under en-US separators)", () => {
    const written = new Intl.NumberFormat("de-DE", { minimumFractionDigits: 1 }).format("1234.5" as unknown as number);
    expect(written).toBe("1.234,5");
    expect(parseDecimal(written, DOT_COMMA).ok).toBe(false);
  });
});

describe("proposeNumberFormat", () => {
  it("finds decimal commas with thousands dots in a semicolon file", () => {
    expect(proposeNumberFormat(["7,85", "1.234,50", "64,00"], ";")).toEqual({ format: COMMA_DOT, ambiguous: false });
  });
  it("finds decimal points with thousands commas", () => {
    expect(proposeNumberFormat(["12.40", "1,234.50"], ",")).toEqual({ format: DOT_COMMA, ambiguous: false });
  });
  it("says when the sample could be read two ways", () => {
    expect(proposeNumberFormat(["1.234", "2.500"], ",").ambiguous).toBe(true);
    expect(proposeNumberFormat(["12", "13"], ",")).toEqual({ format: DOT, ambiguous: false });
  });
});
