import { createRecipe, listRecipes } from "@/lib/data/recipes";
import { fieldErrors, validation } from "@/lib/http/errors";
import { Reply, route } from "@/lib/http/route";
import { recipeCreateInput, recipeListQuery } from "@/lib/validation/recipes";

export const GET = route({}, async ({ user, req }) => {
  const parsed = recipeListQuery.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!parsed.success) throw validation(fieldErrors(parsed.error));
  return { recipes: await listRecipes(user, { includeArchived: parsed.data.includeArchived === "true" }) };
});

/** A new recipe and its version 1. */
export const POST = route({ body: recipeCreateInput, idempotent: true }, async ({ user, body }) => new Reply(201, await createRecipe(user, body)));
