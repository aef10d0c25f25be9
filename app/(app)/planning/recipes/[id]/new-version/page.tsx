import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { PageHeader } from "@/components/shell/page-header";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { getRecipe } from "@/lib/data/recipes";
import { AppError } from "@/lib/http/errors";
import { itemFacts } from "../../../_server/items";
import { RecipeForm } from "../../_components/recipe-form";

export const metadata: Metadata = { title: "New recipe version" };
export const dynamic = "force-dynamic";

export default async function NewVersionPage({ params, searchParams }: { params: Promise<{ id: string }>; searchParams: Promise<{ from?: string | string[] }> }) {
  const user = await requireUser();
  if (!can(user, "recipes.manage")) notFound();
  const { id } = await params;
  const from = Number((await searchParams).from);
  let recipe;
  try {
    recipe = await getRecipe(user, id, Number.isInteger(from) && from > 0 ? from : undefined);
  } catch (e) {
    if (e instanceof AppError && e.status === 404) notFound();
    throw e;
  }
  if (recipe.archived) notFound();
  const { items } = await itemFacts(user);
  return (
    <>
      <PageHeader
        title={`New version of ${recipe.code}`}
        description={`Starts from version ${recipe.version.version}. Saving makes it version ${recipe.currentVersion + 1}, the current one; earlier versions stay as they were.`}
        actions={<Link href={`/planning/recipes/${recipe.id}?version=${recipe.version.version}`} className="btn-quiet">Back to the recipe</Link>}
      />
      <RecipeForm key={recipe.version.version} recipe={recipe} initialItems={items.filter((i) => !i.archived)} />
    </>
  );
}
