// One batch plan as a sheet a kitchen lead can pin up: what to weigh (cure rounded to the scale),
// the lots reserved for it, what is short and where to get it, casing to open, and the cure check;
// recording production, and once made: the batch code, variance, the actual cure check and a hold.
import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { canSomewhere, can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { getBatch } from "@/lib/data/batches";
import { getCompany, getCureSettings } from "@/lib/data/companies";
import { listKitchens } from "@/lib/data/kitchens";
import { AppError } from "@/lib/http/errors";
import { todayIn } from "@/components/planning/dates";
import { itemFacts } from "../../_server/items";
import { BatchSheet } from "./_components/batch-sheet";

export const metadata: Metadata = { title: "Batch" };
export const dynamic = "force-dynamic";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export default async function BatchPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requireUser();
  if (!canSomewhere(user, "planning.read")) notFound();
  const { id } = await params;
  if (!UUID.test(id)) notFound();
  let batch;
  try {
    batch = await getBatch(user, id);
  } catch (e) {
    if (e instanceof AppError && e.status === 404) notFound();
    throw e;
  }
  const [settings, facts, kitchens, company] = await Promise.all([
    getCureSettings(user), itemFacts(user), listKitchens(user, { includeArchived: true }), getCompany(user),
  ]);
  return (
    <>
      {/* the sheet is pinned up in the kitchen: a plain page with room at the edges */}
      <style>{"@media print { @page { size: A4; margin: 12mm; } }"}</style>
      <BatchSheet
        initial={batch}
        units={facts.units}
        untracked={facts.untracked}
        unitSystem={user.unitSystem}
        scaleResolutionG={settings.scaleResolutionG}
        kitchenNames={Object.fromEntries(kitchens.map((k) => [k.code, k.name]))}
        canManage={can(user, "planning.manage", { kitchenId: batch.kitchen.id })}
        canProduce={can(user, "production.post", { kitchenId: batch.kitchen.id })}
        canReleaseHold={can(user, "limits.override", { kitchenId: batch.kitchen.id })}
        canRequestTransfer={can(user, "transfers.request", { kitchenId: batch.kitchen.id })}
        firstDay={company.weekStart}
        today={todayIn(user.timeZone)}
        timeZone={user.timeZone}
        printedBy={user.name}
        printedAt={new Intl.DateTimeFormat("en-GB", { timeZone: user.timeZone, dateStyle: "long", timeStyle: "short" }).format(new Date())}
      />
    </>
  );
}
