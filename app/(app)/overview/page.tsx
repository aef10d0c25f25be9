// The Overview: the manager's morning read over every kitchen they may see (a kitchen lead: their
// own): cure getting close to its date, items below their reorder point, next week's shortages,
// stock value by kitchen and the usage trend. Everything comes from lib/data/dashboard.ts; money is
// at receipt cost until the company has a cost formula, and every money heading says so.
import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { PageHeader } from "@/components/shell/page-header";
import { canSomewhere } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { getDashboard } from "@/lib/data/dashboard";
import { BelowReorderPanel, CureExpiringPanel, ShortagesPanel, StockValuePanel, UsagePanel } from "./_components/panels";

export const metadata: Metadata = { title: "Overview" };
export const dynamic = "force-dynamic";

export default async function OverviewPage() {
  const user = await requireUser();
  if (!canSomewhere(user, "dashboard.read")) notFound();
  const d = await getDashboard(user);
  const scope = d.kitchens.length === 1 ? d.kitchens[0]!.name : d.kitchens.length ? `${d.kitchens.length} kitchens` : "your kitchens";
  return (
    <>
      <PageHeader
        title="Overview"
        description={`What needs a look across ${scope} today: cure close to its date, what to reorder, what next week's batches are short of, and where the money sits.`}
      />
      <p className="-mt-3 mb-6 max-w-3xl text-sm text-brine">
        Money here is <strong className="font-semibold text-pepper-soft">at receipt cost</strong>: each lot at the unit cost it was received with. It will follow
        the company&rsquo;s cost formula once costing is set up.
      </p>
      <div className="space-y-6">
        <CureExpiringPanel panel={d.cureExpiring} currency={d.currency} unitSystem={user.unitSystem} />
        <ShortagesPanel panel={d.shortages} unitSystem={user.unitSystem} canOpenBatches={canSomewhere(user, "planning.read")} />
        <BelowReorderPanel panel={d.belowReorder} unitSystem={user.unitSystem} canOpenReorder={canSomewhere(user, "purchasing.read")} />
        <div className="grid gap-6 xl:grid-cols-[minmax(0,2fr)_minmax(0,3fr)]">
          <StockValuePanel panel={d.stockValue} currency={d.currency} />
          <UsagePanel panel={d.usageTrend} currency={d.currency} />
        </div>
      </div>
    </>
  );
}
