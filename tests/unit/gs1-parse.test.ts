// lib/gs1/parse: GS1 element strings as scanners send them, to the fields purchasing reads.
// Sources, named beside each vector:
//   [TF6]      trade-facts.md section 6 (GS1 barcode engine vectors, check values)
//   [GBE]      GS1 Barcode Engine unit tests, github.com/gs1/gs1-barcode-engine src/c-lib/ai.c (test_ai_parseAIdata)
//   [GSE-AI]   GS1 Barcode Syntax Engine unit tests, github.com/gs1/gs1-syntax-engine src/c-lib/ai.c
//              (test_ai_processAIdata, test_ai_linters); "^" there is FNC1, sent by scanners as GS
//   [GSE-SCAN] GS1 Barcode Syntax Engine unit tests, src/c-lib/scandata.c (test_scandata_processScanData)
//   [GS1-GS]   GS1 General Specifications (section named)
//   constructed: written for this product, checked by hand (check digits with lib/gs1/gtin)
import { describe, expect, it } from "vitest";
import { GS, Gs1ParseError, parseGs1, separatorProblem, type Gs1ErrorCode, type Gs1Label } from "@/lib/gs1/parse";

const TODAY = "2026-12-02";
const parse = (data: string, separator?: string) => parseGs1(data, { today: TODAY, separator });

function failure(data: string, separator?: string): Gs1ParseError {
  try {
    parse(data, separator);
  } catch (e) {
    if (e instanceof Gs1ParseError) return e;
    throw e;
  }
  throw new Error(`expected ${JSON.stringify(data)} to fail`);
}

const EMPTY: Gs1Label = {
  sscc: null, gtin: null, containedGtin: null, lot: null, productionDate: null, packagingDate: null, bestBefore: null,
  sellBy: null, expiry: null, netWeightKg: null, netWeightLb: null, count: null, tradeItemCount: null, other: {},
};
const label = (fields: Partial<Gs1Label>): Gs1Label => ({ ...EMPTY, ...fields });

describe("published element strings", () => {
  it("01123456789012311012345: no separator after fixed-length (01) [TF6, GBE]", () => {
    expect(parse("01123456789012311012345")).toEqual(label({ gtin: "12345678901231", lot: "12345" }));
  });

  it("31001234561012345: no separator after fixed-length (3100) [TF6, GBE]", () => {
    expect(parse("31001234561012345")).toEqual(label({ netWeightKg: "123456", lot: "12345" }));
  });

  it("(10)12345 GS (11)991225: a separator after variable-length (10) [GBE]; 99 is 1999 in 2026 [GS1-GS 7.12]", () => {
    expect(parse(`1012345${GS}11991225`)).toEqual(label({ lot: "12345", productionDate: "1999-12-25" }));
  });

  it("(3900)12345 GS (11)991225: an AI we do not read, ended by GS [GBE]", () => {
    expect(parse(`390012345${GS}11991225`)).toEqual(label({ productionDate: "1999-12-25", other: { "3900": "12345" } }));
  });

  it("the bracketed forms of the same [GBE]", () => {
    expect(parse("(01)12345678901231(10)12345")).toEqual(parse("01123456789012311012345"));
    expect(parse("(3100)123456(10)12345")).toEqual(parse("31001234561012345"));
    expect(parse("(10)12345(11)991225")).toEqual(parse(`1012345${GS}11991225`));
  });

  it('an escaped bracket is data: (10)12345\\(11)991225 is one lot [GBE]', () => {
    expect(parse("(10)12345\\(11)991225").lot).toBe("12345(11)991225");
    expect(parse("(10)12345\\(").lot).toBe("12345(");
  });

  it("(01)95012345678903(3103)000123: 0.123 kg [GSE-AI test_ai_linters]", () => {
    expect(parse("(01)95012345678903(3103)000123")).toEqual(label({ gtin: "95012345678903", netWeightKg: "0.123" }));
  });

  it("(00)123456789012345675: an SSCC with its check digit [GSE-AI test_ai_linters]", () => {
    expect(parse("(00)123456789012345675").sscc).toBe("123456789012345675");
  });

  it("^0112345678901231991234: fixed-length (01) runs into (99) [GSE-AI]", () => {
    expect(parse("0112345678901231991234")).toEqual(label({ gtin: "12345678901231", other: { "99": "1234" } }));
  });

  it("^242123456^10ABC123, ^81111234^10ABC123, ^800112341234512398^0112345678901231: unknown variable AIs ended by GS [GSE-AI]", () => {
    expect(parse(`242123456${GS}10ABC123`)).toEqual(label({ lot: "ABC123", other: { "242": "123456" } }));
    expect(parse(`81111234${GS}10ABC123`)).toEqual(label({ lot: "ABC123", other: { "8111": "1234" } }));
    expect(parse(`800112341234512398${GS}0112345678901231`)).toEqual(label({ gtin: "12345678901231", other: { "8001": "12341234512398" } }));
  });
});

describe("symbology identifiers [GSE-SCAN; trade-facts §6]", () => {
  const expected = label({ gtin: "12312312312333", lot: "ABC123", other: { "99": "TESTING" } });

  it.each(["]C1", "]d2", "]Q3", "]e0"])("%s011231231231233310ABC123 GS 99TESTING", (id) => {
    expect(parse(`${id}011231231231233310ABC123${GS}99TESTING`)).toEqual(expected);
  });

  it("]e0 with a fixed-length (11) run into (98), then GS (97) [GSE-SCAN]", () => {
    expect(parse(`]e0011231231231233310ABC123${GS}1199122598TESTING${GS}97XYZ`)).toEqual(
      label({ gtin: "12312312312333", lot: "ABC123", productionDate: "1999-12-25", other: { "98": "TESTING", "97": "XYZ" } }),
    );
  });

  it("drops other identifiers and reads the data (constructed)", () => {
    expect(parse(`]J1011231231231233310ABC123${GS}99TESTING`)).toEqual(expected);
    expect(parse(`]C0011231231231233310ABC123${GS}99TESTING`)).toEqual(expected);
  });

  it("]E0 and ]E4 carry a bare EAN/UPC; the GTIN is padded to 14 digits [GSE-SCAN]", () => {
    expect(parse("]E02112345678900")).toEqual(label({ gtin: "02112345678900" }));
    expect(parse("]E402345673")).toEqual(label({ gtin: "00000002345673" }));
  });

  it("]E0 / ]E4 errors: short, long, not digits, bad check digit [GSE-SCAN]", () => {
    expect(failure("]E0123456789012").code).toBe("TOO_SHORT");
    expect(failure("]E012345678901234").code).toBe("DATA_AFTER_END");
    expect(failure("]E01234ABC890123").code).toBe("NOT_NUMERIC");
    expect(failure("]E02112345678901").code).toBe("BAD_CHECK_DIGIT");
    expect(failure("]E41234567").code).toBe("TOO_SHORT");
    expect(failure("]E402345674").code).toBe("BAD_CHECK_DIGIT");
  });

  it("]I1: an ITF-14 on a case (constructed: 1 + 0614141 00041 + check digit 5)", () => {
    expect(parse("]I110614141000415")).toEqual(label({ gtin: "10614141000415" }));
  });

  it("nothing after an identifier is EMPTY [GSE-SCAN: \"]C1\", \"]d2\", \"]Q3\" fail]", () => {
    for (const id of ["]C1", "]d2", "]Q3", "]e0"]) expect(failure(id).code).toBe("EMPTY");
  });
});

describe("bare GTINs without an identifier (scanners send EAN/UPC and ITF-14 without an AI)", () => {
  it("reads 8, 12, 13 and 14 digits with a correct check digit as a GTIN [GSE-SCAN validateParity vectors]", () => {
    expect(parse("24012345678905").gtin).toBe("24012345678905");
    expect(parse("2112233789657").gtin).toBe("02112233789657");
    expect(parse("416000336108").gtin).toBe("00416000336108");
    expect(parse("02345680").gtin).toBe("00000002345680");
  });

  it("with ]C1 the same digits are AIs: (10)012345678902 (constructed: 1001234567890 -> check digit 2)", () => {
    expect(parse("]C110012345678902")).toEqual(label({ lot: "012345678902" }));
    expect(parse("10012345678902").gtin).toBe("10012345678902");
  });

  it("digits whose last digit does not check are read as AIs (constructed: (17)261231 then (10)1234)", () => {
    // 17261231101234: as a GTIN-14 its check digit would be 6, not 4
    expect(parse("17261231101234")).toEqual(label({ expiry: "2026-12-31", lot: "1234" }));
  });
});

describe("separators", () => {
  const expected = label({ gtin: "12345678901231", lot: "ABC-12", expiry: "2027-03-31" });

  it("GS ends a variable-length value that is not last [GS1-GS 7.8.5] (constructed)", () => {
    expect(parse(`0112345678901231` + `10ABC-12${GS}17270331`)).toEqual(expected);
  });

  it("tolerates GS in first position (FNC1 sent as GS), after fixed-length values and at the end [GSE-AI: ^0112345678901231^ and ^0112345678901231^991234 pass]", () => {
    expect(parse(`${GS}0112345678901231${GS}10ABC-12${GS}17270331${GS}`)).toEqual(expected);
    expect(parse(`0112345678901231${GS}`)).toEqual(label({ gtin: "12345678901231" }));
    expect(parse(`0112345678901231${GS}991234`)).toEqual(label({ gtin: "12345678901231", other: { "99": "1234" } }));
  });

  it.each(["|", "~", "^", "{GS}", "#"])("a stand-in %j for scanners that cannot type GS (constructed)", (sep) => {
    expect(parse(`0112345678901231${sep}10ABC-12${sep}17270331`, sep)).toEqual(expected);
    // GS is still accepted beside the stand-in
    expect(parse(`0112345678901231${sep}10ABC-12${GS}17270331`, sep)).toEqual(expected);
  });

  it("an unconfigured stand-in is named instead of swallowing the AIs after it (constructed)", () => {
    const e = failure("011234567890123110ABC-12|17270331");
    expect(e.code).toBe("INVALID_CHARACTER");
    expect(e.ai).toBe("10");
    expect(e.message).toMatch(/"\|".*choose it as the separator/);
  });

  it("refuses stand-ins that could be data", () => {
    expect(separatorProblem("|")).toBeNull();
    expect(separatorProblem(GS)).toBeNull();
    expect(separatorProblem("{GS}")).toBeNull();
    for (const bad of ["", "A", "1", "-", "(", "GS", "<GS>", "123456789"]) expect(separatorProblem(bad), bad).not.toBeNull();
    expect(() => parse("0112345678901231", "X")).toThrow(Gs1ParseError);
  });

  it("trims the Enter or Tab a keyboard-wedge scanner adds (constructed)", () => {
    expect(parse(`]C10112345678901231\r\n`)).toEqual(label({ gtin: "12345678901231" }));
    expect(parse(`  (01)12345678901231\t`)).toEqual(label({ gtin: "12345678901231" }));
  });
});

describe("the bracketed human-readable form", () => {
  it("reads a full case label (constructed: SSCC, contained GTIN, count, lot, dates, weight)", () => {
    expect(parse("(00)106141411234567897(02)10614141000415(37)40(10)L2611-07(11)261100(17)270300(3102)001250")).toEqual(
      label({
        sscc: "106141411234567897", containedGtin: "10614141000415", tradeItemCount: "40", lot: "L2611-07",
        productionDate: "2026-11", expiry: "2027-03-31", netWeightKg: "12.50",
      }),
    );
  });

  it("allows spaces between elements as typed from the printed line (constructed)", () => {
    expect(parse("(01) 12345678901231 (17) 270331 (10) ABC-12")).toEqual(label({ gtin: "12345678901231", lot: "ABC-12", expiry: "2027-03-31" }));
  });

  it.each([
    ["(10)(11)98765", "EMPTY_VALUE"], // [GBE] value must not be empty
    ["(10)12345(11)", "EMPTY_VALUE"], // [GBE] value must not be empty
    ["(1A)12345", "BAD_BRACKETS"], // [GBE] AI must be numeric
    ["()12345", "BAD_BRACKETS"], // [GBE] AI too short
    ["(1)12345", "BAD_BRACKETS"], // [GBE] AI too short
    ["(12345)12345", "BAD_BRACKETS"], // [GBE] AI too long
    ["(15", "BAD_BRACKETS"], // [GBE] AI must terminate
    ["(", "BAD_BRACKETS"], // [GBE] AI must terminate
    ["(01)123456789012312(10)12345", "TOO_LONG"], // [GBE] fixed-length AI too long
    ["(17)9(90)217", "TOO_SHORT"], // [GBE] must not run together as ^7990217
    ["(310)123456", "UNKNOWN_AI"], // constructed: AIs beginning 31 have four digits
  ] as const)("%s fails with %s [GBE unless marked]", (data, code: Gs1ErrorCode) => {
    expect(failure(data).code).toBe(code);
  });

  it("1(12345 and 12345 do not begin with an AI in brackets [GBE]", () => {
    expect(failure("1(12345").code).toBe("NO_AI");
    expect(failure("12345").code).toBe("TOO_SHORT"); // read unbracketed: (12) due date wants 6 digits
  });
});

describe("unknown AIs are skipped by GS1's length tables, not fatal", () => {
  it("keeps (21) serial, (3302) gross weight, (410) ship-to GLN, (7003) and (8200) in other (constructed)", () => {
    const data = `0112345678901231` + `21SN0042${GS}` + `3302001350` + `4109501101020917` + `70032701311200${GS}` + `8200https://example.com/p/1${GS}` + `10LOT-9`;
    expect(parse(data)).toEqual(
      label({
        gtin: "12345678901231", lot: "LOT-9",
        other: { "21": "SN0042", "3302": "001350", "410": "9501101020917", "7003": "2701311200", "8200": "https://example.com/p/1" },
      }),
    );
  });

  it("keeps AIs of allocated prefixes that are not in our table, e.g. (3106) and (19) [GS1-GS figure 7.8.5-2] (constructed)", () => {
    expect(parse("0112345678901231310612345619123456").other).toEqual({ "3106": "123456", "19": "123456" });
  });

  it("(89) is not allocated: the scan cannot be split [GSE-AI: ^891234 fails]", () => {
    const e = failure("891234");
    expect(e.code).toBe("UNKNOWN_AI");
    expect(e.ai).toBe("89");
  });

  it("a predefined-length value that is not digits is refused (constructed)", () => {
    expect(failure("0112345678901231330200A350").code).toBe("NOT_NUMERIC");
  });
});

describe("dates", () => {
  it("day 00: (15), (16), (17) the last day of the month; (11), (13) the month alone [trade-facts §6] (constructed)", () => {
    expect(parse("(01)12345678901231(17)260200").expiry).toBe("2026-02-28");
    expect(parse("(01)12345678901231(17)280200").expiry).toBe("2028-02-29"); // 2028 is a leap year
    expect(parse("(01)12345678901231(15)261100").bestBefore).toBe("2026-11-30");
    expect(parse("(01)12345678901231(16)261200").sellBy).toBe("2026-12-31");
    expect(parse("(01)12345678901231(11)260300").productionDate).toBe("2026-03");
    expect(parse("(01)12345678901231(13)260300").packagingDate).toBe("2026-03");
    expect(parse("(01)12345678901231(13)260314").packagingDate).toBe("2026-03-14");
  });

  it.each([
    ["(01)95012345678903(11)131313", "11"], // [GSE-AI test_ai_linters] illegal month
    ["(01)12345678901231(17)260230", "17"], // constructed: 30 February
    ["(01)12345678901231(17)270229", "17"], // constructed: 2027 is not a leap year
    ["(01)12345678901231(15)260001", "15"], // constructed: month 00
    ["(01)12345678901231(16)2612AB", "16"], // constructed: not digits
  ])("%s is refused, naming (%s)", (data, ai) => {
    const e = failure(data);
    expect(["INVALID_DATE", "NOT_NUMERIC"]).toContain(e.code);
    expect(e.ai).toBe(ai);
    expect(e.message).toContain(`(${ai})`);
  });

  it("places two-digit years within -49..+50 years of today [GS1-GS 7.12] (constructed)", () => {
    // with ]C1: eight bare digits whose last digit checks would be read as a GTIN-8
    const expiry = (yymmdd: string, today: string) => parseGs1(`]C117${yymmdd}`, { today }).expiry;
    expect(expiry("760101", "2026-12-02")).toBe("2076-01-01"); // +50
    expect(expiry("770101", "2026-12-02")).toBe("1977-01-01"); // +51 -> -49
    expect(expiry("200101", "2070-06-15")).toBe("2120-01-01"); // -50 -> +50
    expect(expiry("210101", "2070-06-15")).toBe("2021-01-01"); // -49
    expect(expiry("490101", "1999-12-31")).toBe("2049-01-01"); // +50 across the century
    expect(expiry("500101", "1999-12-31")).toBe("1950-01-01"); // -49
    expect(expiry("000229", "2026-12-02")).toBe("2000-02-29"); // 2000 is a leap year (divisible by 400)
    expect(() => parseGs1("]C117000229", { today: "2070-01-01" })).toThrow(/2100-02 has no day 29/); // 2100 is not
  });

  it("takes today as a Date too (its UTC year)", () => {
    expect(parseGs1("]C117770101", { today: new Date(Date.UTC(2026, 11, 2)) }).expiry).toBe("1977-01-01");
  });
});

describe("net weights, exact decimal strings with the label's decimals", () => {
  it.each([
    ["3102001250", "netWeightKg", "12.50"], // the brief's example: 001250 with 2 decimals
    ["3100123456", "netWeightKg", "123456"], // [TF6]
    ["3103000123", "netWeightKg", "0.123"], // [GSE-AI]
    ["3105123456", "netWeightKg", "1.23456"], // constructed
    ["3101000000", "netWeightKg", "0.0"], // constructed
    ["3202002756", "netWeightLb", "27.56"], // constructed
    ["3205000001", "netWeightLb", "0.00001"], // constructed
  ] as const)("%s -> %s %s", (data, field, value) => {
    expect(parse(`0112345678901231${data}`)[field]).toBe(value);
  });

  it("kg and lb together are fine; two kg weights are not [GS1 Syntax Dictionary: 310n ex=310n] (constructed)", () => {
    expect(parse("(01)12345678901231(3102)001250(3202)002756")).toMatchObject({ netWeightKg: "12.50", netWeightLb: "27.56" });
    const e = failure("(01)12345678901231(3102)001250(3103)012500");
    expect(e.code).toBe("NOT_ALLOWED_TOGETHER");
    expect(e.ai).toBe("3103");
  });
});

describe("counts", () => {
  it("(30) and (37) up to 8 digits, leading zeros dropped (constructed)", () => {
    expect(parse(`0112345678901231` + `3000000012`).count).toBe("12");
    expect(parse(`(00)106141411234567897(02)10614141000415(37)00000040`).tradeItemCount).toBe("40");
    expect(parse(`(01)12345678901231(30)0`).count).toBe("0");
  });

  it("more than 8 digits is too long, with the missing-separator hint (constructed)", () => {
    const e = failure(`0112345678901231` + `30123456789`);
    expect(e.code).toBe("TOO_LONG");
    expect(e.message).toMatch(/\(30\).*at most 8 digits.*GS separator/);
  });
});

describe("errors name the AI and what is wrong", () => {
  it("a bad check digit in (01) [TF6: 12345678901234 invalid; GSE-AI ^0112345678901234]", () => {
    const e = failure("0112345678901234");
    expect(e).toMatchObject({ code: "BAD_CHECK_DIGIT", ai: "01", position: 0 });
    expect(e.message).toBe("(01) GTIN: the check digit is wrong: 12345678901234 should end in 1.");
  });

  it("bad check digits in (00) and (02) [GSE-AI test_ai_linters (00)123456789012345670; constructed (02)]", () => {
    expect(failure("(00)123456789012345670")).toMatchObject({ code: "BAD_CHECK_DIGIT", ai: "00" });
    expect(failure("(00)106141411234567897(02)10614141000416(37)1")).toMatchObject({ code: "BAD_CHECK_DIGIT", ai: "02" });
    expect(failure("(01)95012345678902(3103)000123")).toMatchObject({ code: "BAD_CHECK_DIGIT", ai: "01" }); // [GSE-AI]
  });

  it("(01) too short [GSE-AI ^011234567890123, ^011234567890123^]", () => {
    expect(failure("011234567890123")).toMatchObject({ code: "TOO_SHORT", ai: "01" });
    expect(failure(`011234567890123${GS}`)).toMatchObject({ code: "TOO_SHORT", ai: "01" });
  });

  it("(01) with a non-digit [GSE-AI ^01A2345678901231, ^011234567890123A]", () => {
    expect(failure("01A2345678901231")).toMatchObject({ code: "NOT_NUMERIC", ai: "01" });
    expect(failure("011234567890123A")).toMatchObject({ code: "NOT_NUMERIC", ai: "01" });
  });

  it("data after the end [GSE-AI ^01123456789012312, ^01123456789012345^991234]", () => {
    const e = failure("01123456789012312");
    expect(e).toMatchObject({ code: "DATA_AFTER_END", ai: "01", position: 16 });
    expect(e.message).toMatch(/\(01\) GTIN is complete, but "2" after it/);
    expect(failure(`01123456789012345${GS}991234`).code).toBe("DATA_AFTER_END");
  });

  it("(37) with (01) [TF6: (37) allowed only with (00) and (02), not with (01)]", () => {
    const e = failure("(01)12345678901231(37)12");
    expect(e).toMatchObject({ code: "NOT_ALLOWED_TOGETHER", ai: "37" });
    expect(e.message).toMatch(/never with \(01\)/);
  });

  it("(02) with (01) [GS1 Syntax Dictionary: 01 ex=02] (constructed)", () => {
    expect(failure("(01)12345678901231(02)10614141000415")).toMatchObject({ code: "NOT_ALLOWED_TOGETHER", ai: "02" });
  });

  it("the same AI twice with different values; the same value twice is fine [GSE-AI test_ai_validateAIassociations, (400) repeats]", () => {
    expect(parse("(400)ABC(400)ABC").other).toEqual({ "400": "ABC" });
    expect(failure("(400)ABC(400)ABCD")).toMatchObject({ code: "DUPLICATE_AI", ai: "400" });
  });

  it("an empty scan, only separators, only whitespace (constructed)", () => {
    expect(failure("").code).toBe("EMPTY");
    expect(failure("  \r\n").code).toBe("EMPTY");
    expect(failure(`${GS}${GS}`).code).toBe("EMPTY");
  });

  it("a lot over 20 characters, a control character, a space [GS1 Syntax Dictionary: 10 X..20, CSET 82]", () => {
    expect(failure(`10${"A".repeat(21)}`)).toMatchObject({ code: "TOO_LONG", ai: "10" });
    expect(failure("(10)AB\u0007C")).toMatchObject({ code: "INVALID_CHARACTER", ai: "10" });
    expect(failure(`0112345678901231` + `10AB C`)).toMatchObject({ code: "INVALID_CHARACTER", ai: "10" });
    expect(failure(`99~ABC`)).toMatchObject({ code: "INVALID_CHARACTER", ai: "99" }); // [GSE-AI ^99~ABC: bad CSET82 character]
  });

  it("data that does not begin with an AI (constructed)", () => {
    expect(failure("LOT12345")).toMatchObject({ code: "NO_AI", ai: null });
  });
});
