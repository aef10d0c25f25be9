// The Overview's panels (server components: tables and words only; the chart is the one client
// leaf). Each panel is a section with its heading, a link to where the work is done, a table, and
// an empty state that says what would bring something here. Money is shown exactly as sent, with
// the company's cost formula in words ("at FIFO cost", "at moving average cost") by every money heading.
import Link from "next/link";
import { ArrowRight, CalendarCheck2, CheckCircle2, Clock, PackageCheck, ShieldCheck, TriangleAlert, Wallet } from "lucide-react";
import type { ReactNode } from "react";
import { CureCaution } from "@/components/cure/cure-caution";
import { CureMarker } from "@/components/cure/cure-marker";
import { amountText, stockText } from "@/components/purchasing/order-format";
import { FORMULA_WORDS } from "@/components/reports/report-parts";
import { DATE_KIND_WORDS, expiryBand } from "@/components/stock/stock-rows";
import { Badge } from "@/components/ui/badge";
import { DataTable, RowHeader, TBody, Td, Th, THead } from "@/components/ui/data-table";
import type { CostFormula } from "@/lib/costing/engine";
import type {
  BelowReorderPanel as BelowReorder, CureExpiringPanel as CureExpiring, ShortagesPanel as Shortages, StockValuePanel as StockValue,
  UsageTrendPanel as UsageTrend,
} from "@/lib/data/dashboard";
import { dec, type UnitSystem } from "@/lib/units";
import { UsageChart } from "./usage-chart";

const dayFormat = new Intl.DateTimeFormat("en-GB", { timeZone: "UTC", weekday: "short", day: "numeric", month: "short" });
const dateFormat = new Intl.DateTimeFormat("en-GB", { timeZone: "UTC", day: "numeric", month: "short", year: "numeric" });
const dayText = (iso: string) => dayFormat.format(new Date(`${iso}T00:00:00Z`));
const dateText = (iso: string) => dateFormat.format(new Date(`${iso}T00:00:00Z`));
const days = (n: number) => (n === 1 ? "1 day" : `${n} days`);

/** The company's cost formula as the money notes say it: "FIFO cost", "moving average cost". */
export const costWords = (formula: CostFormula) => `${FORMULA_WORDS[formula]} cost`;

/** The small note by every money heading. */
export function AtCost({ formula }: { formula: CostFormula }) {
  return <span className="block text-xs font-normal text-brine">at {costWords(formula)}</span>;
}

function Panel({ id, title, note, action, children }: { id: string; title: string; note?: ReactNode; action?: ReactNode; children: ReactNode }) {
  return (
    <section aria-labelledby={id} className="min-w-0 space-y-3">
      <div className="flex flex-wrap items-end justify-between gap-x-4 gap-y-2">
        <div>
          <h2 id={id} className="text-xl font-semibold">{title}</h2>
          {note ? <p className="text-sm text-brine">{note}</p> : null}
        </div>
        {action}
      </div>
      {children}
    </section>
  );
}

function PanelLink({ href, children }: { href: string; children: ReactNode }) {
  return (
    <Link href={href} className="btn-quiet min-h-touch px-3 text-sm">
      {children}
      <ArrowRight aria-hidden className="h-4 w-4" />
    </Link>
  );
}

function Empty({ icon, children }: { icon: ReactNode; children: ReactNode }) {
  return (
    <div className="panel flex items-start gap-3 px-4 py-4 text-brine">
      <span aria-hidden className="mt-0.5 shrink-0 [&>svg]:h-5 [&>svg]:w-5">{icon}</span>
      <div className="space-y-1">{children}</div>
    </div>
  );
}

/** Days left as a word and an icon, in the stock grid's bands (herb above 30 days, amber to the day, ember past it). */
function DaysLeft({ n }: { n: number }) {
  const { tone } = expiryBand(n);
  if (n < 0) return <Badge tone="ember" icon={<TriangleAlert />}>Expired {days(-n)} ago</Badge>;
  if (n === 0) return <Badge tone={tone} icon={<Clock />}>Last day today</Badge>;
  return <Badge tone={tone} icon={tone === "herb" ? <CheckCircle2 /> : <Clock />}>{days(n)} left</Badge>;
}

// ---------------------------------------------------------------------------------------------

export function CureExpiringPanel({ panel, currency, formula, unitSystem }: { panel: CureExpiring; currency: string; formula: CostFormula; unitSystem: UnitSystem }) {
  const expired = panel.lots.filter((l) => l.daysLeft < 0).length;
  return (
    <Panel
      id="cure-expiring"
      title="Cure expiring soon"
      note={`Cure in stock dated within ${panel.windowDays} days, and any past its date. Use the shortest-dated first; past-date cure is wasted, not used.`}
      action={<PanelLink href="/stock">Open stock</PanelLink>}
    >
      {panel.lots.length === 0 ? (
        <Empty icon={<ShieldCheck />}>
          <p className="font-semibold text-pepper">No cure is within {panel.windowDays} days of its date.</p>
          <p>Cure lots show up here as their use-by or best-before date comes within the company&rsquo;s warning window.</p>
        </Empty>
      ) : (
        <>
          {panel.caution ? <CureCaution /> : null}
          {expired ? (
            <p className="text-sm font-semibold text-ember" role="status">
              {expired === 1 ? "1 lot is past its date" : `${expired} lots are past their date`}: waste {expired === 1 ? "it" : "them"} with a reason on the Stock page.
            </p>
          ) : null}
          <DataTable caption="Cure expiring soon, fewest days left first">
            <THead>
              <Th>Item and lot</Th>
              <Th>Kitchen</Th>
              <Th numeric>On hand</Th>
              <Th numeric>Value<AtCost formula={formula} /></Th>
              <Th>Date</Th>
              <Th>Days left</Th>
            </THead>
            <TBody>
              {panel.lots.map((l) => (
                <tr key={`${l.kitchen.id}:${l.lot.id}`}>
                  <RowHeader className="min-w-[12rem]">
                    <span className="flex flex-wrap items-center gap-x-2 gap-y-1">
                      <span>{l.item.name}</span>
                      <CureMarker />
                    </span>
                    <span className="block text-sm font-normal text-brine">{l.item.sku} · lot {l.lot.code}</span>
                  </RowHeader>
                  <Td>{l.kitchen.name}</Td>
                  <Td numeric className="whitespace-nowrap">{stockText(l.quantity, l.item, unitSystem)}</Td>
                  <Td numeric className="whitespace-nowrap">{amountText(l.value, currency)}</Td>
                  <Td className="whitespace-nowrap">
                    <span className="block text-xs text-brine">{DATE_KIND_WORDS[l.dateKind]}</span>
                    <span className="num tabular-nums">{dateText(l.date)}</span>
                  </Td>
                  <Td className="whitespace-nowrap"><DaysLeft n={l.daysLeft} /></Td>
                </tr>
              ))}
            </TBody>
          </DataTable>
        </>
      )}
    </Panel>
  );
}

export function ShortagesPanel({ panel, unitSystem, canOpenBatches }: { panel: Shortages; unitSystem: UnitSystem; canOpenBatches: boolean }) {
  return (
    <Panel
      id="shortages"
      title="Next week's shortages"
      note={`Planned and reserved batches from ${dayText(panel.from)} to ${dayText(panel.to)} that the stock in date on their day does not cover.`}
      action={canOpenBatches ? <PanelLink href="/planning">Open the planner</PanelLink> : undefined}
    >
      {panel.lines.length === 0 ? (
        <Empty icon={<CalendarCheck2 />}>
          <p className="font-semibold text-pepper">Every batch of the next seven days is covered.</p>
          <p>A batch shows up here when a line needs more than the kitchen has in date on its day, once the batches ahead of it have taken theirs.</p>
        </Empty>
      ) : (
        <>
          {panel.caution ? <CureCaution /> : null}
          <DataTable caption="Short lines of next week's batches, by day">
            <THead>
              <Th>Batch</Th>
              <Th>Item short</Th>
              <Th numeric>Short</Th>
              <Th>Way out</Th>
            </THead>
            <TBody>
              {panel.lines.map((l) => (
                <tr key={`${l.batch.id}:${l.item.id}:${l.needed}`}>
                  <RowHeader>
                    {canOpenBatches ? (
                      <Link href={`/planning/batches/${l.batch.id}`} className="text-paprika underline underline-offset-2">
                        {l.batch.recipeName}
                      </Link>
                    ) : (
                      l.batch.recipeName
                    )}
                    <span className="block text-sm font-normal text-brine">
                      {dayText(l.plannedFor)} · {l.kitchen.name}{l.batch.status === "reserved" ? " · reserved" : ""}
                    </span>
                  </RowHeader>
                  <Td>
                    <span className="flex flex-wrap items-center gap-x-2 gap-y-1">
                      <span>{l.item.name}</span>
                      {l.item.category === "cure" ? <CureMarker /> : null}
                    </span>
                    <span className="block text-sm text-brine">needs {stockText(l.needed, l.item, unitSystem)}</span>
                  </Td>
                  <Td numeric className="whitespace-nowrap font-semibold text-ember">{stockText(l.short, l.item, unitSystem)}</Td>
                  <Td className="text-sm">
                    {l.suggestions.map((s, i) => (
                      <span key={i} className="block">
                        {s.kind === "transfer" ? `Ask ${s.kitchen.code} for ${stockText(s.quantity, l.item, unitSystem)}` : `Buy ${stockText(s.quantity, l.item, unitSystem)}`}
                      </span>
                    ))}
                  </Td>
                </tr>
              ))}
            </TBody>
          </DataTable>
        </>
      )}
    </Panel>
  );
}

export function BelowReorderPanel({ panel, unitSystem, canOpenReorder }: { panel: BelowReorder; unitSystem: UnitSystem; canOpenReorder: boolean }) {
  return (
    <Panel
      id="below-reorder"
      title="Below the reorder point"
      note="Items projected to fall below their reorder point within the supplier's lead time, with what Buying › Reorder suggests."
      action={canOpenReorder ? <PanelLink href="/purchasing/reorder">Open reorder</PanelLink> : undefined}
    >
      {panel.items.length === 0 ? (
        <Empty icon={<PackageCheck />}>
          <p className="font-semibold text-pepper">Nothing is below its reorder point.</p>
          <p>Items show up here when their projected stock falls below the reorder point set for the kitchen on the Stock page.</p>
        </Empty>
      ) : (
        <>
          {panel.caution ? <CureCaution /> : null}
          <DataTable caption="Items below their reorder point, by kitchen">
            <THead>
              <Th>Item</Th>
              <Th>Kitchen</Th>
              <Th numeric>On hand</Th>
              <Th numeric>Projected</Th>
              <Th numeric>Reorder point</Th>
              <Th numeric>Suggested</Th>
            </THead>
            <TBody>
              {panel.items.map((r) => (
                <tr key={`${r.kitchen.id}:${r.item.id}`}>
                  <RowHeader>
                    <span className="flex flex-wrap items-center gap-x-2 gap-y-1">
                      <span>{r.item.name}</span>
                      {r.item.category === "cure" ? <CureMarker /> : null}
                    </span>
                    <span className="block text-sm font-normal text-brine">{r.item.sku}</span>
                  </RowHeader>
                  <Td>{r.kitchen.name}</Td>
                  <Td numeric className="whitespace-nowrap">{stockText(r.onHand, r.item, unitSystem)}</Td>
                  <Td numeric className="whitespace-nowrap">
                    <span className="font-semibold text-amber">{stockText(r.projected, r.item, unitSystem)}</span>
                    <span className="block text-xs text-brine">by {dayText(r.by)}</span>
                  </Td>
                  <Td numeric className="whitespace-nowrap">{stockText(r.reorderPoint, r.item, unitSystem)}</Td>
                  <Td numeric className="whitespace-nowrap">
                    {r.suggestedQuantity !== null ? (
                      <>
                        {stockText(r.suggestedQuantity, r.item, unitSystem)}
                        <span className="block text-xs text-brine">{r.supplier}</span>
                      </>
                    ) : (
                      <span className="text-sm text-brine">no supplier yet</span>
                    )}
                  </Td>
                </tr>
              ))}
            </TBody>
          </DataTable>
        </>
      )}
    </Panel>
  );
}

export function StockValuePanel({ panel, currency, formula }: { panel: StockValue; currency: string; formula: CostFormula }) {
  return (
    <Panel id="stock-value" title="Stock value by kitchen" note={`What is on hand today, at ${costWords(formula)}, as Reports › Valuation values it.`}>
      {panel.kitchens.length === 0 ? (
        <Empty icon={<Wallet />}>
          <p className="font-semibold text-pepper">No open kitchen to value.</p>
          <p>An admin opens kitchens under Settings › Kitchens.</p>
        </Empty>
      ) : (
        <DataTable caption={`Stock value by kitchen, at ${costWords(formula)}`}>
          <THead>
            <Th>Kitchen</Th>
            <Th numeric>Value<AtCost formula={formula} /></Th>
          </THead>
          <TBody>
            {panel.kitchens.map((k) => (
              <tr key={k.kitchen.id}>
                <RowHeader>{k.kitchen.name}</RowHeader>
                <Td numeric>{amountText(k.value, currency)}</Td>
              </tr>
            ))}
          </TBody>
          <tfoot className="border-t-2 border-salt-edge">
            <tr>
              <th scope="row" className="px-4 py-2.5 text-left font-semibold">Total</th>
              <Td numeric className="font-semibold">{amountText(panel.total, currency)}</Td>
            </tr>
          </tfoot>
        </DataTable>
      )}
    </Panel>
  );
}

const CATEGORY_WORDS = { cure: "Cure", casing: "Casings", spice: "Spices", ingredient: "Other ingredients" } as const;
const monthFormat = new Intl.DateTimeFormat("en-GB", { timeZone: "UTC", month: "short", year: "numeric" });
const monthText = (ym: string) => monthFormat.format(new Date(`${ym}-01T00:00:00Z`));

export function UsagePanel({ panel, currency, formula }: { panel: UsageTrend; currency: string; formula: CostFormula }) {
  const any = panel.months.some((m) => !dec(m.total).isZero());
  return (
    <Panel id="usage" title="Usage by month" note={`Stock used in production or by hand, and wasted, over the last six months, at ${costWords(formula)}.`}>
      {!any ? (
        <Empty icon={<Wallet />}>
          <p className="font-semibold text-pepper">Nothing used or wasted in the last six months.</p>
          <p>Usage shows up here as batches are produced and stock is used or wasted.</p>
        </Empty>
      ) : (
        <div className="panel space-y-2 p-4">
          <UsageChart months={panel.months} currency={currency} labels={CATEGORY_WORDS} />
          <UsageTable panel={panel} currency={currency} formula={formula} />
        </div>
      )}
    </Panel>
  );
}

function UsageTable({ panel, currency, formula }: { panel: UsageTrend; currency: string; formula: CostFormula }) {
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-left text-sm">
        <caption className="sr-only">Usage by month and category, at {costWords(formula)}</caption>
        <thead className="border-b border-salt-edge text-brine">
          <tr>
            <th scope="col" className="px-2 py-2 font-semibold">Month</th>
            {(Object.keys(CATEGORY_WORDS) as (keyof typeof CATEGORY_WORDS)[]).map((c) => (
              <th key={c} scope="col" className="px-2 py-2 text-right font-semibold">{CATEGORY_WORDS[c]}</th>
            ))}
            <th scope="col" className="px-2 py-2 text-right font-semibold">Total<AtCost formula={formula} /></th>
          </tr>
        </thead>
        <tbody className="divide-y divide-salt-edge">
          {panel.months.map((m, i) => (
            <tr key={m.month}>
              <th scope="row" className="whitespace-nowrap px-2 py-1.5 font-semibold">
                {monthText(m.month)}
                {i === panel.months.length - 1 ? <span className="font-normal text-brine">, so far</span> : null}
              </th>
              {(Object.keys(CATEGORY_WORDS) as (keyof typeof CATEGORY_WORDS)[]).map((c) => (
                <td key={c} className="num whitespace-nowrap px-2 py-1.5 text-right tabular-nums">{amountText(m[c], currency)}</td>
              ))}
              <td className="num whitespace-nowrap px-2 py-1.5 text-right font-semibold tabular-nums">{amountText(m.total, currency)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
