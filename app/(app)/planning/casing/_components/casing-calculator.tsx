"use client";

// The casing calculator form and its answer. The server does the arithmetic (POST
// /api/calculations/casing, lib/casing): natural casings from their capacity per put-up (the
// item's, or the calibre table's lower bound), manufactured ones as a cylinder with a fill factor.
// This form only gathers the inputs as decimal strings and shows what comes back.
import { Calculator, Loader2 } from "lucide-react";
import { useEffect, useRef, useState, type FormEvent, type ReactNode } from "react";
import { metresText } from "@/components/planning/quantities";
import { AmountField } from "@/components/ui/amount-field";
import { describedBy, FieldError, FieldHint, FormMessage } from "@/components/ui/field";
import { ApiError, calculateCasing, type CasingCalculation } from "@/lib/queries/planning";
import { dec, plain, type UnitSystem } from "@/lib/units";
import type { CasingCalculationInput } from "@/lib/validation/casing";

export interface CasingOption {
  id: string;
  sku: string;
  name: string;
  capacityKg: string | null;
  putUp: string | null;
}

type Errors = Record<string, string[]>;
type By = "item" | "calibre";
type Link = "none" | "length" | "weight";

const PUT_UP_WORDS: Record<string, [string, string]> = {
  hank: ["hank", "hanks"], beef_set: ["set", "sets"], tubed_strand: ["strand", "strands"], stick: ["stick", "sticks"], box: ["box", "boxes"],
};
const putUpWord = (putUp: string | null, n: number): string => {
  const w: [string, string] = putUp ? (PUT_UP_WORDS[putUp] ?? [putUp.replace(/_/g, " "), `${putUp.replace(/_/g, " ")}s`]) : ["put-up", "put-ups"];
  return n === 1 ? w[0] : w[1];
};

export function CasingCalculator({ casings, unitSystem }: { casings: CasingOption[]; unitSystem: UnitSystem }) {
  const [filling, setFilling] = useState({ quantity: "", unit: unitSystem === "us" ? "lb" : "kg" });
  const [by, setBy] = useState<By>(casings.length ? "item" : "calibre");
  const [item, setItem] = useState(casings[0]?.id ?? "");
  const [capacity, setCapacity] = useState("");
  const [calibre, setCalibre] = useState("");
  const [fillPercent, setFillPercent] = useState("90");
  const [link, setLink] = useState<Link>("none");
  const [linkValue, setLinkValue] = useState({ quantity: "", unit: "cm" });
  const [errors, setErrors] = useState<Errors>({});
  const [message, setMessage] = useState<string>();
  const [result, setResult] = useState<CasingCalculation | null>(null);
  const [pending, setPending] = useState(false);
  const chosen = casings.find((c) => c.id === item);

  async function submit(e: FormEvent) {
    e.preventDefault();
    setMessage(undefined);
    const body: CasingCalculationInput = { fillingMass: { quantity: filling.quantity.trim(), unit: filling.unit } };
    if (by === "item") {
      body.item = item;
      if (capacity.trim()) body.capacityKg = capacity.trim();
    } else {
      body.calibreMm = calibre.trim();
      const f = fillPercent.trim();
      if (f) body.fillFactor = /^\d+(\.\d+)?$/.test(f) ? plain(dec(f).div(100)) : f;
    }
    if (link === "length") body.link = { length: { quantity: linkValue.quantity.trim(), unit: linkValue.unit } };
    if (link === "weight") body.link = { weight: { quantity: linkValue.quantity.trim(), unit: linkValue.unit } };
    setPending(true);
    try {
      setResult(await calculateCasing(body));
      setErrors({});
    } catch (err) {
      setResult(null);
      if (err instanceof ApiError && Object.keys(err.fields).length) setErrors(err.fields);
      else {
        setErrors({});
        setMessage(err instanceof Error ? err.message : "The calculation failed.");
      }
    } finally {
      setPending(false);
    }
  }

  const err = (path: string) => {
    const out = Object.entries(errors).filter(([k]) => k === path || k.startsWith(`${path}.`)).flatMap(([, v]) => v);
    return out.length ? out : undefined;
  };
  const unplaced = Object.entries(errors).filter(([k]) => !/^(fillingMass|item|calibreMm|capacityKg|fillFactor|density|link)\b/.test(k)).flatMap(([, v]) => v);

  return (
    <div className="max-w-4xl space-y-6">
      <form onSubmit={(e) => void submit(e)} noValidate className="panel space-y-6 px-6 py-6" aria-label="Casing calculation">
        <div className="grid gap-4 md:grid-cols-2">
          <AmountField id="fillingMass" label="Filling mass" value={filling} units={["kg", "g", "lb", "oz"]} onChange={setFilling} errors={err("fillingMass")}
            hint="Everything stuffed: the meat block plus water, salt, cure and spices." />
        </div>

        <fieldset className="space-y-4">
          <legend className="field-label">Casing</legend>
          <div className="flex flex-wrap gap-2">
            {([["item", "A casing item"], ["calibre", "A calibre (manufactured casing)"]] as const).map(([value, label]) => (
              <label key={value} className={`btn ${by === value ? "border border-pepper bg-salt-deep" : "btn-quiet"} cursor-pointer`}>
                <input type="radio" name="by" value={value} checked={by === value} onChange={() => setBy(value)} className="h-4 w-4 accent-paprika" />
                {label}
              </label>
            ))}
          </div>
          {by === "item" ? (
            <div className="grid gap-4 md:grid-cols-2">
              <div>
                <label htmlFor="item" className="field-label">Casing item</label>
                <select id="item" className="field-input" value={item} onChange={(e) => setItem(e.target.value)} {...describedBy("item", err("item"), true)}>
                  {casings.length === 0 ? <option value="">No casing items in the catalogue</option> : null}
                  {casings.map((c) => <option key={c.id} value={c.id}>{c.sku} · {c.name}</option>)}
                </select>
                <FieldHint id="item">
                  {chosen?.capacityKg ? `Holds ${plain(dec(chosen.capacityKg))} kg per ${putUpWord(chosen.putUp, 1)} (the item's figure).` : "Without its own capacity, the calibre table's lower bound is used (it never under-orders casing)."}
                </FieldHint>
                <FieldError id="item" errors={err("item")} />
              </div>
              <Text id="capacityKg" label="Capacity per put-up (kg, optional)" value={capacity} onChange={setCapacity} errors={err("capacityKg")}
                hint="Only to override the item's: kg of filling one hank, set or strand holds." />
            </div>
          ) : (
            <div className="grid gap-4 md:grid-cols-2">
              <Text id="calibreMm" label="Calibre (mm)" value={calibre} onChange={setCalibre} errors={err("calibreMm")} hint="The stuffed diameter, e.g. 38." />
              <Text id="fillFactor" label="Fill factor (%)" value={fillPercent} onChange={setFillPercent} errors={err("fillFactor")}
                hint="Share of the ideal cylinder filled; 90 % unless the casing maker states a capacity." />
            </div>
          )}
        </fieldset>

        <fieldset className="space-y-3">
          <legend className="field-label">Links (optional)</legend>
          <div className="flex flex-wrap gap-4">
            {([["none", "No links"], ["length", "By length"], ["weight", "By weight"]] as const).map(([value, label]) => (
              <label key={value} className="flex min-h-touch cursor-pointer items-center gap-2">
                <input type="radio" name="link" value={value} checked={link === value} className="h-4 w-4 accent-paprika"
                  onChange={() => { setLink(value); setLinkValue({ quantity: "", unit: value === "weight" ? "g" : "cm" }); }} />
                {label}
              </label>
            ))}
          </div>
          {link !== "none" ? (
            <div className="grid gap-4 md:grid-cols-2">
              <AmountField id={`link.${link}`} label={link === "length" ? "Link length" : "Link weight"} value={linkValue} units={link === "length" ? ["cm", "mm", "in"] : ["g", "oz"]}
                onChange={setLinkValue} errors={err(`link.${link}`) ?? err("link")} />
            </div>
          ) : null}
        </fieldset>

        {message ? <FormMessage tone="error">{message}</FormMessage> : null}
        {unplaced.length ? <FormMessage tone="error">{unplaced[0]}</FormMessage> : null}
        <div className="flex justify-end">
          <button type="submit" className="btn-primary" disabled={pending}>
            {pending ? <Loader2 aria-hidden className="h-4 w-4 animate-spin" /> : <Calculator aria-hidden className="h-4 w-4" />}
            {pending ? "Calculating…" : "Calculate"}
          </button>
        </div>
      </form>

      <section aria-live="polite" aria-label="Result">
        {result ? <Result result={result} unitSystem={unitSystem} /> : null}
      </section>
    </div>
  );
}

function Result({ result, unitSystem }: { result: CasingCalculation; unitSystem: UnitSystem }) {
  const heading = useRef<HTMLHeadingElement>(null);
  useEffect(() => {
    heading.current?.scrollIntoView({ block: "start" });
    heading.current?.focus({ preventScroll: true });
  }, [result]);
  const putUp = result.casing?.putUp ?? null;
  return (
    <div className="space-y-4">
      <h2 ref={heading} tabIndex={-1} className="scroll-mt-4 text-xl font-semibold focus:outline-none">Result</h2>
      <dl className="grid gap-4 sm:grid-cols-3">
        <Figure label="Casing">
          {metresText(result.metres, unitSystem)}
          <span className="block text-sm font-normal text-brine">{plain(dec(result.kgPerMetre).toDecimalPlaces(3))} kg of filling per metre</span>
        </Figure>
        {result.putUps !== null && result.putUpsToOpen !== null ? (
          <Figure label={`${putUpWord(putUp, 2).replace(/^./, (c) => c.toUpperCase())} to open`}>
            {result.putUpsToOpen} {putUpWord(putUp, result.putUpsToOpen)}
            <span className="block text-sm font-normal text-brine">{result.putUps} needed; a {putUpWord(putUp, 1)} is opened whole</span>
          </Figure>
        ) : null}
        {result.links ? (
          <Figure label="Links">
            {result.links.count} {result.links.count === 1 ? "link" : "links"}
            <span className="block text-sm font-normal text-brine">
              {result.links.gramsPerLink} g and {plain(dec(result.links.metresPerLink).times(100).toDecimalPlaces(1))} cm each; {result.links.leftoverGrams} g left over
            </span>
          </Figure>
        ) : null}
      </dl>
      <p className="text-sm text-pepper-soft">
        {result.casing ? <><span className="font-semibold">{result.casing.sku}</span> ({result.casing.calibreMinMm}–{result.casing.calibreMaxMm} mm). </> : null}
        {result.basis.kind === "capacity"
          ? `${plain(dec(result.basis.capacityKgPerPutUp))} kg per ${plain(dec(result.basis.putUpMetres))} m put-up. ${result.basis.source}`
          : `${result.basis.calibreMm} mm cylinder at ${plain(dec(result.basis.fillFactor).times(100))} % fill, ${result.basis.density} g/cm³. ${result.basis.source}`}
      </p>
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

function Text({ id, label, value, onChange, errors, hint }: { id: string; label: string; value: string; onChange: (v: string) => void; errors?: string[]; hint?: string }) {
  return (
    <div>
      <label htmlFor={id} className="field-label">{label}</label>
      <input id={id} type="text" inputMode="decimal" value={value} onChange={(e) => onChange(e.target.value)} className="field-input num" autoComplete="off" {...describedBy(id, errors, Boolean(hint))} />
      {hint ? <FieldHint id={id}>{hint}</FieldHint> : null}
      <FieldError id={id} errors={errors} />
    </div>
  );
}

