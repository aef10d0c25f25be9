import { getReorderSuggestions } from "@/lib/data/reorder-suggestions";
import { fieldErrors, validation } from "@/lib/http/errors";
import { route } from "@/lib/http/route";
import { reorderSuggestionsQuery } from "@/lib/validation/reorder";

/** What to reorder, per kitchen, supplier and item (?kitchen=ID or code; left out: every kitchen in reach). */
export const GET = route({}, async ({ user, req }) => {
  const parsed = reorderSuggestionsQuery.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!parsed.success) throw validation(fieldErrors(parsed.error));
  return getReorderSuggestions(user, parsed.data.kitchen);
});
