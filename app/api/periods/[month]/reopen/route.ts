import { reopenPeriod } from "@/lib/data/periods";
import { fieldErrors, validation } from "@/lib/http/errors";
import { route } from "@/lib/http/route";
import { periodMonthParams, periodReopenInput } from "@/lib/validation/periods";

/** Reopens the latest closed month (admins), with the reason on the audit trail. */
export const POST = route({ body: periodReopenInput, idempotent: true }, async ({ user, params, body }) => {
  const parsed = periodMonthParams.safeParse(params);
  if (!parsed.success) throw validation(fieldErrors(parsed.error));
  return reopenPeriod(user, parsed.data.month, body.reason);
});
