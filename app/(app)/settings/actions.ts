"use server";

import { revalidatePath } from "next/cache";
import { appErrorState, zodErrors, type FormState } from "@/components/ui/form-state";
import { requireUser } from "@/lib/auth/session";
import { updateCompany, updateCureSettings } from "@/lib/data/companies";
import { companyCureSettingsInput, companyUpdateInput } from "@/lib/validation/company";

export type CompanyFormState = FormState<{ name?: string; timeZone?: string; currency?: string; weekStart?: string; approvalThreshold?: string;
  priceTolerancePercent?: string; shortDatedCure?: string; shortDatedCasing?: string; shortDatedSpice?: string; scanSeparator?: string }>;

/** A days field: blank leaves the setting as it is; anything else must be a whole number (zod says so). */
const daysOf = (s: string) => (s.trim() === "" ? undefined : /^\d+$/.test(s.trim()) ? Number(s.trim()) : Number.NaN);
const RECEIVING_FIELDS: Record<string, string> = {
  "receiving.priceTolerancePercent": "priceTolerancePercent", "receiving.shortDatedDays.cure": "shortDatedCure",
  "receiving.shortDatedDays.casing": "shortDatedCasing", "receiving.shortDatedDays.spice": "shortDatedSpice",
};

export async function updateCompanyAction(_prev: CompanyFormState, form: FormData): Promise<CompanyFormState> {
  const user = await requireUser();
  const values = {
    name: String(form.get("name") ?? ""), timeZone: String(form.get("timeZone") ?? ""), currency: String(form.get("currency") ?? ""),
    weekStart: String(form.get("weekStart") ?? ""),
    approvalThreshold: String(form.get("approvalThreshold") ?? ""),
    priceTolerancePercent: String(form.get("priceTolerancePercent") ?? ""), shortDatedCure: String(form.get("shortDatedCure") ?? ""),
    shortDatedCasing: String(form.get("shortDatedCasing") ?? ""), shortDatedSpice: String(form.get("shortDatedSpice") ?? ""),
    // not trimmed: a space could be part of what a scanner types
    scanSeparator: String(form.get("scanSeparator") ?? ""),
  };
  const parsed = companyUpdateInput.safeParse({
    ...values,
    // blank: no stand-in
    scanSeparator: values.scanSeparator === "" ? null : values.scanSeparator,
    receiving: {
      priceTolerancePercent: values.priceTolerancePercent.trim() === "" ? undefined : values.priceTolerancePercent,
      shortDatedDays: { cure: daysOf(values.shortDatedCure), casing: daysOf(values.shortDatedCasing), spice: daysOf(values.shortDatedSpice) },
    },
  });
  if (!parsed.success) {
    const errors = zodErrors(parsed.error) as Record<string, string[] | undefined>;
    for (const [path, field] of Object.entries(RECEIVING_FIELDS)) if (errors[path]) errors[field] = errors[path];
    return { fieldErrors: errors, values };
  }
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
