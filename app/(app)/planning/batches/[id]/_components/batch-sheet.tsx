"use client";

// The batch page's live part: the plan (refetched after every action), Reserve / Release / Cancel
// with confirmations where stock is given back or the plan ends, "Record production" (a side sheet)
// and, once made, what was made (batch code, variance, the cure check on the actual weights, a hold
// and its release), and Print. Each action sends its own Idempotency-Key, kept only while a retry
// after a lost answer may need it. A line short of stock with a transfer suggestion can be asked
// for in one step (for people who may ask for the batch's kitchen); while that request is open the
// line says so and links to the Transfers page instead of offering a second one.
import { useQuery, useQueryClient } from "@tanstack/react-query";
import { ArrowLeft, Ban, ClipboardCheck, GitBranch, Loader2, Lock, OctagonAlert, Printer, Send, TriangleAlert, Unlock } from "lucide-react";
import Link from "next/link";
import { useEffect, useRef, useState } from "react";
import { BomTable, type TransferSuggestion } from "@/components/planning/bom-table";
import { ShortageMarker, shortWords, StatusBadge } from "@/components/planning/batch-badges";
import { ConfirmDialog } from "@/components/planning/confirm-dialog";
import { CureCheckPanel } from "@/components/planning/cure-check";
import { dayFull, dayMedium, weekRange, weekStartOf, type WeekStart } from "@/components/planning/dates";
import { ProductionForm } from "@/components/planning/production-form";
import { ProductionRecord } from "@/components/planning/production-record";
import { gramsText, metresText, putUpWord, quantityText, type UnitsById } from "@/components/planning/quantities";
import { PageHeader } from "@/components/shell/page-header";
import { Badge } from "@/components/ui/badge";
import { FormMessage } from "@/components/ui/field";
import { SideSheet } from "@/components/ui/side-sheet";
import {
  ApiError, batchQueryOptions, cancelBatch, newIdempotencyKey, planningKeys, releaseBatch, requestBatchTransfer, reserveBatch, shortLinesOf, type Batch, type BatchLine,
} from "@/lib/queries/planning";
import { stockKeys } from "@/lib/queries/stock";
import { type UnitSystem } from "@/lib/units";

type Action = "reserve" | "release" | "cancel";

export function BatchSheet({
  initial, units, untracked, unitSystem, scaleResolutionG, kitchenNames, canManage, canProduce, canReleaseHold, canRequestTransfer, firstDay, today, timeZone, printedBy, printedAt,
}: {
  initial: Batch;
  units: UnitsById;
  untracked: string[];
  unitSystem: UnitSystem;
  scaleResolutionG: string;
  kitchenNames: Record<string, string>;
  canManage: boolean;
  /** production.post in the batch's kitchen */
  canProduce: boolean;
  /** limits.override in the batch's kitchen: may release a hold */
  canReleaseHold: boolean;
  /** transfers.request for the batch's kitchen (the one that receives): may ask for a suggested transfer */
  canRequestTransfer: boolean;
  /** the company's first day of the week (the link back to the batch's week) */
  firstDay: WeekStart;
  /** the user's today, yyyy-mm-dd (lots dated before it are expired) */
  today: string;
  /** the user's time zone, for when it was made */
  timeZone: string;
  printedBy: string;
  /** when the page was loaded, in the user's time zone */
  printedAt: string;
}) {
  const queryClient = useQueryClient();
  const q = useQuery({ ...batchQueryOptions(initial.id), initialData: initial, staleTime: 0 });
  const batch = q.data;
  const [busy, setBusy] = useState<Action | null>(null);
  const [confirming, setConfirming] = useState<"release" | "cancel" | null>(null);
  const [done, setDone] = useState<string>();
  /** the last thing done put the batch on hold: said as a warning, not as a success */
  const [doneHold, setDoneHold] = useState(false);
  const [error, setError] = useState<string>();
  const keys = useRef<Partial<Record<Action, string>>>({});
  const [producing, setProducing] = useState(false);
  const productionHeading = useRef<HTMLHeadingElement>(null);
  const [focusProduction, setFocusProduction] = useState(false);
  const open = batch.status === "planned" || batch.status === "reserved";
  const made = batch.status === "produced" || batch.status === "on_hold";

  // after recording or releasing, the record is what to read next (the button that opened the form is gone)
  useEffect(() => {
    if (!focusProduction || producing) return;
    productionHeading.current?.focus();
    setFocusProduction(false);
  }, [focusProduction, producing, batch]);

  async function refresh() {
    await queryClient.invalidateQueries({ queryKey: planningKeys.batches() });
    await queryClient.invalidateQueries({ queryKey: stockKeys.all });
    await queryClient.invalidateQueries({ queryKey: planningKeys.batch(batch.id) });
  }

  function produced(next: Batch) {
    queryClient.setQueryData(planningKeys.batch(batch.id), next);
    setError(undefined);
    const code = next.production?.batchCode ?? next.batchCode ?? "";
    setDoneHold(next.status === "on_hold");
    setDone(
      next.status === "on_hold"
        ? `Recorded as batch ${code}, and put ON HOLD: the cure weighed is over a statutory maximum. Follow the HACCP plan's corrective action (below).`
        : `Recorded: batch ${code}. Write the batch code on the product label.`,
    );
    setProducing(false);
    setFocusProduction(true);
    void refresh();
  }

  function released(next: Batch) {
    queryClient.setQueryData(planningKeys.batch(batch.id), next);
    setError(undefined);
    setDoneHold(false);
    setDone(`Hold released: ${next.production?.batchCode ?? ""} is produced, with the corrective action on record.`);
    setFocusProduction(true);
    void refresh();
  }
  const lineOf = (position: number) => batch.lines.find((l) => l.position === position);

  async function act(action: Action) {
    if (busy) return;
    setBusy(action);
    setError(undefined);
    setDone(undefined);
    setDoneHold(false);
    const key = (keys.current[action] ??= newIdempotencyKey());
    try {
      const run = action === "reserve" ? reserveBatch : action === "release" ? releaseBatch : cancelBatch;
      const next = await run(batch.id, key);
      keys.current[action] = undefined;
      queryClient.setQueryData(planningKeys.batch(batch.id), next);
      setDone(
        action === "reserve"
          ? `Reserved: every line of ${next.recipe.code} is held for ${dayFull(next.plannedFor)}, first expired first out.`
          : action === "release"
            ? `Released: the lots went back to available stock in ${next.kitchen.name}. The batch is still planned.`
            : `Cancelled: ${next.recipe.code} on ${dayFull(next.plannedFor)} is off the plan${batch.status === "reserved" ? " and its lots are available again" : ""}.`,
      );
      setConfirming(null);
    } catch (e) {
      if (!(e instanceof ApiError) || e.status === 0) {
        setError(`${e instanceof Error ? e.message : "Something went wrong."} Try again: it cannot happen twice.`);
        return;
      }
      keys.current[action] = undefined;
      setConfirming(null);
      const short = shortLinesOf(e);
      if (e.code === "SHORTAGE" && short.length) {
        const parts = short.map((s) => {
          const line = lineOf(s.position);
          const f = (v: string) => (line ? quantityText(v, line.item, units, unitSystem) : `${v} ${s.unit}`);
          return `${s.sku} needs ${f(s.needed)}, only ${f(s.available)} can be reserved`;
        });
        setError(`Nothing was reserved (a batch is reserved all or nothing): ${parts.join("; ")}.`);
      } else {
        setError(e.message);
      }
    } finally {
      setBusy(null);
      await queryClient.invalidateQueries({ queryKey: planningKeys.batches() });
      await queryClient.invalidateQueries({ queryKey: stockKeys.all });
      await queryClient.invalidateQueries({ queryKey: planningKeys.batch(batch.id) });
    }
  }

  // asking for a suggested transfer: one request per line and kitchen at a time, its own key kept
  // only for a retry after a lost answer (so a double click or a retry asks once)
  const [asking, setAsking] = useState<string | null>(null);
  const askKeys = useRef<Record<string, string>>({});
  /** item id -> kitchen code asked, until the refetched batch shows the open request itself */
  const [asked, setAsked] = useState<Record<string, string>>({});
  const kitchenLabel = (code: string) => (kitchenNames[code] ? `${kitchenNames[code]} (${code})` : code);

  async function askTransfer(line: BatchLine, s: TransferSuggestion) {
    if (asking) return;
    const id = `${line.item.id}:${s.kitchen.code}`;
    setAsking(id);
    setError(undefined);
    setDone(undefined);
    setDoneHold(false);
    const key = (askKeys.current[id] ??= newIdempotencyKey());
    const amount = quantityText(s.quantity, line.item, units, unitSystem);
    try {
      await requestBatchTransfer({
        batch: batch.id, fromKitchen: s.kitchen.code, toKitchen: batch.kitchen.code, item: line.item.id, quantity: s.quantity, unit: line.item.unit,
        note: `For batch ${batch.recipe.code} on ${dayMedium(batch.plannedFor)}: ${line.item.sku} is short here.`,
      }, key);
      delete askKeys.current[id];
      setAsked((a) => ({ ...a, [line.item.id]: s.kitchen.code }));
      setDone(`Asked ${kitchenLabel(s.kitchen.code)} for ${amount} of ${line.item.sku}. The request waits on the Transfers page until that kitchen sends it; then reserve this batch.`);
    } catch (e) {
      if (!(e instanceof ApiError) || e.status === 0) {
        setError(`${e instanceof Error ? e.message : "Something went wrong."} Try again: it cannot be asked twice.`);
        return;
      }
      delete askKeys.current[id];
      if (e.code === "ALREADY_REQUESTED") {
        const from = (e.details.request as { fromKitchen?: { code?: string } } | undefined)?.fromKitchen?.code;
        if (from) setAsked((a) => ({ ...a, [line.item.id]: from }));
        setDone(e.message);
      } else {
        setError(e.message);
      }
    } finally {
      setAsking(null);
      await queryClient.invalidateQueries({ queryKey: planningKeys.batch(batch.id) });
      // from here the batch's own openRequests say whether a request is open
      setAsked({});
    }
  }

  const transferAction = (line: BatchLine, s: TransferSuggestion) => {
    const askedOf = line.openRequests[0]?.fromKitchen.code ?? asked[line.item.id];
    if (askedOf) {
      if (askedOf.toUpperCase() !== s.kitchen.code.toUpperCase()) return <span className="mt-0.5 block text-brine">Already asked of {kitchenLabel(askedOf)}.</span>;
      return (
        <span className="mt-1 flex flex-wrap items-center gap-x-2 gap-y-1">
          <Badge tone="neutral" icon={<Send />}>Requested</Badge>
          <Link href="/stock/transfers" className="font-semibold text-paprika underline-offset-2 hover:underline print:hidden">
            See it on Transfers
          </Link>
        </span>
      );
    }
    if (!canRequestTransfer || !open) return null;
    const id = `${line.item.id}:${s.kitchen.code}`;
    return (
      <button
        type="button"
        className="btn-quiet mt-1 px-3 text-sm print:hidden"
        onClick={() => void askTransfer(line, s)}
        disabled={asking !== null}
        aria-label={`Request transfer of ${quantityText(s.quantity, line.item, units, unitSystem)} ${line.item.sku} from ${kitchenLabel(s.kitchen.code)}`}
      >
        {asking === id ? <Loader2 aria-hidden className="h-4 w-4 animate-spin" /> : <Send aria-hidden className="h-4 w-4" />}
        Request transfer
      </button>
    );
  };

  const casingLine = batch.lines.find((l) => l.role === "casing");
  const weekStart = weekStartOf(batch.plannedFor, firstDay);

  return (
    <>
      <div className="space-y-6 print:space-y-4">
        <div className="flex flex-wrap items-center justify-between gap-3 print:hidden">
          <Link href={`/planning?week=${weekStart}`} className="btn-quiet">
            <ArrowLeft aria-hidden className="h-5 w-5" /> Week of {weekRange(weekStart)}
          </Link>
          <div className="flex flex-wrap gap-2">
            {canProduce && open ? (
              <button type="button" className={batch.status === "reserved" ? "btn-primary" : "btn-quiet"} onClick={() => { setDone(undefined); setProducing(true); }} disabled={busy !== null}>
                <ClipboardCheck aria-hidden className="h-5 w-5" /> Record production
              </button>
            ) : null}
            {made && batch.production ? (
              <Link href={`/planning/trace/batches/${batch.id}`} className="btn-quiet">
                <GitBranch aria-hidden className="h-5 w-5" /> Trace this batch
              </Link>
            ) : null}
            {canManage && batch.status === "planned" ? (
              <button type="button" className="btn-primary" onClick={() => void act("reserve")} disabled={busy !== null}>
                {busy === "reserve" ? <Loader2 aria-hidden className="h-5 w-5 animate-spin" /> : <Lock aria-hidden className="h-5 w-5" />}
                Reserve
              </button>
            ) : null}
            {canManage && batch.status === "reserved" ? (
              <button type="button" className="btn-quiet" onClick={() => setConfirming("release")} disabled={busy !== null}>
                <Unlock aria-hidden className="h-5 w-5" /> Release
              </button>
            ) : null}
            {canManage && open ? (
              <button type="button" className="btn-quiet text-ember" onClick={() => setConfirming("cancel")} disabled={busy !== null}>
                <Ban aria-hidden className="h-5 w-5" /> Cancel batch
              </button>
            ) : null}
            <button type="button" className="btn-quiet" onClick={() => window.print()}>
              <Printer aria-hidden className="h-5 w-5" /> Print
            </button>
          </div>
        </div>

        <div className="[&>header]:mb-0">
          <PageHeader
            title={`Batch ${batch.recipe.code}`}
            kitchen={batch.kitchen}
            description={`${dayFull(batch.plannedFor)} · ${batch.recipe.name}, version ${batch.recipe.version}`}
          />
        </div>
        <div className="flex flex-wrap items-center gap-2">
          <StatusBadge status={batch.status} />
          <ShortageMarker status={batch.status} shortLines={batch.shortLines} />
          {batch.batchCode ? <span className="text-sm text-brine">Batch code {batch.batchCode}</span> : null}
          <Link href={`/planning/recipes/${batch.recipe.id}?version=${batch.recipe.version}`} className="ml-auto text-sm font-semibold text-paprika underline-offset-2 hover:underline print:hidden">
            Recipe version {batch.recipe.version}
          </Link>
        </div>

        {/* one live region for every outcome; a hold is a warning in words and an icon, not a success */}
        <div role="status">
          {done && doneHold ? (
            <p className="flex items-start gap-2 rounded-md border border-ember/30 bg-ember-soft px-3 py-2 text-sm font-semibold text-ember">
              <OctagonAlert aria-hidden className="mt-0.5 h-4 w-4 shrink-0" />
              <span>{done}</span>
            </p>
          ) : done ? (
            <FormMessage tone="success">{done}</FormMessage>
          ) : null}
        </div>
        {error ? <FormMessage tone="error">{error}</FormMessage> : null}

        {made && batch.production ? (
          <ProductionRecord
            batch={batch}
            units={units}
            unitSystem={unitSystem}
            timeZone={timeZone}
            canReleaseHold={canReleaseHold}
            onReleased={released}
            headingRef={productionHeading}
          />
        ) : null}

        {made ? <h2 className="text-xl font-semibold">The plan</h2> : null}
        <dl className="grid grid-cols-2 gap-3 md:grid-cols-4 print:grid-cols-4">
          <Fact label="Production day">{dayMedium(batch.plannedFor)}</Fact>
          <Fact label="Meat block (green weight)">{gramsText(batch.meatBlockG, unitSystem)}</Fact>
          <Fact label="Filling mass">
            {gramsText(batch.fillingG, unitSystem)}
            <span className="block text-sm font-normal text-brine">meat plus what is mixed in</span>
          </Fact>
          {batch.links ? (
            <Fact label="Links">
              {batch.links.count} × {gramsText(batch.links.weightG, unitSystem)}
            </Fact>
          ) : (
            <Fact label="Planned by">{batch.createdBy?.name ?? "—"}</Fact>
          )}
        </dl>

        {batch.casing && casingLine ? (
          <section aria-labelledby="casing-heading" className="panel flex flex-wrap items-baseline gap-x-6 gap-y-1 px-4 py-3 break-inside-avoid">
            <h2 id="casing-heading" className="font-sans text-base font-semibold">Casing: {casingLine.item.sku}</h2>
            <p className="num">
              <span className="font-semibold">{metresText(batch.casing.metres, unitSystem)}</span> of casing
              {batch.casing.putUps ? <> · {quantityText(batch.casing.putUps, casingLine.item, units, unitSystem)}</> : null}
            </p>
            {batch.casing.putUpsToOpen !== null ? (
              <p className="font-semibold">
                Open {batch.casing.putUpsToOpen} {putUpWord(casingLine.item.id, units, batch.casing.putUpsToOpen)}
              </p>
            ) : null}
            <p className="w-full text-sm text-brine">{batch.casing.source}</p>
          </section>
        ) : null}
        {batch.notes.map((n) => (
          <p key={n} className="flex items-start gap-2 rounded-md border border-amber/40 bg-amber-soft px-3 py-2 text-sm text-pepper">
            <TriangleAlert aria-hidden className="mt-0.5 h-4 w-4 shrink-0 text-amber" /> {n}
          </p>
        ))}

        <section aria-labelledby="bom-heading" className="space-y-2">
          <div className="flex flex-wrap items-baseline justify-between gap-2">
            <h2 id="bom-heading" className="text-xl font-semibold">{made ? "Bill of materials as planned" : "Bill of materials"}</h2>
            {open && batch.shortLines > 0 ? (
              <p className="text-sm font-semibold text-ember">
                {shortWords(batch.shortLines)}: reserving is all or nothing, so nothing can be held until each line has stock here.
              </p>
            ) : null}
          </div>
          <BomTable
            batch={batch}
            units={units}
            untracked={untracked}
            unitSystem={unitSystem}
            scaleResolutionG={scaleResolutionG}
            kitchenNames={kitchenNames}
            transferAction={transferAction}
          />
          <p className="text-sm text-brine">
            Quantities in each item&rsquo;s unit for your {unitSystem === "us" ? "US" : "metric"} setting; cure in grams, rounded to the kitchen scale toward
            compliance.{open ? " Available is what the kitchen still has free (not counting what this batch holds) in lots still in date on the production day." : ""}
          </p>
        </section>

        {batch.cure ? <CureCheckPanel cure={batch.cure} basis="the rounded amounts as planned" headingId="cure-heading" heading={made ? "Cure check as planned" : "Cure check"} /> : null}

        {batch.note ? (
          <section aria-labelledby="note-heading" className="break-inside-avoid">
            <h2 id="note-heading" className="text-xl font-semibold">Note</h2>
            <p className="mt-1 whitespace-pre-line">{batch.note}</p>
          </section>
        ) : null}

        <p className="hidden text-sm text-pepper-soft print:block">
          Printed {printedAt} by {printedBy}. Weighed by: ______________________ Checked by: ______________________
        </p>
      </div>

      {/* the dialogs sit outside the spaced column: its margins would push a fixed dialog down */}
      <SideSheet
        open={producing}
        onClose={() => setProducing(false)}
        title="Record production"
        description={`${batch.recipe.code} · ${dayFull(batch.plannedFor)} · what was actually weighed`}
      >
        <ProductionForm
          batch={batch}
          units={units}
          untracked={untracked}
          unitSystem={unitSystem}
          today={today}
          onProduced={produced}
          onConflict={() => void refresh()}
          onClose={() => setProducing(false)}
        />
      </SideSheet>

      <ConfirmDialog
        open={confirming === "release"}
        title="Release the reserved lots?"
        confirmLabel="Release"
        busy={busy === "release"}
        onConfirm={() => void act("release")}
        onClose={() => setConfirming(null)}
      >
        <p>The lots held for {batch.recipe.code} on {dayFull(batch.plannedFor)} go back to available stock in {batch.kitchen.name}, where other batches may take them. The batch stays planned.</p>
      </ConfirmDialog>
      <ConfirmDialog
        open={confirming === "cancel"}
        title="Cancel this batch?"
        confirmLabel="Cancel batch"
        busy={busy === "cancel"}
        onConfirm={() => void act("cancel")}
        onClose={() => setConfirming(null)}
      >
        <p>{batch.recipe.code} on {dayFull(batch.plannedFor)} comes off the plan{batch.status === "reserved" ? " and its reserved lots go back to available stock" : ""}. A cancelled batch cannot be planned again: plan a new one instead.</p>
      </ConfirmDialog>
    </>
  );
}

function Fact({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div className="panel px-4 py-3 print:rounded-none print:border-pepper/40">
      <dt className="text-sm text-brine">{label}</dt>
      <dd className="num text-lg font-semibold">{children}</dd>
    </div>
  );
}
