"use client";

import { useActionState } from "react";
import { describedBy, FieldError, FieldHint, FormMessage, StatusRegion } from "@/components/ui/field";
import type { AlertPreferences } from "@/lib/validation/preferences";
import { updateAlertEmailAction, type AlertEmailState } from "../actions";

const MODES = [
  { value: "digest", label: "A daily digest", example: "one e-mail at the hour you choose" },
  { value: "immediate", label: "As they are found", example: "an e-mail after each check that finds something" },
  { value: "off", label: "No e-mail", example: "alerts stay in the app" },
] as const;

const KINDS = [
  { value: "expiry", label: "Lots nearing their date", hint: "cure, casings and spices, by your company's warning windows" },
  { value: "reorder", label: "Below reorder point", hint: "projected stock under the reorder point" },
  { value: "shortage", label: "Short for planned batches", hint: "batches in the next 7 days that stock cannot cover" },
] as const;

const hourLabel = (h: number) => `${String(h).padStart(2, "0")}:00`;
const radioCard =
  "flex min-h-touch min-w-[12rem] cursor-pointer items-center gap-3 rounded-md border border-brine-line bg-white px-3 py-2 hover:bg-salt has-[:checked]:border-paprika has-[:checked]:bg-paprika-soft";

export function AlertEmailForm({ prefs }: { prefs: AlertPreferences }) {
  const [state, action, pending] = useActionState<AlertEmailState, FormData>(updateAlertEmailAction, {});
  const v = state.values ?? { alertEmail: prefs.alertEmail, digestHour: String(prefs.digestHour), alertKinds: prefs.alertKinds };
  const e = state.fieldErrors ?? {};
  return (
    <form action={action} className="panel flex max-w-xl flex-col gap-5 px-6 py-6" noValidate aria-labelledby="alert-email">
      <h2 id="alert-email" className="font-display text-lg font-semibold">Alert e-mail</h2>
      {prefs.receivesAlerts ? null : (
        <p className="text-brine">Your role sees no alerts, so nothing is e-mailed to you whatever you choose here.</p>
      )}
      {state.ok ? null : <FormMessage tone="error">{state.message}</FormMessage>}
      <input type="hidden" name="kindsAreRoleDefault" value={prefs.kindsAreRoleDefault ? "1" : "0"} />
      <fieldset {...describedBy("alertEmail", e.alertEmail)}>
        <legend className="field-label">How alerts reach you</legend>
        <div className="flex flex-wrap gap-3">
          {MODES.map((m) => (
            <label key={m.value} className={radioCard}>
              <input type="radio" name="alertEmail" value={m.value} defaultChecked={v.alertEmail === m.value} className="h-5 w-5 accent-paprika" />
              <span>
                <span className="block font-semibold">{m.label}</span>
                <span className="block text-sm text-brine">{m.example}</span>
              </span>
            </label>
          ))}
        </div>
        <FieldError id="alertEmail" errors={e.alertEmail} />
      </fieldset>
      <div>
        <label htmlFor="digestHour" className="field-label">Digest hour</label>
        {/* keyed: after a save the form resets to the saved hour, which a mounted select would not take */}
        <select key={v.digestHour} id="digestHour" name="digestHour" defaultValue={v.digestHour} className="field-input max-w-[10rem]" {...describedBy("digestHour", e.digestHour, true)}>
          {Array.from({ length: 24 }, (_, h) => <option key={h} value={h}>{hourLabel(h)}</option>)}
        </select>
        <FieldHint id="digestHour">In your time zone ({prefs.timeZone.replaceAll("_", " ")}). Used when you choose the daily digest.</FieldHint>
        <FieldError id="digestHour" errors={e.digestHour} />
      </div>
      <fieldset {...describedBy("alertKinds", e.alertKinds)}>
        <legend className="field-label">What to e-mail</legend>
        <div className="flex flex-col gap-2">
          {KINDS.map((k) => (
            <label key={k.value} className="flex cursor-pointer items-start gap-3">
              <input type="checkbox" name="alertKinds" value={k.value} defaultChecked={v.alertKinds.includes(k.value)} className="mt-1 h-5 w-5 accent-paprika" />
              <span>
                <span className="block font-semibold">{k.label}</span>
                <span className="block text-sm text-brine">{k.hint}</span>
              </span>
            </label>
          ))}
        </div>
        {prefs.kindsAreRoleDefault ? <p className="mt-2 text-sm text-brine">These are the defaults for your role.</p> : null}
        <FieldError id="alertKinds" errors={e.alertKinds} />
      </fieldset>
      <div className="flex flex-wrap items-center justify-end gap-3">
        <StatusRegion>{state.ok ? state.message : null}</StatusRegion>
        <button type="submit" className="btn-primary" disabled={pending}>{pending ? "Saving…" : "Save alert e-mail"}</button>
      </div>
    </form>
  );
}
