// Pieces the report pages share (server-safe): the trail back to Reports, the export links, the
// cost formula in words, the controls' frame, and how figures read. Money and quantities stay the
// exact decimal strings the reports return; only grouping and the currency symbol are added.
import { Download, FileSpreadsheet } from "lucide-react";
import Link from "next/link";
import type { ReactNode } from "react";
import type { ItemCategory, StockUnit } from "@/db/types";
import { amountText } from "@/components/purchasing/order-format";

export const CATEGORY_WORDS: Record<ItemCategory, { one: string; many: string }> = {
  cure: { one: "Cure", many: "Cures" },
  casing: { one: "Casing", many: "Casings" },
  spice: { one: "Spice", many: "Spices" },
  ingredient: { one: "Other ingredient", many: "Other ingredients" },
};

/** The cost formula as a person says it. */
export const FORMULA_WORDS = { fifo: "FIFO", average: "moving average" } as const;
const FORMULA_EXPLAINED = {
  fifo: "first in, first out: what leaves a kitchen is costed at the cost of the oldest receipts still there",
  average: "what leaves a kitchen is costed at the average cost of its stock at that moment, re-averaged with every receipt",
} as const;

export function FormulaNote({ formula, children }: { formula: "fifo" | "average"; children?: ReactNode }) {
  return (
    <p className="mb-4 max-w-4xl text-sm text-brine">
      Costed by <strong className="font-semibold text-pepper-soft">{FORMULA_WORDS[formula]}</strong>, kitchen by kitchen: {FORMULA_EXPLAINED[formula]}.
      {children ? <> {children}</> : null}
    </p>
  );
}

/** "Reports / Usage": the way back to the index, as the other report pages show it. */
export function ReportCrumbs({ trail }: { trail: { label: string; href?: string }[] }) {
  return (
    <nav aria-label="Breadcrumb" className="-mt-2 mb-2 text-sm">
      <ol className="flex flex-wrap items-center">
        <li>
          <Link href="/reports" className="text-brine hover:text-pepper hover:underline">Reports</Link>
        </li>
        {trail.map((t, i) => (
          <li key={t.label} className="flex items-center">
            <span aria-hidden className="px-1 text-brine">/</span>
            {t.href && i < trail.length - 1 ? (
              <Link href={t.href} className="text-brine hover:text-pepper hover:underline">{t.label}</Link>
            ) : (
              <span aria-current={i === trail.length - 1 ? "page" : undefined} className="text-pepper-soft">{t.label}</span>
            )}
          </li>
        ))}
      </ol>
    </nav>
  );
}

export interface ExportLink {
  href: string;
  label: string;
  /** what the file is, for people who need to choose */
  hint: string;
  kind: "csv" | "xlsx";
}

/** The report's files: plain links to the API with the page's own query (the browser downloads them). */
export function ExportLinks({ links }: { links: ExportLink[] }) {
  return (
    <section aria-label="Download this report" className="flex flex-wrap items-center gap-2">
      <span className="text-sm font-semibold text-brine">Download</span>
      {links.map((l) => (
        <a key={l.href} href={l.href} download className="btn-quiet px-3 text-sm" title={l.hint}>
          {l.kind === "xlsx" ? <FileSpreadsheet aria-hidden className="h-4 w-4" /> : <Download aria-hidden className="h-4 w-4" />}
          {l.label}
        </a>
      ))}
    </section>
  );
}

/** The controls' frame: a GET form, so every choice is a shareable URL. */
export function ReportControls({ action, label, children }: { action: string; label: string; children: ReactNode }) {
  return (
    <form method="get" action={action} aria-label={label} className="panel mb-4 flex flex-wrap items-end gap-x-4 gap-y-3 px-4 py-3">
      {children}
      <button type="submit" className="btn-primary">Show</button>
    </form>
  );
}

export function Control({ id, label, error, children, className = "" }: { id: string; label: string; error?: string; children: ReactNode; className?: string }) {
  return (
    <div className={className}>
      <label htmlFor={id} className="field-label">{label}</label>
      {children}
      {error ? <p id={`${id}-error`} className="field-error">{error}</p> : null}
    </div>
  );
}

export function KitchenSelect({ id = "kitchen", value, kitchens }: { id?: string; value: string; kitchens: { code: string; name: string; archived?: boolean }[] }) {
  return (
    // "Kitchens", not "Kitchen": the header's kitchen switcher has that name
    <Control id={id} label="Kitchens">
      <select id={id} name="kitchen" defaultValue={value} className="field-input w-64">
        <option value="">All kitchens</option>
        {kitchens.map((k) => (
          <option key={k.code} value={k.code}>
            {k.name} ({k.code}){k.archived ? ", archived" : ""}
          </option>
        ))}
      </select>
    </Control>
  );
}

/** Money as sent ("1250.00") for people: "€1,250.00". */
export const money = (amount: string, currency: string) => amountText(amount, currency);

const UNIT_WORDS: Record<StockUnit, string> = { g: "g", m: "m", ml: "ml", pc: "pc" };

/** An exact quantity, grouped by thousands: "1,500" (the unit goes in its own column or after it). */
export function quantityFigure(value: string): string {
  const negative = value.startsWith("-");
  const [whole, fraction] = (negative ? value.slice(1) : value).split(".");
  const grouped = whole!.replace(/\B(?=(\d{3})+(?!\d))/g, ",");
  return `${negative ? "−" : ""}${grouped}${fraction !== undefined ? `.${fraction}` : ""}`;
}

/** "1,500 g". */
export const quantityText = (value: string, unit: StockUnit) => `${quantityFigure(value)} ${UNIT_WORDS[unit]}`;

export const unitWords = (unit: StockUnit) => UNIT_WORDS[unit];
