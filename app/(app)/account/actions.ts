"use server";

import { revalidatePath } from "next/cache";
import { appErrorState, zodErrors, type FormState } from "@/components/ui/form-state";
import { requireUser } from "@/lib/auth/session";
import { updateProfile } from "@/lib/data/users";
import { profileUpdateInput } from "@/lib/validation/company";

export type ProfileState = FormState<{ name: string; timeZone: string; unitSystem: string }>;

export async function updateProfileAction(_prev: ProfileState, form: FormData): Promise<ProfileState> {
  const user = await requireUser();
  const values = {
    name: String(form.get("name") ?? ""),
    timeZone: String(form.get("timeZone") ?? ""),
    unitSystem: String(form.get("unitSystem") ?? ""),
  };
  // an empty time zone means "the company's"
  const parsed = profileUpdateInput.safeParse({ ...values, timeZone: values.timeZone || null });
  if (!parsed.success) {
    const fieldErrors = zodErrors(parsed.error);
    if (fieldErrors.unitSystem) fieldErrors.unitSystem = ["Choose metric or US units."];
    return { fieldErrors, values };
  }
  try {
    await updateProfile(user, parsed.data);
  } catch (e) {
    const state = appErrorState(e);
    if (!state) throw e;
    return { ...state, values };
  }
  // name, time zone and units show on every page
  revalidatePath("/", "layout");
  return { ok: true, message: "Your details are saved." };
}
