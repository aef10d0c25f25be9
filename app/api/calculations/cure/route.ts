import { calculateCure } from "@/lib/data/cure-calculation";
import { route } from "@/lib/http/route";
import { cureCalculationInput } from "@/lib/validation/cure";

/** Ingoing nitrite and nitrate of a cure, checked against the company's table; or the cure for a target ppm. Writes nothing. */
export const POST = route({ body: cureCalculationInput }, async ({ user, body }) => calculateCure(user, body));
