"use server";

import { revalidatePath } from "next/cache";
import { appErrorState, zodErrors, type FormState } from "@/components/ui/form-state";
import { requireUser } from "@/lib/auth/session";
import { createKitchen, updateKitchen } from "@/lib/data/kitchens";
import { uuid } from "@/lib/validation/common";
import { kitchenCreateInput, kitchenUpdateInput } from "@/lib/validation/company";

export type KitchenFormState = FormState<{ code: string; name: string; address: string; timeZone: string; archived?: boolean }>;

/** Adds a kitchen, or saves one when the form carries its id. */
export async function saveKitchenAction(_prev: KitchenFormState, form: FormData): Promise<KitchenFormState> {
  const user = await requireUser();
  const rawId = form.get("id");
  const values = {
    code: String(form.get("code") ?? ""),
    name: String(form.get("name") ?? ""),
    address: String(form.get("address") ?? ""),
    timeZone: String(form.get("timeZone") ?? ""),
    archived: rawId ? form.get("archived") === "on" : undefined,
  };
  // an empty time zone means "the company's"
  const input = { ...values, timeZone: values.timeZone || null };
  let saved: { code: string; name: string };
  try {
    if (rawId) {
      const id = uuid.safeParse(rawId);
      if (!id.success) return { message: "This kitchen could not be found. Reload the page and try again.", values };
      const parsed = kitchenUpdateInput.safeParse(input);
      if (!parsed.success) return { fieldErrors: zodErrors(parsed.error), values };
      saved = await updateKitchen(user, id.data, parsed.data);
    } else {
      const parsed = kitchenCreateInput.safeParse(input);
      if (!parsed.success) return { fieldErrors: zodErrors(parsed.error), values };
      saved = await createKitchen(user, parsed.data);
    }
  } catch (e) {
    const state = appErrorState(e);
    if (!state) throw e;
    return { ...state, values };
  }
  // kitchens appear in the switcher of every page
  revalidatePath("/", "layout");
  return { ok: true, message: rawId ? `Saved ${saved.code} · ${saved.name}.` : `Added ${saved.code} · ${saved.name}.` };
}
