"use client";

// A quantity with its unit: a decimal text box (typed as text, never a float) and a unit select,
// labelled together, with a hint and the errors for the field. With checkDecimal, a value that is
// not a plain decimal is flagged as it is typed.
import { isDecimalString } from "@/lib/units";
import { describedBy, FieldError, FieldHint } from "./field";

export interface Amount {
  quantity: string;
  unit: string;
}

export function AmountField({ id, label, value, units, onChange, errors, hint, checkDecimal = false }: {
  id: string;
  label: string;
  value: Amount;
  units: readonly string[];
  onChange: (v: Amount) => void;
  errors?: string[];
  hint?: string;
  checkDecimal?: boolean;
}) {
  const bad = checkDecimal && value.quantity.trim() !== "" && !isDecimalString(value.quantity.trim());
  const shown = errors ?? (bad ? ["Type the number with a point for decimals, e.g. 12.5."] : undefined);
  return (
    <div>
      <label htmlFor={id} className="field-label">{label}</label>
      <div className="flex gap-2">
        <input id={id} type="text" inputMode="decimal" className="field-input num" value={value.quantity} autoComplete="off"
          onChange={(e) => onChange({ ...value, quantity: e.target.value })} {...describedBy(id, shown, Boolean(hint))} />
        <label htmlFor={`${id}-unit`} className="sr-only">{label}: unit</label>
        <select id={`${id}-unit`} className="field-input w-24 shrink-0" value={value.unit} onChange={(e) => onChange({ ...value, unit: e.target.value })}>
          {units.map((u) => <option key={u} value={u}>{u}</option>)}
        </select>
      </div>
      {hint ? <FieldHint id={id}>{hint}</FieldHint> : null}
      <FieldError id={id} errors={shown} />
    </div>
  );
}
