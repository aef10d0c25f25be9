"use server";

import { revalidatePath } from "next/cache";
import { appErrorState, zodErrors, type FormState } from "@/components/ui/form-state";
import { requireUser } from "@/lib/auth/session";
import { createSupplier, createSupplierItem, updateSupplier, updateSupplierItem } from "@/lib/data/suppliers";
import { uuid } from "@/lib/validation/common";
import { supplierCreateInput, supplierItemCreateInput, supplierItemPatchInput, supplierPatchInput } from "@/lib/validation/suppliers";

export type SupplierFormState = FormState<Record<string, string | boolean | undefined>> & { id?: string };

const text = (form: FormData, key: string) => String(form.get(key) ?? "").trim();

/** Adds a supplier, or saves one when the form carries its id. */
export async function saveSupplierAction(_prev: SupplierFormState, form: FormData): Promise<SupplierFormState> {
  const user = await requireUser();
  const rawId = form.get("id");
  const values = {
    name: text(form, "name"),
    contactName: text(form, "contactName"),
    orderEmail: text(form, "orderEmail"),
    phone: text(form, "phone"),
    leadTimeDays: text(form, "leadTimeDays"),
    minOrderValue: text(form, "minOrderValue"),
    notes: String(form.get("notes") ?? ""),
    active: rawId ? form.get("active") === "on" : undefined,
  };
  // the form's text as the API body: empty e-mail and minimum mean none; lead time in whole days
  const days = /^\d{1,3}$/.test(values.leadTimeDays) ? Number(values.leadTimeDays) : values.leadTimeDays === "" ? undefined : Number.NaN;
  const input = {
    ...values,
    orderEmail: values.orderEmail || null,
    minOrderValue: values.minOrderValue || null,
    leadTimeDays: days,
  };
  let saved: { id: string; name: string };
  try {
    if (rawId) {
      const id = uuid.safeParse(rawId);
      if (!id.success) return { message: "This supplier could not be found. Reload the page and try again.", values };
      const parsed = supplierPatchInput.safeParse(input);
      if (!parsed.success) return { fieldErrors: zodErrors(parsed.error), values };
      saved = await updateSupplier(user, id.data, parsed.data);
    } else {
      const parsed = supplierCreateInput.safeParse(input);
      if (!parsed.success) return { fieldErrors: zodErrors(parsed.error), values };
      saved = await createSupplier(user, parsed.data);
    }
  } catch (e) {
    const state = appErrorState(e);
    if (!state) throw e;
    return { ...state, values };
  }
  revalidatePath("/purchasing");
  revalidatePath(`/purchasing/suppliers/${saved.id}`);
  return { ok: true, id: saved.id, message: rawId ? `Saved ${saved.name}.` : `Added ${saved.name}.` };
}

/** Adds an item to a supplier, or saves one when the form carries its id. */
export async function saveSupplierItemAction(_prev: SupplierFormState, form: FormData): Promise<SupplierFormState> {
  const user = await requireUser();
  const supplierId = uuid.safeParse(form.get("supplierId"));
  if (!supplierId.success) return { message: "This supplier could not be found. Reload the page and try again." };
  const rawId = form.get("id");
  const values = {
    sku: text(form, "sku"),
    description: text(form, "description"),
    item: text(form, "item"),
    packLabel: text(form, "packLabel"),
    packQuantity: text(form, "packQuantity"),
    packUnit: text(form, "packUnit"),
    gtin: text(form, "gtin"),
    active: rawId ? form.get("active") === "on" : undefined,
  };
  const input = { ...values, gtin: values.gtin || null };
  let saved: { id: string; sku: string };
  try {
    if (rawId) {
      const id = uuid.safeParse(rawId);
      if (!id.success) return { message: "This supplier item could not be found. Reload the page and try again.", values };
      const parsed = supplierItemPatchInput.safeParse(input);
      if (!parsed.success) return { fieldErrors: zodErrors(parsed.error), values };
      saved = await updateSupplierItem(user, supplierId.data, id.data, parsed.data);
    } else {
      const parsed = supplierItemCreateInput.safeParse({ ...input, gtin: input.gtin ?? undefined });
      if (!parsed.success) return { fieldErrors: zodErrors(parsed.error), values };
      saved = await createSupplierItem(user, supplierId.data, parsed.data);
    }
  } catch (e) {
    const state = appErrorState(e);
    if (!state) throw e;
    return { ...state, values };
  }
  revalidatePath(`/purchasing/suppliers/${supplierId.data}`);
  revalidatePath("/purchasing");
  return { ok: true, id: saved.id, message: rawId ? `Saved ${saved.sku}.` : `Added ${saved.sku}.` };
}
