// The week planner: the current kitchen's batches day by day for one week (from the company's first
// day of the week, Monday unless it chose another), with their status and shortages, "Reserve all"
// for the week and "Plan a batch". ?week= takes any day and shows the week it falls in.
import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { addDays, defaultWeek, isIsoDay, todayIn, weekStartOf } from "@/components/planning/dates";
import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { can, canSomewhere } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { listBatches } from "@/lib/data/batches";
import { getCompany, getCureSettings } from "@/lib/data/companies";
import { getCurrentKitchen } from "@/lib/data/current-kitchen";
import { listKitchens } from "@/lib/data/kitchens";
import { listRecipes } from "@/lib/data/recipes";
import { itemFacts } from "./_server/items";
import { WeekPlanner } from "./_components/week-planner";

export const metadata: Metadata = { title: "Planning" };
export const dynamic = "force-dynamic";

export default async function Page({ searchParams }: { searchParams: Promise<{ week?: string | string[]; plan?: string | string[] }> }) {
  const user = await requireUser();
  if (!canSomewhere(user, "planning.read")) notFound();
  const kitchen = await getCurrentKitchen(user);
  const sp = await searchParams;
  const today = todayIn(user.timeZone);
  const { weekStart: firstDay } = await getCompany(user);
  const start = isIsoDay(sp.week) ? weekStartOf(sp.week, firstDay) : defaultWeek(today, firstDay);
  const header = (
    <PageHeader
      title="Planning"
      kitchen={kitchen}
      description="The week's batches, what each needs, what is short and what is reserved for it."
    />
  );
  if (!kitchen || !can(user, "planning.read", { kitchenId: kitchen.id })) {
    return (
      <>
        {header}
        <EmptyState title="No kitchen to plan for">
          <p>Batches are planned per kitchen, and you are not assigned to one yet. An admin assigns kitchens under Settings › People.</p>
        </EmptyState>
      </>
    );
  }
  const [batches, recipes, facts, settings, kitchens] = await Promise.all([
    listBatches(user, { kitchen: kitchen.code, from: start, to: addDays(start, 6) }),
    listRecipes(user),
    itemFacts(user),
    getCureSettings(user),
    listKitchens(user, { includeArchived: true }),
  ]);
  const planRef = typeof sp.plan === "string" ? sp.plan : undefined;
  const plan = planRef ? recipes.find((r) => r.code === planRef.toUpperCase() || r.id === planRef) : undefined;
  return (
    <>
      {header}
      <WeekPlanner
        key={`${kitchen.code}:${start}`}
        kitchen={{ code: kitchen.code, name: kitchen.name }}
        start={start}
        firstDay={firstDay}
        today={today}
        initialBatches={batches}
        recipes={recipes}
        casings={facts.items.filter((i) => i.category === "casing" && !i.archived && i.casing).map((i) => ({ id: i.id, sku: i.sku, name: i.name, calibreMinMm: i.casing!.calibreMinMm, calibreMaxMm: i.casing!.calibreMaxMm }))}
        units={facts.units}
        unitSystem={user.unitSystem}
        scaleResolutionG={settings.scaleResolutionG}
        kitchenNames={Object.fromEntries(kitchens.map((k) => [k.code, k.name]))}
        canManage={can(user, "planning.manage", { kitchenId: kitchen.id })}
        canWriteRecipes={can(user, "recipes.manage")}
        planRecipe={plan?.id}
      />
    </>
  );
}
