// lib/gs1/gtin: mod-10 check digits and GTIN normalisation.
import { describe, expect, it } from "vitest";
import { gtinCheckDigit, hasValidCheckDigit, isValidGtin, normalizeGtin } from "@/lib/gs1/gtin";

describe("gtinCheckDigit", () => {
  it("629104150021 -> 3 (gs1.org check digit calculator example; trade-facts §6)", () => {
    expect(gtinCheckDigit("629104150021")).toBe(3);
  });

  it("730001100001 -> 7 (GS1 Sweden example; trade-facts §6)", () => {
    expect(gtinCheckDigit("730001100001")).toBe(7);
  });

  it("1234567890123 -> 1 (trade-facts §6: 12345678901231 is valid)", () => {
    expect(gtinCheckDigit("1234567890123")).toBe(1);
  });

  it("SSCC body 10614141123456789 -> 7 (GS1 General Specifications SSCC example (00)106141411234567897)", () => {
    expect(gtinCheckDigit("10614141123456789")).toBe(7);
  });

  it("refuses non-digits", () => {
    expect(() => gtinCheckDigit("12a4")).toThrow();
    expect(() => gtinCheckDigit("")).toThrow();
  });
});

describe("isValidGtin", () => {
  it("12345678901231 valid, 12345678901234 invalid (trade-facts §6)", () => {
    expect(isValidGtin("12345678901231")).toBe(true);
    expect(isValidGtin("12345678901234")).toBe(false);
  });

  it("accepts GTIN-8/12/13/14 with their check digit (gs1.org / GS1 Sweden vectors, trade-facts §6)", () => {
    expect(isValidGtin("6291041500213")).toBe(true); // 13
    expect(isValidGtin("7300011000017")).toBe(true); // 13
    expect(isValidGtin("96385074")).toBe(true); // GTIN-8, constructed: 9638507 -> 4
    expect(isValidGtin("036000291452")).toBe(true); // UPC-A 12, constructed: 03600029145 -> 2
  });

  it("refuses other lengths and non-digits", () => {
    expect(isValidGtin("1234567890128")).toBe(true); // constructed: 123456789012 -> 8
    expect(isValidGtin("123456789012")).toBe(true); // constructed: 12345678901 -> 2
    expect(isValidGtin("123456789013")).toBe(false); // constructed: wrong check digit
    expect(isValidGtin("0012345678901231")).toBe(false); // 16 digits
    expect(isValidGtin("1234567")).toBe(false);
    expect(isValidGtin("1234567890123a")).toBe(false);
    expect(isValidGtin(" 12345678901231")).toBe(false);
  });
});

describe("hasValidCheckDigit", () => {
  it("works for any length (SSCC 18 digits)", () => {
    expect(hasValidCheckDigit("106141411234567897")).toBe(true);
    expect(hasValidCheckDigit("106141411234567890")).toBe(false);
  });
});

describe("normalizeGtin", () => {
  it("pads to 14 digits", () => {
    expect(normalizeGtin("6291041500213")).toBe("06291041500213");
    expect(normalizeGtin("96385074")).toBe("00000096385074");
    expect(normalizeGtin("036000291452")).toBe("00036000291452");
    expect(normalizeGtin("12345678901231")).toBe("12345678901231");
  });

  it("strips spaces", () => {
    expect(normalizeGtin(" 629 1041 50021 3 ")).toBe("06291041500213");
  });

  it("returns null for bad check digit, wrong length, non-digits", () => {
    expect(normalizeGtin("12345678901234")).toBeNull();
    expect(normalizeGtin("1234567890")).toBeNull();
    expect(normalizeGtin("12-345678901231")).toBeNull();
    expect(normalizeGtin("")).toBeNull();
  });
});
