// Casing for a batch: metres, put-ups to open, links (lib/casing/calculate.ts).
// Check values and their sources:
// - 32/35 mm hog hank holds 45 kg of filling, a hank is 91.44 m: trade-facts §4 (capacity table
//   [practice], hank = 100 yd, 1 yd = 0.9144 m exactly, NIST SP 811).
// - beef rounds 35-38 mm, 30 kg per 30 m set: trade-facts §4 [sec].
// - cylinder geometry checked against mathjs 14.9.1 (a general-purpose unit library; binary floats,
//   so compared at a relative tolerance of 1e-12) and against the closed form by hand.
// - the US rule of thumb "a 32-35 mm hog hank holds about 100-125 lb" (trade-facts §4 [practice]):
//   the 45 kg planning default sits just under it (45 kg = 99.2 lb), as a conservative default should.
import { evaluate } from "mathjs";
import { describe, expect, it } from "vitest";
import { defaultCapacityKg } from "@/lib/casing/capacity";
import { casingNeed, CasingInputError, DEFAULT_DENSITY_G_PER_CM3, DEFAULT_FILL_FACTOR, kgPerMetre } from "@/lib/casing/calculate";
import { HANK_METRES } from "@/lib/casing/put-ups";
import { convert, dec } from "@/lib/units";

const hogHank = { kind: "capacity" as const, capacityKg: "45", putUpMetres: HANK_METRES, source: "table" };

describe("natural casings by capacity per put-up (trade-facts §4)", () => {
  it("plans 90 kg of filling in 32/35 mm hog casing as exactly 2 hanks, 182.88 m", () => {
    expect(defaultCapacityKg({ casingKind: "natural_hog", putUp: "hank", calibreMinMm: "32" })).toBe("45");
    const need = casingNeed("90", hogHank);
    expect(need.putUps!.toString()).toBe("2");
    expect(need.putUpsToOpen).toBe(2);
    expect(need.metres.toString()).toBe("182.88");
  });

  it("opens a whole third hank for 90.001 kg (put-ups round up)", () => {
    const need = casingNeed("90.001", hogHank);
    expect(need.putUpsToOpen).toBe(3);
    expect(need.putUps!.gt(2)).toBe(true);
  });

  it("keeps metres exact: 10 kg in a hog hank is 10/45 x 91.44 m = 20.32 m", () => {
    expect(casingNeed("10", hogHank).metres.toString()).toBe("20.32");
  });

  it("plans beef rounds 35-38 mm at 30 kg per 30 m set: 1 kg per metre", () => {
    const rounds = { kind: "capacity" as const, capacityKg: defaultCapacityKg({ casingKind: "natural_beef", putUp: "beef_set", calibreMinMm: "36", putUpMetres: "30" })!, putUpMetres: "30", source: "table" };
    expect(rounds.capacityKg).toBe("30");
    const need = casingNeed("75", rounds);
    expect(need.metres.toString()).toBe("75");
    expect(need.putUpsToOpen).toBe(3);
  });

  it("the 45 kg default stays at or under the US rule of thumb of 100-125 lb a hank (common practice)", () => {
    const lb = convert("45", "kg", "lb");
    expect(lb.lt(100)).toBe(true);
    expect(lb.gt(99)).toBe(true);
  });
});

describe("manufactured casings by cylinder (trade-facts §4 geometry)", () => {
  it("matches mathjs for a 21 mm collagen casing at the default density and fill factor", () => {
    const ours = kgPerMetre({ kind: "cylinder", calibreMm: "21" });
    const ref = evaluate(`${DEFAULT_DENSITY_G_PER_CM3} g/cm^3 * pi * (21 mm / 2)^2 * 1 m * ${DEFAULT_FILL_FACTOR}`).toNumber("kg");
    expect(Math.abs(ours.toNumber() - ref) / ref).toBeLessThan(1e-12);
  });

  it("matches mathjs at other calibres, densities and fill factors", () => {
    for (const [mm, rho, fill] of [["16", "1.01", "0.85"], ["38", "1.05", "1"], ["60", "1.03", "0.9"]] as const) {
      const ours = kgPerMetre({ kind: "cylinder", calibreMm: mm, densityGPerCm3: rho, fillFactor: fill });
      const ref = evaluate(`${rho} g/cm^3 * pi * (${mm} mm / 2)^2 * 1 m * ${fill}`).toNumber("kg");
      expect(Math.abs(ours.toNumber() - ref) / ref).toBeLessThan(1e-12);
    }
  });

  it("by hand: a 20 mm ideal cylinder (fill 1) of 1.03 g/cm^3 meat holds 323.584 g a metre", () => {
    // hand check: r = 1 cm, pi x 1 x 100 = 314.159265... cm^3 per metre, x 1.03 = 323.584 g
    const perMetre = kgPerMetre({ kind: "cylinder", calibreMm: "20", fillFactor: "1" });
    expect(perMetre.toDecimalPlaces(6).toString()).toBe("0.323584");
  });

  it("counts whole put-ups for a strand-stocked casing", () => {
    const need = casingNeed("50", { kind: "cylinder", calibreMm: "26", putUpMetres: "50" });
    expect(need.putUps!.toNumber()).toBeCloseTo(need.metres.toNumber() / 50, 12);
    expect(need.putUpsToOpen).toBe(need.putUps!.ceil().toNumber());
  });

  it("refuses a fill factor over 1 and a zero calibre, naming the field", () => {
    expect(() => kgPerMetre({ kind: "cylinder", calibreMm: "21", fillFactor: "1.1" })).toThrow(CasingInputError);
    try {
      kgPerMetre({ kind: "cylinder", calibreMm: "0" });
    } catch (e) {
      expect((e as CasingInputError).field).toBe("calibreMm");
    }
    expect(() => kgPerMetre({ kind: "cylinder", calibreMm: "0" })).toThrow(/calibre/i);
  });
});

describe("links", () => {
  it("makes 900 links of 100 g from 90 kg, nothing left over", () => {
    const need = casingNeed("90", hogHank, { by: "weight", grams: "100" });
    expect(need.links!.count).toBe(900);
    expect(need.links!.leftoverGrams.toString()).toBe("0");
    // 100 g in a hog hank holding 45 kg over 91.44 m: 0.2032 m a link
    expect(need.links!.metresPerLink.toString()).toBe("0.2032");
  });

  it("rounds links down and reports the part-link left over", () => {
    const need = casingNeed("10.05", hogHank, { by: "weight", grams: "100" });
    expect(need.links!.count).toBe(100);
    expect(need.links!.leftoverGrams.toString()).toBe("50");
  });

  it("derives link weight from link length: 15 cm links in a hog hank weigh 15/91.44 x 45 kg", () => {
    const need = casingNeed("90", hogHank, { by: "length", metres: "0.15" });
    expect(need.links!.gramsPerLink.toString()).toBe(dec("0.15").times(45000).div("91.44").toString());
    expect(need.links!.count).toBe(dec("182.88").div("0.15").floor().toNumber());
  });

  it("refuses a zero filling and a zero link, naming the field", () => {
    expect(() => casingNeed("0", hogHank)).toThrow(expect.objectContaining({ field: "fillingMass" }));
    expect(() => casingNeed("1", hogHank, { by: "length", metres: "0" })).toThrow(expect.objectContaining({ field: "link.length" }));
  });
});
