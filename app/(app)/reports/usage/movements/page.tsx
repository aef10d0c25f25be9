// Reports > Usage > one item's month: every movement of the item in the month (one kitchen or all),
// with what the cost formula made of each, from the same engine run as the usage report
// (lib/data/reports.ts usageMovements). The totals are the usage report's row for the item.
import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { ListX } from "lucide-react";
import { CureCaution } from "@/components/cure/cure-caution";
import { CureMarker } from "@/components/cure/cure-marker";
import { CATEGORY_WORDS, FormulaNote, money, quantityText, ReportCrumbs } from "@/components/reports/report-parts";
import { PageHeader } from "@/components/shell/page-header";
import { DataTable, TBody, Td, Th, THead } from "@/components/ui/data-table";
import { EmptyState } from "@/components/ui/empty-state";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { usageMovements, type UsageMovement } from "@/lib/data/reports";
import { AppError } from "@/lib/http/errors";
import { isMonth, monthLabel } from "@/lib/periods/months";
import { dec } from "@/lib/units";
import { usageMovementsQuery } from "@/lib/validation/reports";

export const metadata: Metadata = { title: "Usage: movements" };
export const dynamic = "force-dynamic";

const one = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v)?.trim() || undefined;

const KIND_WORDS: Record<UsageMovement["kind"], string> = {
  receipt: "Received", use: "Used", waste: "Wasted", count: "Counted", adjustment: "Adjusted", transfer: "Transfer",
};
const COUNTS_AS: Record<NonNullable<UsageMovement["countsAs"]>, string> = { used: "Used", wasted: "Wasted", countDifference: "Count difference" };
const BASIS_WORDS: Record<UsageMovement["basis"], string> = {
  receipt: "at the receipt's cost", formula: "by the cost formula", transfer: "at what it cost where it came from",
  gain: "at the latest receipt cost", reversal: "at what the movement it reverses cost",
};

function What({ m }: { m: UsageMovement }) {
  if (m.kind === "transfer") {
    const other = m.otherKitchen ? m.otherKitchen.code : "another kitchen";
    return <>{dec(m.quantity).gt(0) ? "Transfer in from" : "Transfer out to"} <span className="whitespace-nowrap">{other}</span></>;
  }
  return <>{KIND_WORDS[m.kind]}</>;
}

export default async function UsageMovementsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requireUser();
  if (!can(user, "reports.read")) notFound();
  const sp = await searchParams;
  const parsed = usageMovementsQuery.safeParse({ month: one(sp.month), item: one(sp.item), kitchen: one(sp.kitchen) });
  if (!parsed.success) notFound();
  let data;
  try {
    data = await usageMovements(user, parsed.data);
  } catch (e) {
    if (e instanceof AppError && e.status === 404) notFound();
    throw e;
  }
  // back to the report the person came from (its range), else to this month
  const from = isMonth(one(sp.from) ?? "") ? one(sp.from)! : data.month;
  const to = isMonth(one(sp.to) ?? "") ? one(sp.to)! : data.month;
  const back = `/reports/usage?${new URLSearchParams({ from, to, groupBy: "item", ...(data.kitchen ? { kitchen: data.kitchen.code } : {}) }).toString()}`;
  const when = new Intl.DateTimeFormat("en-GB", { timeZone: user.timeZone, day: "numeric", month: "short", hour: "2-digit", minute: "2-digit" });
  const t = data.totals;
  const cur = data.currency;

  return (
    <>
      <ReportCrumbs trail={[{ label: "Usage", href: back }, { label: data.item.sku }]} />
      <PageHeader
        title={`${data.item.name}, ${monthLabel(data.month)}`}
        kitchen={data.kitchen}
        description={`Every movement of ${data.item.sku} (${CATEGORY_WORDS[data.item.category].one.toLowerCase()}) in ${monthLabel(data.month)}${data.kitchen ? "" : " in every kitchen"}, oldest first, with what each did to the stock's value.`}
      />
      {data.item.category === "cure" ? <p className="-mt-4 mb-4"><CureMarker /></p> : null}
      <FormulaNote formula={data.costFormula}>
        Receipts and transfers move stock and value but are not usage; the last column says which figure of the usage report each movement is part of.
      </FormulaNote>
      {data.item.category === "cure" ? <CureCaution className="mb-4 max-w-4xl" /> : null}

      <dl className="mb-4 grid max-w-4xl grid-cols-2 gap-3 md:grid-cols-4">
        <Figure label="Used" value={money(t.usedCost, cur)} sub={quantityText(t.usedQuantity, data.unit)} />
        <Figure label="Wasted" value={money(t.wastedCost, cur)} sub={quantityText(t.wastedQuantity, data.unit)} />
        <Figure label="Cost (used and wasted)" value={money(t.cost, cur)} testId="drill-total-cost" />
        <Figure label="Count difference" value={money(t.countDifferenceCost, cur)} sub={quantityText(t.countDifferenceQuantity, data.unit)} />
      </dl>

      {data.movements.length === 0 ? (
        <EmptyState title={`No movements of ${data.item.sku} in ${monthLabel(data.month)}`} icon={<ListX aria-hidden className="h-8 w-8" />}>
          <p>Choose another month or kitchen on the usage report.</p>
        </EmptyState>
      ) : (
        <DataTable caption={`Movements of ${data.item.name} in ${monthLabel(data.month)}, oldest first`}>
          <THead>
            <Th>Date</Th>
            <Th>Movement</Th>
            <Th>Kitchen</Th>
            <Th>Lot</Th>
            <Th numeric>Quantity</Th>
            <Th numeric>Unit cost</Th>
            <Th numeric>Value</Th>
            <Th>In the report as</Th>
          </THead>
          <TBody>
            {data.movements.map((m) => (
              <tr key={m.id}>
                <Td className="num whitespace-nowrap">{when.format(new Date(m.occurredAt))}</Td>
                <Td>
                  <span className="font-semibold"><What m={m} /></span>
                  {m.reversal ? <span className="block text-sm text-brine">a reversal</span> : null}
                  {m.reason && !m.reversal ? <span className="block text-sm text-brine">{m.reason}</span> : null}
                </Td>
                <Td className="whitespace-nowrap">{m.kitchen.code}</Td>
                <Td className="whitespace-nowrap">{m.lot.code}</Td>
                <Td numeric className="whitespace-nowrap">{dec(m.quantity).gt(0) ? "+" : ""}{quantityText(m.quantity, data.unit)}</Td>
                <Td numeric className="whitespace-nowrap">
                  {money(m.unitCost, cur)}<span className="text-brine"> /{data.unit}</span>
                  <span className="block text-xs font-normal text-brine">{BASIS_WORDS[m.basis]}</span>
                </Td>
                <Td numeric className="whitespace-nowrap">{dec(m.value).gt(0) ? "+" : ""}{money(m.value, cur)}</Td>
                <Td className="whitespace-nowrap">{m.countsAs ? COUNTS_AS[m.countsAs] : <span className="text-brine">Not usage</span>}</Td>
              </tr>
            ))}
          </TBody>
        </DataTable>
      )}
      <p className="mt-3 max-w-4xl text-sm text-brine">
        Each value is rounded to the currency&rsquo;s smallest unit for showing; the figures above add the exact values and round once, as the usage
        report does.
      </p>
    </>
  );
}

function Figure({ label, value, sub, testId }: { label: string; value: string; sub?: string; testId?: string }) {
  return (
    <div className="panel px-4 py-3">
      <dt className="text-sm text-brine">{label}</dt>
      <dd className="num text-xl font-semibold tabular-nums" data-testid={testId}>{value}</dd>
      {sub ? <dd className="num text-sm text-brine">{sub}</dd> : null}
    </div>
  );
}
