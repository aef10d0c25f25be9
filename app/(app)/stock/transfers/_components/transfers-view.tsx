"use client";

// Transfer requests of the current kitchen: what others ask of it (fulfil, choosing the lot to
// send, or decline, where the user may fulfil here) and what it asked of others (their status and
// any decline reason), plus "Ask another kitchen".
import { useQuery, useQueryClient } from "@tanstack/react-query";
import { ArrowLeftRight, Loader2, Plus, TriangleAlert } from "lucide-react";
import { useId, useMemo, useRef, useState, type FormEvent, type ReactNode } from "react";
import type { Item } from "@/lib/data/items";
import type { Movement } from "@/lib/data/ledger";
import type { TransferLotChoice, TransferLotChoices, TransferRequest } from "@/lib/data/transfer-requests";
import { apiFetch, jsonInit } from "@/lib/queries/api";
import { ApiError, newIdempotencyKey, stockKeys } from "@/lib/queries/stock";
import { dec, unitsFor, type UnitSystem } from "@/lib/units";
import { CureCaution } from "@/components/cure/cure-caution";
import { DATE_KIND_WORDS, expiryBand, quantityText } from "@/components/stock/stock-rows";
import { Badge } from "@/components/ui/badge";
import { DataTable, RowHeader, TBody, Td, Th, THead } from "@/components/ui/data-table";
import { describedBy, FieldError, FormMessage, StatusRegion, TextField } from "@/components/ui/field";
import { SideSheet, SideSheetFooter } from "@/components/ui/side-sheet";

interface KitchenOption {
  id: string;
  code: string;
  name: string;
}

const send = <T,>(url: string, init?: { method: string; body: unknown; key?: string }): Promise<T> =>
  apiFetch<T>(url, init ? jsonInit(init.method, init.body, init.key ? { "idempotency-key": init.key } : {}) : undefined);

const transferKeys = { kitchen: (code: string) => ["transfer-requests", code.toUpperCase()] as const };

const STATUS_WORDS: Record<TransferRequest["status"], { word: string; className: string }> = {
  open: { word: "Open", className: "border-amber/40 bg-amber-soft text-pepper" },
  fulfilled: { word: "Fulfilled", className: "border-herb/40 bg-herb-soft text-herb" },
  declined: { word: "Declined", className: "border-ember/40 bg-ember-soft text-ember" },
  cancelled: { word: "Cancelled", className: "border-salt-edge bg-salt-deep text-pepper" },
};

function StatusTag({ status }: { status: TransferRequest["status"] }) {
  const s = STATUS_WORDS[status];
  return <span className={`inline-flex rounded-full border px-2.5 py-0.5 text-sm font-semibold ${s.className}`}>{s.word}</span>;
}

export function TransfersView({ kitchen, kitchens, timeZone, unitSystem, canFulfil, canRequest }: {
  kitchen: { code: string; name: string };
  kitchens: KitchenOption[];
  timeZone: string;
  unitSystem: UnitSystem;
  canFulfil: boolean;
  canRequest: boolean;
}) {
  const queryClient = useQueryClient();
  const key = transferKeys.kitchen(kitchen.code);
  const q = useQuery({
    queryKey: key,
    queryFn: () => send<{ requests: TransferRequest[] }>(`/api/transfer-requests?kitchen=${encodeURIComponent(kitchen.code)}`),
    staleTime: 0,
  });
  const [asking, setAsking] = useState(false);
  const [declining, setDeclining] = useState<TransferRequest | null>(null);
  const [fulfilling, setFulfilling] = useState<TransferRequest | null>(null);
  const [notice, setNotice] = useState<{ tone: "success" | "error"; text: string } | null>(null);
  const when = useMemo(() => new Intl.DateTimeFormat("en-GB", { timeZone, dateStyle: "medium", timeStyle: "short" }), [timeZone]);
  const nameOf = (code: string) => kitchens.find((k) => k.code.toUpperCase() === code.toUpperCase())?.name ?? code;
  const here = kitchen.code.toUpperCase();
  const requests = q.data?.requests ?? [];
  const askedOfUs = requests.filter((r) => r.fromKitchen.code.toUpperCase() === here && r.status === "open");
  const askedByUs = requests.filter((r) => r.toKitchen.code.toUpperCase() === here);

  const refresh = async () => {
    await queryClient.invalidateQueries({ queryKey: key });
    await queryClient.invalidateQueries({ queryKey: stockKeys.all });
  };

  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <StatusRegion>{notice?.tone === "success" ? notice.text : null}</StatusRegion>
        {canRequest ? (
          <button type="button" className="btn-primary" onClick={() => setAsking(true)}>
            <Plus aria-hidden className="h-5 w-5" /> Ask another kitchen
          </button>
        ) : null}
      </div>
      {notice?.tone === "error" ? <FormMessage tone="error">{notice.text}</FormMessage> : null}

      {q.isPending ? (
        <p role="status" className="flex items-center gap-2 text-brine">
          <Loader2 aria-hidden className="h-4 w-4 animate-spin" /> Loading the requests…
        </p>
      ) : q.isError ? (
        <FormMessage tone="error">The requests could not be loaded: {q.error.message}</FormMessage>
      ) : (
        <>
          <section aria-labelledby="asked-of-us" className="space-y-2">
            <h2 id="asked-of-us" className="text-xl font-semibold">Asked of this kitchen</h2>
            {askedOfUs.length === 0 ? (
              <p className="text-brine">No open requests from other kitchens.</p>
            ) : (
              <DataTable caption="Open requests other kitchens made of this kitchen">
                <THead>
                  <Th>Item</Th>
                  <Th numeric>Quantity</Th>
                  <Th>Asking kitchen</Th>
                  <Th>Note</Th>
                  <Th>Asked at</Th>
                  {canFulfil ? <Th action /> : null}
                </THead>
                <TBody>
                  {askedOfUs.map((r) => (
                    <tr key={r.id}>
                      <RowHeader>
                        {r.item.sku}
                        <span className="block text-sm font-normal text-brine">{r.item.name}</span>
                      </RowHeader>
                      <Td numeric>{r.enteredQuantity} {r.enteredUnit}</Td>
                      <Td>{nameOf(r.toKitchen.code)}</Td>
                      <Td className="max-w-[14rem] text-sm">{r.note ?? <span className="text-brine">—</span>}</Td>
                      <Td className="whitespace-nowrap text-sm"><time dateTime={r.requestedAt}>{when.format(new Date(r.requestedAt))}</time></Td>
                      {canFulfil ? (
                        <Td action>
                          <div className="flex justify-end gap-2">
                            <button
                              type="button"
                              className="btn-primary"
                              aria-label={`Fulfil ${r.item.sku} for ${nameOf(r.toKitchen.code)}`}
                              onClick={() => {
                                setNotice(null);
                                setFulfilling(r);
                              }}
                            >
                              Fulfil
                            </button>
                            <button
                              type="button"
                              className="btn-quiet"
                              aria-label={`Decline ${r.item.sku} for ${nameOf(r.toKitchen.code)}`}
                              onClick={() => {
                                setNotice(null);
                                setDeclining(r);
                              }}
                            >
                              Decline
                            </button>
                          </div>
                        </Td>
                      ) : null}
                    </tr>
                  ))}
                </TBody>
              </DataTable>
            )}
          </section>

          <section aria-labelledby="asked-by-us" className="space-y-2">
            <h2 id="asked-by-us" className="text-xl font-semibold">Asked by this kitchen</h2>
            {askedByUs.length === 0 ? (
              <p className="text-brine">This kitchen has not asked another for stock yet.{canRequest ? " Use “Ask another kitchen” to ask." : ""}</p>
            ) : (
              <DataTable caption="Requests this kitchen made of other kitchens">
                <THead>
                  <Th>Item</Th>
                  <Th numeric>Quantity</Th>
                  <Th>Kitchen asked</Th>
                  <Th>Status</Th>
                  <Th>Asked at</Th>
                  <Th>Decline reason</Th>
                </THead>
                <TBody>
                  {askedByUs.map((r) => (
                    <tr key={r.id}>
                      <RowHeader>
                        {r.item.sku}
                        <span className="block text-sm font-normal text-brine">{r.item.name}</span>
                      </RowHeader>
                      <Td numeric>{r.enteredQuantity} {r.enteredUnit}</Td>
                      <Td>{nameOf(r.fromKitchen.code)}</Td>
                      <Td><StatusTag status={r.status} /></Td>
                      <Td className="whitespace-nowrap text-sm"><time dateTime={r.requestedAt}>{when.format(new Date(r.requestedAt))}</time></Td>
                      <Td className="max-w-[14rem] text-sm">{r.declineReason ?? <span className="text-brine">—</span>}</Td>
                    </tr>
                  ))}
                </TBody>
              </DataTable>
            )}
          </section>
        </>
      )}

      {canRequest ? (
        <SideSheet open={asking} onClose={() => setAsking(false)} title="Ask another kitchen" description={`Stock for ${kitchen.name}, sent by the kitchen you ask.`}>
          <AskForm
            kitchen={kitchen}
            others={kitchens.filter((k) => k.code.toUpperCase() !== here)}
            onCancel={() => setAsking(false)}
            onDone={async (text) => {
              setAsking(false);
              await refresh();
              setNotice({ tone: "success", text });
            }}
          />
        </SideSheet>
      ) : null}

      {canFulfil ? (
        <SideSheet
          open={fulfilling !== null}
          onClose={() => setFulfilling(null)}
          title={fulfilling ? `Fulfil ${fulfilling.item.sku}` : "Fulfil"}
          description={fulfilling ? `${fulfilling.enteredQuantity} ${fulfilling.enteredUnit} asked by ${nameOf(fulfilling.toKitchen.code)}` : undefined}
        >
          {fulfilling ? (
            <FulfilForm
              request={fulfilling}
              toName={nameOf(fulfilling.toKitchen.code)}
              unitSystem={unitSystem}
              onCancel={() => setFulfilling(null)}
              onClosed={async (text) => {
                setFulfilling(null);
                await refresh();
                setNotice({ tone: "error", text });
              }}
              onDone={async (text) => {
                setFulfilling(null);
                await refresh();
                setNotice({ tone: "success", text });
              }}
            />
          ) : null}
        </SideSheet>
      ) : null}

      {canFulfil ? (
        <SideSheet
          open={declining !== null}
          onClose={() => setDeclining(null)}
          title={declining ? `Decline ${declining.item.sku}` : "Decline"}
          description={declining ? `${declining.enteredQuantity} ${declining.enteredUnit} asked by ${nameOf(declining.toKitchen.code)}` : undefined}
        >
          {declining ? (
            <DeclineForm
              request={declining}
              onCancel={() => setDeclining(null)}
              onDone={async (text) => {
                setDeclining(null);
                await refresh();
                setNotice({ tone: "success", text });
              }}
            />
          ) : null}
        </SideSheet>
      ) : null}
    </div>
  );
}

const dayFormat = new Intl.DateTimeFormat("en-GB", { timeZone: "UTC", day: "numeric", month: "short", year: "numeric" });
const formatDay = (d: string) => dayFormat.format(new Date(Date.UTC(Number(d.slice(0, 4)), Number(d.slice(5, 7)) - 1, Number(d.slice(8, 10)))));

/** "use by 12 Mar 2027 · 40 days left", "best before 2 Jan 2027 · expired 3 days ago", "no date". */
function lotDateText(l: TransferLotChoice): string {
  if (!l.date) return `received ${formatDay(l.receivedOn)} · no date`;
  const d = l.daysLeft ?? 0;
  const left = d < 0 ? `expired ${-d === 1 ? "1 day" : `${-d} days`} ago` : d === 0 ? "last day today" : `${d === 1 ? "1 day" : `${d} days`} left`;
  return `${l.dateKind ? DATE_KIND_WORDS[l.dateKind] : "dated"} ${formatDay(l.date)} · ${left}`;
}

/** The expiry band as a word (the days are spelled out beside it): herb, amber within 30 days, ember once past. */
function expiryBadge(days: number): { tone: "herb" | "amber" | "ember"; word: string } {
  const tone = expiryBand(days).tone;
  if (tone === "ember") return { tone, word: "expired" };
  if (tone === "amber") return { tone, word: "expires soon" };
  return { tone: "herb", word: "in date" };
}

const FEFO = "fefo";

/**
 * Fulfils a request: first expired, first out (the suggested draw, shown lot by lot) or a lot of
 * the sending kitchen's choosing. One Idempotency-Key per attempt at one choice, so a retry after
 * a lost answer cannot send twice; a new choice or a definite answer starts a new key.
 */
function FulfilForm({ request, toName, unitSystem, onCancel, onDone, onClosed }: {
  request: TransferRequest;
  toName: string;
  unitSystem: UnitSystem;
  onCancel: () => void;
  onDone: (text: string) => Promise<void>;
  /** The request was closed meanwhile (fulfilled or declined by someone else). */
  onClosed: (text: string) => Promise<void>;
}) {
  const id = useId().replace(/:/g, "");
  const choices = useQuery({
    queryKey: ["transfer-requests", "lots", request.id],
    queryFn: () => send<TransferLotChoices>(`/api/transfer-requests/${request.id}/lots`),
    staleTime: 0,
  });
  const [choice, setChoice] = useState(FEFO);
  const [fields, setFields] = useState<Record<string, string[]>>({});
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const key = useRef<string | null>(null);

  const c = choices.data;
  const qty = (value: string) => (c ? quantityText(value, c.item, unitSystem).main : value);
  const asked = dec(request.quantity);
  const chosen = c?.lots.find((l) => l.lotId === choice);
  const fefoShort = c ? dec(c.fefo.short).gt(0) : false;
  const totalAvailable = c ? c.lots.reduce((sum, l) => sum.plus(dec(l.available)), dec("0")).toFixed() : "0";

  const choose = (value: string) => {
    setChoice(value);
    setFields({});
    setError(null);
    key.current = null;
  };

  const submit = async (e: FormEvent) => {
    e.preventDefault();
    if (busy) return;
    setBusy(true);
    setError(null);
    setFields({});
    key.current ??= newIdempotencyKey();
    try {
      const done = await send<{ request: TransferRequest; movements: Movement[] }>(`/api/transfer-requests/${request.id}/fulfil`, {
        method: "POST",
        body: choice === FEFO ? {} : { lot: choice },
        key: key.current,
      });
      key.current = null;
      const lots = [...new Set(done.movements.filter((m) => dec(m.delta).lt(0)).map((m) => m.lot.code))];
      const from = c?.item.trackLots && lots.length ? ` (${lots.length === 1 ? "lot" : "lots"} ${lots.join(", ")})` : "";
      await onDone(`Sent ${request.enteredQuantity} ${request.enteredUnit} of ${request.item.sku} to ${toName}${from}.`);
    } catch (e2) {
      if (!(e2 instanceof ApiError) || e2.status === 0) {
        // the answer was lost: the same key makes a retry safe
        setError(`Not fulfilled: ${e2 instanceof Error ? e2.message : "something went wrong."} Try again; it cannot be sent twice.`);
        return;
      }
      key.current = null;
      if (e2.code === "REQUEST_CLOSED") {
        await onClosed(`The request for ${request.item.sku} was not fulfilled: ${e2.message}`);
        return;
      }
      if (e2.fields.lot) setFields({ lot: e2.fields.lot });
      else if (e2.code === "INSUFFICIENT_STOCK") {
        const a = typeof e2.details.available === "string" ? e2.details.available : null;
        setError(`Not fulfilled: not enough stock here.${a !== null && c ? ` Only ${qty(a)} available${choice === FEFO ? " in date" : ""}.` : ""}`);
      } else setError(`Not fulfilled: ${e2.message}`);
      await choices.refetch();
    } finally {
      setBusy(false);
    }
  };

  if (choices.isPending) {
    return (
      <p role="status" className="flex items-center gap-2 text-brine">
        <Loader2 aria-hidden className="h-4 w-4 animate-spin" /> Loading this kitchen&rsquo;s lots…
      </p>
    );
  }
  if (choices.isError) {
    return (
      <div className="space-y-5">
        <FormMessage tone="error">The lots could not be loaded: {choices.error.message}</FormMessage>
        <SideSheetFooter>
          <button type="button" className="btn-quiet" onClick={onCancel}>Cancel</button>
          <button type="button" className="btn-primary" onClick={() => void choices.refetch()}>Try again</button>
        </SideSheetFooter>
      </div>
    );
  }
  const data = choices.data;
  // in-date lots first (in the order the draw takes them), expired ones after
  const lotOptions = data.item.trackLots ? [...data.lots.filter((l) => !l.expired), ...data.lots.filter((l) => l.expired)] : [];

  return (
    <form onSubmit={(e) => void submit(e)} noValidate className="space-y-5">
      {data.item.cure ? <CureCaution /> : null}
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
        <dt className="text-brine">Asked for</dt>
        <dd className="num font-semibold tabular-nums">{qty(request.quantity)}</dd>
        <dt className="text-brine">Available here</dt>
        <dd className="num font-semibold tabular-nums">{qty(totalAvailable)}</dd>
        {request.note ? (
          <>
            <dt className="text-brine">Note</dt>
            <dd>{request.note}</dd>
          </>
        ) : null}
      </dl>

      {!data.item.trackLots ? (
        <p className="text-sm text-pepper-soft">
          {data.item.sku} is not tracked by lot: the oldest stock here goes first.
          {fefoShort ? <span className="mt-1 block font-semibold text-ember">{qty(data.fefo.short)} short.</span> : null}
        </p>
      ) : (
        <fieldset aria-describedby={fields.lot?.length ? `${id}-lot-error` : undefined}>
          <legend className="field-label">Lot to send</legend>
          <div className="mt-1 space-y-2">
            <ChoiceCard
              name={`${id}-lot`}
              value={FEFO}
              checked={choice === FEFO}
              onChange={choose}
              autoFocus
              title="First expired, first out (suggested)"
            >
              {data.fefo.takes.length ? (
                <span>
                  Takes {data.fefo.takes.map((t) => `${qty(t.quantity)} from lot ${t.code}`).join(", then ")}.
                </span>
              ) : (
                <span>No lot in date has stock here.</span>
              )}
              {fefoShort ? (
                <span className="mt-1 flex items-start gap-1 font-semibold text-ember">
                  <TriangleAlert aria-hidden className="mt-0.5 h-4 w-4 shrink-0" />
                  {qty(data.fefo.short)} short{data.lots.some((l) => l.expired) ? ": expired lots go only when named below" : ""}.
                </span>
              ) : data.lots.some((l) => l.expired) ? (
                <span className="mt-1 block">Expired lots are skipped.</span>
              ) : null}
            </ChoiceCard>
            {lotOptions.map((l) => {
              const enough = dec(l.available).gte(asked);
              const band = l.daysLeft === null ? null : expiryBadge(l.daysLeft);
              return (
                <ChoiceCard
                  key={l.lotId}
                  name={`${id}-lot`}
                  value={l.lotId}
                  checked={choice === l.lotId}
                  onChange={choose}
                  disabled={!enough}
                  title={`Lot ${l.code}`}
                  badge={band ? <Badge tone={band.tone}>{band.word}</Badge> : null}
                >
                  <span className="block">{lotDateText(l)}</span>
                  <span className="num block tabular-nums">
                    {qty(l.available)} available{enough ? "" : ": less than asked"}
                  </span>
                </ChoiceCard>
              );
            })}
          </div>
          <FieldError id={`${id}-lot`} errors={fields.lot} />
        </fieldset>
      )}
      {!data.item.trackLots ? <FieldError id={`${id}-lot`} errors={fields.lot} /> : null}

      {chosen?.expired ? (
        <p role="note" className="flex items-start gap-2 rounded-md border border-ember/30 bg-ember-soft px-3 py-2 text-sm font-medium text-ember">
          <TriangleAlert aria-hidden className="mt-0.5 h-4 w-4 shrink-0" />
          <span>Lot {chosen.code} expired on {formatDay(chosen.date!)}. {toName} will not be able to use it, only waste it.</span>
        </p>
      ) : null}

      {error ? <FormMessage tone="error">{error}</FormMessage> : null}
      <SideSheetFooter>
        <button type="button" className="btn-quiet" onClick={onCancel}>Cancel</button>
        <button type="submit" className="btn-primary" disabled={busy}>
          {busy ? <Loader2 aria-hidden className="h-5 w-5 animate-spin" /> : <ArrowLeftRight aria-hidden className="h-5 w-5" />}
          Send to {toName}
        </button>
      </SideSheetFooter>
    </form>
  );
}

/** One choice of the lot list: a radio with its title, badge and details, the whole card clickable. */
function ChoiceCard({ name, value, checked, onChange, disabled, autoFocus, title, badge, children }: {
  name: string;
  value: string;
  checked: boolean;
  onChange: (value: string) => void;
  disabled?: boolean;
  autoFocus?: boolean;
  title: string;
  badge?: ReactNode;
  children: ReactNode;
}) {
  return (
    <label
      className={`flex min-h-touch items-start gap-3 rounded-md border px-3 py-2 ${
        disabled ? "cursor-not-allowed border-salt-edge bg-salt-deep" : checked ? "cursor-pointer border-paprika bg-paprika-soft" : "cursor-pointer border-salt-edge bg-white"
      }`}
    >
      <input
        type="radio"
        name={name}
        value={value}
        checked={checked}
        disabled={disabled}
        data-autofocus={autoFocus ? "" : undefined}
        onChange={() => onChange(value)}
        className="mt-1 h-5 w-5 shrink-0 accent-paprika"
      />
      <span className="min-w-0 flex-1">
        <span className="flex flex-wrap items-center gap-2 font-semibold text-pepper">
          {title}
          {badge}
        </span>
        <span className="mt-0.5 block text-sm text-pepper-soft">{children}</span>
      </span>
    </label>
  );
}

function DeclineForm({ request, onCancel, onDone }: { request: TransferRequest; onCancel: () => void; onDone: (text: string) => Promise<void> }) {
  const [reason, setReason] = useState("");
  const [fields, setFields] = useState<Record<string, string[]>>({});
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const submit = async (e: FormEvent) => {
    e.preventDefault();
    if (busy) return;
    setBusy(true);
    setError(null);
    setFields({});
    try {
      await send(`/api/transfer-requests/${request.id}/decline`, { method: "POST", body: { reason: reason.trim() } });
      await onDone(`Declined the request for ${request.item.sku}.`);
    } catch (e2) {
      if (e2 instanceof ApiError && Object.keys(e2.fields).length) setFields(e2.fields);
      else setError(`Not declined: ${e2 instanceof Error ? e2.message : "something went wrong."}`);
    } finally {
      setBusy(false);
    }
  };
  return (
    <form onSubmit={(e) => void submit(e)} noValidate className="space-y-5">
      <div>
        <label htmlFor="decline-reason" className="field-label">Reason</label>
        <textarea
          id="decline-reason"
          name="reason"
          rows={3}
          maxLength={500}
          className="field-input"
          data-autofocus=""
          value={reason}
          onChange={(e) => setReason(e.target.value)}
          required
          {...describedBy("decline-reason", fields.reason)}
        />
        <FieldError id="decline-reason" errors={fields.reason} />
      </div>
      {error ? <FormMessage tone="error">{error}</FormMessage> : null}
      <SideSheetFooter>
        <button type="button" className="btn-quiet" onClick={onCancel}>Cancel</button>
        <button type="submit" className="btn-primary" disabled={busy}>
          {busy ? <Loader2 aria-hidden className="h-5 w-5 animate-spin" /> : null}
          Decline request
        </button>
      </SideSheetFooter>
    </form>
  );
}

function AskForm({ kitchen, others, onCancel, onDone }: {
  kitchen: { code: string; name: string };
  others: KitchenOption[];
  onCancel: () => void;
  onDone: (text: string) => Promise<void>;
}) {
  const items = useQuery({ queryKey: ["items", "active"], queryFn: () => send<{ items: Item[] }>("/api/items"), staleTime: 60_000 });
  const [itemId, setItemId] = useState("");
  const [quantity, setQuantity] = useState("");
  const [unit, setUnit] = useState("");
  const [from, setFrom] = useState(others.length === 1 ? others[0]!.code : "");
  const [note, setNote] = useState("");
  const [fields, setFields] = useState<Record<string, string[]>>({});
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  const list = (items.data?.items ?? []).filter((i) => !i.archived);
  const item = list.find((i) => i.id === itemId);
  const units = useMemo(() => {
    if (!item) return [];
    try {
      return unitsFor(item.itemUnits).map((c) => ({ unit: c.unit, label: c.label }));
    } catch {
      return [{ unit: item.stockUnit, label: item.stockUnit }];
    }
  }, [item]);

  const submit = async (e: FormEvent) => {
    e.preventDefault();
    if (busy) return;
    setBusy(true);
    setError(null);
    setFields({});
    const body = {
      fromKitchen: from,
      toKitchen: kitchen.code,
      item: itemId,
      quantity: quantity.trim().replace(",", "."),
      unit: unit || units[0]?.unit || "",
      ...(note.trim() ? { note: note.trim() } : {}),
    };
    try {
      await send("/api/transfer-requests", { method: "POST", body, key: newIdempotencyKey() });
      const label = units.find((u) => u.unit === body.unit)?.label ?? body.unit;
      await onDone(`Asked ${others.find((k) => k.code === from)?.name ?? from} for ${body.quantity} ${label} of ${item?.sku ?? "the item"}.`);
    } catch (e2) {
      if (e2 instanceof ApiError && Object.keys(e2.fields).length) {
        setFields(e2.fields);
        const unplaced = Object.keys(e2.fields).filter((k) => !["item", "quantity", "unit", "fromKitchen", "note"].includes(k));
        setError(unplaced.length ? `Not asked: ${e2.fields[unplaced[0]!]?.[0] ?? e2.message}` : "Not asked: check the fields marked below.");
      } else {
        setError(`Not asked: ${e2 instanceof Error ? e2.message : "something went wrong."}`);
      }
    } finally {
      setBusy(false);
    }
  };

  return (
    <form onSubmit={(e) => void submit(e)} noValidate className="space-y-5">
      <div>
        <label htmlFor="ask-item" className="field-label">Item</label>
        <select
          id="ask-item"
          name="item"
          className="field-input"
          data-autofocus=""
          value={itemId}
          onChange={(e) => {
            setItemId(e.target.value);
            setUnit("");
          }}
          required
          {...describedBy("ask-item", fields.item)}
        >
          <option value="">{items.isPending ? "Loading items…" : "Choose an item"}</option>
          {list.map((i) => <option key={i.id} value={i.id}>{i.sku} · {i.name}</option>)}
        </select>
        <FieldError id="ask-item" errors={fields.item} />
        {items.isError ? <FormMessage tone="error">The items could not be loaded: {items.error.message}</FormMessage> : null}
      </div>
      {item?.cure ? <CureCaution /> : null}

      <div className="grid grid-cols-[1fr_auto] gap-3">
        <TextField
          name="quantity"
          id="ask-quantity"
          label="Quantity"
          inputMode="decimal"
          autoComplete="off"
          value={quantity}
          onChange={(e) => setQuantity(e.target.value)}
          errors={fields.quantity}
          required
        />
        <div>
          <label htmlFor="ask-unit" className="field-label">Unit</label>
          <select
            id="ask-unit"
            name="unit"
            className="field-input"
            value={unit || units[0]?.unit || ""}
            onChange={(e) => setUnit(e.target.value)}
            disabled={!item}
            {...describedBy("ask-unit", fields.unit)}
          >
            {item ? units.map((u) => <option key={u.unit} value={u.unit}>{u.label}</option>) : <option value="">—</option>}
          </select>
          <FieldError id="ask-unit" errors={fields.unit} />
        </div>
      </div>

      <div>
        <label htmlFor="ask-from" className="field-label">Kitchen to ask</label>
        <select
          id="ask-from"
          name="fromKitchen"
          className="field-input"
          value={from}
          onChange={(e) => setFrom(e.target.value)}
          required
          {...describedBy("ask-from", fields.fromKitchen)}
        >
          <option value="">Choose a kitchen</option>
          {others.map((k) => <option key={k.id} value={k.code}>{k.name} ({k.code})</option>)}
        </select>
        <FieldError id="ask-from" errors={fields.fromKitchen} />
      </div>

      <div>
        <label htmlFor="ask-note" className="field-label">Note (optional)</label>
        <textarea
          id="ask-note"
          name="note"
          rows={3}
          maxLength={500}
          className="field-input"
          value={note}
          onChange={(e) => setNote(e.target.value)}
          {...describedBy("ask-note", fields.note)}
        />
        <FieldError id="ask-note" errors={fields.note} />
      </div>

      {error ? <FormMessage tone="error">{error}</FormMessage> : null}
      <SideSheetFooter>
        <button type="button" className="btn-quiet" onClick={onCancel}>Cancel</button>
        <button type="submit" className="btn-primary" disabled={busy}>
          {busy ? <Loader2 aria-hidden className="h-5 w-5 animate-spin" /> : <ArrowLeftRight aria-hidden className="h-5 w-5" />}
          Send request
        </button>
      </SideSheetFooter>
    </form>
  );
}
