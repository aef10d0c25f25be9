"use client";

// Record one movement on an item (or one of its lots) in the current kitchen from a side sheet:
// waste, an adjustment or a transfer out. POSTs /api/movements with one Idempotency-Key per submit,
// shows 422 field messages beside their fields and 409 refusals (short stock, expired lot) in an
// alert; on success the owner closes the sheet, refetches the stock and confirms.
import { useQuery, useQueryClient } from "@tanstack/react-query";
import { AlertTriangle, Loader2 } from "lucide-react";
import { useId, useMemo, useRef, useState, type FormEvent } from "react";
import type { StockLot, StockRow } from "@/lib/data/stock";
import { apiFetch, jsonInit } from "@/lib/queries/api";
import { ApiError, newIdempotencyKey, stockQueryOptions } from "@/lib/queries/stock";
import { globalUnitsOf, DIMENSION_OF_BASE, unitsFor, type UnitSystem } from "@/lib/units";
import { CureCaution } from "@/components/cure/cure-caution";
import { describedBy, FieldError, FieldHint, FormMessage, TextField } from "@/components/ui/field";
import { SideSheet, SideSheetFooter } from "@/components/ui/side-sheet";
import { casingLabel, DATE_KIND_WORDS, daysLeft, formatDay, itemUnitsOf, quantityText } from "./stock-rows";

export type ActionKind = "waste" | "adjustment" | "transfer";

export interface ActionTarget {
  item: StockRow;
  lot?: StockLot;
  /** the mode the sheet opens in (the row menu's choice); waste when not given */
  kind?: ActionKind;
}

const KIND_WORDS: Record<ActionKind, { label: string; hint: string }> = {
  waste: { label: "Waste", hint: "Stock thrown away: spoiled, dropped, past its date." },
  adjustment: { label: "Adjustment", hint: "A correction up or down; use a minus sign to take stock off." },
  transfer: { label: "Transfer out", hint: "Stock sent to another kitchen of the company." },
};

interface KitchenOption {
  id: string;
  code: string;
  name: string;
}

/** The units offered for an item: its put-up and packs, then the common units of its dimension. */
function unitOptions(item: StockRow): { unit: string; label: string }[] {
  try {
    const choices = unitsFor(itemUnitsOf(item)).map((c) => ({ unit: c.unit, label: c.label }));
    if (!choices.some((c) => c.unit === item.unit)) choices.unshift({ unit: item.unit, label: item.unit });
    return choices;
  } catch {
    return [item.unit, ...globalUnitsOf(DIMENSION_OF_BASE[item.unit]).map((u) => u.code).filter((c) => c !== item.unit)].map((u) => ({ unit: u, label: u }));
  }
}

async function fetchKitchens(): Promise<KitchenOption[]> {
  const body = await apiFetch<{ kitchens: (KitchenOption & { archived: boolean })[] }>("/api/kitchens");
  return body.kitchens.filter((k) => !k.archived);
}

export function StockActionSheet({ kitchen, target, onClose, onDone, unitSystem, today }: {
  kitchen: string;
  target: ActionTarget | null;
  onClose: () => void;
  /** called after a movement was posted, with a sentence to confirm it */
  onDone: (message: string) => void;
  unitSystem: UnitSystem;
  /** the user's today, yyyy-mm-dd: an expired lot is said so */
  today?: string;
}) {
  const item = target?.item;
  const lot = target?.lot;
  const title = item ? `Record for ${item.sku}` : "Record";
  const description = item
    ? `${item.casing ? `${casingLabel(item.casing)} · ` : ""}${item.name}${lot ? ` · lot ${lot.code}` : ""}`
    : undefined;
  return (
    <SideSheet open={target !== null} onClose={onClose} title={title} description={description}>
      {item ? (
        <ActionForm
          // a new target (or mode) starts a fresh form
          key={`${item.itemId}:${lot?.lotId ?? ""}:${target?.kind ?? ""}`}
          kitchen={kitchen}
          item={item}
          lot={lot}
          initialKind={target?.kind ?? "waste"}
          today={today}
          onDone={onDone}
          unitSystem={unitSystem}
          onCancel={onClose}
        />
      ) : null}
    </SideSheet>
  );
}

function ActionForm({ kitchen, item, lot, initialKind, today, onDone, onCancel, unitSystem }: {
  kitchen: string;
  item: StockRow;
  lot?: StockLot;
  initialKind: ActionKind;
  today?: string;
  onDone: (message: string) => void;
  onCancel: () => void;
  unitSystem: UnitSystem;
}) {
  const queryClient = useQueryClient();
  const id = useId().replace(/:/g, "");
  const [kind, setKind] = useState<ActionKind>(initialKind);
  const expiredOn = lot?.date && today && daysLeft(lot.date, today) < 0 ? lot.date : null;
  const [quantity, setQuantity] = useState("");
  const units = useMemo(() => unitOptions(item), [item]);
  // the put-up or the stock unit first (the list itself runs small to large: mg before g)
  const [unit, setUnit] = useState(() => units.find((u) => u.unit === item.casing?.putUp)?.unit ?? units.find((u) => u.unit === item.unit)?.unit ?? units[0]?.unit ?? item.unit);
  const [reason, setReason] = useState("");
  const [toKitchen, setToKitchen] = useState("");
  const [fields, setFields] = useState<Record<string, string[]>>({});
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const submitting = useRef(false);

  const kitchens = useQuery({ queryKey: ["kitchens"], queryFn: fetchKitchens, enabled: kind === "transfer", staleTime: 60_000 });
  const others = (kitchens.data ?? []).filter((k) => k.code.toUpperCase() !== kitchen.toUpperCase());

  const available = lot ? lot.available : item.available;
  const unitLabel = units.find((u) => u.unit === unit)?.label ?? unit;

  const submit = async (e: FormEvent) => {
    e.preventDefault();
    if (submitting.current) return;
    submitting.current = true;
    setBusy(true);
    setError(null);
    setFields({});
    const body = {
      kind,
      kitchen,
      item: item.itemId,
      quantity: quantity.trim().replace(",", "."),
      unit,
      ...(lot ? { lot: lot.lotId } : {}),
      ...(reason.trim() ? { reason: reason.trim() } : {}),
      ...(kind === "transfer" && toKitchen ? { toKitchen } : {}),
    };
    try {
      try {
        await apiFetch("/api/movements", jsonInit("POST", body, { "idempotency-key": newIdempotencyKey() }));
      } catch (e) {
        if (!(e instanceof ApiError)) throw e;
        if (e.status === 0) throw new ApiError(0, "NETWORK", "The server could not be reached. Nothing was recorded; check the connection and try again.");
        if (e.status === 422 && Object.keys(e.fields).length) {
          setFields(e.fields);
          const unplaced = Object.entries(e.fields).filter(([k]) => !["quantity", "unit", "reason", "toKitchen"].includes(k));
          setError(unplaced.length ? `Not recorded: ${unplaced[0]![1][0] ?? e.message}` : "Not recorded: check the fields marked below.");
        } else if (e.code === "INSUFFICIENT_STOCK") {
          const a = typeof e.details.available === "string" ? e.details.available : undefined;
          setError(`Not recorded: not enough stock.${a !== undefined ? ` Only ${quantityText(a, item, unitSystem).main} available${lot ? ` in lot ${lot.code}` : ""}.` : ""} ${e.message}`.trim());
        } else {
          setError(`Not recorded: ${e.message}`);
        }
        return;
      }
      await queryClient.invalidateQueries({ queryKey: stockQueryOptions(kitchen).queryKey });
      await queryClient.invalidateQueries({ queryKey: ["movements"] });
      const what = `${body.quantity} ${unitLabel} of ${item.sku}${lot ? `, lot ${lot.code}` : ""}`;
      onDone(
        kind === "waste" ? `Waste recorded: ${what}.`
          : kind === "adjustment" ? `Adjustment recorded: ${what}.`
            : `Transfer recorded: ${what} sent to ${toKitchen}.`,
      );
    } catch (e2) {
      setError(e2 instanceof Error ? e2.message : "Something went wrong; nothing was recorded.");
    } finally {
      submitting.current = false;
      setBusy(false);
    }
  };

  return (
    <form onSubmit={(e) => void submit(e)} noValidate className="space-y-5">
      {item.cure ? <CureCaution /> : null}
      <p className="text-sm text-brine">
        Available{lot ? ` in lot ${lot.code}` : ""}: <span className="num font-semibold tabular-nums text-pepper">{quantityText(available, item, unitSystem).main}</span>
      </p>
      {expiredOn && lot ? (
        <p className="flex items-start gap-2 rounded-md border border-ember/30 bg-ember-soft px-3 py-2 text-sm font-medium text-ember">
          <AlertTriangle aria-hidden className="mt-0.5 h-4 w-4 shrink-0" />
          <span>
            Lot {lot.code} is expired ({lot.dateKind ? DATE_KIND_WORDS[lot.dateKind] : "dated"} {formatDay(expiredOn)}): it may be wasted, but not used in production.
          </span>
        </p>
      ) : null}

      <fieldset>
        <legend className="field-label">What happened</legend>
        <div className="mt-1 grid grid-cols-3 gap-2">
          {(Object.keys(KIND_WORDS) as ActionKind[]).map((k) => (
            <label
              key={k}
              className={`flex min-h-touch cursor-pointer items-center justify-center rounded-md border px-2 text-center text-sm font-semibold ${kind === k ? "border-paprika bg-paprika-soft text-pepper" : "border-salt-edge bg-white text-pepper"}`}
            >
              <input
                type="radio"
                name="kind"
                value={k}
                checked={kind === k}
                onChange={() => {
                  setKind(k);
                  setFields({});
                  setError(null);
                }}
                className="sr-only"
              />
              {KIND_WORDS[k].label}
            </label>
          ))}
        </div>
        <p className="mt-1 text-sm text-brine">{KIND_WORDS[kind].hint}</p>
      </fieldset>

      <div className="grid grid-cols-[1fr_auto] gap-3">
        <TextField
          name="quantity"
          id={`${id}-quantity`}
          label={kind === "adjustment" ? "Quantity (+ or −)" : "Quantity"}
          inputMode={kind === "adjustment" ? "text" : "decimal"}
          autoComplete="off"
          value={quantity}
          onChange={(e) => setQuantity(e.target.value)}
          errors={fields.quantity}
          initialFocus
          required
        />
        <div>
          <label htmlFor={`${id}-unit`} className="field-label">Unit</label>
          <select
            id={`${id}-unit`}
            name="unit"
            className="field-input"
            value={unit}
            onChange={(e) => setUnit(e.target.value)}
            {...describedBy(`${id}-unit`, fields.unit)}
          >
            {units.map((u) => <option key={u.unit} value={u.unit}>{u.label}</option>)}
          </select>
          <FieldError id={`${id}-unit`} errors={fields.unit} />
        </div>
      </div>

      {kind === "transfer" ? (
        <div>
          <label htmlFor={`${id}-to`} className="field-label">Receiving kitchen</label>
          <select
            id={`${id}-to`}
            name="toKitchen"
            className="field-input"
            value={toKitchen}
            onChange={(e) => setToKitchen(e.target.value)}
            required
            {...describedBy(`${id}-to`, fields.toKitchen, kitchens.isError || (kitchens.isSuccess && !others.length))}
          >
            <option value="">{kitchens.isPending ? "Loading kitchens…" : "Choose a kitchen"}</option>
            {others.map((k) => <option key={k.id} value={k.code}>{k.name} ({k.code})</option>)}
          </select>
          {kitchens.isError ? <FieldHint id={`${id}-to`}>{kitchens.error.message}</FieldHint> : null}
          {kitchens.isSuccess && !others.length ? <FieldHint id={`${id}-to`}>The company has no other kitchen to send to.</FieldHint> : null}
          <FieldError id={`${id}-to`} errors={fields.toKitchen} />
        </div>
      ) : null}

      <div>
        <label htmlFor={`${id}-reason`} className="field-label">
          Reason{kind === "waste" ? "" : " (optional)"}
        </label>
        <textarea
          id={`${id}-reason`}
          name="reason"
          rows={3}
          className="field-input"
          value={reason}
          maxLength={500}
          onChange={(e) => setReason(e.target.value)}
          required={kind === "waste"}
          {...describedBy(`${id}-reason`, fields.reason)}
        />
        <FieldError id={`${id}-reason`} errors={fields.reason} />
      </div>

      {error ? <FormMessage tone="error">{error}</FormMessage> : null}

      <SideSheetFooter>
        <button type="button" className="btn-quiet" onClick={onCancel}>Cancel</button>
        <button type="submit" className="btn-primary" disabled={busy}>
          {busy ? <Loader2 aria-hidden className="h-5 w-5 animate-spin" /> : null}
          Record {KIND_WORDS[kind].label.toLowerCase()}
        </button>
      </SideSheetFooter>
    </form>
  );
}
