// The catalogue's schemas: one item shape for casings, cures, spices and other ingredients, with
// each category's own attributes held in shape by resolveItem(), which also fills the defaults
// (hank length, casing capacity from the trade table, storage, lot tracking) and converts each
// purchase pack to the stock unit exactly. Client-safe: forms, actions, routes and lib/data share it.
import { z } from "zod";
import { CASING_KINDS, CASING_STORAGE, ITEM_CATEGORIES, PUT_UPS, STOCK_UNITS, type ItemCategory, type StockUnit } from "../../db/types";
import { defaultCapacityKg } from "../casing/capacity";
import { SALTS, type Salt } from "../cure/limits";
import { defaultStorage, HANK_METRES, isNaturalCasing, PUT_UP_KINDS, PUT_UP_LABELS, putUpFits, type CasingKind, type CasingStorage, type PutUpKind } from "../casing/put-ups";
import {
  assertItemUnits, dec, findGlobalUnit, isDecimalString, isUnitError, isUnitFor, normaliseUnitName, plain, toStockUnits, toStoredQuantity,
  type ItemUnits,
} from "../units";
import { decimalString } from "./common";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
export const isUuid = (s: string) => UUID.test(s);

const positive = (schema: z.ZodString) => schema.refine((s) => dec(s).gt(0), { error: "Must be more than 0." });

// ---------------------------------------------------------------------------------------------
// Fields

/** Letters, digits, dot, dash and underscore: it travels in URLs (/api/items/HOG-32-35). Kept as typed. */
export const sku = z
  .string({ error: "Enter the SKU." })
  .trim()
  .min(1, "Enter the SKU.")
  .max(40, "At most 40 characters.")
  .regex(/^[A-Za-z0-9][A-Za-z0-9._-]*$/, "Use letters, digits, dots, dashes or underscores, e.g. HOG-32-35.")
  .refine((s) => !isUuid(s), { error: "An SKU cannot look like an id (a UUID)." });

const name = z.string({ error: "Enter the item's name." }).trim().min(1, "Enter the item's name.").max(120, "At most 120 characters.");
const category = z.enum(ITEM_CATEGORIES, { error: "Choose a category: casing, cure, spice or ingredient." });
const unit = z.enum(STOCK_UNITS, { error: "Choose the stock unit: g, m, ml or pc." });
const flag = z.boolean({ error: "Send true or false." });

/** mm, NUMERIC(8,2) */
const calibre = positive(decimalString({ scale: 2 })).refine((s) => dec(s).lt(1000), { error: "A calibre is under 1000 mm." });
/** a fraction of the cure's mass from its label, NUMERIC(10,8): 6.25 % is "0.0625" */
const fraction = decimalString({ scale: 8 }).refine((s) => dec(s).lte(1), { error: "A fraction from 0 to 1: 6.25 % is 0.0625." });
/** which salt the label names: potassium nitrite converts differently from sodium (trade-facts §2) */
const salt = z.enum(SALTS, { error: "Choose the salt as printed on the label: sodium or potassium." });
/** NUMERIC(30,12) */
const positive12 = positive(decimalString({ scale: 12 }));

export const packInput = z.object({
  name: z.string({ error: "Name the pack, e.g. \"25 lb pail\"." }).trim().min(1, "Name the pack, e.g. \"25 lb pail\".").max(60, "At most 60 characters."),
  quantity: positive12,
  unit: z.string({ error: "Enter the unit the pack's size is in, e.g. lb." }).trim().min(1, "Enter the unit the pack's size is in, e.g. lb.").max(30, "At most 30 characters."),
});
export type PackInput = z.infer<typeof packInput>;

const packs = z.array(packInput, { error: "Send the packs as a list." }).max(20, "At most 20 packs.");

const casingKind = z.enum(CASING_KINDS, { error: "Choose the casing: natural_hog, natural_sheep, natural_beef, collagen, fibrous or cellulose." });
const putUp = z.enum(PUT_UPS, { error: "Choose the put-up: hank, beef_set, tubed_strand, stick or box." });
const storage = z.enum(CASING_STORAGE, { error: "Choose the storage: salted, brine or dry." });
const form = z.string({ error: "Describe the form as text, e.g. ground." }).trim().max(60, "At most 60 characters.");

const attributeFields = {
  // casings
  casingKind,
  calibreMinMm: calibre,
  calibreMaxMm: calibre,
  putUp,
  putUpMetres: positive12,
  capacityKgPerPutUp: positive12,
  storage,
  // cures
  nitriteFraction: fraction,
  nitrateFraction: fraction,
  nitriteSalt: salt,
  nitrateSalt: salt,
  // spices and other ingredients
  form,
  densityGPerMl: positive12,
};

const draftShape = {
  sku,
  name,
  category,
  unit,
  trackLots: flag.optional(),
  trackDates: flag.optional(),
  packs: packs.optional(),
  casingKind: attributeFields.casingKind.optional(),
  calibreMinMm: attributeFields.calibreMinMm.optional(),
  calibreMaxMm: attributeFields.calibreMaxMm.optional(),
  putUp: attributeFields.putUp.optional(),
  putUpMetres: attributeFields.putUpMetres.optional(),
  capacityKgPerPutUp: attributeFields.capacityKgPerPutUp.optional(),
  storage: attributeFields.storage.optional(),
  nitriteFraction: attributeFields.nitriteFraction.optional(),
  nitrateFraction: attributeFields.nitrateFraction.optional(),
  nitriteSalt: attributeFields.nitriteSalt.optional(),
  nitrateSalt: attributeFields.nitrateSalt.optional(),
  form: attributeFields.form.optional(),
  densityGPerMl: attributeFields.densityGPerMl.optional(),
};

/** An item as a person describes it: the create body, and the whole item a PATCH merges into. */
export type ItemDraft = z.output<z.ZodObject<typeof draftShape>>;

/**
 * POST /api/items. Cross-field rules and defaults: resolveItem(), run on the fields that parsed
 * (a field already refused is not blamed again, nor are the fields it would drag along).
 */
export const itemCreateInput = z.object(draftShape).superRefine((draft, ctx) => {
  const failed = new Set(ctx.issues.map((i) => String(i.path?.[0] ?? "")));
  if (failed.has("category") || failed.has("unit") || failed.has("")) return;
  const d: Record<string, unknown> = { ...draft };
  for (const f of failed) delete d[f];
  const r = resolveItem(d as ItemDraft);
  if (r.ok) return;
  for (const [path, messages] of Object.entries(r.fields)) {
    if (failed.has(path.split(".")[0]!)) continue;
    for (const message of messages) ctx.addIssue({ code: "custom", message, path: path.split(".").map((p) => (/^\d+$/.test(p) ? Number(p) : p)) });
  }
});

/**
 * PATCH /api/items/{id}: any field; null clears an optional attribute (a cleared put-up length,
 * capacity or cure salt takes its default again). `packs` replaces every pack. `archived` hides the item.
 * The merged item is checked as a whole (mergeItemPatch, then resolveItem).
 */
export const itemPatchInput = z
  .object({
    sku,
    name,
    category,
    unit,
    trackLots: flag,
    trackDates: flag,
    packs,
    casingKind: attributeFields.casingKind.nullable(),
    calibreMinMm: attributeFields.calibreMinMm.nullable(),
    calibreMaxMm: attributeFields.calibreMaxMm.nullable(),
    putUp: attributeFields.putUp.nullable(),
    putUpMetres: attributeFields.putUpMetres.nullable(),
    capacityKgPerPutUp: attributeFields.capacityKgPerPutUp.nullable(),
    storage: attributeFields.storage.nullable(),
    nitriteFraction: attributeFields.nitriteFraction.nullable(),
    nitrateFraction: attributeFields.nitrateFraction.nullable(),
    nitriteSalt: attributeFields.nitriteSalt.nullable(),
    nitrateSalt: attributeFields.nitrateSalt.nullable(),
    form: attributeFields.form.nullable(),
    densityGPerMl: attributeFields.densityGPerMl.nullable(),
    archived: flag,
  })
  .partial();
export type ItemPatch = z.infer<typeof itemPatchInput>;

/** GET /api/items query. */
export const itemListQuery = z.object({
  category: category.optional(),
  q: z.string().trim().max(100, "At most 100 characters.").optional(),
  archived: z.enum(["true", "false"], { error: "Send true or false." }).optional(),
});

// ---------------------------------------------------------------------------------------------
// The whole item: rules per category, defaults, packs in stock units

const CASING_FIELDS = ["casingKind", "calibreMinMm", "calibreMaxMm", "putUp", "putUpMetres", "capacityKgPerPutUp", "storage"] as const;
const CURE_FIELDS = ["nitriteFraction", "nitrateFraction", "nitriteSalt", "nitrateSalt"] as const;
const INGREDIENT_FIELDS = ["form", "densityGPerMl"] as const;
type AttributeField = (typeof CASING_FIELDS)[number] | (typeof CURE_FIELDS)[number] | (typeof INGREDIENT_FIELDS)[number];

/** Which attribute fields belong to a category. */
export const ATTRIBUTE_FIELDS: Readonly<Record<ItemCategory, readonly AttributeField[]>> = {
  casing: CASING_FIELDS,
  cure: CURE_FIELDS,
  spice: INGREDIENT_FIELDS,
  ingredient: INGREDIENT_FIELDS,
};
const ALL_ATTRIBUTE_FIELDS: readonly AttributeField[] = [...CASING_FIELDS, ...CURE_FIELDS, ...INGREDIENT_FIELDS];

const ONLY_FOR: Record<AttributeField, string> = {
  casingKind: "Only for casings.",
  calibreMinMm: "Only for casings.",
  calibreMaxMm: "Only for casings.",
  putUp: "Only for casings.",
  putUpMetres: "Only for casings.",
  capacityKgPerPutUp: "Only for casings.",
  storage: "Only for casings.",
  nitriteFraction: "Only for cures.",
  nitrateFraction: "Only for cures.",
  nitriteSalt: "Only for cures.",
  nitrateSalt: "Only for cures.",
  form: "Only for spices and ingredients.",
  densityGPerMl: "Only for spices and ingredients (cure is planned and recorded by mass only).",
};

export interface ResolvedCasing {
  kind: CasingKind;
  calibreMinMm: string;
  calibreMaxMm: string;
  putUp: PutUpKind | null;
  putUpMetres: string | null;
  capacityKgPerPutUp: string | null;
  storage: CasingStorage;
}

export interface ResolvedPack extends PackInput {
  /** the pack's size in the item's stock unit, exact then rounded half-even to NUMERIC(30,12) */
  stockQuantity: string;
}

/** An item with every default filled in, ready to store. Decimals are plain strings. */
export interface ResolvedItem {
  sku: string;
  name: string;
  category: ItemCategory;
  stockUnit: StockUnit;
  trackLots: boolean;
  trackDates: boolean;
  casing: ResolvedCasing | null;
  /** the salts default to sodium, the common cure (trade-facts §1), unless the label says potassium */
  cure: { nitriteFraction: string; nitrateFraction: string; nitriteSalt: Salt; nitrateSalt: Salt } | null;
  form: string | null;
  densityGPerMl: string | null;
  packs: ResolvedPack[];
  itemUnits: ItemUnits;
}

export type ResolveResult = { ok: true; item: ResolvedItem } | { ok: false; fields: Record<string, string[]> };

/**
 * Checks an item as a whole and fills its defaults. Every problem is named by its field's dotted
 * path ("packs.0.unit"), so a form or a 422 can point at it.
 */
export function resolveItem(d: ItemDraft): ResolveResult {
  const fields: Record<string, string[]> = {};
  const fail = (path: string, message: string) => void (fields[path] ??= []).push(message);

  for (const f of ALL_ATTRIBUTE_FIELDS) {
    if (d[f] !== undefined && d[f] !== "" && !ATTRIBUTE_FIELDS[d.category].includes(f)) fail(f, ONLY_FOR[f]);
  }

  // lots and dates: on unless switched off; dates are kept per lot
  let trackLots = d.trackLots ?? true;
  let trackDates = d.trackDates ?? trackLots;
  if (d.category === "cure") {
    // cure is always traceable to the supplier's lot and date (trade-facts §5, §9)
    if (d.trackLots === false) fail("trackLots", "Cure lots are always tracked.");
    if (d.trackDates === false) fail("trackDates", "Cure dates are always tracked.");
    trackLots = trackDates = true;
  } else if (trackDates && !trackLots) {
    fail("trackDates", "Dates are kept per lot: turn on lot tracking too.");
  }

  let casing: ResolvedCasing | null = null;
  let cure: ResolvedItem["cure"] = null;
  let form: string | null = null;
  let densityGPerMl: string | null = null;

  if (d.category === "casing") {
    casing = resolveCasing(d, fail);
  } else if (d.category === "cure") {
    if (d.unit !== "g") fail("unit", "Cure is stocked and planned by mass only: use g.");
    if (d.nitriteFraction === undefined) fail("nitriteFraction", "Enter the nitrite fraction from the label (6.25 % is 0.0625; 0 if none).");
    if (d.nitrateFraction === undefined) fail("nitrateFraction", "Enter the nitrate fraction from the label (4 % is 0.04; 0 if none).");
    if (d.nitriteFraction !== undefined && d.nitrateFraction !== undefined) {
      const sum = dec(d.nitriteFraction).plus(d.nitrateFraction);
      if (sum.isZero()) fail("nitriteFraction", "A cure carries nitrite or nitrate: both cannot be 0.");
      else if (sum.gt(1)) fail("nitrateFraction", "Nitrite and nitrate together cannot be more than the whole cure (1).");
      else {
        cure = {
          nitriteFraction: plain(d.nitriteFraction), nitrateFraction: plain(d.nitrateFraction),
          nitriteSalt: d.nitriteSalt ?? "sodium", nitrateSalt: d.nitrateSalt ?? "sodium",
        };
      }
    }
  } else {
    form = d.form ? d.form : null;
    densityGPerMl = d.densityGPerMl !== undefined ? plain(d.densityGPerMl) : null;
  }

  const base: ItemUnits = {
    stockUnit: d.unit,
    putUp: casing?.putUp && casing.putUpMetres ? { name: casing.putUp, metres: casing.putUpMetres } : null,
    densityGPerMl,
    packs: [],
  };
  const resolvedPacks = resolvePacks(d.packs ?? [], base, fail);
  const itemUnits: ItemUnits = { ...base, packs: resolvedPacks.map((p) => ({ name: p.name, quantity: p.quantity, unit: p.unit })) };
  if (Object.keys(fields).length === 0) {
    // the units module's own check of the whole description, as a last guard
    try {
      assertItemUnits(itemUnits);
    } catch (e) {
      if (!isUnitError(e)) throw e;
      fail(d.packs?.length ? "packs" : "unit", e.message);
    }
  }
  if (Object.keys(fields).length) return { ok: false, fields };
  return {
    ok: true,
    item: {
      sku: d.sku,
      name: d.name,
      category: d.category,
      stockUnit: d.unit,
      trackLots,
      trackDates,
      casing,
      cure,
      form,
      densityGPerMl,
      packs: resolvedPacks,
      itemUnits,
    },
  };
}

function resolveCasing(d: ItemDraft, fail: (path: string, message: string) => void): ResolvedCasing | null {
  const kind = d.casingKind;
  if (!kind) fail("casingKind", "Choose the casing: natural hog, sheep or beef, collagen, fibrous or cellulose.");
  if (d.calibreMinMm === undefined) fail("calibreMinMm", "Enter the calibre in mm (the smaller figure of 32/35).");
  const calibreMaxMm = d.calibreMaxMm ?? d.calibreMinMm;
  if (d.calibreMinMm !== undefined && calibreMaxMm !== undefined && dec(calibreMaxMm).lt(d.calibreMinMm)) {
    fail("calibreMaxMm", "The largest calibre cannot be below the smallest.");
  }
  const natural = kind ? isNaturalCasing(kind) : false;
  const putUp = d.putUp ?? null;
  if (kind && natural && !putUp) fail("putUp", "Natural casings are stocked in put-ups: choose hank, beef set or tubed strand.");
  if (kind && putUp && !putUpFits(putUp, kind)) {
    const fits = (PUT_UP_KINDS[putUp] ?? []).map((k) => k.replace("natural_", "")).join(" or ");
    fail("putUp", `A ${PUT_UP_LABELS[putUp].toLowerCase()} is a put-up of ${fits} casings.`);
  }
  if (putUp && d.unit !== "pc") fail("unit", "A casing stocked in put-ups is counted in pieces: use pc (one pc is one put-up).");
  if (!putUp && d.unit !== "m" && d.unit !== "pc") fail("unit", "A casing is stocked in metres (m) or pieces (pc).");

  let putUpMetres: string | null = null;
  if (putUp) {
    putUpMetres = d.putUpMetres !== undefined ? plain(d.putUpMetres) : putUp === "hank" ? HANK_METRES : null;
    if (putUpMetres === null) fail("putUpMetres", `Enter the length of one ${PUT_UP_LABELS[putUp].toLowerCase()} in metres.`);
  } else if (d.putUpMetres !== undefined) {
    fail("putUpMetres", "Only with a put-up.");
  }

  let capacity: string | null = null;
  if (d.capacityKgPerPutUp !== undefined) {
    if (!putUp) fail("capacityKgPerPutUp", "Only with a put-up (capacity is kg of filling per put-up).");
    else capacity = plain(d.capacityKgPerPutUp);
  } else if (kind && putUp && putUpMetres !== null && d.calibreMinMm !== undefined) {
    capacity = defaultCapacityKg({ casingKind: kind, putUp, putUpMetres, calibreMinMm: d.calibreMinMm }) ?? null;
    if (capacity === null && natural) {
      fail("capacityKgPerPutUp", "The trade table has no capacity for this casing, calibre and put-up: enter kg of filling per put-up.");
    }
  }

  if (!kind || d.calibreMinMm === undefined || calibreMaxMm === undefined) return null;
  return {
    kind,
    calibreMinMm: plain(d.calibreMinMm),
    calibreMaxMm: plain(calibreMaxMm),
    putUp,
    putUpMetres,
    capacityKgPerPutUp: capacity,
    storage: d.storage ?? defaultStorage(kind),
  };
}

function resolvePacks(list: readonly PackInput[], base: ItemUnits, fail: (path: string, message: string) => void): ResolvedPack[] {
  const names = new Set<string>();
  let namesOk = true;
  list.forEach((p, i) => {
    const n = normaliseUnitName(p.name);
    let problem: string | undefined;
    if (findGlobalUnit(n)) problem = `"${p.name}" is a unit; name the pack by what it is, e.g. "25 lb pail".`;
    else if (isUnitFor(n, base)) problem = "That is the put-up's own name; name the pack by what it holds, e.g. \"box of 10 hanks\".";
    else if (names.has(n)) problem = "Another pack has this name.";
    if (problem) {
      fail(`packs.${i}.name`, problem);
      namesOk = false;
    }
    names.add(n);
  });
  if (!namesOk) return [];
  // packs may be sized in each other's units ("case of 4 bags"), so each resolves against them all
  const units: ItemUnits = { ...base, packs: list.map((p) => ({ name: p.name, quantity: p.quantity, unit: p.unit })) };
  const out: ResolvedPack[] = [];
  list.forEach((p, i) => {
    let exact;
    try {
      exact = toStockUnits(p.quantity, p.unit, units);
    } catch (e) {
      if (!isUnitError(e)) throw e;
      fail(`packs.${i}.unit`, e.message);
      return;
    }
    let stored: string;
    try {
      stored = toStoredQuantity(exact);
    } catch (e) {
      if (!isUnitError(e)) throw e;
      fail(`packs.${i}.quantity`, "Too large to store.");
      return;
    }
    if (!dec(stored).gt(0)) {
      fail(`packs.${i}.quantity`, `Too small: under 0.000000000001 ${base.stockUnit}.`);
      return;
    }
    out.push({ name: p.name, quantity: plain(p.quantity), unit: p.unit, stockQuantity: stored });
  });
  return out;
}

// ---------------------------------------------------------------------------------------------
// PATCH: the current item plus the changes

/** A patch value differs from the current one (decimals by value: "91.440" is "91.44"). */
function differs(before: unknown, after: unknown): boolean {
  if (typeof before === "string" && typeof after === "string" && isDecimalString(before) && isDecimalString(after)) {
    return !dec(before).eq(after);
  }
  return before !== after;
}

/**
 * The item after a PATCH, as a draft for resolveItem. Fields the patch leaves out keep their
 * values, except those that would no longer fit:
 * - a new category drops the attributes of the old one (and, into cure, the lot switches);
 * - a new put-up drops the old put-up's length (a hank takes 91.44 m again, others need one);
 * - a new casing kind, lower calibre, put-up or length drops the capacity, which is taken from
 *   the trade table again (or must be entered), and a new casing kind drops the storage;
 * - switching lot tracking off switches dates off unless the patch says otherwise.
 */
export function mergeItemPatch(current: ItemDraft, patch: ItemPatch): ItemDraft {
  const next: Record<string, unknown> = { ...current };
  for (const [key, value] of Object.entries(patch)) {
    if (key === "archived" || value === undefined) continue;
    if (value === null) delete next[key];
    else next[key] = value;
  }
  const given = (key: keyof ItemPatch) => key in patch && patch[key] !== undefined;
  const drop = (key: keyof ItemDraft) => {
    if (!given(key as keyof ItemPatch)) delete next[key];
  };

  // a key the patch names with a value other than the current one, or clears
  const touched = (key: keyof ItemDraft & keyof ItemPatch) =>
    patch[key] === null || (patch[key] !== undefined && differs(current[key], patch[key]));

  const category = next.category as ItemCategory;
  if (category !== current.category) {
    for (const f of ALL_ATTRIBUTE_FIELDS) if (!ATTRIBUTE_FIELDS[category].includes(f)) drop(f);
    if (category === "cure") {
      drop("trackLots");
      drop("trackDates");
    }
  }
  if (touched("putUp")) drop("putUpMetres");
  if (touched("casingKind") || touched("calibreMinMm") || touched("putUp") || touched("putUpMetres")) drop("capacityKgPerPutUp");
  if (touched("casingKind")) drop("storage");
  if (patch.trackLots === false) drop("trackDates");
  return next as ItemDraft;
}
