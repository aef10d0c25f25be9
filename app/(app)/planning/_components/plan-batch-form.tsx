"use client";

// Plans one batch: recipe, day, meat block (kg or lb) or links (count x weight), and optionally a
// casing other than the recipe's. The server works out the bill of materials, the casing and the
// cure verdict (a cure over a statutory maximum cannot be saved); after saving, the sheet shows them.
import { useQuery } from "@tanstack/react-query";
import { CalendarPlus, Loader2 } from "lucide-react";
import Link from "next/link";
import { useId, useRef, useState, type FormEvent } from "react";
import { CureCaution } from "@/components/cure/cure-caution";
import { ShortageMarker } from "@/components/planning/batch-badges";
import { BomTable } from "@/components/planning/bom-table";
import { verdictOf } from "@/components/planning/cure-check";
import { dayFull } from "@/components/planning/dates";
import { gramsText, metresText, putUpWord, type UnitsById } from "@/components/planning/quantities";
import { AmountField } from "@/components/ui/amount-field";
import { describedBy, FieldError, FieldHint, FormMessage } from "@/components/ui/field";
import { SideSheetFooter } from "@/components/ui/side-sheet";
import { CLASS_LABELS } from "@/lib/cure/limits";
import {
  ApiError, newIdempotencyKey, planBatch, recipeQueryOptions, type Batch, type BatchCreateBody, type RecipeSummary,
} from "@/lib/queries/planning";
import { dec, plain, type UnitSystem } from "@/lib/units";

export interface CasingChoice {
  id: string;
  sku: string;
  name: string;
  calibreMinMm: string;
  calibreMaxMm: string;
}

type Errors = Record<string, string[]>;
type Mode = "meat" | "links";

export function PlanBatchForm({ kitchen, today, initialDay, initialRecipe, recipes, casings, units, unitSystem, scaleResolutionG, kitchenNames, onPlanned, onClose }: {
  kitchen: { code: string; name: string };
  today: string;
  initialDay: string;
  initialRecipe?: string;
  recipes: RecipeSummary[];
  casings: CasingChoice[];
  units: UnitsById;
  unitSystem: UnitSystem;
  scaleResolutionG: string;
  kitchenNames: Record<string, string>;
  onPlanned: () => Promise<void>;
  onClose: () => void;
}) {
  const id = useId().replace(/:/g, "");
  const [recipeId, setRecipeId] = useState(initialRecipe ?? "");
  const [day, setDay] = useState(initialDay);
  const [mode, setMode] = useState<Mode>("meat");
  const [meat, setMeat] = useState({ quantity: "", unit: unitSystem === "us" ? "lb" : "kg" });
  const [count, setCount] = useState("");
  const [weight, setWeight] = useState({ quantity: "", unit: unitSystem === "us" ? "oz" : "g" });
  const [casing, setCasing] = useState("");
  const [note, setNote] = useState("");
  const [errors, setErrors] = useState<Errors>({});
  const [message, setMessage] = useState<string>();
  const [busy, setBusy] = useState(false);
  const [planned, setPlanned] = useState<Batch | null>(null);
  const key = useRef<string | null>(null);

  const recipe = useQuery({ ...recipeQueryOptions(recipeId), enabled: recipeId !== "" });
  const spec = recipe.data?.version;
  const range = spec?.casing?.calibreMinMm && spec.casing.calibreMaxMm ? { lo: dec(spec.casing.calibreMinMm), hi: dec(spec.casing.calibreMaxMm) } : null;
  const fitting = casings.filter((c) => !range || (dec(c.calibreMinMm).gte(range.lo) && dec(c.calibreMaxMm).lte(range.hi)));

  const err = (path: string) => {
    const out = Object.entries(errors).filter(([k]) => k === path || k.startsWith(`${path}.`)).flatMap(([, v]) => v);
    return out.length ? out : undefined;
  };

  const chooseRecipe = (value: string) => {
    setRecipeId(value);
    setCasing("");
    key.current = null;
  };

  async function submit(e: FormEvent) {
    e.preventDefault();
    if (busy) return;
    setMessage(undefined);
    const local: Errors = {};
    if (!recipeId) local.recipe = ["Choose the recipe."];
    if (mode === "links" && !/^\d+$/.test(count.trim())) local["links.count"] = ["Give the number of links as a whole number, e.g. 240."];
    if (Object.keys(local).length) {
      setErrors(local);
      return;
    }
    const body: BatchCreateBody = {
      kitchen: kitchen.code,
      recipe: recipeId,
      plannedFor: day,
      ...(mode === "meat"
        ? { meatBlock: { quantity: meat.quantity.trim(), unit: meat.unit } }
        : { links: { count: Number(count.trim()), weight: { quantity: weight.quantity.trim(), unit: weight.unit } } }),
      ...(casing ? { casing } : {}),
      ...(note.trim() ? { note: note.trim() } : {}),
    };
    setBusy(true);
    key.current ??= newIdempotencyKey();
    try {
      const batch = await planBatch(body, key.current);
      key.current = null;
      setErrors({});
      setPlanned(batch);
      await onPlanned();
    } catch (e2) {
      if (!(e2 instanceof ApiError) || e2.status === 0) {
        setMessage(`Not planned: ${e2 instanceof Error ? e2.message : "something went wrong."} Try again: it cannot be planned twice.`);
        return;
      }
      key.current = null;
      if (Object.keys(e2.fields).length) {
        setErrors(e2.fields);
        const placed = /^(recipe|version|plannedFor|meatBlock|links|casing|note)\b/;
        const unplaced = Object.entries(e2.fields).filter(([k]) => !placed.test(k)).flatMap(([, v]) => v);
        setMessage(unplaced[0] ?? (e2.status === 422 ? undefined : e2.message));
        if (e2.fields["links.count"] === undefined && mode === "links" && e2.fields.meatBlock) setErrors({ ...e2.fields, links: e2.fields.meatBlock });
      } else {
        setErrors({});
        setMessage(e2.message);
      }
    } finally {
      setBusy(false);
    }
  }

  const another = () => {
    setPlanned(null);
    setMeat((m) => ({ ...m, quantity: "" }));
    setCount("");
    setNote("");
    setMessage(undefined);
    key.current = null;
  };

  if (planned) {
    return <Planned batch={planned} units={units} unitSystem={unitSystem} scaleResolutionG={scaleResolutionG} kitchenNames={kitchenNames} onClose={onClose} onAnother={another} />;
  }

  return (
    <form onSubmit={(e) => void submit(e)} noValidate className="space-y-5" aria-label="Plan a batch">
      <div>
        <label htmlFor={`${id}-recipe`} className="field-label">Recipe</label>
        <select
          id={`${id}-recipe`}
          className="field-input"
          value={recipeId}
          onChange={(e) => chooseRecipe(e.target.value)}
          data-autofocus=""
          {...describedBy(`${id}-recipe`, err("recipe") ?? err("version"), true)}
        >
          <option value="">Choose a recipe…</option>
          {recipes.map((r) => (
            <option key={r.id} value={r.id}>
              {r.code} · {r.name}{r.hasCure ? " (cure)" : ""}
            </option>
          ))}
        </select>
        <FieldHint id={`${id}-recipe`}>
          {recipe.isFetching && !spec ? (
            "Reading the recipe…"
          ) : spec ? (
            <>
              Version {spec.version} · {CLASS_LABELS[spec.productClass]}
              {spec.casing?.item ? ` · casing ${spec.casing.item.sku}` : spec.casing ? ` · casing ${spec.casing.calibreMinMm}–${spec.casing.calibreMaxMm} mm` : " · no casing"}
            </>
          ) : (
            "The plan uses the recipe's current version."
          )}
        </FieldHint>
        <FieldError id={`${id}-recipe`} errors={err("recipe") ?? err("version")} />
      </div>
      {spec?.cure ? <CureCaution /> : null}

      <div>
        <label htmlFor={`${id}-day`} className="field-label">Production day</label>
        <input
          id={`${id}-day`}
          type="date"
          className="field-input num"
          value={day}
          min={today}
          onChange={(e) => setDay(e.target.value)}
          {...describedBy(`${id}-day`, err("plannedFor"), Boolean(day))}
        />
        {day ? <FieldHint id={`${id}-day`}>{dayFull(day)}</FieldHint> : null}
        <FieldError id={`${id}-day`} errors={err("plannedFor")} />
      </div>

      <fieldset className="space-y-3">
        <legend className="field-label">How much</legend>
        <div className="flex flex-wrap gap-2">
          {([["meat", "Meat block weight"], ["links", "Links × link weight"]] as const).map(([value, label]) => (
            <label key={value} className={`btn ${mode === value ? "border border-pepper bg-salt-deep" : "btn-quiet"} cursor-pointer`}>
              <input type="radio" name={`${id}-mode`} value={value} checked={mode === value} onChange={() => setMode(value)} className="h-4 w-4 accent-paprika" />
              {label}
            </label>
          ))}
        </div>
        {mode === "meat" ? (
          <AmountField
            checkDecimal
            id={`${id}-meat`}
            label="Meat block (green weight)"
            value={meat}
            units={["kg", "lb"]}
            onChange={setMeat}
            errors={err("meatBlock")}
            hint="Meat and fat only, before salt, cure, spices and water."
          />
        ) : (
          <div className="grid grid-cols-[7rem_1fr] gap-3">
            <div>
              <label htmlFor={`${id}-count`} className="field-label">Links</label>
              <input id={`${id}-count`} type="text" inputMode="numeric" className="field-input num" value={count} onChange={(e) => setCount(e.target.value)} autoComplete="off" {...describedBy(`${id}-count`, err("links.count"))} />
              <FieldError id={`${id}-count`} errors={err("links.count")} />
            </div>
            <AmountField
            checkDecimal
              id={`${id}-weight`}
              label="Weight of one link"
              value={weight}
              units={["g", "oz"]}
              onChange={setWeight}
              errors={err("links.weight") ?? (err("links.count") ? undefined : err("links"))}
              hint="Stuffed weight: links × weight is the filling, the meat block follows from the recipe."
            />
          </div>
        )}
      </fieldset>

      <div>
        <label htmlFor={`${id}-casing`} className="field-label">Casing</label>
        <select id={`${id}-casing`} className="field-input" value={casing} onChange={(e) => setCasing(e.target.value)} disabled={!recipeId} {...describedBy(`${id}-casing`, err("casing"), true)}>
          <option value="">{spec?.casing?.item ? `The recipe's: ${spec.casing.item.sku} · ${spec.casing.item.name}` : "None (plan without casing)"}</option>
          {fitting.filter((c) => c.id !== spec?.casing?.item?.id).map((c) => (
            <option key={c.id} value={c.id}>{c.sku} · {c.name}</option>
          ))}
        </select>
        <FieldHint id={`${id}-casing`}>
          {range ? `Casings within the recipe's ${plain(range.lo)}–${plain(range.hi)} mm range.` : "Any casing item; put-ups to open follow from the filling mass."}
        </FieldHint>
        <FieldError id={`${id}-casing`} errors={err("casing")} />
      </div>

      <div>
        <label htmlFor={`${id}-note`} className="field-label">Note (optional)</label>
        <textarea id={`${id}-note`} className="field-input min-h-[4.5rem] py-2" value={note} onChange={(e) => setNote(e.target.value)} maxLength={1000} {...describedBy(`${id}-note`, err("note"))} />
        <FieldError id={`${id}-note`} errors={err("note")} />
      </div>

      {message ? <FormMessage tone="error">{message}</FormMessage> : null}
      <SideSheetFooter>
        <button type="button" className="btn-quiet" onClick={onClose}>Cancel</button>
        <button type="submit" className="btn-primary" disabled={busy}>
          {busy ? <Loader2 aria-hidden className="h-5 w-5 animate-spin" /> : <CalendarPlus aria-hidden className="h-5 w-5" />}
          Plan batch
        </button>
      </SideSheetFooter>
    </form>
  );
}


function Planned({ batch, units, unitSystem, scaleResolutionG, kitchenNames, onClose, onAnother }: {
  batch: Batch;
  units: UnitsById;
  unitSystem: UnitSystem;
  scaleResolutionG: string;
  kitchenNames: Record<string, string>;
  onClose: () => void;
  onAnother: () => void;
}) {
  const casingLine = batch.lines.find((l) => l.role === "casing");
  const verdict = batch.cure ? verdictOf(batch.cure) : null;
  return (
    <div className="space-y-4" aria-label="Planned batch">
      <FormMessage tone="success">
        Planned {batch.recipe.code} for {dayFull(batch.plannedFor)}: {gramsText(batch.meatBlockG, unitSystem)} of meat block.
      </FormMessage>
      <div className="flex flex-wrap items-center gap-2">
        <ShortageMarker status={batch.status} shortLines={batch.shortLines} />
        {batch.shortLines ? <span className="text-sm text-pepper-soft">against this kitchen&rsquo;s available stock; nothing can be reserved until each line has stock.</span> : null}
      </div>
      <h3 className="font-sans text-base font-semibold">Bill of materials</h3>
      <BomTable batch={batch} units={units} unitSystem={unitSystem} scaleResolutionG={scaleResolutionG} kitchenNames={kitchenNames} compact />
      {batch.casing && casingLine ? (
        <p className="text-sm">
          <span className="font-semibold">Casing:</span> {metresText(batch.casing.metres, unitSystem)}
          {batch.casing.putUpsToOpen !== null ? `, open ${batch.casing.putUpsToOpen} ${putUpWord(casingLine.item.id, units, batch.casing.putUpsToOpen)}` : ""}.
        </p>
      ) : null}
      {batch.notes.map((n) => <p key={n} className="text-sm text-pepper-soft">{n}</p>)}
      {batch.cure && verdict ? (
        <>
          <CureCaution />
          <p className={`flex items-start gap-2 rounded-md border px-3 py-2 text-sm font-semibold ${verdict.tone}`}>
            {verdict.icon}
            <span>Cure: {batch.cure.nitritePpm} ppm ingoing nitrite on the rounded amount. {verdict.text}</span>
          </p>
        </>
      ) : null}
      <SideSheetFooter>
        <button type="button" className="btn-quiet" onClick={onClose}>Close</button>
        <button type="button" className="btn-quiet" onClick={onAnother}>Plan another</button>
        <Link href={`/planning/batches/${batch.id}`} className="btn-primary">Open the batch sheet</Link>
      </SideSheetFooter>
    </div>
  );
}
