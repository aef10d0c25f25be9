import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { PageHeader } from "@/components/shell/page-header";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { itemFacts } from "../../_server/items";
import { RecipeForm } from "../_components/recipe-form";

export const metadata: Metadata = { title: "New recipe" };
export const dynamic = "force-dynamic";

export default async function NewRecipePage() {
  const user = await requireUser();
  if (!can(user, "recipes.manage")) notFound();
  const { items } = await itemFacts(user);
  return (
    <>
      <PageHeader
        title="New recipe"
        description="Version 1 of a recipe. Saving checks the cure against your company's regulatory table: a recipe over a statutory maximum is refused."
        actions={<Link href="/planning/recipes" className="btn-quiet">Recipes</Link>}
      />
      <RecipeForm initialItems={items.filter((i) => !i.archived)} />
    </>
  );
}
