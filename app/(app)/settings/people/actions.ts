"use server";

import { revalidatePath } from "next/cache";
import { appErrorState, zodErrors, type FieldErrors, type FormState } from "@/components/ui/form-state";
import { requireUser } from "@/lib/auth/session";
import { createInvitation, revokeInvitation } from "@/lib/data/invitations";
import { updateUser } from "@/lib/data/users";
import { uuid } from "@/lib/validation/common";
import { invitationCreateInput, userUpdateInput } from "@/lib/validation/company";

const LEAD_NEEDS_KITCHEN = "A kitchen lead needs at least one kitchen.";

/** Our own words for the schema's terse defaults, so every message reads the same. */
function friendly(errors: FieldErrors, values: { name: string }, extra: FieldErrors = {}): FieldErrors {
  const out: FieldErrors = { ...errors };
  if (out.role) out.role = ["Choose a role."];
  if (out.name) out.name = [values.name.trim() ? "Use at most 120 characters." : "Enter the person's name."];
  for (const [k, v] of Object.entries(extra)) if (v && !out[k]) out[k] = v;
  return out;
}

export type InviteState = FormState<{ email: string; name: string; role: string; kitchenIds: string[] }>;

export async function inviteAction(_prev: InviteState, form: FormData): Promise<InviteState> {
  const user = await requireUser();
  const values = {
    email: String(form.get("email") ?? ""),
    name: String(form.get("name") ?? ""),
    role: String(form.get("role") ?? ""),
    kitchenIds: form.getAll("kitchenIds").map(String),
  };
  const isLead = values.role === "kitchen_lead";
  // Only a kitchen lead is limited to kitchens; any other role works in all of them.
  const parsed = invitationCreateInput.safeParse({ ...values, kitchenIds: isLead ? values.kitchenIds : [] });
  if (!parsed.success) {
    // the schema checks kitchens only once the rest is valid; say it all at once
    const extra = isLead && values.kitchenIds.length === 0 ? { kitchenIds: [LEAD_NEEDS_KITCHEN] } : {};
    return { fieldErrors: friendly(zodErrors(parsed.error), values, extra), values };
  }
  try {
    await createInvitation(user, parsed.data);
  } catch (e) {
    const state = appErrorState(e);
    if (!state) throw e;
    return { ...state, values };
  }
  revalidatePath("/settings/people");
  return { ok: true, message: `Invitation sent to ${parsed.data.email}.` };
}

export type UserEditState = FormState<{ name: string; role?: string; kitchenIds?: string[]; disabled?: boolean }>;

export async function updateUserAction(_prev: UserEditState, form: FormData): Promise<UserEditState> {
  const user = await requireUser();
  const id = uuid.safeParse(form.get("id"));
  if (!id.success) return { message: "This person could not be found. Reload the page and try again." };
  // Fields the form did not show (own role, own account, kitchens of other roles) stay as they are.
  const role = form.get("role");
  const values = {
    name: String(form.get("name") ?? ""),
    role: role === null ? undefined : String(role),
    kitchenIds: form.has("kitchensShown") ? form.getAll("kitchenIds").map(String) : undefined,
    disabled: form.has("disabledShown") ? form.get("disabled") === "on" : undefined,
  };
  const extra = values.role === "kitchen_lead" && values.kitchenIds?.length === 0 ? { kitchenIds: [LEAD_NEEDS_KITCHEN] } : {};
  const parsed = userUpdateInput.safeParse(values);
  if (!parsed.success || extra.kitchenIds) {
    return { fieldErrors: friendly(parsed.success ? {} : zodErrors(parsed.error), values, extra), values };
  }
  let name: string;
  try {
    name = (await updateUser(user, id.data, parsed.data)).name;
  } catch (e) {
    const state = appErrorState(e);
    if (!state) throw e;
    return { ...state, values };
  }
  // your own name is in every page's header
  if (id.data === user.id) revalidatePath("/", "layout");
  else revalidatePath("/settings/people");
  return { ok: true, message: `Saved changes for ${name}.` };
}

export type WithdrawState = FormState;

export async function withdrawInvitationAction(_prev: WithdrawState, form: FormData): Promise<WithdrawState> {
  const user = await requireUser();
  const id = uuid.safeParse(form.get("id"));
  if (!id.success) return { message: "This invitation could not be found. Reload the page and try again." };
  let email: string;
  try {
    email = (await revokeInvitation(user, id.data)).email;
  } catch (e) {
    const state = appErrorState(e);
    if (!state) throw e;
    return state;
  }
  revalidatePath("/settings/people");
  return { ok: true, message: `Invitation to ${email} withdrawn.` };
}
