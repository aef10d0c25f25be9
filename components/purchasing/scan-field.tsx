"use client";

// A field for a case-label scan: a keyboard-wedge scanner types the barcode and presses Enter; the
// API reads it (lib/gs1) and the field shows the item's GTIN, lot, dates and weight, or what is
// wrong with the scan. Scanners that send the group separator as Ctrl+] get an ASCII 29 inserted;
// those that type another character use the company's stand-in (Settings > Company: the server applies
// it when no `separator` is passed), or pass `separator` to override it.
// The decoded label goes to onDecoded for the page to match against supplier items and lots. Not a
// <form> of its own (Enter reads the scan), so it can sit inside a receipt form.
import { ScanBarcode } from "lucide-react";
import { useRef, useState, type KeyboardEvent } from "react";
import { describedBy, FieldError, FieldHint } from "@/components/ui/field";
import { ApiError, parseGs1Scan, type Gs1Label } from "@/lib/queries/gs1";

const GS = "\u001d";

/** "2027-03-31" -> "31 Mar 2027"; "2026-11" (no day on the label) -> "Nov 2026". UTC, so no day shifts. */
function formatLabelDate(iso: string): string {
  const [y, m, d] = iso.split("-").map(Number);
  const at = new Date(Date.UTC(y!, m! - 1, d ?? 1));
  const opts: Intl.DateTimeFormatOptions = d === undefined ? { month: "short", year: "numeric", timeZone: "UTC" } : { day: "numeric", month: "short", year: "numeric", timeZone: "UTC" };
  return new Intl.DateTimeFormat(undefined, opts).format(at);
}

function rows(label: Gs1Label): [string, string][] {
  const out: [string, string | null][] = [
    ["Item (GTIN)", label.gtin],
    ["Contents (GTIN)", label.containedGtin],
    ["Lot", label.lot],
    ["Use by", label.expiry && formatLabelDate(label.expiry)],
    ["Best before", label.bestBefore && formatLabelDate(label.bestBefore)],
    ["Sell by", label.sellBy && formatLabelDate(label.sellBy)],
    ["Made", label.productionDate && formatLabelDate(label.productionDate)],
    ["Packed", label.packagingDate && formatLabelDate(label.packagingDate)],
    ["Net weight", label.netWeightKg && `${label.netWeightKg} kg`],
    ["Net weight", label.netWeightLb && `${label.netWeightLb} lb`],
    ["Count", label.count],
    ["Items in the unit", label.tradeItemCount],
    ["Shipping unit (SSCC)", label.sscc],
  ];
  return out.filter((r): r is [string, string] => Boolean(r[1]));
}

export function ScanField({ id = "gs1-scan", label = "Scan a case label", separator, onDecoded }: {
  id?: string;
  label?: string;
  /** The character the scanner types instead of the group separator, if it cannot send ASCII 29. */
  separator?: string;
  onDecoded?: (label: Gs1Label, scanned: string) => void;
}) {
  const input = useRef<HTMLInputElement>(null);
  const [value, setValue] = useState("");
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string>();
  const [decoded, setDecoded] = useState<Gs1Label>();

  async function read() {
    if (!value.trim() || busy) return;
    setBusy(true);
    setError(undefined);
    try {
      const result = await parseGs1Scan({ data: value, ...(separator ? { separator } : {}) });
      setDecoded(result);
      onDecoded?.(result, value);
    } catch (err) {
      setDecoded(undefined);
      setError(err instanceof ApiError ? err.message : "The label could not be read. Try again.");
    } finally {
      setBusy(false);
      // the next scan replaces this one
      input.current?.select();
    }
  }

  // Enter ends a scan. Many scanners send the group separator (FNC1) as Ctrl+], which a browser would drop.
  function onKeyDown(e: KeyboardEvent<HTMLInputElement>) {
    if (e.key === "Enter") {
      e.preventDefault();
      void read();
      return;
    }
    if (!e.ctrlKey || (e.key !== "]" && e.code !== "BracketRight")) return;
    e.preventDefault();
    const el = e.currentTarget;
    const start = el.selectionStart ?? value.length;
    const end = el.selectionEnd ?? value.length;
    const next = value.slice(0, start) + GS + value.slice(end);
    setValue(next);
    requestAnimationFrame(() => el.setSelectionRange(start + 1, start + 1));
  }

  const errors = error ? [error] : undefined;
  const shown = decoded ? rows(decoded) : [];
  const others = decoded ? Object.entries(decoded.other) : [];

  return (
    <div className="space-y-3">
      <div>
        <label htmlFor={id} className="field-label">{label}</label>
        <div className="flex gap-2">
          <input
            ref={input}
            id={id}
            type="text"
            className="field-input font-mono"
            value={value}
            onChange={(e) => setValue(e.target.value)}
            onKeyDown={onKeyDown}
            autoComplete="off"
            autoCapitalize="off"
            autoCorrect="off"
            spellCheck={false}
            enterKeyHint="done"
            placeholder="(01)…(17)…(10)…"
            {...describedBy(id, errors, true)}
          />
          <button type="button" className="btn-quiet shrink-0" onClick={() => void read()} disabled={busy || !value.trim()}>
            <ScanBarcode aria-hidden className="h-5 w-5" />
            {busy ? "Reading…" : "Read"}
          </button>
        </div>
        <FieldHint id={id}>Point the scanner at the GS1 barcode on the case, or type the line printed under it.</FieldHint>
        <FieldError id={id} errors={errors} />
      </div>
      {decoded ? (
        <div className="panel px-4 py-3" aria-live="polite">
          {shown.length === 0 && others.length === 0 ? (
            <p className="text-sm text-brine">The barcode holds nothing this page reads.</p>
          ) : (
            <dl className="grid grid-cols-[auto_1fr] gap-x-6 gap-y-1 text-sm">
              {shown.map(([term, detail], i) => (
                <div key={`${term}-${i}`} className="contents">
                  <dt className="text-brine">{term}</dt>
                  <dd className="num font-medium">{detail}</dd>
                </div>
              ))}
              {others.length ? (
                <div className="contents">
                  <dt className="text-brine">Also on the label</dt>
                  <dd className="num">{others.map(([ai, v]) => `(${ai}) ${v}`).join(", ")}</dd>
                </div>
              ) : null}
            </dl>
          )}
        </div>
      ) : null}
    </div>
  );
}
