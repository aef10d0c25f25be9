"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import type { FormState } from "@/components/ui/form-state";
import { ITEM_CATEGORIES } from "@/db/types";
import { requireUser } from "@/lib/auth/session";
import { createItem, updateItem } from "@/lib/data/items";
import { AppError, fieldErrors } from "@/lib/http/errors";
import { dec, plain } from "@/lib/units";
import { uuid } from "@/lib/validation/common";
import { itemCreateInput, itemPatchInput } from "@/lib/validation/items";

/** Field errors keyed by dotted path ("packs.0.unit"), so each pack row shows its own. */
export type ItemFormState = FormState<never>;

const PACK_KEY = /^packs\.(\d+)\.(name|quantity|unit)$/;

/** Percent as typed -> fraction, exactly; a bad percent is kept for the schema to refuse by name. */
function percentToFraction(raw: string): string {
  if (!/^\d{1,3}(\.\d{1,6})?$/.test(raw)) return raw === "" ? raw : `bad:${raw}`;
  return plain(dec(raw).div(100));
}

/** The form as the API body: empty optional fields are left out on create, cleared (null) on edit. */
function bodyFrom(form: FormData, editing: boolean): { body: Record<string, unknown>; percentErrors: Record<string, string[]> } {
  const text = (k: string) => String(form.get(k) ?? "").trim();
  const optional = (k: string) => (text(k) === "" ? (editing ? null : undefined) : text(k));
  const category = text("category");
  const body: Record<string, unknown> = { sku: text("sku"), name: text("name"), category, unit: text("unit") };
  const percentErrors: Record<string, string[]> = {};

  if (category !== "cure") {
    body.trackLots = form.get("trackLots") === "on";
    body.trackDates = form.get("trackDates") === "on";
  }
  if (category === "casing") {
    for (const k of ["casingKind", "calibreMinMm", "calibreMaxMm", "putUp", "putUpMetres", "capacityKgPerPutUp", "storage"]) body[k] = optional(k);
  } else if (category === "cure") {
    for (const [field, input] of [["nitriteFraction", "nitritePercent"], ["nitrateFraction", "nitratePercent"]] as const) {
      const f = percentToFraction(text(input));
      if (f === "") percentErrors[field] = [`Enter the ${field === "nitriteFraction" ? "nitrite" : "nitrate"} percentage from the label (0 if none).`];
      else if (f.startsWith("bad:")) percentErrors[field] = ["Enter the percentage from the label, e.g. 6.25 (up to 6 decimals)."];
      else if (dec(f).gt(1)) percentErrors[field] = ["At most 100 %."];
      else body[field] = f;
    }
    // sodium or potassium, as on the label; the schema refuses anything else by name
    body.nitriteSalt = optional("nitriteSalt");
    body.nitrateSalt = optional("nitrateSalt");
  } else if ((ITEM_CATEGORIES as readonly string[]).includes(category)) {
    body.form = optional("form");
    body.densityGPerMl = optional("densityGPerMl");
  }

  const rows: Record<string, string>[] = [];
  for (const [key, value] of form.entries()) {
    const m = PACK_KEY.exec(key);
    if (m) (rows[Number(m[1])] ??= {})[m[2]!] = String(value).trim();
  }
  body.packs = Array.from(rows, (r) => ({ name: r?.name ?? "", quantity: r?.quantity ?? "", unit: r?.unit ?? "" }));
  if (editing) body.archived = form.get("archived") === "on";
  // undefined keys are simply absent from the parsed body
  for (const k of Object.keys(body)) if (body[k] === undefined) delete body[k];
  return { body, percentErrors };
}

const fail = (error: z.ZodError, extra: Record<string, string[]>): ItemFormState => ({ fieldErrors: { ...fieldErrors(error), ...extra } });

/** Adds an item, or saves one when the form carries its id. */
export async function saveItemAction(_prev: ItemFormState, form: FormData): Promise<ItemFormState> {
  const user = await requireUser();
  const rawId = form.get("id");
  const { body, percentErrors } = bodyFrom(form, Boolean(rawId));
  let saved: { sku: string; name: string };
  try {
    if (rawId) {
      const id = uuid.safeParse(rawId);
      if (!id.success) return { message: "This item could not be found. Reload the page and try again." };
      const parsed = itemPatchInput.safeParse(body);
      if (!parsed.success || Object.keys(percentErrors).length) return parsed.success ? { fieldErrors: percentErrors } : fail(parsed.error, percentErrors);
      saved = await updateItem(user, id.data, parsed.data);
    } else {
      const parsed = itemCreateInput.safeParse(body);
      if (!parsed.success || Object.keys(percentErrors).length) return parsed.success ? { fieldErrors: percentErrors } : fail(parsed.error, percentErrors);
      saved = await createItem(user, parsed.data);
    }
  } catch (e) {
    if (!(e instanceof AppError)) throw e;
    // keep the dotted paths ("packs.0.unit"): each pack row shows its own error
    const fields = (e.details as { fields?: Record<string, string[]> } | undefined)?.fields;
    if (fields) return { message: e.status === 422 ? undefined : e.message, fieldErrors: fields };
    return { message: e.message };
  }
  revalidatePath("/stock/items");
  return { ok: true, message: rawId ? `Saved ${saved.sku} · ${saved.name}.` : `Added ${saved.sku} · ${saved.name}.` };
}
