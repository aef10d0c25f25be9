// A recipe version's bill of materials for a meat block, and its cure check. Pure, exact (Dec),
// client-safe: the recipe page, batch plans and production all call it.
//
// - Rates are per kg of the meat block's green weight (or, for pumped and immersion products, per
//   kg of the pickle, which is meat x pickle per kg of meat): g/kg, % (of that weight) or ml/kg.
// - Each line turns into the item's stock unit: grams, or millilitres; a volume rate for an item
//   stocked by mass (or the reverse) goes through the item's density.
// - Filling mass (what goes into the casing) = meat block + the meat-block lines (trade-facts §4).
//   Batch mass (the EU basis, mg per kg of the food) = filling mass, plus the pickle pumped in for
//   a pumped product (meat x pump fraction).
// - The cure check is lib/cure's, on the cure lines' grams (FSIS Directive 7620.3 ch. 3).
// - roundCure: a batch weighs cure on a scale; each cure quantity is rounded to the scale's
//   resolution toward compliance (trade-facts §2): of the roundings down and up, the one with no
//   blocking check, then the fewest warnings, then the least nitrite; the verdict is on that amount.
import { calculateCure, type CureCalculation, type CureLine } from "../cure/calculate";
import { methodOf } from "../cure/method";
import type { ProductClass, RegulatoryTable, Salt, Storage } from "../cure/limits";
import { Dec, dec, ZERO } from "../units/decimal";
import type { RateUnit } from "../validation/recipes";

export interface BomItem {
  id: string;
  sku: string;
  name: string;
  category: "casing" | "cure" | "spice" | "ingredient";
  stockUnit: "g" | "ml" | "m" | "pc";
  densityGPerMl: string | null;
  nitriteFraction: string | null;
  nitrateFraction: string | null;
  nitriteSalt?: Salt;
  nitrateSalt?: Salt;
}

export interface BomLineSpec {
  position: number;
  item: BomItem;
  rate: string;
  rateUnit: RateUnit;
  basis: "meat_block" | "pickle";
}

export interface BomSpec {
  productClass: ProductClass;
  storage: Storage;
  lines: readonly BomLineSpec[];
  pickleKgPerKgMeat: string | null;
  pumpFraction: string | null;
}

export interface BomLine {
  position: number;
  item: BomItem;
  /** exact, in the item's stock unit */
  quantity: Dec;
  unit: "g" | "ml";
  /** the line's mass in grams (through the density for a volume) */
  grams: Dec;
}

export interface Bom {
  meatGrams: Dec;
  pickleGrams: Dec | null;
  lines: BomLine[];
  /** meat block + meat-block lines */
  fillingGrams: Dec;
  /** the whole batch (EU basis) */
  batchGrams: Dec;
}

/** A line that cannot be turned into its item's stock unit (no density, a casing...). */
export class BomLineError extends Error {
  constructor(
    readonly position: number,
    readonly field: "item" | "unit",
    message: string,
  ) {
    super(message);
    this.name = "BomLineError";
  }
}

/** Why a line cannot be used, or null: the same rule billOfMaterials applies. */
export function lineProblem(item: BomItem, rateUnit: RateUnit): { field: "item" | "unit"; message: string } | null {
  if (item.stockUnit !== "g" && item.stockUnit !== "ml") {
    return { field: "item", message: `${item.name} is stocked in ${item.stockUnit}: casings go in the recipe's casing, not its lines.` };
  }
  const volumeRate = rateUnit === "ml_per_kg";
  if ((volumeRate || item.stockUnit === "ml") && !item.densityGPerMl) {
    return {
      field: volumeRate ? "unit" : "item",
      message: `${item.name} has no density: give its density on the item${volumeRate ? ", or the rate in g/kg or %" : ""}.`,
    };
  }
  if (volumeRate && item.category === "cure") return { field: "unit", message: "Cure is planned by mass only (spoon and volume measures of cure are unreliable)." };
  return null;
}

export function billOfMaterials(spec: BomSpec, meatGrams: Dec): Bom {
  const meatKg = meatGrams.div(1000);
  const pickleGrams = spec.pickleKgPerKgMeat ? meatGrams.times(spec.pickleKgPerKgMeat) : null;
  const lines = spec.lines.map((l): BomLine => {
    const problem = lineProblem(l.item, l.rateUnit);
    if (problem) throw new BomLineError(l.position, problem.field, problem.message);
    const baseKg = l.basis === "pickle" ? (pickleGrams ?? ZERO).div(1000) : meatKg;
    const rate = dec(l.rate);
    let grams: Dec | null = null;
    let ml: Dec | null = null;
    if (l.rateUnit === "g_per_kg") grams = rate.times(baseKg);
    else if (l.rateUnit === "percent") grams = rate.times(baseKg).times(10); // % of kg in g: /100 x 1000
    else ml = rate.times(baseKg);
    const density = l.item.densityGPerMl ? dec(l.item.densityGPerMl) : null;
    if (grams === null) grams = ml!.times(density!);
    if (l.item.stockUnit === "ml") return { position: l.position, item: l.item, quantity: ml ?? grams.div(density!), unit: "ml", grams };
    return { position: l.position, item: l.item, quantity: grams, unit: "g", grams };
  });
  const additions = lines.filter((_, i) => spec.lines[i]!.basis === "meat_block").reduce((s, l) => s.plus(l.grams), ZERO);
  const fillingGrams = meatGrams.plus(additions);
  const pumped = spec.pumpFraction ? meatGrams.times(spec.pumpFraction) : ZERO;
  return { meatGrams, pickleGrams, lines, fillingGrams, batchGrams: fillingGrams.plus(pumped) };
}

export interface CureCheckOptions {
  table: RegulatoryTable;
  scaleResolutionG: string;
}

function cureRequest(spec: BomSpec, bom: Bom, cures: { line: BomLine; grams: Dec }[], table: RegulatoryTable) {
  return {
    method: methodOf(spec.productClass),
    productClass: spec.productClass,
    storage: spec.storage,
    table,
    meatBlock: { quantity: bom.meatGrams.toString(), unit: "g" },
    cures: cures.map(({ line, grams }): CureLine => ({
      quantity: grams.toString(), unit: "g", name: line.item.name,
      nitriteFraction: line.item.nitriteFraction ?? "0", nitrateFraction: line.item.nitrateFraction ?? "0",
      nitriteSalt: line.item.nitriteSalt, nitrateSalt: line.item.nitrateSalt,
    })),
    ...(bom.pickleGrams ? { pickle: { quantity: bom.pickleGrams.toString(), unit: "g" } } : {}),
    ...(spec.pumpFraction ? { pumpFraction: spec.pumpFraction } : {}),
    ...(table === "eu" ? { batchMass: { quantity: bom.batchGrams.toString(), unit: "g" } } : {}),
  };
}

export const cureLinesOf = (bom: Bom) => bom.lines.filter((l) => l.item.category === "cure");

/** The cure check on the exact quantities (a recipe's rates), or null when the recipe has no cure. */
export function checkCure(spec: BomSpec, bom: Bom, opts: CureCheckOptions): CureCalculation | null {
  const cures = cureLinesOf(bom);
  if (cures.length === 0) return null;
  return calculateCure(cureRequest(spec, bom, cures.map((line) => ({ line, grams: line.quantity })), opts.table), { scaleResolutionG: opts.scaleResolutionG });
}

/** The cure check on given cure amounts (production: what was weighed), grams per cure line position. */
export function checkCureAmounts(spec: BomSpec, bom: Bom, grams: ReadonlyMap<number, Dec>, opts: CureCheckOptions): CureCalculation | null {
  const cures = cureLinesOf(bom).filter((l) => (grams.get(l.position) ?? ZERO).gt(0));
  if (cures.length === 0) return null;
  return calculateCure(cureRequest(spec, bom, cures.map((line) => ({ line, grams: grams.get(line.position)! })), opts.table), { scaleResolutionG: opts.scaleResolutionG });
}

export interface RoundedCure {
  /** grams to weigh per cure line position */
  grams: Map<number, Dec>;
  rounding: Map<number, "exact" | "down" | "up">;
  check: CureCalculation;
}

/** Cure quantities rounded to the scale toward compliance, with the verdict on the rounded amounts. */
export function roundCure(spec: BomSpec, bom: Bom, opts: CureCheckOptions): RoundedCure | null {
  const cures = cureLinesOf(bom);
  if (cures.length === 0) return null;
  const resolution = dec(opts.scaleResolutionG);
  const options = cures.map((line) => {
    const steps = line.quantity.div(resolution);
    const down = steps.floor().times(resolution);
    const up = steps.ceil().times(resolution);
    return down.eq(up) ? [{ grams: down, how: "exact" as const }] : [{ grams: down, how: "down" as const }, { grams: up, how: "up" as const }];
  });
  // every combination (a recipe has one to three cures, so at most eight)
  let combos: { grams: Dec; how: "exact" | "down" | "up" }[][] = [[]];
  for (const o of options) combos = combos.flatMap((c) => o.map((x) => [...c, x]));
  let best: { combo: (typeof combos)[number]; check: CureCalculation; score: number; nitrite: Dec } | null = null;
  for (const combo of combos) {
    if (combo.every((x) => x.grams.isZero())) continue;
    const check = calculateCure(cureRequest(spec, bom, cures.map((line, i) => ({ line, grams: combo[i]!.grams })), opts.table), { scaleResolutionG: opts.scaleResolutionG });
    const score = (check.blocked ? 1_000_000 : 0) + check.warnings;
    const nitrite = dec(check.nitritePpm);
    if (!best || score < best.score || (score === best.score && nitrite.lt(best.nitrite))) best = { combo, check, score, nitrite };
  }
  if (!best) {
    // every rounding weighs nothing: keep the exact amounts, and the check says what that means
    const check = calculateCure(cureRequest(spec, bom, cures.map((line) => ({ line, grams: line.quantity })), opts.table), { scaleResolutionG: opts.scaleResolutionG });
    return { grams: new Map(cures.map((l) => [l.position, l.quantity])), rounding: new Map(cures.map((l) => [l.position, "exact"])), check };
  }
  return {
    grams: new Map(cures.map((l, i) => [l.position, best!.combo[i]!.grams])),
    rounding: new Map(cures.map((l, i) => [l.position, best!.combo[i]!.how])),
    check: best.check,
  };
}

