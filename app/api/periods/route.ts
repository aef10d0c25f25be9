import { listPeriods } from "@/lib/data/periods";
import { fieldErrors, validation } from "@/lib/http/errors";
import { route } from "@/lib/http/route";
import { periodListQuery } from "@/lib/validation/periods";

/** The company's months with their status, who closed them, and the audit trail. */
export const GET = route({}, async ({ user, req }) => {
  const parsed = periodListQuery.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!parsed.success) throw validation(fieldErrors(parsed.error));
  return listPeriods(user, parsed.data);
});
