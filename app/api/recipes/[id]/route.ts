import { getRecipe } from "@/lib/data/recipes";
import { fieldErrors, validation } from "@/lib/http/errors";
import { refParam, route } from "@/lib/http/route";
import { recipeGetQuery } from "@/lib/validation/recipes";

/** A recipe (by id or code) with its current version, or ?version=N, and the list of its versions. */
export const GET = route({}, async ({ user, params, req }) => {
  const parsed = recipeGetQuery.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!parsed.success) throw validation(fieldErrors(parsed.error));
  return getRecipe(user, refParam(params, "Recipe"), parsed.data.version);
});
