"use client";

// A supplier's price lists: send a CSV (with a progress bar), say once which column is which (the
// mapping is remembered for this supplier when a list is applied), look at what it would change
// (row findings, prices up and down in percent and per kg / metre / hank) before anything is
// written, then apply it from a date. Below: the lists applied so far.
// The file goes to POST /api/suppliers/{id}/price-lists by XMLHttpRequest, whose upload events
// drive the progress bar; every send carries the file again (the server knows it by its SHA-256).
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useId, useMemo, useRef, useState } from "react";
import { ArrowDownRight, ArrowUpRight, CircleAlert, FileUp, Minus, Sparkles, TriangleAlert } from "lucide-react";
import { CureCaution } from "@/components/cure/cure-caution";
import { CureMarker } from "@/components/cure/cure-marker";
import { percentText, preferredUnitIndex, priceText } from "@/components/purchasing/price-format";
import { Badge } from "@/components/ui/badge";
import { DataTable, RowHeader, TBody, Td, Th, THead } from "@/components/ui/data-table";
import { EmptyState } from "@/components/ui/empty-state";
import { FormMessage, StatusRegion } from "@/components/ui/field";
import type { PriceListChange, PriceListFileFacts, PriceListImport, PriceListProblem, PriceListResult } from "@/lib/data/price-lists";
import { DATE_FORMATS } from "@/lib/import/dates";
import { DECIMAL_SEPARATORS, THOUSANDS_SEPARATORS } from "@/lib/import/numbers";
import { PRICE_LIST_FIELDS } from "@/lib/purchasing/price-list-fields";
import type { UnitSystem } from "@/lib/units";
import { CSV_DELIMITERS, type CsvMapping } from "@/lib/validation/imports";

const DECIMAL_LABELS: Record<(typeof DECIMAL_SEPARATORS)[number], string> = { ".": "Point: 1234.50", ",": "Comma: 1234,50" };
const THOUSANDS_LABELS: Record<(typeof THOUSANDS_SEPARATORS)[number], string> = {
  "": "None: 1234", ",": "Comma: 1,234", ".": "Point: 1.234", " ": "Space: 1 234", "'": "Apostrophe: 1'234",
};
const DELIMITER_LABELS: Record<(typeof CSV_DELIMITERS)[number], string> = { ",": "Commas", ";": "Semicolons", "\t": "Tabs", "|": "Bars ( | )" };
const ENCODING_LABELS: Record<PriceListFileFacts["encoding"], string> = { "utf-8": "UTF-8", "windows-1252": "Windows-1252", "utf-16le": "UTF-16", "utf-16be": "UTF-16" };

interface Sent {
  status: number;
  body: { error?: { code: string; message: string; details?: Record<string, unknown> } } & Partial<PriceListResult>;
}

/** POST multipart with upload progress (fetch has no upload progress events). */
function sendPriceList(supplierId: string, form: FormData, onProgress: (fraction: number | null) => void): Promise<Sent> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open("POST", `/api/suppliers/${supplierId}/price-lists`);
    xhr.responseType = "json";
    xhr.upload.onprogress = (e) => onProgress(e.lengthComputable && e.total > 0 ? e.loaded / e.total : null);
    xhr.upload.onload = () => onProgress(1);
    xhr.onload = () => resolve({ status: xhr.status, body: (xhr.response ?? {}) as Sent["body"] });
    xhr.onerror = () => reject(new Error("The file could not be sent. Check the connection and try again."));
    xhr.send(form);
  });
}

/** The mapping's column for a field as an index into the file's columns, or -1. */
function columnIndex(mapping: CsvMapping, field: string, facts: PriceListFileFacts): number {
  const ref = mapping.columns[field];
  if (!ref) return -1;
  if ("column" in ref) return ref.column - 1;
  const loose = (s: string) => s.trim().replace(/\s+/g, " ").toLowerCase();
  return facts.headers.findIndex((h) => loose(h) === loose(ref.header));
}

/** A column chosen by index, kept by its header when it has a unique one (so a reordered file still fits). */
function columnRef(index: number, facts: PriceListFileFacts, headerRow: number): { header: string } | { column: number } {
  const header = facts.headers[index]?.trim() ?? "";
  const unique = header !== "" && facts.headers.filter((h) => h.trim() === header).length === 1;
  return headerRow > 0 && unique ? { header } : { column: index + 1 };
}

const count = (n: number, word: string) => `${n.toLocaleString("en")} ${n === 1 ? word : `${word}s`}`;

/** "row 7, column 'Price': the price is 0…" -> "the price is 0…" (the table has the row and column). */
const findingText = (p: PriceListProblem) => p.message.replace(/^row \d+(?:, column (?:'.*?'|\d+))?: /, "");

function Direction({ change }: { change: PriceListChange }) {
  switch (change.direction) {
    case "up":
      return <Badge tone="amber" icon={<ArrowUpRight />}>Up {percentText(change.changePercent!)}</Badge>;
    case "down":
      return <Badge tone="herb" icon={<ArrowDownRight />}>Down {percentText(change.changePercent!)}</Badge>;
    case "new":
      return <Badge icon={<Sparkles />}>First price</Badge>;
    default:
      return <Badge icon={<Minus />}>Same</Badge>;
  }
}

export function PriceListSection({ supplierId, supplierName, currency, canManage, imports, today, unitSystem }: {
  supplierId: string;
  supplierName: string;
  currency: string;
  canManage: boolean;
  imports: PriceListImport[];
  /** the company's date, for the effective-date field */
  today: string;
  unitSystem: UnitSystem;
}) {
  const router = useRouter();
  const uid = useId();
  const fid = (name: string) => `${uid}-${name}`;
  const fileInput = useRef<HTMLInputElement>(null);

  const [file, setFile] = useState<File | null>(null);
  const [effectiveFrom, setEffectiveFrom] = useState(today);
  const [facts, setFacts] = useState<PriceListFileFacts | null>(null);
  /** the mapping on the form; null until the server has read the file once */
  const [mapping, setMapping] = useState<CsvMapping | null>(null);
  /** the form's mapping differs from the one the preview was made with */
  const [edited, setEdited] = useState(false);
  const [result, setResult] = useState<PriceListResult | null>(null);
  const [busy, setBusy] = useState<{ what: "check" | "apply"; progress: number | null } | null>(null);
  const [error, setError] = useState<string>();
  const [notice, setNotice] = useState<string>();

  const send = async (what: "check" | "apply") => {
    if (!file) {
      setError("Choose the supplier's price list file first.");
      return;
    }
    setError(undefined);
    setNotice(undefined);
    setBusy({ what, progress: 0 });
    const form = new FormData();
    form.set("dryRun", what === "check" ? "true" : "false");
    if (/^\d{4}-\d{2}-\d{2}$/.test(effectiveFrom)) form.set("effectiveFrom", effectiveFrom);
    // a mapping the person has seen (or set) goes with the file; the first check lets the server choose
    if (mapping && (edited || what === "apply" || result)) form.set("mapping", JSON.stringify(mapping));
    form.set("file", file);
    try {
      const r = await sendPriceList(supplierId, form, (progress) => setBusy({ what, progress }));
      const details = r.body.error?.details as (Partial<PriceListResult> & { file?: PriceListFileFacts; fields?: Record<string, string[]> }) | undefined;
      if (r.status === 200 || r.status === 201) {
        const body = r.body as PriceListResult;
        setFacts(body.file);
        setMapping(body.mapping);
        setEdited(false);
        if (body.status === "preview") {
          setResult(body);
        } else {
          setResult(null);
          setFile(null);
          if (fileInput.current) fileInput.current.value = "";
          setNotice(body.message);
          router.refresh();
        }
      } else if (details?.summary) {
        // applying found row errors: the same findings as a preview, nothing written
        setResult({ ...(details as PriceListResult), status: "preview" });
        if (details.file) setFacts(details.file);
        setError(r.body.error!.message);
      } else {
        if (details?.file) {
          // no column matched: the columns found, so the person can say which is which
          setFacts(details.file);
          setMapping((m) => m ?? { headerRow: 1, columns: {}, delimiter: null, decimal: ".", thousands: "", dateFormat: "yyyy-MM-dd" });
          setResult(null);
        }
        const fields = details?.fields ? Object.entries(details.fields).map(([k, v]) => (k === "file" ? v[0] : `${k}: ${v[0]}`)) : [];
        setError(fields.length && !fields.includes(r.body.error?.message ?? "") ? `${r.body.error?.message ?? "Not accepted."} ${fields.join(" ")}` : (r.body.error?.message ?? "Not accepted."));
      }
    } catch (e) {
      setError(e instanceof Error ? e.message : String(e));
    } finally {
      setBusy(null);
    }
  };

  const setColumn = (field: string, index: number) => {
    if (!mapping || !facts) return;
    const columns = { ...mapping.columns };
    if (index < 0) delete columns[field];
    else columns[field] = columnRef(index, facts, mapping.headerRow);
    setMapping({ ...mapping, columns });
    setEdited(true);
  };
  const setFormat = (patch: Partial<CsvMapping>) => {
    if (!mapping) return;
    setMapping({ ...mapping, ...patch });
    setEdited(true);
  };

  const problems = useMemo(
    () => (result ? [...result.errors.map((p) => ({ p, error: true })), ...result.warnings.map((p) => ({ p, error: false }))].sort((a, b) => a.p.row - b.p.row) : []),
    [result],
  );
  const canApply = Boolean(result && file && !edited && !busy && result.summary.errors === 0 && result.summary.priced > 0 && !result.appliedBefore);
  const hasCure = Boolean(result?.changes.some((c) => c.item.category === "cure"));
  const s = result?.summary;

  return (
    <section aria-labelledby={fid("heading")} className="mt-8 space-y-3">
      <div>
        <h2 id={fid("heading")} className="text-xl font-semibold">Price lists</h2>
        <p className="text-sm text-brine">
          {canManage
            ? `Send ${supplierName}'s price list as CSV. You see every change before anything is written, and the columns you choose are remembered for their next list.`
            : `The price lists applied for ${supplierName}. A buyer, manager or admin sends new ones.`}
        </p>
      </div>
      <StatusRegion>{notice}</StatusRegion>

      {canManage ? (
        <div className="panel space-y-5 px-5 py-4">
          <div className="flex flex-wrap items-end gap-4">
            <div className="min-w-[16rem] flex-1">
              <label htmlFor={fid("file")} className="field-label">Price list file (CSV)</label>
              <input
                ref={fileInput}
                id={fid("file")}
                type="file"
                accept=".csv,.txt,.tsv,text/csv,text/plain"
                className="field-input py-2"
                onChange={(e) => {
                  // another file: its columns are read afresh (the remembered mapping, or a proposal)
                  setFile(e.target.files?.[0] ?? null);
                  setResult(null);
                  setFacts(null);
                  setMapping(null);
                  setEdited(false);
                  setError(undefined);
                  setNotice(undefined);
                }}
              />
            </div>
            <div>
              <label htmlFor={fid("from")} className="field-label">Prices take effect on</label>
              <input
                id={fid("from")} type="date" className="field-input" value={effectiveFrom} required
                onChange={(e) => {
                  setEffectiveFrom(e.target.value);
                  if (result) setEdited(true);
                }}
              />
            </div>
            <button type="button" className="btn-quiet" disabled={!file || Boolean(busy)} onClick={() => send("check")}>
              <FileUp aria-hidden className="h-4 w-4" /> {result || mapping ? "Check again" : "Check the file"}
            </button>
          </div>
          <p className="text-sm text-brine">
            CSV or text up to 25 MB, as a spreadsheet saves it (UTF-8 or Windows characters; commas, semicolons or tabs). A date column in the file, if chosen below, wins over this date.
          </p>

          {busy ? (
            <div className="space-y-1">
              <div
                role="progressbar"
                aria-label={busy.what === "check" ? "Sending the file to check it" : "Sending the file to apply it"}
                aria-valuemin={0}
                aria-valuemax={100}
                aria-valuenow={busy.progress === null ? undefined : Math.round(busy.progress * 100)}
                className="h-2 w-full overflow-hidden rounded-full bg-salt-deep"
              >
                <div className="h-full rounded-full bg-paprika transition-[width]" style={{ width: `${Math.round((busy.progress ?? 0.05) * 100)}%` }} />
              </div>
              <p className="num text-sm text-brine" aria-live="polite">
                {busy.progress !== null && busy.progress < 1
                  ? `Sending… ${Math.round(busy.progress * 100)} %`
                  : busy.what === "check" ? "Sent. Reading every row…" : "Sent. Writing the prices…"}
              </p>
            </div>
          ) : null}
          {error ? <FormMessage tone="error">{error}</FormMessage> : null}

          {facts && mapping ? (
            <fieldset className="space-y-3 rounded-md border border-salt-edge px-4 py-3">
              <legend className="px-1 font-semibold">Which column is which</legend>
              <p className="text-sm text-brine">
                Read as {ENCODING_LABELS[facts.encoding]}{facts.bom ? " (with byte-order mark)" : ""}, cells separated by {DELIMITER_LABELS[facts.delimiter].toLowerCase()}.
                {result?.mappingSource === "remembered" ? " These are the columns remembered for this supplier." : result?.mappingSource === "proposed" ? " Proposed from the column names: check them." : ""}
              </p>
              {result?.proposal?.numberFormatAmbiguous ? <p className="text-sm font-semibold text-amber">The numbers could be read more than one way: check the decimal and thousands separators.</p> : null}
              {result?.proposal?.dateFormatAmbiguous ? <p className="text-sm font-semibold text-amber">The dates could be read more than one way (03/04): check the date format.</p> : null}
              <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
                {PRICE_LIST_FIELDS.map((f) => {
                  const index = columnIndex(mapping, f.key, facts);
                  return (
                    <div key={f.key}>
                      <label htmlFor={fid(`col-${f.key}`)} className="field-label">{f.label}{f.required ? " (required)" : ""}</label>
                      <select id={fid(`col-${f.key}`)} className="field-input" value={String(index)} onChange={(e) => setColumn(f.key, Number(e.target.value))}>
                        <option value="-1">{f.required ? "Choose a column" : "Not in the file"}</option>
                        {facts.columnNames.map((name, i) => (
                          <option key={i} value={String(i)}>{name}{facts.sampleRows[0]?.[i] ? ` (e.g. ${facts.sampleRows[0][i]!.slice(0, 24)})` : ""}</option>
                        ))}
                      </select>
                    </div>
                  );
                })}
              </div>
              <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
                <div>
                  <label htmlFor={fid("decimal")} className="field-label">Decimal separator</label>
                  <select id={fid("decimal")} className="field-input" value={mapping.decimal} onChange={(e) => setFormat({ decimal: e.target.value as CsvMapping["decimal"] })}>
                    {DECIMAL_SEPARATORS.map((d) => <option key={d} value={d}>{DECIMAL_LABELS[d]}</option>)}
                  </select>
                </div>
                <div>
                  <label htmlFor={fid("thousands")} className="field-label">Thousands separator</label>
                  <select id={fid("thousands")} className="field-input" value={mapping.thousands} onChange={(e) => setFormat({ thousands: e.target.value as CsvMapping["thousands"] })}>
                    {THOUSANDS_SEPARATORS.map((t) => <option key={t || "none"} value={t}>{THOUSANDS_LABELS[t]}</option>)}
                  </select>
                </div>
                <div>
                  <label htmlFor={fid("dates")} className="field-label">Date format</label>
                  <select id={fid("dates")} className="field-input" value={mapping.dateFormat} onChange={(e) => setFormat({ dateFormat: e.target.value as CsvMapping["dateFormat"] })}>
                    {DATE_FORMATS.map((d) => <option key={d} value={d}>{d.replace("yyyy", "YYYY").replace("dd", "DD")}</option>)}
                  </select>
                </div>
                <div>
                  <label htmlFor={fid("delimiter")} className="field-label">Cells separated by</label>
                  <select id={fid("delimiter")} className="field-input" value={mapping.delimiter ?? ""} onChange={(e) => setFormat({ delimiter: (e.target.value || null) as CsvMapping["delimiter"] })}>
                    <option value="">Work it out</option>
                    {CSV_DELIMITERS.map((d) => <option key={d} value={d}>{DELIMITER_LABELS[d]}</option>)}
                  </select>
                </div>
                <div>
                  <label htmlFor={fid("header")} className="field-label">Column names in row</label>
                  <input
                    id={fid("header")} type="number" min={0} max={50} className="field-input num" value={mapping.headerRow}
                    onChange={(e) => setFormat({ headerRow: Math.max(0, Math.min(50, Math.trunc(Number(e.target.value) || 0))) })}
                  />
                </div>
              </div>
              {edited ? <p className="text-sm text-brine">Changed: check the file again to see what these columns give.</p> : null}
            </fieldset>
          ) : null}

          {result && s ? (
            <div className="space-y-4" aria-labelledby={fid("preview")} role="region">
              <div>
                <h3 id={fid("preview")} className="text-lg font-semibold">What this list would change</h3>
                <p className={s.errors ? "font-semibold text-ember" : "text-pepper"}>{result.message}</p>
              </div>
              <ul className="flex flex-wrap gap-2" aria-label="Counts">
                <li><Badge>{count(s.rows, "row")} read</Badge></li>
                <li><Badge tone="amber" icon={<ArrowUpRight />}>{s.raised.toLocaleString("en")} up</Badge></li>
                <li><Badge tone="herb" icon={<ArrowDownRight />}>{s.lowered.toLocaleString("en")} down</Badge></li>
                <li><Badge icon={<Minus />}>{s.unchanged.toLocaleString("en")} unchanged</Badge></li>
                {s.firstPrices ? <li><Badge icon={<Sparkles />}>{count(s.firstPrices, "first price")}</Badge></li> : null}
                {s.skipped ? <li><Badge tone="amber" icon={<TriangleAlert />}>{count(s.skipped, "unknown SKU")} skipped</Badge></li> : null}
                {s.errors ? <li><Badge tone="ember" icon={<CircleAlert />}>{count(s.errors, "error")}</Badge></li> : null}
                {s.warnings ? <li><Badge tone="amber" icon={<TriangleAlert />}>{count(s.warnings, "warning")}</Badge></li> : null}
              </ul>

              {problems.length ? (
                <DataTable caption="Rows to look at" captionHidden={false}>
                  <THead>
                    <Th numeric>Row</Th>
                    <Th>Column</Th>
                    <Th>Kind</Th>
                    <Th>What we found</Th>
                  </THead>
                  <TBody>
                    {problems.map(({ p, error: isError }, i) => (
                      <tr key={`${p.row}-${i}`}>
                        <Td numeric>{p.row}</Td>
                        <Td className="whitespace-nowrap">{p.column ?? <span className="text-brine">whole row</span>}</Td>
                        <Td>{isError ? <Badge tone="ember" icon={<CircleAlert />}>Error</Badge> : <Badge tone="amber" icon={<TriangleAlert />}>Warning</Badge>}</Td>
                        <Td className="min-w-[18rem]">{findingText(p)}</Td>
                      </tr>
                    ))}
                  </TBody>
                </DataTable>
              ) : null}
              {s.warnings > result.warnings.length ? <p className="text-sm text-brine">And {count(s.warnings - result.warnings.length, "more warning")} like these.</p> : null}

              {hasCure ? <CureCaution /> : null}
              {result.changes.length ? (
                <DataTable caption="Price changes" captionHidden={false}>
                  <THead>
                    <Th numeric>Row</Th>
                    <Th>Their SKU</Th>
                    <Th>Our item</Th>
                    <Th numeric>Was</Th>
                    <Th numeric>Now</Th>
                    <Th>Change</Th>
                    <Th numeric>Per unit</Th>
                  </THead>
                  <TBody>
                    {result.changes.map((c) => {
                      const u = c.perUnit[preferredUnitIndex(c.perUnit, c.item.stockUnit, unitSystem)];
                      return (
                        <tr key={c.supplierItemId + c.effectiveFrom}>
                          <Td numeric>{c.row}</Td>
                          <RowHeader className="min-w-[9rem]">
                            <span className="whitespace-nowrap">{c.sku}</span>
                            <span className="block text-sm font-normal text-brine">{c.packLabel}</span>
                            {c.listedDescription ? <span className="block whitespace-pre-line text-sm font-normal text-brine">{c.listedDescription}</span> : null}
                          </RowHeader>
                          <Td>
                            <span className="flex flex-wrap items-center gap-2">
                              <Link href={`/purchasing/prices/${c.item.id}`} className="font-semibold underline decoration-brine-line underline-offset-4 hover:decoration-paprika">{c.item.sku}</Link>
                              {c.item.category === "cure" ? <CureMarker /> : null}
                            </span>
                            <span className="block text-sm text-brine">{c.item.name}</span>
                          </Td>
                          <Td numeric className="whitespace-nowrap">{c.oldPrice ? priceText(c.oldPrice, currency) : <span className="text-brine">—</span>}</Td>
                          <Td numeric className="whitespace-nowrap font-semibold">
                            {priceText(c.newPrice, currency)}
                            {c.effectiveFrom !== result.effectiveFrom ? <span className="block text-sm font-normal text-brine">from {c.effectiveFrom}</span> : null}
                          </Td>
                          <Td><Direction change={c} /></Td>
                          <Td numeric className="whitespace-nowrap">
                            {u ? (
                              <>
                                {u.before ? `${priceText(u.before, currency)} → ` : ""}
                                <span className="font-semibold">{priceText(u.after, currency)}</span>
                                <span className="text-brine"> / {u.label}</span>
                              </>
                            ) : null}
                          </Td>
                        </tr>
                      );
                    })}
                  </TBody>
                </DataTable>
              ) : null}
              {s.moreChanges ? <p className="text-sm text-brine">The first {count(result.changes.length, "change")} {result.changes.length === 1 ? "is" : "are"} listed; {s.moreChanges.toLocaleString("en")} more {s.moreChanges === 1 ? "is" : "are"} counted above.</p> : null}

              <div className="flex flex-wrap items-center gap-3">
                <button type="button" className="btn-primary" disabled={!canApply} onClick={() => send("apply")}>
                  Apply {count(s.priced, "price")} from {effectiveFrom}
                </button>
                <p className="text-sm text-brine">
                  {result.appliedBefore
                    ? `This file was applied on ${result.appliedBefore.appliedAt.slice(0, 10)}; it will not be applied twice.`
                    : s.errors
                      ? "Correct the rows with errors (or the columns above) and check the file again: a list is applied whole or not at all."
                      : edited
                        ? "Check the file again after changing the columns or the date."
                        : "All of it is written together, or nothing is."}
                </p>
              </div>
            </div>
          ) : null}
        </div>
      ) : null}

      <h3 className="pt-2 text-lg font-semibold">Applied price lists</h3>
      {imports.length ? (
        <DataTable caption={`Price lists applied for ${supplierName}`}>
          <THead>
            <Th>Applied</Th>
            <Th>File</Th>
            <Th>Takes effect</Th>
            <Th numeric>Rows</Th>
            <Th numeric>Up</Th>
            <Th numeric>Down</Th>
            <Th numeric>Same</Th>
            <Th numeric>First</Th>
            <Th numeric>Skipped</Th>
            <Th>By</Th>
          </THead>
          <TBody>
            {imports.map((i) => (
              <tr key={i.id}>
                <Td className="num whitespace-nowrap">{new Date(i.appliedAt).toLocaleString("en-GB", { dateStyle: "medium", timeStyle: "short" })}</Td>
                <RowHeader className="font-normal">
                  <span className="break-all">{i.upload.filename}</span>
                  {i.counts.warnings ? <span className="block text-sm text-brine">{count(i.counts.warnings, "warning")}</span> : null}
                </RowHeader>
                <Td className="num whitespace-nowrap">{i.effectiveFrom}</Td>
                <Td numeric>{i.counts.rows.toLocaleString("en")}</Td>
                <Td numeric>{i.counts.raised.toLocaleString("en")}</Td>
                <Td numeric>{i.counts.lowered.toLocaleString("en")}</Td>
                <Td numeric>{i.counts.unchanged.toLocaleString("en")}</Td>
                <Td numeric>{i.counts.firstPrices.toLocaleString("en")}</Td>
                <Td numeric>{i.counts.skipped.toLocaleString("en")}</Td>
                <Td>{i.appliedBy?.name ?? <span className="text-brine">—</span>}</Td>
              </tr>
            ))}
          </TBody>
        </DataTable>
      ) : (
        <EmptyState title="No price list applied yet">
          <p>{canManage ? "Send this supplier's list above: the prices of their items are kept with the date they take effect, so you can see how each one moves." : "Prices appear here once a buyer applies a list."}</p>
        </EmptyState>
      )}
    </section>
  );
}
