"use client";

// The week of one kitchen, from the company's first day of the week: each day with its batches
// (recipe, meat block, status, shortage in words), "Reserve all" for the week with a summary and a
// per-batch report (reserved now, already reserved, short of what, skipped), and "Plan a batch" in a
// side sheet.
import { useQuery, useQueryClient } from "@tanstack/react-query";
import { CalendarPlus, ChevronLeft, ChevronRight, CheckCircle2, CircleMinus, Loader2, Lock, TriangleAlert, X } from "lucide-react";
import Link from "next/link";
import { useMemo, useRef, useState } from "react";
import { ShortageMarker, shortWords, StatusBadge, statusWord } from "@/components/planning/batch-badges";
import { addDays, dayLong, dayShort, weekDays, weekRange, weekWord, type WeekStart } from "@/components/planning/dates";
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
  result: ReserveAllResult;
  /** the week's batches before the call, for each line's units */
  before: Map<string, Batch>;
}

export function WeekPlanner({ kitchen, start, firstDay, today, initialBatches, recipes, casings, units, unitSystem, scaleResolutionG, kitchenNames, canManage, canWriteRecipes, planRecipe }: {
  kitchen: { code: string; name: string };
  /** the week's first day (yyyy-mm-dd) */
  start: string;
  /** the company's first day of the week */
  firstDay: WeekStart;
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
  const end = addDays(start, 6);
  const queryClient = useQueryClient();
  const q = useQuery({ ...weekQueryOptions(kitchen.code, start, end), initialData: initialBatches, staleTime: 0 });
  const batches = q.data;
  const days = weekDays(start);
  const [planning, setPlanning] = useState<{ day: string; recipe?: string } | null>(canManage && planRecipe ? { day: firstOpenDay(days, today), recipe: planRecipe } : null);
  const [report, setReport] = useState<Report | null>(null);
  const [reserveError, setReserveError] = useState<string>();
  const [reserving, setReserving] = useState(false);
  const reserveKey = useRef<string | null>(null);

  const word = weekWord(start, today, firstDay);
  const range = weekRange(start);
  const open = batches.filter((b) => b.status === "planned" || b.status === "reserved");
  const toReserve = open.filter((b) => b.status === "planned" && b.plannedFor >= today);
  const shortBatches = open.filter((b) => b.shortLines > 0);
  const past = end < today;
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
    const from = start < today ? today : start;
    reserveKey.current ??= newIdempotencyKey();
    try {
      const result = await reserveAll({ kitchen: kitchen.code, from, to: end }, reserveKey.current);
      reserveKey.current = null;
      setReport({ range: from === start ? range : `${dayShort(from)} – ${dayShort(end)}`, result, before });
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
          <Link href={`/planning?week=${addDays(start, -7)}`} className="btn-quiet px-3" aria-label="Previous week">
            <ChevronLeft aria-hidden className="h-5 w-5" />
          </Link>
          <h2 className="min-w-[15rem] text-center text-xl font-semibold" aria-live="polite">
            {word ? <span>{word} · </span> : null}
            <span className="font-normal">{range}</span>
          </h2>
          <Link href={`/planning?week=${addDays(start, 7)}`} className="btn-quiet px-3" aria-label="Next week">
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

/** "1 reserved now, 1 already reserved, 1 short of stock, 1 skipped" (only the outcomes that happened). */
function reserveSummary(c: ReserveAllResult["counts"]): string {
  const parts = [
    c.reserved ? `${c.reserved} reserved now` : "",
    c.alreadyReserved ? `${c.alreadyReserved} already reserved` : "",
    c.short ? `${c.short} short of stock (nothing held for ${c.short === 1 ? "it" : "them"})` : "",
    c.skipped ? `${c.skipped} skipped (made or cancelled)` : "",
  ].filter(Boolean);
  if (!parts.length) return "no batch planned in these days";
  return c.reserved ? parts.join(", ") : `nothing new to hold: ${parts.join(", ")}`;
}

function ReserveReport({ report, units, unitSystem, onDismiss }: { report: Report; units: UnitsById; unitSystem: UnitSystem; onDismiss: () => void }) {
  const shortText = (batch: Batch | undefined, s: ReserveAllResult["batches"][number]["short"][number]) => {
    const line = batch?.lines.find((l) => l.position === s.position);
    const f = (v: string) => (line ? quantityText(v, line.item, units, unitSystem) : `${v} ${s.unit}`);
    return `${s.sku} needs ${f(s.needed)}, ${f(s.available)} available`;
  };
  const { result } = report;
  return (
    <section aria-label="Reserve all: result" className="panel space-y-2 px-4 py-3">
      <div className="flex items-start justify-between gap-3">
        <h3 className="font-sans text-base font-semibold">Reserve all, {report.range}: {reserveSummary(result.counts)}.</h3>
        <button type="button" className="btn-quiet -my-1 min-w-touch px-0" onClick={onDismiss} aria-label="Dismiss the result">
          <X aria-hidden className="h-5 w-5" />
        </button>
      </div>
      <ul className="space-y-1.5">
        {result.batches.map((r) => (
          <li key={r.batchId} className="flex items-start gap-2 text-sm">
            {r.outcome === "reserved" ? (
              <CheckCircle2 aria-hidden className="mt-0.5 h-4 w-4 shrink-0 text-herb" />
            ) : r.outcome === "already_reserved" ? (
              <Lock aria-hidden className="mt-0.5 h-4 w-4 shrink-0 text-herb" />
            ) : r.outcome === "short" ? (
              <TriangleAlert aria-hidden className="mt-0.5 h-4 w-4 shrink-0 text-ember" />
            ) : (
              <CircleMinus aria-hidden className="mt-0.5 h-4 w-4 shrink-0 text-brine" />
            )}
            <span>
              <Link href={`/planning/batches/${r.batchId}`} className="font-semibold underline-offset-2 hover:underline">
                {r.recipeCode} · {dayShort(r.plannedFor)}
              </Link>
              {": "}
              {r.outcome === "reserved" ? (
                "reserved now."
              ) : r.outcome === "already_reserved" ? (
                "already reserved, nothing to do."
              ) : r.outcome === "short" ? (
                <>
                  <span className="font-semibold text-ember">not reserved, {shortWords(r.short.length)}</span>
                  {" — "}
                  {r.short.map((s) => shortText(report.before.get(r.batchId), s)).join("; ")}.
                </>
              ) : (
                <span className="text-brine">skipped, {statusWord(r.status).toLowerCase()}.</span>
              )}
            </span>
          </li>
        ))}
      </ul>
    </section>
  );
}
