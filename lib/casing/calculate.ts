// How much casing a batch needs: metres, put-ups to open and links, from the filling mass.
// Pure: no I/O, exact decimals (lib/units). Sources and rules: trade-facts §4.
//
// Two ways to plan, chosen by what is known of the casing:
// - capacity: kg of filling one put-up holds (a natural casing's hank or set, from the item or the
//   calibre table's lower bound). metres = filling / capacity x metres per put-up. The published
//   capacities already allow for nominal calibre, linking and end losses, so natural casings are
//   planned this way only.
// - cylinder: a uniform manufactured casing of a given calibre. Mass per metre = density x pi x r^2
//   x 1 m x fill factor (default density 1.03 g/cm^3 for air-free sausage meat [calc]; default fill
//   factor 0.9 [memory: check it against the casing maker's stated capacity when one is given]).
//   A calibre range is planned at its LOWER bound: the narrower casing needs more metres, so the
//   plan never under-orders.
// Put-ups to open round UP (a hank is opened whole); links round DOWN (only whole links are made)
// and the part-link left over is reported.
import { Dec, dec, ONE, ZERO } from "../units";

/** Air-free sausage meat, g/cm^3 (trade-facts §4: about 1.01-1.05; 1.03 taken as the default). */
export const DEFAULT_DENSITY_G_PER_CM3 = "1.03";
/** Share of the ideal cylinder a manufactured casing is filled to (from memory; editable). */
export const DEFAULT_FILL_FACTOR = "0.9";

// pi to 60 significant digits (Dec's precision), from decimal.js itself: acos(-1).
const PI = Dec.acos(-1);

export interface CapacityBasis {
  kind: "capacity";
  /** kg of filling per put-up */
  capacityKg: string;
  /** metres in one put-up (a hank: 91.44) */
  putUpMetres: string;
  /** where the capacity came from, shown with the result */
  source: string;
}

export interface CylinderBasis {
  kind: "cylinder";
  /** stuffed diameter in mm (for a range, its lower bound) */
  calibreMm: string;
  fillFactor?: string;
  densityGPerCm3?: string;
  /** metres in one put-up (a shirred stick, a strand), when the casing is stocked by the piece */
  putUpMetres?: string | null;
}

export type LinkSpec = { by: "length"; metres: string } | { by: "weight"; grams: string };

export interface CasingNeed {
  /** kg of filling one metre holds */
  kgPerMetre: Dec;
  /** exact metres of casing for the filling */
  metres: Dec;
  /** exact put-ups (null when the basis has no put-up length) */
  putUps: Dec | null;
  /** whole put-ups to open */
  putUpsToOpen: number | null;
  links: { count: number; leftoverGrams: Dec; gramsPerLink: Dec; metresPerLink: Dec } | null;
}

export class CasingInputError extends Error {
  constructor(
    readonly field: string,
    message: string,
  ) {
    super(message);
    this.name = "CasingInputError";
  }
}

function positive(value: string, field: string, what: string): Dec {
  const d = dec(value);
  if (d.lte(ZERO)) throw new CasingInputError(field, `${what} must be more than zero.`);
  return d;
}

/** kg of filling one metre of casing holds under a basis. */
export function kgPerMetre(basis: CapacityBasis | CylinderBasis): Dec {
  if (basis.kind === "capacity") {
    return positive(basis.capacityKg, "capacityKg", "The capacity per put-up").div(positive(basis.putUpMetres, "putUpMetres", "The length of a put-up"));
  }
  const fill = positive(basis.fillFactor ?? DEFAULT_FILL_FACTOR, "fillFactor", "The fill factor");
  if (fill.gt(ONE)) throw new CasingInputError("fillFactor", "The fill factor is a share of the ideal cylinder: 1 or less.");
  const density = positive(basis.densityGPerCm3 ?? DEFAULT_DENSITY_G_PER_CM3, "density", "The density");
  const radiusCm = positive(basis.calibreMm, "calibreMm", "The calibre").div(20);
  // g per metre = g/cm^3 x cm^2 x 100 cm; / 1000 -> kg per metre
  return density.times(PI).times(radiusCm.pow(2)).times(100).times(fill).div(1000);
}

/** Casing for `fillingKg` of filling, with links when a link length or weight is given. */
export function casingNeed(fillingKg: string | Dec, basis: CapacityBasis | CylinderBasis, link?: LinkSpec): CasingNeed {
  const filling = dec(fillingKg);
  if (filling.lte(ZERO)) throw new CasingInputError("fillingMass", "The filling mass must be more than zero.");
  const perMetre = kgPerMetre(basis);
  const metres = filling.div(perMetre);
  const putUpMetres = basis.putUpMetres ? positive(basis.putUpMetres, "putUpMetres", "The length of a put-up") : null;
  const putUps = putUpMetres ? metres.div(putUpMetres) : null;
  return {
    kgPerMetre: perMetre,
    metres,
    putUps,
    putUpsToOpen: putUps ? putUps.ceil().toNumber() : null,
    links: link ? linksOf(filling, perMetre, link) : null,
  };
}

function linksOf(fillingKg: Dec, perMetre: Dec, link: LinkSpec): NonNullable<CasingNeed["links"]> {
  const gramsPerLink =
    link.by === "weight"
      ? positive(link.grams, "link.weight", "The link weight")
      : positive(link.metres, "link.length", "The link length").times(perMetre).times(1000);
  const fillingGrams = fillingKg.times(1000);
  const count = fillingGrams.div(gramsPerLink).floor();
  return {
    count: count.toNumber(),
    leftoverGrams: fillingGrams.minus(count.times(gramsPerLink)),
    gramsPerLink,
    metresPerLink: gramsPerLink.div(1000).div(perMetre),
  };
}
