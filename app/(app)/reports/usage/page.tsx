// Reports > Usage: what was used and wasted, month by month, at the company's cost formula
// (lib/data/reports.ts usageReport, the same figures as GET /api/reports/usage and its files). The
// query is the URL (from, to, groupBy, kitchen); by default last month in the company's calendar.
// The chart is always by category (a second run of the report grouped so); the table follows
// "Group by". Each item row opens that item's costed movements of the month (./movements).
import { BarChart3 } from "lucide-react";
import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import type { ReactNode } from "react";
import { CureCaution } from "@/components/cure/cure-caution";
import { CureMarker } from "@/components/cure/cure-marker";
import {
  CATEGORY_WORDS, Control, ExportLinks, FormulaNote, KitchenSelect, money, quantityText, ReportControls, ReportCrumbs, type ExportLink,
} from "@/components/reports/report-parts";
import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { ITEM_CATEGORIES, type ItemCategory } from "@/db/types";
import { dateInZone } from "@/lib/alerts/expiry";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { getCompany } from "@/lib/data/companies";
import { listKitchens } from "@/lib/data/kitchens";
import { usageReports, type UsageReport, type UsageRow } from "@/lib/data/reports";
import { monthLabel, monthsBetween } from "@/lib/periods/months";
import { previousMonth, rangeWords } from "@/lib/reports/months";
import { currencyExponent, dec, ZERO } from "@/lib/units";
import { USAGE_GROUPS, usageQuery, type UsageGroup } from "@/lib/validation/reports";
import { UsageChart } from "../../overview/_components/usage-chart";

export const metadata: Metadata = { title: "Usage" };
export const dynamic = "force-dynamic";

const one = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v)?.trim() || undefined;
const GROUP_WORDS: Record<UsageGroup, string> = { item: "Item", category: "Category", kitchen: "Kitchen" };

export default async function UsagePage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requireUser();
  if (!can(user, "reports.read")) notFound();
  const sp = await searchParams;
  const [company, kitchens] = await Promise.all([getCompany(user), listKitchens(user, { includeArchived: true })]);
  const lastMonth = previousMonth(dateInZone(new Date(), company.timeZone));
  const from = one(sp.from) ?? one(sp.to) ?? lastMonth;
  const to = one(sp.to) ?? from;
  const groupBy = (USAGE_GROUPS as readonly string[]).includes(one(sp.groupBy) ?? "") ? (one(sp.groupBy) as UsageGroup) : "item";
  const kitchenCode = one(sp.kitchen) ?? "";
  const kitchen = kitchens.find((k) => k.code.toUpperCase() === kitchenCode.toUpperCase());

  const parsed = usageQuery.safeParse({ from, to, groupBy, ...(kitchen ? { kitchen: kitchen.code } : {}) });
  const errors: Record<string, string> = {};
  if (!parsed.success) for (const issue of parsed.error.issues) errors[String(issue.path[0])] ??= issue.message;
  if (kitchenCode && !kitchen) errors.kitchen = `No kitchen ${kitchenCode}: choose one from the list.`;
  const ok = parsed.success && !errors.kitchen;

  const query = (extra: Record<string, string>) => {
    const q = new URLSearchParams({ from, to, groupBy });
    if (kitchen) q.set("kitchen", kitchen.code);
    for (const [k, v] of Object.entries(extra)) q.set(k, v);
    return q.toString();
  };
  // the table's grouping and, for the chart, by category: one costing run for both
  const [report, byCategory] = ok ? await usageReports(user, parsed.data, [groupBy, "category"]) : [null, null];
  const categories = groupBy === "category" ? report : byCategory;
  const exports: ExportLink[] = ok && can(user, "reports.export")
    ? [
        { href: `/api/reports/usage?${query({ format: "csv" })}`, label: "CSV", hint: "Comma-separated values in UTF-8", kind: "csv" },
        { href: `/api/reports/usage?${query({ format: "csv", bom: "true" })}`, label: "CSV for spreadsheet programs", hint: "The same CSV with a byte order mark, so spreadsheet programs read accents and currency signs right", kind: "csv" },
        { href: `/api/reports/usage?${query({ format: "xlsx" })}`, label: "Spreadsheet (.xlsx)", hint: "An Excel workbook with the rows and the totals", kind: "xlsx" },
      ]
    : [];
  const cure = Boolean(report?.rows.some((r) => r.category === "cure") || categories?.rows.some((r) => r.category === "cure"));

  return (
    <>
      <ReportCrumbs trail={[{ label: "Usage" }]} />
      <PageHeader
        title="Usage"
        kitchen={kitchen ?? null}
        description="What the kitchens used and wasted each month, and what it cost by the company's cost formula. Stock count differences are shown apart."
      />
      <ReportControls action="/reports/usage" label="Report options">
        <input type="hidden" name="groupBy" value={groupBy} />
        <Control id="usage-from" label="From month" error={errors.from}>
          <input id="usage-from" name="from" type="month" defaultValue={from} required pattern="\d{4}-\d{2}" placeholder="yyyy-mm" className="field-input w-44"
            aria-invalid={errors.from ? true : undefined} aria-describedby={errors.from ? "usage-from-error" : undefined} />
        </Control>
        <Control id="usage-to" label="To month" error={errors.to}>
          <input id="usage-to" name="to" type="month" defaultValue={to} required pattern="\d{4}-\d{2}" placeholder="yyyy-mm" className="field-input w-44"
            aria-invalid={errors.to ? true : undefined} aria-describedby={errors.to ? "usage-to-error" : undefined} />
        </Control>
        <KitchenSelect value={kitchen?.code ?? ""} kitchens={kitchens} />
        {errors.kitchen ? <p className="field-error w-full">{errors.kitchen}</p> : null}
      </ReportControls>

      <div className="mb-4 flex flex-wrap items-center justify-between gap-3">
        <nav aria-label="Group by" className="flex items-center gap-2">
          <span className="text-sm font-semibold text-brine">Group by</span>
          <ul className="inline-flex rounded-md border border-brine-line bg-white p-0.5">
            {USAGE_GROUPS.map((g) => (
              <li key={g}>
                <Link
                  href={`/reports/usage?${query({ groupBy: g })}`}
                  aria-current={g === groupBy ? "page" : undefined}
                  className={`inline-flex min-h-[40px] items-center rounded px-4 font-semibold ${g === groupBy ? "bg-smoke text-white" : "text-pepper hover:bg-salt-deep"}`}
                >
                  {GROUP_WORDS[g]}
                </Link>
              </li>
            ))}
          </ul>
        </nav>
        {exports.length ? <ExportLinks links={exports} /> : null}
      </div>

      {report ? (
        <>
          <FormulaNote formula={report.costFormula}>
            Count differences (stock counts and adjustments; gains positive) are not usage: they have their own columns and are not added to the cost.
          </FormulaNote>
          {cure ? <CureCaution className="mb-4 max-w-4xl" /> : null}
          {report.rows.length === 0 ? (
            <EmptyState title={`Nothing used, wasted or counted differently in ${rangeWords(report.from, report.to)}`} icon={<BarChart3 aria-hidden className="h-8 w-8" />}>
              <p>Usage shows here once stock is used in production or by hand, or wasted{kitchen ? ` in ${kitchen.name}` : ""}. Choose other months or all kitchens above.</p>
            </EmptyState>
          ) : (
            <div className="space-y-6">
              {categories ? <CategoryChart report={categories} /> : null}
              <UsageTable report={report} drill={(r) => `/reports/usage/movements?${new URLSearchParams({
                month: r.month, item: r.item!.id, ...(kitchen ? { kitchen: kitchen.code } : {}), from: report.from, to: report.to,
              }).toString()}`} />
            </div>
          )}
        </>
      ) : (
        <EmptyState title="Choose the months to report" icon={<BarChart3 aria-hidden className="h-8 w-8" />}>
          <p>Give a first and a last month (at most 36 months) and press Show.</p>
        </EmptyState>
      )}
    </>
  );
}

// ---------------------------------------------------------------------------------------------

function Section({ id, title, note, children }: { id: string; title: string; note?: ReactNode; children: ReactNode }) {
  return (
    <section aria-labelledby={id} className="min-w-0 space-y-3">
      <div>
        <h2 id={id} className="text-xl font-semibold">{title}</h2>
        {note ? <p className="text-sm text-brine">{note}</p> : null}
      </div>
      {children}
    </section>
  );
}

/** Cost per month, stacked by category: the chart, and the same figures in a table under it. */
function CategoryChart({ report }: { report: UsageReport }) {
  const months = monthsBetween(report.from, report.to).map((month) => {
    const figures = Object.fromEntries(ITEM_CATEGORIES.map((c) => [c, ZERO.toFixed(currencyExponent(report.currency))])) as Record<ItemCategory, string>;
    let total = ZERO;
    for (const r of report.rows.filter((x) => x.month === month)) {
      figures[r.category!] = r.cost;
      total = total.add(dec(r.cost));
    }
    return { month, ...figures, total: total.toFixed(currencyExponent(report.currency)) };
  });
  const labels = Object.fromEntries(ITEM_CATEGORIES.map((c) => [c, CATEGORY_WORDS[c].many])) as Record<ItemCategory, string>;
  const order: ItemCategory[] = ["cure", "casing", "spice", "ingredient"];
  return (
    <Section id="usage-chart" title="Cost per month by category" note="Used and wasted together; count differences are left out.">
      <div className="panel space-y-2 p-4">
        <UsageChart months={months} currency={report.currency} labels={labels} />
        <div className="overflow-x-auto">
          <table className="w-full border-collapse text-left text-sm">
            <caption className="sr-only">Cost per month by category</caption>
            <thead className="border-b border-salt-edge text-brine">
              <tr>
                <th scope="col" className="px-2 py-2 font-semibold">Month</th>
                {order.map((c) => <th key={c} scope="col" className="px-2 py-2 text-right font-semibold">{labels[c]}</th>)}
                <th scope="col" className="px-2 py-2 text-right font-semibold">Total</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-salt-edge">
              {months.map((m) => (
                <tr key={m.month}>
                  <th scope="row" className="whitespace-nowrap px-2 py-1.5 font-semibold">{monthLabel(m.month)}</th>
                  {order.map((c) => <td key={c} className="num whitespace-nowrap px-2 py-1.5 text-right tabular-nums">{money(m[c], report.currency)}</td>)}
                  <td className="num whitespace-nowrap px-2 py-1.5 text-right font-semibold tabular-nums">{money(m.total, report.currency)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </div>
    </Section>
  );
}

const th = "whitespace-nowrap px-3 py-2 font-semibold";
const cell = "num whitespace-nowrap px-3 py-2 text-right tabular-nums";
const zeroMuted = (v: string) => (dec(v).isZero() ? "text-brine" : "");

/** The report's rows, a block per month, with a subtotal per month when there are several, and the totals. */
function UsageTable({ report, drill }: { report: UsageReport; drill: (r: UsageRow) => string }) {
  const byItem = report.groupBy === "item";
  const months = [...new Set(report.rows.map((r) => r.month))];
  const columns = byItem ? 8 : 5;
  const name = { item: "Item", category: "Category", kitchen: "Kitchen" }[report.groupBy];
  const subtotal = (rows: UsageRow[], f: (r: UsageRow) => string) => rows.reduce((s, r) => s.add(dec(f(r))), ZERO).toFixed(currencyExponent(report.currency));
  const caption = `Usage and cost by month and ${name.toLowerCase()}, ${rangeWords(report.from, report.to)}${report.kitchen ? `, ${report.kitchen.name}` : ", all kitchens"}`;
  return (
    <Section
      id="usage-table"
      title={`By ${name.toLowerCase()}`}
      note={byItem ? "Quantities are in each item's stock unit and are not totalled (units differ). Open an item to see its movements of the month." : undefined}
    >
      <div className="panel overflow-x-auto">
        <table className="w-full border-collapse text-left text-[15px]">
          <caption className="sr-only">{caption}</caption>
          <thead className="border-b border-salt-edge bg-salt-deep/60 text-sm text-brine">
            {byItem ? (
              <>
                <tr>
                  <th scope="col" rowSpan={2} className={`${th} text-left align-bottom`}>Item</th>
                  <th scope="colgroup" colSpan={2} className={`${th} border-l border-salt-edge pb-0 text-center`}>Used</th>
                  <th scope="colgroup" colSpan={2} className={`${th} border-l border-salt-edge pb-0 text-center`}>Wasted</th>
                  <th scope="col" rowSpan={2} className={`${th} border-l border-salt-edge text-right align-bottom`}>Cost</th>
                  <th scope="colgroup" colSpan={2} className={`${th} border-l border-salt-edge pb-0 text-center`}>Count difference</th>
                </tr>
                <tr>
                  <th scope="col" className={`${th} border-l border-salt-edge text-right`}>Quantity</th>
                  <th scope="col" className={`${th} text-right`}>Cost</th>
                  <th scope="col" className={`${th} border-l border-salt-edge text-right`}>Quantity</th>
                  <th scope="col" className={`${th} text-right`}>Cost</th>
                  <th scope="col" className={`${th} border-l border-salt-edge text-right`}>Quantity</th>
                  <th scope="col" className={`${th} text-right`}>Value</th>
                </tr>
              </>
            ) : (
              <tr>
                <th scope="col" className={`${th} text-left`}>{name}</th>
                <th scope="col" className={`${th} text-right`}>Used</th>
                <th scope="col" className={`${th} text-right`}>Wasted</th>
                <th scope="col" className={`${th} text-right`}>Cost</th>
                <th scope="col" className={`${th} text-right`}>Count difference</th>
              </tr>
            )}
          </thead>
          {months.map((month) => {
            const rows = report.rows.filter((r) => r.month === month);
            return (
              <tbody key={month} className="divide-y divide-salt-edge border-b border-salt-edge">
                <tr className="bg-salt/70">
                  <th scope="colgroup" colSpan={columns} className="px-3 pb-1.5 pt-3 text-left font-display text-base font-semibold text-pepper">{monthLabel(month)}</th>
                </tr>
                {rows.map((r) => (
                  <tr key={`${month}:${r.item?.id ?? r.category ?? r.kitchen?.id}`}>
                    <th scope="row" className="min-w-[11rem] px-3 py-2 text-left align-middle font-semibold">
                      {byItem ? (
                        <>
                          <span className="flex flex-wrap items-center gap-x-2 gap-y-1">
                            <Link href={drill(r)} className="text-pepper underline decoration-brine-line underline-offset-2 hover:decoration-paprika">
                              {r.item!.name}
                              <span className="sr-only">: movements of {monthLabel(month)}</span>
                            </Link>
                            {r.category === "cure" ? <CureMarker /> : null}
                          </span>
                          <span className="block text-sm font-normal text-brine">{r.item!.sku} · {CATEGORY_WORDS[r.category!].one}</span>
                        </>
                      ) : report.groupBy === "category" ? (
                        <span className="flex flex-wrap items-center gap-2">{CATEGORY_WORDS[r.category!].many}{r.category === "cure" ? <CureMarker /> : null}</span>
                      ) : (
                        <>{r.kitchen!.name} <span className="font-normal text-brine">({r.kitchen!.code})</span></>
                      )}
                    </th>
                    {byItem ? (
                      <>
                        <td className={`${cell} border-l border-salt-edge ${zeroMuted(r.usedQuantity!)}`}>{quantityText(r.usedQuantity!, r.unit!)}</td>
                        <td className={`${cell} ${zeroMuted(r.usedCost)}`}>{money(r.usedCost, report.currency)}</td>
                        <td className={`${cell} border-l border-salt-edge ${zeroMuted(r.wastedQuantity!)}`}>{quantityText(r.wastedQuantity!, r.unit!)}</td>
                        <td className={`${cell} ${zeroMuted(r.wastedCost)}`}>{money(r.wastedCost, report.currency)}</td>
                        <td className={`${cell} border-l border-salt-edge font-semibold`}>{money(r.cost, report.currency)}</td>
                        <td className={`${cell} border-l border-salt-edge ${zeroMuted(r.countDifferenceQuantity!)}`}>{quantityText(r.countDifferenceQuantity!, r.unit!)}</td>
                        <td className={`${cell} ${zeroMuted(r.countDifferenceCost)}`}>{money(r.countDifferenceCost, report.currency)}</td>
                      </>
                    ) : (
                      <>
                        <td className={`${cell} ${zeroMuted(r.usedCost)}`}>{money(r.usedCost, report.currency)}</td>
                        <td className={`${cell} ${zeroMuted(r.wastedCost)}`}>{money(r.wastedCost, report.currency)}</td>
                        <td className={`${cell} font-semibold`}>{money(r.cost, report.currency)}</td>
                        <td className={`${cell} ${zeroMuted(r.countDifferenceCost)}`}>{money(r.countDifferenceCost, report.currency)}</td>
                      </>
                    )}
                  </tr>
                ))}
                {months.length > 1 ? (
                  <tr className="text-brine">
                    <th scope="row" className="px-3 py-2 text-left font-semibold">{monthLabel(month)}, total</th>
                    {byItem ? (
                      <>
                        <td className="border-l border-salt-edge" />
                        <td className={cell}>{money(subtotal(rows, (r) => r.usedCost), report.currency)}</td>
                        <td className="border-l border-salt-edge" />
                        <td className={cell}>{money(subtotal(rows, (r) => r.wastedCost), report.currency)}</td>
                        <td className={`${cell} border-l border-salt-edge font-semibold text-pepper`}>{money(subtotal(rows, (r) => r.cost), report.currency)}</td>
                        <td className="border-l border-salt-edge" />
                        <td className={cell}>{money(subtotal(rows, (r) => r.countDifferenceCost), report.currency)}</td>
                      </>
                    ) : (
                      <>
                        <td className={cell}>{money(subtotal(rows, (r) => r.usedCost), report.currency)}</td>
                        <td className={cell}>{money(subtotal(rows, (r) => r.wastedCost), report.currency)}</td>
                        <td className={`${cell} font-semibold text-pepper`}>{money(subtotal(rows, (r) => r.cost), report.currency)}</td>
                        <td className={cell}>{money(subtotal(rows, (r) => r.countDifferenceCost), report.currency)}</td>
                      </>
                    )}
                  </tr>
                ) : null}
              </tbody>
            );
          })}
          <tfoot className="border-t-2 border-brine-line bg-salt-deep/40">
            <tr>
              <th scope="row" className="px-3 py-2.5 text-left font-semibold">Total{report.from !== report.to ? `, ${rangeWords(report.from, report.to)}` : ""}</th>
              {byItem ? (
                <>
                  <td className="border-l border-salt-edge" />
                  <td className={`${cell} font-semibold`} data-testid="usage-total-used">{money(report.totals.usedCost, report.currency)}</td>
                  <td className="border-l border-salt-edge" />
                  <td className={`${cell} font-semibold`} data-testid="usage-total-wasted">{money(report.totals.wastedCost, report.currency)}</td>
                  <td className={`${cell} border-l border-salt-edge font-semibold`} data-testid="usage-total-cost">{money(report.totals.cost, report.currency)}</td>
                  <td className="border-l border-salt-edge" />
                  <td className={`${cell} font-semibold`} data-testid="usage-total-count">{money(report.totals.countDifferenceCost, report.currency)}</td>
                </>
              ) : (
                <>
                  <td className={`${cell} font-semibold`} data-testid="usage-total-used">{money(report.totals.usedCost, report.currency)}</td>
                  <td className={`${cell} font-semibold`} data-testid="usage-total-wasted">{money(report.totals.wastedCost, report.currency)}</td>
                  <td className={`${cell} font-semibold`} data-testid="usage-total-cost">{money(report.totals.cost, report.currency)}</td>
                  <td className={`${cell} font-semibold`} data-testid="usage-total-count">{money(report.totals.countDifferenceCost, report.currency)}</td>
                </>
              )}
            </tr>
          </tfoot>
        </table>
      </div>
    </Section>
  );
}
