import { listExpiringLots } from "@/lib/data/stock";
import { fieldErrors, validation } from "@/lib/http/errors";
import { route } from "@/lib/http/route";
import { lotsQuery } from "@/lib/validation/stock";

/** Lots with stock expiring within N days (expired ones only with includeExpired=true). */
export const GET = route({}, async ({ user, req }) => {
  const parsed = lotsQuery.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!parsed.success) throw validation(fieldErrors(parsed.error));
  const q = parsed.data;
  return { lots: await listExpiringLots(user, { withinDays: q.expiringWithinDays, includeExpired: q.includeExpired, kitchenCode: q.kitchen }) };
});
