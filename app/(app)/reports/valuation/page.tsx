// Reports > Valuation: what the stock on hand was worth at the end of a day, by the company's cost
// formula (lib/data/reports.ts valuationReport, the same figures as GET /api/reports/valuation and
// its files), per kitchen and item, with totals per kitchen and per category. The query is the URL
// (asOf, kitchen); by default the last day of last month in the company's calendar.
import { Scale } from "lucide-react";
import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { CureCaution } from "@/components/cure/cure-caution";
import { CureMarker } from "@/components/cure/cure-marker";
import {
  CATEGORY_WORDS, Control, ExportLinks, FormulaNote, KitchenSelect, money, quantityFigure, ReportControls, ReportCrumbs, unitWords, type ExportLink,
} from "@/components/reports/report-parts";
import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { ITEM_CATEGORIES } from "@/db/types";
import { dateInZone } from "@/lib/alerts/expiry";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { getCompany } from "@/lib/data/companies";
import { listKitchens } from "@/lib/data/kitchens";
import { valuationReport, type ValuationReport } from "@/lib/data/reports";
import { dayWords, endOfPreviousMonth } from "@/lib/reports/months";
import { valuationQuery } from "@/lib/validation/reports";

export const metadata: Metadata = { title: "Valuation" };
export const dynamic = "force-dynamic";

const one = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v)?.trim() || undefined;

export default async function ValuationPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requireUser();
  if (!can(user, "reports.read")) notFound();
  const sp = await searchParams;
  const [company, kitchens] = await Promise.all([getCompany(user), listKitchens(user, { includeArchived: true })]);
  const today = dateInZone(new Date(), company.timeZone);
  const asOf = one(sp.asOf) ?? endOfPreviousMonth(today);
  const kitchenCode = one(sp.kitchen) ?? "";
  const kitchen = kitchens.find((k) => k.code.toUpperCase() === kitchenCode.toUpperCase());

  const parsed = valuationQuery.safeParse({ asOf, ...(kitchen ? { kitchen: kitchen.code } : {}) });
  const errors: Record<string, string> = {};
  if (!parsed.success) for (const issue of parsed.error.issues) errors[String(issue.path[0])] ??= issue.message;
  if (parsed.success && asOf > today) errors.asOf = `asOf: ${dayWords(asOf)} has not ended yet; choose today or an earlier day.`;
  if (kitchenCode && !kitchen) errors.kitchen = `No kitchen ${kitchenCode}: choose one from the list.`;
  const ok = parsed.success && !errors.asOf && !errors.kitchen;
  const report = ok ? await valuationReport(user, parsed.data) : null;

  const query = (extra: Record<string, string>) => {
    const q = new URLSearchParams({ asOf });
    if (kitchen) q.set("kitchen", kitchen.code);
    for (const [k, v] of Object.entries(extra)) q.set(k, v);
    return q.toString();
  };
  const exports: ExportLink[] = ok && can(user, "reports.export")
    ? [
        { href: `/api/reports/valuation?${query({ format: "csv" })}`, label: "CSV", hint: "Comma-separated values in UTF-8", kind: "csv" },
        { href: `/api/reports/valuation?${query({ format: "csv", bom: "true" })}`, label: "CSV for spreadsheet programs", hint: "The same CSV with a byte order mark, so spreadsheet programs read accents and currency signs right", kind: "csv" },
        { href: `/api/reports/valuation?${query({ format: "xlsx" })}`, label: "Spreadsheet (.xlsx)", hint: "An Excel workbook with the rows and the total", kind: "xlsx" },
      ]
    : [];

  return (
    <>
      <ReportCrumbs trail={[{ label: "Valuation" }]} />
      <PageHeader
        title="Valuation"
        kitchen={kitchen ?? null}
        description="What the stock on hand was worth at the end of a day, by the company's cost formula: per kitchen and item, with totals per kitchen and per category."
      />
      <ReportControls action="/reports/valuation" label="Report options">
        <Control id="valuation-as-of" label="At the end of" error={errors.asOf}>
          <input id="valuation-as-of" name="asOf" type="date" defaultValue={asOf} max={today} required className="field-input w-48"
            aria-invalid={errors.asOf ? true : undefined} aria-describedby={errors.asOf ? "valuation-as-of-error" : undefined} />
        </Control>
        <KitchenSelect value={kitchen?.code ?? ""} kitchens={kitchens} />
        {errors.kitchen ? <p className="field-error w-full">{errors.kitchen}</p> : null}
      </ReportControls>
      {exports.length ? <div className="mb-4 flex justify-end"><ExportLinks links={exports} /></div> : null}

      {report ? (
        <>
          <FormulaNote formula={report.costFormula} />
          {report.rows.some((r) => r.item.category === "cure") ? <CureCaution className="mb-4 max-w-4xl" /> : null}
          {report.rows.length === 0 ? (
            <EmptyState title={`No stock on hand at the end of ${dayWords(report.asOf)}`} icon={<Scale aria-hidden className="h-8 w-8" />}>
              <p>Stock is valued once it has been received{kitchen ? ` into ${kitchen.name}` : ""}. Choose a later day or all kitchens above.</p>
            </EmptyState>
          ) : (
            <div className="space-y-6">
              <Summaries report={report} />
              <ValuationTable report={report} />
            </div>
          )}
        </>
      ) : (
        <EmptyState title="Choose the day to value" icon={<Scale aria-hidden className="h-8 w-8" />}>
          <p>Give a day that has ended and press Show: the stock is valued as it stood at the end of that day.</p>
        </EmptyState>
      )}
    </>
  );
}

// ---------------------------------------------------------------------------------------------

const th = "whitespace-nowrap px-3 py-2 font-semibold";
const cell = "num whitespace-nowrap px-3 py-2 text-right tabular-nums";

/** Totals per kitchen and per category, side by side. */
function Summaries({ report }: { report: ValuationReport }) {
  const kitchens = [...new Map(report.rows.map((r) => [r.kitchen.code, r.kitchen])).values()];
  const categories = ITEM_CATEGORIES.filter((c) => report.totals.byCategory[c] !== undefined);
  return (
    <div className="grid gap-4 md:grid-cols-2">
      <SummaryTable
        id="valuation-by-kitchen"
        title="By kitchen"
        rows={kitchens.map((k) => ({ key: k.code, label: <>{k.name} <span className="font-normal text-brine">({k.code})</span></>, value: report.totals.byKitchen[k.code]! }))}
        total={report.totals.value}
        currency={report.currency}
      />
      <SummaryTable
        id="valuation-by-category"
        title="By category"
        rows={categories.map((c) => ({
          key: c,
          label: <span className="flex flex-wrap items-center gap-2">{CATEGORY_WORDS[c].many}{c === "cure" ? <CureMarker /> : null}</span>,
          value: report.totals.byCategory[c]!,
        }))}
        total={report.totals.value}
        currency={report.currency}
      />
    </div>
  );
}

function SummaryTable({ id, title, rows, total, currency }: { id: string; title: string; rows: { key: string; label: React.ReactNode; value: string }[]; total: string; currency: string }) {
  return (
    <section aria-labelledby={id} className="panel min-w-0 px-4 py-3">
      <h2 id={id} className="mb-1 text-lg font-semibold">{title}</h2>
      <table className="w-full border-collapse text-left text-[15px]">
        <caption className="sr-only">Value {title.toLowerCase()}</caption>
        <thead className="sr-only">
          <tr><th scope="col">{title.replace(/^By /, "")}</th><th scope="col">Value</th></tr>
        </thead>
        <tbody className="divide-y divide-salt-edge">
          {rows.map((r) => (
            <tr key={r.key}>
              <th scope="row" className="py-1.5 pr-3 text-left font-semibold">{r.label}</th>
              <td className="num whitespace-nowrap py-1.5 text-right tabular-nums">{money(r.value, currency)}</td>
            </tr>
          ))}
        </tbody>
        <tfoot className="border-t-2 border-brine-line">
          <tr>
            <th scope="row" className="py-1.5 pr-3 text-left font-semibold">Total</th>
            <td className="num whitespace-nowrap py-1.5 text-right font-semibold tabular-nums">{money(total, currency)}</td>
          </tr>
        </tfoot>
      </table>
    </section>
  );
}

/** A block per kitchen: its items with quantity, unit and value, then the kitchen's total; the grand total last. */
function ValuationTable({ report }: { report: ValuationReport }) {
  const kitchens = [...new Map(report.rows.map((r) => [r.kitchen.code, r.kitchen])).values()];
  return (
    <section aria-labelledby="valuation-table" className="min-w-0 space-y-3">
      <div>
        <h2 id="valuation-table" className="text-xl font-semibold">By kitchen and item</h2>
        <p className="text-sm text-brine">On hand in each item&rsquo;s stock unit at the end of {dayWords(report.asOf)}.</p>
      </div>
      <div className="panel overflow-x-auto">
        <table className="w-full border-collapse text-left text-[15px]">
          <caption className="sr-only">Stock value at the end of {dayWords(report.asOf)} by kitchen and item</caption>
          <thead className="border-b border-salt-edge bg-salt-deep/60 text-sm text-brine">
            <tr>
              <th scope="col" className={`${th} text-left`}>Item</th>
              <th scope="col" className={`${th} text-left`}>Category</th>
              <th scope="col" className={`${th} text-right`}>On hand</th>
              <th scope="col" className={`${th} text-left`}>Unit</th>
              <th scope="col" className={`${th} text-right`}>Value</th>
            </tr>
          </thead>
          {kitchens.map((k) => (
            <tbody key={k.code} className="divide-y divide-salt-edge border-b border-salt-edge">
              <tr className="bg-salt/70">
                <th scope="colgroup" colSpan={5} className="px-3 pb-1.5 pt-3 text-left font-display text-base font-semibold text-pepper">
                  {k.name} <span className="font-sans text-sm font-normal text-brine">({k.code})</span>
                </th>
              </tr>
              {report.rows.filter((r) => r.kitchen.code === k.code).map((r) => (
                <tr key={`${k.code}:${r.item.id}`}>
                  <th scope="row" className="min-w-[12rem] px-3 py-2 text-left align-middle font-semibold">
                    <span className="flex flex-wrap items-center gap-x-2 gap-y-1">{r.item.name}{r.item.category === "cure" ? <CureMarker /> : null}</span>
                    <span className="block text-sm font-normal text-brine">{r.item.sku}</span>
                  </th>
                  <td className="px-3 py-2">{CATEGORY_WORDS[r.item.category].one}</td>
                  <td className={cell}>{quantityFigure(r.quantity)}</td>
                  <td className="px-3 py-2">{unitWords(r.unit)}</td>
                  <td className={cell}>{money(r.value, report.currency)}</td>
                </tr>
              ))}
              <tr className="text-brine">
                <th scope="row" colSpan={4} className="px-3 py-2 text-left font-semibold">{k.name}, total</th>
                <td className={`${cell} font-semibold text-pepper`}>{money(report.totals.byKitchen[k.code]!, report.currency)}</td>
              </tr>
            </tbody>
          ))}
          <tfoot className="border-t-2 border-brine-line bg-salt-deep/40">
            <tr>
              <th scope="row" colSpan={4} className="px-3 py-2.5 text-left font-semibold">
                Total{report.kitchen ? `, ${report.kitchen.name}` : ", all kitchens"}
              </th>
              <td className={`${cell} font-semibold`} data-testid="valuation-total">{money(report.totals.value, report.currency)}</td>
            </tr>
          </tfoot>
        </table>
      </div>
    </section>
  );
}
