// Default stuffing capacity per natural casing put-up.
// Source of every check value: natural casing trade association tables as reproduced in
// trade-facts §4; [practice] for hog and sheep hanks (a trade table as reproduced by an exporter),
// [sec] for beef rounds and middles. Bands are half-open [low, high) and chosen by the calibre's
// LOWER bound; the default is the LOWER bound of the band's capacity (trade-facts §4).
import { describe, expect, it } from "vitest";
import { CAPACITY_TABLES, capacityTableFor, defaultCapacityKg } from "@/lib/casing/capacity";
import { HANK_METRES } from "@/lib/casing/put-ups";

const hog = (calibreMinMm: string, putUpMetres?: string) => defaultCapacityKg({ casingKind: "natural_hog", putUp: "hank", calibreMinMm, putUpMetres });
const sheep = (calibreMinMm: string) => defaultCapacityKg({ casingKind: "natural_sheep", putUp: "hank", calibreMinMm });
const beef = (calibreMinMm: string, putUpMetres: string) => defaultCapacityKg({ casingKind: "natural_beef", putUp: "beef_set", calibreMinMm, putUpMetres });

describe("hog hanks [practice: trade table as reproduced by an exporter, trade-facts §4]", () => {
  it("gives 45 kg for a 32/35 mm hog hank: the 32-34 band, lower bound of 45-48 kg", () => {
    expect(hog("32")).toBe("45");
  });

  it("reads each band's lower capacity: 30-32 41, 32-34 45, 34-36 48, 36-38 52 kg", () => {
    expect(hog("30")).toBe("41");
    expect(hog("34")).toBe("48");
    expect(hog("36")).toBe("52");
  });

  it("uses half-open bands chosen by the lower calibre", () => {
    expect(hog("31.99")).toBe("41");
    expect(hog("32.00")).toBe("45");
    expect(hog("33.5")).toBe("45");
    expect(hog("37.99")).toBe("52");
  });

  it("has no default outside the table (the person enters it)", () => {
    expect(hog("29.99")).toBeUndefined();
    expect(hog("38")).toBeUndefined();
    expect(hog("42")).toBeUndefined();
  });

  it("reads the table for the nominal 91.44 m hank (100 yd) and hanks within the 88-92 m tolerance", () => {
    expect(HANK_METRES).toBe("91.44");
    expect(hog("32", "91.44")).toBe("45");
    expect(hog("32", "91")).toBe("45");
    expect(hog("32", "88")).toBe("45");
    // a half hank is not what the table describes
    expect(hog("32", "45.72")).toBeUndefined();
  });
});

describe("sheep hanks [practice, trade-facts §4]", () => {
  it("20-22 mm 21 kg, 22-24 mm 25 kg", () => {
    expect(sheep("20")).toBe("21");
    expect(sheep("21.5")).toBe("21");
    expect(sheep("22")).toBe("25");
  });

  it("has no default outside 20-24 mm", () => {
    expect(sheep("18")).toBeUndefined();
    expect(sheep("24")).toBeUndefined();
  });
});

describe("beef sets [sec: natural casing trade association tables, trade-facts §4]", () => {
  it("rounds per 30 m set: 35-38 30, 38-40 33, 40-43 36, 43-46 39 kg", () => {
    expect(beef("35", "30")).toBe("30");
    expect(beef("38", "30")).toBe("33");
    expect(beef("40", "30")).toBe("36");
    expect(beef("43", "30")).toBe("39");
    expect(beef("45", "30")).toBe("39");
    expect(beef("46", "30")).toBeUndefined();
  });

  it("middles per 18 m: 45-50 29, 50-55 32, 55-60 36 kg", () => {
    expect(beef("45", "18")).toBe("29");
    expect(beef("50", "18")).toBe("32");
    expect(beef("55", "18")).toBe("36");
    expect(beef("60", "18")).toBeUndefined();
  });

  it("has no default for sets of other lengths or without a length", () => {
    expect(beef("40", "9")).toBeUndefined();
    expect(beef("40", "18")).toBeUndefined(); // an 18 m set of rounds: not tabled
    expect(defaultCapacityKg({ casingKind: "natural_beef", putUp: "beef_set", calibreMinMm: "40" })).toBeUndefined();
    expect(beef("40", "30.000")).toBe("36");
  });
});

describe("what the table does not cover", () => {
  it("has no default for manufactured casings, strands, boxes or no put-up", () => {
    expect(defaultCapacityKg({ casingKind: "collagen", putUp: "stick", calibreMinMm: "32", putUpMetres: "15" })).toBeUndefined();
    expect(defaultCapacityKg({ casingKind: "natural_hog", putUp: "tubed_strand", calibreMinMm: "32", putUpMetres: "10" })).toBeUndefined();
    expect(defaultCapacityKg({ casingKind: "natural_hog", putUp: "box", calibreMinMm: "32", putUpMetres: "91.44" })).toBeUndefined();
    expect(defaultCapacityKg({ casingKind: "natural_hog", putUp: null, calibreMinMm: "32" })).toBeUndefined();
    expect(capacityTableFor({ casingKind: "natural_sheep", putUp: "beef_set", putUpMetres: "30" })).toBeUndefined();
  });

  it("keeps every band half-open, ascending and contiguous, with low <= high capacity", () => {
    for (const t of CAPACITY_TABLES) {
      t.bands.forEach((b, i) => {
        expect(Number(b.fromMm)).toBeLessThan(Number(b.toMm));
        expect(Number(b.kg)).toBeLessThanOrEqual(Number(b.kgHigh));
        if (i > 0) expect(b.fromMm).toBe(t.bands[i - 1]!.toMm);
      });
    }
  });
});
