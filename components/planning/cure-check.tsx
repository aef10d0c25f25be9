// The cure verdict of a recipe or a batch plan: the ingoing nitrite and nitrate, each check with
// its table, entry and limit, and the verdict in words. The check itself is the server's (lib/cure);
// this only shows it. Cure pink marks the cure; the verdicts use herb / amber / ember with words.
import { AlertTriangle, CheckCircle2, Info, OctagonX } from "lucide-react";
import type { ReactNode } from "react";
import { CureCaution } from "@/components/cure/cure-caution";
import { Badge } from "@/components/ui/badge";
import { DataTable, RowHeader, TBody, Td, Th, THead } from "@/components/ui/data-table";
import type { CureCalculation, CureCheck } from "@/lib/cure/calculate";
import { TABLE_LABELS } from "@/lib/cure/limits";

export const KIND_WORDS: Record<CureCheck["kind"], string> = { max: "Maximum", min: "Minimum", target: "Required level" };

/** "+0.0000" -> "at the limit", "-31.2500" -> "31.2500 below", "+5.0000" -> "5.0000 above" */
export function deviationWords(d: string): string {
  if (/^[+-]0\.0000$/.test(d)) return "at the limit";
  return d.startsWith("-") ? `${d.slice(1)} below` : `${d.replace(/^\+/, "")} above`;
}

export function verdictOf(cure: CureCalculation): { tone: string; icon: ReactNode; text: string } {
  if (cure.blocked) return { tone: "border-ember/40 bg-ember-soft text-ember", icon: <OctagonX aria-hidden className="h-5 w-5 shrink-0" />, text: "Over a statutory maximum: must not be used." };
  if (cure.table === "none" || cure.checks.length === 0) {
    return { tone: "border-brine-line bg-brine-soft text-pepper", icon: <Info aria-hidden className="h-5 w-5 shrink-0" />, text: "No regulatory check was made (your company has no table chosen): nothing is blocked." };
  }
  if (cure.warnings > 0) {
    return { tone: "border-amber/40 bg-amber-soft text-amber", icon: <AlertTriangle aria-hidden className="h-5 w-5 shrink-0" />, text: `Within every maximum, with ${cure.warnings} warning${cure.warnings === 1 ? "" : "s"}: see the checks.` };
  }
  return { tone: "border-herb/40 bg-herb-soft text-herb", icon: <CheckCircle2 aria-hidden className="h-5 w-5 shrink-0" />, text: "Within every check." };
}

/** One check's verdict in words and an icon (not colour alone). */
export function CheckVerdict({ check: c }: { check: CureCheck }) {
  if (c.within) return <Badge tone="herb" icon={<CheckCircle2 />}>Within</Badge>;
  if (c.severity === "block") return <Badge tone="ember" icon={<OctagonX />}>Over: blocked</Badge>;
  if (c.groupMet) return <Badge icon={<Info />}>Alternative met</Badge>;
  const word = c.kind === "min" ? "Under" : c.kind === "max" ? "Over" : "Off the level";
  return <Badge tone="amber" icon={<AlertTriangle />}>{`${word}: warning`}</Badge>;
}

/**
 * The cure check as a section: caution, verdict, figures and the checks table.
 * `basis` says what the figures were computed on ("the rounded amounts as planned", "the recipe's exact rates").
 */
export function CureCheckPanel({ cure, basis, headingId, heading = "Cure check" }: { cure: CureCalculation; basis: string; headingId: string; heading?: string }) {
  const verdict = verdictOf(cure);
  return (
    <section aria-labelledby={headingId} className="space-y-3 break-inside-avoid">
      <h2 id={headingId} className="text-xl font-semibold">{heading}</h2>
      <CureCaution />
      <p className={`flex items-start gap-2 rounded-md border px-4 py-2.5 font-semibold ${verdict.tone}`}>
        {verdict.icon}
        <span>{verdict.text}</span>
      </p>
      <p className="text-sm text-pepper-soft">
        Ingoing nitrite <strong className="num font-semibold text-pepper">{cure.nitritePpm} ppm</strong>
        {" · "}nitrate <strong className="num font-semibold text-pepper">{cure.nitratePpm} ppm</strong>, as sodium salts on the meat block&rsquo;s green
        weight, from {basis}. Table: {TABLE_LABELS[cure.table]}.
      </p>
      {cure.checks.length ? (
        <DataTable caption={`${heading}: each check against ${TABLE_LABELS[cure.table]}`}>
          <THead>
            <Th>Check</Th>
            <Th>Kind</Th>
            <Th numeric>Limit</Th>
            <Th numeric>This {basis.includes("recipe") ? "recipe" : "batch"}</Th>
            <Th>Verdict</Th>
          </THead>
          <TBody>
            {cure.checks.map((c) => (
              <tr key={c.id} className={!c.within && c.severity === "block" ? "bg-ember-soft/50" : undefined}>
                <RowHeader className="font-normal">
                  <span className="font-semibold">{c.entry}</span>
                  <span className="block text-sm text-brine">
                    {c.table.toUpperCase()} · {c.citation.regulation} · {c.substance}
                    {c.verified ? "" : " · not read in the primary text"}
                  </span>
                </RowHeader>
                <Td className="whitespace-nowrap text-sm">{KIND_WORDS[c.kind]}{c.severity === "block" ? " (blocks)" : " (warns)"}</Td>
                <Td numeric className="whitespace-nowrap">{c.limitPpm}{c.tolerancePpm ? ` ± ${c.tolerancePpm}` : ""} {c.basis === "batch_as_ion" ? "mg/kg" : "ppm"}</Td>
                <Td numeric className="whitespace-nowrap">
                  {c.ppm}
                  <span className="block text-sm text-brine">{deviationWords(c.deviationPpm)}</span>
                </Td>
                <Td><CheckVerdict check={c} /></Td>
              </tr>
            ))}
          </TBody>
        </DataTable>
      ) : null}
      {cure.notes.length ? (
        <ul className="list-disc space-y-1 pl-6 text-sm text-pepper-soft" aria-label="Cure notes">
          {cure.notes.map((n) => <li key={n}>{n}</li>)}
        </ul>
      ) : null}
    </section>
  );
}
