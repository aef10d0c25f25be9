"use client";

// "Record production": what was actually made. The meat block as weighed (kg or lb), per line what
// was weighed (prefilled with the plan; cure in grams) and, for items tracked by lot, which lots it
// came from (default: the reserved ones, then first expired first out; or chosen here, lot by lot).
// A field left as prefilled is sent as the exact planned amount, so the rounding of a prefilled
// figure never becomes a variance (nor moves the cure check). The server posts everything in one
// transaction and runs the cure check again on the actual weights; its answers land beside the
// fields they name (lines.N.quantity, lines.N.lots.M.lot) and conflicts (an expired lot, too little
// stock) above the buttons, in its words, which name the lot.
import { useQuery } from "@tanstack/react-query";
import { ClipboardCheck, Loader2, Plus, Trash2 } from "lucide-react";
import { useId, useMemo, useRef, useState, type FormEvent } from "react";
import { CureCaution } from "@/components/cure/cure-caution";
import { CureMarker } from "@/components/cure/cure-marker";
import { describedBy, FieldError, FieldHint, FormMessage } from "@/components/ui/field";
import { SideSheetFooter } from "@/components/ui/side-sheet";
import {
  ApiError, newIdempotencyKey, produceBatch, type Batch, type BatchLine, type BatchProduceBody,
} from "@/lib/queries/planning";
import { stockQueryOptions } from "@/lib/queries/stock";
import {
  dec, Dec, DIMENSION_OF_BASE, formatQuantity, fromStockUnits, isDecimalString, plain, toStockUnits, toStoredQuantity, unitsFor, ZERO,
  type ItemUnits, type UnitSystem,
} from "@/lib/units";
import { dayPlain } from "./dates";
import { gramsText, quantityText, signedGramsText, signedQuantityText, type UnitsById } from "./quantities";

type Errors = Record<string, string[]>;

interface LotRow {
  key: number;
  lot: string;
  quantity: string;
}

interface LineState {
  quantity: string;
  unit: string;
  chooseLots: boolean;
  lots: LotRow[];
}

interface LotOption {
  lotId: string;
  code: string;
  date: string | null;
  dateKind: string | null;
  /** what this batch may take: the kitchen's available plus what the batch itself holds there */
  available: Dec;
  expired: boolean;
}

const DATE_KIND: Record<string, string> = { use_by: "use by", best_before: "best before" };
// units nobody weighs a batch line in
const SKIP_UNITS = new Set(["mg", "mm", "cm", "in", "tsp", "tbsp"]);

const itemUnitsOf = (line: BatchLine, units: UnitsById): ItemUnits => units[line.item.id] ?? { stockUnit: line.item.unit };
const isCure = (line: BatchLine) => line.item.category === "cure" && line.item.unit === "g";
/** The unit choice that is one stock unit: the put-up for put-up items, else the stock unit. */
const stockUnitChoice = (u: ItemUnits) => (u.putUp ? u.putUp.name : u.stockUnit);

/** The units offered for a line: cure in grams only; else the stock dimension (and lengths of a put-up). */
function unitChoices(line: BatchLine, u: ItemUnits): { unit: string; label: string }[] {
  if (isCure(line)) return [{ unit: "g", label: "g" }];
  try {
    const dim = DIMENSION_OF_BASE[u.stockUnit];
    const out = unitsFor(u).filter((c) => c.kind !== "pack" && !SKIP_UNITS.has(c.unit) && (c.kind === "put-up" || c.dimension === dim || (u.putUp && c.dimension === "length")));
    return out.length ? out.map((c) => ({ unit: c.unit, label: c.label })) : [{ unit: u.stockUnit, label: u.stockUnit }];
  } catch {
    return [{ unit: u.stockUnit, label: u.stockUnit }];
  }
}

/** The planned quantity as the field starts: cure exactly as planned in grams, else in the user's readable unit. */
function prefillOf(line: BatchLine, u: ItemUnits, system: UnitSystem): { quantity: string; unit: string } {
  if (isCure(line)) return { quantity: plain(dec(line.quantity)), unit: "g" };
  const f = formatQuantity(line.quantity, u, system);
  return { quantity: f.value, unit: f.unit };
}

/** A typed amount in the item's stock unit, rounded to the stored scale (so lot parts add up exactly as sent). */
function stockAmount(quantity: string, unit: string, u: ItemUnits): Dec | null {
  const q = quantity.trim();
  if (!isDecimalString(q)) return null;
  try {
    return dec(toStoredQuantity(toStockUnits(q, unit, u)));
  } catch {
    return null;
  }
}

/** A stock amount in `unit` for a field, when it has a short exact form there (else null). */
function shortIn(value: string, unit: string, u: ItemUnits): string | null {
  try {
    const v = fromStockUnits(value, unit, u);
    return v.decimalPlaces() <= 3 ? plain(v) : null;
  } catch {
    return null;
  }
}

let rowKeys = 0;
const sentenceCase = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

export function ProductionForm({ batch, units, untracked, unitSystem, today, onProduced, onConflict, onClose }: {
  batch: Batch;
  units: UnitsById;
  untracked: readonly string[];
  unitSystem: UnitSystem;
  /** the user's today, yyyy-mm-dd: lots dated before it are expired and cannot be used */
  today: string;
  onProduced: (batch: Batch) => void;
  /** the batch changed under us (already produced, cancelled): read it again */
  onConflict: () => void;
  onClose: () => void;
}) {
  const id = useId().replace(/:/g, "");
  const meatUnit = unitSystem === "us" ? "lb" : "kg";
  const meatPrefill = useMemo(() => formatQuantity(batch.meatBlockG, { stockUnit: "g" }, unitSystem, { unit: meatUnit }).value, [batch.meatBlockG, unitSystem, meatUnit]);
  const prefill = useMemo(
    () => Object.fromEntries(batch.lines.map((l) => [l.position, prefillOf(l, itemUnitsOf(l, units), unitSystem)])),
    [batch.lines, units, unitSystem],
  );
  const [meat, setMeat] = useState({ quantity: meatPrefill, unit: meatUnit });
  const [lines, setLines] = useState<Record<number, LineState>>(() =>
    Object.fromEntries(batch.lines.map((l) => [l.position, { ...prefill[l.position]!, chooseLots: false, lots: [] }])),
  );
  const [note, setNote] = useState("");
  const [errors, setErrors] = useState<Errors>({});
  const [message, setMessage] = useState<string>();
  const [busy, setBusy] = useState(false);
  const key = useRef<string | null>(null);

  const tracked = (l: BatchLine) => !untracked.includes(l.item.id);
  const stock = useQuery({ ...stockQueryOptions(batch.kitchen.code), enabled: batch.lines.some(tracked), staleTime: 0 });

  /** Lots of the line's item in this kitchen that this batch could draw on, first expired first. */
  const lotOptions = (line: BatchLine): LotOption[] => {
    const row = stock.data?.rows.find((r) => r.itemId === line.item.id);
    const heldHere = (lotId: string) => batch.lines.flatMap((l) => l.lots).filter((x) => x.lotId === lotId).reduce((s, x) => s.plus(dec(x.quantity)), ZERO);
    return (row?.lots ?? [])
      .filter((l) => dec(l.onHand).gt(0))
      .map((l) => ({
        lotId: l.lotId, code: l.code, date: l.date, dateKind: l.dateKind,
        available: dec(l.available).plus(heldHere(l.lotId)),
        expired: l.date !== null && l.date < today,
      }));
  };

  /** Any change is a new attempt: a new key, and the last answer's message no longer stands. */
  const changed = (...fields: string[]) => {
    key.current = null;
    setMessage(undefined);
    if (fields.length) setErrors((all) => Object.fromEntries(Object.entries(all).filter(([k]) => !fields.some((f) => k === f || k.startsWith(`${f}:`)))));
  };
  const setLine = (position: number, patch: Partial<LineState>) => {
    setLines((all) => ({ ...all, [position]: { ...all[position]!, ...patch } }));
    changed(`q:${position}`, `lots:${position}`, `lot:${position}`);
  };
  const touched = (position: number) => {
    const s = lines[position]!;
    const p = prefill[position]!;
    return s.quantity.trim() !== p.quantity || s.unit !== p.unit;
  };
  const meatTouched = meat.quantity.trim() !== meatPrefill || meat.unit !== meatUnit;

  /** What the line will post, in the stock unit (null while a figure is not a number). */
  function actualOf(line: BatchLine): Dec | null {
    const s = lines[line.position]!;
    const u = itemUnitsOf(line, units);
    if (s.chooseLots) {
      let sum = ZERO;
      for (const r of s.lots) {
        const a = stockAmount(r.quantity, s.unit, u);
        if (!a) return null;
        sum = sum.plus(a);
      }
      return sum;
    }
    if (!touched(line.position)) return dec(line.quantity);
    return stockAmount(s.quantity, s.unit, u);
  }

  function startChoosing(line: BatchLine) {
    const s = lines[line.position]!;
    const u = itemUnitsOf(line, units);
    const options = lotOptions(line).filter((o) => !o.expired && o.available.gt(0));
    let unit = s.unit;
    let rows: LotRow[];
    if (!touched(line.position) && line.lots.length && dec(line.reserved).eq(dec(line.quantity))) {
      // as reserved, lot by lot; in the stock unit when the user's unit has no short form for a part
      if (line.lots.some((l) => shortIn(l.quantity, unit, u) === null)) unit = stockUnitChoice(u);
      rows = line.lots.map((l) => ({ key: ++rowKeys, lot: l.lotId, quantity: shortIn(l.quantity, unit, u) ?? plain(dec(l.quantity)) }));
    } else {
      const first = line.lots[0]?.lotId ?? options[0]?.lotId ?? "";
      rows = [{ key: ++rowKeys, lot: first, quantity: s.quantity.trim() }];
    }
    setLine(line.position, { chooseLots: true, unit, lots: rows });
  }

  const err = (k: string) => errors[k];

  function validate(): Errors {
    const out: Errors = {};
    const m = meat.quantity.trim();
    if (!isDecimalString(m) || dec(m).lte(0)) out.meat = ["Type the meat block as weighed, more than zero, e.g. 20.4."];
    for (const line of batch.lines) {
      const s = lines[line.position]!;
      const u = itemUnitsOf(line, units);
      if (!s.chooseLots) {
        if (touched(line.position) && !isDecimalString(s.quantity.trim())) out[`q:${line.position}`] = ["Type the number with a point for decimals, e.g. 12.5 (0 if none was used)."];
        continue;
      }
      if (!s.lots.length) out[`lots:${line.position}`] = ["Add the lots it came from, or go back to the reserved lots."];
      const options = lotOptions(line);
      const seen = new Set<string>();
      s.lots.forEach((r, j) => {
        const problems: string[] = [];
        const amount = stockAmount(r.quantity, s.unit, u);
        const option = options.find((o) => o.lotId === r.lot);
        if (!r.lot) problems.push("Choose the lot.");
        else if (seen.has(r.lot)) problems.push("This lot is chosen twice: give it one line.");
        if (!amount || amount.lte(0)) problems.push("Type how much came from this lot, more than zero.");
        else if (option && amount.gt(option.available)) problems.push(`Only ${quantityText(plain(option.available), line.item, units, unitSystem)} of ${option.code} is available here.`);
        if (r.lot) seen.add(r.lot);
        if (problems.length) out[`lot:${line.position}:${j}`] = problems;
      });
    }
    return out;
  }

  function body(): BatchProduceBody {
    const sent: NonNullable<BatchProduceBody["lines"]> = [];
    for (const line of batch.lines) {
      const s = lines[line.position]!;
      const u = itemUnitsOf(line, units);
      if (s.chooseLots) {
        const parts = s.lots.map((r) => ({ lot: r.lot, quantity: plain(stockAmount(r.quantity, s.unit, u)!) }));
        const sum = parts.reduce((a, p) => a.plus(dec(p.quantity)), ZERO);
        sent.push({ position: line.position, quantity: plain(sum), unit: u.stockUnit, lots: parts });
      } else if (touched(line.position)) {
        sent.push({ position: line.position, quantity: s.quantity.trim(), unit: s.unit });
      } else {
        sent.push({ position: line.position });
      }
    }
    return {
      // untouched: exactly the planned meat block, not its rounded display
      actualMeatBlock: meatTouched ? { quantity: meat.quantity.trim(), unit: meat.unit } : { quantity: batch.meatBlockG, unit: "g" },
      lines: sent,
      ...(note.trim() ? { note: note.trim() } : {}),
    };
  }

  /** The server's per-field messages, placed on our fields (lines by their index in what was sent). */
  function place(fields: Record<string, string[]>, sent: NonNullable<BatchProduceBody["lines"]>): { placed: Errors; unplaced: string[] } {
    const placed: Errors = {};
    const unplaced: string[] = [];
    const add = (k: string, v: string[]) => (placed[k] = [...(placed[k] ?? []), ...v]);
    for (const [k, v] of Object.entries(fields)) {
      const m = /^lines\.(\d+)\.(quantity|unit|lots|position)(?:\.(\d+)\.(?:lot|quantity))?$/.exec(k);
      const position = m ? sent[Number(m[1])]?.position : undefined;
      if (m && position !== undefined && m[2] === "lots" && m[3] !== undefined) add(`lot:${position}:${m[3]}`, v);
      else if (m && position !== undefined && m[2] === "lots") add(`lots:${position}`, v);
      else if (m && position !== undefined && (m[2] === "quantity" || m[2] === "unit")) add(lines[position]?.chooseLots ? `lots:${position}` : `q:${position}`, v);
      else if (k.startsWith("actualMeatBlock")) add("meat", v);
      else if (k === "note") add("note", v);
      else unplaced.push(...v);
    }
    return { placed, unplaced };
  }

  async function submit(e: FormEvent) {
    e.preventDefault();
    if (busy) return;
    setMessage(undefined);
    const local = validate();
    setErrors(local);
    if (Object.keys(local).length) {
      setMessage("Nothing was recorded: correct the fields marked below.");
      return;
    }
    const sent = body();
    setBusy(true);
    key.current ??= newIdempotencyKey();
    try {
      const next = await produceBatch(batch.id, sent, key.current);
      key.current = null;
      onProduced(next);
    } catch (e2) {
      if (!(e2 instanceof ApiError) || e2.status === 0) {
        setMessage(`Not recorded yet: ${e2 instanceof Error ? e2.message : "something went wrong."} Try again: it cannot be recorded twice.`);
        return;
      }
      key.current = null;
      const { placed, unplaced } = place(e2.fields, sent.lines ?? []);
      setErrors(placed);
      // one transaction: nothing of it was posted. A conflict says which lot or line, in the server's words.
      const why = e2.status === 422 ? (unplaced[0] ?? "correct the fields marked below.") : e2.message;
      setMessage(`Nothing was recorded: ${why}`);
      if (e2.code === "NOT_PRODUCIBLE" || e2.status === 404) onConflict();
    } finally {
      setBusy(false);
    }
  }

  const meatShown = err("meat") ?? (meat.quantity.trim() !== "" && !isDecimalString(meat.quantity.trim()) ? ["Type the number with a point for decimals, e.g. 20.4."] : undefined);
  const meatActual = meatTouched && isDecimalString(meat.quantity.trim()) ? plain(dec(toStoredQuantity(toStockUnits(meat.quantity.trim(), meat.unit, { stockUnit: "g" })))) : null;

  return (
    <form onSubmit={(e) => void submit(e)} noValidate className="space-y-5" aria-label="Record production">
      {batch.cure ? <CureCaution /> : null}

      <div>
        <label htmlFor={`${id}-meat`} className="field-label">Actual meat block (green weight)</label>
        <div className="flex gap-2">
          <input
            id={`${id}-meat`}
            type="text"
            inputMode="decimal"
            autoComplete="off"
            className="field-input num"
            value={meat.quantity}
            data-autofocus=""
            onChange={(e) => { setMeat({ ...meat, quantity: e.target.value }); changed("meat"); }}
            {...describedBy(`${id}-meat`, meatShown, true)}
          />
          <label htmlFor={`${id}-meat-unit`} className="sr-only">Actual meat block: unit</label>
          <select id={`${id}-meat-unit`} className="field-input w-24 shrink-0" value={meat.unit} onChange={(e) => { setMeat({ ...meat, unit: e.target.value }); changed("meat"); }}>
            <option value="kg">kg</option>
            <option value="lb">lb</option>
          </select>
        </div>
        <FieldHint id={`${id}-meat`}>
          Planned {gramsText(batch.meatBlockG, unitSystem)}
          {meatActual ? <>: <span className="num font-semibold text-pepper">{signedGramsText(plain(dec(meatActual).minus(dec(batch.meatBlockG))), unitSystem)}</span></> : null}
          . Meat and fat as they went in, before salt, cure and spices.
        </FieldHint>
        <FieldError id={`${id}-meat`} errors={meatShown} />
      </div>

      <section aria-labelledby={`${id}-lines`} className="space-y-3">
        <div>
          <h3 id={`${id}-lines`} className="font-sans text-base font-semibold">What was weighed</h3>
          <p className="text-sm text-brine">Each line starts at the plan; change what differs. Cure in grams, as the scale shows it.</p>
        </div>
        {batch.lines.map((line) => (
          <LineFields
            key={line.position}
            id={`${id}-l${line.position}`}
            line={line}
            state={lines[line.position]!}
            units={units}
            unitSystem={unitSystem}
            choices={unitChoices(line, itemUnitsOf(line, units))}
            tracked={tracked(line)}
            options={lotOptions(line)}
            lotsLoading={stock.isLoading}
            lotsError={stock.error instanceof Error ? stock.error.message : undefined}
            actual={actualOf(line)}
            errors={errors}
            onChange={(patch) => setLine(line.position, patch)}
            onChooseLots={() => startChoosing(line)}
          />
        ))}
      </section>

      <div>
        <label htmlFor={`${id}-note`} className="field-label">Note (optional)</label>
        <textarea id={`${id}-note`} className="field-input min-h-[4.5rem] py-2" value={note} maxLength={1000}
          onChange={(e) => { setNote(e.target.value); changed("note"); }} {...describedBy(`${id}-note`, err("note"), true)} />
        <FieldHint id={`${id}-note`}>Kept with the batch, e.g. who weighed or anything that went differently.</FieldHint>
        <FieldError id={`${id}-note`} errors={err("note")} />
      </div>

      {message ? <FormMessage tone="error">{message}</FormMessage> : null}
      <SideSheetFooter>
        <button type="button" className="btn-quiet" onClick={onClose}>Cancel</button>
        <button type="submit" className="btn-primary" disabled={busy}>
          {busy ? <Loader2 aria-hidden className="h-5 w-5 animate-spin" /> : <ClipboardCheck aria-hidden className="h-5 w-5" />}
          Record production
        </button>
      </SideSheetFooter>
    </form>
  );
}

function LineFields({ id, line, state, units, unitSystem, choices, tracked, options, lotsLoading, lotsError, actual, errors, onChange, onChooseLots }: {
  id: string;
  line: BatchLine;
  state: LineState;
  units: UnitsById;
  unitSystem: UnitSystem;
  choices: { unit: string; label: string }[];
  tracked: boolean;
  options: LotOption[];
  lotsLoading: boolean;
  lotsError?: string;
  actual: Dec | null;
  errors: Errors;
  onChange: (patch: Partial<LineState>) => void;
  onChooseLots: () => void;
}) {
  const q = (v: string) => quantityText(v, line.item, units, unitSystem);
  const label = `Actual ${line.item.sku}`;
  const qErrors = errors[`q:${line.position}`];
  const lotsErrors = errors[`lots:${line.position}`];
  const variance = actual ? actual.minus(dec(line.quantity)) : null;
  const unitLabel = choices.find((c) => c.unit === state.unit)?.label ?? state.unit;
  const reservedWords = line.lots.length
    ? `As reserved: ${line.lots.map((l) => `${l.code} ${q(l.quantity)}`).join(", ")}${dec(line.reserved).lt(dec(line.quantity)) ? ", the rest first expired first out" : ""}`
    : "First expired first out (nothing is reserved)";
  const chosen = (lotId: string) => options.find((o) => o.lotId === lotId);
  const lotWords = (o: LotOption) =>
    `${o.date ? `${o.expired ? "Expired" : sentenceCase(DATE_KIND[o.dateKind ?? ""] ?? "dated")} ${dayPlain(o.date)} · ` : ""}${q(plain(o.available))} free for this batch`;
  const setRow = (j: number, patch: Partial<LotRow>) => onChange({ lots: state.lots.map((r, i) => (i === j ? { ...r, ...patch } : r)) });

  return (
    <fieldset className={`panel space-y-3 px-4 py-3 ${line.item.category === "cure" ? "border-cure-edge" : ""}`}>
      <legend className="sr-only">{line.item.sku} · {line.item.name}{line.item.category === "cure" ? " (cure)" : ""}</legend>
      <div aria-hidden className="flex flex-wrap items-center gap-2">
        <span className="font-semibold">{line.item.sku}</span>
        {line.item.category === "cure" ? <CureMarker /> : null}
        <span className="text-sm text-brine">{line.item.name}</span>
      </div>

      {state.chooseLots ? (
        <p className="text-sm" id={`${id}-total`}>
          <span className="text-brine">Planned <span className="num">{q(line.quantity)}</span> · from the lots below: </span>
          <span className="num font-semibold">{actual ? q(plain(actual)) : "—"}</span>
          {variance && !variance.isZero() ? <span className="num text-pepper-soft"> ({signedQuantityText(plain(variance), line.item, units, unitSystem)})</span> : null}
        </p>
      ) : (
        <div>
          <label htmlFor={`${id}-q`} className="field-label">Actual<span className="sr-only"> {line.item.sku}</span></label>
          <div className="flex gap-2">
            <input
              id={`${id}-q`}
              type="text"
              inputMode="decimal"
              autoComplete="off"
              className="field-input num"
              value={state.quantity}
              onChange={(e) => onChange({ quantity: e.target.value })}
              {...describedBy(`${id}-q`, qErrors, true)}
            />
            {choices.length > 1 ? (
              <>
                <label htmlFor={`${id}-unit`} className="sr-only">{label}: unit</label>
                <select id={`${id}-unit`} className="field-input w-28 shrink-0" value={state.unit} onChange={(e) => onChange({ unit: e.target.value })}>
                  {choices.map((c) => <option key={c.unit} value={c.unit}>{c.label}</option>)}
                </select>
              </>
            ) : (
              <span className="flex min-h-touch w-12 shrink-0 items-center text-brine">{unitLabel}</span>
            )}
          </div>
          <FieldHint id={`${id}-q`}>
            Planned <span className="num">{q(line.quantity)}</span>
            {variance && !variance.isZero() ? <>: <span className="num font-semibold text-pepper">{signedQuantityText(plain(variance), line.item, units, unitSystem)}</span></> : null}
          </FieldHint>
          <FieldError id={`${id}-q`} errors={qErrors} />
        </div>
      )}

      {tracked ? (
        <fieldset className="space-y-2">
          <legend className="field-label">Lots<span className="sr-only"> of {line.item.sku}</span></legend>
          <div className="flex flex-wrap gap-2">
            <label className={`btn cursor-pointer text-sm ${state.chooseLots ? "btn-quiet" : "border border-pepper bg-salt-deep"}`}>
              <input type="radio" name={`${id}-lots`} checked={!state.chooseLots} onChange={() => onChange({ chooseLots: false })} className="h-4 w-4 accent-paprika" />
              {line.lots.length ? "As reserved" : "First expired first out"}
            </label>
            <label className={`btn cursor-pointer text-sm ${state.chooseLots ? "border border-pepper bg-salt-deep" : "btn-quiet"}`}>
              <input type="radio" name={`${id}-lots`} checked={state.chooseLots} onChange={onChooseLots} disabled={lotsLoading || !!lotsError} className="h-4 w-4 accent-paprika" />
              Choose lots
            </label>
          </div>
          {lotsError ? <p className="text-sm text-ember">The lots could not be read ({lotsError}); the reserved lots are used.</p> : null}
          {!state.chooseLots ? (
            <p className="text-sm text-pepper-soft">{reservedWords}.</p>
          ) : (
            <div className="space-y-2">
              {state.lots.map((r, j) => {
                const rowErrors = errors[`lot:${line.position}:${j}`];
                const rid = `${id}-lot${j}`;
                return (
                  <div key={r.key}>
                    <div className="grid grid-cols-[minmax(0,1fr)_6.5rem_auto] items-center gap-2">
                      <label htmlFor={`${rid}-lot`} className="sr-only">Lot {j + 1} of {line.item.sku}</label>
                      <select id={`${rid}-lot`} className="field-input" value={r.lot} onChange={(e) => setRow(j, { lot: e.target.value })} {...describedBy(rid, rowErrors)}>
                        <option value="">Choose a lot…</option>
                        {options.map((o) => (
                          <option key={o.lotId} value={o.lotId} disabled={o.expired}>
                            {o.code}
                            {o.date ? ` · ${o.expired ? "expired" : (DATE_KIND[o.dateKind ?? ""] ?? "date")} ${dayPlain(o.date)}` : ""}
                            {o.expired ? " (cannot be used)" : ` · ${q(plain(o.available))} free`}
                          </option>
                        ))}
                      </select>
                      <div className="flex items-center gap-1">
                        <label htmlFor={`${rid}-q`} className="sr-only">Lot {j + 1} of {line.item.sku}: quantity in {unitLabel}</label>
                        <input id={`${rid}-q`} type="text" inputMode="decimal" autoComplete="off" className="field-input num" value={r.quantity}
                          onChange={(e) => setRow(j, { quantity: e.target.value })} {...describedBy(rid, rowErrors)} />
                        <span className="text-sm text-brine">{unitLabel}</span>
                      </div>
                      <button type="button" className="btn-quiet min-w-touch px-0" aria-label={`Remove lot ${j + 1} of ${line.item.sku}`} onClick={() => onChange({ lots: state.lots.filter((_, i) => i !== j) })}>
                        <Trash2 aria-hidden className="h-5 w-5" />
                      </button>
                    </div>
                    {chosen(r.lot) ? (
                      <p className="mt-1 text-sm text-brine">
                        {lotWords(chosen(r.lot)!)}
                      </p>
                    ) : null}
                    <FieldError id={rid} errors={rowErrors} />
                  </div>
                );
              })}
              <button type="button" className="btn-quiet text-sm" onClick={() => onChange({ lots: [...state.lots, { key: ++rowKeys, lot: "", quantity: "" }] })}>
                <Plus aria-hidden className="h-4 w-4" /> Add a lot
              </button>
            </div>
          )}
          <FieldError id={`${id}-lots`} errors={lotsErrors} />
        </fieldset>
      ) : (
        <p className="text-sm text-brine">Not tracked by lot: taken from the reserved stock, then first expired first out.</p>
      )}
    </fieldset>
  );
}
