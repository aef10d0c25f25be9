import { calculateCasing } from "@/lib/data/casing-calculation";
import { route } from "@/lib/http/route";
import { casingCalculationInput } from "@/lib/validation/casing";

/** Casing for a filling mass: metres, put-ups to open, links. Computes only; writes nothing. */
export const POST = route({ body: casingCalculationInput }, async ({ user, body }) => calculateCasing(user, body));
