"use client";

// The reorder list of one kitchen: per supplier, the items to order with their figures, the packs
// (editable; 0 leaves an item out), the price per buying unit and the line value, the reasons on
// demand, and a choice among the other suppliers of an item (the cheapest per stock unit comes
// preselected; choosing another moves the line under that supplier, with that supplier's own
// lead time and packs). "Create draft orders" posts the lines: one draft per supplier.
// Money shown is worked out with the same exact rules as the order (lib/purchasing/order-money).
import { ChevronDown, ChevronRight, Loader2, PackageCheck, ShoppingBasket, TriangleAlert } from "lucide-react";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { Fragment, useMemo, useRef, useState } from "react";
import { CureCaution } from "@/components/cure/cure-caution";
import { CureMarker } from "@/components/cure/cure-marker";
import { amountText, stockText } from "@/components/purchasing/order-format";
import { DataTable, RowHeader, TBody, Td, Th, THead } from "@/components/ui/data-table";
import { EmptyState } from "@/components/ui/empty-state";
import { describedBy, FieldError, FormMessage } from "@/components/ui/field";
import type { PurchaseOrder } from "@/lib/data/purchase-orders";
import { lineTotal, orderTotal, toMinor } from "@/lib/purchasing/order-money";
import { buyingUnit, priceText } from "@/lib/reorder/price-per";
import {
  ApiError, createReorderOrders, newIdempotencyKey, type KitchenReorder, type ReorderLine, type ReorderOffer,
} from "@/lib/queries/reorder";
import { dec, plain, type UnitSystem } from "@/lib/units";

const WHOLE = /^\d{1,6}$/;
const PRICE = /^\d{1,16}(\.\d{1,4})?$/;
const day = new Intl.DateTimeFormat("en-GB", { timeZone: "UTC", weekday: "short", day: "numeric", month: "short" });
const dayText = (iso: string) => day.format(new Date(`${iso}T00:00:00Z`));
const packsWord = (n: number) => (n === 1 ? "pack" : "packs");

interface Choice {
  supplierItemId?: string;
  packs?: string;
  packPrice?: string;
}

interface Current {
  line: ReorderLine;
  offer: ReorderOffer;
  /** the preselected offer, so the raise to the supplier's minimum still applies */
  original: boolean;
  packs: string;
  packPrice: string;
  /** whole packs >= 1 as typed, or null (left out or unreadable) */
  packCount: string | null;
  value: string | null;
}

const offersOf = (l: ReorderLine) => [l.chosen, ...l.alternatives];

export function ReorderBoard({ kitchen, today, currency, cureCaution, unitSystem, canManage }: {
  kitchen: KitchenReorder;
  today: string;
  currency: string;
  cureCaution: boolean;
  unitSystem: UnitSystem;
  canManage: boolean;
}) {
  const router = useRouter();
  const [choices, setChoices] = useState<Record<string, Choice>>({});
  const [open, setOpen] = useState<Record<string, boolean>>({});
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [message, setMessage] = useState<string>();
  const [busy, setBusy] = useState(false);
  const [made, setMade] = useState<PurchaseOrder[]>([]);
  // the lines of the drafts just made: the same lines again would make the same drafts twice
  const [madeFrom, setMadeFrom] = useState<string | null>(null);
  const retryKey = useRef<string | null>(null);

  const lines = useMemo(() => kitchen.suppliers.flatMap((g) => g.lines), [kitchen]);

  const currentOf = (l: ReorderLine): Current => {
    const c = choices[l.item.id] ?? {};
    const offer = offersOf(l).find((o) => o.supplierItemId === (c.supplierItemId ?? l.chosen.supplierItemId)) ?? l.chosen;
    const packs = c.packs ?? String(offer.packs);
    const packPrice = c.packPrice ?? "";
    const packCount = WHOLE.test(packs.trim()) && Number(packs.trim()) >= 1 ? String(Number(packs.trim())) : null;
    const price = offer.packPrice ?? (PRICE.test(packPrice.trim()) ? packPrice.trim() : null);
    return {
      line: l, offer, original: offer === l.chosen, packs, packPrice, packCount,
      value: packCount !== null && price !== null ? lineTotal(packCount, price, currency) : null,
    };
  };
  const current = lines.map(currentOf);

  // the lines under the supplier now chosen for each, suppliers by name
  const groups = new Map<string, { supplier: ReorderOffer["supplier"]; deliverBy: string; rows: Current[] }>();
  for (const c of current) {
    const g = groups.get(c.offer.supplier.id) ?? { supplier: c.offer.supplier, deliverBy: c.offer.horizon, rows: [] };
    g.rows.push(c);
    groups.set(c.offer.supplier.id, g);
  }
  const shownGroups = [...groups.values()].sort((a, b) => a.supplier.name.localeCompare(b.supplier.name));
  const toOrder = current.filter((c) => c.packCount !== null);
  const supplierCount = new Set(toOrder.map((c) => c.offer.supplier.id)).size;

  const setChoice = (itemId: string, patch: Choice) => setChoices((cs) => ({ ...cs, [itemId]: { ...cs[itemId], ...patch } }));
  const fieldErrors = (itemId: string, field: string) => errors[`${itemId}.${field}`];

  const sent = toOrder;
  const body = {
    kitchen: kitchen.kitchen.id,
    lines: sent.map((c) => ({
      supplierItemId: c.offer.supplierItemId,
      packs: c.packCount!,
      ...(c.offer.packPrice === null && c.packPrice.trim() ? { packPrice: c.packPrice.trim() } : {}),
    })),
  };
  const bodyText = JSON.stringify(body);
  const alreadyMade = madeFrom === bodyText;

  const submit = async () => {
    setBusy(true);
    setMessage(undefined);
    const key = retryKey.current ?? newIdempotencyKey();
    try {
      const r = await createReorderOrders(body, key);
      retryKey.current = null;
      setErrors({});
      setMade(r.orders);
      setMadeFrom(bodyText);
      router.refresh();
    } catch (err) {
      const apiError = err instanceof ApiError ? err : null;
      // a lost answer may have been acted on: the same key replays it on the next try
      retryKey.current = apiError?.code === "NETWORK" ? key : null;
      const byItem: Record<string, string[]> = {};
      for (const [k, msgs] of Object.entries(apiError?.fields ?? {})) {
        const m = /^lines\.(\d+)\.(.+)$/.exec(k);
        const target = m && sent[Number(m[1])] ? `${sent[Number(m[1])]!.line.item.id}.${m[2]}` : k;
        (byItem[target] ??= []).push(...msgs);
      }
      setErrors(byItem);
      setMessage(apiError?.message ?? "The drafts could not be made. Try again.");
    } finally {
      setBusy(false);
    }
  };

  const q = (value: string, l: ReorderLine) => stockText(value, l.item, unitSystem);

  const reasonsOf = (c: Current): string[] => {
    const { line: l, offer: o } = c;
    const out = [
      `By ${dayText(o.horizon)} (${o.supplier.name} delivers in ${o.supplier.leadTimeDays} ${o.supplier.leadTimeDays === 1 ? "day" : "days"}): on hand ${q(l.onHand, l)} − reserved ${q(l.reserved, l)} − planned batches not yet reserved ${q(o.plannedWithinLeadTime, l)} + on order ${q(o.openOrdersWithinLeadTime, l)} = ${q(o.projected, l)}, below the reorder point of ${q(l.reorderPoint, l)}.`,
      l.parLevel !== null
        ? `Up to the par level of ${q(l.parLevel, l)}: ${q(o.shortfall, l)} to order, rounded up to whole packs: ${o.packs} × ${o.packLabel}.`
        : `No par level is set, so up to the reorder point: ${q(o.shortfall, l)} to order, rounded up to whole packs: ${o.packs} × ${o.packLabel}.`,
    ];
    if (c.original && l.minimumRaise > 0) {
      out.push(`Raised by ${l.minimumRaise} ${packsWord(l.minimumRaise)} to ${l.chosen.packs} so the order to ${o.supplier.name} reaches its minimum of ${amountText(o.supplier.minOrderValue!, currency)}.`);
    }
    if (o.packPrice === null) out.push(`${o.supplier.name} has no current price for ${o.sku}: enter the pack price to order it.`);
    for (const p of l.pendingOrders) {
      out.push(`${p.number} (${p.status === "draft" ? "a draft" : "approved"}) already holds ${q(p.quantity, l)}: not counted until it is sent.`);
    }
    return out;
  };

  const offerLabel = (o: ReorderOffer, l: ReorderLine) => {
    const price = o.unitPrice === null ? "no price" : (() => {
      const p = priceText(o.unitPrice, l.item, unitSystem, currency);
      return `${amountText(p.amount, currency)} / ${p.label}`;
    })();
    return `${o.supplier.name} · ${price}${o.suggested ? "" : ` · not needed within ${o.supplier.leadTimeDays} days`}`;
  };

  if (lines.length === 0 && kitchen.unsourced.length === 0) {
    return (
      <EmptyState title="Nothing to reorder" icon={<PackageCheck aria-hidden className="h-8 w-8" />}>
        {kitchen.watched === 0 ? (
          <p>
            No item has a reorder point in {kitchen.kitchen.name} yet. Set reorder points (and par levels) on the{" "}
            <Link href="/stock" className="text-paprika underline underline-offset-2">Stock</Link> page: items are suggested here when their stock is projected to fall below them.
          </p>
        ) : (
          <p>
            All {kitchen.watched} {kitchen.watched === 1 ? "item" : "items"} with a reorder point in {kitchen.kitchen.name} stay at or above it within their
            suppliers' lead times, counting planned batches and orders on their way.
          </p>
        )}
      </EmptyState>
    );
  }

  return (
    <div className="space-y-8">
      {cureCaution ? <CureCaution /> : null}
      <div role="status">
        {made.length ? (
          <FormMessage tone="success">
            Drafted{" "}
            {made.map((o, i) => (
              <Fragment key={o.id}>
                {i > 0 ? (i === made.length - 1 ? " and " : ", ") : null}
                <Link href={`/purchasing/orders/${o.id}`} className="underline underline-offset-2">{o.number}</Link> for {o.supplier.name} ({amountText(o.total, o.currency)})
              </Fragment>
            ))}
            . Approve and send them from their pages.
          </FormMessage>
        ) : null}
      </div>
      {message ? <FormMessage tone="error">{message}</FormMessage> : null}

      {shownGroups.map((g) => {
        const raised = g.rows.filter((r) => r.original && r.line.minimumRaise > 0 && r.packs === String(r.line.chosen.packs));
        const unpriced = g.rows.some((r) => r.packCount !== null && r.value === null);
        const values = g.rows.map((r) => r.value).filter((v): v is string => v !== null);
        const total = orderTotal(values, currency);
        const min = g.supplier.minOrderValue;
        const below = min !== null && g.rows.some((r) => r.packCount !== null) && toMinor(total, currency) < toMinor(min, currency);
        const headingId = `supplier-${g.supplier.id}`;
        return (
          <section key={g.supplier.id} aria-labelledby={headingId} className="space-y-3">
            <header className="flex flex-wrap items-end justify-between gap-2">
              <div>
                <h2 id={headingId} className="text-xl font-semibold">{g.supplier.name}</h2>
                <p className="text-sm text-brine">
                  Delivers in {g.supplier.leadTimeDays} {g.supplier.leadTimeDays === 1 ? "day" : "days"}: a draft asks for {dayText(g.deliverBy)}.
                  {min !== null ? ` Minimum order ${amountText(min, currency)}.` : " No minimum order."}
                </p>
              </div>
              <div className="text-right">
                <p className="text-sm text-brine">Order value</p>
                <p className="num text-lg font-semibold tabular-nums" aria-label={`Order value for ${g.supplier.name}`}>{amountText(total, currency)}</p>
              </div>
            </header>
            {below ? (
              <p className="flex items-start gap-2 text-sm font-medium text-amber">
                <TriangleAlert aria-hidden className="mt-0.5 h-4 w-4 shrink-0" />
                Below {g.supplier.name}'s minimum order of {amountText(min!, currency)}: add packs or lines before sending.
              </p>
            ) : null}
            {raised.length || unpriced ? (
              <ul className="text-sm text-brine">
                {raised.map((r) => (
                  <li key={r.line.item.id}>
                    {r.line.item.name} raised by {r.line.minimumRaise} {packsWord(r.line.minimumRaise)} so the order reaches {g.supplier.name}'s minimum of {amountText(min!, currency)}.
                  </li>
                ))}
                {unpriced ? <li>Lines without a price are left out of the order value.</li> : null}
              </ul>
            ) : null}
            <DataTable caption={`To order from ${g.supplier.name}`}>
              <THead>
                <Th>Item</Th>
                <Th numeric>On hand</Th>
                <Th numeric>Projected</Th>
                <Th numeric>Reorder point</Th>
                <Th>Order</Th>
                <Th numeric>Price</Th>
                <Th numeric>Value</Th>
                <Th action />
              </THead>
              <TBody>
                {g.rows.map((c) => {
                  const l = c.line;
                  const o = c.offer;
                  const id = `line-${l.item.id}`;
                  const expanded = open[l.item.id] ?? false;
                  const choosable = offersOf(l).length > 1;
                  const price = o.unitPrice === null ? null : priceText(o.unitPrice, l.item, unitSystem, currency);
                  const leftOut = c.packCount === null && c.packs.trim() !== "" && /^0+$/.test(c.packs.trim());
                  return (
                    <Fragment key={l.item.id}>
                      <tr className={leftOut ? "opacity-60" : undefined}>
                        <RowHeader className="min-w-[11rem] max-w-[15rem]">
                          <span className="flex flex-wrap items-center gap-2">
                            {l.item.name}
                            {l.item.category === "cure" ? <CureMarker /> : null}
                          </span>
                          <span className="block text-sm font-normal text-brine">{l.item.sku} · {o.sku}</span>
                          {choosable ? (
                            <>
                              <label htmlFor={`${id}-supplier`} className="sr-only">Supplier for {l.item.name}</label>
                              <select
                                id={`${id}-supplier`} className="field-input mt-1 min-h-[44px] w-full max-w-[14rem] truncate text-sm font-normal" value={o.supplierItemId}
                                onChange={(e) => setChoice(l.item.id, { supplierItemId: e.target.value, packs: undefined, packPrice: undefined })}
                              >
                                {offersOf(l).map((alt) => (
                                  <option key={alt.supplierItemId} value={alt.supplierItemId} disabled={!alt.suggested}>{offerLabel(alt, l)}</option>
                                ))}
                              </select>
                            </>
                          ) : null}
                          <FieldError id={`${id}-supplier`} errors={fieldErrors(l.item.id, "supplierItemId")} />
                          {l.pendingOrders.length ? (
                            <span className="mt-1 block text-sm font-normal text-brine">
                              Already drafted:{" "}
                              {l.pendingOrders.map((p, i) => (
                                <Fragment key={p.id}>
                                  {i > 0 ? ", " : null}
                                  <Link href={`/purchasing/orders/${p.id}`} className="text-paprika underline-offset-2 hover:underline">{p.number}</Link>
                                </Fragment>
                              ))}
                            </span>
                          ) : null}
                        </RowHeader>
                        <Td numeric className="whitespace-nowrap">{q(l.onHand, l)}</Td>
                        <Td numeric className="whitespace-nowrap">
                          <span className="inline-flex items-center gap-1 font-semibold text-amber">
                            <TriangleAlert aria-hidden className="h-4 w-4" />
                            {q(o.projected, l)}
                          </span>
                          <span className="block text-sm text-brine">by {dayText(o.horizon)}</span>
                        </Td>
                        <Td numeric className="whitespace-nowrap">
                          {q(l.reorderPoint, l)}
                          <span className="block text-sm text-brine">{l.parLevel === null ? "no par level" : `par ${q(l.parLevel, l)}`}</span>
                        </Td>
                        <Td className="min-w-[9rem]">
                          <div className="flex items-center gap-2">
                            <label htmlFor={`${id}-packs`} className="sr-only">Packs of {l.item.name}</label>
                            <input
                              id={`${id}-packs`} type="text" inputMode="numeric" autoComplete="off" className="field-input num w-16 text-right"
                              value={c.packs} disabled={!canManage}
                              onChange={(e) => setChoice(l.item.id, { packs: e.target.value })}
                              {...describedBy(`${id}-packs`, fieldErrors(l.item.id, "packs"))}
                            />
                            <span className="text-sm leading-tight">× {o.packLabel}</span>
                          </div>
                          <span className="block text-sm text-brine">
                            {c.packCount !== null ? `= ${q(plain(dec(o.packSize).times(c.packCount)), l)}` : leftOut ? "left out" : "whole packs"}
                          </span>
                          <FieldError id={`${id}-packs`} errors={fieldErrors(l.item.id, "packs")} />
                          {o.packPrice === null ? (
                            <div className="mt-1">
                              <label htmlFor={`${id}-price`} className="text-sm font-semibold">Pack price ({currency})</label>
                              <input
                                id={`${id}-price`} type="text" inputMode="decimal" autoComplete="off" className="field-input num w-28" placeholder="No price yet"
                                value={c.packPrice} disabled={!canManage}
                                onChange={(e) => setChoice(l.item.id, { packPrice: e.target.value })}
                                {...describedBy(`${id}-price`, fieldErrors(l.item.id, "packPrice"))}
                              />
                              <FieldError id={`${id}-price`} errors={fieldErrors(l.item.id, "packPrice")} />
                            </div>
                          ) : null}
                        </Td>
                        <Td numeric className="whitespace-nowrap">
                          {price ? (
                            <>
                              {amountText(price.amount, currency)}
                              <span className="block text-sm text-brine">per {price.label}</span>
                            </>
                          ) : <span className="text-brine">—</span>}
                        </Td>
                        <Td numeric className="whitespace-nowrap">{c.value === null ? <span className="text-brine">—</span> : amountText(c.value, currency)}</Td>
                        <Td action>
                          <button
                            type="button" className="btn-quiet gap-1 px-2" aria-expanded={expanded} aria-controls={`${id}-why`}
                            onClick={() => setOpen((s) => ({ ...s, [l.item.id]: !expanded }))}
                          >
                            {expanded ? <ChevronDown aria-hidden className="h-4 w-4" /> : <ChevronRight aria-hidden className="h-4 w-4" />}
                            Why<span className="sr-only"> {l.item.name}</span>
                          </button>
                        </Td>
                      </tr>
                      {expanded ? (
                        <tr id={`${id}-why`} className="bg-salt">
                          <td colSpan={8} className="px-4 py-3">
                            <ul className="list-disc space-y-1 pl-5 text-sm" aria-label={`Why ${l.item.name} is suggested`}>
                              {reasonsOf(c).map((r) => <li key={r}>{r}</li>)}
                            </ul>
                            {choosable ? (
                              <table className="mt-3 w-full text-sm">
                                <caption className="pb-1 text-left font-semibold">Suppliers of {l.item.name}, cheapest per {buyingUnit(l.item, unitSystem).label} first</caption>
                                <thead className="text-brine">
                                  <tr>
                                    <th scope="col" className="py-1 pr-3 text-left font-semibold">Supplier</th>
                                    <th scope="col" className="py-1 pr-3 text-left font-semibold">Pack</th>
                                    <th scope="col" className="py-1 pr-3 text-right font-semibold">Price</th>
                                    <th scope="col" className="py-1 pr-3 text-right font-semibold">Lead time</th>
                                    <th scope="col" className="py-1 pr-3 text-right font-semibold">Projected</th>
                                    <th scope="col" className="py-1 text-right font-semibold">Packs</th>
                                  </tr>
                                </thead>
                                <tbody>
                                  {offersOf(l).map((alt) => {
                                    const p = alt.unitPrice === null ? null : priceText(alt.unitPrice, l.item, unitSystem, currency);
                                    return (
                                      <tr key={alt.supplierItemId} className={alt.supplierItemId === o.supplierItemId ? "font-semibold" : undefined}>
                                        <th scope="row" className="py-1 pr-3 text-left font-normal">{alt.supplier.name}{alt.supplierItemId === o.supplierItemId ? " (chosen)" : ""}</th>
                                        <td className="py-1 pr-3">{alt.packLabel}{alt.packPrice !== null ? ` at ${amountText(alt.packPrice, currency)}` : ""}</td>
                                        <td className="num py-1 pr-3 text-right">{p ? `${amountText(p.amount, currency)} / ${p.label}` : "no price"}</td>
                                        <td className="num py-1 pr-3 text-right">{alt.supplier.leadTimeDays} d</td>
                                        <td className="num py-1 pr-3 text-right">{q(alt.projected, l)} by {dayText(alt.horizon)}</td>
                                        <td className="num py-1 text-right">{alt.suggested ? alt.packs : "not needed"}</td>
                                      </tr>
                                    );
                                  })}
                                </tbody>
                              </table>
                            ) : null}
                          </td>
                        </tr>
                      ) : null}
                    </Fragment>
                  );
                })}
              </TBody>
            </DataTable>
          </section>
        );
      })}

      {kitchen.unsourced.length ? (
        <section aria-labelledby="unsourced" className="space-y-3">
          <h2 id="unsourced" className="text-xl font-semibold">Below the reorder point, no supplier</h2>
          <p className="text-sm text-brine">
            No active supplier lists these items: add the item to a supplier under <Link href="/purchasing" className="text-paprika underline underline-offset-2">Suppliers</Link>, then come back.
          </p>
          <DataTable caption="Below the reorder point with no supplier">
            <THead>
              <Th>Item</Th>
              <Th numeric>On hand</Th>
              <Th numeric>Projected today</Th>
              <Th numeric>Reorder point</Th>
              <Th numeric>Par</Th>
            </THead>
            <TBody>
              {kitchen.unsourced.map((u) => (
                <tr key={u.item.id}>
                  <RowHeader>
                    <span className="flex flex-wrap items-center gap-2">{u.item.name}{u.item.category === "cure" ? <CureMarker /> : null}</span>
                    <span className="block text-sm font-normal text-brine">{u.item.sku}</span>
                  </RowHeader>
                  <Td numeric>{stockText(u.onHand, u.item, unitSystem)}</Td>
                  <Td numeric>{stockText(u.projectedToday, u.item, unitSystem)}</Td>
                  <Td numeric>{stockText(u.reorderPoint, u.item, unitSystem)}</Td>
                  <Td numeric>{u.parLevel === null ? <span className="text-brine">—</span> : stockText(u.parLevel, u.item, unitSystem)}</Td>
                </tr>
              ))}
            </TBody>
          </DataTable>
        </section>
      ) : null}

      {lines.length ? (
        <div className="panel flex flex-wrap items-center justify-between gap-3 px-4 py-3">
          <p className="text-brine">
            {alreadyMade
              ? "These lines are drafted: change a line to draft again, or approve the drafts from Orders."
              : toOrder.length
              ? `${toOrder.length} ${toOrder.length === 1 ? "line" : "lines"} for ${supplierCount} ${supplierCount === 1 ? "supplier" : "suppliers"}: one draft each, delivered to ${kitchen.kitchen.name}. Figures as of ${dayText(today)}.`
              : "Every line is left out (0 packs)."}
          </p>
          {canManage ? (
            <button type="button" className="btn-primary" disabled={busy || toOrder.length === 0 || alreadyMade} onClick={submit}>
              {busy ? <Loader2 aria-hidden className="h-5 w-5 animate-spin" /> : <ShoppingBasket aria-hidden className="h-5 w-5" />}
              Create draft orders
            </button>
          ) : (
            <p className="text-sm text-brine">Buyers, managers and admins draft the orders.</p>
          )}
        </div>
      ) : null}
    </div>
  );
}

