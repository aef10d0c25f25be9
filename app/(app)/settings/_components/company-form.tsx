"use client";

import { useActionState } from "react";
import { FormMessage, StatusRegion, TextField } from "@/components/ui/field";
import { TimeZoneSelect } from "@/components/ui/time-zone-select";
import type { Company } from "@/lib/data/companies";
import { updateCompanyAction, type CompanyFormState } from "../actions";

export function CompanyForm({ company, zones }: { company: Omit<Company, "id">; zones: string[] }) {
  const [state, action, pending] = useActionState<CompanyFormState, FormData>(updateCompanyAction, {});
  // after a rejected save, show what was sent; otherwise the saved values
  const v = state.values ?? company;
  return (
    <form action={action} className="panel flex max-w-xl flex-col gap-5 px-6 py-6" noValidate>
      {state.ok ? null : <FormMessage tone="error">{state.message}</FormMessage>}
      <TextField name="name" label="Company name" autoComplete="organization" required defaultValue={v.name} errors={state.fieldErrors?.name} />
      <TimeZoneSelect
        name="timeZone" label="Time zone" zones={zones} defaultValue={v.timeZone} errors={state.fieldErrors?.timeZone}
        hint="Dates and day ends follow this zone, unless a kitchen or person sets its own."
      />
      <TextField
        name="currency" label="Currency" required defaultValue={v.currency} errors={state.fieldErrors?.currency}
        maxLength={3} autoCapitalize="characters" spellCheck={false} className="max-w-[12rem]"
        hint="Three-letter code, e.g. EUR, GBP or USD."
      />
      <div className="flex flex-wrap items-center justify-end gap-3">
        <StatusRegion>{state.ok ? state.message : null}</StatusRegion>
        <button type="submit" className="btn-primary" disabled={pending}>{pending ? "Saving…" : "Save"}</button>
      </div>
    </form>
  );
}
