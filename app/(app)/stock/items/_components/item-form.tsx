"use client";

import { useActionState, useEffect, useId, useMemo, useRef, useState } from "react";
import { SheetForm } from "@/components/ui/sheet-form";
import { Plus, Trash2 } from "lucide-react";
import { CureCaution } from "@/components/cure/cure-caution";
import { CureMarker } from "@/components/cure/cure-marker";
import { describedBy, FieldError, FieldHint, FormMessage, StatusCheckbox, TextField } from "@/components/ui/field";
import { SideSheetFooter } from "@/components/ui/side-sheet";
import { CASING_KINDS, ITEM_CATEGORIES, type ItemCategory, type StockUnit } from "@/db/types";
import { capacityBand, capacityTableFor, defaultCapacityKg } from "@/lib/casing/capacity";
import {
  CASING_KIND_LABELS, defaultStorage, HANK_METRES, isNaturalCasing, PUT_UP_LABELS, STORAGE_LABELS,
  type CasingKind, type PutUpKind,
} from "@/lib/casing/put-ups";
import type { Salt } from "@/lib/cure/limits";
import type { Item } from "@/lib/data/items";
import { isDecimalString } from "@/lib/units";
import { saveItemAction, type ItemFormState } from "../actions";
import { CATEGORY_LABELS, percentOf, STOCK_UNIT_LABELS } from "./format";

const PUT_UPS_FOR: Record<CasingKind, (PutUpKind | "")[]> = {
  natural_hog: ["hank", "tubed_strand", "box"],
  natural_sheep: ["hank", "tubed_strand", "box"],
  natural_beef: ["beef_set", "box"],
  collagen: ["stick", "box", ""],
  fibrous: ["stick", "box", ""],
  cellulose: ["stick", "box", ""],
};

const UNITS_FOR: Record<Exclude<ItemCategory, "cure">, StockUnit[]> = { casing: ["m", "pc"], spice: ["g", "ml", "pc"], ingredient: ["g", "ml", "pc"] };

const FORMS = ["ground", "whole", "cracked", "flakes", "granules", "liquid", "paste", "culture"];
const PACK_UNITS = ["kg", "g", "lb", "oz", "l", "ml", "gal", "m", "yd", "pc"];

interface PackRow {
  key: number;
  name: string;
  quantity: string;
  unit: string;
}

/** Sodium or potassium, beside the fraction it belongs to: lib/cure counts potassium nitrite differently. */
function SaltSelect({ id, substance, defaultValue, errors }: { id: string; substance: "nitrite" | "nitrate"; defaultValue?: Salt; errors?: string[] }) {
  return (
    <div>
      <label htmlFor={id} className="field-label">{substance === "nitrite" ? "Nitrite" : "Nitrate"} salt</label>
      <select id={id} name={`${substance}Salt`} defaultValue={defaultValue ?? "sodium"} className="field-input" {...describedBy(id, errors, true)}>
        <option value="sodium">Sodium {substance}</option>
        <option value="potassium">Potassium {substance}</option>
      </select>
      <FieldHint id={id}>As printed on the label.</FieldHint>
      <FieldError id={id} errors={errors} />
    </div>
  );
}

const safe = <T,>(f: () => T): T | undefined => {
  try {
    return f();
  } catch {
    return undefined;
  }
};

/** Add (no item given) or edit an item. Fields follow the category. */
export function ItemForm({ item, onSaved, onCancel }: { item?: Item; onSaved: (message: string) => void; onCancel: () => void }) {
  const [state, action, pending] = useActionState<ItemFormState, FormData>(saveItemAction, {});
  useEffect(() => {
    if (state.ok) onSaved(state.message ?? "Saved.");
  }, [state, onSaved]);
  const e = state.fieldErrors ?? {};
  const uid = useId();
  const fid = (name: string) => `${uid}-${name}`;

  const c = item?.casing;
  const [category, setCategory] = useState<ItemCategory>(item?.category ?? "casing");
  const [casingKind, setCasingKind] = useState<CasingKind>(c?.kind ?? "natural_hog");
  const [putUp, setPutUp] = useState<PutUpKind | "">(c ? (c.putUp ?? "") : "hank");
  const [calibreMin, setCalibreMin] = useState(c?.calibreMinMm ?? "");
  const storedDefault = c?.putUp ? safe(() => defaultCapacityKg({ casingKind: c.kind, putUp: c.putUp, putUpMetres: c.putUpMetres, calibreMinMm: c.calibreMinMm })) : undefined;
  // a length or capacity that is the default stays empty, so it follows the casing when that changes
  const [putUpMetres, setPutUpMetres] = useState(c?.putUp === "hank" && c.putUpMetres === HANK_METRES ? "" : (c?.putUpMetres ?? ""));
  const initialCapacity = c?.capacityKgPerPutUp && c.capacityKgPerPutUp !== storedDefault ? c.capacityKgPerPutUp : "";
  const [unit, setUnit] = useState<StockUnit>(item?.stockUnit ?? "pc");
  const [trackLots, setTrackLots] = useState(item?.trackLots ?? true);
  const nextKey = useRef(0);
  const [packs, setPacks] = useState<PackRow[]>(() => (item?.packs ?? []).map((p) => ({ key: nextKey.current++, name: p.name, quantity: p.quantity, unit: p.unit })));

  const offeredPutUps = PUT_UPS_FOR[casingKind];
  const natural = isNaturalCasing(casingKind);
  const forcedUnit: StockUnit | null = category === "cure" ? "g" : category === "casing" && putUp ? "pc" : null;
  const unitChoices = category === "cure" ? ["g" as const] : UNITS_FOR[category];
  const shownUnit = forcedUnit ?? (unitChoices.includes(unit) ? unit : unitChoices[0]!);

  const capacityHint = useMemo(() => {
    if (!putUp) return undefined;
    const metres = putUpMetres === "" ? undefined : isDecimalString(putUpMetres) ? putUpMetres : null;
    if (metres === null) return undefined;
    const table = capacityTableFor({ casingKind, putUp, putUpMetres: metres });
    const band = table && isDecimalString(calibreMin) ? safe(() => capacityBand(table, calibreMin)) : undefined;
    if (table && band) {
      return `Leave empty for the trade table's ${band.kg} kg: ${table.basis}, ${band.fromMm}–${band.toMm} mm band holds ${band.kg === band.kgHigh ? band.kg : `${band.kg}–${band.kgHigh}`} kg of filling; the lower figure is the planning default.`;
    }
    if (natural) return "Required here: the trade table has no figure for this casing, calibre and put-up. Kg of filling (meat, water, salt and spices) per put-up.";
    return "Optional: kg of filling per put-up, from the casing maker.";
  }, [casingKind, putUp, putUpMetres, calibreMin, natural]);

  const setPack = (key: number, field: "name" | "quantity" | "unit", value: string) =>
    setPacks((rows) => rows.map((r) => (r.key === key ? { ...r, [field]: value } : r)));

  // errors for fields this form does not show, so none is lost
  const shown = new Set(["sku", "name", "category", "unit", "trackLots", "trackDates", "packs", "archived", "_"]);
  if (category === "casing") for (const k of ["casingKind", "calibreMinMm", "calibreMaxMm", "putUp", "putUpMetres", "capacityKgPerPutUp", "storage"]) shown.add(k);
  if (category === "cure") for (const k of ["nitriteFraction", "nitrateFraction", "nitriteSalt", "nitrateSalt"]) shown.add(k);
  if (category === "spice" || category === "ingredient") for (const k of ["form", "densityGPerMl"]) shown.add(k);
  const stray = Object.entries(e).filter(([k, v]) => v?.length && !shown.has(k) && !k.startsWith("packs."));

  const decimalProps = { inputMode: "decimal" as const, autoComplete: "off", spellCheck: false };

  return (
    <SheetForm action={action}>
      {item ? <input type="hidden" name="id" value={item.id} /> : null}
      <FormMessage tone="error">{state.message ?? e._?.[0]}</FormMessage>
      {stray.length ? (
        <FormMessage tone="error">{stray.map(([k, v]) => `${k}: ${v![0]}`).join(" ")}</FormMessage>
      ) : null}

      <fieldset>
        <legend className="field-label">Category</legend>
        <div className="grid grid-cols-2 gap-2">
          {ITEM_CATEGORIES.map((cat) => (
            <label
              key={cat}
              className={`flex min-h-touch cursor-pointer items-center gap-2 rounded-md border px-3 py-2 has-[:focus-visible]:outline has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-paprika ${
                category === cat ? "border-pepper bg-salt-deep font-semibold" : "border-brine-line bg-white hover:bg-salt"
              }`}
            >
              <input
                type="radio" name="category" value={cat} checked={category === cat} className="h-4 w-4 accent-paprika"
                onChange={() => {
                  setCategory(cat);
                  // each category starts from its usual stock unit
                  if (cat !== item?.category) setUnit(cat === "casing" ? "m" : "g");
                  else setUnit(item.stockUnit);
                }}
              />
              {cat === "cure" ? <CureMarker /> : CATEGORY_LABELS[cat].one}
            </label>
          ))}
        </div>
        <FieldError id={fid("category")} errors={e.category} />
      </fieldset>

      <TextField
        name="sku" id={fid("sku")} label="SKU" required defaultValue={item?.sku} errors={e.sku} initialFocus maxLength={40}
        autoComplete="off" spellCheck={false} className="max-w-[16rem]" hint="Your code for the item, e.g. HOG-32-35. Letters, digits, dots and dashes."
      />
      <TextField name="name" id={fid("name")} label="Name" required defaultValue={item?.name} errors={e.name} autoComplete="off" maxLength={120} />

      {category === "cure" ? (
        <section className="flex flex-col gap-4" aria-label="Cure details">
          <CureCaution />
          <div className="grid grid-cols-2 gap-3">
            <TextField
              name="nitritePercent" id={fid("nitriteFraction")} label="Nitrite, %" required errors={e.nitriteFraction} {...decimalProps}
              defaultValue={item?.cure ? percentOf(item.cure.nitriteFraction) : undefined} placeholder="from the label"
            />
            <SaltSelect id={fid("nitriteSalt")} substance="nitrite" defaultValue={item?.cure?.nitriteSalt} errors={e.nitriteSalt} />
            <TextField
              name="nitratePercent" id={fid("nitrateFraction")} label="Nitrate, %" required errors={e.nitrateFraction} {...decimalProps}
              defaultValue={item?.cure ? percentOf(item.cure.nitrateFraction) : undefined} placeholder="0 if none"
            />
            <SaltSelect id={fid("nitrateSalt")} substance="nitrate" defaultValue={item?.cure?.nitrateSalt} errors={e.nitrateSalt} />
          </div>
          <p className="-mt-2 text-sm text-brine">
            Copy the strengths and salts from this product&apos;s label (e.g. 6.25 % sodium nitrite, 0 % nitrate). Nothing is assumed: cures are sold at many strengths.
            Cure is stocked and planned in grams, and its lots and dates are always tracked.
          </p>
        </section>
      ) : null}

      {category === "casing" ? (
        <section className="flex flex-col gap-4" aria-label="Casing details">
          <div>
            <label htmlFor={fid("casingKind")} className="field-label">Casing kind</label>
            <select
              id={fid("casingKind")} name="casingKind" value={casingKind} className="field-input" {...describedBy(fid("casingKind"), e.casingKind)}
              onChange={(ev) => {
                const kind = ev.target.value as CasingKind;
                setCasingKind(kind);
                if (!PUT_UPS_FOR[kind].includes(putUp)) setPutUp(PUT_UPS_FOR[kind][0]!);
              }}
            >
              {CASING_KINDS.map((k) => <option key={k} value={k}>{CASING_KIND_LABELS[k]}</option>)}
            </select>
            <FieldError id={fid("casingKind")} errors={e.casingKind} />
          </div>
          <fieldset>
            <legend className="field-label">Calibre, mm</legend>
            <div className="grid grid-cols-2 gap-3">
              <div>
                <label htmlFor={fid("calibreMinMm")} className="text-sm text-brine">From</label>
                <input
                  id={fid("calibreMinMm")} name="calibreMinMm" value={calibreMin} onChange={(ev) => setCalibreMin(ev.target.value)}
                  className="field-input" placeholder="32" {...decimalProps} {...describedBy(fid("calibreMinMm"), e.calibreMinMm)}
                />
                <FieldError id={fid("calibreMinMm")} errors={e.calibreMinMm} />
              </div>
              <div>
                <label htmlFor={fid("calibreMaxMm")} className="text-sm text-brine">To</label>
                <input
                  id={fid("calibreMaxMm")} name="calibreMaxMm" defaultValue={c?.calibreMaxMm} className="field-input" placeholder="35"
                  {...decimalProps} {...describedBy(fid("calibreMaxMm"), e.calibreMaxMm)}
                />
                <FieldError id={fid("calibreMaxMm")} errors={e.calibreMaxMm} />
              </div>
            </div>
            <FieldHint id={fid("calibre")}>Stuffed diameter as sold: 32/35 is from 32 to 35 mm.</FieldHint>
          </fieldset>
          <div>
            <label htmlFor={fid("putUp")} className="field-label">Put-up</label>
            <select
              id={fid("putUp")} name="putUp" value={putUp} className="field-input" {...describedBy(fid("putUp"), e.putUp, true)}
              onChange={(ev) => setPutUp(ev.target.value as PutUpKind | "")}
            >
              {offeredPutUps.map((p) => <option key={p} value={p}>{p ? PUT_UP_LABELS[p] : "None: stocked by length or piece"}</option>)}
            </select>
            <FieldHint id={fid("putUp")}>
              {putUp ? `Stocked in pieces: one pc is one ${PUT_UP_LABELS[putUp].toLowerCase()}, and part of one may be used.` : "Manufactured casing kept in metres or single pieces."}
            </FieldHint>
            <FieldError id={fid("putUp")} errors={e.putUp} />
          </div>
          {putUp ? (
            <div className="grid grid-cols-2 gap-3">
              <TextField
                name="putUpMetres" id={fid("putUpMetres")} label={`Metres per ${PUT_UP_LABELS[putUp].toLowerCase()}`} errors={e.putUpMetres}
                value={putUpMetres} onChange={(ev) => setPutUpMetres(ev.target.value)} placeholder={putUp === "hank" ? HANK_METRES : undefined}
                hint={putUp === "hank" ? "Empty: 91.44 m (a hank is 100 yd)." : putUp === "beef_set" ? "Required: 9, 18 or 30 m." : "Required."}
                {...decimalProps}
              />
              <TextField
                name="capacityKgPerPutUp" id={fid("capacityKgPerPutUp")} label="Kg filling per put-up" errors={e.capacityKgPerPutUp}
                defaultValue={initialCapacity} hint={capacityHint} {...decimalProps}
              />
            </div>
          ) : null}
          <div className="max-w-[16rem]">
            <label htmlFor={fid("storage")} className="field-label">Storage</label>
            <select
              key={casingKind} id={fid("storage")} name="storage" className="field-input"
              defaultValue={c && c.kind === casingKind ? c.storage : defaultStorage(casingKind)} {...describedBy(fid("storage"), e.storage)}
            >
              {(["salted", "brine", "dry"] as const).map((s) => <option key={s} value={s}>{STORAGE_LABELS[s]}</option>)}
            </select>
            <FieldError id={fid("storage")} errors={e.storage} />
          </div>
        </section>
      ) : null}

      {category === "spice" || category === "ingredient" ? (
        <section className="grid grid-cols-2 gap-3" aria-label={`${CATEGORY_LABELS[category].one} details`}>
          <TextField
            name="form" id={fid("form")} label="Form (optional)" list={fid("forms")} defaultValue={item?.form ?? undefined} errors={e.form}
            maxLength={60} autoComplete="off" hint="Ground, whole, flakes, liquid, culture…"
          />
          <datalist id={fid("forms")}>{FORMS.map((f) => <option key={f} value={f} />)}</datalist>
          <TextField
            name="densityGPerMl" id={fid("densityGPerMl")} label="Density, g/ml (optional)" defaultValue={item?.densityGPerMl ?? undefined}
            errors={e.densityGPerMl} hint="For liquids that recipes give by volume." {...decimalProps}
          />
        </section>
      ) : null}

      <div className="max-w-[16rem]">
        <label htmlFor={fid("unit")} className="field-label">Stock unit</label>
        {forcedUnit ? (
          <>
            <input type="hidden" name="unit" value={forcedUnit} />
            <p id={fid("unit")} className="flex min-h-touch items-center rounded-md border border-salt-edge bg-salt px-3 text-pepper" {...describedBy(fid("unit"), e.unit, true)}>
              {STOCK_UNIT_LABELS[forcedUnit]}
            </p>
            <FieldHint id={fid("unit")}>{category === "cure" ? "Cure: by mass only." : "One pc is one put-up."}</FieldHint>
          </>
        ) : (
          <select
            id={fid("unit")} name="unit" value={shownUnit} onChange={(ev) => setUnit(ev.target.value as StockUnit)} className="field-input"
            {...describedBy(fid("unit"), e.unit)}
          >
            {unitChoices.map((u) => <option key={u} value={u}>{STOCK_UNIT_LABELS[u]}</option>)}
          </select>
        )}
        <FieldError id={fid("unit")} errors={e.unit} />
      </div>

      {category !== "cure" ? (
        <fieldset className="flex flex-col gap-2">
          <legend className="field-label">Traceability</legend>
          <label className="flex min-h-touch cursor-pointer items-center gap-3 rounded-md border border-brine-line px-3 py-2 hover:bg-salt">
            <input type="checkbox" name="trackLots" checked={trackLots} onChange={(ev) => setTrackLots(ev.target.checked)} className="h-5 w-5 accent-paprika" />
            <span>Track lots (supplier&apos;s lot code on each delivery)</span>
          </label>
          <label className={`flex min-h-touch items-center gap-3 rounded-md border border-brine-line px-3 py-2 ${trackLots ? "cursor-pointer hover:bg-salt" : "text-brine"}`}>
            <input
              key={String(trackLots)} type="checkbox" name="trackDates" disabled={!trackLots}
              defaultChecked={trackLots && (item?.trackLots ? item.trackDates : true)} className="h-5 w-5 accent-paprika"
            />
            <span>Track use-by or best-before dates{trackLots ? "" : " (needs lots)"}</span>
          </label>
          <FieldError id={fid("trackLots")} errors={e.trackLots ?? e.trackDates} />
        </fieldset>
      ) : null}

      <fieldset>
        <legend className="field-label">Purchase packs</legend>
        <p className="mb-2 text-sm text-brine">
          Sizes as the supplier sells them, e.g. a 25 lb pail or a box of 10 hanks. Each is converted exactly to {shownUnit}.
        </p>
        <datalist id={fid("pack-units")}>
          {[...(putUp && category === "casing" ? [putUp === "beef_set" ? "set" : putUp === "tubed_strand" ? "strand" : putUp] : []), ...PACK_UNITS].map((u) => <option key={u} value={u} />)}
        </datalist>
        {packs.length ? (
          <div className="mb-1 grid grid-cols-[1fr_5.5rem_5.5rem_2.75rem] gap-2 text-sm text-brine" aria-hidden>
            <span>Pack</span><span>Size</span><span>Unit</span><span />
          </div>
        ) : null}
        <ul className="flex flex-col gap-2">
          {packs.map((p, i) => {
            const errs = [e[`packs.${i}.name`], e[`packs.${i}.quantity`], e[`packs.${i}.unit`]].flatMap((x) => x ?? []);
            const rowId = fid(`pack-${p.key}`);
            return (
              <li key={p.key}>
                <div className="grid grid-cols-[1fr_5.5rem_5.5rem_2.75rem] gap-2">
                  <input
                    name={`packs.${i}.name`} value={p.name} onChange={(ev) => setPack(p.key, "name", ev.target.value)} aria-label={`Pack ${i + 1} name`}
                    placeholder="25 lb pail" className="field-input" maxLength={60} autoComplete="off" {...describedBy(rowId, e[`packs.${i}.name`])}
                  />
                  <input
                    name={`packs.${i}.quantity`} value={p.quantity} onChange={(ev) => setPack(p.key, "quantity", ev.target.value)} aria-label={`Pack ${i + 1} size`}
                    placeholder="25" className="field-input text-right tabular-nums" {...decimalProps} {...describedBy(rowId, e[`packs.${i}.quantity`])}
                  />
                  <input
                    name={`packs.${i}.unit`} value={p.unit} onChange={(ev) => setPack(p.key, "unit", ev.target.value)} aria-label={`Pack ${i + 1} unit`}
                    placeholder="lb" list={fid("pack-units")} className="field-input" autoComplete="off" {...describedBy(rowId, e[`packs.${i}.unit`])}
                  />
                  <button
                    type="button" className="btn-quiet min-w-touch px-0" aria-label={`Remove pack ${i + 1}`}
                    onClick={() => setPacks((rows) => rows.filter((r) => r.key !== p.key))}
                  >
                    <Trash2 aria-hidden className="h-4 w-4" />
                  </button>
                </div>
                <FieldError id={rowId} errors={errs.length ? [errs.join(" ")] : undefined} />
              </li>
            );
          })}
        </ul>
        <button
          type="button" className="btn-quiet mt-2"
          onClick={() => setPacks((rows) => [...rows, { key: nextKey.current++, name: "", quantity: "", unit: "" }])}
        >
          <Plus aria-hidden className="h-4 w-4" />
          Add a pack
        </button>
        <FieldError id={fid("packs")} errors={e.packs} />
      </fieldset>

      {item ? (
        <StatusCheckbox id="item-archived" name="archived" label="Archived" defaultChecked={item.archived}
          hint={item.archived ? "Untick to use this item again." : "Leaves lists and pickers. Its lots and history stay."} />
      ) : null}

      <SideSheetFooter>
        <button type="button" className="btn-quiet" onClick={onCancel}>Cancel</button>
        <button type="submit" className="btn-primary" disabled={pending}>
          {pending ? "Saving…" : item ? "Save changes" : "Add item"}
        </button>
      </SideSheetFooter>
    </SheetForm>
  );
}
