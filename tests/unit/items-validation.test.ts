// The catalogue's rules: lib/validation/items.ts (schemas, resolveItem, mergeItemPatch).
import { describe, expect, it } from "vitest";
import { fieldErrors } from "@/lib/http/errors";
import { dec } from "@/lib/units";
import { itemCreateInput, itemPatchInput, mergeItemPatch, resolveItem, type ItemDraft } from "@/lib/validation/items";

const hogHank: ItemDraft = { sku: "HOG-32-35", name: "Hog casing 32/35", category: "casing", unit: "pc", casingKind: "natural_hog", calibreMinMm: "32", calibreMaxMm: "35", putUp: "hank" };
const cure: ItemDraft = { sku: "CURE-1", name: "Curing salt #1", category: "cure", unit: "g", nitriteFraction: "0.0625", nitrateFraction: "0" };
const spice: ItemDraft = { sku: "PEP-BLK", name: "Black pepper", category: "spice", unit: "g", form: "ground" };

/** The field errors of a draft that must fail. */
function errorsOf(d: ItemDraft): Record<string, string[]> {
  const r = resolveItem(d);
  if (r.ok) throw new Error("expected the draft to be refused");
  return r.fields;
}
function resolvedOf(d: ItemDraft) {
  const r = resolveItem(d);
  if (!r.ok) throw new Error(`refused: ${JSON.stringify(r.fields)}`);
  return r.item;
}
/** The 422 the route would answer: dotted field paths. */
function bodyErrors(body: unknown, schema: typeof itemCreateInput | typeof itemPatchInput = itemCreateInput) {
  const r = schema.safeParse(body);
  if (r.success) throw new Error("expected the body to be refused");
  return fieldErrors(r.error);
}

describe("casings", () => {
  it("defaults a hank to 91.44 m (100 yd, trade-facts §4), capacity from the calibre table, salted, lots and dates tracked", () => {
    const item = resolvedOf(hogHank);
    expect(item.casing).toEqual({
      kind: "natural_hog", calibreMinMm: "32", calibreMaxMm: "35", putUp: "hank", putUpMetres: "91.44", capacityKgPerPutUp: "45", storage: "salted",
    });
    expect(item).toMatchObject({ stockUnit: "pc", trackLots: true, trackDates: true, cure: null, form: null, densityGPerMl: null });
    expect(item.itemUnits).toEqual({ stockUnit: "pc", putUp: { name: "hank", metres: "91.44" }, densityGPerMl: null, packs: [] });
  });

  it("keeps a capacity the person entered", () => {
    expect(resolvedOf({ ...hogHank, capacityKgPerPutUp: "47.5" }).casing?.capacityKgPerPutUp).toBe("47.5");
  });

  it("asks for the capacity of a natural casing outside the table", () => {
    expect(errorsOf({ ...hogHank, calibreMinMm: "40", calibreMaxMm: "42" })).toEqual({ capacityKgPerPutUp: [expect.stringMatching(/enter kg of filling/)] });
    expect(resolvedOf({ ...hogHank, calibreMinMm: "40", calibreMaxMm: "42", capacityKgPerPutUp: "60" }).casing?.capacityKgPerPutUp).toBe("60");
  });

  it("stocks put-ups in pieces and natural casings in put-ups", () => {
    expect(Object.keys(errorsOf({ ...hogHank, unit: "m" }))).toEqual(["unit"]);
    expect(Object.keys(errorsOf({ ...hogHank, putUp: undefined }))).toEqual(["putUp"]);
  });

  it("needs a length for put-ups other than a hank", () => {
    const set: ItemDraft = { ...hogHank, casingKind: "natural_beef", calibreMinMm: "40", calibreMaxMm: "43", putUp: "beef_set" };
    expect(Object.keys(errorsOf(set))).toEqual(["putUpMetres"]);
    // per 30 m set of rounds, 40-43 mm: 36 kg [sec: natural casing trade association tables, trade-facts §4]
    expect(resolvedOf({ ...set, putUpMetres: "30" }).casing).toMatchObject({ putUpMetres: "30", capacityKgPerPutUp: "36" });
  });

  it("keeps hanks for hog and sheep and sets for beef", () => {
    expect(Object.keys(errorsOf({ ...hogHank, casingKind: "natural_beef", calibreMinMm: "40", calibreMaxMm: "43" }))).toEqual(["putUp", "capacityKgPerPutUp"]);
    expect(errorsOf({ ...hogHank, putUp: "beef_set", putUpMetres: "30" }).putUp).toBeDefined();
  });

  it("refuses a largest calibre below the smallest; a single calibre is both", () => {
    expect(Object.keys(errorsOf({ ...hogHank, calibreMaxMm: "31" }))).toEqual(["calibreMaxMm"]);
    expect(resolvedOf({ ...hogHank, calibreMaxMm: undefined }).casing).toMatchObject({ calibreMinMm: "32", calibreMaxMm: "32" });
  });

  it("lets a manufactured casing go without a put-up, in metres, stored dry", () => {
    const collagen: ItemDraft = { sku: "COL-26", name: "Collagen 26", category: "casing", unit: "m", casingKind: "collagen", calibreMinMm: "26" };
    expect(resolvedOf(collagen).casing).toEqual({
      kind: "collagen", calibreMinMm: "26", calibreMaxMm: "26", putUp: null, putUpMetres: null, capacityKgPerPutUp: null, storage: "dry",
    });
    expect(Object.keys(errorsOf({ ...collagen, unit: "g" }))).toEqual(["unit"]);
    expect(Object.keys(errorsOf({ ...collagen, capacityKgPerPutUp: "3" }))).toEqual(["capacityKgPerPutUp"]);
    // on sticks the maker's capacity is optional
    expect(resolvedOf({ ...collagen, unit: "pc", putUp: "stick", putUpMetres: "15.24" }).casing?.capacityKgPerPutUp).toBeNull();
  });

  it("refuses a casing without its kind or calibre", () => {
    expect(Object.keys(errorsOf({ sku: "C", name: "C", category: "casing", unit: "m" })).sort()).toEqual(["calibreMinMm", "casingKind"]);
  });
});

describe("cures", () => {
  it("keeps the label's fractions and always tracks lots and dates", () => {
    const item = resolvedOf(cure);
    expect(item.cure).toEqual({ nitriteFraction: "0.0625", nitrateFraction: "0", nitriteSalt: "sodium", nitrateSalt: "sodium" });
    expect(item).toMatchObject({ trackLots: true, trackDates: true, casing: null });
  });

  it("never assumes 6.25 %: both fractions are required", () => {
    expect(errorsOf({ ...cure, nitriteFraction: undefined, nitrateFraction: undefined })).toEqual({
      nitriteFraction: [expect.stringMatching(/from the label/)],
      nitrateFraction: [expect.stringMatching(/from the label/)],
    });
  });

  it("needs some nitrite or nitrate, and no more than the whole cure", () => {
    expect(Object.keys(errorsOf({ ...cure, nitriteFraction: "0", nitrateFraction: "0" }))).toEqual(["nitriteFraction"]);
    expect(Object.keys(errorsOf({ ...cure, nitriteFraction: "0.9", nitrateFraction: "0.2" }))).toEqual(["nitrateFraction"]);
    // the nitrite/nitrate cure for dry-cured products: 6.25 % nitrite + 4 % nitrate [practice, trade-facts §1]
    expect(resolvedOf({ ...cure, nitrateFraction: "0.04" }).cure).toMatchObject({ nitriteFraction: "0.0625", nitrateFraction: "0.04" });
    expect(resolvedOf({ ...cure, nitriteFraction: "1", nitrateFraction: "0" }).cure?.nitriteFraction).toBe("1");
  });

  it("is stocked in grams, tracked, and never converted by volume", () => {
    expect(Object.keys(errorsOf({ ...cure, unit: "ml" }))).toEqual(["unit"]);
    expect(Object.keys(errorsOf({ ...cure, trackLots: false }))).toEqual(["trackLots"]);
    expect(Object.keys(errorsOf({ ...cure, trackDates: false }))).toEqual(["trackDates"]);
    expect(Object.keys(errorsOf({ ...cure, densityGPerMl: "1.2" }))).toEqual(["densityGPerMl"]);
    expect(resolvedOf({ ...cure, trackLots: true, trackDates: true }).trackLots).toBe(true);
  });

  it("says which salt each carries: sodium unless the label says potassium", () => {
    // potassium nitrite converts differently from sodium nitrite (1.2335 x, trade-facts §2), so the item records it
    expect(resolvedOf({ ...cure, nitriteSalt: "potassium" }).cure).toEqual({ nitriteFraction: "0.0625", nitrateFraction: "0", nitriteSalt: "potassium", nitrateSalt: "sodium" });
    expect(resolvedOf({ ...cure, nitrateFraction: "0.04", nitrateSalt: "potassium" }).cure).toMatchObject({ nitriteSalt: "sodium", nitrateSalt: "potassium" });
    expect(itemCreateInput.parse({ ...cure, nitriteSalt: "potassium", nitrateSalt: "sodium" })).toMatchObject({ nitriteSalt: "potassium", nitrateSalt: "sodium" });
  });

  it("refuses a salt other than sodium or potassium, naming the field", () => {
    expect(bodyErrors({ ...cure, nitriteSalt: "calcium" })).toEqual({ nitriteSalt: [expect.stringMatching(/sodium or potassium/)] });
    expect(Object.keys(bodyErrors({ nitrateSalt: "Potassium" }, itemPatchInput))).toEqual(["nitrateSalt"]);
  });

  it("refuses fractions above 1, more than 8 decimals and JSON numbers, naming the field", () => {
    expect(Object.keys(bodyErrors({ ...cure, nitriteFraction: "6.25" }))).toEqual(["nitriteFraction"]);
    expect(Object.keys(bodyErrors({ ...cure, nitriteFraction: "0.062500001" }))).toEqual(["nitriteFraction"]);
    expect(Object.keys(bodyErrors({ ...cure, nitriteFraction: 0.0625 }))).toEqual(["nitriteFraction"]);
  });
});

describe("spices and ingredients", () => {
  it("keeps form and density; lots and dates on unless switched off", () => {
    expect(resolvedOf({ ...spice, densityGPerMl: "1.03" })).toMatchObject({ form: "ground", densityGPerMl: "1.03", trackLots: true, trackDates: true });
    expect(resolvedOf({ ...spice, trackLots: false })).toMatchObject({ trackLots: false, trackDates: false });
    expect(resolvedOf({ ...spice, trackDates: false })).toMatchObject({ trackLots: true, trackDates: false });
  });

  it("keeps dates per lot", () => {
    expect(Object.keys(errorsOf({ ...spice, trackLots: false, trackDates: true }))).toEqual(["trackDates"]);
  });

  it("refuses attributes of another category, naming each", () => {
    expect(errorsOf({ ...spice, putUp: "hank", nitriteFraction: "0.0625" })).toEqual({
      putUp: ["Only for casings."],
      nitriteFraction: ["Only for cures."],
    });
    expect(Object.keys(errorsOf({ ...hogHank, form: "salted" }))).toEqual(["form"]);
    expect(errorsOf({ ...spice, nitriteSalt: "sodium", nitrateSalt: "potassium" })).toEqual({ nitriteSalt: ["Only for cures."], nitrateSalt: ["Only for cures."] });
    expect(bodyErrors({ ...hogHank, nitriteSalt: "potassium" })).toEqual({ nitriteSalt: ["Only for cures."] });
  });

  it("refuses a density of 0", () => {
    expect(Object.keys(bodyErrors({ ...spice, densityGPerMl: "0" }))).toEqual(["densityGPerMl"]);
  });
});

describe("packs", () => {
  it("stores a 25 lb pail of a gram item as exactly 11339.80925 g (NIST: 1 lb = 453.59237 g)", () => {
    const item = resolvedOf({ ...spice, packs: [{ name: "25 lb pail", quantity: "25", unit: "lb" }] });
    expect(item.packs).toEqual([{ name: "25 lb pail", quantity: "25", unit: "lb", stockQuantity: "11339.809250000000" }]);
    expect(item.itemUnits.packs).toEqual([{ name: "25 lb pail", quantity: "25", unit: "lb" }]);
  });

  it("sizes a pack in put-ups or in another pack", () => {
    const item = resolvedOf({ ...hogHank, packs: [{ name: "box of 10 hanks", quantity: "10", unit: "hanks" }, { name: "case", quantity: "2", unit: "box of 10 hanks" }] });
    expect(item.packs.map((p) => p.stockQuantity)).toEqual(["10.000000000000", "20.000000000000"]);
    // 100 yd of casing is one hank: 100 x 0.9144 m / 91.44 m (NIST: 1 yd = 0.9144 m)
    const byLength = resolvedOf({ ...hogHank, packs: [{ name: "roll", quantity: "100", unit: "yd" }] });
    expect(dec(byLength.packs[0]!.stockQuantity).eq(1)).toBe(true);
  });

  it("converts by volume only through a density", () => {
    const bottle = { name: "1 gal jug", quantity: "1", unit: "gal" };
    expect(Object.keys(errorsOf({ ...spice, packs: [bottle] }))).toEqual(["packs.0.unit"]);
    // 1 US gal = 3785.411784 ml (NIST) x 1.2 g/ml
    expect(resolvedOf({ ...spice, densityGPerMl: "1.2", packs: [bottle] }).packs[0]!.stockQuantity).toBe("4542.494140800000");
  });

  it("names the pack whose unit is unknown or circular", () => {
    expect(Object.keys(errorsOf({ ...spice, packs: [{ name: "sack", quantity: "1", unit: "kg" }, { name: "tub", quantity: "3", unit: "scoops" }] }))).toEqual(["packs.1.unit"]);
    expect(Object.keys(errorsOf({ ...spice, packs: [{ name: "bag", quantity: "2", unit: "bag" }] }))).toEqual(["packs.0.unit"]);
  });

  it("refuses a pack named like a unit, the put-up or another pack", () => {
    expect(Object.keys(errorsOf({ ...spice, packs: [{ name: "kg", quantity: "1", unit: "kg" }] }))).toEqual(["packs.0.name"]);
    expect(Object.keys(errorsOf({ ...hogHank, packs: [{ name: "Hanks", quantity: "1", unit: "pc" }] }))).toEqual(["packs.0.name"]);
    expect(Object.keys(errorsOf({ ...spice, packs: [{ name: "Bag", quantity: "1", unit: "kg" }, { name: "bag", quantity: "2", unit: "kg" }] }))).toEqual(["packs.1.name"]);
  });

  it("names bad pack fields in the body by dotted path", () => {
    const errors = bodyErrors({ ...spice, packs: [{ name: "pail", quantity: 25, unit: "lb" }, { name: "", quantity: "0", unit: "" }] });
    expect(Object.keys(errors).sort()).toEqual(["packs.0.quantity", "packs.1.name", "packs.1.quantity", "packs.1.unit"]);
    expect(Object.keys(bodyErrors({ ...spice, packs: [{ name: "tub", quantity: "3", unit: "scoops" }] }))).toEqual(["packs.0.unit"]);
  });
});

describe("the create body", () => {
  it("parses a whole casing and trims text", () => {
    const r = itemCreateInput.safeParse({ ...hogHank, sku: " HOG-32-35 ", name: " Hog 32/35 " });
    expect(r.success && r.data).toMatchObject({ sku: "HOG-32-35", name: "Hog 32/35" });
  });

  it("refuses decimals sent as JSON numbers", () => {
    expect(Object.keys(bodyErrors({ ...hogHank, calibreMinMm: 32 }))).toEqual(["calibreMinMm"]);
    expect(Object.keys(bodyErrors({ ...hogHank, putUpMetres: 91.44 }))).toEqual(["putUpMetres"]);
  });

  it("keeps SKUs usable in a URL and distinct from ids", () => {
    expect(Object.keys(bodyErrors({ ...spice, sku: "PEP/1" }))).toEqual(["sku"]);
    expect(Object.keys(bodyErrors({ ...spice, sku: "3f2b8c1e-4a5d-4e6f-8a9b-0c1d2e3f4a5b" }))).toEqual(["sku"]);
    expect(Object.keys(bodyErrors({ ...spice, sku: "" }))).toEqual(["sku"]);
  });

  it("names a missing category or unit", () => {
    expect(Object.keys(bodyErrors({ sku: "X", name: "X" })).sort()).toEqual(["category", "unit"]);
  });
});

describe("mergeItemPatch", () => {
  const stored: ItemDraft = { ...hogHank, putUpMetres: "91.44", capacityKgPerPutUp: "45", storage: "salted", trackLots: true, trackDates: true, packs: [] };

  it("keeps what the patch leaves out", () => {
    expect(resolvedOf(mergeItemPatch(stored, { name: "Hog 32/35 salted" })).casing).toMatchObject({ capacityKgPerPutUp: "45", putUpMetres: "91.44" });
  });

  it("takes the capacity from the table again when the lower calibre changes", () => {
    expect(resolvedOf(mergeItemPatch(stored, { calibreMinMm: "34", calibreMaxMm: "36" })).casing?.capacityKgPerPutUp).toBe("48");
    expect(resolvedOf(mergeItemPatch(stored, { calibreMaxMm: "36" })).casing?.capacityKgPerPutUp).toBe("45");
    expect(resolvedOf(mergeItemPatch({ ...stored, capacityKgPerPutUp: "47" }, { storage: "brine" })).casing?.capacityKgPerPutUp).toBe("47");
    expect(resolvedOf(mergeItemPatch({ ...stored, capacityKgPerPutUp: "47" }, { capacityKgPerPutUp: null })).casing?.capacityKgPerPutUp).toBe("45");
  });

  it("drops the old category's attributes", () => {
    const merged = mergeItemPatch(stored, { category: "spice", unit: "g" });
    expect(resolvedOf(merged)).toMatchObject({ category: "spice", casing: null });
    expect(merged.casingKind).toBeUndefined();
  });

  it("turns a spice with lots off into a cure with lots on", () => {
    const s: ItemDraft = { ...spice, trackLots: false, trackDates: false };
    expect(errorsOf(mergeItemPatch(s, { category: "cure" }))).toEqual({
      nitriteFraction: [expect.any(String)],
      nitrateFraction: [expect.any(String)],
    });
    expect(resolvedOf(mergeItemPatch(s, { category: "cure", nitriteFraction: "0.0625", nitrateFraction: "0" }))).toMatchObject({ trackLots: true, trackDates: true });
  });

  it("changes a cure's salt, takes sodium again when cleared, and drops the salts with the category", () => {
    const storedCure: ItemDraft = { ...cure, nitriteSalt: "sodium", nitrateSalt: "sodium", trackLots: true, trackDates: true, packs: [] };
    const potassium = mergeItemPatch(storedCure, { nitriteSalt: "potassium" });
    expect(resolvedOf(potassium).cure).toMatchObject({ nitriteFraction: "0.0625", nitriteSalt: "potassium", nitrateSalt: "sodium" });
    expect(resolvedOf(mergeItemPatch(potassium, { nitriteSalt: null })).cure?.nitriteSalt).toBe("sodium");
    const spiced = mergeItemPatch(potassium, { category: "spice" });
    expect(spiced.nitriteSalt).toBeUndefined();
    expect(resolvedOf(spiced)).toMatchObject({ category: "spice", cure: null });
  });

  it("switches dates off with lots, and drops a put-up's length with the put-up", () => {
    expect(resolvedOf(mergeItemPatch({ ...spice, trackLots: true, trackDates: true }, { trackLots: false }))).toMatchObject({ trackLots: false, trackDates: false });
    expect(Object.keys(errorsOf(mergeItemPatch(stored, { casingKind: "natural_beef", putUp: "beef_set" })))).toEqual(["putUpMetres"]);
  });
});
