"use client";

// A recipe, or a new version of one: the meat block (shares adding up to 100 %), the lines (an
// item from the catalogue at a rate per kg of meat block or of pickle), the casing, the product
// class and storage, process notes. The server checks everything again (the items, the units, the
// cure against the company's table) and names each field it refuses ("lines.2.rate"); the message
// appears beside that field. Rows left completely empty are not sent.
import { useQuery } from "@tanstack/react-query";
import { Loader2, Plus, Save, Trash2 } from "lucide-react";
import { useRouter } from "next/navigation";
import { useEffect, useId, useRef, useState, type FormEvent, type ReactNode } from "react";
import { CureCaution } from "@/components/cure/cure-caution";
import { describedBy, FieldError, FieldHint, FormMessage } from "@/components/ui/field";
import { CLASS_LABELS, PRODUCT_CLASSES, type ProductClass, type Storage } from "@/lib/cure/limits";
import { methodOf } from "@/lib/cure/method";
import {
  addRecipeVersion, ApiError, createRecipe, itemsQueryOptions, newIdempotencyKey, type Item, type Recipe, type RecipeCreateBody,
} from "@/lib/queries/planning";
import { dec, isDecimalString, plain } from "@/lib/units";

type Errors = Record<string, string[]>;
type RateUnit = "g/kg" | "%" | "ml/kg";
type Basis = "meat_block" | "pickle";

interface MeatRow { key: number; name: string; percent: string }
interface LineRow { key: number; item: string; rate: string; unit: RateUnit; basis: Basis }
type LinkBy = "none" | "length" | "weight";

let nextKey = 1;
const meatRow = (name = "", percent = ""): MeatRow => ({ key: nextKey++, name, percent });
const lineRow = (l: Partial<Omit<LineRow, "key">> = {}): LineRow => ({ key: nextKey++, item: "", rate: "", unit: "g/kg", basis: "meat_block", ...l });

const CATEGORY_GROUPS: { category: Item["category"]; label: string }[] = [
  { category: "cure", label: "Cures" },
  { category: "spice", label: "Spices and seasonings" },
  { category: "ingredient", label: "Other ingredients" },
];

const CLASS_HINT = "Dry and fermented sausages (salami, pepperoni) are comminuted: the chopped-meat limit applies, never the dry-cured one.";

export function RecipeForm({ recipe, initialItems }: {
  /** a new version of this recipe (prefilled from the version shown), else a new recipe */
  recipe?: Recipe;
  initialItems: Item[];
}) {
  const router = useRouter();
  const id = useId().replace(/:/g, "");
  const items = useQuery({ ...itemsQueryOptions(), initialData: initialItems }).data;
  const v = recipe?.version;
  const [code, setCode] = useState("");
  const [name, setName] = useState(recipe?.name ?? "");
  const [productClass, setProductClass] = useState<ProductClass>(v?.productClass ?? "comminuted");
  const [storage, setStorage] = useState<Storage>(v?.storage ?? "keep_refrigerated");
  const [meat, setMeat] = useState<MeatRow[]>(() => (v ? v.meatBlock.map((m) => meatRow(m.name, m.percent)) : [meatRow("", "70"), meatRow("", "30")]));
  const [lines, setLines] = useState<LineRow[]>(() => (v ? v.lines.map((l) => lineRow({ item: l.item.id, rate: l.rate, unit: l.unit, basis: l.basis })) : [lineRow(), lineRow(), lineRow()]));
  const [pickle, setPickle] = useState({ kgPerKgMeat: v?.pickle?.kgPerKgMeat ?? "", pumpPercent: v?.pickle?.pumpFraction ? plain(dec(v.pickle.pumpFraction).times(100)) : "" });
  const [casingItem, setCasingItem] = useState(v?.casing?.item?.id ?? "");
  const [calibre, setCalibre] = useState({ min: v?.casing?.calibreMinMm ?? "", max: v?.casing?.calibreMaxMm ?? "" });
  const [linkBy, setLinkBy] = useState<LinkBy>(v?.casing?.linkLengthM ? "length" : v?.casing?.linkWeightG ? "weight" : "none");
  const [link, setLink] = useState(() =>
    v?.casing?.linkLengthM
      ? { quantity: plain(dec(v.casing.linkLengthM).times(100)), unit: "cm" }
      : v?.casing?.linkWeightG
        ? { quantity: v.casing.linkWeightG, unit: "g" }
        : { quantity: "", unit: "cm" },
  );
  const [processNotes, setProcessNotes] = useState(v?.processNotes ?? "");
  const [changeNote, setChangeNote] = useState("");
  const [errors, setErrors] = useState<Errors>({});
  const [message, setMessage] = useState<string>();
  const [busy, setBusy] = useState(false);
  const key = useRef<string | null>(null);
  const form = useRef<HTMLFormElement>(null);
  const [focusError, setFocusError] = useState(0);

  const method = methodOf(productClass);
  const usesPickle = method === "pumped" || method === "immersion";
  const meatTotal = meat.reduce((s, m) => (isDecimalString(m.percent.trim()) ? s.plus(dec(m.percent.trim())) : s), dec("0"));
  const meatBad = meat.some((m) => m.percent.trim() !== "" && !isDecimalString(m.percent.trim()));
  const casings = items.filter((i) => i.category === "casing" && !i.archived);
  const pickable = items.filter((i) => i.category !== "casing" && !i.archived);
  const hasCure = lines.some((l) => items.find((i) => i.id === l.item)?.category === "cure");

  // after a refusal, the first field named goes into focus (and view)
  useEffect(() => {
    if (!focusError) return;
    form.current?.querySelector<HTMLElement>("[aria-invalid='true']")?.focus();
  }, [focusError]);

  const err = (path: string) => {
    const out = Object.entries(errors).filter(([k]) => k === path || k.startsWith(`${path}.`)).flatMap(([, m]) => m);
    return out.length ? out : undefined;
  };
  const only = (path: string) => errors[path];

  function buildBody(): { body: RecipeCreateBody; lineKeys: number[] } {
    const sent = lines.filter((l) => l.item || l.rate.trim());
    const body: RecipeCreateBody = {
      code: code.trim(),
      name: name.trim(),
      productClass,
      storage,
      meatBlock: meat.map((m) => ({ name: m.name.trim(), percent: m.percent.trim() })),
      lines: sent.map((l) => ({ item: l.item, rate: l.rate.trim(), unit: l.unit, basis: usesPickle ? l.basis : "meat_block" })),
      processNotes: processNotes.trim(),
      changeNote: changeNote.trim(),
    };
    if (usesPickle) {
      body.pickle = { kgPerKgMeat: pickle.kgPerKgMeat.trim() };
      if (method === "pumped") {
        const p = pickle.pumpPercent.trim();
        body.pickle.pumpFraction = isDecimalString(p) ? plain(dec(p).div(100)) : p;
      }
    }
    if (casingItem || calibre.min.trim() || calibre.max.trim() || (linkBy !== "none" && link.quantity.trim())) {
      body.casing = {
        ...(casingItem ? { item: casingItem } : {}),
        ...(calibre.min.trim() ? { calibreMinMm: calibre.min.trim() } : {}),
        ...(calibre.max.trim() ? { calibreMaxMm: calibre.max.trim() } : {}),
        ...(linkBy === "length" ? { linkLength: { quantity: link.quantity.trim(), unit: link.unit } } : {}),
        ...(linkBy === "weight" ? { linkWeight: { quantity: link.quantity.trim(), unit: link.unit } } : {}),
      };
    }
    return { body, lineKeys: sent.map((l) => l.key) };
  }

  /** The server names lines by their index among the rows sent; the form names them by row. */
  function placeErrors(fields: Errors, lineKeys: number[]): Errors {
    const out: Errors = {};
    for (const [path, messages] of Object.entries(fields)) {
      const m = /^lines\.(\d+)(\..*)?$/.exec(path);
      const k = m ? lineKeys[Number(m[1])] : undefined;
      const placed = m && k !== undefined ? `line-${k}${m[2] ?? ""}` : path;
      (out[placed] ??= []).push(...messages);
    }
    return out;
  }

  async function submit(e: FormEvent) {
    e.preventDefault();
    if (busy) return;
    setMessage(undefined);
    const { body, lineKeys } = buildBody();
    setBusy(true);
    key.current ??= newIdempotencyKey();
    try {
      const saved = recipe
        ? await addRecipeVersion(recipe.id, { ...body, code: undefined } as Omit<RecipeCreateBody, "code">, key.current)
        : await createRecipe(body, key.current);
      key.current = null;
      router.push(`/planning/recipes/${saved.id}?saved=${saved.currentVersion}`);
      router.refresh();
    } catch (e2) {
      if (!(e2 instanceof ApiError) || e2.status === 0) {
        setMessage(`Not saved: ${e2 instanceof Error ? e2.message : "something went wrong."} Try again: it cannot be saved twice.`);
        setBusy(false);
        return;
      }
      key.current = null;
      const placed = placeErrors(e2.fields, lineKeys);
      setErrors(placed);
      const known = /^(code|name|productClass|storage|meatBlock|line-\d+|pickle|casing|processNotes|changeNote)\b/;
      const stray = Object.entries(placed).filter(([k]) => !known.test(k)).flatMap(([, m]) => m);
      const count = Object.keys(placed).length;
      const why = e2.status === 422 && /statutory maximum/.test(e2.message) ? ` ${e2.message}` : "";
      setMessage(
        count
          ? `Not saved.${why} ${count === 1 ? "One field needs" : `${count} fields need`} attention, marked beside ${count === 1 ? "it" : "them"}.${stray.length ? ` ${stray.join(" ")}` : ""}`
          : `Not saved: ${e2.message}`,
      );
      setFocusError((n) => n + 1);
      setBusy(false);
    }
  }

  const totalOk = meatTotal.eq(100) && !meatBad;

  return (
    <form ref={form} onSubmit={(e) => void submit(e)} noValidate className="max-w-5xl space-y-6" aria-label={recipe ? `New version of ${recipe.code}` : "New recipe"}>
      <Section title="The recipe">
        <div className="grid gap-4 md:grid-cols-[12rem_1fr]">
          {recipe ? (
            <div>
              <p className="field-label">Code</p>
              <p className="num flex min-h-touch items-center font-semibold">{recipe.code}</p>
            </div>
          ) : (
            <Text id="code" label="Code" value={code} onChange={setCode} errors={only("code")} hint="Batch codes start with it, e.g. BRAT-1." />
          )}
          <Text id="name" label="Name" value={name} onChange={setName} errors={only("name")} />
        </div>
        <div className="grid gap-4 md:grid-cols-2">
          <div>
            <label htmlFor="productClass" className="field-label">Product class</label>
            <select id="productClass" className="field-input" value={productClass} onChange={(e) => setProductClass(e.target.value as ProductClass)} {...describedBy("productClass", only("productClass"), true)}>
              {PRODUCT_CLASSES.map((c) => <option key={c} value={c}>{CLASS_LABELS[c]}</option>)}
            </select>
            <FieldHint id="productClass">{CLASS_HINT}</FieldHint>
            <FieldError id="productClass" errors={only("productClass")} />
          </div>
          <fieldset aria-describedby={only("storage") ? "storage-error" : undefined}>
            <legend className="field-label">Storage</legend>
            <div className="flex flex-wrap gap-4">
              {([["keep_refrigerated", "Keep refrigerated"], ["shelf_stable", "Shelf stable"]] as const).map(([value, label]) => (
                <label key={value} className="flex min-h-touch cursor-pointer items-center gap-2">
                  <input type="radio" name={`${id}-storage`} value={value} checked={storage === value} onChange={() => setStorage(value)} className="h-4 w-4 accent-paprika" />
                  {label}
                </label>
              ))}
            </div>
            <p className="mt-1 text-sm text-brine">Keep-refrigerated cured products are checked against the 120 ppm minimum.</p>
            <FieldError id="storage" errors={only("storage")} />
          </fieldset>
        </div>
      </Section>

      <Section title="Meat block" description="The meat and fat that every rate is per kg of: their shares add up to 100 %.">
        <div className="space-y-2">
          <div aria-hidden className="grid grid-cols-[1fr_8rem_44px] gap-2 text-sm font-semibold text-brine">
            <span>Meat or fat</span><span>Share</span><span />
          </div>
          {meat.map((m, i) => (
            <div key={m.key}>
              <div className="grid grid-cols-[1fr_8rem_44px] items-start gap-2">
                <Text id={`meatBlock.${i}.name`} label={`Meat ${i + 1}: name`} value={m.name} onChange={(name2) => setMeat((rs) => rs.map((r) => (r.key === m.key ? { ...r, name: name2 } : r)))} errors={err(`meatBlock.${i}.name`)} placeholder="e.g. Pork shoulder, trimmed" srLabel errorsBelow />
                <Text id={`meatBlock.${i}.percent`} label={`Meat ${i + 1}: share (%)`} value={m.percent} onChange={(p) => setMeat((rs) => rs.map((r) => (r.key === m.key ? { ...r, percent: p } : r)))} errors={err(`meatBlock.${i}.percent`)} decimal suffix="%" srLabel errorsBelow />
                <RemoveButton label={`Remove meat ${i + 1}`} disabled={meat.length === 1} onClick={() => setMeat((rs) => rs.filter((r) => r.key !== m.key))} />
              </div>
              <RowErrors fields={[[`meatBlock.${i}.name`, err(`meatBlock.${i}.name`)], [`meatBlock.${i}.percent`, err(`meatBlock.${i}.percent`)]]} />
            </div>
          ))}
        </div>
        <div className="flex flex-wrap items-center justify-between gap-3">
          <button type="button" className="btn-quiet" onClick={() => setMeat((rs) => [...rs, meatRow()])} disabled={meat.length >= 20}>
            <Plus aria-hidden className="h-4 w-4" /> Add meat or fat
          </button>
          <p id="meat-total" className={`num text-sm font-semibold ${totalOk ? "text-herb" : "text-amber"}`} aria-live="polite">
            {meatBad ? "A share is not a number." : totalOk ? "Adds up to 100 %." : `Adds up to ${plain(meatTotal)} %: it must be 100 %.`}
          </p>
        </div>
        <FieldError id="meatBlock" errors={only("meatBlock")} />
      </Section>

      <Section title="Lines" description={`Salt, cure, spices and liquids, each at a rate per kg of ${usesPickle ? "meat block or of pickle" : "meat block"}: g/kg, % of it, or ml/kg for liquids with a density.`}>
        {hasCure ? <CureCaution /> : null}
        <div className="space-y-2">
          <div aria-hidden className="grid gap-2 text-sm font-semibold text-brine" style={{ gridTemplateColumns: usesPickle ? "1fr 7rem 6rem 9rem 44px" : "1fr 7rem 6rem 44px" }}>
            <span>Item</span><span>Rate</span><span>Unit</span>{usesPickle ? <span>Per kg of</span> : null}<span />
          </div>
          {lines.map((l, i) => {
            const p = `line-${l.key}`;
            const chosen = items.find((it) => it.id === l.item);
            return (
              <div key={l.key}>
              <div className="grid items-start gap-2" style={{ gridTemplateColumns: usesPickle ? "1fr 7rem 6rem 9rem 44px" : "1fr 7rem 6rem 44px" }}>
                <div>
                  <label htmlFor={`${p}.item`} className="sr-only">Line {i + 1}: item</label>
                  <select id={`${p}.item`} className="field-input" value={l.item} onChange={(e) => setLines((rs) => rs.map((r) => (r.key === l.key ? { ...r, item: e.target.value } : r)))} {...describedBy(`${p}.item`, only(`${p}.item`) ?? only(p))}>
                    <option value="">Choose an item…</option>
                    {chosen && !pickable.includes(chosen) ? <option value={chosen.id}>{chosen.sku} · {chosen.name} (archived)</option> : null}
                    {CATEGORY_GROUPS.map((g) => (
                      <optgroup key={g.category} label={g.label}>
                        {pickable.filter((it) => it.category === g.category).map((it) => (
                          <option key={it.id} value={it.id}>{it.sku} · {it.name}{it.cure ? ` (cure, ${plain(dec(it.cure.nitriteFraction).times(100))} % nitrite)` : ""}</option>
                        ))}
                      </optgroup>
                    ))}
                  </select>
                </div>
                <Text id={`${p}.rate`} label={`Line ${i + 1}: rate`} value={l.rate} onChange={(rate) => setLines((rs) => rs.map((r) => (r.key === l.key ? { ...r, rate } : r)))} errors={only(`${p}.rate`)} decimal srLabel errorsBelow />
                <div>
                  <label htmlFor={`${p}.unit`} className="sr-only">Line {i + 1}: unit</label>
                  <select id={`${p}.unit`} className="field-input" value={l.unit} onChange={(e) => setLines((rs) => rs.map((r) => (r.key === l.key ? { ...r, unit: e.target.value as RateUnit } : r)))} {...describedBy(`${p}.unit`, only(`${p}.unit`))}>
                    <option value="g/kg">g/kg</option>
                    <option value="%">%</option>
                    <option value="ml/kg">ml/kg</option>
                  </select>
                </div>
                {usesPickle ? (
                  <div>
                    <label htmlFor={`${p}.basis`} className="sr-only">Line {i + 1}: per kg of</label>
                    <select id={`${p}.basis`} className="field-input" value={l.basis} onChange={(e) => setLines((rs) => rs.map((r) => (r.key === l.key ? { ...r, basis: e.target.value as Basis } : r)))} {...describedBy(`${p}.basis`, only(`${p}.basis`))}>
                      <option value="meat_block">meat block</option>
                      <option value="pickle">pickle</option>
                    </select>
                  </div>
                ) : null}
                <RemoveButton label={`Remove line ${i + 1}`} onClick={() => setLines((rs) => rs.filter((r) => r.key !== l.key))} />
              </div>
              <RowErrors fields={[[`${p}.item`, only(`${p}.item`) ?? only(p)], [`${p}.rate`, only(`${p}.rate`)], [`${p}.unit`, only(`${p}.unit`)], [`${p}.basis`, only(`${p}.basis`)]]} />
              </div>
            );
          })}
        </div>
        <button type="button" className="btn-quiet" onClick={() => setLines((rs) => [...rs, lineRow()])} disabled={lines.length >= 60}>
          <Plus aria-hidden className="h-4 w-4" /> Add a line
        </button>
        <FieldError id="lines" errors={only("lines")} />
      </Section>

      {usesPickle ? (
        <Section title="Pickle" description="The brine the cure goes into: kg of pickle per kg of meat.">
          <div className="grid gap-4 md:grid-cols-2">
            <Text id="pickle.kgPerKgMeat" label="Pickle per kg of meat (kg)" value={pickle.kgPerKgMeat} onChange={(x) => setPickle((p) => ({ ...p, kgPerKgMeat: x }))} errors={err("pickle.kgPerKgMeat") ?? only("pickle")} decimal />
            {method === "pumped" ? (
              <Text id="pickle.pumpFraction" label="Pump level (%)" value={pickle.pumpPercent} onChange={(x) => setPickle((p) => ({ ...p, pumpPercent: x }))} errors={err("pickle.pumpFraction")} decimal hint="Pickle injected per green weight, e.g. 10." />
            ) : null}
          </div>
        </Section>
      ) : null}

      <Section title="Casing" description="A casing item, or a calibre range any casing item must fall in (or both); and the link length or weight.">
        <div className="grid gap-4 md:grid-cols-[1fr_8rem_8rem]">
          <div>
            <label htmlFor="casing.item" className="field-label">Casing item</label>
            <select id="casing.item" className="field-input" value={casingItem} onChange={(e) => setCasingItem(e.target.value)} {...describedBy("casing.item", err("casing.item") ?? only("casing"))}>
              <option value="">No item: a calibre range only</option>
              {casings.map((c) => <option key={c.id} value={c.id}>{c.sku} · {c.name}</option>)}
            </select>
            <FieldError id="casing.item" errors={err("casing.item") ?? only("casing")} />
          </div>
          <Text id="casing.calibreMinMm" label="Calibre from (mm)" value={calibre.min} onChange={(x) => setCalibre((c) => ({ ...c, min: x }))} errors={err("casing.calibreMinMm")} decimal />
          <Text id="casing.calibreMaxMm" label="to (mm)" value={calibre.max} onChange={(x) => setCalibre((c) => ({ ...c, max: x }))} errors={err("casing.calibreMaxMm")} decimal />
        </div>
        <fieldset className="grid gap-4 md:grid-cols-[auto_1fr] md:items-end">
          <legend className="field-label">Links</legend>
          <div className="flex flex-wrap gap-4">
            {([["none", "Not linked"], ["length", "By length"], ["weight", "By weight"]] as const).map(([value, label]) => (
              <label key={value} className="flex min-h-touch cursor-pointer items-center gap-2">
                <input
                  type="radio" name={`${id}-link`} value={value} checked={linkBy === value} className="h-4 w-4 accent-paprika"
                  onChange={() => {
                    setLinkBy(value);
                    setLink({ quantity: "", unit: value === "weight" ? "g" : "cm" });
                  }}
                />
                {label}
              </label>
            ))}
          </div>
          {linkBy !== "none" ? (
            <div className="flex max-w-xs gap-2">
              <Text id={`casing.link${linkBy === "length" ? "Length" : "Weight"}.quantity`} label={linkBy === "length" ? "Link length" : "Link weight"} value={link.quantity}
                onChange={(x) => setLink((k) => ({ ...k, quantity: x }))} errors={err(linkBy === "length" ? "casing.linkLength" : "casing.linkWeight")} decimal srLabel />
              <label htmlFor={`${id}-link-unit`} className="sr-only">Link {linkBy}: unit</label>
              <select id={`${id}-link-unit`} className="field-input w-24 shrink-0" value={link.unit} onChange={(e) => setLink((k) => ({ ...k, unit: e.target.value }))}>
                {(linkBy === "length" ? ["cm", "mm", "in"] : ["g", "oz"]).map((u) => <option key={u} value={u}>{u}</option>)}
              </select>
            </div>
          ) : null}
        </fieldset>
      </Section>

      <Section title="Process notes" description="Method and critical limits as text (temperatures, pH, weight loss): printed on every batch sheet's recipe.">
        <div>
          <label htmlFor="processNotes" className="sr-only">Process notes</label>
          <textarea id="processNotes" className="field-input min-h-[7rem] py-2" value={processNotes} onChange={(e) => setProcessNotes(e.target.value)} maxLength={4000} {...describedBy("processNotes", only("processNotes"))} />
          <FieldError id="processNotes" errors={only("processNotes")} />
        </div>
        {recipe ? <Text id="changeNote" label="What changed in this version" value={changeNote} onChange={setChangeNote} errors={only("changeNote")} decimal={false} hint={`Version ${recipe.currentVersion + 1}; batches already planned keep the version they were planned with.`} /> : null}
      </Section>

      {message ? <FormMessage tone="error">{message}</FormMessage> : null}
      <div className="flex justify-end gap-2">
        <button type="button" className="btn-quiet" onClick={() => router.back()}>Cancel</button>
        <button type="submit" className="btn-primary" disabled={busy}>
          {busy ? <Loader2 aria-hidden className="h-5 w-5 animate-spin" /> : <Save aria-hidden className="h-5 w-5" />}
          {recipe ? `Save version ${recipe.currentVersion + 1}` : "Save recipe"}
        </button>
      </div>
    </form>
  );
}

function Section({ title, description, children }: { title: string; description?: string; children: ReactNode }) {
  const hid = useId();
  return (
    <section aria-labelledby={hid} className="panel space-y-4 px-5 py-5">
      <div>
        <h2 id={hid} className="text-xl font-semibold">{title}</h2>
        {description ? <p className="mt-0.5 text-sm text-brine">{description}</p> : null}
      </div>
      {children}
    </section>
  );
}

function Text({ id, label, value, onChange, errors, hint, decimal = false, srLabel = false, placeholder, suffix, errorsBelow = false }: {
  id: string;
  label: string;
  value: string;
  onChange: (v: string) => void;
  errors?: string[];
  hint?: string;
  decimal?: boolean;
  /** the label only for assistive technology (a row's column header says it) */
  srLabel?: boolean;
  placeholder?: string;
  suffix?: string;
  /** the row shows the message across its full width (see RowErrors), not in this narrow cell */
  errorsBelow?: boolean;
}) {
  return (
    <div>
      <label htmlFor={id} className={srLabel ? "sr-only" : "field-label"}>{label}</label>
      <div className="relative">
        <input
          id={id} type="text" inputMode={decimal ? "decimal" : undefined} autoComplete="off" placeholder={placeholder}
          className={`field-input ${decimal ? "num" : ""} ${suffix ? "pr-8" : ""}`} value={value} onChange={(e) => onChange(e.target.value)}
          {...describedBy(id, errors, Boolean(hint))}
        />
        {suffix ? <span aria-hidden className="pointer-events-none absolute inset-y-0 right-3 flex items-center text-brine">{suffix}</span> : null}
      </div>
      {hint ? <FieldHint id={id}>{hint}</FieldHint> : null}
      {errorsBelow ? null : <FieldError id={id} errors={errors} />}
    </div>
  );
}

/** A row's field messages across the row's full width, each still tied to its field by id. */
function RowErrors({ fields }: { fields: [string, string[] | undefined][] }) {
  if (!fields.some(([, e]) => e?.length)) return null;
  return <div className="-mt-1 space-y-0.5 pb-1">{fields.map(([fid, e]) => <FieldError key={fid} id={fid} errors={e} />)}</div>;
}

function RemoveButton({ label, onClick, disabled }: { label: string; onClick: () => void; disabled?: boolean }) {
  return (
    <button type="button" className="btn-quiet min-w-touch px-0" aria-label={label} onClick={onClick} disabled={disabled}>
      <Trash2 aria-hidden className="h-4 w-4" />
    </button>
  );
}
