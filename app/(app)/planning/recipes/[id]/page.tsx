// One recipe version: meat block, lines (with what 1 kg of meat block takes), casing, class and
// storage, process notes and the cure check on its exact rates; the list of versions beside it.
import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { CalendarPlus, FilePlus2, History } from "lucide-react";
import { CureMarker } from "@/components/cure/cure-marker";
import { CureCheckPanel } from "@/components/planning/cure-check";
import { PageHeader } from "@/components/shell/page-header";
import { DataTable, RowHeader, TBody, Td, Th, THead } from "@/components/ui/data-table";
import { FormMessage } from "@/components/ui/field";
import { can, canSomewhere } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { CLASS_LABELS, METHOD_LABELS } from "@/lib/cure/limits";
import { getCurrentKitchen } from "@/lib/data/current-kitchen";
import { getRecipe } from "@/lib/data/recipes";
import { AppError } from "@/lib/http/errors";
import { dec, plain } from "@/lib/units";

export const metadata: Metadata = { title: "Recipe" };
export const dynamic = "force-dynamic";

const STORAGE_WORDS = { keep_refrigerated: "Keep refrigerated", shelf_stable: "Shelf stable" } as const;
const BASIS_WORDS = { meat_block: "meat block", pickle: "pickle" } as const;

export default async function RecipePage({ params, searchParams }: {
  params: Promise<{ id: string }>;
  searchParams: Promise<{ version?: string | string[]; saved?: string | string[] }>;
}) {
  const user = await requireUser();
  if (!canSomewhere(user, "planning.read")) notFound();
  const { id } = await params;
  const sp = await searchParams;
  const asked = Number(sp.version);
  let recipe;
  try {
    recipe = await getRecipe(user, id, Number.isInteger(asked) && asked > 0 ? asked : undefined);
  } catch (e) {
    if (e instanceof AppError && e.status === 404) notFound();
    throw e;
  }
  const v = recipe.version;
  const kitchen = await getCurrentKitchen(user);
  const canPlan = kitchen ? can(user, "planning.manage", { kitchenId: kitchen.id }) : false;
  const canWrite = can(user, "recipes.manage") && !recipe.archived;
  const when = new Intl.DateTimeFormat("en-GB", { timeZone: user.timeZone, dateStyle: "medium" });
  const saved = Number(sp.saved);
  const hasCure = v.lines.some((l) => l.item.category === "cure");

  return (
    <>
      <PageHeader
        title={`${recipe.code} · ${recipe.name}`}
        description={`Version ${v.version}${v.version === recipe.currentVersion ? " (current)" : ` of ${recipe.currentVersion}`} · ${CLASS_LABELS[v.productClass]} · ${STORAGE_WORDS[v.storage]}`}
        actions={
          <>
            {canPlan && v.version === recipe.currentVersion ? (
              <Link href={`/planning?plan=${encodeURIComponent(recipe.code)}`} className="btn-quiet"><CalendarPlus aria-hidden className="h-5 w-5" /> Plan a batch</Link>
            ) : null}
            {canWrite ? (
              <Link href={`/planning/recipes/${recipe.id}/new-version?from=${v.version}`} className="btn-primary"><FilePlus2 aria-hidden className="h-5 w-5" /> New version</Link>
            ) : null}
          </>
        }
      />
      {saved === v.version ? <div className="mb-4" role="status"><FormMessage tone="success">Version {saved} saved{saved === 1 ? "" : " and now current"}.</FormMessage></div> : null}
      {v.version !== recipe.currentVersion ? (
        <p className="mb-4 flex items-start gap-2 rounded-md border border-amber/40 bg-amber-soft px-3 py-2 text-sm text-pepper">
          <History aria-hidden className="mt-0.5 h-4 w-4 shrink-0 text-amber" />
          <span>An earlier version: new batches use version {recipe.currentVersion}. Batches planned with this one keep it.</span>
        </p>
      ) : null}

      <div className="grid gap-6 lg:grid-cols-[1fr_15rem]">
        <div className="min-w-0 space-y-6">
          <section aria-labelledby="meat-heading" className="space-y-2">
            <h2 id="meat-heading" className="text-xl font-semibold">Meat block</h2>
            <DataTable caption="Meat block">
              <THead><Th>Meat or fat</Th><Th numeric>Share</Th></THead>
              <TBody>
                {v.meatBlock.map((m, i) => (
                  <tr key={i}><RowHeader className="font-normal">{m.name}</RowHeader><Td numeric>{m.percent} %</Td></tr>
                ))}
              </TBody>
            </DataTable>
          </section>

          <section aria-labelledby="lines-heading" className="space-y-2">
            <h2 id="lines-heading" className="text-xl font-semibold">Lines</h2>
            {v.lines.length === 0 ? (
              <p className="text-brine">No lines: the meat block only.</p>
            ) : (
              <DataTable caption="Lines of the recipe">
                <THead><Th>Item</Th><Th numeric>Rate</Th><Th>Per kg of</Th><Th numeric>For 1 kg of meat</Th></THead>
                <TBody>
                  {v.lines.map((l) => (
                    <tr key={l.position}>
                      <RowHeader>
                        <span className="flex flex-wrap items-center gap-2">{l.item.sku}{l.item.category === "cure" ? <CureMarker /> : null}</span>
                        <span className="block text-sm font-normal text-brine">{l.item.name}</span>
                      </RowHeader>
                      <Td numeric className="whitespace-nowrap">{l.rate} {l.unit}</Td>
                      <Td className="text-sm">{BASIS_WORDS[l.basis]}</Td>
                      <Td numeric className="whitespace-nowrap">{plain(dec(l.perKgMeat.quantity).toDecimalPlaces(3))} {l.perKgMeat.unit}</Td>
                    </tr>
                  ))}
                </TBody>
              </DataTable>
            )}
            <p className="text-sm text-brine">
              Filling: {plain(dec(v.fillingGramsPerKgMeat).toDecimalPlaces(1))} g per kg of meat block (what goes into the casing). Method: {METHOD_LABELS[v.method]}.
            </p>
          </section>

          {v.pickle ? (
            <section aria-labelledby="pickle-heading" className="space-y-1">
              <h2 id="pickle-heading" className="text-xl font-semibold">Pickle</h2>
              <p>{v.pickle.kgPerKgMeat} kg of pickle per kg of meat{v.pickle.pumpFraction ? `, pumped at ${plain(dec(v.pickle.pumpFraction).times(100))} %` : ""}.</p>
            </section>
          ) : null}

          <section aria-labelledby="casing-heading" className="space-y-1">
            <h2 id="casing-heading" className="text-xl font-semibold">Casing</h2>
            {v.casing ? (
              <p>
                {v.casing.item ? <><span className="font-semibold">{v.casing.item.sku}</span> · {v.casing.item.name}</> : "Any casing item"}
                {v.casing.calibreMinMm ? ` · calibre ${v.casing.calibreMinMm}–${v.casing.calibreMaxMm} mm` : ""}
                {v.casing.linkLengthM ? ` · links of ${plain(dec(v.casing.linkLengthM).times(100))} cm` : ""}
                {v.casing.linkWeightG ? ` · links of ${v.casing.linkWeightG} g` : ""}
              </p>
            ) : (
              <p className="text-brine">No casing given: batches are planned without casing unless one is chosen.</p>
            )}
          </section>

          {v.processNotes ? (
            <section aria-labelledby="notes-heading" className="space-y-1">
              <h2 id="notes-heading" className="text-xl font-semibold">Process notes</h2>
              <p className="max-w-3xl whitespace-pre-line">{v.processNotes}</p>
            </section>
          ) : null}

        </div>

        <nav aria-labelledby="versions-heading" className="space-y-2">
          <h2 id="versions-heading" className="text-xl font-semibold">Versions</h2>
          <ol className="panel divide-y divide-salt-edge">
            {[...recipe.versions].reverse().map((x) => {
              const current = x.version === v.version;
              return (
                <li key={x.version}>
                  <Link
                    href={`/planning/recipes/${recipe.id}?version=${x.version}`}
                    aria-current={current ? "page" : undefined}
                    className={`block min-h-touch px-3 py-2 ${current ? "border-l-[3px] border-paprika bg-salt-deep" : "hover:bg-salt"}`}
                  >
                    <span className="font-semibold">Version {x.version}{x.version === recipe.currentVersion ? " · current" : ""}</span>
                    <span className="block text-sm text-brine">{when.format(new Date(x.createdAt))}{x.createdBy ? ` · ${x.createdBy.name}` : ""}</span>
                    {x.changeNote ? <span className="block text-sm text-pepper-soft">{x.changeNote}</span> : null}
                  </Link>
                </li>
              );
            })}
          </ol>
        </nav>
      </div>

      <div className="mt-6">
        {v.cure ? (
          <CureCheckPanel cure={v.cure} basis="the recipe's exact rates (a batch is checked again on its rounded amounts)" headingId="cure-heading" />
        ) : hasCure ? null : (
          <p className="text-sm text-brine">No cure in this recipe: no nitrite check applies.</p>
        )}
      </div>
    </>
  );
}
