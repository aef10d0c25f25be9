"use server";

import { revalidatePath } from "next/cache";
import { appErrorState, zodErrors, type FormState } from "@/components/ui/form-state";
import { requireUser } from "@/lib/auth/session";
import { updateCompany, updateCureSettings } from "@/lib/data/companies";
import { companyCureSettingsInput, companyUpdateInput } from "@/lib/validation/company";

export type CompanyFormState = FormState<{ name?: string; timeZone?: string; currency?: string; weekStart?: string; approvalThreshold?: string;
  priceTolerancePercent?: string; shortDatedCure?: string; shortDatedCasing?: string; shortDatedSpice?: string; scanSeparator?: string;
  warnCure?: string; warnCasing?: string; warnSpice?: string; warnIngredient?: string; costFormula?: string }>;

/** A days field: blank leaves the setting as it is; anything else must be a whole number (zod says so). */
const daysOf = (s: string) => (s.trim() === "" ? undefined : /^\d+$/.test(s.trim()) ? Number(s.trim()) : Number.NaN);
const RECEIVING_FIELDS: Record<string, string> = {
  "receiving.priceTolerancePercent": "priceTolerancePercent", "receiving.shortDatedDays.cure": "shortDatedCure",
  "receiving.shortDatedDays.casing": "shortDatedCasing", "receiving.shortDatedDays.spice": "shortDatedSpice",
  "expiryWindows.cure": "warnCure", "expiryWindows.casing": "warnCasing", "expiryWindows.spice": "warnSpice", "expiryWindows.ingredient": "warnIngredient",
};
/** "60, 30, 7" -> [60, 30, 7]; blank: no warnings; a part that is not a whole number fails zod's check (NaN). */
const daysListOf = (s: string) => (s.trim() === "" ? [] : s.split(/[,;\s]+/).filter(Boolean).map((p) => (/^\d+$/.test(p) ? Number(p) : Number.NaN)));

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
    warnCure: String(form.get("warnCure") ?? ""), warnCasing: String(form.get("warnCasing") ?? ""),
    warnSpice: String(form.get("warnSpice") ?? ""), warnIngredient: String(form.get("warnIngredient") ?? ""),
    costFormula: String(form.get("costFormula") ?? ""),
  };
  const parsed = companyUpdateInput.safeParse({
    ...values,
    // blank: no stand-in
    scanSeparator: values.scanSeparator === "" ? null : values.scanSeparator,
    costFormula: values.costFormula || undefined,
    expiryWindows: { cure: daysListOf(values.warnCure), casing: daysListOf(values.warnCasing), spice: daysListOf(values.warnSpice), ingredient: daysListOf(values.warnIngredient) },
    receiving: {
      priceTolerancePercent: values.priceTolerancePercent.trim() === "" ? undefined : values.priceTolerancePercent,
      shortDatedDays: { cure: daysOf(values.shortDatedCure), casing: daysOf(values.shortDatedCasing), spice: daysOf(values.shortDatedSpice) },
    },
  });
  if (!parsed.success) {
    const errors = zodErrors(parsed.error) as Record<string, string[] | undefined>;
    // nested fields by their own box (zod's flattened errors name only the top level)
    for (const issue of parsed.error.issues) {
      const field = RECEIVING_FIELDS[issue.path.slice(0, 2).join(".")] ?? RECEIVING_FIELDS[issue.path.slice(0, 3).join(".")];
      if (field) (errors[field] ??= []).push(issue.message);
    }
    delete errors.expiryWindows;
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
