"use client";

import { useActionState, useEffect, useState } from "react";
import { SheetForm } from "@/components/ui/sheet-form";
import type { Role } from "@/db/types";
import { FormMessage, TextField } from "@/components/ui/field";
import { SideSheetFooter } from "@/components/ui/side-sheet";
import type { UserSummary } from "@/lib/data/users";
import { updateUserAction, type UserEditState } from "../actions";
import { KitchenChoices, type KitchenOption } from "./kitchen-choices";
import { RoleSelect } from "./role-select";

export function UserEditForm({ user, kitchens, isSelf, onSaved, onCancel }: {
  user: UserSummary;
  kitchens: KitchenOption[];
  isSelf: boolean;
  onSaved: (message: string) => void;
  onCancel: () => void;
}) {
  const [state, action, pending] = useActionState<UserEditState, FormData>(updateUserAction, {});
  const [role, setRole] = useState<Role | "">(user.role);
  const [disabled, setDisabled] = useState(user.disabled);

  useEffect(() => {
    if (state.ok) onSaved(state.message ?? "Saved.");
  }, [state, onSaved]);

  const selected = state.values?.kitchenIds ?? user.kitchens.map((k) => k.id);
  return (
    <SheetForm action={action}>
      <input type="hidden" name="id" value={user.id} />
      <FormMessage tone="error">{state.message}</FormMessage>
      <TextField name="name" id="edit-name" label="Name" autoComplete="off" required defaultValue={user.name} errors={state.fieldErrors?.name} initialFocus />
      <RoleSelect id="edit-role" value={role} onChange={setRole} errors={state.fieldErrors?.role} disabled={isSelf} />
      {isSelf ? <p className="-mt-3 text-sm text-brine">You can&apos;t change your own role. Another admin can.</p> : null}
      {role === "kitchen_lead" ? (
        <KitchenChoices idPrefix="edit" kitchens={kitchens} selected={selected} errors={state.fieldErrors?.kitchenIds} />
      ) : (
        <p className="text-sm text-brine">Works in every kitchen.</p>
      )}
      {isSelf ? null : (
        <fieldset>
          <legend className="field-label">Access</legend>
          <input type="hidden" name="disabledShown" value="1" />
          <label className="flex min-h-touch cursor-pointer items-start gap-3 rounded-md border border-brine-line px-3 py-2.5 hover:bg-salt">
            <input
              type="checkbox" name="disabled" checked={disabled} onChange={(e) => setDisabled(e.target.checked)}
              className="mt-0.5 h-5 w-5 accent-paprika" aria-describedby="edit-disabled-hint"
            />
            <span>
              <span className="block font-semibold">Disable this account</span>
              <span id="edit-disabled-hint" className="block text-sm text-brine">
                {user.disabled ? "Untick to let them sign in again." : "They are signed out at once and can't sign in. Their records stay."}
              </span>
            </span>
          </label>
        </fieldset>
      )}
      <SideSheetFooter>
        <button type="button" className="btn-quiet" onClick={onCancel}>Cancel</button>
        <button type="submit" className="btn-primary" disabled={pending}>{pending ? "Saving…" : "Save changes"}</button>
      </SideSheetFooter>
    </SheetForm>
  );
}
