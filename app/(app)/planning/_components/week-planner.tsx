"use client";

// The week of one kitchen: each day with its batches (recipe, meat block, status, shortage in
// words), "Reserve all" for the week with a per-batch report, and "Plan a batch" in a side sheet.
import { useQuery, useQueryClient } from "@tanstack/react-query";
import { CalendarPlus, ChevronLeft, ChevronRight, CheckCircle2, Loader2, Lock, TriangleAlert, X } from "lucide-react";
import Link from "next/link";
import { useMemo, useRef, useState } from "react";
import { ShortageMarker, shortWords, StatusBadge } from "@/components/planning/batch-badges";
import { addDays, dayLong, dayShort, weekDays, weekRange, weekWord } from "@/components/planning/dates";
import { gramsText, quantityText, type UnitsById } from "@/components/planning/quantities";
import { CureMarker } from "@/components/cure/cure-marker";
import { EmptyState } from "@/components/ui/empty-state";
import { FormMessage } from "@/components/ui/field";
import { SideSheet } from "@/components/ui/side-sheet";
import {
  ApiError, newIdempotencyKey, planningKeys, reserveAll, weekQueryOptions, type Batch, type RecipeSummary, type ReserveAllResult,
} from "@/lib/queries/planning";
import { stockKeys } from "@/lib/queries/stock";
import type { UnitSystem } from "@/lib/units";
import { PlanBatchForm, type CasingChoice } from "./plan-batch-form";

interface Report {
  range: string;
  rows: { batch: Batch | undefined; batchId: string; wasReserved: boolean; reserved: boolean; short: ReserveAllResult["batches"][number]["short"] }[];
}

export function WeekPlanner({ kitchen, monday, today, initialBatches, recipes, casings, units, unitSystem, scaleResolutionG, kitchenNames, canManage, canWriteRecipes, planRecipe }: {
  kitchen: { code: string; name: string };
  monday: string;
  today: string;
  initialBatches: Batch[];
  recipes: RecipeSummary[];
  casings: CasingChoice[];
  units: UnitsById;
  unitSystem: UnitSystem;
  scaleResolutionG: string;
  kitchenNames: Record<string, string>;
  canManage: boolean;
  canWriteRecipes: boolean;
  planRecipe?: string;
}) {
  const sunday = addDays(monday, 6);
  const queryClient = useQueryClient();
  const q = useQuery({ ...weekQueryOptions(kitchen.code, monday, sunday), initialData: initialBatches, staleTime: 0 });
  const batches = q.data;
  const days = weekDays(monday);
  const [planning, setPlanning] = useState<{ day: string; recipe?: string } | null>(canManage && planRecipe ? { day: firstOpenDay(days, today), recipe: planRecipe } : null);
  const [report, setReport] = useState<Report | null>(null);
  const [reserveError, setReserveError] = useState<string>();
  const [reserving, setReserving] = useState(false);
  const reserveKey = useRef<string | null>(null);

  const word = weekWord(monday, today);
  const range = weekRange(monday);
  const open = batches.filter((b) => b.status === "planned" || b.status === "reserved");
  const toReserve = open.filter((b) => b.status === "planned" && b.plannedFor >= today);
  const shortBatches = open.filter((b) => b.shortLines > 0);
  const past = sunday < today;
  const byDay = useMemo(() => new Map(days.map((d) => [d, batches.filter((b) => b.plannedFor === d)])), [batches, days]);

  const refresh = async () => {
    await queryClient.invalidateQueries({ queryKey: planningKeys.batches() });
    await queryClient.invalidateQueries({ queryKey: stockKeys.all });
  };

  async function reserveWeek() {
    if (reserving) return;
    setReserving(true);
    setReserveError(undefined);
    const before = new Map(batches.map((b) => [b.id, b]));
    const from = monday < today ? today : monday;
    reserveKey.current ??= newIdempotencyKey();
    try {
      const result = await reserveAll({ kitchen: kitchen.code, from, to: sunday }, reserveKey.current);
      reserveKey.current = null;
      setReport({
        range: from === monday ? range : `${dayShort(from)} – ${dayShort(sunday)}`,
        rows: result.batches.map((r) => ({ batch: before.get(r.batchId), batchId: r.batchId, wasReserved: before.get(r.batchId)?.status === "reserved", reserved: r.reserved, short: r.short })),
      });
    } catch (e) {
      if (e instanceof ApiError && e.status !== 0) reserveKey.current = null;
      setReserveError(`Nothing was reserved: ${e instanceof Error ? e.message : "something went wrong."}${e instanceof ApiError && e.status !== 0 ? "" : " Try again: it cannot happen twice."}`);
    } finally {
      setReserving(false);
      await refresh();
    }
  }

  return (
    <div className="space-y-5">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <nav aria-label="Weeks" className="flex flex-wrap items-center gap-2">
          <Link href={`/planning?week=${addDays(monday, -7)}`} className="btn-quiet px-3" aria-label="Previous week">
            <ChevronLeft aria-hidden className="h-5 w-5" />
          </Link>
          <h2 className="min-w-[15rem] text-center text-xl font-semibold" aria-live="polite">
            {word ? <span>{word} · </span> : null}
            <span className="font-normal">{range}</span>
          </h2>
          <Link href={`/planning?week=${addDays(monday, 7)}`} className="btn-quiet px-3" aria-label="Next week">
            <ChevronRight aria-hidden className="h-5 w-5" />
          </Link>
          {word !== "This week" ? <Link href={`/planning?week=${today}`} className="btn-quiet">This week</Link> : null}
        </nav>
        {canManage ? (
          <div className="flex flex-wrap gap-2">
            <button
              type="button"
              className="btn-quiet"
              onClick={() => void reserveWeek()}
              disabled={reserving || past || toReserve.length === 0}
              aria-describedby="reserve-all-hint"
            >
              {reserving ? <Loader2 aria-hidden className="h-5 w-5 animate-spin" /> : <Lock aria-hidden className="h-5 w-5" />}
              Reserve all
            </button>
            <button type="button" className="btn-primary" onClick={() => setPlanning({ day: firstOpenDay(days, today) })} disabled={recipes.length === 0 || past}>
              <CalendarPlus aria-hidden className="h-5 w-5" /> Plan a batch
            </button>
          </div>
        ) : null}
      </div>

      <p id="reserve-all-hint" className="text-sm text-brine">
        {batches.length === 0
          ? "Nothing planned this week."
          : `${batches.length} ${batches.length === 1 ? "batch" : "batches"} · ${open.filter((b) => b.status === "reserved").length} reserved · ${toReserve.length} to reserve${shortBatches.length ? ` · ${shortBatches.length} short of stock` : ""}.`}
        {canManage && toReserve.length ? " Reserve all holds lots first-expired-first-out for each planned batch from today on; a batch short of any line is left as it is." : ""}
      </p>

      {reserveError ? <FormMessage tone="error">{reserveError}</FormMessage> : null}
      <div role="status">{report ? <ReserveReport report={report} units={units} unitSystem={unitSystem} onDismiss={() => setReport(null)} /> : null}</div>

      {recipes.length === 0 ? (
        <EmptyState title="No recipes yet">
          <p>A batch is planned from a recipe.{canWriteRecipes ? " " : " A manager or kitchen lead writes them. "}{canWriteRecipes ? <Link href="/planning/recipes/new" className="font-semibold text-paprika underline">Write the first recipe</Link> : null}</p>
        </EmptyState>
      ) : null}

      <ol className="panel divide-y divide-salt-edge" aria-label={`Batches in ${kitchen.name}, ${range}`}>
        {days.map((day) => {
          const list = byDay.get(day) ?? [];
          const isToday = day === today;
          const before = day < today;
          return (
            <li key={day} className={`grid grid-cols-[9.5rem_1fr] gap-4 px-4 py-3 ${before ? "bg-salt/70" : ""}`} aria-label={dayLong(day)}>
              <div>
                <p className={`font-display text-lg font-semibold leading-tight ${before ? "text-brine" : ""}`}>{dayShort(day)}</p>
                {isToday ? <p className="text-sm font-semibold text-paprika">Today</p> : before ? <p className="text-sm text-brine">Past</p> : null}
              </div>
              <div className="min-w-0 space-y-2">
                {list.length === 0 ? (
                  <div className="flex min-h-touch items-center justify-between gap-3">
                    <p className="text-brine">Nothing planned</p>
                    {canManage && !before && recipes.length ? (
                      <button type="button" className="btn-quiet" onClick={() => setPlanning({ day })} aria-label={`Plan a batch on ${dayLong(day)}`}>
                        <CalendarPlus aria-hidden className="h-4 w-4" /> Plan
                      </button>
                    ) : null}
                  </div>
                ) : (
                  <ul className="space-y-2">
                    {list.map((b) => <BatchRow key={b.id} batch={b} unitSystem={unitSystem} />)}
                  </ul>
                )}
              </div>
            </li>
          );
        })}
      </ol>

      {canManage ? (
        <SideSheet open={planning !== null} onClose={() => setPlanning(null)} title="Plan a batch" description={`In ${kitchen.name}. The plan works out what to weigh; Reserve holds the stock.`}>
          {planning ? (
            <PlanBatchForm
              kitchen={kitchen}
              today={today}
              initialDay={planning.day}
              initialRecipe={planning.recipe}
              recipes={recipes}
              casings={casings}
              units={units}
              unitSystem={unitSystem}
              scaleResolutionG={scaleResolutionG}
              kitchenNames={kitchenNames}
              onPlanned={refresh}
              onClose={() => setPlanning(null)}
            />
          ) : null}
        </SideSheet>
      ) : null}
    </div>
  );
}

function firstOpenDay(days: string[], today: string): string {
  return days.find((d) => d >= today) ?? days[0]!;
}

function BatchRow({ batch: b, unitSystem }: { batch: Batch; unitSystem: UnitSystem }) {
  const cancelled = b.status === "cancelled";
  const hasCure = b.lines.some((l) => l.role === "cure");
  return (
    <li className={`grid grid-cols-[minmax(0,1fr)_auto] items-start gap-x-4 gap-y-1.5 rounded-md border px-3 py-2 ${cancelled ? "border-salt-edge bg-salt text-brine" : "border-salt-edge bg-white"}`}>
      <div className="min-w-0">
        <Link href={`/planning/batches/${b.id}`} className="font-semibold text-pepper underline-offset-2 hover:underline">
          <span className={cancelled ? "line-through" : undefined}>{b.recipe.code}</span>
          <span className="block text-sm font-normal text-brine">{b.recipe.name} · version {b.recipe.version}</span>
        </Link>
        <div className="mt-1.5 flex flex-wrap gap-1.5">
          <StatusBadge status={b.status} />
          <ShortageMarker status={b.status} shortLines={b.shortLines} />
        </div>
      </div>
      <div className="flex items-start gap-3">
        {hasCure ? <CureMarker /> : null}
        <p className="num min-w-[6rem] text-right text-lg font-semibold leading-tight">
          {gramsText(b.meatBlockG, unitSystem)}
          <span className="block text-xs font-normal text-brine">meat block</span>
        </p>
      </div>
    </li>
  );
}

function ReserveReport({ report, units, unitSystem, onDismiss }: { report: Report; units: UnitsById; unitSystem: UnitSystem; onDismiss: () => void }) {
  const shortText = (batch: Batch | undefined, s: ReserveAllResult["batches"][number]["short"][number]) => {
    const line = batch?.lines.find((l) => l.position === s.position);
    const f = (v: string) => (line ? quantityText(v, line.item, units, unitSystem) : `${v} ${s.unit}`);
    return `${s.sku} needs ${f(s.needed)}, ${f(s.available)} available`;
  };
  const reservedNow = report.rows.filter((r) => r.reserved && !r.wasReserved).length;
  const short = report.rows.filter((r) => !r.reserved).length;
  return (
    <section aria-label="Reserve all: result" className="panel space-y-2 px-4 py-3">
      <div className="flex items-start justify-between gap-3">
        <h3 className="font-sans text-base font-semibold">
          Reserve all, {report.range}: {reservedNow} reserved{short ? `, ${short} short of stock (nothing held for ${short === 1 ? "it" : "them"})` : ""}
          {report.rows.length === 0 ? ": no planned batch to reserve" : ""}.
        </h3>
        <button type="button" className="btn-quiet -my-1 min-w-touch px-0" onClick={onDismiss} aria-label="Dismiss the result">
          <X aria-hidden className="h-5 w-5" />
        </button>
      </div>
      <ul className="space-y-1.5">
        {report.rows.map((r) => (
          <li key={r.batchId} className="flex items-start gap-2 text-sm">
            {r.reserved ? <CheckCircle2 aria-hidden className="mt-0.5 h-4 w-4 shrink-0 text-herb" /> : <TriangleAlert aria-hidden className="mt-0.5 h-4 w-4 shrink-0 text-ember" />}
            <span>
              <Link href={`/planning/batches/${r.batchId}`} className="font-semibold underline-offset-2 hover:underline">
                {r.batch ? `${r.batch.recipe.code} · ${dayShort(r.batch.plannedFor)}` : "A batch"}
              </Link>
              {": "}
              {r.reserved ? (
                r.wasReserved ? "already reserved." : "reserved."
              ) : (
                <>
                  <span className="font-semibold text-ember">not reserved, {shortWords(r.short.length)}</span>
                  {" — "}
                  {r.short.map((s) => shortText(r.batch, s)).join("; ")}.
                </>
              )}
            </span>
          </li>
        ))}
      </ul>
    </section>
  );
}
