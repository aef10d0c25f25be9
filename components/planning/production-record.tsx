// What was made, on the batch sheet once a batch is produced: the batch code big enough to copy onto
// the product label, who made it and when, the meat block and each line planned against actual
// with the signed variance and the lots used (each a link to its trace), the cure check run again
// on the actual weights, and, for a batch over a statutory maximum, the hold: the caution and the
// HACCP advice in words with an icon, and for a manager the form to release it with the corrective
// action. A released hold says who released it, when and why.
import { CheckCircle2, OctagonAlert } from "lucide-react";
import Link from "next/link";
import type { Ref } from "react";
import { CureCaution } from "@/components/cure/cure-caution";
import { CureMarker } from "@/components/cure/cure-marker";
import { DataTable, RowHeader, TBody, Td, Th, THead } from "@/components/ui/data-table";
import type { Batch, BatchLine } from "@/lib/queries/planning";
import { dec, type UnitSystem } from "@/lib/units";
import { CureCheckPanel } from "./cure-check";
import { momentText } from "./dates";
import { HoldReleaseForm } from "./hold-release-form";
import { gramsText, quantityText, signedGramsText, signedQuantityText, type UnitsById } from "./quantities";

function VarianceWords({ value, text }: { value: string; text: string }) {
  const v = dec(value);
  if (v.isZero()) return <span className="text-brine">as planned</span>;
  return (
    <>
      <span className="font-semibold">{text}</span>
      <span className="block text-sm text-brine">{v.isNegative() ? "less than planned" : "more than planned"}</span>
    </>
  );
}

const sentence = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/** The statutory maxima the actual cure was over, in words (what put the batch on hold). */
function overWords(p: NonNullable<Batch["production"]>): string | null {
  const over = (p.cure?.checks ?? []).filter((c) => !c.within && c.severity === "block");
  if (!over.length) return null;
  return `the cure weighed was over a statutory maximum: ${over.map((c) => `${c.substance} ${c.ppm} ppm against ${c.limitPpm} ppm (${c.entry})`).join("; ")}.`;
}

export function ProductionRecord({ batch, units, unitSystem, timeZone, canReleaseHold, onReleased, headingRef }: {
  batch: Batch;
  units: UnitsById;
  unitSystem: UnitSystem;
  timeZone: string;
  canReleaseHold: boolean;
  onReleased: (batch: Batch) => void;
  headingRef?: Ref<HTMLHeadingElement>;
}) {
  const p = batch.production;
  if (!p) return null;
  const meatVariance = dec(p.actualMeatBlockG).minus(dec(batch.meatBlockG)).toFixed();
  const held = p.hold && !p.hold.releasedAt;
  const lineOf = (position: number) => batch.lines.find((l) => l.position === position);

  return (
    <section aria-labelledby="production-heading" className="space-y-4">
      <h2 id="production-heading" ref={headingRef} tabIndex={-1} className="text-xl font-semibold focus:outline-none">Production</h2>

      <div className="panel flex flex-wrap items-end justify-between gap-x-8 gap-y-3 border-2 border-pepper/70 px-5 py-4 break-inside-avoid">
        <div className="min-w-0">
          <p className="text-sm font-semibold text-brine">Batch code · write it on the product label</p>
          <p className="num break-all font-display text-4xl font-bold leading-tight tracking-wide text-pepper md:text-5xl" data-testid="batch-code">
            {p.batchCode}
          </p>
        </div>
        <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-sm">
          <dt className="text-brine">Made</dt>
          <dd className="num font-semibold">{momentText(p.producedAt, timeZone)}{p.producedBy ? ` by ${p.producedBy.name}` : ""}</dd>
          <dt className="text-brine">Meat block</dt>
          <dd className="num">
            <span className="font-semibold">{gramsText(p.actualMeatBlockG, unitSystem)}</span>
            <span className="text-brine"> · planned {gramsText(batch.meatBlockG, unitSystem)}</span>
            {dec(meatVariance).isZero() ? null : <span> · {signedGramsText(meatVariance, unitSystem)}</span>}
          </dd>
        </dl>
      </div>

      {p.hold && held ? (
        <section aria-labelledby="hold-heading" className="space-y-3 rounded-lg border-2 border-ember bg-ember-soft px-5 py-4 break-inside-avoid">
          <h3 id="hold-heading" className="flex items-center gap-2 text-xl font-semibold text-ember">
            <OctagonAlert aria-hidden className="h-6 w-6 shrink-0" /> On hold: do not release this batch for sale
          </h3>
          <p className="font-semibold text-pepper">{sentence(p.hold.reason.replace(/^On hold: /, ""))}</p>
          <CureCaution />
          {canReleaseHold ? (
            <HoldReleaseForm batch={batch} onReleased={onReleased} />
          ) : (
            <p className="text-sm font-semibold text-pepper">Only a manager can release the hold, with the corrective action taken.</p>
          )}
        </section>
      ) : null}
      {p.hold && !held ? (
        <section aria-labelledby="released-heading" className="space-y-1 rounded-lg border border-herb/40 bg-herb-soft px-5 py-3 break-inside-avoid">
          <h3 id="released-heading" className="flex items-center gap-2 font-sans text-base font-semibold text-herb">
            <CheckCircle2 aria-hidden className="h-5 w-5 shrink-0" /> Hold released
            {p.hold.releasedBy ? ` by ${p.hold.releasedBy.name}` : ""}
            {p.hold.releasedAt ? ` on ${momentText(p.hold.releasedAt, timeZone)}` : ""}
          </h3>
          <p className="text-pepper"><span className="font-semibold">Corrective action:</span> {p.hold.releaseReason}</p>
          <p className="text-sm text-pepper-soft">It was held because {overWords(p) ?? p.hold.reason.replace(/^On hold: /, "")}</p>
        </section>
      ) : null}

      <DataTable caption={`Planned and actual: ${p.batchCode}`}>
        <THead>
          <Th>Item</Th>
          <Th numeric>Planned</Th>
          <Th numeric>Actual</Th>
          <Th numeric>Variance</Th>
          <Th>Lots used</Th>
        </THead>
        <TBody>
          {p.lines.map((l) => {
            const line = lineOf(l.position);
            const item = line?.item ?? { id: l.item.id, unit: l.item.unit as BatchLine["item"]["unit"], category: "ingredient" as const };
            const q = (v: string) => quantityText(v, item, units, unitSystem);
            return (
              <tr key={l.position} className="break-inside-avoid align-top">
                <RowHeader className="align-top">
                  <span className="flex flex-wrap items-center gap-2">
                    {l.item.sku}
                    {item.category === "cure" ? <CureMarker /> : null}
                  </span>
                  <span className="block text-sm font-normal text-brine">{l.item.name}</span>
                </RowHeader>
                <Td numeric className="align-top whitespace-nowrap">{q(l.planned)}</Td>
                <Td numeric className="align-top whitespace-nowrap font-semibold">{q(l.actual)}</Td>
                <Td numeric className="align-top whitespace-nowrap">
                  <VarianceWords value={l.variance} text={signedQuantityText(l.variance, item, units, unitSystem)} />
                </Td>
                <Td className="align-top text-sm">
                  {l.lots.length ? (
                    <ul className="space-y-0.5">
                      {l.lots.map((lot) => (
                        <li key={lot.lotId}>
                          <Link href={`/planning/trace/lots/${lot.lotId}`} className="font-semibold text-paprika underline-offset-2 hover:underline print:text-pepper">
                            {lot.code}
                          </Link>
                          <span className="num whitespace-nowrap"> · {q(lot.quantity)}</span>
                        </li>
                      ))}
                    </ul>
                  ) : (
                    <span className="text-brine">None used</span>
                  )}
                </Td>
              </tr>
            );
          })}
        </TBody>
      </DataTable>
      <p className="text-sm text-brine">
        Variance is actual less planned, in each item&rsquo;s unit; cure in grams as weighed.
      </p>

      {p.cure ? <CureCheckPanel cure={p.cure} basis="the weights actually used" headingId="actual-cure-heading" heading="Cure check on the actual weights" /> : null}
    </section>
  );
}
