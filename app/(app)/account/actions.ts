"use server";

import { revalidatePath } from "next/cache";
import { appErrorState, zodErrors, type FormState } from "@/components/ui/form-state";
import { requireUser } from "@/lib/auth/session";
import { defaultAlertKinds } from "@/lib/alerts/digest";
import { updateAlertPreferences } from "@/lib/data/preferences";
import { updateProfile } from "@/lib/data/users";
import { alertPreferencesInput } from "@/lib/validation/preferences";
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

export type AlertEmailState = FormState<{ alertEmail: string; digestHour: string; alertKinds: string[] }>;

export async function updateAlertEmailAction(_prev: AlertEmailState, form: FormData): Promise<AlertEmailState> {
  const user = await requireUser();
  const values = {
    alertEmail: String(form.get("alertEmail") ?? ""),
    digestHour: String(form.get("digestHour") ?? ""),
    alertKinds: form.getAll("alertKinds").map(String),
  };
  const parsed = alertPreferencesInput.safeParse({
    alertEmail: values.alertEmail,
    digestHour: values.digestHour === "" ? NaN : Number(values.digestHour),
    // the form always sends the full choice; "role default" is only kept when nothing changed from it
    alertKinds: form.get("kindsAreRoleDefault") === "1" && sameSet(values.alertKinds, defaultAlertKinds(user.role)) ? null : values.alertKinds,
  });
  if (!parsed.success) return { fieldErrors: zodErrors(parsed.error), values };
  try {
    await updateAlertPreferences(user, parsed.data);
  } catch (e) {
    const state = appErrorState(e);
    if (!state) throw e;
    return { ...state, values };
  }
  revalidatePath("/account");
  return { ok: true, message: "Your alert e-mail settings are saved." };
}

const sameSet = (a: readonly string[], b: readonly string[]) => a.length === b.length && a.every((x) => b.includes(x));
