"use client";

import { useActionState } from "react";
import { describedBy, FieldError, FormMessage, StatusRegion, TextField } from "@/components/ui/field";
import { TimeZoneSelect } from "@/components/ui/time-zone-select";
import { updateProfileAction, type ProfileState } from "../actions";

const UNITS = [
  { value: "metric", label: "Metric", example: "kg, g, m, l" },
  { value: "us", label: "US", example: "lb, oz, ft, gal" },
] as const;

export function ProfileForm({ profile, zones, companyTimeZone }: {
  profile: { name: string; timeZone: string | null; unitSystem: "metric" | "us" };
  zones: string[];
  companyTimeZone: string;
}) {
  const [state, action, pending] = useActionState<ProfileState, FormData>(updateProfileAction, {});
  // after a rejected save, show what was sent; otherwise the saved values
  const v = state.values ?? { ...profile, timeZone: profile.timeZone ?? "" };
  const unitErrors = state.fieldErrors?.unitSystem;
  return (
    <form action={action} className="panel flex max-w-xl flex-col gap-5 px-6 py-6" noValidate>
      {state.ok ? null : <FormMessage tone="error">{state.message}</FormMessage>}
      <TextField name="name" label="Your name" autoComplete="name" required defaultValue={v.name} errors={state.fieldErrors?.name} />
      <TimeZoneSelect
        name="timeZone" label="Time zone" zones={zones} defaultValue={v.timeZone} errors={state.fieldErrors?.timeZone}
        emptyLabel={`The company's (${companyTimeZone.replaceAll("_", " ")})`}
        hint="Dates and times are shown to you in this zone."
      />
      <fieldset {...describedBy("unitSystem", unitErrors)}>
        <legend className="field-label">Units</legend>
        <div className="flex flex-wrap gap-3">
          {UNITS.map((u) => (
            <label
              key={u.value}
              className="flex min-h-touch min-w-[10rem] cursor-pointer items-center gap-3 rounded-md border border-brine-line bg-white px-3 py-2 hover:bg-salt has-[:checked]:border-paprika has-[:checked]:bg-paprika-soft"
            >
              <input type="radio" name="unitSystem" value={u.value} defaultChecked={v.unitSystem === u.value} className="h-5 w-5 accent-paprika" />
              <span>
                <span className="block font-semibold">{u.label}</span>
                <span className="block text-sm text-brine">{u.example}</span>
              </span>
            </label>
          ))}
        </div>
        <FieldError id="unitSystem" errors={unitErrors} />
      </fieldset>
      <div className="flex flex-wrap items-center justify-end gap-3">
        <StatusRegion>{state.ok ? state.message : null}</StatusRegion>
        <button type="submit" className="btn-primary" disabled={pending}>{pending ? "Saving…" : "Save"}</button>
      </div>
    </form>
  );
}
