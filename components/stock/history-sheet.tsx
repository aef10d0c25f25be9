"use client";

// Movement history of one item (or one of its lots) in the current kitchen, newest first, in a side
// sheet so the grid stays in view. Pages come from GET /api/movements by cursor ("Load more").
import { useInfiniteQuery } from "@tanstack/react-query";
import { AlertCircle, Loader2 } from "lucide-react";
import type { Movement } from "@/lib/data/ledger";
import type { MovementEntry } from "@/lib/data/movements";
import type { StockLot, StockRow } from "@/lib/data/stock";
import { fetchMovements, stockKeys } from "@/lib/queries/stock";
import { dec, type UnitSystem } from "@/lib/units";
import { SideSheet } from "@/components/ui/side-sheet";
import { casingLabel, DATE_KIND_WORDS, quantityText, stockUnitText } from "./stock-rows";

export interface HistoryTarget {
  item: StockRow;
  lot?: StockLot;
}

const PAGE_SIZE = 25;

function kindWords(m: Movement): string {
  const positive = dec(m.delta).gt(0);
  switch (m.kind) {
    case "receipt": return "Received";
    case "use": return "Used";
    case "waste": return "Wasted";
    case "adjustment": return "Adjusted";
    case "count": return "Counted";
    case "transfer": return positive ? `Transfer in from ${m.otherKitchen?.code ?? "another kitchen"}` : `Transfer out to ${m.otherKitchen?.code ?? "another kitchen"}`;
  }
}

/** Who posted it: "you", the person's name, or words for a user no longer known and for none. */
function byWhom(m: MovementEntry, currentUserId: string): string {
  if (m.userId === null) return "the system";
  if (m.userId === currentUserId) return "you";
  return m.userName ?? "a former user";
}

function deltaText(m: Movement, item: StockRow, system: UnitSystem): string {
  const d = dec(m.delta);
  if (d.isZero()) return "no change";
  const shown = quantityText(d.abs().toFixed(), item, system).main;
  return `${d.gt(0) ? "+" : "−"}${shown}`;
}

export function HistorySheet({ kitchen, target, onClose, unitSystem, timeZone, currentUserId }: {
  kitchen: string;
  target: HistoryTarget | null;
  onClose: () => void;
  unitSystem: UnitSystem;
  timeZone: string;
  currentUserId: string;
}) {
  const item = target?.item;
  const lot = target?.lot;
  const title = item ? `History of ${item.sku}` : "History";
  const description = item
    ? `${item.casing ? `${casingLabel(item.casing)} · ` : ""}${item.name}${lot ? ` · lot ${lot.code}` : ""} · newest first`
    : undefined;
  return (
    <SideSheet open={target !== null} onClose={onClose} title={title} description={description}>
      {item ? <MovementList kitchen={kitchen} item={item} lot={lot} unitSystem={unitSystem} timeZone={timeZone} currentUserId={currentUserId} /> : null}
    </SideSheet>
  );
}

function MovementList({ kitchen, item, lot, unitSystem, timeZone, currentUserId }: {
  kitchen: string;
  item: StockRow;
  lot?: StockLot;
  unitSystem: UnitSystem;
  timeZone: string;
  currentUserId: string;
}) {
  const q = useInfiniteQuery({
    queryKey: stockKeys.movements({ kitchen, item: item.itemId, lot: lot?.lotId }),
    queryFn: ({ pageParam }) => fetchMovements({ kitchen, item: item.itemId, lot: lot?.lotId, cursor: pageParam, limit: PAGE_SIZE }),
    initialPageParam: null as string | null,
    getNextPageParam: (last) => last.nextCursor,
    staleTime: 0,
  });
  const when = new Intl.DateTimeFormat("en-GB", { timeZone, dateStyle: "medium", timeStyle: "short" });
  const movements = q.data?.pages.flatMap((p) => p.movements) ?? [];

  if (q.isPending) {
    return (
      <p role="status" className="flex items-center gap-2 text-brine">
        <Loader2 aria-hidden className="h-4 w-4 animate-spin" /> Loading the history…
      </p>
    );
  }
  if (q.isError && !movements.length) {
    return (
      <div role="alert" className="flex items-start gap-2 rounded-md border border-ember/30 bg-ember-soft px-3 py-2 text-sm font-medium text-ember">
        <AlertCircle aria-hidden className="mt-0.5 h-4 w-4 shrink-0" />
        <span>The history could not be loaded: {q.error.message}</span>
      </div>
    );
  }
  return (
    <div className="pb-6">
      {lot ? (
        <p className="mb-4 text-sm text-brine">
          Lot {lot.code}
          {lot.date && lot.dateKind ? ` · ${DATE_KIND_WORDS[lot.dateKind]} ${lot.date}` : ""} · received {lot.receivedOn}
        </p>
      ) : null}
      {movements.length === 0 ? (
        <p className="text-brine">No movements yet in this kitchen.</p>
      ) : (
        <ol className="divide-y divide-salt-edge border-y border-salt-edge">
          {movements.map((m) => (
            <li key={m.id} className="py-3">
              <div className="flex items-baseline justify-between gap-3">
                <span className="font-semibold">{kindWords(m)}</span>
                <span className="num whitespace-nowrap text-right font-semibold tabular-nums">{deltaText(m, item, unitSystem)}</span>
              </div>
              <p className="mt-0.5 text-sm text-brine">
                <time dateTime={m.occurredAt}>{when.format(new Date(m.occurredAt))}</time>
                {!lot ? ` · lot ${m.lot.code}` : ""}
                {m.kind === "count" && m.counted !== null ? ` · counted ${stockUnitText(dec(m.counted).toFixed(), item)}` : ""}
                {` · by ${byWhom(m, currentUserId)}`}
              </p>
              {m.reason ? <p className="mt-0.5 text-sm text-pepper-soft">{m.reason}</p> : null}
            </li>
          ))}
        </ol>
      )}
      {q.isError && movements.length ? (
        <p role="alert" className="field-error">More could not be loaded: {q.error.message}</p>
      ) : null}
      {q.hasNextPage ? (
        <button type="button" className="btn-quiet mt-4 w-full" onClick={() => void q.fetchNextPage()} disabled={q.isFetchingNextPage}>
          {q.isFetchingNextPage ? <Loader2 aria-hidden className="h-4 w-4 animate-spin" /> : null}
          Load more
        </button>
      ) : movements.length ? (
        <p className="mt-4 text-sm text-brine">That is the whole history.</p>
      ) : null}
    </div>
  );
}
