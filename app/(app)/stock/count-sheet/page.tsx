// A printable count sheet: every item of the current kitchen (each lot of a tracked item) with what
// the books say is on hand and an empty box to write the count in. Server-rendered from getStock;
// print CSS drops the rail, the header and the buttons.
import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { ArrowLeft } from "lucide-react";
import { CureMarker } from "@/components/cure/cure-marker";
import { CureCaution } from "@/components/cure/cure-caution";
import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { buildRows, DATE_KIND_WORDS, quantityText, stockUnitText, stockUnitWord, type GridRow } from "@/components/stock/stock-rows";
import { can, canSomewhere } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { getCurrentKitchen } from "@/lib/data/current-kitchen";
import { getStock } from "@/lib/data/stock";
import { PrintButton } from "./_components/print-button";

export const metadata: Metadata = { title: "Count sheet" };
export const dynamic = "force-dynamic";

const UNIT_NAMES: Record<string, string> = { g: "g", m: "m", ml: "ml", pc: "pc" };

export default async function CountSheetPage() {
  const user = await requireUser();
  if (!canSomewhere(user, "stock.read")) notFound();
  const kitchen = await getCurrentKitchen(user);
  if (!kitchen || !can(user, "stock.read", { kitchenId: kitchen.id })) notFound();
  const [stock] = await getStock(user, kitchen.code);
  const rows = buildRows(stock?.rows ?? []);
  const printedAt = new Intl.DateTimeFormat("en-GB", { timeZone: user.timeZone, dateStyle: "long", timeStyle: "short" }).format(new Date());
  const lines = rows.filter((r) => r.kind !== "group" && (r.kind === "lot" || !r.item.trackLots || r.item.lots.length === 0)).length;

  return (
    <div>
      <div className="mb-4 flex items-center justify-between gap-3 print:hidden">
        <Link href="/stock" className="btn-quiet">
          <ArrowLeft aria-hidden className="h-5 w-5" /> Back to stock
        </Link>
        <PrintButton />
      </div>
      <PageHeader
        title="Count sheet"
        kitchen={kitchen}
        description={`${lines} ${lines === 1 ? "line" : "lines"} · printed ${printedAt}. Count each line in the unit shown and write the figure in its box; tracked items are counted lot by lot.`}
      />
      <dl className="mb-4 hidden grid-cols-2 gap-6 print:grid">
        <div className="border-b border-pepper pb-1"><dt className="inline font-semibold">Counted by: </dt><dd className="inline" /></div>
        <div className="border-b border-pepper pb-1"><dt className="inline font-semibold">Date and time: </dt><dd className="inline" /></div>
      </dl>
      {rows.some((r) => r.kind === "item" && r.item.cure) ? <CureCaution className="mb-4" /> : null}
      {rows.length === 0 ? (
        <EmptyState title="Nothing to count yet">
          <p>Items are added under Stock › Items by a buyer or manager; once they exist they are listed here to count.</p>
        </EmptyState>
      ) : (
        <div className="panel overflow-x-auto print:overflow-visible print:rounded-none print:border-0">
          <table className="w-full border-collapse text-left text-[15px]">
            <caption className="sr-only">Count sheet of {kitchen.name}</caption>
            <thead className="border-b-2 border-pepper/40 bg-salt-deep/60 text-sm text-pepper-soft print:bg-transparent">
              <tr>
                <th scope="col" className="px-3 py-2">SKU</th>
                <th scope="col" className="px-3 py-2">Item</th>
                <th scope="col" className="px-3 py-2">Lot</th>
                <th scope="col" className="px-3 py-2">Date</th>
                <th scope="col" className="px-3 py-2">Unit</th>
                <th scope="col" className="px-3 py-2 text-right">On hand</th>
                <th scope="col" className="px-3 py-2 text-right">Counted</th>
              </tr>
            </thead>
            <tbody>{rows.map((r) => <SheetRow key={r.id} row={r} unitSystem={user.unitSystem} />)}</tbody>
          </table>
        </div>
      )}
    </div>
  );
}

function CountBox() {
  return <span aria-hidden className="inline-block h-9 w-32 rounded-sm border-2 border-pepper/70 bg-white align-middle print:h-7 print:w-28" />;
}

function SheetRow({ row, unitSystem }: { row: GridRow; unitSystem: "metric" | "us" }) {
  if (row.kind === "group") {
    return (
      <tr className="break-inside-avoid border-b border-salt-edge bg-salt-deep/50 print:bg-transparent">
        <th scope="colgroup" colSpan={7} className="px-3 pb-1 pt-4 font-display text-lg font-semibold">{row.label}</th>
      </tr>
    );
  }
  const item = row.item;
  const unit = item.casing?.putUp ? `${stockUnitWord(item)} (${UNIT_NAMES[item.unit]})` : UNIT_NAMES[item.unit];
  if (row.kind === "item") {
    const countedByLot = item.trackLots && item.lots.length > 0;
    const onHand = quantityText(item.onHand, item, unitSystem);
    return (
      <tr className="break-inside-avoid border-b border-salt-edge">
        <td className="num px-3 py-2 align-middle font-semibold">{item.sku}</td>
        <td className="px-3 py-2 align-middle">
          <span className="font-semibold">{row.label}</span>
          {item.casing ? <span className="block text-sm text-brine">{item.name}</span> : null}
          {item.cure ? <CureMarker className="ml-2" /> : null}
        </td>
        <td className="px-3 py-2 align-middle text-brine" colSpan={2}>
          {countedByLot ? "count each lot below" : item.trackLots ? "no lots in stock" : ""}
        </td>
        <td className="px-3 py-2 align-middle">{unit}</td>
        <td className="num px-3 py-2 text-right align-middle tabular-nums">
          {stockUnitText(item.onHand, item)}
          {onHand.length ? <span className="block text-sm text-brine">{onHand.length}</span> : null}
        </td>
        <td className="px-3 py-2 text-right align-middle">{countedByLot ? null : <CountBox />}</td>
      </tr>
    );
  }
  const lot = row.lot;
  return (
    <tr className="break-inside-avoid border-b border-salt-edge">
      <td className="num px-3 py-2 align-middle text-brine">{item.sku}</td>
      <td className="px-3 py-2 pl-8 align-middle text-sm text-brine">{item.name}</td>
      <td className="num px-3 py-2 align-middle font-semibold">{lot.code}</td>
      <td className="num px-3 py-2 align-middle whitespace-nowrap">
        {lot.date ? `${lot.dateKind ? `${DATE_KIND_WORDS[lot.dateKind]} ` : ""}${lot.date}` : `received ${lot.receivedOn}`}
      </td>
      <td className="px-3 py-2 align-middle">{unit}</td>
      <td className="num px-3 py-2 text-right align-middle tabular-nums">{stockUnitText(lot.onHand, item)}</td>
      <td className="px-3 py-2 text-right align-middle"><CountBox /></td>
    </tr>
  );
}
