import { closePeriod } from "@/lib/data/periods";
import { fieldErrors, validation } from "@/lib/http/errors";
import { route } from "@/lib/http/route";
import { periodMonthParams } from "@/lib/validation/periods";

/** Closes a month that is over: movements dated in it are refused from then on. */
export const POST = route({ idempotent: true }, async ({ user, params }) => {
  const parsed = periodMonthParams.safeParse(params);
  if (!parsed.success) throw validation(fieldErrors(parsed.error));
  return closePeriod(user, parsed.data.month);
});
