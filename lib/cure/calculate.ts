// Ingoing nitrite and nitrate of a cure formulation, the FSIS way (FSIS Directive 7620.3, chapter 3,
// via trade-facts §3), and its checks against the chosen table (./limits.ts). Pure, client-safe.
//
// - ppm is on the green weight of the meat block only (not water, spices, or finished weight):
//     comminuted, dry:  ppm = salt in the cure x 1,000,000 / meat block
//                       (dry: the cure quantity is the mix applied to that meat)
//     pumped:           ppm = salt in the pickle x pump fraction x 1,000,000 / pickle
//     immersion:        ppm = salt in the pickle x 1,000,000 / (meat block + pickle)
//   EU figures are mg per kg of the whole batch, as the ion (NaNO2 x 0.67, NaNO3 x 0.73).
// - Everything is exact (Dec, lib/units); verdicts ("within") are decided on exact values. Figures
//   are returned as decimal strings to 4 places, rounded half-even; deviations are rounded away from
//   zero, so a deviation never reads 0.0000 when the verdict says it is over or under.
// - A check is a maximum, a minimum or a required level (target). Only verified statutory maxima
//   block; minima and required levels warn with the deviation; alternatives of one required level
//   (bacon) are entries of their own, and meeting any one of them meets the level.
// - Inverse: with targetNitritePpm and one cure without quantity, the cure needed is rounded to the
//   kitchen scale's resolution toward compliance (down under a maximum, up over a minimum) and the
//   verdict is decided on the rounded amount (trade-facts §2).
import { convert, Dec, dec, plain, UnitError, ZERO } from "../units";
import { CURE_CAUTION } from "./caution";
import {
  CLASSES_BY_METHOD, DEFAULT_CLASS, ION_FACTORS, LIMITS, POTASSIUM_NITRITE_FACTOR,
  type CheckKind, type Citation, type CureMethod, type HeatTreatment, type LimitEntry, type ProductClass, type RegulatoryTable,
  type Salt, type Storage, type Substance,
} from "./limits";

/** A bad input found while calculating (a unit that is not a mass...): the caller answers 422 on `field`. */
export class CureInputError extends Error {
  constructor(
    readonly field: string,
    message: string,
  ) {
    super(message);
    this.name = "CureInputError";
  }
}

export interface MassAmount {
  quantity: string;
  unit: string;
}

export interface CureLine {
  /** absent only for the one cure of an inverse calculation */
  quantity?: string;
  unit?: string;
  /** sodium (or potassium) nitrite as a fraction of the cure's mass, from the label: 6.25 % is "0.0625" */
  nitriteFraction: string;
  nitrateFraction?: string;
  nitriteSalt?: Salt;
  nitrateSalt?: Salt;
  name?: string;
}

export interface CureCalculationRequest {
  method: CureMethod;
  productClass?: ProductClass;
  storage?: Storage;
  /** already resolved: the request's table or the company's */
  table: RegulatoryTable;
  meatBlock: MassAmount;
  cures: CureLine[];
  pickle?: MassAmount;
  pumpFraction?: string;
  batchMass?: MassAmount;
  heatTreatment?: HeatTreatment;
  targetNitritePpm?: string;
}

export interface CureCalculationOptions {
  /** kitchen scale resolution in grams (company setting, default 0.1) */
  scaleResolutionG: string;
  /** apply figures marked unverified (the EU entries); off unless asked for */
  includeUnverified?: boolean;
  /** how the request named its cures, for error paths: "cures" (cures.0.quantity) or "cure" (cure.quantity) */
  curesField?: "cures" | "cure";
}

export interface CureCheck {
  id: string;
  table: "us" | "eu";
  entry: string;
  productClass: ProductClass;
  substance: Substance;
  kind: CheckKind;
  /** the figure for the salt compared ("sodium", "potassium", or potassium counted as its sodium equivalent) */
  limitPpm: string;
  /** a range's half-width: within when |ppm - limitPpm| <= tolerancePpm */
  tolerancePpm?: string;
  /** this batch's value under this entry, 4 places */
  ppm: string;
  /** ppm - limitPpm, 4 places, rounded away from zero */
  deviationPpm: string;
  /** decided on exact values: max ppm <= limit, min ppm >= limit, target |ppm - limit| <= tolerance */
  within: boolean;
  /** what a miss does: a verified statutory maximum blocks; everything else warns */
  severity: "block" | "warn";
  salt: "sodium" | "potassium" | "sodium_equivalent" | "mixed";
  basis: "meat_block" | "batch_as_ion";
  verified: boolean;
  group?: string;
  /** for an alternative of a required level: whether any entry of its group is met */
  groupMet?: boolean;
  conditions?: string;
  /** how a potassium figure was derived when the text gives none */
  derived?: string;
  citation: Citation;
}

export interface RequiredCure {
  /** rounded to the scale resolution toward compliance, grams */
  quantity: string;
  unit: "g";
  /** before rounding, grams, 6 places half-even */
  exactQuantity: string;
  scaleResolutionG: string;
  rounding: "exact" | "down" | "up";
  targetNitritePpm: string;
}

export interface CureCalculation {
  method: CureMethod;
  productClass: ProductClass;
  table: RegulatoryTable;
  storage: Storage | null;
  meatBlockGrams: string;
  pickleGrams: string | null;
  batchGrams: string | null;
  /** ingoing nitrite, as sodium nitrite (potassium nitrite / 1.2335), on the meat block */
  nitritePpm: string;
  /** ingoing nitrate salts on the meat block (the chart's rows cover sodium or potassium alike) */
  nitratePpm: string;
  nitriteBySalt: { sodium: string; potassium: string };
  /** EU: mg per kg of the whole batch, as the ion; null without a batch mass (each null with potassium salts) */
  euIonsMgPerKg: { nitrite: string | null; nitrate: string | null } | null;
  requiredCure: RequiredCure | null;
  checks: CureCheck[];
  /** a verified statutory maximum is exceeded: this formulation must not be used */
  blocked: boolean;
  /** minima, required levels (with no alternative met) and unverified figures that were missed */
  warnings: number;
  notes: string[];
  caution: string;
}

const MILLION = new Dec(1_000_000);

const fmt4 = (d: Dec) => d.toDecimalPlaces(4, Dec.ROUND_HALF_EVEN).toFixed(4);
function fmtDeviation(d: Dec): string {
  const r = d.toDecimalPlaces(4, Dec.ROUND_UP);
  return `${r.isNegative() && !r.isZero() ? "" : "+"}${r.toFixed(4)}`;
}

function grams(amount: MassAmount, field: string): Dec {
  let g: Dec;
  try {
    g = convert(amount.quantity, amount.unit, "g");
  } catch (e) {
    if (e instanceof UnitError) {
      throw new CureInputError(e.code === "INVALID_NUMBER" ? `${field}.quantity` : `${field}.unit`, e.code === "WRONG_DIMENSION" ? "Use a mass unit: g, kg, oz or lb (weigh it: volumes of cure and pickle are unreliable)." : e.message);
    }
    throw e;
  }
  if (!g.isPositive() || g.isZero()) throw new CureInputError(`${field}.quantity`, "Must be more than zero.");
  return g;
}

interface Amounts {
  /** salt masses in grams */
  nitrite: Record<Salt, Dec>;
  nitrate: Record<Salt, Dec>;
}

interface Basis {
  meat: Dec;
  pickle: Dec | null;
  batch: Dec | null;
  /** ppm contributed by one gram of salt in the cure (or in the pickle) */
  ppmPerGram: Dec;
}

function basisOf(req: CureCalculationRequest): Basis {
  const meat = grams(req.meatBlock, "meatBlock");
  const pickle = req.pickle ? grams(req.pickle, "pickle") : null;
  const batch = req.batchMass ? grams(req.batchMass, "batchMass") : null;
  if (batch && batch.lt(meat)) throw new CureInputError("batchMass.quantity", "The whole batch cannot weigh less than its meat block.");
  let ppmPerGram: Dec;
  switch (req.method) {
    case "comminuted":
    case "dry":
      ppmPerGram = MILLION.div(meat);
      break;
    case "pumped": {
      if (!pickle) throw new CureInputError("pickle", "A pumped cure needs the pickle's weight.");
      if (!req.pumpFraction) throw new CureInputError("pumpFraction", "A pumped cure needs the pump level (10 % is 0.1).");
      const pump = dec(req.pumpFraction);
      if (!pump.isPositive() || pump.isZero() || pump.gt(1)) throw new CureInputError("pumpFraction", "The pump level is a fraction above 0 and at most 1 (10 % is 0.1).");
      ppmPerGram = pump.times(MILLION).div(pickle);
      break;
    }
    case "immersion":
      if (!pickle) throw new CureInputError("pickle", "An immersion cure needs the pickle's weight.");
      ppmPerGram = MILLION.div(meat.plus(pickle));
      break;
  }
  return { meat, pickle, batch, ppmPerGram };
}

function fraction(value: string | undefined, field: string): Dec {
  if (value === undefined) return ZERO;
  const f = dec(value);
  if (f.isNegative() || f.gt(1)) throw new CureInputError(field, "A fraction from 0 to 1 (6.25 % is 0.0625).");
  return f;
}

function amountsOf(lines: { grams: Dec; line: CureLine }[], curesField: string, multi: boolean): Amounts {
  const out: Amounts = { nitrite: { sodium: ZERO, potassium: ZERO }, nitrate: { sodium: ZERO, potassium: ZERO } };
  lines.forEach(({ grams: g, line }, i) => {
    const path = multi ? `${curesField}.${i}` : curesField;
    const nf = fraction(line.nitriteFraction, `${path}.nitriteFraction`);
    const nrf = fraction(line.nitrateFraction, `${path}.nitrateFraction`);
    if (nf.plus(nrf).gt(1)) throw new CureInputError(`${path}.nitrateFraction`, "Nitrite and nitrate together cannot be more than the whole cure (1).");
    const ns = line.nitriteSalt ?? "sodium";
    const ts = line.nitrateSalt ?? "sodium";
    out.nitrite[ns] = out.nitrite[ns].plus(g.times(nf));
    out.nitrate[ts] = out.nitrate[ts].plus(g.times(nrf));
  });
  return out;
}

interface Evaluated {
  nitriteNa: Dec;
  nitriteK: Dec;
  nitrateNa: Dec;
  nitrateK: Dec;
  ionNitrite: Dec | null;
  ionNitrate: Dec | null;
  checks: CureCheck[];
  blocked: boolean;
  warnings: number;
}

function entriesFor(req: CureCalculationRequest, productClass: ProductClass, includeUnverified: boolean): LimitEntry[] {
  if (req.table === "none") return [];
  return LIMITS.filter(
    (e) =>
      e.table === req.table &&
      e.productClasses.includes(productClass) &&
      (e.onByDefault || includeUnverified) &&
      (!e.storage || e.storage === req.storage) &&
      (!e.heatTreatment || e.heatTreatment === req.heatTreatment),
  );
}

function evaluate(amounts: Amounts, basis: Basis, entries: LimitEntry[], productClass: ProductClass): Evaluated {
  const ppm = (g: Dec) => g.times(basis.ppmPerGram);
  const nitriteNa = ppm(amounts.nitrite.sodium);
  const nitriteK = ppm(amounts.nitrite.potassium);
  const nitrateNa = ppm(amounts.nitrate.sodium);
  const nitrateK = ppm(amounts.nitrate.potassium);

  // EU: the salt that ends up in the product (ppm x meat block), as the ion, per kg of the batch.
  // No potassium factor was read, so potassium salts leave the ion figures undetermined.
  const inBatch = (p: Dec, factor: string) => (basis.batch ? p.times(basis.meat).div(basis.batch).times(factor) : null);
  const ionNitrite = nitriteK.isZero() ? inBatch(nitriteNa, ION_FACTORS.nitrite) : null;
  const ionNitrate = nitrateK.isZero() ? inBatch(nitrateNa, ION_FACTORS.nitrate) : null;

  const checks: CureCheck[] = [];
  for (const e of entries) {
    let value: Dec | null;
    let limit: Dec;
    let tolerance: Dec | undefined;
    let salt: CureCheck["salt"];
    let derived: string | undefined;
    if (e.basis === "batch_as_ion") {
      value = e.substance === "nitrite" ? ionNitrite : ionNitrate;
      limit = dec(e.sodium.ppm);
      tolerance = e.sodium.tolerance ? dec(e.sodium.tolerance) : undefined;
      salt = "sodium";
    } else if (e.substance === "nitrate") {
      // the chart's nitrate rows are "sodium or potassium nitrate" at one figure
      value = nitrateNa.plus(nitrateK);
      limit = dec(e.sodium.ppm);
      tolerance = e.sodium.tolerance ? dec(e.sodium.tolerance) : undefined;
      salt = nitrateK.isZero() ? "sodium" : nitrateNa.isZero() ? "potassium" : "mixed";
    } else {
      const na = e.sodium;
      const k = e.potassium ?? e.sodium;
      if (nitriteNa.isZero() && !nitriteK.isZero()) {
        value = nitriteK;
        limit = dec(k.ppm);
        tolerance = k.tolerance ? dec(k.tolerance) : undefined;
        salt = "potassium";
        derived = k.derived;
      } else if (nitriteK.isZero()) {
        value = nitriteNa;
        limit = dec(na.ppm);
        tolerance = na.tolerance ? dec(na.tolerance) : undefined;
        salt = "sodium";
      } else {
        // both salts: potassium counted at this entry's own sodium/potassium ratio
        const ratio = dec(k.ppm).isZero() ? dec("1") : dec(na.ppm).div(k.ppm);
        value = nitriteNa.plus(nitriteK.times(ratio));
        limit = dec(na.ppm);
        tolerance = na.tolerance ? dec(na.tolerance) : undefined;
        salt = "sodium_equivalent";
        derived = k.derived;
      }
    }
    if (value === null) continue; // an EU ion figure that could not be computed (said in the notes)
    const deviation = value.minus(limit);
    const within = e.kind === "max" ? value.lte(limit) : e.kind === "min" ? value.gte(limit) : deviation.abs().lte(tolerance ?? ZERO);
    checks.push({
      id: e.id, table: e.table, entry: e.entry, productClass, substance: e.substance, kind: e.kind,
      limitPpm: plain(limit), ...(tolerance ? { tolerancePpm: plain(tolerance) } : {}),
      ppm: fmt4(value), deviationPpm: fmtDeviation(deviation), within,
      severity: e.statutory && e.kind === "max" && e.verified ? "block" : "warn",
      salt, basis: e.basis, verified: e.verified,
      ...(e.group ? { group: e.group } : {}), ...(e.conditions ? { conditions: e.conditions } : {}), ...(derived ? { derived } : {}),
      citation: e.citation,
    });
  }
  const groupsMet = new Set(checks.filter((c) => c.group && c.within).map((c) => c.group));
  for (const c of checks) if (c.group) c.groupMet = groupsMet.has(c.group);
  const blocked = checks.some((c) => c.severity === "block" && !c.within);
  const missedGroups = new Set<string>();
  let warnings = 0;
  for (const c of checks) {
    if (c.within || c.severity === "block") continue;
    if (c.group) {
      if (!c.groupMet && !missedGroups.has(c.group)) {
        missedGroups.add(c.group);
        warnings++;
      }
    } else warnings++;
  }
  return { nitriteNa, nitriteK, nitrateNa, nitrateK, ionNitrite, ionNitrate, checks, blocked, warnings };
}

function requireProductClass(req: CureCalculationRequest): ProductClass {
  const productClass = req.productClass ?? DEFAULT_CLASS[req.method];
  if (!CLASSES_BY_METHOD[req.method].includes(productClass)) {
    throw new CureInputError(
      "productClass",
      req.method === "comminuted"
        ? "Chopped and ground products (dry and fermented sausages included) are comminuted: the chopped-meat limit applies."
        : `A ${req.method} cure makes ${CLASSES_BY_METHOD[req.method].join(" or ")} products.`,
    );
  }
  return productClass;
}

/** The calculation, its checks and the notes a person needs beside them. */
export function calculateCure(req: CureCalculationRequest, options: CureCalculationOptions): CureCalculation {
  const curesField = options.curesField ?? "cures";
  const multi = curesField === "cures";
  const productClass = requireProductClass(req);
  if (req.method !== "pumped" && req.pumpFraction !== undefined) throw new CureInputError("pumpFraction", "Only a pumped cure has a pump level.");
  if ((req.method === "comminuted" || req.method === "dry") && req.pickle) {
    throw new CureInputError("pickle", "Only pumped and immersion cures have a pickle; a dry cure's quantity is the mix applied to the meat.");
  }
  if (req.table === "eu" && !req.batchMass) {
    throw new CureInputError("batchMass", "EU limits are per kg of the whole batch: give the batch mass (meat plus everything added).");
  }
  if (req.cures.length === 0) throw new CureInputError(curesField, "Give at least one cure.");
  const basis = basisOf(req);
  const entries = entriesFor(req, productClass, options.includeUnverified ?? false);
  const pathOf = (i: number) => (multi ? `${curesField}.${i}` : curesField);

  let requiredCure: RequiredCure | null = null;
  let result: Evaluated;
  const notes: string[] = [];

  if (req.targetNitritePpm !== undefined) {
    if (req.cures.length !== 1) throw new CureInputError(curesField, "To find the cure for a target ppm, give exactly one cure, without a quantity.");
    const line = req.cures[0]!;
    if (line.quantity !== undefined) throw new CureInputError(`${pathOf(0)}.quantity`, "Leave the quantity out: it is what the calculator finds.");
    const target = dec(req.targetNitritePpm);
    if (!target.isPositive() || target.isZero()) throw new CureInputError("targetNitritePpm", "The target must be more than 0 ppm.");
    const nf = fraction(line.nitriteFraction, `${pathOf(0)}.nitriteFraction`);
    if (nf.isZero()) throw new CureInputError(`${pathOf(0)}.nitriteFraction`, "This cure carries no nitrite, so no quantity of it reaches a nitrite target.");
    const resolution = dec(options.scaleResolutionG);
    if (!resolution.isPositive() || resolution.isZero()) throw new CureInputError("scaleResolutionG", "The scale resolution must be more than 0 g.");
    const exact = target.div(nf.times(basis.ppmPerGram));
    const steps = exact.div(resolution);
    const down = steps.floor().times(resolution);
    const up = steps.ceil().times(resolution);
    const tryAmount = (g: Dec) => evaluate(amountsOf([{ grams: g, line }], curesField, multi), basis, entries, productClass);
    let chosen: Dec;
    let rounding: RequiredCure["rounding"];
    if (down.eq(up)) {
      chosen = down;
      rounding = "exact";
      result = tryAmount(chosen);
    } else {
      // toward compliance: the candidate with no block, then the fewest warnings; a tie goes down
      // (less nitrite: cure is toxic in overdose)
      const a = tryAmount(down);
      const b = tryAmount(up);
      const score = (r: Evaluated) => (r.blocked ? 1_000_000 : 0) + r.warnings;
      [chosen, rounding, result] = score(b) < score(a) ? [up, "up", b] : [down, "down", a];
    }
    if (chosen.isZero()) notes.push(`Rounded to the ${plain(resolution)} g scale, no cure at all would be weighed: use a finer scale or a weaker cure.`);
    requiredCure = {
      quantity: plain(chosen), unit: "g", exactQuantity: plain(exact.toDecimalPlaces(6, Dec.ROUND_HALF_EVEN)),
      scaleResolutionG: plain(resolution), rounding, targetNitritePpm: plain(target),
    };
  } else {
    const lines = req.cures.map((line, i) => {
      if (line.quantity === undefined) throw new CureInputError(`${pathOf(i)}.quantity`, "Enter how much of this cure is used (or give a target ppm to find it).");
      return { grams: grams({ quantity: line.quantity, unit: line.unit ?? "g" }, pathOf(i)), line };
    });
    result = evaluate(amountsOf(lines, curesField, multi), basis, entries, productClass);
  }

  if (req.table === "none") notes.push("No regulatory table is chosen: no regulatory check was made, and nothing is blocked.");
  if (req.table === "us") {
    if (!req.storage) notes.push("Storage is not given: the 120 ppm minimum for keep-refrigerated products was not checked.");
    notes.push("9 CFR 424.21(c) also limits nitrite in the finished product to 200 ppm, calculated as sodium nitrite; that is measured on the product, not calculated here.");
  }
  if (req.table === "eu") {
    if (result.checks.length === 0) {
      notes.push(
        "The EU figures (Regulation (EU) 2023/2108, E 249-250 and E 251-252 in meat products) could not be read in the annex text; they are marked unverified and were not applied. No EU check was made, and nothing is blocked.",
      );
    }
    if (!result.nitriteK.isZero() || !result.nitrateK.isZero()) notes.push("EU ion figures are not worked out for potassium salts: no conversion factor for them was read.");
    if (!req.heatTreatment && options.includeUnverified) notes.push("Give the heat treatment to choose the EU meat category (08.3.1 or 08.3.2).");
  }
  if (!result.nitriteK.isZero()) {
    notes.push(`Potassium nitrite counts as sodium nitrite divided by ${POTASSIUM_NITRITE_FACTOR} in the nitrite figure; each check uses the regulation's potassium figure where it gives one.`);
  }

  return {
    method: req.method,
    productClass,
    table: req.table,
    storage: req.storage ?? null,
    meatBlockGrams: plain(basis.meat),
    pickleGrams: basis.pickle ? plain(basis.pickle) : null,
    batchGrams: basis.batch ? plain(basis.batch) : null,
    nitritePpm: fmt4(result.nitriteNa.plus(result.nitriteK.div(POTASSIUM_NITRITE_FACTOR))),
    nitratePpm: fmt4(result.nitrateNa.plus(result.nitrateK)),
    nitriteBySalt: { sodium: fmt4(result.nitriteNa), potassium: fmt4(result.nitriteK) },
    euIonsMgPerKg: basis.batch
      ? { nitrite: result.ionNitrite ? fmt4(result.ionNitrite) : null, nitrate: result.ionNitrate ? fmt4(result.ionNitrate) : null }
      : null,
    requiredCure,
    checks: result.checks,
    blocked: result.blocked,
    warnings: result.warnings,
    notes,
    caution: CURE_CAUTION,
  };
}
