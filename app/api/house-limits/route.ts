import { listHouseLimits, setHouseLimits } from "@/lib/data/house-limits";
import { route } from "@/lib/http/route";
import { houseLimitsInput } from "@/lib/validation/house-limits";

/** The company's own, stricter cure limits. */
export const GET = route({}, async ({ user }) => ({ limits: await listHouseLimits(user) }));

/** Replaces the house limits (admins). */
export const PUT = route({ body: houseLimitsInput }, async ({ user, body }) => ({ limits: await setHouseLimits(user, body.limits) }));
