"use client";

// The cure calculator's company settings: which regulatory table its checks use, and the kitchen
// scale's resolution that cure quantities are rounded to (toward compliance).
import { useActionState } from "react";
import { describedBy, FieldError, FieldHint, FormMessage, StatusRegion, TextField } from "@/components/ui/field";
import { TABLE_LABELS, TABLES } from "@/lib/cure/limits";
import type { CureSettings } from "@/lib/data/companies";
import { updateCureSettingsAction, type CureSettingsFormState } from "../actions";

export function CureSettingsForm({ settings }: { settings: CureSettings }) {
  const [state, action, pending] = useActionState<CureSettingsFormState, FormData>(updateCureSettingsAction, {});
  const v = state.values ?? settings;
  return (
    <form action={action} className="panel mt-6 flex max-w-xl flex-col gap-5 px-6 py-6" noValidate aria-labelledby="cure-settings-title">
      <div>
        <h2 id="cure-settings-title" className="text-xl font-semibold">Cure calculator</h2>
        <p className="mt-1 text-sm text-brine">The limits the calculator checks and the scale cure is weighed on. Planning defaults: local regulation and your HACCP plan govern.</p>
      </div>
      {state.ok ? null : <FormMessage tone="error">{state.message}</FormMessage>}
      <div>
        <label htmlFor="regulatoryTable" className="field-label">Regulatory table</label>
        <select
          key={v.regulatoryTable} id="regulatoryTable" name="regulatoryTable" defaultValue={v.regulatoryTable} className="field-input"
          {...describedBy("regulatoryTable", state.fieldErrors?.regulatoryTable, true)}
        >
          {TABLES.map((t) => <option key={t} value={t}>{TABLE_LABELS[t]}</option>)}
        </select>
        <FieldHint id="regulatoryTable">With no table, nothing is blocked and the calculator says that no regulatory check was made.</FieldHint>
        <FieldError id="regulatoryTable" errors={state.fieldErrors?.regulatoryTable} />
      </div>
      <TextField
        name="scaleResolutionG" label="Kitchen scale resolution (g)" inputMode="decimal" required defaultValue={v.scaleResolutionG}
        errors={state.fieldErrors?.scaleResolutionG} className="max-w-[12rem]"
        hint="The smallest step the cure scale shows, e.g. 0.1 g. Cure quantities are rounded to it toward compliance."
      />
      <div className="flex flex-wrap items-center justify-end gap-3">
        <StatusRegion>{state.ok ? state.message : null}</StatusRegion>
        <button type="submit" className="btn-primary" disabled={pending}>{pending ? "Saving…" : "Save cure settings"}</button>
      </div>
    </form>
  );
}
