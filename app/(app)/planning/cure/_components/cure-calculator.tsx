"use client";

// The cure calculator form and its answer. The server does the arithmetic and the checks
// (POST /api/calculations/cure, lib/cure); this form only gathers the inputs as decimal strings
// (percentages from the label become exact fractions here) and shows what comes back.
import { AlertTriangle, CheckCircle2, Info, Loader2, OctagonX, Plus, Trash2 } from "lucide-react";
import { useEffect, useRef, useState, type FormEvent, type ReactNode } from "react";
import { CheckVerdict, deviationWords, KIND_WORDS } from "@/components/planning/cure-check";
import { AmountField } from "@/components/ui/amount-field";
import { describedBy, FieldError, FieldHint, FormMessage } from "@/components/ui/field";
import { DataTable, RowHeader, TBody, Td, Th, THead } from "@/components/ui/data-table";
import type { CureCalculation, CureCheck } from "@/lib/cure/calculate";
import {
  CLASSES_BY_METHOD, CLASS_LABELS, DEFAULT_CLASS, METHOD_LABELS, METHODS, TABLE_LABELS, TABLES,
  type CureMethod, type HeatTreatment, type ProductClass, type RegulatoryTable, type Storage,
} from "@/lib/cure/limits";
import { ApiError, apiFetch, jsonInit } from "@/lib/queries/api";
import { dec, isDecimalString, plain } from "@/lib/units";

export interface StockCure {
  sku: string;
  name: string;
  nitriteFraction: string;
  nitrateFraction: string;
}

type Mode = "check" | "inverse";
type Errors = Record<string, string[]>;

interface CureRow {
  key: number;
  name: string;
  quantity: string;
  unit: string;
  nitritePercent: string;
  nitratePercent: string;
  potassium: boolean;
}

const MASS_UNITS = ["g", "kg", "oz", "lb"] as const;
const HEAT_WORDS: Record<HeatTreatment, string> = {
  not_heat_treated: "Not heat treated (08.3.1)",
  heat_treated: "Heat treated (08.3.2)",
  sterilised: "Sterilised, Fo > 3.00 (08.3.2)",
};

const toFraction = (percent: string) => plain(dec(percent).div(100));
const toPercent = (fraction: string) => plain(dec(fraction).times(100));

let nextKey = 1;
const emptyRow = (): CureRow => ({ key: nextKey++, name: "", quantity: "", unit: "g", nitritePercent: "6.25", nitratePercent: "0", potassium: false });

export function CureCalculator({ defaultTable, scaleResolutionG, stockCures }: {
  defaultTable: RegulatoryTable;
  scaleResolutionG: string;
  stockCures: StockCure[];
}) {
  const [mode, setMode] = useState<Mode>("check");
  const [method, setMethod] = useState<CureMethod>("comminuted");
  const [productClass, setProductClass] = useState<ProductClass>("comminuted");
  const [storage, setStorage] = useState<Storage>("keep_refrigerated");
  const [table, setTable] = useState<RegulatoryTable>(defaultTable);
  const [meat, setMeat] = useState({ quantity: "", unit: "kg" });
  const [rows, setRows] = useState<CureRow[]>(() => [emptyRow()]);
  const [pickle, setPickle] = useState({ quantity: "", unit: "kg" });
  const [pumpPercent, setPumpPercent] = useState("10");
  const [batch, setBatch] = useState({ quantity: "", unit: "kg" });
  const [heat, setHeat] = useState<HeatTreatment>("not_heat_treated");
  const [target, setTarget] = useState("");
  const [errors, setErrors] = useState<Errors>({});
  const [message, setMessage] = useState<string>();
  const [result, setResult] = useState<CureCalculation | null>(null);
  const [pending, setPending] = useState(false);

  const usesPickle = method === "pumped" || method === "immersion";
  const shownRows = mode === "inverse" ? rows.slice(0, 1) : rows;

  const chooseMethod = (m: CureMethod) => {
    setMethod(m);
    setProductClass(DEFAULT_CLASS[m]);
  };
  const updateRow = (key: number, patch: Partial<CureRow>) => setRows((rs) => rs.map((r) => (r.key === key ? { ...r, ...patch } : r)));

  /** The body as the API takes it; local errors for what cannot even be sent. */
  function buildBody(): { body?: Record<string, unknown>; local: Errors } {
    const local: Errors = {};
    const percent = (value: string, path: string, what: string) => {
      if (!isDecimalString(value.trim())) {
        local[path] = [`Enter the ${what} percentage from the label, e.g. 6.25 (0 if none).`];
        return undefined;
      }
      return toFraction(value.trim());
    };
    const cures = shownRows.map((r, i) => {
      const line: Record<string, unknown> = {
        nitriteFraction: percent(r.nitritePercent, `cures.${i}.nitriteFraction`, "nitrite"),
        nitrateFraction: percent(r.nitratePercent || "0", `cures.${i}.nitrateFraction`, "nitrate"),
      };
      if (r.name.trim()) line.name = r.name.trim();
      if (r.potassium) Object.assign(line, { nitriteSalt: "potassium", nitrateSalt: "potassium" });
      if (mode === "check") Object.assign(line, { quantity: r.quantity.trim(), unit: r.unit });
      return line;
    });
    const body: Record<string, unknown> = {
      method, productClass, storage, table,
      meatBlock: { quantity: meat.quantity.trim(), unit: meat.unit },
      cures,
    };
    if (usesPickle) body.pickle = { quantity: pickle.quantity.trim(), unit: pickle.unit };
    if (method === "pumped") {
      if (!isDecimalString(pumpPercent.trim())) local.pumpFraction = ["Enter the pump level in percent, e.g. 10."];
      else body.pumpFraction = toFraction(pumpPercent.trim());
    }
    if (table === "eu") {
      body.batchMass = { quantity: batch.quantity.trim(), unit: batch.unit };
      body.heatTreatment = heat;
    }
    if (mode === "inverse") body.targetNitritePpm = target.trim();
    return { body: Object.keys(local).length ? undefined : body, local };
  }

  async function submit(e: FormEvent) {
    e.preventDefault();
    const { body, local } = buildBody();
    setMessage(undefined);
    if (!body) {
      setErrors(local);
      return;
    }
    setPending(true);
    try {
      setResult(await apiFetch<CureCalculation>("/api/calculations/cure", jsonInit("POST", body)));
      setErrors({});
    } catch (err) {
      setResult(null);
      if (err instanceof ApiError && Object.keys(err.fields).length) {
        setErrors(err.fields);
      } else {
        setErrors({});
        setMessage(err instanceof Error ? err.message : "The calculation failed.");
      }
    } finally {
      setPending(false);
    }
  }

  /** Messages for a field and anything under it ("meatBlock" also shows "meatBlock.quantity"). */
  const err = (path: string) => {
    const out = Object.entries(errors).filter(([k]) => k === path || k.startsWith(`${path}.`)).flatMap(([, v]) => v);
    return out.length ? out : undefined;
  };
  const unplaced = Object.entries(errors)
    .filter(([k]) => !/^(method|productClass|storage|table|meatBlock|cures?|pickle|pumpFraction|batchMass|heatTreatment|targetNitritePpm)\b/.test(k))
    .flatMap(([, v]) => v);

  return (
    <div className="max-w-4xl space-y-6">
      <form onSubmit={submit} noValidate className="panel space-y-6 px-6 py-6" aria-label="Cure calculation">
        <fieldset>
          <legend className="field-label">What to work out</legend>
          <div className="flex flex-wrap gap-2">
            {([["check", "Check a formulation"], ["inverse", "How much cure for a target ppm"]] as const).map(([value, label]) => (
              <label key={value} className={`btn ${mode === value ? "border border-pepper bg-salt-deep" : "btn-quiet"} cursor-pointer`}>
                <input type="radio" name="mode" value={value} checked={mode === value} onChange={() => setMode(value)} className="h-4 w-4 accent-paprika" />
                {label}
              </label>
            ))}
          </div>
        </fieldset>

        <div className="grid gap-4 md:grid-cols-2">
          <Select id="method" label="Method" value={method} onChange={(v) => chooseMethod(v as CureMethod)} errors={err("method")}
            options={METHODS.map((m) => [m, METHOD_LABELS[m]])} />
          <Select id="productClass" label="Product class" value={productClass} onChange={(v) => setProductClass(v as ProductClass)} errors={err("productClass")}
            options={CLASSES_BY_METHOD[method].map((c) => [c, CLASS_LABELS[c]])}
            hint="Dry and fermented sausages (salami, pepperoni) are comminuted: the chopped-meat limit applies, never the dry-cured one." />
          <Select id="table" label="Regulatory table" value={table} onChange={(v) => setTable(v as RegulatoryTable)} errors={err("table")}
            options={TABLES.map((t) => [t, TABLE_LABELS[t]])}
            hint={`Your company's table: ${TABLE_LABELS[defaultTable].split(" (")[0]}.`} />
          <fieldset>
            <legend className="field-label">Storage</legend>
            <div className="flex flex-wrap gap-4">
              {([["keep_refrigerated", "Keep refrigerated"], ["shelf_stable", "Shelf stable"]] as const).map(([value, label]) => (
                <label key={value} className="flex min-h-touch cursor-pointer items-center gap-2">
                  <input type="radio" name="storage" value={value} checked={storage === value} onChange={() => setStorage(value)} className="h-4 w-4 accent-paprika" />
                  {label}
                </label>
              ))}
            </div>
            <FieldError id="storage" errors={err("storage")} />
          </fieldset>
        </div>

        <div className="grid gap-4 md:grid-cols-2">
          <AmountField units={MASS_UNITS} id="meatBlock" label="Meat block (green weight)" value={meat} onChange={setMeat} errors={err("meatBlock")}
            hint="Meat and fat only: not water, salt, spices or the finished weight." />
          {mode === "inverse" ? (
            <Text id="targetNitritePpm" label="Target ingoing nitrite (ppm)" value={target} onChange={setTarget} errors={err("targetNitritePpm")}
              hint={`Rounded to your ${scaleResolutionG} g scale toward compliance: down under a maximum, up over a minimum.`} />
          ) : null}
        </div>

        <fieldset className="space-y-3">
          <legend className="field-label">{mode === "inverse" ? "The cure to weigh" : "Cures"}</legend>
          {shownRows.map((r, i) => (
            <CureLineFields
              key={r.key} row={r} index={i} inverse={mode === "inverse"} stockCures={stockCures} errors={err}
              onChange={(patch) => updateRow(r.key, patch)}
              onRemove={shownRows.length > 1 ? () => setRows((rs) => rs.filter((x) => x.key !== r.key)) : undefined}
            />
          ))}
          <FieldError id="cures" errors={errors.cures ?? errors.cure} />
          {mode === "check" && rows.length < 10 ? (
            <button type="button" className="btn-quiet" onClick={() => setRows((rs) => [...rs, emptyRow()])}>
              <Plus aria-hidden className="h-4 w-4" /> Add a cure
            </button>
          ) : null}
        </fieldset>

        {usesPickle ? (
          <div className="grid gap-4 md:grid-cols-2">
            <AmountField units={MASS_UNITS} id="pickle" label="Pickle (brine) weight" value={pickle} onChange={setPickle} errors={err("pickle")}
              hint="The cures above are what is dissolved in this pickle." />
            {method === "pumped" ? (
              <Text id="pumpFraction" label="Pump level (%)" value={pumpPercent} onChange={setPumpPercent} errors={err("pumpFraction")}
                hint="Pickle injected per green weight, e.g. 10." />
            ) : null}
          </div>
        ) : null}

        {table === "eu" ? (
          <div className="grid gap-4 md:grid-cols-2">
            <AmountField units={MASS_UNITS} id="batchMass" label="Whole batch mass" value={batch} onChange={setBatch} errors={err("batchMass")}
              hint="EU figures are per kg of the whole batch: meat and everything added." />
            <Select id="heatTreatment" label="Heat treatment" value={heat} onChange={(v) => setHeat(v as HeatTreatment)} errors={err("heatTreatment")}
              options={Object.entries(HEAT_WORDS)} />
          </div>
        ) : null}

        {message ? <FormMessage tone="error">{message}</FormMessage> : null}
        {unplaced.length ? <FormMessage tone="error">{unplaced[0]}</FormMessage> : null}
        <div className="flex justify-end">
          <button type="submit" className="btn-primary" disabled={pending}>
            {pending ? <Loader2 aria-hidden className="h-4 w-4 animate-spin" /> : null}
            {pending ? "Calculating…" : "Calculate"}
          </button>
        </div>
      </form>

      <section aria-live="polite" aria-label="Result">
        {result ? <Result result={result} /> : null}
      </section>
    </div>
  );
}

function CureLineFields({ row, index, inverse, stockCures, errors, onChange, onRemove }: {
  row: CureRow;
  index: number;
  inverse: boolean;
  stockCures: StockCure[];
  errors: (path: string) => string[] | undefined;
  onChange: (patch: Partial<CureRow>) => void;
  onRemove?: () => void;
}) {
  const p = `cures.${index}`;
  const n = index + 1;
  // a single `cure` is never sent by this form, but the API may name it so
  const e = (field: string) => errors(`${p}.${field}`) ?? (index === 0 ? errors(`cure.${field}`) : undefined);
  return (
    <div className="rounded-md border border-salt-edge bg-salt/60 p-4">
      <div className="grid gap-4 md:grid-cols-2">
        {stockCures.length ? (
          <div>
            <label htmlFor={`${p}-stock`} className="field-label">Cure {n}: from the catalogue</label>
            <select
              id={`${p}-stock`} className="field-input" value=""
              onChange={(ev) => {
                const c = stockCures.find((s) => s.sku === ev.target.value);
                if (c) onChange({ name: c.name, nitritePercent: toPercent(c.nitriteFraction), nitratePercent: toPercent(c.nitrateFraction) });
              }}
            >
              <option value="">Fill from a cure item…</option>
              {stockCures.map((s) => <option key={s.sku} value={s.sku}>{s.name} ({s.sku})</option>)}
            </select>
          </div>
        ) : null}
        <Text id={`${p}.name`} label={`Cure ${n}: name (optional)`} value={row.name} onChange={(name) => onChange({ name })} errors={e("name")} decimal={false} />
      </div>
      <div className="mt-4 grid gap-4 md:grid-cols-3">
        {inverse ? null : (
          <AmountField units={MASS_UNITS} id={`${p}.quantity`} label={`Cure ${n}: quantity`} value={{ quantity: row.quantity, unit: row.unit }}
            onChange={(v) => onChange({ quantity: v.quantity, unit: v.unit })} errors={[...(e("quantity") ?? []), ...(e("unit") ?? [])]} />
        )}
        <Text id={`${p}.nitriteFraction`} label={`Cure ${n}: nitrite (%)`} value={row.nitritePercent} onChange={(v) => onChange({ nitritePercent: v })}
          errors={e("nitriteFraction")} hint="From the label, e.g. 6.25" />
        <Text id={`${p}.nitrateFraction`} label={`Cure ${n}: nitrate (%)`} value={row.nitratePercent} onChange={(v) => onChange({ nitratePercent: v })}
          errors={e("nitrateFraction")} hint="0 if none" />
      </div>
      <div className="mt-3 flex flex-wrap items-center justify-between gap-3">
        <label className="flex min-h-touch cursor-pointer items-center gap-2 text-sm">
          <input type="checkbox" checked={row.potassium} onChange={(ev) => onChange({ potassium: ev.target.checked })} className="h-4 w-4 accent-paprika" />
          Potassium salts (potassium nitrite / nitrate) instead of sodium
        </label>
        {onRemove ? (
          <button type="button" className="btn-quiet" onClick={onRemove}>
            <Trash2 aria-hidden className="h-4 w-4" /> Remove cure {n}
          </button>
        ) : null}
      </div>
    </div>
  );
}

function Result({ result }: { result: CureCalculation }) {
  const heading = useRef<HTMLHeadingElement>(null);
  // a new answer is read from its heading: scrolled into view and focused
  useEffect(() => {
    heading.current?.scrollIntoView({ block: "start" });
    heading.current?.focus({ preventScroll: true });
  }, [result]);
  const verdict = result.blocked
    ? { tone: "border-ember/40 bg-ember-soft text-ember", icon: <OctagonX aria-hidden className="h-5 w-5" />, text: "Over a statutory maximum: this formulation must not be used." }
    : result.table === "none" || result.checks.length === 0
      ? { tone: "border-brine-line bg-brine-soft text-pepper", icon: <Info aria-hidden className="h-5 w-5" />, text: "No regulatory check was made: nothing is blocked." }
      : result.warnings > 0
        ? { tone: "border-amber/40 bg-amber-soft text-amber", icon: <AlertTriangle aria-hidden className="h-5 w-5" />, text: `Within every maximum, with ${result.warnings} warning${result.warnings === 1 ? "" : "s"}: see the checks.` }
        : { tone: "border-herb/40 bg-herb-soft text-herb", icon: <CheckCircle2 aria-hidden className="h-5 w-5" />, text: "Within every check." };
  return (
    <div className="space-y-4">
      <h2 ref={heading} tabIndex={-1} className="scroll-mt-4 text-xl font-semibold focus:outline-none">Result</h2>
      <p className={`flex items-start gap-2 rounded-md border px-4 py-3 font-semibold ${verdict.tone}`}>{verdict.icon}<span>{verdict.text}</span></p>
      <p className="flex items-start gap-2 rounded-md border border-cure-edge bg-cure-soft px-3 py-2 text-sm text-pepper">
        <AlertTriangle aria-hidden className="mt-0.5 h-4 w-4 shrink-0 text-cure" />
        <span><strong className="font-semibold text-cure">Cure caution. </strong>{result.caution}</span>
      </p>
      <dl className="grid gap-4 sm:grid-cols-3">
        {result.requiredCure ? (
          <Figure label="Weigh this much cure">
            {result.requiredCure.quantity} g
            <span className="block text-sm font-normal text-brine">
              exact {result.requiredCure.exactQuantity} g; {result.requiredCure.rounding === "exact" ? "on" : `rounded ${result.requiredCure.rounding} to`} the {result.requiredCure.scaleResolutionG} g scale
            </span>
          </Figure>
        ) : null}
        <Figure label="Ingoing nitrite">
          {result.nitritePpm} ppm
          <span className="block text-sm font-normal text-brine">as sodium nitrite, on the meat block</span>
        </Figure>
        <Figure label="Ingoing nitrate">
          {result.nitratePpm} ppm
          <span className="block text-sm font-normal text-brine">on the meat block</span>
        </Figure>
        {result.euIonsMgPerKg ? (
          <Figure label="EU, per kg of batch">
            {result.euIonsMgPerKg.nitrite ?? "–"} mg/kg NO₂⁻
            <span className="block text-sm font-normal text-brine">{result.euIonsMgPerKg.nitrate ?? "–"} mg/kg NO₃⁻</span>
          </Figure>
        ) : null}
      </dl>

      {result.checks.length ? (
        <DataTable caption={`Checks against ${TABLE_LABELS[result.table]}`} captionHidden={false}>
          <THead>
            <Th>Check</Th>
            <Th>Kind</Th>
            <Th numeric>Limit</Th>
            <Th numeric>This batch</Th>
            <Th>Verdict</Th>
          </THead>
          <TBody>
            {result.checks.map((c) => (
              <tr key={c.id} className={!c.within && c.severity === "block" ? "bg-ember-soft/50" : undefined}>
                <RowHeader className="font-normal">
                  <span className="font-semibold">{c.entry}</span>
                  <span className="block text-sm text-brine">
                    {c.table.toUpperCase()} · {c.substance} · read {c.citation.readOn}{c.verified ? "" : " · not read in the primary text"}
                  </span>
                  {c.conditions ? <span className="block text-sm text-brine">{c.kind === "target" ? "Conditions" : "Note"}: {c.conditions}</span> : null}
                </RowHeader>
                <Td>{KIND_WORDS[c.kind]}{c.severity === "block" ? " (blocks)" : " (warns)"}</Td>
                <Td numeric className="whitespace-nowrap">{c.limitPpm}{c.tolerancePpm ? ` ± ${c.tolerancePpm}` : ""} {c.basis === "batch_as_ion" ? "mg/kg" : "ppm"}</Td>
                <Td numeric>
                  {c.ppm}
                  <span className="block text-sm text-brine">{deviationWords(c.deviationPpm)}</span>
                </Td>
                <Td><CheckVerdict check={c} /></Td>
              </tr>
            ))}
          </TBody>
        </DataTable>
      ) : null}

      {result.notes.length ? (
        <ul className="list-disc space-y-1 pl-6 text-sm text-pepper-soft" aria-label="Notes">
          {result.notes.map((n) => <li key={n}>{n}</li>)}
        </ul>
      ) : null}

      {result.checks.length ? (
        <details className="text-sm text-pepper-soft">
          <summary className="flex min-h-touch cursor-pointer items-center font-semibold">Where each figure comes from</summary>
          <ul className="mt-2 space-y-2">
            {result.checks.map((c) => (
              <li key={c.id}>
                <span className="font-semibold">{c.citation.regulation}</span>: {c.citation.entry}. Read {c.citation.readOn}; {c.citation.via}
                {c.derived ? ` ${c.derived}.` : ""}
              </li>
            ))}
          </ul>
        </details>
      ) : null}
    </div>
  );
}

function Figure({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="panel px-4 py-3">
      <dt className="text-sm text-brine">{label}</dt>
      <dd className="num text-2xl font-semibold">{children}</dd>
    </div>
  );
}

function Select({ id, label, value, onChange, options, errors, hint }: {
  id: string;
  label: string;
  value: string;
  onChange: (v: string) => void;
  options: [string, string][];
  errors?: string[];
  hint?: string;
}) {
  return (
    <div>
      <label htmlFor={id} className="field-label">{label}</label>
      <select id={id} value={value} onChange={(e) => onChange(e.target.value)} className="field-input" {...describedBy(id, errors, Boolean(hint))}>
        {options.map(([v, l]) => <option key={v} value={v}>{l}</option>)}
      </select>
      {hint ? <FieldHint id={id}>{hint}</FieldHint> : null}
      <FieldError id={id} errors={errors} />
    </div>
  );
}

function Text({ id, label, value, onChange, errors, hint, className, decimal = true }: {
  id: string;
  decimal?: boolean;
  label: string;
  value: string;
  onChange: (v: string) => void;
  errors?: string[];
  hint?: string;
  className?: string;
}) {
  return (
    <div className={className}>
      <label htmlFor={id} className="field-label">{label}</label>
      <input id={id} type="text" inputMode={decimal ? "decimal" : undefined} value={value} onChange={(e) => onChange(e.target.value)} className={`field-input ${decimal ? "num" : ""}`} autoComplete="off" {...describedBy(id, errors, Boolean(hint))} />
      {hint ? <FieldHint id={id}>{hint}</FieldHint> : null}
      <FieldError id={id} errors={errors} />
    </div>
  );
}

