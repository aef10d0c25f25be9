"use server";

import { revalidatePath } from "next/cache";
import { appErrorState, zodErrors, type FormState } from "@/components/ui/form-state";
import { requireUser } from "@/lib/auth/session";
import { updateCompany, updateCureSettings } from "@/lib/data/companies";
import { companyCureSettingsInput, companyUpdateInput } from "@/lib/validation/company";

export type CompanyFormState = FormState<{ name?: string; timeZone?: string; currency?: string; weekStart?: string; approvalThreshold?: string }>;

export async function updateCompanyAction(_prev: CompanyFormState, form: FormData): Promise<CompanyFormState> {
  const user = await requireUser();
  const values = {
    name: String(form.get("name") ?? ""), timeZone: String(form.get("timeZone") ?? ""), currency: String(form.get("currency") ?? ""),
    weekStart: String(form.get("weekStart") ?? ""),
    approvalThreshold: String(form.get("approvalThreshold") ?? ""),
  };
  const parsed = companyUpdateInput.safeParse(values);
  if (!parsed.success) return { fieldErrors: zodErrors(parsed.error), values };
  try {
    await updateCompany(user, parsed.data);
  } catch (e) {
    const state = appErrorState(e);
    if (!state) throw e;
    return { ...state, values };
  }
  // the company name is in every page's header (and the week start shapes the planner)
  revalidatePath("/", "layout");
  return { ok: true, message: "Company details saved." };
}

export type CureSettingsFormState = FormState<{ regulatoryTable?: string; scaleResolutionG?: string }>;

/** The cure calculator's table and kitchen scale resolution (Settings > Company). */
export async function updateCureSettingsAction(_prev: CureSettingsFormState, form: FormData): Promise<CureSettingsFormState> {
  const user = await requireUser();
  const values = { regulatoryTable: String(form.get("regulatoryTable") ?? ""), scaleResolutionG: String(form.get("scaleResolutionG") ?? "") };
  const parsed = companyCureSettingsInput.safeParse(values);
  if (!parsed.success) return { fieldErrors: zodErrors(parsed.error), values };
  try {
    await updateCureSettings(user, parsed.data);
  } catch (e) {
    const state = appErrorState(e);
    if (!state) throw e;
    return { ...state, values };
  }
  revalidatePath("/planning/cure");
  return { ok: true, message: "Cure calculator settings saved." };
}
