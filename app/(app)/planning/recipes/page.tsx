// The company's recipes: code, name, product class, storage, whether they carry cure, version.
import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { Plus } from "lucide-react";
import { CureMarker } from "@/components/cure/cure-marker";
import { PageHeader } from "@/components/shell/page-header";
import { DataTable, RowHeader, TBody, Td, Th, THead } from "@/components/ui/data-table";
import { EmptyState } from "@/components/ui/empty-state";
import { can, canSomewhere } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { CLASS_LABELS } from "@/lib/cure/limits";
import { listRecipes } from "@/lib/data/recipes";

export const metadata: Metadata = { title: "Recipes" };
export const dynamic = "force-dynamic";

const STORAGE_WORDS = { keep_refrigerated: "Keep refrigerated", shelf_stable: "Shelf stable" } as const;

export default async function RecipesPage() {
  const user = await requireUser();
  if (!canSomewhere(user, "planning.read")) notFound();
  const recipes = await listRecipes(user);
  const canWrite = can(user, "recipes.manage");
  return (
    <>
      <PageHeader
        title="Recipes"
        description="Each recipe is versioned: a change is a new version, and a batch keeps the version it was planned with."
        actions={canWrite ? <Link href="/planning/recipes/new" className="btn-primary"><Plus aria-hidden className="h-5 w-5" /> New recipe</Link> : undefined}
      />
      {recipes.length === 0 ? (
        <EmptyState title="No recipes yet">
          <p>A recipe gives the meat block, the rates of salt, cure and spices per kg of it, the casing and the product class; batches are planned from it.</p>
          {canWrite ? <p><Link href="/planning/recipes/new" className="font-semibold text-paprika underline">Write the first recipe</Link>.</p> : null}
        </EmptyState>
      ) : (
        <DataTable caption="Recipes">
          <THead>
            <Th>Recipe</Th>
            <Th>Product class</Th>
            <Th>Storage</Th>
            <Th>Cure</Th>
            <Th numeric>Version</Th>
          </THead>
          <TBody>
            {recipes.map((r) => (
              <tr key={r.id}>
                <RowHeader>
                  <Link href={`/planning/recipes/${r.id}`} className="underline-offset-2 hover:underline">
                    {r.code}
                    <span className="block text-sm font-normal text-brine">{r.name}</span>
                  </Link>
                </RowHeader>
                <Td className="text-sm">{CLASS_LABELS[r.productClass]}</Td>
                <Td className="text-sm">{STORAGE_WORDS[r.storage]}</Td>
                <Td>{r.hasCure ? <CureMarker /> : <span className="text-sm text-brine">No cure</span>}</Td>
                <Td numeric>{r.currentVersion}</Td>
              </tr>
            ))}
          </TBody>
        </DataTable>
      )}
    </>
  );
}
