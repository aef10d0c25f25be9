"use client";

import { useActionState } from "react";
import { describedBy, FieldError, FieldHint, FormMessage, StatusRegion, TextField } from "@/components/ui/field";
import { TimeZoneSelect } from "@/components/ui/time-zone-select";
import type { Company } from "@/lib/data/companies";
import { WEEK_STARTS, type WeekStart } from "@/lib/validation/company";
import { updateCompanyAction, type CompanyFormState } from "../actions";

const COST_FORMULAS = [
  { value: "fifo", label: "First in, first out", hint: "use is costed from the oldest stock received" },
  { value: "average", label: "Moving average", hint: "use is costed at the average of what is in stock" },
] as const;

const WARN_FIELDS = [
  { name: "warnCure", category: "cure", label: "Cures" },
  { name: "warnCasing", category: "casing", label: "Casings" },
  { name: "warnSpice", category: "spice", label: "Spices" },
  { name: "warnIngredient", category: "ingredient", label: "Other ingredients" },
] as const;

const DAY_NAMES: Record<WeekStart, string> = { monday: "Monday", sunday: "Sunday", saturday: "Saturday" };

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
      <div>
        <label htmlFor="weekStart" className="field-label">Planning weeks begin on</label>
        <select
          key={v.weekStart} id="weekStart" name="weekStart" defaultValue={v.weekStart} className="field-input max-w-[12rem]"
          {...describedBy("weekStart", state.fieldErrors?.weekStart, true)}
        >
          {WEEK_STARTS.map((d) => <option key={d} value={d}>{DAY_NAMES[d]}</option>)}
        </select>
        <FieldHint id="weekStart">The week planner shows this day and the six after it.</FieldHint>
        <FieldError id="weekStart" errors={state.fieldErrors?.weekStart} />
      </div>
      <TextField
        name="approvalThreshold" label="Buyers may approve orders up to" inputMode="decimal" required defaultValue={v.approvalThreshold}
        errors={state.fieldErrors?.approvalThreshold} className="max-w-[12rem]"
        hint={`A purchase order's total, in ${company.currency}. Above it, a manager or an admin approves the order.`}
      />
      <fieldset className="flex flex-col gap-3">
        <legend className="field-label">Checking deliveries</legend>
        <TextField
          name="priceTolerancePercent" label="Flag a delivered price more than this % off the order" inputMode="decimal"
          defaultValue={state.values?.priceTolerancePercent ?? company.receiving.priceTolerancePercent} errors={state.fieldErrors?.priceTolerancePercent} className="max-w-[12rem]"
        />
        <p className="text-sm text-brine">Flag a lot as short-dated when it has fewer days of life left than:</p>
        <div className="flex flex-wrap gap-4">
          <TextField name="shortDatedCure" label="Cures (days)" inputMode="numeric" defaultValue={state.values?.shortDatedCure ?? String(company.receiving.shortDatedDays.cure)} errors={state.fieldErrors?.shortDatedCure} className="max-w-[8rem]" />
          <TextField name="shortDatedCasing" label="Casings (days)" inputMode="numeric" defaultValue={state.values?.shortDatedCasing ?? String(company.receiving.shortDatedDays.casing)} errors={state.fieldErrors?.shortDatedCasing} className="max-w-[8rem]" />
          <TextField name="shortDatedSpice" label="Spices (days)" inputMode="numeric" defaultValue={state.values?.shortDatedSpice ?? String(company.receiving.shortDatedDays.spice)} errors={state.fieldErrors?.shortDatedSpice} className="max-w-[8rem]" />
        </div>
        <TextField
          name="scanSeparator" label="What your scanners type for the label's group separator" maxLength={8} spellCheck={false} autoComplete="off"
          defaultValue={state.values?.scanSeparator ?? company.scanSeparator ?? ""} errors={state.fieldErrors?.scanSeparator} className="max-w-[8rem]"
          hint="Only for scanners that cannot send GS into a browser: set them to type a character such as | or ~ instead, and enter it here. Leave empty when yours send GS."
        />
      </fieldset>
      <fieldset className="flex flex-col gap-3" {...describedBy("costFormula", state.fieldErrors?.costFormula)}>
        <legend className="field-label">Cost formula of the reports and the Overview</legend>
        <div className="flex flex-wrap gap-3">
          {COST_FORMULAS.map((f) => (
            <label
              key={f.value}
              className="flex min-h-touch min-w-[14rem] flex-1 cursor-pointer items-center gap-3 rounded-md border border-brine-line bg-white px-3 py-2 hover:bg-salt has-[:checked]:border-paprika has-[:checked]:bg-paprika-soft"
            >
              <input type="radio" name="costFormula" value={f.value} defaultChecked={(state.values?.costFormula || company.costFormula) === f.value} className="h-5 w-5 accent-paprika" />
              <span>
                <span className="block font-semibold">{f.label}</span>
                <span className="block text-sm text-brine">{f.hint}</span>
              </span>
            </label>
          ))}
        </div>
        <p className="text-sm text-brine">Kept per kitchen. It can change only while no month is closed.</p>
        <FieldError id="costFormula" errors={state.fieldErrors?.costFormula} />
      </fieldset>
      <fieldset className="flex flex-col gap-3">
        <legend className="field-label">Warnings before a lot&apos;s date</legend>
        <p className="text-sm text-brine">
          The morning check warns when a lot in stock is this many days or fewer from its use-by or best-before date, once for each number.
          Separate numbers with commas; leave a box empty for no warnings.
        </p>
        <div className="grid grid-cols-2 gap-4">
          {WARN_FIELDS.map((f) => (
            <TextField
              key={f.name} name={f.name} label={`${f.label} (days)`} spellCheck={false} autoComplete="off"
              defaultValue={state.values?.[f.name] ?? company.expiryWindows[f.category].join(", ")} errors={state.fieldErrors?.[f.name]}
            />
          ))}
        </div>
      </fieldset>
      <div className="flex flex-wrap items-center justify-end gap-3">
        <StatusRegion>{state.ok ? state.message : null}</StatusRegion>
        <button type="submit" className="btn-primary" disabled={pending}>{pending ? "Saving…" : "Save"}</button>
      </div>
    </form>
  );
}
