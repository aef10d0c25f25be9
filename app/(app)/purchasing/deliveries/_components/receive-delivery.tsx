"use client";

// "Receive a delivery": supplier, kitchen, the order (optional), then either the supplier's CSV or
// an empty delivery to key or scan lines into. When the file's columns cannot be matched on their
// own, the form asks which column holds which field and sends the file again with that mapping.
import { useRouter } from "next/navigation";
import { useMemo, useState, type FormEvent } from "react";
import { FieldError, FormMessage } from "@/components/ui/field";
import { DELIVERY_NOTE_FIELDS } from "@/lib/purchasing/delivery-note-fields";
import { ApiError, createKeyedDelivery, uploadDeliveryCsv } from "@/lib/queries/deliveries";

interface Option { id: string; label: string }
interface OrderOption { id: string; number: string; supplierId: string; kitchenId: string }

export function ReceiveDelivery({ suppliers, kitchens, orders, defaultKitchenId }: {
  suppliers: Option[]; kitchens: (Option & { code: string })[]; orders: OrderOption[]; defaultKitchenId: string | null;
}) {
  const router = useRouter();
  const [supplier, setSupplier] = useState(suppliers[0]?.id ?? "");
  const [kitchen, setKitchen] = useState(defaultKitchenId ?? kitchens[0]?.id ?? "");
  const [order, setOrder] = useState("");
  const [noteNumber, setNoteNumber] = useState("");
  const [file, setFile] = useState<File | null>(null);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<ApiError | null>(null);
  const [headers, setHeaders] = useState<string[] | null>(null);
  const [columns, setColumns] = useState<Record<string, string>>({});
  const [keyedKey] = useState(() => crypto.randomUUID());
  const openOrders = useMemo(() => orders.filter((o) => o.supplierId === supplier && o.kitchenId === kitchen), [orders, supplier, kitchen]);

  async function read(e: FormEvent) {
    e.preventDefault();
    if (!file) {
      setError(new ApiError(422, "VALIDATION", "Choose the delivery note's CSV file first.", { file: ["Choose the CSV file."] }));
      return;
    }
    const form = new FormData();
    form.set("supplier", supplier);
    form.set("kitchen", kitchen);
    if (order) form.set("order", order);
    if (noteNumber.trim()) form.set("noteNumber", noteNumber.trim());
    if (headers) {
      const chosen = Object.fromEntries(Object.entries(columns).filter(([, h]) => h).map(([k, h]) => [k, { header: h }]));
      form.set("mapping", JSON.stringify({ headerRow: 1, columns: chosen }));
    }
    form.set("file", file);
    setBusy(true);
    setError(null);
    try {
      const d = await uploadDeliveryCsv(form);
      router.push(`/purchasing/deliveries/${d.id}`);
    } catch (err) {
      const apiErr = err instanceof ApiError ? err : new ApiError(0, "ERROR", "The file could not be sent. Try again.");
      const found = apiErr.details.headers;
      if (Array.isArray(found)) setHeaders(found as string[]);
      setError(apiErr);
    } finally {
      setBusy(false);
    }
  }

  async function startKeyed() {
    setBusy(true);
    setError(null);
    try {
      const k = kitchens.find((x) => x.id === kitchen);
      const d = await createKeyedDelivery({ supplier, kitchen: k?.code ?? kitchen, ...(order ? { order } : {}), ...(noteNumber.trim() ? { noteNumber: noteNumber.trim() } : {}) }, keyedKey);
      router.push(`/purchasing/deliveries/${d.id}`);
    } catch (err) {
      setError(err instanceof ApiError ? err : new ApiError(0, "ERROR", "Could not start the delivery."));
    } finally {
      setBusy(false);
    }
  }

  const rowErrors = (error?.details.errors as { row: number; column: string | null; message: string }[] | undefined) ?? [];
  return (
    <form onSubmit={read} className="panel flex flex-col gap-4 px-5 py-5" aria-labelledby="receive-title" noValidate>
      <h2 id="receive-title" className="font-display text-lg font-semibold text-pepper">Receive a delivery</h2>
      {error ? <FormMessage tone="error">{error.message}</FormMessage> : null}
      {rowErrors.length ? (
        <ul className="list-disc pl-5 text-sm text-ember" aria-label="Rows that could not be read">
          {rowErrors.slice(0, 20).map((r) => <li key={`${r.row}-${r.column}-${r.message}`}>{r.message}</li>)}
        </ul>
      ) : null}
      <div className="grid gap-4 sm:grid-cols-2">
        <div>
          <label htmlFor="dl-supplier" className="field-label">Supplier</label>
          <select id="dl-supplier" className="field-input" value={supplier} onChange={(e) => { setSupplier(e.target.value); setOrder(""); setHeaders(null); }}>
            {suppliers.map((s) => <option key={s.id} value={s.id}>{s.label}</option>)}
          </select>
          <FieldError id="dl-supplier" errors={error?.fields.supplier} />
        </div>
        <div>
          <label htmlFor="dl-kitchen" className="field-label">Delivered to</label>
          <select id="dl-kitchen" className="field-input" value={kitchen} onChange={(e) => { setKitchen(e.target.value); setOrder(""); }}>
            {kitchens.map((k) => <option key={k.id} value={k.id}>{k.label}</option>)}
          </select>
          <FieldError id="dl-kitchen" errors={error?.fields.kitchen} />
        </div>
        <div>
          <label htmlFor="dl-order" className="field-label">Against order</label>
          <select id="dl-order" className="field-input" value={order} onChange={(e) => setOrder(e.target.value)}>
            <option value="">Any open order of this supplier</option>
            {openOrders.map((o) => <option key={o.id} value={o.id}>{o.number}</option>)}
          </select>
          <FieldError id="dl-order" errors={error?.fields.order} />
        </div>
        <div>
          <label htmlFor="dl-note" className="field-label">Delivery note number (if the file has none)</label>
          <input id="dl-note" className="field-input" value={noteNumber} onChange={(e) => setNoteNumber(e.target.value)} maxLength={80} />
        </div>
      </div>
      <div>
        <label htmlFor="dl-file" className="field-label">The supplier&apos;s delivery note as CSV</label>
        <input id="dl-file" type="file" accept=".csv,text/csv" className="field-input" onChange={(e) => { setFile(e.target.files?.[0] ?? null); setHeaders(null); }} />
        <FieldError id="dl-file" errors={error?.fields.file} />
      </div>
      {headers ? (
        <fieldset className="flex flex-col gap-2 rounded-md border border-brine-line px-4 py-3">
          <legend className="px-1 text-sm font-semibold text-pepper">Which column holds what?</legend>
          <div className="grid gap-3 sm:grid-cols-2">
            {DELIVERY_NOTE_FIELDS.map((f) => (
              <div key={f.key}>
                <label htmlFor={`map-${f.key}`} className="field-label">{f.label}{f.required ? " (needed)" : ""}</label>
                <select id={`map-${f.key}`} className="field-input" value={columns[f.key] ?? ""} onChange={(e) => setColumns({ ...columns, [f.key]: e.target.value })}>
                  <option value="">Not in the file</option>
                  {headers.map((h) => <option key={h} value={h}>{h}</option>)}
                </select>
              </div>
            ))}
          </div>
        </fieldset>
      ) : null}
      <div className="flex flex-wrap items-center justify-end gap-3">
        <button type="button" className="btn-quiet" onClick={startKeyed} disabled={busy || !supplier || !kitchen}>Key in or scan instead</button>
        <button type="submit" className="btn-primary" disabled={busy || !supplier || !kitchen}>{busy ? "Reading…" : "Read the note"}</button>
      </div>
    </form>
  );
}
