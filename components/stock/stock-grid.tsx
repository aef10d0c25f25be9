"use client";

// The stock grid: one kitchen's casings, cures, spices and other ingredients, on hand by lot.
//
// ag-grid Community only (no row grouping, tree data or master/detail): rows come flat from
// buildRows() (category header rows, items, lots under tracked items); an external filter hides
// the rows of a collapsed category or item, and postSortRows puts sorted rows back under their
// header and item. Counts typed into the "Counted" column collect in a pending count sheet that is
// posted in one go; par level and reorder point save at once (optimistic, put back on error). Both
// take a plain number in the item's stock unit or a number with a unit of the same dimension
// ("2.5 lb", "12 ft"): counts are posted in the typed unit (the server converts and keeps what was
// typed), levels are converted here by lib/units because the levels endpoint takes one unit for
// both. Each row has one compact actions button (pinned right) opening a small menu: History, and
// for people who may post, waste / adjustment / transfer out in the record sheet. The layout fits
// 1024 x 768 with the rail.
// Undo is ag-grid's undoRedoCellEditing: Ctrl+Z (or the Undo button, for touch) restores the
// previous value, which goes through the same setter and save path as an edit. ag-grid keeps its
// undo history by row position, so it clears it whenever rows are shown, hidden, re-sorted or
// replaced; the grid's callbacks are therefore stable and a saved level never replaces the rows.
import { useQuery, useQueryClient } from "@tanstack/react-query";
import {
  AllCommunityModule,
  ModuleRegistry,
  themeQuartz,
  type CellKeyDownEvent,
  type CellValueChangedEvent,
  type ColDef,
  type ColumnState,
  type FullWidthCellKeyDownEvent,
  type GridApi,
  type GetRowIdParams,
  type GridReadyEvent,
  type IFilterOptionDef,
  type IRowNode,
  type ITextFilterParams,
  type PostSortRowsParams,
  type ProcessCellForExportParams,
  type RowClassParams,
  type RowHeightParams,
  type SuppressKeyboardEventParams,
  type TextMatcherParams,
  type ValueGetterParams,
  type ValueSetterParams,
} from "ag-grid-community";
import { AgGridReact, type CustomCellEditorProps, type CustomCellRendererProps } from "ag-grid-react";
import { ArrowRightLeft, ChevronDown, ChevronRight, CircleAlert, ClipboardList, Download, Ellipsis, History, Loader2, RotateCcw, Search, SlidersHorizontal, Trash2, Undo2 } from "lucide-react";
import Link from "next/link";
import { useCallback, useEffect, useId, useLayoutEffect, useMemo, useRef, useState, useSyncExternalStore } from "react";
import { createPortal } from "react-dom";
import { CureCaution } from "@/components/cure/cure-caution";
import { CureMarker } from "@/components/cure/cure-marker";
import { EmptyState } from "@/components/ui/empty-state";
import { FormMessage } from "@/components/ui/field";
import type { ItemCategory } from "@/db/types";
import { ApiError, newIdempotencyKey, postCount, putStockLevel, stockQueryOptions } from "@/lib/queries/stock";
import { neutraliseFormula } from "@/lib/csv";
import { dec, type UnitSystem } from "@/lib/units";
import { HistorySheet, type HistoryTarget } from "./history-sheet";
import { RowActionsMenu, menuId, type RowMenuItem, type RowMenuState } from "./row-actions-menu";
import { StockActionSheet, type ActionKind, type ActionTarget } from "./stock-action-sheet";
import {
  buildRows,
  casingLabel,
  compareDecimal,
  DATE_KIND_WORDS,
  daysLeft,
  entryAsStored,
  entryText,
  expiryBand,
  firstDatedLot,
  formatDay,
  parseQuantityEntry,
  parseQuantityInput,
  quantityText,
  restoreHierarchy,
  stockStatus,
  stockUnitText,
  stockUnitWord,
  type GridRow,
  type ItemRow,
  type LotRow,
  type QuantityEntry,
} from "./stock-rows";

// once per page load: without the modules, editors and filters silently do nothing
ModuleRegistry.registerModules([AllCommunityModule]);

// Quartz in our tokens (tailwind.config.ts): salt surfaces, brine rules, pepper text, paprika focus.
const gridTheme = themeQuartz.withParams({
  fontFamily: "var(--font-sans), system-ui, sans-serif",
  fontSize: 15,
  headerFontSize: 14,
  headerFontWeight: 600,
  foregroundColor: "#1F1A17",
  backgroundColor: "#FFFFFF",
  headerBackgroundColor: "#F1ECE4",
  headerTextColor: "#3A332E",
  borderColor: "#E4DDD2",
  accentColor: "#AE3F1A",
  rangeSelectionBorderColor: "#AE3F1A",
  rowHoverColor: "#FAF7F2",
  selectedRowBackgroundColor: "#F8E4DA",
  invalidColor: "#B0261E",
  wrapperBorderRadius: 8,
  borderRadius: 6,
  headerHeight: 48,
  rowHeight: 52,
  // narrow padding: at 1024 x 768 with the rail, every key column fits without scrolling sideways
  cellHorizontalPadding: 8,
  iconSize: 18,
});

type Notice = { tone: "success" | "error"; text: string } | null;

interface PendingLine {
  rowId: string;
  itemId: string;
  lotId?: string;
  sku: string;
  lotCode?: string;
  /** the number as typed */
  counted: string;
  /** the unit it was typed in (the item's stock unit when none was typed): the server converts */
  unit: string;
  /** the grid's text of the entry ("480", "2.5 lb"): what the Counted cell holds */
  text: string;
}

/** What cell renderers and setters reach through ag-grid's `context`. */
interface GridContext {
  unitSystem: UnitSystem;
  today: string;
  canCount: boolean;
  canSetLevels: boolean;
  isGroupCollapsed: (g: ItemCategory) => boolean;
  isItemExpanded: (rowId: string) => boolean;
  toggleGroup: (g: ItemCategory) => void;
  toggleItem: (rowId: string) => void;
  canPost: boolean;
  /** opens (or, when open, closes) the row's actions menu under the given button */
  toggleMenu: (row: ItemRow | LotRow, button: HTMLElement, focus?: "first" | "last") => void;
  /** the row whose menu is open, for the buttons' aria-expanded */
  menuOpenFor: { subscribe: (listener: () => void) => () => void; get: () => string | null };
  refuse: (message: string) => void;
}

const GROUP_VALUE = "·group·";
const hasLots = (d: GridRow) => d.kind === "item" && d.item.trackLots && d.item.lots.length > 0;
const isCountable = (d: GridRow | undefined) => !!d && ((d.kind === "item" && !d.item.trackLots) || d.kind === "lot");
const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;
const isPress = (e: KeyboardEvent) => (e.key === "Enter" || e.key === " ") && !e.ctrlKey && !e.metaKey && !e.altKey;
/** Enter or Space that the grid's own handler must not take (it would move down a row). */
const pressTogglesItem = (p: SuppressKeyboardEventParams<GridRow>) => !p.editing && isPress(p.event) && !!p.data && (p.data.kind === "group" || hasLots(p.data));
const pressOpensMenu = (p: SuppressKeyboardEventParams<GridRow>) => !p.editing && isPress(p.event) && !!p.data && p.data.kind !== "group";

// ---------------------------------------------------------------------------------------------
// Cells

function Toggle({ expanded, label, onToggle }: { expanded: boolean; label: string; onToggle: () => void }) {
  const Icon = expanded ? ChevronDown : ChevronRight;
  return (
    <button
      type="button"
      // the grid moves focus between cells; Enter or Space on the focused cell toggles too
      tabIndex={-1}
      aria-expanded={expanded}
      aria-label={label}
      onClick={onToggle}
      className="flex h-11 w-11 shrink-0 items-center justify-center rounded-md text-pepper hover:bg-salt-deep"
    >
      <Icon aria-hidden className="h-5 w-5" />
    </button>
  );
}

function ItemCell({ data: d, context: ctx }: CustomCellRendererProps<GridRow, unknown, GridContext>) {
  if (!d) return null;
  if (d.kind === "group") {
    const open = !ctx.isGroupCollapsed(d.group);
    return (
      <div className="flex h-full items-center gap-1">
        <Toggle expanded={open} label={`${open ? "Collapse" : "Expand"} ${d.label}`} onToggle={() => ctx.toggleGroup(d.group)} />
        <span className="font-display text-[17px] font-semibold text-pepper">{d.label}</span>
        <span className="ml-1 text-sm font-normal text-brine">{plural(d.itemCount, "item", "items")}</span>
      </div>
    );
  }
  if (d.kind === "lot") {
    const lot = d.lot;
    const days = lot.date ? daysLeft(lot.date, ctx.today) : null;
    const band = days === null ? null : expiryBand(days);
    return (
      <div className="flex h-full min-w-0 items-center gap-1 pl-8">
        <div className="min-w-0 border-l-2 border-brine-line pl-3 leading-tight">
          <div className="truncate font-semibold text-pepper-soft">Lot {lot.code}</div>
          <div className="mt-0.5 flex min-w-0 items-center gap-1.5 whitespace-nowrap text-[13px] text-brine">
            {lot.date ? (
              <>
                {/* the date gives way before its band ("expired") does */}
                <span className="min-w-0 truncate" title={`${lot.dateKind ? DATE_KIND_WORDS[lot.dateKind] : "dated"} ${formatDay(lot.date)}`}>
                  {lot.dateKind ? DATE_KIND_WORDS[lot.dateKind] : "dated"} {formatDay(lot.date)}
                </span>
                {band ? <ExpiryTag tone={band.tone} word={band.word} /> : null}
              </>
            ) : (
              <span className="min-w-0 truncate">received {formatDay(lot.receivedOn)} · no date</span>
            )}
          </div>
        </div>
      </div>
    );
  }
  const item = d.item;
  const expandable = hasLots(d);
  const open = ctx.isItemExpanded(d.id);
  const first = item.trackDates ? firstDatedLot(item) : null;
  const band = first?.date ? expiryBand(daysLeft(first.date, ctx.today)) : null;
  return (
    <div className="flex h-full min-w-0 items-center gap-1">
      {expandable ? (
        <Toggle expanded={open} label={`${open ? "Hide" : "Show"} lots of ${item.sku}`} onToggle={() => ctx.toggleItem(d.id)} />
      ) : (
        <span aria-hidden className="w-11 shrink-0" />
      )}
      <div className="min-w-0 leading-tight">
        <div className="flex min-w-0 items-center gap-2">
          <span className="truncate font-semibold" title={d.label}>{d.label}</span>
          {item.cure ? <CureMarker className="shrink-0 !px-2 !py-0 !text-[13px]" /> : null}
        </div>
        <div className="mt-0.5 flex min-w-0 items-center gap-1.5 whitespace-nowrap text-[13px] text-brine">
          <span className="truncate" title={`${item.sku} · ${item.name}`}>
            {item.sku}
            {item.casing ? ` · ${item.name}` : ""}
            {item.trackLots ? ` · ${plural(item.lots.length, "lot", "lots")}` : ""}
          </span>
          {band ? <ExpiryTag tone={band.tone} word={first && band.word !== "expired" && band.word !== "in date" ? `next ${band.word}` : band.word} /> : null}
        </div>
      </div>
    </div>
  );
}

function ExpiryTag({ tone, word }: { tone: "herb" | "amber" | "ember" | "neutral"; word: string }) {
  const colours = {
    herb: "border-herb/25 bg-herb-soft text-herb",
    amber: "border-amber/25 bg-amber-soft text-amber",
    ember: "border-ember/25 bg-ember-soft text-ember",
    neutral: "border-brine-line bg-brine-soft text-pepper-soft",
  }[tone];
  return <span className={`inline-flex shrink-0 items-center rounded-full border px-1.5 text-[12px] font-semibold leading-[18px] ${colours}`}>{word}</span>;
}

function QuantityCell({ value, data: d, context: ctx }: CustomCellRendererProps<GridRow, string | null, GridContext>) {
  if (!d || d.kind === "group" || value === null || value === undefined) return null;
  const q = quantityText(value, d.item, ctx.unitSystem);
  const zero = dec(value).isZero();
  return (
    <div className={`num flex h-full flex-col items-end justify-center leading-tight tabular-nums ${zero ? "text-brine" : ""}`}>
      <span className={d.kind === "item" ? "font-semibold" : ""}>{q.main}</span>
      {q.length ? <span className="text-[13px] text-brine">{q.length}</span> : null}
    </div>
  );
}

/** The entry a Counted cell holds ("480", "2.5 lb"), read for its item; null when empty or unreadable. */
function countedEntry(value: string | null | undefined, d: ItemRow | LotRow): QuantityEntry | null {
  if (value === null || value === undefined) return null;
  const parsed = parseQuantityEntry(value, d.item);
  return parsed.ok ? parsed.entry : null;
}

function CountedCell({ value, data: d, context: ctx }: CustomCellRendererProps<GridRow, string | null, GridContext>) {
  if (!d || d.kind === "group") return null;
  if (d.kind === "item" && d.item.trackLots) {
    return <div className="flex h-full items-center justify-end text-[13px] text-brine">{d.item.lots.length ? "count each lot" : "no lots"}</div>;
  }
  const unit = stockUnitWord(d.item);
  const entry = countedEntry(value, d);
  if (!entry) {
    return (
      <div className="flex h-full items-center justify-end">
        <span className="inline-flex min-w-[72px] justify-end rounded border border-dashed border-brine-line px-2 py-1 text-sm text-brine">
          {ctx.canCount ? unit : "—"}
        </span>
      </div>
    );
  }
  const onHand = d.kind === "lot" ? d.lot.onHand : d.item.onHand;
  const diff = dec(entry.inStock).minus(dec(onHand));
  // typed in the stock unit: exact figures; in another unit: as typed, the difference as people read it
  const converted = entry.unit !== null;
  const diffText = diff.isZero()
    ? "no difference"
    : `${diff.gt(0) ? "+" : "−"}${converted ? quantityText(diff.abs().toFixed(), d.item, ctx.unitSystem).main : stockUnitText(diff.abs().toFixed(), d.item)}`;
  return (
    <div
      className="num flex h-full flex-col items-end justify-center leading-tight tabular-nums"
      title={converted ? `${entryText(entry)} = ${stockUnitText(entryAsStored(entry), d.item)}` : undefined}
    >
      <span className="font-semibold text-pepper">{converted ? entryText(entry) : stockUnitText(entry.quantity, d.item)}</span>
      <span className="text-[13px] text-brine">{diffText}</span>
    </div>
  );
}

function LevelCell({ value, data: d, context: ctx, colDef }: CustomCellRendererProps<GridRow, string | null, GridContext>) {
  if (!d || d.kind !== "item") return null;
  const status = colDef?.colId === "reorderPoint" ? stockStatus(d.item.available, d.reorderPoint) : null;
  return (
    <div className="num flex h-full flex-col items-end justify-center gap-0.5 leading-tight tabular-nums">
      {value === null || value === undefined ? (
        <span className="text-sm text-brine">not set</span>
      ) : (
        <span>{quantityText(value, d.item, ctx.unitSystem).main}</span>
      )}
      {status ? <ExpiryTag tone={status.tone} word={status.word} /> : null}
    </div>
  );
}

const rowTarget = (d: ItemRow | LotRow) => `${d.item.sku}${d.kind === "lot" ? `, lot ${d.lot.code}` : ""}`;

/** One compact button per row: opens the row's menu (History; Record waste, adjustment, transfer). */
function ActionsCell({ data: d, context: ctx }: CustomCellRendererProps<GridRow, unknown, GridContext>) {
  const openFor = useSyncExternalStore(ctx.menuOpenFor.subscribe, ctx.menuOpenFor.get, () => null);
  if (!d || d.kind === "group") return null;
  const open = openFor === d.id;
  return (
    // at the cell's left: an overlay scrollbar (tablets) may cover the last 16 px of the grid
    <div className="flex h-full items-center justify-start">
      <button
        type="button"
        // the grid moves focus between cells; Enter, Space or Shift+F10 on the row opens the menu
        tabIndex={-1}
        data-row-menu-trigger
        aria-haspopup="menu"
        aria-expanded={open}
        aria-controls={open ? menuId(d.id) : undefined}
        aria-label={`Actions for ${rowTarget(d)}`}
        aria-keyshortcuts="Shift+F10"
        title={ctx.canPost ? "History, waste, adjustment, transfer" : "History"}
        onClick={(e) => ctx.toggleMenu(d, e.currentTarget)}
        className={`flex h-11 w-11 items-center justify-center rounded-md border text-pepper hover:bg-salt-deep ${open ? "border-paprika bg-paprika-soft" : "border-salt-edge bg-white"}`}
      >
        <Ellipsis aria-hidden className="h-5 w-5" />
      </button>
    </div>
  );
}

function ActionsHeader() {
  return (
    <span className="flex w-11 justify-center" title="Row actions">
      <Ellipsis aria-hidden className="h-5 w-5 text-brine" />
      <span className="sr-only">Actions</span>
    </span>
  );
}

/**
 * The editor of the quantity cells: a decimal keypad on tablets, the stock unit beside the box. A
 * number alone is in the stock unit; a number and a unit of the same dimension ("2.5 lb", "12 ft")
 * is converted exactly (lib/units), and the conversion shows under the box. Enter or Tab on text
 * that cannot be read keeps the editor open with the reason under the box (Esc cancels); leaving
 * the cell otherwise is refused by the column's setter, which says why above the grid.
 */
function QuantityEditor(p: CustomCellEditorProps<GridRow, string | null, GridContext>) {
  const ref = useRef<HTMLInputElement>(null);
  const d = p.data;
  const { eventKey, onValueChange } = p;
  const typed = !!eventKey && eventKey.length === 1;
  const bubbleId = `${useId().replace(/:/g, "")}-quantity-note`;
  // The text is held here, not only in the grid: keys typed right after the one that opened the
  // editor must land after it, before the grid has re-rendered with the new value.
  const [text, setText] = useState(() =>
    typed ? eventKey! : eventKey === "Backspace" || eventKey === "Delete" ? "" : (p.initialValue ?? ""),
  );
  // errors show once Enter or Tab was refused (while typing "2 l" on the way to "2 lb" they would flash)
  const [tried, setTried] = useState(false);
  const [box, setBox] = useState<DOMRect | null>(null);
  const item = d && d.kind !== "group" ? d.item : null;
  const parsed = item ? parseQuantityEntry(text, item) : null;
  const parsedRef = useRef(parsed);
  parsedRef.current = parsed;

  useLayoutEffect(() => {
    const input = ref.current;
    if (text !== (p.initialValue ?? "")) onValueChange(text);
    input?.focus();
    if (typed) input?.setSelectionRange(text.length, text.length);
    else input?.select();
    if (input) setBox(input.getBoundingClientRect());
    // only when the editor opens
  }, []);

  useEffect(() => {
    const input = ref.current;
    if (!input) return;
    // on the input itself, before the grid's own key handling on the cell: the grid would commit
    const onKeyDown = (e: KeyboardEvent) => {
      if ((e.key === "Enter" || e.key === "Tab") && parsedRef.current && !parsedRef.current.ok) {
        e.preventDefault();
        e.stopPropagation();
        setTried(true);
      }
    };
    input.addEventListener("keydown", onKeyDown);
    return () => input.removeEventListener("keydown", onKeyDown);
  }, []);

  if (!d || d.kind === "group" || !item || !parsed) return null;
  const unit = stockUnitWord(item);
  const what = p.colDef.headerName ?? "Quantity";
  const target = d.kind === "lot" ? `${item.sku}, lot ${d.lot.code}` : item.sku;
  const error = tried && !parsed.ok ? parsed.message : null;
  const preview = parsed.ok && parsed.entry?.unit ? `${entryText(parsed.entry)} = ${stockUnitText(entryAsStored(parsed.entry), item)}` : null;
  const note = error ?? preview;
  return (
    <div className="flex h-full w-full items-center gap-1.5 bg-white px-2">
      <input
        ref={ref}
        type="text"
        inputMode="decimal"
        autoComplete="off"
        spellCheck={false}
        aria-label={`${what} for ${target}, in ${unit}`}
        aria-invalid={error ? true : undefined}
        aria-describedby={note ? bubbleId : undefined}
        value={text}
        onChange={(e) => {
          setText(e.target.value);
          onValueChange(e.target.value);
        }}
        className={`num h-10 w-full min-w-0 rounded border-2 bg-white px-2 text-right tabular-nums text-pepper outline-none ${error ? "border-ember" : "border-paprika"}`}
      />
      <span className="shrink-0 text-sm text-brine">{unit}</span>
      {note && box && typeof document !== "undefined"
        ? createPortal(
            // under the box, outside the cell (cells clip their content)
            <div
              id={bubbleId}
              role={error ? "alert" : undefined}
              style={{ position: "fixed", top: box.bottom + 6, left: Math.max(8, Math.min(box.right - 320, window.innerWidth - 328)), width: 320, zIndex: 60 }}
              className={`flex items-start gap-2 rounded-md border px-3 py-2 text-sm font-medium shadow-lg ${error ? "border-ember/40 bg-ember-soft text-ember" : "border-salt-edge bg-white text-pepper"}`}
            >
              {error ? <CircleAlert aria-hidden className="mt-0.5 h-4 w-4 shrink-0" /> : null}
              <span>{error ? `${what} not changed: ${error} Esc cancels.` : preview}</span>
            </div>,
            document.body,
          )
        : null}
    </div>
  );
}

// ---------------------------------------------------------------------------------------------
// Values, filters, comparators

const quantityOf = (field: "onHand" | "reserved" | "available") => (p: ValueGetterParams<GridRow>) => {
  const d = p.data;
  if (!d || d.kind === "group") return null;
  return d.kind === "lot" ? d.lot[field] : d.item[field];
};

/** Lots filter with their item (so an item's lots never stand without it); headers always pass. */
const itemLevelFilterValue = (value: (d: ItemRow | LotRow) => string | null) => (p: ValueGetterParams<GridRow>) => {
  const d = p.data;
  if (!d || d.kind === "group") return GROUP_VALUE;
  return value(d);
};

/** A Counted cell's value in the stock unit (the cell holds the entry as typed: "2.5 lb"). */
const countedInStock = (d: GridRow | undefined): string | null => {
  if (!isCountable(d)) return null;
  const row = d as ItemRow | LotRow;
  return countedEntry(row.counted, row)?.inStock ?? null;
};

const decimalComparator = (a: string | null, b: string | null) => {
  if (a === null || a === undefined) return b === null || b === undefined ? 0 : -1;
  if (b === null || b === undefined) return 1;
  return dec(a).comparedTo(dec(b));
};

function decimalOption(displayKey: string, displayName: string, test: (c: number) => boolean): IFilterOptionDef {
  return {
    displayKey,
    displayName,
    numberOfInputs: 1,
    predicate: ([typed]: unknown[], cell: unknown) => {
      if (cell === GROUP_VALUE) return true;
      const parsed = parseQuantityInput(typed);
      if (!parsed.ok || parsed.value === null) return true; // not a number yet: filter nothing
      const c = compareDecimal(cell as string | null, parsed.value);
      return c !== null && test(c);
    },
  };
}

/** Exact decimal filters (in the stock unit) that leave category headers in place. */
const decimalFilterParams: ITextFilterParams = {
  filterOptions: [
    decimalOption("atLeast", "At least", (c) => c >= 0),
    decimalOption("atMost", "At most", (c) => c <= 0),
    decimalOption("exactly", "Equals", (c) => c === 0),
    { displayKey: "notSet", displayName: "Not set", numberOfInputs: 0, predicate: (_v: unknown[], cell: unknown) => cell === GROUP_VALUE || cell === null || cell === undefined },
  ],
  maxNumConditions: 1,
  trimInput: true,
};

const itemTextMatcher = ({ data, filterOption, value, filterText }: TextMatcherParams) => {
  if ((data as GridRow | undefined)?.kind === "group") return true;
  const v = value ?? "";
  const t = filterText ?? "";
  switch (filterOption) {
    case "notContains": return !v.includes(t);
    case "equals": return v === t;
    case "startsWith": return v.startsWith(t);
    default: return v.includes(t);
  }
};

const CSV_COLUMNS = ["category", "sku", "name", "lot", "date", "dateKind", "unit", "onHand", "reserved", "available", "parLevel", "reorderPoint", "counted"];

/** Cells a spreadsheet would run as a formula get a leading ' (as in the movements CSV). */
function csvCell(p: ProcessCellForExportParams<GridRow>): string {
  let v = p.value;
  // a count typed in another unit ("2.5 lb") goes out in the stock unit, as it will be stored
  const d = p.node?.data;
  if (p.column.getColId() === "counted" && d && d.kind !== "group" && typeof v === "string") {
    const entry = countedEntry(v, d);
    v = entry ? entryAsStored(entry) : v;
  }
  if (v === null || v === undefined) return "";
  return neutraliseFormula(String(v));
}

// ---------------------------------------------------------------------------------------------

// Grid callbacks at module level: ag-grid re-runs its filter and sort stages when one of these
// props changes identity, and each such run clears the undo history.
const rowIdOf = (p: GetRowIdParams<GridRow>) => p.data.id;
const rowHeightOf = (p: RowHeightParams<GridRow>) => (p.data?.kind === "group" ? 46 : 56);
const rowClassOf = (p: RowClassParams<GridRow>) => (p.data?.kind === "group" ? "!bg-salt-deep" : p.data?.kind === "lot" ? "!bg-salt/60" : undefined);
const externalFilterPresent = () => true;
// the export runs at once (no "exporting" overlay, which would defer it past the lifted collapse)
const SUPPRESSED_OVERLAYS: ("exporting")[] = ["exporting"];
const keepHierarchy = (p: PostSortRowsParams<GridRow>) => {
  const sorted = restoreHierarchy(p.nodes, (n) => n.data!);
  p.nodes.splice(0, p.nodes.length, ...sorted);
};

export function StockGrid({ kitchen, userId, unitSystem, timeZone, today, canCount, canSetLevels, canPost = false }: {
  kitchen: { code: string; name: string };
  userId: string;
  unitSystem: UnitSystem;
  timeZone: string;
  /** the user's today, yyyy-mm-dd (days left count from it) */
  today: string;
  canCount: boolean;
  canSetLevels: boolean;
  /** waste, adjustments and transfers out from a row's Record sheet (stock.post here) */
  canPost?: boolean;
}) {
  const queryClient = useQueryClient();
  const query = useQuery({ ...stockQueryOptions(kitchen.code), staleTime: 0 });
  const apiRef = useRef<GridApi<GridRow> | null>(null);
  const gridBox = useRef<HTMLDivElement>(null);
  const collapsed = useRef(new Set<ItemCategory>());
  const expanded = useRef(new Set<string>());
  const exportingAll = useRef(false);
  const columnsRestored = useRef(false);

  const [search, setSearch] = useState("");
  const [notice, setNotice] = useState<Notice>(null);
  const [pending, setPending] = useState<Map<string, PendingLine>>(() => new Map());
  const pendingRef = useRef(pending);
  pendingRef.current = pending;
  const [posting, setPosting] = useState(false);
  const [history, setHistory] = useState<HistoryTarget | null>(null);
  const [record, setRecord] = useState<ActionTarget | null>(null);
  const [canUndo, setCanUndo] = useState(false);
  // bumped to rebuild the rows from the fetched data (after a discard or a posted count)
  const [rowsVersion, setRowsVersion] = useState(0);
  // one Idempotency-Key per count sheet: a retry of the same sheet (after a lost answer) replays the
  // first posting instead of counting twice; any change to the sheet gets a new key
  const countKey = useRef<string | null>(null);

  // v2: the narrow layout with one actions column (v1 layouts kept the wide "history" column)
  const storageKey = `hank-and-lot:stock-grid:columns:v2:${userId}`;
  const data = query.data;
  const rows = useMemo(
    () => (data ? buildRows(data.rows, { get: (id) => pendingRef.current.get(id)?.text }) : []),
    // rowsVersion: rebuild on demand (pending counts are read through the ref)
    [data, rowsVersion],
  );
  const hasCure = useMemo(() => !!data?.rows.some((r) => r.cure), [data]);

  const refreshUndo = useCallback(() => setCanUndo((apiRef.current?.getCurrentUndoSize() ?? 0) > 0), []);

  // rows of a collapsed category or item are hidden (all shown while exporting)
  const doesExternalFilterPass = useCallback((node: IRowNode<GridRow>) => {
    const d = node.data;
    if (!d || d.kind === "group" || exportingAll.current) return true;
    if (collapsed.current.has(d.group)) return false;
    return d.kind === "item" || expanded.current.has(d.parentId);
  }, []);

  // ---- the row menu: one for the grid; the buttons learn which row has it through a tiny store
  const [menu, setMenuState] = useState<RowMenuState | null>(null);
  const menuRef = useRef<RowMenuState | null>(null);
  const menuListeners = useRef(new Set<() => void>());
  const setMenu = useCallback((next: RowMenuState | null) => {
    menuRef.current = next;
    setMenuState(next);
    for (const l of menuListeners.current) l();
  }, []);
  const menuOpenStore = useMemo(
    () => ({
      subscribe: (listener: () => void) => {
        menuListeners.current.add(listener);
        return () => void menuListeners.current.delete(listener);
      },
      get: () => menuRef.current?.rowId ?? null,
    }),
    [],
  );

  /** Focus back on the row's actions cell (where the menu came from), so the keyboard carries on. */
  const focusActionsCell = useCallback((rowId: string) => {
    const api = apiRef.current;
    const node = api?.getRowNode(rowId);
    if (api && node && node.rowIndex !== null) api.setFocusedCell(node.rowIndex, "actions");
  }, []);

  const menuItems = useCallback(
    (row: ItemRow | LotRow): RowMenuItem[] => {
      const target = { item: row.item, lot: row.kind === "lot" ? row.lot : undefined };
      // the sheets give focus back to what had it when they opened: the row's cell
      const open = (then: () => void) => () => {
        focusActionsCell(row.id);
        then();
      };
      const record = (kind: ActionKind) => open(() => setRecord({ ...target, kind }));
      const items: RowMenuItem[] = [{ key: "history", label: "History", icon: History, onSelect: open(() => setHistory(target)) }];
      if (canPost) {
        items.push(
          { key: "waste", label: "Record waste", icon: Trash2, onSelect: record("waste") },
          { key: "adjustment", label: "Record adjustment", icon: SlidersHorizontal, onSelect: record("adjustment") },
          { key: "transfer", label: "Transfer out", icon: ArrowRightLeft, onSelect: record("transfer") },
        );
      }
      return items;
    },
    [canPost, focusActionsCell],
  );

  const closeMenu = useCallback(
    (reason: "escape" | "tab" | "outside" | "chosen") => {
      const open = menuRef.current;
      setMenu(null);
      if (open && (reason === "escape" || reason === "tab")) focusActionsCell(open.rowId);
    },
    [setMenu, focusActionsCell],
  );

  const refreshItemCells = useCallback((rowIds: string[]) => {
    const api = apiRef.current;
    if (!api) return;
    const rowNodes = rowIds.map((id) => api.getRowNode(id)).filter((n): n is IRowNode<GridRow> => !!n);
    api.refreshCells({ rowNodes, columns: ["item"], force: true });
  }, []);

  const context = useMemo<GridContext>(
    () => ({
      unitSystem,
      today,
      canCount,
      canSetLevels,
      isGroupCollapsed: (g) => collapsed.current.has(g),
      isItemExpanded: (id) => expanded.current.has(id),
      toggleGroup: (g) => {
        if (!collapsed.current.delete(g)) collapsed.current.add(g);
        apiRef.current?.onFilterChanged();
        refreshItemCells([`group:${g}`]);
      },
      toggleItem: (id) => {
        if (!expanded.current.delete(id)) expanded.current.add(id);
        apiRef.current?.onFilterChanged();
        refreshItemCells([id]);
      },
      canPost,
      toggleMenu: (row, button, focus = "first") => {
        if (menuRef.current?.rowId === row.id) {
          setMenu(null);
          return;
        }
        const r = button.getBoundingClientRect();
        setMenu({
          rowId: row.id,
          label: `Actions for ${rowTarget(row)}`,
          anchor: { top: r.top, bottom: r.bottom, left: r.left, right: r.right },
          focus,
          items: menuItems(row),
        });
      },
      menuOpenFor: menuOpenStore,
      refuse: (message) => setNotice({ tone: "error", text: message }),
    }),
    [unitSystem, today, canCount, canSetLevels, canPost, refreshItemCells, menuItems, menuOpenStore],
  );

  const quantitySetter = useCallback((field: "counted" | "parLevel" | "reorderPoint", what: string) => (p: ValueSetterParams<GridRow>) => {
    const d = p.data;
    if (!d || d.kind === "group") return false;
    const parsed = parseQuantityEntry(p.newValue, d.item);
    if (!parsed.ok) {
      (p.context as GridContext).refuse(`${what} for ${rowTarget(d)} not changed: ${parsed.message}`);
      return false;
    }
    if (field === "counted") {
      // kept as typed ("2.5 lb"): the count is posted in that unit and the server converts it
      const value = parsed.entry ? entryText(parsed.entry) : null;
      if (!isCountable(d) || d.counted === value) return false;
      d.counted = value;
      return true;
    }
    // levels are saved together in one unit: converted here (lib/units), rounded as stored
    const value = parsed.entry ? entryAsStored(parsed.entry) : null;
    if (d.kind !== "item" || d[field] === value) return false;
    d[field] = value;
    return true;
  }, []);

  const columnDefs = useMemo<ColDef<GridRow>[]>(() => {
    // widths for 1024 x 768 with the rail: about 865 px for the grid, the item column takes the rest
    const numeric = {
      type: "rightAligned",
      width: 100,
      minWidth: 80,
      comparator: decimalComparator,
      filter: "agTextColumnFilter",
      filterParams: decimalFilterParams,
      getQuickFilterText: () => "",
    } satisfies ColDef<GridRow>;
    const hidden = (colId: string, headerName: string, get: (d: ItemRow | LotRow) => string | null): ColDef<GridRow> => ({
      colId, headerName, hide: true, sortable: false, filter: false, getQuickFilterText: () => "",
      valueGetter: (p) => (p.data && p.data.kind !== "group" ? get(p.data) : null),
    });
    const defs: ColDef<GridRow>[] = [
      {
        colId: "item",
        headerName: "Item",
        pinned: "left",
        lockPinned: true,
        flex: 1,
        minWidth: 190,
        valueGetter: (p) => (!p.data ? null : p.data.kind === "group" ? p.data.label : p.data.kind === "item" ? p.data.label : `${p.data.item.sku} lot ${p.data.lot.code}`),
        comparator: (a: string | null, b: string | null) => (a ?? "").localeCompare(b ?? "", undefined, { numeric: true }),
        cellRenderer: ItemCell,
        suppressKeyboardEvent: pressTogglesItem,
        getQuickFilterText: (p) => p.data?.search ?? "",
        filter: "agTextColumnFilter",
        filterValueGetter: (p) => {
          const d = p.data;
          if (!d) return null;
          if (d.kind === "group") return d.label;
          const i = d.item;
          return `${i.sku} ${i.name} ${i.casing ? casingLabel(i.casing) : ""}`;
        },
        filterParams: { filterOptions: ["contains", "notContains", "startsWith", "equals"], textMatcher: itemTextMatcher, maxNumConditions: 1, trimInput: true } satisfies ITextFilterParams,
      },
      { ...numeric, colId: "onHand", headerName: "On hand", width: 100, valueGetter: quantityOf("onHand"), cellRenderer: QuantityCell, filterValueGetter: itemLevelFilterValue((d) => d.item.onHand) },
      { ...numeric, colId: "reserved", headerName: "Reserved", width: 92, valueGetter: quantityOf("reserved"), cellRenderer: QuantityCell, filterValueGetter: itemLevelFilterValue((d) => d.item.reserved) },
      { ...numeric, colId: "available", headerName: "Available", width: 100, valueGetter: quantityOf("available"), cellRenderer: QuantityCell, filterValueGetter: itemLevelFilterValue((d) => d.item.available) },
    ];
    if (canCount) {
      defs.push({
        ...numeric,
        colId: "counted",
        headerName: "Counted",
        headerTooltip: "Type the quantity counted: a number in the item's stock unit, or with a unit (2.5 lb, 12 ft). Enter saves it to the count sheet and moves down.",
        width: 104,
        editable: (p) => isCountable(p.data),
        valueGetter: (p) => (isCountable(p.data) ? (p.data as ItemRow | LotRow).counted : null),
        // the cell holds the entry as typed ("2.5 lb"): sorted in the stock unit
        comparator: (_a: string | null, _b: string | null, a: IRowNode<GridRow>, b: IRowNode<GridRow>) => decimalComparator(countedInStock(a.data), countedInStock(b.data)),
        valueSetter: quantitySetter("counted", "Counted"),
        cellEditor: QuantityEditor,
        cellRenderer: CountedCell,
        cellClass: (p) => (isCountable(p.data) ? "cursor-text" : undefined),
        // a tracked item is counted by lot: it stands above its lots like a header
        filterValueGetter: itemLevelFilterValue((d) => (d.kind === "item" && d.item.trackLots ? GROUP_VALUE : countedInStock(d))),
      });
    }
    const levelCol = (colId: "parLevel" | "reorderPoint", headerName: string, width: number): ColDef<GridRow> => ({
      ...numeric,
      colId,
      headerName,
      headerTooltip: canSetLevels ? "A number in the item's stock unit (g, ml, m or put-ups), or with a unit (2 kg, 12 ft). Saved as soon as you press Enter." : undefined,
      width,
      editable: (p) => canSetLevels && p.data?.kind === "item",
      valueGetter: (p) => (p.data?.kind === "item" ? p.data[colId] : null),
      valueSetter: quantitySetter(colId, headerName),
      cellEditor: QuantityEditor,
      cellRenderer: LevelCell,
      cellClass: (p) => (canSetLevels && p.data?.kind === "item" ? "cursor-text" : undefined),
      filterValueGetter: itemLevelFilterValue((d) => (d.kind === "item" ? d[colId] : d.item[colId])),
    });
    defs.push(levelCol("parLevel", "Par level", 92), levelCol("reorderPoint", "Reorder point", 120));
    defs.push({
      colId: "actions",
      headerName: "Actions",
      headerComponent: ActionsHeader,
      headerTooltip: canPost ? "Row actions: history, waste, adjustment, transfer out (Shift+F10 on a row)" : "Row actions: history (Shift+F10 on a row)",
      pinned: "right",
      lockPinned: true,
      // 44 px button + 4 px padding, and 16 px a tablet's overlay scrollbar may cover
      width: 68,
      resizable: false,
      sortable: false,
      filter: false,
      suppressMovable: true,
      cellClass: "!pl-1 !pr-0",
      headerClass: "!pl-1 !pr-0",
      cellRenderer: ActionsCell,
      suppressKeyboardEvent: pressOpensMenu,
      getQuickFilterText: () => "",
    });
    // for the CSV file only: plain values in the stock unit, one column each
    defs.push(
      hidden("category", "Category", (d) => d.item.category),
      hidden("sku", "SKU", (d) => d.item.sku),
      hidden("name", "Name", (d) => d.item.name),
      hidden("lot", "Lot", (d) => (d.kind === "lot" ? d.lot.code : null)),
      hidden("date", "Date", (d) => (d.kind === "lot" ? d.lot.date : null)),
      hidden("dateKind", "Date kind", (d) => (d.kind === "lot" ? d.lot.dateKind : null)),
      hidden("unit", "Stock unit", (d) => d.item.unit),
    );
    return defs;
  }, [canCount, canSetLevels, canPost, quantitySetter]);

  // headers wrap ("Reorder / point") rather than widen their columns
  const defaultColDef = useMemo<ColDef<GridRow>>(() => ({ sortable: true, resizable: true, suppressMovable: false, wrapHeaderText: true, autoHeaderHeight: true }), []);

  // ---- column state, remembered per user in this browser
  const saveColumns = useCallback(
    (e: { source: string; finished?: boolean }) => {
      const api = apiRef.current;
      if (!api || !columnsRestored.current) return;
      if (e.source === "api" || e.source === "gridInitializing" || e.source === "flex" || e.finished === false) return;
      try {
        localStorage.setItem(storageKey, JSON.stringify(api.getColumnState()));
      } catch {
        // storage full or blocked: the layout is simply not remembered
      }
    },
    [storageKey],
  );

  const onGridReady = useCallback(
    (e: GridReadyEvent<GridRow>) => {
      apiRef.current = e.api;
      try {
        const saved = localStorage.getItem(storageKey);
        if (saved) e.api.applyColumnState({ state: JSON.parse(saved) as ColumnState[], applyOrder: true });
      } catch {
        // unreadable or blocked storage: start from the default layout
      }
      columnsRestored.current = true;
    },
    [storageKey],
  );

  const resetColumns = () => {
    try {
      localStorage.removeItem(storageKey);
    } catch {
      // nothing stored
    }
    apiRef.current?.resetColumnState();
    setNotice({ tone: "success", text: "Columns are back to their original order, width and sort." });
  };

  // ---- editing
  const saveLevel = useCallback(
    async (node: IRowNode<GridRow>, field: "parLevel" | "reorderPoint", oldValue: string | null) => {
      const d = node.data;
      if (!d || d.kind !== "item") return;
      const sent = d[field];
      const word = field === "parLevel" ? "Par level" : "Reorder point";
      try {
        const saved = await putStockLevel({ kitchen: kitchen.code, item: d.item.itemId, parLevel: d.parLevel, reorderPoint: d.reorderPoint });
        // keep the fetched data in step without a refetch (a new row set would clear the undo history)
        d.item.parLevel = saved.parLevel;
        d.item.reorderPoint = saved.reorderPoint;
        setNotice({ tone: "success", text: `${word} of ${d.item.sku} saved: ${sent === null ? "not set" : stockUnitText(sent, d.item)}.` });
      } catch (e) {
        if (d[field] === sent) node.setDataValue(field, oldValue, "rollback");
        const reason = e instanceof ApiError ? (e.fields[field]?.[0] ?? e.fields.parLevel?.[0] ?? e.fields.reorderPoint?.[0] ?? e.message) : "Something went wrong.";
        setNotice({
          tone: "error",
          text: `${word} of ${d.item.sku} not saved: ${reason} It is back to ${oldValue === null ? "not set" : stockUnitText(oldValue, d.item)}.`,
        });
      }
      refreshUndo();
    },
    [kitchen.code, refreshUndo],
  );

  const onCellValueChanged = useCallback(
    (e: CellValueChangedEvent<GridRow>) => {
      const d = e.data;
      const colId = e.column.getColId();
      if (!d || d.kind === "group") return;
      if (colId === "counted") {
        countKey.current = null;
        setPending((prev) => {
          const next = new Map(prev);
          const counted = (d as ItemRow | LotRow).counted;
          const entry = countedEntry(counted, d as ItemRow | LotRow);
          if (counted === null) next.delete(d.id);
          else {
            next.set(d.id, {
              rowId: d.id,
              itemId: d.item.itemId,
              lotId: d.kind === "lot" ? d.lot.lotId : undefined,
              sku: d.item.sku,
              lotCode: d.kind === "lot" ? d.lot.code : undefined,
              counted: entry?.quantity ?? counted,
              unit: entry?.unit ?? d.item.unit,
              text: counted,
            });
          }
          return next;
        });
        setNotice(null);
      } else if ((colId === "parLevel" || colId === "reorderPoint") && e.source !== "rollback") {
        // the status marker reads both levels
        e.api.refreshCells({ rowNodes: [e.node], columns: ["reorderPoint"], force: true });
        void saveLevel(e.node, colId, (e.oldValue as string | null) ?? null);
      }
      refreshUndo();
    },
    [saveLevel, refreshUndo],
  );

  const onCellKeyDown = useCallback(
    (e: CellKeyDownEvent<GridRow> | FullWidthCellKeyDownEvent<GridRow>) => {
      const ke = e.event as KeyboardEvent | undefined;
      const d = e.data;
      if (!ke || !d || !("column" in e)) return;
      const colId = e.column.getColId();
      const menuKey = (ke.key === "F10" && ke.shiftKey) || ke.key === "ContextMenu";
      if (menuKey && d.kind !== "group" && !e.api.getEditingCells().length) {
        // the row's menu from any of its cells, as a context menu would open
        const button = gridBox.current?.querySelector<HTMLElement>(`.ag-row[row-id="${CSS.escape(d.id)}"] [col-id="actions"] button`);
        if (!button) return;
        ke.preventDefault();
        context.toggleMenu(d, button);
        return;
      }
      if (ke.key !== "Enter" && ke.key !== " ") return;
      if (colId === "item") {
        if (d.kind === "group") context.toggleGroup(d.group);
        else if (hasLots(d)) context.toggleItem(d.id);
        else return;
        ke.preventDefault();
      } else if (colId === "actions" && d.kind !== "group") {
        const button = (ke.target as HTMLElement | null)?.querySelector?.<HTMLElement>("button[data-row-menu-trigger]");
        if (!button) return;
        ke.preventDefault();
        context.toggleMenu(d, button);
      }
    },
    [context],
  );

  // ---- count sheet
  const discard = () => {
    countKey.current = null;
    setPending(new Map());
    pendingRef.current = new Map();
    setRowsVersion((v) => v + 1);
    setNotice({ tone: "success", text: "Counted values discarded; nothing was posted." });
  };

  const post = async () => {
    const lines = [...pending.values()];
    if (!lines.length || posting) return;
    setPosting(true);
    setNotice(null);
    try {
      const result = await postCount(
        { kitchen: kitchen.code, lines: lines.map((l) => ({ item: l.itemId, ...(l.lotId ? { lot: l.lotId } : {}), counted: l.counted, unit: l.unit })) },
        (countKey.current ??= newIdempotencyKey()),
      );
      countKey.current = null;
      // a line differs when its movements moved stock (an untracked item's count may touch several lots)
      const differences = lines.filter((l) =>
        result.movements
          .filter((m) => m.item.id === l.itemId && (!l.lotId || m.lot.id === l.lotId))
          .reduce((sum, m) => sum.plus(dec(m.delta)), dec("0"))
          .isZero() === false,
      ).length;
      pendingRef.current = new Map();
      setPending(new Map());
      setRowsVersion((v) => v + 1);
      await queryClient.invalidateQueries({ queryKey: stockQueryOptions(kitchen.code).queryKey });
      setNotice({ tone: "success", text: `Count posted: ${plural(lines.length, "line", "lines")}, ${plural(differences, "difference", "differences")}.` });
    } catch (e) {
      setNotice({ tone: "error", text: countError(e, lines) });
      const line = e instanceof ApiError ? lineOf(e, lines) : null;
      const api = apiRef.current;
      const node = line ? api?.getRowNode(line.rowId) : undefined;
      if (api && node && node.rowIndex !== null) {
        api.ensureNodeVisible(node);
        api.setFocusedCell(node.rowIndex, "counted");
      }
    } finally {
      setPosting(false);
    }
  };

  // ---- toolbar
  const exportCsv = async () => {
    const api = apiRef.current;
    if (!api) return;
    // every row that passes the search and filters, including the rows of collapsed categories and
    // items: lift the collapse, wait for ag-grid to re-filter (it does so asynchronously), export
    const refiltered = () =>
      new Promise<void>((resolve) => {
        const done = () => {
          clearTimeout(timer);
          api.removeEventListener("modelUpdated", done);
          resolve();
        };
        const timer = setTimeout(done, 2000);
        api.addEventListener("modelUpdated", done);
        api.onFilterChanged();
      });
    exportingAll.current = true;
    try {
      await refiltered();
      api.exportDataAsCsv({
        fileName: `stock-${kitchen.code}-${today}.csv`,
        columnKeys: CSV_COLUMNS.filter((c) => c !== "counted" || canCount),
        shouldRowBeSkipped: (p) => p.node.data?.kind === "group",
        processCellCallback: csvCell,
      });
    } finally {
      exportingAll.current = false;
      api.onFilterChanged();
    }
  };

  useEffect(() => {
    if (!pending.size) return;
    // leaving with an unposted count sheet asks first
    const warn = (e: BeforeUnloadEvent) => e.preventDefault();
    window.addEventListener("beforeunload", warn);
    return () => window.removeEventListener("beforeunload", warn);
  }, [pending.size]);

  if (query.isPending) {
    return (
      <p role="status" className="panel flex items-center gap-2 px-6 py-8 text-brine">
        <Loader2 aria-hidden className="h-5 w-5 animate-spin" /> Loading the stock of {kitchen.name}…
      </p>
    );
  }
  if (query.isError) {
    return (
      <div className="space-y-3">
        <FormMessage tone="error">The stock could not be loaded: {query.error.message}</FormMessage>
        <button type="button" className="btn-quiet" onClick={() => void query.refetch()}>
          Try again
        </button>
      </div>
    );
  }
  if (!query.data.rows.length) {
    return (
      <EmptyState title="No items in this kitchen's stock yet">
        <p>
          Stock lists the catalogue&apos;s items. A buyer or manager adds them under{" "}
          <Link href="/stock/items" className="font-semibold text-paprika underline">Stock › Items</Link>; then the first delivery is received
          and counts start here.
        </p>
      </EmptyState>
    );
  }

  return (
    <div className="flex flex-col gap-3">
      {hasCure ? <CureCaution /> : null}

      <div className="flex flex-wrap items-center gap-2">
        <div className="relative min-w-[220px] flex-1">
          <label htmlFor="stock-search" className="sr-only">Search stock</label>
          <Search aria-hidden className="pointer-events-none absolute left-3 top-1/2 h-5 w-5 -translate-y-1/2 text-brine" />
          <input
            id="stock-search"
            type="search"
            className="field-input pl-10"
            placeholder="Search SKU, name, calibre or lot"
            value={search}
            onChange={(e) => setSearch(e.target.value)}
          />
        </div>
        {canCount || canSetLevels ? (
          <button
            type="button"
            className="btn-quiet"
            disabled={!canUndo}
            onClick={() => {
              apiRef.current?.undoCellEditing();
              refreshUndo();
            }}
            aria-keyshortcuts="Control+Z"
          >
            <Undo2 aria-hidden className="h-5 w-5" /> Undo
          </button>
        ) : null}
        <button type="button" className="btn-quiet" onClick={() => void exportCsv()}>
          <Download aria-hidden className="h-5 w-5" /> Export CSV
        </button>
        <Link href="/stock/count-sheet" className="btn-quiet">
          <ClipboardList aria-hidden className="h-5 w-5" /> Count sheet
        </Link>
        <button type="button" className="btn-quiet" onClick={resetColumns}>
          <RotateCcw aria-hidden className="h-5 w-5" /> Reset columns
        </button>
      </div>
      {canCount ? (
        // the pending count sheet: always in place above the grid, so nothing shifts while typing
        <section aria-label="Count sheet" className={`flex min-h-[60px] flex-wrap items-center justify-between gap-x-4 gap-y-2 rounded-lg border px-4 py-2 ${pending.size ? "border-paprika/50 bg-paprika-soft/40" : "border-salt-edge bg-white"}`}>
          {pending.size ? (
            <p className="min-w-0 flex-1 basis-[360px]">
              <span className="font-semibold">{plural(pending.size, "line", "lines")} counted</span>
              <span className="text-brine"> · posted together as one count · Ctrl+Z undoes</span>
            </p>
          ) : (
            <p className="min-w-0 flex-1 basis-[360px] text-sm text-brine">
              To count, tap a Counted cell or type on it (480, or with a unit: 2.5 lb): Enter keeps it and moves down, Esc cancels, Ctrl+Z undoes.
            </p>
          )}
          <div className="flex shrink-0 gap-2">
            <button type="button" className="btn-quiet" onClick={discard} disabled={posting || !pending.size}>
              Discard
            </button>
            <button type="button" className="btn-primary" onClick={() => void post()} disabled={posting || !pending.size}>
              {posting ? <Loader2 aria-hidden className="h-5 w-5 animate-spin" /> : null}
              Post count
            </button>
          </div>
        </section>
      ) : canSetLevels ? (
        <p className="text-sm text-brine">Tap a par level or reorder point to change it (in the item&apos;s stock unit, or with a unit: 2 kg, 12 ft); it is saved at once, and Ctrl+Z undoes.</p>
      ) : null}

      <div role="status" className={notice?.tone === "success" ? "" : "sr-only"}>
        {notice?.tone === "success" ? <FormMessage tone="success">{notice.text}</FormMessage> : null}
      </div>
      {notice?.tone === "error" ? <FormMessage tone="error">{notice.text}</FormMessage> : null}

      <div ref={gridBox} style={{ height: "max(360px, calc(100vh - 380px))" }}>
        <AgGridReact<GridRow>
          theme={gridTheme}
          rowData={rows}
          columnDefs={columnDefs}
          defaultColDef={defaultColDef}
          context={context}
          getRowId={rowIdOf}
          getRowHeight={rowHeightOf}
          getRowClass={rowClassOf}
          isExternalFilterPresent={externalFilterPresent}
          doesExternalFilterPass={doesExternalFilterPass}
          postSortRows={keepHierarchy}
          quickFilterText={search}
          cacheQuickFilter
          undoRedoCellEditing
          undoRedoCellEditingLimit={50}
          singleClickEdit
          stopEditingWhenCellsLoseFocus
          enterNavigatesVertically
          enterNavigatesVerticallyAfterEdit
          ensureDomOrder
          animateRows={false}
          suppressDragLeaveHidesColumns
          onGridReady={onGridReady}
          onCellValueChanged={onCellValueChanged}
          onCellKeyDown={onCellKeyDown}
          onUndoEnded={refreshUndo}
          onRedoEnded={refreshUndo}
          onModelUpdated={refreshUndo}
          onCellEditingStopped={refreshUndo}
          onColumnMoved={saveColumns}
          onColumnResized={saveColumns}
          onColumnVisible={saveColumns}
          onColumnPinned={saveColumns}
          onSortChanged={saveColumns}
          suppressOverlays={SUPPRESSED_OVERLAYS}
          overlayNoRowsTemplate="<span>Nothing matches the search or filters.</span>"
        />
      </div>

      <RowActionsMenu menu={menu} onClose={closeMenu} />
      <HistorySheet
        kitchen={kitchen.code}
        target={history}
        onClose={() => setHistory(null)}
        unitSystem={unitSystem}
        timeZone={timeZone}
        currentUserId={userId}
      />
      {canPost ? (
        <StockActionSheet
          kitchen={kitchen.code}
          target={record}
          onClose={() => setRecord(null)}
          onDone={(text) => {
            setRecord(null);
            setNotice({ tone: "success", text });
          }}
          unitSystem={unitSystem}
          today={today}
        />
      ) : null}
    </div>
  );
}

const FIELD_WORDS: Record<string, string> = { counted: "counted", unit: "unit", lot: "lot", item: "item" };

/** The pending line a 422 names ("lines.3.counted" -> the fourth line sent). */
function lineOf(e: ApiError, lines: PendingLine[]): PendingLine | null {
  for (const path of Object.keys(e.fields)) {
    const m = /^lines\.(\d+)\./.exec(path);
    if (m) return lines[Number(m[1])] ?? null;
  }
  return null;
}

function countError(e: unknown, lines: PendingLine[]): string {
  if (!(e instanceof ApiError)) return "The count was not posted: something went wrong. Nothing was changed; try again.";
  for (const [path, messages] of Object.entries(e.fields)) {
    const m = /^lines\.(\d+)\.(\w+)/.exec(path);
    if (!m) continue;
    const index = Number(m[1]);
    const line = lines[index];
    const what = line ? `${line.sku}${line.lotCode ? `, lot ${line.lotCode}` : ""}` : `line ${index + 1}`;
    return `The count was not posted. Line ${index + 1} (${what}), ${FIELD_WORDS[m[2]!] ?? m[2]}: ${messages[0] ?? e.message} Nothing was changed; fix the line and post again.`;
  }
  return `The count was not posted: ${e.message} Nothing was changed.`;
}
