"use client";

// The reconciliation table: one row per line of the note with what it matched on the order and
// what was found, and per line Accept / Reject / Correct. Every change answers the whole delivery
// (the findings are worked out again on the server), which replaces what is shown.
import Link from "next/link";
import { useState, type FormEvent } from "react";
import { CureCaution } from "@/components/cure/cure-caution";
import { CureMarker } from "@/components/cure/cure-marker";
import { ScanField } from "@/components/purchasing/scan-field";
import { Badge } from "@/components/ui/badge";
import { FormMessage } from "@/components/ui/field";
import { FINDING_LABELS, type DeliveryFinding } from "@/lib/purchasing/delivery-findings";
import {
  addDeliveryLine, ApiError, attachDeliveryDocument, postDelivery, updateDelivery, updateDeliveryLine, type Delivery,
} from "@/lib/queries/deliveries";
import type { Gs1Label } from "@/lib/queries/gs1";

type Line = Delivery["lines"][number];
const TONE: Record<DeliveryFinding, "herb" | "amber" | "ember" | "neutral"> = {
  as_ordered: "herb", short: "amber", over: "amber", different_item: "amber", not_on_order: "amber", price_differs: "amber",
  lot_missing: "amber", date_missing: "amber", expired: "ember", short_dated: "amber",
};
const DATE_KIND_WORDS = { use_by: "use by", best_before: "best before" } as const;

function Findings({ findings }: { findings: DeliveryFinding[] }) {
  return (
    <ul className="flex flex-wrap gap-1" aria-label="Findings">
      {findings.map((f) => <li key={f}><Badge tone={TONE[f]}>{FINDING_LABELS[f]}</Badge></li>)}
    </ul>
  );
}

function Correction({ line, supplierItems, onSave, onCancel, busy }: {
  line: Line; supplierItems: { id: string; label: string }[]; busy: boolean;
  onSave: (c: Record<string, string | null>) => void; onCancel: () => void;
}) {
  const [item, setItem] = useState(line.supplierItem?.id ?? "");
  const [quantity, setQuantity] = useState(line.quantity);
  const [price, setPrice] = useState(line.unitPrice ?? "");
  const [lot, setLot] = useState(line.lot ?? "");
  const [date, setDate] = useState(line.date ?? "");
  const [dateKind, setDateKind] = useState<string>(line.dateKind ?? "use_by");
  const p = `fix-${line.lineNo}`;
  function save(e: FormEvent) {
    e.preventDefault();
    const c: Record<string, string | null> = {};
    if (item && item !== line.supplierItem?.id) c.supplierItem = item;
    if (quantity !== line.quantity) c.quantity = quantity.trim();
    if (price && price !== line.unitPrice) c.unitPrice = price.trim();
    if (lot.trim() !== (line.lot ?? "")) c.lot = lot.trim() || null;
    if (date !== (line.date ?? "")) c.date = date || null;
    if (date && dateKind !== line.dateKind) c.dateKind = dateKind;
    onSave(c);
  }
  return (
    <form onSubmit={save} className="grid gap-3 rounded-md border border-brine-line bg-salt px-3 py-3 sm:grid-cols-3" aria-label={`Correct line ${line.lineNo}`}>
      <div className="sm:col-span-3">
        <label htmlFor={`${p}-item`} className="field-label">Item</label>
        <select id={`${p}-item`} className="field-input" value={item} onChange={(e) => setItem(e.target.value)}>
          <option value="">Choose the supplier item</option>
          {supplierItems.map((s) => <option key={s.id} value={s.id}>{s.label}</option>)}
        </select>
      </div>
      <div><label htmlFor={`${p}-qty`} className="field-label">Packs</label><input id={`${p}-qty`} className="field-input" inputMode="decimal" value={quantity} onChange={(e) => setQuantity(e.target.value)} /></div>
      <div><label htmlFor={`${p}-price`} className="field-label">Price per pack</label><input id={`${p}-price`} className="field-input" inputMode="decimal" value={price} onChange={(e) => setPrice(e.target.value)} /></div>
      <div><label htmlFor={`${p}-lot`} className="field-label">Lot</label><input id={`${p}-lot`} className="field-input" value={lot} onChange={(e) => setLot(e.target.value)} /></div>
      <div><label htmlFor={`${p}-date`} className="field-label">Date</label><input id={`${p}-date`} type="date" className="field-input" value={date} onChange={(e) => setDate(e.target.value)} /></div>
      <div>
        <label htmlFor={`${p}-kind`} className="field-label">Kind of date</label>
        <select id={`${p}-kind`} className="field-input" value={dateKind} onChange={(e) => setDateKind(e.target.value)}>
          <option value="use_by">Use by</option><option value="best_before">Best before</option>
        </select>
      </div>
      <div className="flex items-end justify-end gap-2">
        <button type="button" className="btn-quiet" onClick={onCancel}>Cancel</button>
        <button type="submit" className="btn-primary" disabled={busy}>Save correction</button>
      </div>
    </form>
  );
}

export function Reconciliation({ initial, supplierItems }: { initial: Delivery; supplierItems: { id: string; label: string; gtin: string | null }[] }) {
  const [d, setD] = useState(initial);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<ApiError | null>(null);
  const [message, setMessage] = useState<string | null>(null);
  const [editing, setEditing] = useState<string | null>(null);
  const [postKey, setPostKey] = useState(() => crypto.randomUUID());
  const [noteNumber, setNoteNumber] = useState(d.noteNumber ?? "");
  const [freight, setFreight] = useState(d.freight);
  const [scan, setScan] = useState<{ gtin: string; lot: string; date: string; dateKind: string; quantity: string; sku: string }>({ gtin: "", lot: "", date: "", dateKind: "use_by", quantity: "1", sku: "" });
  const draft = d.status === "draft";

  async function run(fn: () => Promise<Delivery>, done?: string) {
    setBusy(true);
    setError(null);
    setMessage(null);
    try {
      const next = await fn();
      setD(next);
      if (done) setMessage(done);
      return true;
    } catch (e) {
      setError(e instanceof ApiError ? e : new ApiError(0, "ERROR", "That did not work. Try again."));
      return false;
    } finally {
      setBusy(false);
    }
  }

  const decide = (l: Line, decision: "accept" | "reject" | "pending") => run(() => updateDeliveryLine(d.id, l.id, { decision }));
  const correct = async (l: Line, corrections: Record<string, string | null>) => {
    if (await run(() => updateDeliveryLine(d.id, l.id, { corrections }), `Line ${l.lineNo} corrected.`)) setEditing(null);
  };
  function onDecoded(label: Gs1Label) {
    setScan((s) => ({
      ...s, gtin: label.gtin ?? label.containedGtin ?? s.gtin, lot: label.lot ?? s.lot,
      date: label.expiry ?? label.bestBefore ?? s.date, dateKind: label.expiry ? "use_by" : label.bestBefore ? "best_before" : s.dateKind,
    }));
  }
  async function addScanned(e: FormEvent) {
    e.preventDefault();
    const body: Record<string, unknown> = { source: scan.gtin ? "scan" : "keyed", quantity: scan.quantity.trim() };
    if (scan.gtin) body.gtin = scan.gtin;
    if (scan.sku.trim()) body.sku = scan.sku.trim();
    if (scan.lot.trim()) body.lot = scan.lot.trim();
    if (scan.date) { body.date = scan.date; body.dateKind = scan.dateKind; }
    if (await run(() => addDeliveryLine(d.id, body, crypto.randomUUID()), "Line added.")) setScan({ gtin: "", lot: "", date: "", dateKind: "use_by", quantity: "1", sku: "" });
  }
  async function saveHead(e: FormEvent) {
    e.preventDefault();
    await run(() => updateDelivery(d.id, { ...(noteNumber.trim() ? { noteNumber: noteNumber.trim() } : {}), freight: freight.trim() || "0" }), "Saved.");
  }
  async function attach(file: File | undefined) {
    if (!file) return;
    const form = new FormData();
    form.set("file", file);
    await run(() => attachDeliveryDocument(d.id, form), "Delivery note attached.");
  }
  async function post() {
    // the key is kept only for a retry after a lost answer: a refusal (4xx) is stored under it, so
    // the next try after settling the lines needs a new one
    await run(async () => {
      try {
        return await postDelivery(d.id, postKey);
      } catch (e) {
        if (e instanceof ApiError && e.status >= 400 && e.status < 500) setPostKey(crypto.randomUUID());
        throw e;
      }
    }, "Booked into stock.");
  }

  // the attached PDF or photo, opened by the browser in a tab of its own (GET /api/deliveries/{id}/document)
  const paperNoteLink = d.document ? (
    <a href={`/api/deliveries/${d.id}/document`} target="_blank" rel="noopener" className="text-paprika underline underline-offset-2">View the paper note</a>
  ) : null;

  return (
    <div className="flex flex-col gap-5">
      {d.cureCaution ? <CureCaution /> : null}
      {error ? <FormMessage tone="error">{error.message}</FormMessage> : null}
      <p role="status" aria-live="polite" className="min-h-[1.25rem] text-sm text-herb">{message}</p>

      {draft ? (
        <form onSubmit={saveHead} className="panel flex flex-wrap items-end gap-4 px-5 py-4" aria-label="Note details">
          <div><label htmlFor="dl-number" className="field-label">Delivery note number</label><input id="dl-number" className="field-input" value={noteNumber} onChange={(e) => setNoteNumber(e.target.value)} /></div>
          <div><label htmlFor="dl-freight" className="field-label">Freight on the note ({d.currency})</label><input id="dl-freight" className="field-input max-w-[10rem]" inputMode="decimal" value={freight} onChange={(e) => setFreight(e.target.value)} /></div>
          <button type="submit" className="btn-quiet" disabled={busy}>Save</button>
          <div>
            <label htmlFor="dl-document" className="field-label">The paper note (PDF or photo)</label>
            <input id="dl-document" type="file" accept=".pdf,.jpg,.jpeg,.png,.heic,.webp,application/pdf,image/*" className="field-input" onChange={(e) => attach(e.target.files?.[0])} />
          </div>
          {d.document ? <p className="text-sm text-brine">Attached: {d.document.filename} · {paperNoteLink}</p> : null}
        </form>
      ) : (
        <section className="panel flex flex-wrap items-center gap-4 px-5 py-4" aria-label="Booked">
          <Badge tone="herb">Booked</Badge>
          <p className="text-sm">Booked into {d.kitchen.name} on {d.postedAt?.slice(0, 10)} by {d.postedBy?.name}. Freight {d.freight} {d.currency}.</p>
          {d.document ? paperNoteLink : null}
          <Link href="/stock" className="btn-quiet">Open the stock grid</Link>
        </section>
      )}

      <div className="overflow-x-auto">
        <table className="w-full border-collapse text-sm" aria-label="Lines of the delivery note">
          <thead>
            <tr className="border-b border-brine-line text-left text-brine">
              <th scope="col" className="px-2 py-2">#</th>
              <th scope="col" className="px-2 py-2">Delivered</th>
              <th scope="col" className="px-2 py-2 text-right">Packs</th>
              <th scope="col" className="px-2 py-2 text-right">In stock units</th>
              <th scope="col" className="px-2 py-2">On the order</th>
              <th scope="col" className="px-2 py-2 text-right">Price per pack</th>
              <th scope="col" className="px-2 py-2">Lot and date</th>
              <th scope="col" className="px-2 py-2">Found</th>
              <th scope="col" className="px-2 py-2">Decision</th>
            </tr>
          </thead>
          <tbody>
            {d.lines.map((l) => (
              <FragmentRow key={l.id} l={l} draft={draft} busy={busy} editing={editing === l.id}
                onAccept={() => decide(l, "accept")} onReject={() => decide(l, "reject")} onUndo={() => decide(l, "pending")}
                onEdit={() => setEditing(editing === l.id ? null : l.id)}
                correction={<Correction line={l} supplierItems={supplierItems} busy={busy} onSave={(c) => correct(l, c)} onCancel={() => setEditing(null)} />}
              />
            ))}
          </tbody>
        </table>
      </div>

      {draft ? (
        <form onSubmit={addScanned} className="panel grid gap-4 px-5 py-4 md:grid-cols-2" aria-label="Add a line">
          <div className="md:col-span-2"><ScanField label="Scan a case label to add a line" onDecoded={onDecoded} /></div>
          <div><label htmlFor="add-gtin" className="field-label">GTIN</label><input id="add-gtin" className="field-input" value={scan.gtin} onChange={(e) => setScan({ ...scan, gtin: e.target.value })} /></div>
          <div><label htmlFor="add-sku" className="field-label">or the supplier&apos;s SKU</label><input id="add-sku" className="field-input" value={scan.sku} onChange={(e) => setScan({ ...scan, sku: e.target.value })} /></div>
          <div><label htmlFor="add-qty" className="field-label">Packs</label><input id="add-qty" className="field-input" inputMode="decimal" value={scan.quantity} onChange={(e) => setScan({ ...scan, quantity: e.target.value })} /></div>
          <div><label htmlFor="add-lot" className="field-label">Lot</label><input id="add-lot" className="field-input" value={scan.lot} onChange={(e) => setScan({ ...scan, lot: e.target.value })} /></div>
          <div><label htmlFor="add-date" className="field-label">Date</label><input id="add-date" type="date" className="field-input" value={scan.date} onChange={(e) => setScan({ ...scan, date: e.target.value })} /></div>
          <div>
            <label htmlFor="add-kind" className="field-label">Kind of date</label>
            <select id="add-kind" className="field-input" value={scan.dateKind} onChange={(e) => setScan({ ...scan, dateKind: e.target.value })}>
              <option value="use_by">Use by</option><option value="best_before">Best before</option>
            </select>
          </div>
          <div className="flex items-end justify-end md:col-span-2"><button type="submit" className="btn-quiet" disabled={busy}>Add the line</button></div>
        </form>
      ) : null}

      {draft ? (
        <div className="flex flex-wrap items-center justify-end gap-3">
          <p className="text-sm text-brine">{d.counts.pending ? `${d.counts.pending} line${d.counts.pending === 1 ? "" : "s"} still to settle.` : "Every line is settled."}</p>
          <button type="button" className="btn-primary" onClick={post} disabled={busy}>Book into stock</button>
        </div>
      ) : null}
    </div>
  );
}

function FragmentRow({ l, draft, busy, editing, onAccept, onReject, onUndo, onEdit, correction }: {
  l: Line; draft: boolean; busy: boolean; editing: boolean; onAccept: () => void; onReject: () => void; onUndo: () => void; onEdit: () => void; correction: React.ReactNode;
}) {
  const cure = l.item?.category === "cure";
  return (
    <>
      <tr className="border-b border-brine-line align-top" data-line={l.lineNo}>
        <td className="px-2 py-2 tabular-nums">{l.lineNo}</td>
        <th scope="row" className="px-2 py-2 text-left font-normal">
          <span className="font-semibold">{l.supplierItem?.sku ?? l.noted.sku ?? l.noted.gtin}</span> {cure ? <CureMarker /> : null}
          <span className="block text-brine">{l.item ? `${l.item.name} · ${l.supplierItem?.packLabel}` : (l.noted.description ?? "Unknown to this supplier's list")}</span>
        </th>
        <td className="px-2 py-2 text-right tabular-nums">{l.quantity}</td>
        <td className="px-2 py-2 text-right tabular-nums">{l.quantityStock ? `${l.quantityStock} ${l.item?.stockUnit}` : "—"}</td>
        <td className="px-2 py-2">{l.orderLine ? <>{l.orderLine.orderNumber} line {l.orderLine.lineNo}<span className="block text-brine tabular-nums">still to come {l.orderLine.outstandingStock}</span></> : <span className="text-brine">—</span>}</td>
        <td className="px-2 py-2 text-right tabular-nums">{l.unitPrice ?? "—"}{l.orderLine ? <span className="block text-brine">ordered {l.orderLine.packPrice}</span> : null}</td>
        <td className="px-2 py-2">{l.lot ?? <span className="text-brine">no lot</span>}<span className="block text-brine">{l.date ? `${DATE_KIND_WORDS[l.dateKind ?? "use_by"]} ${l.date}` : "no date"}</span></td>
        <td className="px-2 py-2"><Findings findings={l.findings} /></td>
        <td className="px-2 py-2">
          {l.decision === "accept" ? <Badge tone="herb">Accepted</Badge> : l.decision === "reject" ? <Badge tone="ember">Rejected</Badge> : <Badge>To settle</Badge>}
          {l.landedUnitCost ? <span className="block text-brine tabular-nums">landed {l.landedUnitCost} per {l.item?.stockUnit}</span> : null}
          {draft ? (
            <span className="mt-1 flex flex-wrap gap-1">
              {l.decision !== "accept" ? <button type="button" className="btn-quiet" onClick={onAccept} disabled={busy} aria-label={`Accept line ${l.lineNo}`}>Accept</button> : null}
              {l.decision !== "reject" ? <button type="button" className="btn-quiet" onClick={onReject} disabled={busy} aria-label={`Reject line ${l.lineNo}`}>Reject</button> : null}
              {l.decision !== "pending" ? <button type="button" className="btn-quiet" onClick={onUndo} disabled={busy} aria-label={`Undo the decision on line ${l.lineNo}`}>Undo</button> : null}
              <button type="button" className="btn-quiet" onClick={onEdit} aria-expanded={editing} aria-label={`Correct line ${l.lineNo}`}>Correct</button>
            </span>
          ) : null}
        </td>
      </tr>
      {editing ? <tr><td colSpan={9} className="px-2 pb-3">{correction}</td></tr> : null}
    </>
  );
}
