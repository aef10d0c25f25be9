// The Overview: the manager's morning read over every kitchen they may see (a kitchen lead: their
// own): cure getting close to its date, items below their reorder point, next week's shortages,
// stock value by kitchen and the usage trend. Everything comes from lib/data/dashboard.ts; money
// follows the company's cost formula (FIFO or moving average), and every money heading says which.
import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { PageHeader } from "@/components/shell/page-header";
import { canSomewhere } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { getDashboard } from "@/lib/data/dashboard";
import { BelowReorderPanel, CureExpiringPanel, costWords, ShortagesPanel, StockValuePanel, UsagePanel } from "./_components/panels";

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
        Money here is at <strong className="font-semibold text-pepper-soft">{costWords(d.costFormula)}</strong>, the company&rsquo;s cost formula (Settings › Company),
        kept kitchen by kitchen as in the reports. A lot of cure is valued at its kitchen&rsquo;s unit value of the item.
      </p>
      <div className="space-y-6">
        <CureExpiringPanel panel={d.cureExpiring} currency={d.currency} formula={d.costFormula} unitSystem={user.unitSystem} />
        <ShortagesPanel panel={d.shortages} unitSystem={user.unitSystem} canOpenBatches={canSomewhere(user, "planning.read")} />
        <BelowReorderPanel panel={d.belowReorder} unitSystem={user.unitSystem} canOpenReorder={canSomewhere(user, "purchasing.read")} />
        <div className="grid gap-6 xl:grid-cols-[minmax(0,2fr)_minmax(0,3fr)]">
          <StockValuePanel panel={d.stockValue} currency={d.currency} formula={d.costFormula} />
          <UsagePanel panel={d.usageTrend} currency={d.currency} formula={d.costFormula} />
        </div>
      </div>
    </>
  );
}
