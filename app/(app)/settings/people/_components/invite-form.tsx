"use client";

import { useActionState, useEffect, useState } from "react";
import { SheetForm } from "@/components/ui/sheet-form";
import type { Role } from "@/db/types";
import { FormMessage, TextField } from "@/components/ui/field";
import { SideSheetFooter } from "@/components/ui/side-sheet";
import { inviteAction, type InviteState } from "../actions";
import { KitchenChoices, type KitchenOption } from "./kitchen-choices";
import { RoleSelect } from "./role-select";

export function InviteForm({ kitchens, onSent, onCancel }: {
  kitchens: KitchenOption[];
  onSent: (message: string) => void;
  onCancel: () => void;
}) {
  const [state, action, pending] = useActionState<InviteState, FormData>(inviteAction, {});
  const [role, setRole] = useState<Role | "">("");

  useEffect(() => {
    if (state.ok) onSent(state.message ?? "Invitation sent.");
  }, [state, onSent]);

  return (
    <SheetForm action={action}>
      <FormMessage tone="error">{state.message}</FormMessage>
      <TextField
        name="email" id="invite-email" label="E-mail" type="email" autoComplete="off" required initialFocus
        errors={state.fieldErrors?.email} hint="The invitation link goes here. It works once, for 7 days."
      />
      <TextField name="name" id="invite-name" label="Name" autoComplete="off" required errors={state.fieldErrors?.name} />
      <RoleSelect id="invite-role" value={role} onChange={setRole} errors={state.fieldErrors?.role} placeholder="Choose a role…" />
      {role === "kitchen_lead" ? (
        <KitchenChoices idPrefix="invite" kitchens={kitchens} selected={state.values?.kitchenIds ?? []} errors={state.fieldErrors?.kitchenIds} />
      ) : null}
      <SideSheetFooter>
        <button type="button" className="btn-quiet" onClick={onCancel}>Cancel</button>
        <button type="submit" className="btn-primary" disabled={pending}>{pending ? "Sending…" : "Send invitation"}</button>
      </SideSheetFooter>
    </SheetForm>
  );
}
