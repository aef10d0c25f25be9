// Reports > Price variance: every delivered line booked in the months, its price as ordered, as
// delivered and on the supplier's price list that day (per buying unit), and what the differences
// come to, per supplier and month with totals (lib/data/price-variance.ts getPriceVariance, the same
// figures as GET /api/reports/price-variance and its CSV). The query is the URL (from, to,
// supplier); by default last month in the company's calendar.
import { Receipt } from "lucide-react";
import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { CureCaution } from "@/components/cure/cure-caution";
import { CureMarker } from "@/components/cure/cure-marker";
import { Control, ExportLinks, money, quantityText, ReportControls, ReportCrumbs, type ExportLink } from "@/components/reports/report-parts";
import { PageHeader } from "@/components/shell/page-header";
import { Badge } from "@/components/ui/badge";
import { EmptyState } from "@/components/ui/empty-state";
import { dateInZone } from "@/lib/alerts/expiry";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { getCompany } from "@/lib/data/companies";
import { getPriceVariance, type PriceVarianceReport } from "@/lib/data/price-variance";
import { listSuppliers } from "@/lib/data/suppliers";
import { monthLabel } from "@/lib/periods/months";
import { dayWords, previousMonth, rangeWords } from "@/lib/reports/months";
import { currencyExponent, dec } from "@/lib/units";
import { priceVarianceQuery, type PriceVarianceGroup, type PriceVarianceRow, type PriceVarianceTotals } from "@/lib/validation/price-variance";

export const metadata: Metadata = { title: "Price variance" };
export const dynamic = "force-dynamic";

const one = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v)?.trim() || undefined;

export default async function PriceVariancePage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requireUser();
  if (!can(user, "reports.read")) notFound();
  const sp = await searchParams;
  const company = await getCompany(user);
  const lastMonth = previousMonth(dateInZone(new Date(), company.timeZone));
  const from = one(sp.from) ?? one(sp.to) ?? lastMonth;
  const to = one(sp.to) ?? from;
  const suppliers = can(user, "purchasing.read") ? await listSuppliers(user, { includeInactive: true }) : [];
  const supplierId = one(sp.supplier) ?? "";
  const supplier = suppliers.find((s) => s.id === supplierId);

  const parsed = priceVarianceQuery.safeParse({ from, to, ...(supplierId ? { supplier: supplierId } : {}) });
  const errors: Record<string, string> = {};
  if (!parsed.success) for (const issue of parsed.error.issues) errors[String(issue.path[0])] ??= issue.message;
  if (supplierId && !supplier) errors.supplier = "No such supplier: choose one from the list.";
  const ok = parsed.success && !errors.supplier;
  const report = ok ? await getPriceVariance(user, parsed.data) : null;

  const q = new URLSearchParams({ from, to, ...(supplier ? { supplier: supplier.id } : {}), format: "csv" });
  const exports: ExportLink[] = ok && can(user, "reports.export")
    ? [{ href: `/api/reports/price-variance?${q.toString()}`, label: "CSV", hint: "Every line with its prices and differences, comma-separated, UTF-8", kind: "csv" }]
    : [];

  return (
    <>
      <ReportCrumbs trail={[{ label: "Price variance" }]} />
      <PageHeader
        title="Price variance"
        description="What deliveries cost against what was ordered and against the supplier's price list on the day, per supplier and month. More than ordered or listed is positive."
      />
      <ReportControls action="/reports/price-variance" label="Report options">
        <Control id="pv-from" label="From month" error={errors.from}>
          <input id="pv-from" name="from" type="month" defaultValue={from} required pattern="\d{4}-\d{2}" placeholder="yyyy-mm" className="field-input w-44"
            aria-invalid={errors.from ? true : undefined} aria-describedby={errors.from ? "pv-from-error" : undefined} />
        </Control>
        <Control id="pv-to" label="To month" error={errors.to}>
          <input id="pv-to" name="to" type="month" defaultValue={to} required pattern="\d{4}-\d{2}" placeholder="yyyy-mm" className="field-input w-44"
            aria-invalid={errors.to ? true : undefined} aria-describedby={errors.to ? "pv-to-error" : undefined} />
        </Control>
        <Control id="pv-supplier" label="Supplier" error={errors.supplier}>
          <select id="pv-supplier" name="supplier" defaultValue={supplier?.id ?? ""} className="field-input w-64">
            <option value="">All suppliers</option>
            {suppliers.map((s) => <option key={s.id} value={s.id}>{s.name}{s.active ? "" : " (inactive)"}</option>)}
          </select>
        </Control>
      </ReportControls>
      {exports.length ? <div className="mb-4 flex justify-end"><ExportLinks links={exports} /></div> : null}

      {report ? (
        <>
          <p className="mb-4 max-w-4xl text-sm text-brine">
            Prices are per buying unit (a kilogram, a metre, a hank and so on, by your unit system), before freight. The differences are worked per stock unit on the exact
            prices and rounded once, half-even, to the currency&rsquo;s smallest unit; a total adds the exact figures, so it can be a cent off the sum of the lines.
          </p>
          {report.cureCaution ? <CureCaution className="mb-4 max-w-4xl" /> : null}
          {report.rows.length === 0 ? (
            <EmptyState title={`No deliveries booked in ${rangeWords(report.from, report.to)}${report.supplier ? ` from ${report.supplier.name}` : ""}`} icon={<Receipt aria-hidden className="h-8 w-8" />}>
              <p>Lines show here once a delivery is booked into stock (Buying, Deliveries). Choose other months or all suppliers above.</p>
            </EmptyState>
          ) : (
            <VarianceTable report={report} />
          )}
        </>
      ) : (
        <EmptyState title="Choose the months to report" icon={<Receipt aria-hidden className="h-8 w-8" />}>
          <p>Give a first and a last month (at most 24 months) and press Show.</p>
        </EmptyState>
      )}
    </>
  );
}

// ---------------------------------------------------------------------------------------------

const th = "px-3 py-2 font-semibold";
const cell = "num whitespace-nowrap px-3 py-2 text-right tabular-nums";

/** A price per buying unit: the 4 decimals the report gives, trailing zeros dropped down to the currency's own. */
function priceText(value: string, currency: string): string {
  const places = currencyExponent(currency);
  const [whole, fraction = ""] = value.split(".");
  let f = fraction.replace(/0+$/, "");
  if (f.length < places) f = f.padEnd(places, "0");
  return money(f ? `${whole}.${f}` : whole!, currency);
}

const signed = (v: string, currency: string) => `${dec(v).gt(0) ? "+" : ""}${money(v, currency)}`;

/** "—" where there is nothing to compare, and why, in words a screen reader reads too. */
function Missing({ why }: { why: string }) {
  return (
    <>
      <span aria-hidden>—</span>
      <span className="block text-xs font-normal text-brine">{why}</span>
    </>
  );
}

function VarianceTable({ report }: { report: PriceVarianceReport }) {
  const cur = report.currency;
  let at = 0;
  const blocks = report.groups.map((g) => {
    const rows = report.rows.slice(at, at + g.lines);
    at += g.lines;
    return { g, rows };
  });
  return (
    <section aria-labelledby="pv-table" className="min-w-0 space-y-3">
      <div>
        <h2 id="pv-table" className="text-xl font-semibold">By supplier and month</h2>
        <p className="text-sm text-brine">
          A dash means there is nothing to compare: <strong className="font-semibold text-pepper-soft">not on an order</strong> (delivered without an order line) or{" "}
          <strong className="font-semibold text-pepper-soft">no list price</strong> (the supplier&rsquo;s price list had no price for that pack on the day). Such
          lines are left out of that total and counted under it.
        </p>
      </div>
      <div className="panel overflow-x-auto">
        <table className="w-full border-collapse text-left text-[15px]">
          <caption className="sr-only">Price variance by supplier and month, {rangeWords(report.from, report.to)}</caption>
          <thead className="border-b border-salt-edge bg-salt-deep/60 text-sm text-brine">
            <tr>
              <th scope="col" rowSpan={2} className={`${th} text-left align-bottom`}>Delivered</th>
              <th scope="col" rowSpan={2} className={`${th} text-left align-bottom`}>Item</th>
              <th scope="colgroup" colSpan={3} className={`${th} border-l border-salt-edge pb-0 text-center`}>Price per buying unit</th>
              <th scope="colgroup" colSpan={2} className={`${th} border-l border-salt-edge pb-0 text-center`}>Difference</th>
            </tr>
            <tr>
              <th scope="col" className={`${th} whitespace-nowrap border-l border-salt-edge text-right`}>Ordered</th>
              <th scope="col" className={`${th} whitespace-nowrap text-right`}>Delivered</th>
              <th scope="col" className={`${th} whitespace-nowrap text-right`}>List</th>
              <th scope="col" className={`${th} whitespace-nowrap border-l border-salt-edge text-right`}>Over order</th>
              <th scope="col" className={`${th} whitespace-nowrap text-right`}>Over list</th>
            </tr>
          </thead>
          {blocks.map(({ g, rows }) => (
            <tbody key={`${g.supplierId}:${g.month}`} className="divide-y divide-salt-edge border-b border-salt-edge">
              <tr className="bg-salt/70">
                <th scope="colgroup" colSpan={7} className="px-3 pb-1.5 pt-3 text-left font-display text-base font-semibold text-pepper">
                  {g.supplierName} <span className="font-sans text-sm font-normal text-brine">· {monthLabel(g.month)}</span>
                </th>
              </tr>
              {rows.map((r) => <Line key={`${r.deliveryId}:${r.lineNo}`} r={r} currency={cur} />)}
              <SumRow label={`${g.supplierName}, ${monthLabel(g.month)}`} s={g} currency={cur} />
            </tbody>
          ))}
          <tfoot className="border-t-2 border-brine-line bg-salt-deep/40">
            <SumRow label={`Total, ${rangeWords(report.from, report.to)}`} s={report.totals} currency={cur} total />
          </tfoot>
        </table>
      </div>
    </section>
  );
}

function Line({ r, currency }: { r: PriceVarianceRow; currency: string }) {
  const per = <span className="text-brine"> /{r.buyingUnit}</span>;
  return (
    <tr>
      <td className="whitespace-nowrap px-3 py-2 align-top">
        <span className="num">{dayWords(r.deliveredOn).replace(/ \d{4}$/, "")}</span>
        <span className="block text-sm text-brine">{r.noteNumber} · line {r.lineNo}</span>
      </td>
      <th scope="row" className="min-w-[12rem] px-3 py-2 text-left align-top font-semibold">
        <span className="flex flex-wrap items-center gap-x-2 gap-y-1">
          {r.itemName}
          {r.category === "cure" ? <CureMarker /> : null}
          {r.substitute ? <Badge>Substitute</Badge> : null}
        </span>
        <span className="block text-sm font-normal text-brine">
          {r.packs} × {r.packLabel} · {quantityText(r.quantity, r.stockUnit)}{r.orderNumber ? ` · ${r.orderNumber}` : ""}
        </span>
      </th>
      <td className={`${cell} border-l border-salt-edge align-top`}>
        {r.orderedPerBuyingUnit !== null ? <>{priceText(r.orderedPerBuyingUnit, currency)}{per}</> : <Missing why="not on an order" />}
      </td>
      <td className={`${cell} align-top font-semibold`}>{priceText(r.deliveredPerBuyingUnit, currency)}{per}</td>
      <td className={`${cell} align-top`}>
        {r.listPerBuyingUnit !== null ? <>{priceText(r.listPerBuyingUnit, currency)}{per}</> : <Missing why="no list price" />}
      </td>
      <td className={`${cell} border-l border-salt-edge align-top`}>
        {r.orderVariance !== null ? signed(r.orderVariance, currency) : <Missing why="not on an order" />}
      </td>
      <td className={`${cell} align-top`}>{r.listVariance !== null ? signed(r.listVariance, currency) : <Missing why="no list price" />}</td>
    </tr>
  );
}

function SumRow({ label, s, currency, total = false }: { label: string; s: PriceVarianceTotals | PriceVarianceGroup; currency: string; total?: boolean }) {
  const notes = [
    `${s.lines} ${s.lines === 1 ? "line" : "lines"}, ${money(s.deliveredValue, currency)} delivered`,
    s.withoutOrder ? `${s.withoutOrder} not on an order` : null,
    s.withoutListPrice ? `${s.withoutListPrice} without a list price` : null,
  ].filter(Boolean);
  return (
    <tr className={total ? "" : "text-pepper-soft"}>
      <th scope="row" colSpan={5} className={`px-3 ${total ? "py-2.5" : "py-2"} text-left font-semibold`}>
        {label}
        <span className="block text-sm font-normal text-brine">{notes.join("; ")}</span>
      </th>
      <td className={`${cell} border-l border-salt-edge font-semibold`} data-testid={total ? "pv-total-order" : undefined}>
        {s.orderVariance !== null ? signed(s.orderVariance, currency) : <Missing why="nothing to compare" />}
      </td>
      <td className={`${cell} font-semibold`} data-testid={total ? "pv-total-list" : undefined}>
        {s.listVariance !== null ? signed(s.listVariance, currency) : <Missing why="nothing to compare" />}
      </td>
    </tr>
  );
}
