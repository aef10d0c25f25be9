"use client";

// The form of a purchase order, new or a draft being changed: the supplier, the delivery kitchen,
// the supplier's items in whole packs at a pack price (prefilled with the current price), the
// line totals and the order total worked out live with the same exact arithmetic the server uses
// (lib/purchasing/order-money.ts; the server's figures are what is saved). Errors from the API are
// shown on the field they name (lines.N.packs, supplier.orderEmail...).
import { Loader2, Plus, Trash2, TriangleAlert } from "lucide-react";
import { useRouter } from "next/navigation";
import { useMemo, useRef, useState, type FormEvent } from "react";
import { CureCaution } from "@/components/cure/cure-caution";
import { CureMarker } from "@/components/cure/cure-marker";
import { describedBy, FieldError, FieldHint, FormMessage } from "@/components/ui/field";
import { SideSheetFooter } from "@/components/ui/side-sheet";
import type { OrderCatalogueSupplier, PurchaseOrder } from "@/lib/data/purchase-orders";
import { lineTotal, orderTotal, toMinor } from "@/lib/purchasing/order-money";
import { ApiError, apiFetch, jsonInit } from "@/lib/queries/api";
import { newIdempotencyKey } from "@/lib/queries/stock";
import type { UnitSystem } from "@/lib/units";
import { amountText, stockText } from "./order-format";

export interface KitchenOption {
  id: string;
  code: string;
  name: string;
}

interface LineDraft {
  /** a stable key for React while lines come and go */
  key: string;
  supplierItemId: string;
  packs: string;
  packPrice: string;
}

const WHOLE = /^\d{1,6}$/;
const PRICE = /^\d{1,16}(\.\d{1,4})?$/;

/** The line's total as the server will work it out, or null while the packs or price cannot be read. */
function liveTotal(l: LineDraft, currency: string): string | null {
  const packs = l.packs.trim();
  const price = l.packPrice.trim();
  if (!WHOLE.test(packs) || Number(packs) < 1 || !PRICE.test(price)) return null;
  return lineTotal(packs, price, currency);
}

export function OrderForm({ catalogue, kitchens, defaultKitchenId, unitSystem, order, onCancel, onSaved }: {
  catalogue: { currency: string; today: string; suppliers: OrderCatalogueSupplier[] };
  kitchens: KitchenOption[];
  defaultKitchenId: string | null;
  unitSystem: UnitSystem;
  /** a draft to change; without it, a new order */
  order?: PurchaseOrder;
  onCancel: () => void;
  /** after a change is saved (a new order goes to its own page instead) */
  onSaved?: (order: PurchaseOrder) => void;
}) {
  const router = useRouter();
  const { currency } = catalogue;
  const [supplierId, setSupplierId] = useState(order?.supplier.id ?? "");
  const [kitchenId, setKitchenId] = useState(order?.kitchen.id ?? defaultKitchenId ?? kitchens[0]?.id ?? "");
  const [deliverBy, setDeliverBy] = useState(order?.deliverBy ?? "");
  const [notes, setNotes] = useState(order?.notes ?? "");
  const keyCounter = useRef(0);
  const nextKey = () => `l${++keyCounter.current}`;
  const [lines, setLines] = useState<LineDraft[]>(
    () => order?.lines.map((l) => ({ key: nextKey(), supplierItemId: l.supplierItemId, packs: l.packs, packPrice: l.packPrice })) ?? [],
  );
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [message, setMessage] = useState<string>();
  const [busy, setBusy] = useState(false);
  const retryKey = useRef<string | null>(null);

  const supplier = catalogue.suppliers.find((s) => s.id === supplierId);
  const itemsById = useMemo(() => new Map((supplier?.items ?? []).map((i) => [i.id, i])), [supplier]);
  // a draft's line whose supplier item was switched off since: still shown, from the order
  const orderLine = (id: string) => order?.lines.find((l) => l.supplierItemId === id);
  const totals = lines.map((l) => liveTotal(l, currency));
  const total = orderTotal(totals.filter((t): t is string => t !== null), currency);
  const incomplete = totals.some((t) => t === null);
  const belowMinimum = supplier?.minOrderValue && lines.length > 0 && toMinor(total, currency) < toMinor(supplier.minOrderValue, currency);
  const hasCure = lines.some((l) => (itemsById.get(l.supplierItemId)?.item.category ?? orderLine(l.supplierItemId)?.item.category) === "cure");
  const addable = (supplier?.items ?? []).filter((i) => !lines.some((l) => l.supplierItemId === i.id));
  const fieldErrors = (key: string) => errors[key];

  const changeSupplier = (id: string) => {
    setSupplierId(id);
    setLines([]); // lines are the supplier's items
    setErrors({});
  };
  const addItem = (id: string) => {
    const item = itemsById.get(id);
    if (!item) return;
    setLines((ls) => [...ls, { key: nextKey(), supplierItemId: id, packs: "1", packPrice: item.currentPrice ?? "" }]);
  };
  const setLine = (key: string, patch: Partial<LineDraft>) => {
    // an answer's error about this field no longer applies once it is changed
    const i = lines.findIndex((l) => l.key === key);
    const stale = Object.keys(patch).map((f) => `lines.${i}.${f}`);
    setErrors((es) => (stale.some((k) => k in es) ? Object.fromEntries(Object.entries(es).filter(([k]) => !stale.includes(k))) : es));
    setLines((ls) => ls.map((l) => (l.key === key ? { ...l, ...patch } : l)));
  };

  const submit = async (e: FormEvent) => {
    e.preventDefault();
    setBusy(true);
    setMessage(undefined);
    const body = {
      ...(order ? {} : { supplier: supplierId }),
      kitchen: kitchenId,
      lines: lines.map((l) => ({ supplierItem: l.supplierItemId, packs: l.packs.trim(), ...(l.packPrice.trim() ? { packPrice: l.packPrice.trim() } : {}) })),
      ...(order ? { deliverBy: deliverBy || null } : deliverBy ? { deliverBy } : {}),
      notes,
    };
    const key = retryKey.current ?? newIdempotencyKey();
    try {
      const saved = order
        ? await apiFetch<PurchaseOrder>(`/api/purchase-orders/${order.id}`, jsonInit("PATCH", body))
        : await apiFetch<PurchaseOrder>("/api/purchase-orders", jsonInit("POST", body, { "idempotency-key": key }));
      retryKey.current = null;
      setErrors({});
      if (order) {
        onSaved?.(saved);
        router.refresh();
      } else {
        router.push(`/purchasing/orders/${saved.id}`);
      }
    } catch (err) {
      const apiError = err instanceof ApiError ? err : null;
      // a lost answer may have been saved: the same key replays it on the next try
      retryKey.current = apiError?.code === "NETWORK" ? key : null;
      setErrors(apiError?.fields ?? {});
      setMessage(apiError?.message ?? "The order could not be saved. Try again.");
      setBusy(false);
    }
  };

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-5">
      {message ? <FormMessage tone="error">{message}</FormMessage> : null}
      <div>
        <label htmlFor="order-supplier" className="field-label">Supplier</label>
        {order ? (
          <p id="order-supplier" className="min-h-touch py-2 font-semibold">{order.supplier.name}</p>
        ) : (
          <select
            id="order-supplier" className="field-input" value={supplierId} data-autofocus=""
            onChange={(e) => changeSupplier(e.target.value)} {...describedBy("order-supplier", fieldErrors("supplier"), true)}
          >
            <option value="">Choose a supplier…</option>
            {catalogue.suppliers.map((s) => <option key={s.id} value={s.id}>{s.name}</option>)}
          </select>
        )}
        {order ? null : <FieldHint id="order-supplier">One supplier per order: its items are offered below.</FieldHint>}
        <FieldError id="order-supplier" errors={fieldErrors("supplier")} />
        {supplier && !supplier.orderEmail ? (
          <p className="mt-2 flex items-start gap-2 text-sm text-amber">
            <TriangleAlert aria-hidden className="mt-0.5 h-4 w-4 shrink-0" />
            {supplier.name} has no order e-mail yet: the order can be drafted and approved, and sent once the supplier has one.
          </p>
        ) : null}
      </div>

      <div className="grid grid-cols-2 gap-4">
        <div>
          <label htmlFor="order-kitchen" className="field-label">Deliver to</label>
          <select id="order-kitchen" className="field-input" value={kitchenId} onChange={(e) => setKitchenId(e.target.value)} {...describedBy("order-kitchen", fieldErrors("kitchen"))}>
            {kitchens.map((k) => <option key={k.id} value={k.id}>{k.name}</option>)}
          </select>
          <FieldError id="order-kitchen" errors={fieldErrors("kitchen")} />
        </div>
        <div>
          <label htmlFor="order-deliver-by" className="field-label">Needed by (optional)</label>
          <input
            id="order-deliver-by" type="date" className="field-input" min={catalogue.today} value={deliverBy}
            onChange={(e) => setDeliverBy(e.target.value)} {...describedBy("order-deliver-by", fieldErrors("deliverBy"))}
          />
          <FieldError id="order-deliver-by" errors={fieldErrors("deliverBy")} />
        </div>
      </div>

      <fieldset className="space-y-3">
        <legend className="field-label">Lines</legend>
        {lines.length === 0 ? (
          <p className="text-sm text-brine">{supplier ? "Add the items to order, one line each." : "Choose the supplier first."}</p>
        ) : (
          <ol className="space-y-3" aria-label="Order lines">
            {lines.map((l, i) => {
              const item = itemsById.get(l.supplierItemId);
              const fromOrder = orderLine(l.supplierItemId);
              const sku = item?.sku ?? fromOrder?.supplierSku ?? "";
              const description = item?.description ?? fromOrder?.description ?? "";
              const packLabel = item?.packLabel ?? fromOrder?.packLabel ?? "";
              const category = item?.item.category ?? fromOrder?.item.category;
              const packSize = item?.packSizeStock ?? fromOrder?.packSizeStock;
              const stockItem = item?.item ?? fromOrder?.item;
              const t = totals[i];
              const id = `line-${l.key}`;
              return (
                <li key={l.key} className="rounded-md border border-salt-edge bg-salt px-3 py-3" aria-label={`Line ${i + 1}: ${sku}`}>
                  <div className="flex items-start justify-between gap-2">
                    <div className="min-w-0">
                      <p className="flex flex-wrap items-center gap-2 font-semibold">{sku}{category === "cure" ? <CureMarker /> : null}</p>
                      <p className="text-sm text-brine">
                        {description} · {packLabel}
                        {packSize && stockItem ? ` (${stockText(packSize, stockItem, unitSystem)})` : ""}
                      </p>
                    </div>
                    <button
                      type="button" className="btn-quiet -mr-2 min-w-touch shrink-0 px-0" aria-label={`Remove ${sku}`}
                      onClick={() => setLines((ls) => ls.filter((x) => x.key !== l.key))}
                    >
                      <Trash2 aria-hidden className="h-5 w-5" />
                    </button>
                  </div>
                  <FieldError id={`${id}-item`} errors={fieldErrors(`lines.${i}.supplierItem`)} />
                  <div className="mt-2 grid grid-cols-[5.5rem_8rem_1fr] items-start gap-3">
                    <div>
                      <label htmlFor={`${id}-packs`} className="field-label text-sm">Packs</label>
                      <input
                        id={`${id}-packs`} type="text" inputMode="numeric" autoComplete="off" className="field-input num" value={l.packs}
                        onChange={(e) => setLine(l.key, { packs: e.target.value })} {...describedBy(`${id}-packs`, fieldErrors(`lines.${i}.packs`))}
                      />
                    </div>
                    <div>
                      <label htmlFor={`${id}-price`} className="field-label text-sm">Pack price ({currency})</label>
                      <input
                        id={`${id}-price`} type="text" inputMode="decimal" autoComplete="off" className="field-input num" value={l.packPrice}
                        placeholder={item?.currentPrice ? undefined : "No price yet"}
                        onChange={(e) => setLine(l.key, { packPrice: e.target.value })} {...describedBy(`${id}-price`, fieldErrors(`lines.${i}.packPrice`))}
                      />
                    </div>
                    <div className="text-right">
                      <span className="field-label text-sm">Line total</span>
                      <output htmlFor={`${id}-packs ${id}-price`} className="num block py-2 font-semibold tabular-nums" aria-label={`Line total of ${sku}`}>
                        {t == null ? "—" : amountText(t, currency)}
                      </output>
                    </div>
                  </div>
                  <FieldError id={`${id}-packs`} errors={fieldErrors(`lines.${i}.packs`)} />
                  <FieldError id={`${id}-price`} errors={fieldErrors(`lines.${i}.packPrice`)} />
                </li>
              );
            })}
          </ol>
        )}
        <FieldError id="order-lines" errors={fieldErrors("lines")} />
        {supplier && addable.length > 0 ? (
          <div>
            <label htmlFor="order-add-item" className="field-label">Add an item</label>
            <select id="order-add-item" className="field-input" value="" onChange={(e) => addItem(e.target.value)}>
              <option value="">Choose from {supplier.name}'s items…</option>
              {addable.map((i) => (
                <option key={i.id} value={i.id}>
                  {i.sku} · {i.description} · {i.packLabel}{i.currentPrice ? ` · ${amountText(i.currentPrice, currency)}` : ""}
                </option>
              ))}
            </select>
          </div>
        ) : supplier && supplier.items.length === 0 ? (
          <p className="text-sm text-brine">{supplier.name} has no active items yet: add them on the supplier's page.</p>
        ) : null}
      </fieldset>

      {hasCure ? <CureCaution /> : null}

      <div>
        <label htmlFor="order-notes" className="field-label">Notes for the supplier (optional)</label>
        <textarea
          id="order-notes" className="field-input min-h-[5rem] py-2" maxLength={2000} value={notes}
          onChange={(e) => setNotes(e.target.value)} {...describedBy("order-notes", fieldErrors("notes"), true)}
        />
        <FieldHint id="order-notes">Printed on the order and quoted in the e-mail, e.g. delivery hours.</FieldHint>
        <FieldError id="order-notes" errors={fieldErrors("notes")} />
      </div>

      <SideSheetFooter>
        <div className="mr-auto">
          <p className="text-sm text-brine">Order total{incomplete ? " (lines with packs and price)" : ""}</p>
          <output className="num block text-xl font-semibold tabular-nums" aria-label="Order total">{amountText(total, currency)}</output>
          {belowMinimum ? <p className="text-sm text-amber">Below {supplier!.name}'s minimum order of {amountText(supplier!.minOrderValue!, currency)}.</p> : null}
        </div>
        <button type="button" className="btn-quiet" onClick={onCancel} disabled={busy}>Cancel</button>
        <button type="submit" className="btn-primary" disabled={busy || !supplierId || lines.length === 0}>
          {busy ? <Loader2 aria-hidden className="h-5 w-5 animate-spin" /> : order ? null : <Plus aria-hidden className="h-5 w-5" />}
          {order ? "Save draft" : "Create draft"}
        </button>
      </SideSheetFooter>
    </form>
  );
}
