"use client";

import { useActionState, useEffect } from "react";
import { SheetForm } from "@/components/ui/sheet-form";
import { describedBy, FieldError, FormMessage, StatusCheckbox, TextField } from "@/components/ui/field";
import { SideSheetFooter } from "@/components/ui/side-sheet";
import { TimeZoneSelect } from "@/components/ui/time-zone-select";
import type { Kitchen } from "@/lib/data/kitchens";
import { saveKitchenAction, type KitchenFormState } from "../actions";

/** Add (no kitchen given) or edit a kitchen. */
export function KitchenForm({ kitchen, zones, companyTimeZone, onSaved, onCancel }: {
  kitchen?: Kitchen;
  zones: string[];
  companyTimeZone: string;
  onSaved: (message: string) => void;
  onCancel: () => void;
}) {
  const [state, action, pending] = useActionState<KitchenFormState, FormData>(saveKitchenAction, {});
  useEffect(() => {
    if (state.ok) onSaved(state.message ?? "Saved.");
  }, [state, onSaved]);
  const e = state.fieldErrors;

  return (
    <SheetForm action={action}>
      {kitchen ? <input type="hidden" name="id" value={kitchen.id} /> : null}
      <FormMessage tone="error">{state.message}</FormMessage>
      <TextField
        name="code" id="kitchen-code" label="Code" required defaultValue={kitchen?.code} errors={e?.code} initialFocus
        maxLength={12} autoCapitalize="characters" autoComplete="off" spellCheck={false} className="max-w-[14rem]"
        hint="Short and unique, e.g. NORTH-1. Shown on labels and in the kitchen switcher."
      />
      <TextField name="name" id="kitchen-name" label="Name" required defaultValue={kitchen?.name} errors={e?.name} autoComplete="off" />
      <div>
        <label htmlFor="kitchen-address" className="field-label">Address <span className="font-normal text-brine">(optional)</span></label>
        <textarea
          id="kitchen-address" name="address" rows={3} defaultValue={kitchen?.address}
          className="field-input py-2" {...describedBy("kitchen-address", e?.address)}
        />
        <FieldError id="kitchen-address" errors={e?.address} />
      </div>
      <TimeZoneSelect
        name="timeZone" id="kitchen-time-zone" label="Time zone" zones={zones} defaultValue={kitchen?.timeZone}
        emptyLabel={`The company's (${companyTimeZone.replaceAll("_", " ")})`} errors={e?.timeZone}
        hint="Only for a kitchen in another time zone than the company."
      />
      {kitchen ? (
        <StatusCheckbox id="kitchen-archived" name="archived" label="Archived" defaultChecked={kitchen.archived} errors={e?.archived}
          hint={kitchen.archived ? "Untick to open this kitchen again." : "Leaves the kitchen switcher and new work. Its records stay."} />
      ) : null}
      <SideSheetFooter>
        <button type="button" className="btn-quiet" onClick={onCancel}>Cancel</button>
        <button type="submit" className="btn-primary" disabled={pending}>
          {pending ? "Saving…" : kitchen ? "Save changes" : "Add kitchen"}
        </button>
      </SideSheetFooter>
    </SheetForm>
  );
}
