// A company's house limits: stricter than the regulation, checked beside it. A miss never blocks
// outright; a manager may plan past it with a reason (lib/data/batches.ts). Pure, client-safe.
// The verdict compares the calculator's ppm, which is exact to 4 decimal places (half-even).
import { dec } from "../units/decimal";
import type { CureCalculation } from "./calculate";
import type { ProductClass } from "./limits";

export interface HouseLimit {
  productClass: ProductClass;
  substance: "nitrite" | "nitrate";
  kind: "max" | "min";
  limitPpm: string;
  note: string;
}

export interface HouseCheck extends HouseLimit {
  ppm: string;
  within: boolean;
}

export function houseChecks(limits: readonly HouseLimit[], cure: CureCalculation): HouseCheck[] {
  return limits
    .filter((l) => l.productClass === cure.productClass)
    .map((l) => {
      const ppm = l.substance === "nitrite" ? cure.nitritePpm : cure.nitratePpm;
      const within = l.kind === "max" ? dec(ppm).lte(dec(l.limitPpm)) : dec(ppm).gte(dec(l.limitPpm));
      return { ...l, ppm, within };
    });
}
