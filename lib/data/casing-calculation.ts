// The casing calculator behind POST /api/calculations/casing: reads the casing item (capacity per
// put-up, or calibre for a manufactured casing) and hands the arithmetic to lib/casing/calculate.
import "server-only";
import { db } from "../../db/client";
import type { ItemRow } from "../../db/types";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import { capacityTableFor, defaultCapacityKg } from "../casing/capacity";
import { casingNeed, CasingInputError, DEFAULT_DENSITY_G_PER_CM3, DEFAULT_FILL_FACTOR, type CapacityBasis, type CylinderBasis, type LinkSpec } from "../casing/calculate";
import { HANK_METRES, isNaturalCasing, PUT_UP_LABELS } from "../casing/put-ups";
import { validation } from "../http/errors";
import { convert, dec, plain, UnitError, type Dec } from "../units";
import type { CasingCalculationInput } from "../validation/casing";
import { loadItemForLedger } from "./items-for-ledger";

export interface CasingCalculation {
  fillingKg: string;
  casing: { itemId: string; sku: string; name: string; calibreMinMm: string; calibreMaxMm: string; putUp: string | null } | null;
  basis:
    | { kind: "capacity"; capacityKgPerPutUp: string; putUpMetres: string; source: string }
    | { kind: "cylinder"; calibreMm: string; fillFactor: string; density: string; putUpMetres: string | null; source: string };
  kgPerMetre: string;
  metres: string;
  putUps: string | null;
  putUpsToOpen: number | null;
  links: { count: number; gramsPerLink: string; metresPerLink: string; leftoverGrams: string } | null;
}

const round = (d: Dec, places: number) => plain(d.toDecimalPlaces(places));

function inUnit(amount: { quantity: string; unit: string }, to: string, field: string): Dec {
  try {
    return convert(amount.quantity, amount.unit, to);
  } catch (e) {
    if (e instanceof UnitError) throw validation({ [`${field}.unit`]: [e.message] });
    throw e;
  }
}

const CYLINDER_SOURCE =
  "Ideal cylinder x fill factor (trade-facts §4): density 1.03 g/cm³ for air-free sausage meat; fill factor 0.9 from memory, check it against the casing maker's stated capacity.";

/**
 * How a casing item is planned: from its capacity per put-up (given here, on the item, or the
 * calibre table's lower bound) or, for a manufactured casing without one, as a cylinder at its
 * lower calibre. A natural casing with no known capacity is 422 on capacityKg (no geometry for it).
 */
export function casingBasisForItem(
  row: ItemRow,
  overrides: { capacityKg?: string; fillFactor?: string; density?: string } = {},
  field = "item",
): { basis: CapacityBasis | CylinderBasis; source: string } {
  if (row.category !== "casing" || !row.casing_kind) throw validation({ [field]: [`${row.name} is not a casing.`] });
  const putUpMetres = row.put_up ? (row.put_up_metres ?? (row.put_up === "hank" ? HANK_METRES : null)) : null;
  const tableKg = row.put_up
    ? defaultCapacityKg({ casingKind: row.casing_kind, putUp: row.put_up, putUpMetres: row.put_up_metres, calibreMinMm: row.calibre_min_mm! })
    : undefined;
  const capacityKg = overrides.capacityKg ?? row.capacity_kg_per_put_up ?? tableKg;
  if (capacityKg && putUpMetres) {
    const source = overrides.capacityKg
      ? "The capacity you entered."
      : row.capacity_kg_per_put_up
        ? `The item's capacity per ${PUT_UP_LABELS[row.put_up!].toLowerCase()}.`
        : `Default for the calibre: lower bound of the band, ${capacityTableFor({ casingKind: row.casing_kind, putUp: row.put_up, putUpMetres: row.put_up_metres })!.source}.`;
    return { basis: { kind: "capacity", capacityKg: plain(dec(capacityKg)), putUpMetres: plain(dec(putUpMetres)), source }, source };
  }
  if (isNaturalCasing(row.casing_kind)) {
    // published natural-casing capacities are far from the ideal cylinder (trade-facts §4): no geometry
    throw validation({ capacityKg: [`No capacity is known for ${row.name}: enter the kg of filling one put-up holds (on the item, or here).`] });
  }
  return {
    basis: {
      kind: "cylinder", calibreMm: plain(dec(row.calibre_min_mm!)), fillFactor: overrides.fillFactor, densityGPerCm3: overrides.density,
      putUpMetres: putUpMetres ? plain(dec(putUpMetres)) : null,
    },
    source: CYLINDER_SOURCE,
  };
}

export async function calculateCasing(actor: CurrentUser, input: CasingCalculationInput): Promise<CasingCalculation> {
  assertCan(actor, "planning.read");
  const fillingKg = inUnit(input.fillingMass, "kg", "fillingMass");
  const link: LinkSpec | undefined = !input.link
    ? undefined
    : "length" in input.link
      ? { by: "length", metres: plain(inUnit(input.link.length, "m", "link.length")) }
      : { by: "weight", grams: plain(inUnit(input.link.weight, "g", "link.weight")) };

  let casing: CasingCalculation["casing"] = null;
  let basis: CapacityBasis | CylinderBasis;
  let source: string;
  if (input.item) {
    const { row } = await loadItemForLedger(db(), actor.companyId, input.item);
    casing = {
      itemId: row.id, sku: row.sku, name: row.name, calibreMinMm: plain(dec(row.calibre_min_mm ?? "0")), calibreMaxMm: plain(dec(row.calibre_max_mm ?? "0")), putUp: row.put_up,
    };
    ({ basis, source } = casingBasisForItem(row, input));
  } else {
    basis = { kind: "cylinder", calibreMm: input.calibreMm!, fillFactor: input.fillFactor, densityGPerCm3: input.density };
    source = CYLINDER_SOURCE;
  }

  let need;
  try {
    need = casingNeed(fillingKg, basis, link);
  } catch (e) {
    if (e instanceof CasingInputError) throw validation({ [e.field]: [e.message] });
    throw e;
  }
  return {
    fillingKg: plain(fillingKg),
    casing,
    basis:
      basis.kind === "capacity"
        ? { kind: "capacity", capacityKgPerPutUp: basis.capacityKg, putUpMetres: basis.putUpMetres, source }
        : {
            kind: "cylinder", calibreMm: basis.calibreMm, fillFactor: basis.fillFactor ?? DEFAULT_FILL_FACTOR, density: basis.densityGPerCm3 ?? DEFAULT_DENSITY_G_PER_CM3,
            putUpMetres: basis.putUpMetres ?? null, source,
          },
    kgPerMetre: round(need.kgPerMetre, 6),
    metres: round(need.metres, 4),
    putUps: need.putUps ? round(need.putUps, 4) : null,
    putUpsToOpen: need.putUpsToOpen,
    links: need.links
      ? {
          count: need.links.count, gramsPerLink: round(need.links.gramsPerLink, 2), metresPerLink: round(need.links.metresPerLink, 4),
          leftoverGrams: round(need.links.leftoverGrams, 2),
        }
      : null,
  };
}
