// A batch's bill of materials: each line in the user's units, cure with its rounding to the
// kitchen scale, the lots reserved for it, what the kitchen has available on the production day,
// and for a line short of stock how much, with where to get it (a transfer or buying). Compact:
// item, quantity and stock only (the plan sheet after saving). Each reserved lot links to its trace.
// The batch sheet adds, beside each transfer suggestion, the way to ask for it (`transferAction`).
// Server-safe.
import { ArrowLeftRight, CheckCircle2, Lock, ShoppingCart, TriangleAlert } from "lucide-react";
import Link from "next/link";
import type { ReactNode } from "react";
import { CureMarker } from "@/components/cure/cure-marker";
import { Badge } from "@/components/ui/badge";
import { DataTable, RowHeader, TBody, Td, Th, THead } from "@/components/ui/data-table";
import type { Batch, BatchLine } from "@/lib/queries/planning";
import { dec, type UnitSystem } from "@/lib/units";
import { dayPlain } from "./dates";
import { lengthText, quantityText, roundingText, type UnitsById } from "./quantities";

const ROLE_WORDS: Record<BatchLine["role"], string> = { cure: "Cure", ingredient: "Ingredient", casing: "Casing" };
/** The role in words; an ingredient line says what kind (a spice or another ingredient). */
const roleWord = (l: BatchLine) => (l.role === "ingredient" && l.item.category === "spice" ? "Spice" : ROLE_WORDS[l.role]);
const DATE_KIND: Record<string, string> = { use_by: "use by", best_before: "best before" };

export type TransferSuggestion = Extract<BatchLine["suggestions"][number], { kind: "transfer" }>;

interface Props {
  batch: Batch;
  units: UnitsById;
  unitSystem: UnitSystem;
  scaleResolutionG: string;
  compact?: boolean;
  /** kitchen codes to names, for the transfer suggestions */
  kitchenNames?: Readonly<Record<string, string>>;
  /** items not tracked by lot: what is reserved is shown, not the lots it sits in */
  untracked?: readonly string[];
  /** shown under a transfer suggestion: asking for it, or that it was asked */
  transferAction?: (line: BatchLine, suggestion: TransferSuggestion) => ReactNode;
}

function StockCell({ line, batch, q, kitchenNames, transferAction }: {
  line: BatchLine; batch: Batch; q: (v: string) => string; kitchenNames?: Readonly<Record<string, string>>; transferAction?: Props["transferAction"];
}) {
  const open = batch.status === "planned" || batch.status === "reserved";
  const fullyReserved = dec(line.reserved).gte(dec(line.quantity));
  if (fullyReserved) return <Badge tone="herb" icon={<Lock />}>Reserved</Badge>;
  if (line.short) {
    return (
      <div className="space-y-1">
        <Badge tone="ember" icon={<TriangleAlert />}>{`Short ${q(line.short)}`}</Badge>
        {dec(line.plannedBefore).gt(0) ? <p className="text-sm text-brine">after <span className="num">{q(line.plannedBefore)}</span> planned ahead</p> : null}
        {line.suggestions.length ? (
          <ul className="space-y-0.5 text-sm text-pepper-soft" aria-label={`Where to get ${line.item.sku}`}>
            {line.suggestions.map((s, i) =>
              s.kind === "transfer" ? (
                <li key={i}>
                  <span className="flex items-start gap-1">
                    <ArrowLeftRight aria-hidden className="mt-0.5 h-3.5 w-3.5 shrink-0" />
                    <span>Transfer <span className="num">{q(s.quantity)}</span> from {kitchenNames?.[s.kitchen.code] ? `${kitchenNames[s.kitchen.code]} (${s.kitchen.code})` : s.kitchen.code}</span>
                  </span>
                  {transferAction ? transferAction(line, s) : null}
                </li>
              ) : (
                <li key={i} className="flex items-start gap-1">
                  <ShoppingCart aria-hidden className="mt-0.5 h-3.5 w-3.5 shrink-0" />
                  <span>Buy <span className="num">{q(s.quantity)}</span></span>
                </li>
              ),
            )}
          </ul>
        ) : null}
      </div>
    );
  }
  if (!open) return <span className="text-sm text-brine">—</span>;
  return <Badge tone="herb" icon={<CheckCircle2 />}>Enough</Badge>;
}

export function BomTable({ batch, units, unitSystem, scaleResolutionG, compact, kitchenNames, untracked = [], transferAction }: Props) {
  const q = (line: BatchLine) => (v: string) => quantityText(v, line.item, units, unitSystem);
  const caption = `Bill of materials: ${batch.recipe.code} on ${dayPlain(batch.plannedFor)}`;
  // a batch made or cancelled holds nothing and needs no stock: its plan is shown without those columns
  const stockColumns = batch.status === "planned" || batch.status === "reserved";
  return (
    <DataTable caption={caption}>
      <THead>
        <Th>Item</Th>
        {compact ? null : <Th>Role</Th>}
        <Th numeric>Quantity</Th>
        {compact || !stockColumns ? null : <Th>Reserved lots</Th>}
        {compact || !stockColumns ? null : <Th numeric>Available</Th>}
        {stockColumns ? <Th>Stock</Th> : null}
      </THead>
      <TBody>
        {batch.lines.map((l) => {
          const length = l.role === "casing" ? lengthText(l.quantity, l.item, units, unitSystem) : null;
          return (
            <tr key={l.position} className="break-inside-avoid align-top">
              <RowHeader className={`align-top ${compact ? "!px-3 [overflow-wrap:anywhere]" : ""}`}>
                <span className="flex flex-wrap items-center gap-2">
                  {l.item.sku}
                  {l.item.category === "cure" ? <CureMarker /> : null}
                </span>
                <span className="block text-sm font-normal text-brine">{l.item.name}</span>
              </RowHeader>
              {compact ? null : <Td className="align-top text-sm">{roleWord(l)}</Td>}
              <Td numeric className={`align-top ${compact ? "!px-3" : ""}`}>
                <span className="whitespace-nowrap font-semibold">{q(l)(l.quantity)}</span>
                {l.role === "cure" ? (
                  <span className="block text-sm text-brine">
                    {compact ? (l.rounding === "exact" ? "exact" : `rounded ${l.rounding} to the ${scaleResolutionG} g scale`) : roundingText(l.rounding, l.exactQuantity, scaleResolutionG)}
                  </span>
                ) : null}
                {length ? <span className="block whitespace-nowrap text-sm text-brine">{length}</span> : null}
              </Td>
              {compact || !stockColumns ? null : (
                <Td className="align-top text-sm">
                  {l.lots.length && untracked.includes(l.item.id) ? (
                    <span className="num">{q(l)(l.reserved)} <span className="text-brine">(not tracked by lot)</span></span>
                  ) : l.lots.length ? (
                    <ul className="space-y-0.5">
                      {l.lots.map((lot) => (
                        <li key={lot.lotId}>
                          <Link href={`/planning/trace/lots/${lot.lotId}`} className="font-semibold text-paprika underline-offset-2 hover:underline print:text-pepper">{lot.code}</Link>
                          {lot.date ? <span className="text-brine"> · {lot.dateKind ? `${DATE_KIND[lot.dateKind] ?? lot.dateKind} ` : ""}{dayPlain(lot.date)}</span> : null}
                          <span className="num whitespace-nowrap"> · {q(l)(lot.quantity)}</span>
                        </li>
                      ))}
                    </ul>
                  ) : (
                    <span className="text-brine">None</span>
                  )}
                </Td>
              )}
              {compact || !stockColumns ? null : <Td numeric className="align-top whitespace-nowrap">{q(l)(l.available)}</Td>}
              {stockColumns ? <Td className={`align-top ${compact ? "!px-3" : ""}`}><StockCell line={l} batch={batch} q={q(l)} kitchenNames={kitchenNames} transferAction={transferAction} /></Td> : null}
            </tr>
          );
        })}
      </TBody>
    </DataTable>
  );
}
