import { addRecipeVersion } from "@/lib/data/recipes";
import { refParam, Reply, route } from "@/lib/http/route";
import { recipeVersionInput } from "@/lib/validation/recipes";

/** A new version of the recipe; it becomes the current one, and earlier versions stay as written. */
export const POST = route({ body: recipeVersionInput, idempotent: true }, async ({ user, params, body }) =>
  new Reply(201, await addRecipeVersion(user, refParam(params, "Recipe"), body)));
