// The cure calculator's arithmetic and checks (lib/cure), against trade-facts §1-3 with each
// check value's source named beside it. Tags as trade-facts: [pub] read in a published primary
// source, [sec] a secondary source quoting one, [calc] derived here from sourced definitions.
// Limits: 9 CFR 424.21(c) and 424.22(b) as quoted from the eCFR (see lib/cure/limits.ts, read
// 2026-12-02); Regulation (EU) 2023/2108 figures are unverified (not read in the annex text).
import { describe, expect, it } from "vitest";
import {
  calculateCure, CLASS_LABELS, CureInputError, LIMITS, POTASSIUM_NITRITE_FACTOR,
  type CureCalculationRequest, type CureLine,
} from "@/lib/cure";
import { dec } from "@/lib/units";

const CURE_625: Omit<CureLine, "quantity"> = { nitriteFraction: "0.0625" }; // the common pink cure, 6.25 % sodium nitrite [practice]
const NANO2: Omit<CureLine, "quantity"> = { nitriteFraction: "1" }; // sodium nitrite itself

const g = (quantity: string, unit = "g") => ({ quantity, unit });
const calc = (req: Partial<CureCalculationRequest> & Pick<CureCalculationRequest, "method">, opts: { scaleResolutionG?: string; includeUnverified?: boolean } = {}) =>
  calculateCure({ table: "us", meatBlock: g("1000"), cures: [], ...req }, { scaleResolutionG: opts.scaleResolutionG ?? "0.1", includeUnverified: opts.includeUnverified });
const check = (r: ReturnType<typeof calc>, id: string) => {
  const c = r.checks.find((x) => x.id === id);
  if (!c) throw new Error(`no check ${id} in ${r.checks.map((x) => x.id).join(", ")}`);
  return c;
};
const fieldOf = (f: () => unknown) => {
  try {
    f();
  } catch (e) {
    if (e instanceof CureInputError) return e.field;
    throw e;
  }
  throw new Error("no CureInputError");
};

describe("ingoing nitrite, FSIS method (FSIS Directive 7620.3 ch. 3 via trade-facts §3)", () => {
  it("100 lb meat + 0.25 lb of a 6.25 % cure, comminuted: 156.25 ppm, within the 156.25 maximum (9 CFR 424.21(c)) [calc]", () => {
    const r = calc({ method: "comminuted", meatBlock: g("100", "lb"), cures: [{ ...CURE_625, ...g("0.25", "lb") }] });
    expect(r.nitritePpm).toBe("156.2500");
    const max = check(r, "us-nitrite-comminuted");
    expect(max).toMatchObject({ kind: "max", limitPpm: "156.25", ppm: "156.2500", deviationPpm: "+0.0000", within: true, severity: "block", table: "us" });
    expect(max.citation).toMatchObject({ regulation: "9 CFR 424.21(c)", readOn: "2026-12-02" });
    expect(max.citation.entry).toMatch(/1\/4 oz to 100 lb chopped meat/);
    expect(r.blocked).toBe(false);
  });

  it("2.5 g/kg of a 6.25 % cure is 156.25 ppm, within the comminuted maximum, never compared with a truncated 156 (trade-facts §1 [calc], 9 CFR 424.21(c))", () => {
    const r = calc({ method: "comminuted", meatBlock: g("1", "kg"), cures: [{ ...CURE_625, ...g("2.5") }] });
    expect(r.nitritePpm).toBe("156.2500");
    expect(check(r, "us-nitrite-comminuted").within).toBe(true);
  });

  it("5,000 g meat with 1.0 g sodium nitrite is 200 ppm; with 0.75 g 150 ppm (FSIS Directive 7620.3 via trade-facts §3 [sec])", () => {
    expect(calc({ method: "comminuted", table: "none", meatBlock: g("5000"), cures: [{ ...NANO2, ...g("1.0") }] }).nitritePpm).toBe("200.0000");
    expect(calc({ method: "comminuted", table: "none", meatBlock: g("5000"), cures: [{ ...NANO2, ...g("0.75") }] }).nitritePpm).toBe("150.0000");
  });

  it("1,000 g meat with 30 g of a 0.6 % nitrite curing salt is 180 ppm (trade-facts §3 [sec])", () => {
    const r = calc({ method: "comminuted", table: "none", meatBlock: g("1000"), cures: [{ nitriteFraction: "0.006", ...g("30") }] });
    expect(r.nitritePpm).toBe("180.0000");
  });

  it("pumped: 2 lb sodium nitrite in 1,000 lb pickle at 10 % pump is 200 ppm, within the 200 ppm pickle rate (trade-facts §3 [calc], 9 CFR 424.21(c))", () => {
    const r = calc({ method: "pumped", meatBlock: g("500", "lb"), pickle: g("1000", "lb"), pumpFraction: "0.1", cures: [{ ...NANO2, ...g("2", "lb") }] });
    expect(r.nitritePpm).toBe("200.0000");
    expect(check(r, "us-nitrite-pickle")).toMatchObject({ limitPpm: "200", within: true });
  });

  it("immersion: nitrite x 1,000,000 / (meat block + pickle) (trade-facts §3 [sec])", () => {
    const r = calc({ method: "immersion", meatBlock: g("1000"), pickle: g("1000"), cures: [{ ...NANO2, ...g("0.4") }] });
    expect(r.nitritePpm).toBe("200.0000");
  });

  it("adds several cures up, and counts nitrate on its own chart row (9 CFR 424.21(c): 2 3/4 oz to 100 lb chopped = 1718.75 ppm [calc])", () => {
    // a nitrite/nitrate cure of 6.25 % nitrite and 4 % nitrate (trade-facts §1 [practice]) plus the pink cure
    const r = calc({ method: "comminuted", meatBlock: g("2", "kg"), cures: [{ ...CURE_625, ...g("2.5") }, { nitriteFraction: "0.0625", nitrateFraction: "0.04", ...g("2.5") }] });
    expect(r.nitritePpm).toBe("156.2500"); // 5 g x 0.0625 / 2 kg
    expect(r.nitratePpm).toBe("50.0000"); // 2.5 g x 0.04 / 2 kg
    expect(check(r, "us-nitrate-comminuted")).toMatchObject({ limitPpm: "1718.75", within: true });
  });

  it("blocks over a statutory maximum, and shows a deviation that never rounds to zero", () => {
    const r = calc({ method: "comminuted", meatBlock: g("1000"), cures: [{ ...NANO2, ...g("0.15625001") }] });
    const max = check(r, "us-nitrite-comminuted");
    expect(max.within).toBe(false);
    expect(max.deviationPpm).toBe("+0.0001"); // exactly +0.00001 ppm over
    expect(r.blocked).toBe(true);
  });

  it("reads the dry cure (1 oz to 100 lb = 625 ppm) and the nitrate rates (3 1/2 oz = 2187.5, pickle 700) from the chart (9 CFR 424.21(c) [calc])", () => {
    const r = calc({ method: "dry", meatBlock: g("100", "lb"), cures: [{ ...NANO2, ...g("1", "oz") }] });
    expect(r.nitritePpm).toBe("625.0000");
    expect(check(r, "us-nitrite-dry-cured")).toMatchObject({ limitPpm: "625", within: true });
    expect(check(r, "us-nitrate-dry-cured").limitPpm).toBe("2187.5");
    expect(check(calc({ method: "immersion", pickle: g("1000"), cures: [{ ...NANO2, ...g("0.1") }] }), "us-nitrate-pickle").limitPpm).toBe("700");
  });
});

describe("product classes (trade-facts §2)", () => {
  it("classifies a dry or fermented sausage as comminuted, never dry cured", () => {
    expect(CLASS_LABELS.comminuted).toMatch(/dry and fermented sausages included/);
    expect(fieldOf(() => calc({ method: "comminuted", productClass: "dry_cured", cures: [{ ...CURE_625, ...g("2.5") }] }))).toBe("productClass");
    // a salami's cure is mixed into the chopped meat: the 156.25 ppm maximum applies, not 625
    const salami = calc({ method: "comminuted", productClass: "comminuted", storage: "shelf_stable", cures: [{ nitriteFraction: "0.0625", nitrateFraction: "0.04", ...g("2.5") }] });
    expect(salami.checks.filter((c) => c.substance === "nitrite").map((c) => c.limitPpm)).toEqual(["156.25"]);
  });

  it("takes the class from the method when none is given", () => {
    expect(calc({ method: "dry", cures: [{ ...CURE_625, ...g("2.5") }] }).productClass).toBe("dry_cured");
  });
});

describe("minimum and required levels warn; they never block", () => {
  it("warns under the 120 ppm floor for keep-refrigerated products (FSIS policy via trade-facts §2 [sec])", () => {
    const r = calc({ method: "comminuted", storage: "keep_refrigerated", cures: [{ ...CURE_625, ...g("1.5") }] });
    expect(r.nitritePpm).toBe("93.7500");
    expect(check(r, "us-keep-refrigerated-min")).toMatchObject({ kind: "min", limitPpm: "120", within: false, severity: "warn", deviationPpm: "-26.2500", verified: false });
    expect(r.blocked).toBe(false);
    expect(r.warnings).toBe(1);
    // shelf stable: no floor; storage left out: not checked, and the notes say so
    expect(calc({ method: "comminuted", storage: "shelf_stable", cures: [{ ...CURE_625, ...g("1.5") }] }).checks.some((c) => c.kind === "min")).toBe(false);
    expect(calc({ method: "comminuted", cures: [{ ...CURE_625, ...g("1.5") }] }).notes.join(" ")).toMatch(/keep-refrigerated products was not checked/);
  });

  const bacon = (grams: string) =>
    calc({ method: "pumped", productClass: "bacon_pumped", storage: "keep_refrigerated", pickle: g("1000"), pumpFraction: "0.1", cures: [{ ...NANO2, ...g(grams) }] });

  it("pumped bacon: 120 ppm is the required level, within (9 CFR 424.22(b)(1) [pub via eCFR quote])", () => {
    const r = bacon("1.2"); // 1.2 g x 0.1 x 1,000,000 / 1,000 g = 120 ppm
    expect(r.nitritePpm).toBe("120.0000");
    expect(check(r, "us-bacon-pumped-120")).toMatchObject({ kind: "target", limitPpm: "120", within: true, severity: "warn", groupMet: true, conditions: expect.stringMatching(/550 ppm sodium ascorbate or sodium erythorbate/) });
    expect(check(r, "us-bacon-pumped-max").within).toBe(true);
    expect(r.warnings).toBe(0);
    expect(r.checks.some((c) => c.substance === "nitrate" && c.limitPpm === "0")).toBe(true); // no nitrate in bacon
  });

  it("pumped bacon: an alternative (100 ppm) is an entry of its own, not a failure of the 120 ppm entry", () => {
    const r = bacon("1.0");
    expect(check(r, "us-bacon-pumped-120")).toMatchObject({ within: false, deviationPpm: "-20.0000", groupMet: true });
    expect(check(r, "us-bacon-pumped-100")).toMatchObject({ within: true, limitPpm: "100" });
    expect(check(r, "us-bacon-pumped-40-80")).toMatchObject({ limitPpm: "60", tolerancePpm: "20", within: false });
    // the keep-refrigerated floor still warns at 100 ppm; the bacon level does not
    expect(r.warnings).toBe(1);
    expect(r.blocked).toBe(false);
  });

  it("pumped bacon: 40 to 80 ppm (with sucrose and a lactic culture) meets the level; 90 ppm meets none and warns once", () => {
    expect(check(bacon("0.6"), "us-bacon-pumped-40-80").within).toBe(true);
    const r = calc({ method: "pumped", productClass: "bacon_pumped", storage: "shelf_stable", pickle: g("1000"), pumpFraction: "0.1", cures: [{ ...NANO2, ...g("0.9") }] });
    expect(r.checks.filter((c) => c.group).every((c) => c.groupMet === false)).toBe(true);
    expect(r.warnings).toBe(1);
    expect(r.blocked).toBe(false);
  });

  it("pumped bacon above 120 ppm is over the paragraph's level and blocks", () => {
    const r = bacon("1.5");
    expect(check(r, "us-bacon-pumped-max")).toMatchObject({ within: false, severity: "block" });
    expect(r.blocked).toBe(true);
  });

  it("bacon: nitrate is not allowed (9 CFR 424.21(c): nitrate for cured meat products other than bacon)", () => {
    const r = calc({ method: "dry", productClass: "bacon_dry", cures: [{ nitriteFraction: "0.0625", nitrateFraction: "0.04", ...g("2.5") }] });
    expect(check(r, "us-nitrate-bacon")).toMatchObject({ limitPpm: "0", within: false, severity: "block" });
    expect(r.blocked).toBe(true);
  });
});

describe("potassium nitrite (trade-facts §2 [sec/calc]: 1.2335 x sodium, truncated)", () => {
  it("prints the regulation's potassium figures as 1.2335 x the sodium figure, truncated: 120 -> 148, 100 -> 123, 200 -> 246", () => {
    for (const id of ["us-bacon-pumped-120", "us-bacon-pumped-100", "us-bacon-immersion", "us-bacon-dry"]) {
      const e = LIMITS.find((l) => l.id === id)!;
      expect(e.potassium!.ppm, id).toBe(dec(e.sodium.ppm).times(POTASSIUM_NITRITE_FACTOR).floor().toString());
    }
    expect(LIMITS.find((l) => l.id === "us-bacon-dry")!.potassium!.ppm).toBe("246");
  });

  it("checks a potassium nitrite cure against the potassium figure: 246 ppm within dry-cured bacon's 246, 247 ppm blocks", () => {
    const kno2 = (grams: string) => calc({ method: "dry", productClass: "bacon_dry", cures: [{ nitriteFraction: "1", nitriteSalt: "potassium", ...g(grams) }] });
    const ok = kno2("0.246");
    expect(check(ok, "us-bacon-dry")).toMatchObject({ salt: "potassium", limitPpm: "246", ppm: "246.0000", within: true });
    expect(ok.nitriteBySalt).toEqual({ sodium: "0.0000", potassium: "246.0000" });
    expect(ok.nitritePpm).toBe("199.4325"); // as sodium nitrite: 246 / 1.2335
    expect(kno2("0.247").blocked).toBe(true);
  });

  it("keeps the chart's 'sodium or potassium nitrite' rows at one figure (1/4 oz to 100 lb of either salt)", () => {
    const r = calc({ method: "comminuted", cures: [{ nitriteFraction: "1", nitriteSalt: "potassium", ...g("0.15625") }] });
    expect(check(r, "us-nitrite-comminuted")).toMatchObject({ salt: "potassium", limitPpm: "156.25", within: true });
  });
});

describe("the cure for a target ppm, rounded to the scale toward compliance (trade-facts §2)", () => {
  it("120 ppm with a 6.25 % cure needs 1.92 g per kg (trade-facts §3 [calc])", () => {
    const r = calc({ method: "comminuted", targetNitritePpm: "120", cures: [{ ...CURE_625 }] }, { scaleResolutionG: "0.01" });
    expect(r.requiredCure).toMatchObject({ quantity: "1.92", exactQuantity: "1.92", rounding: "exact", unit: "g" });
    expect(r.nitritePpm).toBe("120.0000");
  });

  it("200 ppm with a 6.25 % cure needs 3.2 g per kg (trade-facts §3 [calc]); dry cure, within 625", () => {
    const r = calc({ method: "dry", targetNitritePpm: "200", cures: [{ ...CURE_625 }] });
    expect(r.requiredCure).toMatchObject({ quantity: "3.2", exactQuantity: "3.2", rounding: "exact" });
    expect(check(r, "us-nitrite-dry-cured").within).toBe(true);
  });

  it("rounds down under a maximum at 0.1 g and decides the verdict on the rounded amount", () => {
    // 9,450 g at 156.25 ppm needs exactly 23.625 g; 23.7 g would be 156.75 ppm, over the maximum
    const r = calc({ method: "comminuted", meatBlock: g("9450"), targetNitritePpm: "156.25", cures: [{ ...CURE_625 }] });
    expect(r.requiredCure).toMatchObject({ quantity: "23.6", exactQuantity: "23.625", rounding: "down", scaleResolutionG: "0.1" });
    expect(r.nitritePpm).toBe("156.0847"); // 23.6 x 0.0625 x 1,000,000 / 9,450
    expect(check(r, "us-nitrite-comminuted").within).toBe(true);
    expect(r.blocked).toBe(false);
  });

  it("rounds up over a minimum: 120 ppm keep-refrigerated at 0.1 g is 2.0 g (125 ppm), not 1.9 g (118.75 ppm, under the floor)", () => {
    const r = calc({ method: "comminuted", storage: "keep_refrigerated", targetNitritePpm: "120", cures: [{ ...CURE_625 }] });
    expect(r.requiredCure).toMatchObject({ quantity: "2", rounding: "up" });
    expect(r.nitritePpm).toBe("125.0000");
    expect(check(r, "us-keep-refrigerated-min").within).toBe(true);
    // shelf stable there is no floor: the tie goes down, to less nitrite
    expect(calc({ method: "comminuted", storage: "shelf_stable", targetNitritePpm: "120", cures: [{ ...CURE_625 }] }).requiredCure).toMatchObject({ quantity: "1.9", rounding: "down" });
  });

  it("takes a maximum over a minimum when both bind: immersion bacon at 120 ppm rounds down", () => {
    const r = calc({ method: "immersion", productClass: "bacon_immersion", storage: "keep_refrigerated", meatBlock: g("1000"), pickle: g("1000"), targetNitritePpm: "120", cures: [{ nitriteFraction: "0.0625" }] });
    // exact 3.84 g; resolution 0.1: 3.8 g (118.75 ppm, warns under the floor) rather than 3.9 g (over 120, blocks)
    expect(r.requiredCure).toMatchObject({ quantity: "3.8", exactQuantity: "3.84", rounding: "down" });
    expect(r.blocked).toBe(false);
    expect(r.warnings).toBe(1);
  });
});

describe("tables", () => {
  it("none: no check, nothing blocked, and the notes say so", () => {
    const r = calc({ method: "comminuted", table: "none", cures: [{ ...NANO2, ...g("1") }] });
    expect(r.checks).toEqual([]);
    expect(r.blocked).toBe(false);
    expect(r.notes.join(" ")).toMatch(/no regulatory check was made/);
  });

  it("eu needs the batch mass (EU figures are per kg of the whole batch)", () => {
    expect(fieldOf(() => calc({ method: "comminuted", table: "eu", cures: [{ ...CURE_625, ...g("2.5") }] }))).toBe("batchMass");
    expect(fieldOf(() => calc({ method: "comminuted", table: "eu", batchMass: g("900"), cures: [{ ...CURE_625, ...g("2.5") }] }))).toBe("batchMass.quantity");
  });

  it("eu: figures not read in the annex text are unverified and off by default; nothing is checked or blocked, and the notes say why", () => {
    const r = calc({ method: "comminuted", table: "eu", batchMass: g("1100"), heatTreatment: "not_heat_treated", cures: [{ ...CURE_625, ...g("2.5") }] });
    expect(r.checks).toEqual([]);
    expect(r.blocked).toBe(false);
    expect(r.notes.join(" ")).toMatch(/unverified and were not applied/);
    // NaNO2 x 0.67 = NO2- (Regulation (EU) 2023/2108 recitals via trade-facts §2): 0.15625 g x 0.67 / 1.1 kg
    expect(r.euIonsMgPerKg).toEqual({ nitrite: "95.1705", nitrate: "0.0000" });
  });

  it("eu, asked for the unverified figures: checks 08.3.1 against its cited annex entry, as the ion per kg of batch, and only warns", () => {
    // Regulation (EC) 1333/2008 Annex II as amended by Regulation (EU) 2023/2108, category 08.3.1,
    // E 249-250: 80 mg/kg as NO2- [sec: a public research note; NOT read in the annex text]
    const r = calc({ method: "comminuted", table: "eu", batchMass: g("1100"), heatTreatment: "not_heat_treated", cures: [{ ...CURE_625, ...g("2.5") }] }, { includeUnverified: true });
    const eu = check(r, "eu-08.3.1-nitrite");
    expect(eu).toMatchObject({ table: "eu", basis: "batch_as_ion", limitPpm: "80", ppm: "95.1705", within: false, verified: false, severity: "warn" });
    expect(eu.citation.regulation).toMatch(/2023\/2108/);
    expect(eu.citation.entry).toMatch(/08\.3\.1, E 249-250/);
    expect(eu.citation.via).toMatch(/UNVERIFIED/);
    expect(r.blocked).toBe(false);
    const within = calc({ method: "comminuted", table: "eu", batchMass: g("1100"), heatTreatment: "not_heat_treated", cures: [{ ...CURE_625, ...g("2") }] }, { includeUnverified: true });
    expect(check(within, "eu-08.3.1-nitrite")).toMatchObject({ ppm: "76.1364", within: true }); // 0.125 g x 0.67 / 1.1 kg
  });

  it("every limit carries a citation with the regulation, the entry and the day it was read", () => {
    for (const l of LIMITS) {
      expect(l.citation.regulation, l.id).toBeTruthy();
      expect(l.citation.entry, l.id).toBeTruthy();
      expect(l.citation.readOn, l.id).toBe("2026-12-02");
      if (l.table === "eu") expect([l.verified, l.onByDefault], l.id).toEqual([false, false]);
    }
  });
});

describe("bad input", () => {
  it("names the field: a volume unit, an inverse cure with a quantity, a pump level with another method", () => {
    expect(fieldOf(() => calc({ method: "comminuted", meatBlock: g("1", "l"), cures: [{ ...CURE_625, ...g("2.5") }] }))).toBe("meatBlock.unit");
    expect(fieldOf(() => calc({ method: "comminuted", targetNitritePpm: "120", cures: [{ ...CURE_625, ...g("2.5") }] }))).toBe("cures.0.quantity");
    expect(fieldOf(() => calc({ method: "comminuted", pumpFraction: "0.1", cures: [{ ...CURE_625, ...g("2.5") }] }))).toBe("pumpFraction");
    expect(fieldOf(() => calc({ method: "comminuted", targetNitritePpm: "120", cures: [{ nitriteFraction: "0", nitrateFraction: "0.04" }] }))).toBe("cures.0.nitriteFraction");
    expect(fieldOf(() => calc({ method: "comminuted", cures: [{ nitriteFraction: "0.7", nitrateFraction: "0.4", ...g("1") }] }))).toBe("cures.0.nitrateFraction");
  });

  it("always returns the caution", () => {
    expect(calc({ method: "comminuted", cures: [{ ...CURE_625, ...g("2.5") }] }).caution).toMatch(/toxic in overdose.*labelled and apart.*HACCP plan and licensed practice govern/);
  });
});
