// The cure calculator behind POST /api/calculations/cure: the company's table (unless the request
// names one) and scale resolution, then lib/cure's arithmetic. Computes only; writes nothing.
import "server-only";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import { calculateCure as calculate, CureInputError, type CureCalculation } from "../cure/calculate";
import { validation } from "../http/errors";
import type { CureCalculationInput } from "../validation/cure";
import { getCureSettings } from "./companies";

export async function calculateCure(actor: CurrentUser, input: CureCalculationInput): Promise<CureCalculation> {
  assertCan(actor, "planning.read");
  const settings = await getCureSettings(actor);
  const { cures, cure, table, ...rest } = input;
  try {
    return calculate(
      { ...rest, table: table ?? settings.regulatoryTable, cures: cures ?? (cure ? [cure] : []) },
      { scaleResolutionG: settings.scaleResolutionG, curesField: cures ? "cures" : "cure" },
    );
  } catch (e) {
    // e.g. the company's table is eu and the request has no batch mass
    if (e instanceof CureInputError) throw validation({ [e.field]: [e.message] });
    throw e;
  }
}
