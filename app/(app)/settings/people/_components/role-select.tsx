// The role picker with a line under it saying what the chosen role may do.
import type { Role } from "@/db/types";
import { ROLES } from "@/lib/validation/company";
import { describedBy, FieldError, FieldHint } from "@/components/ui/field";
import { ROLE_HINTS, ROLE_LABELS } from "@/lib/auth/roles";

export function RoleSelect({ id, value, onChange, errors, disabled, placeholder }: {
  id: string;
  value: Role | "";
  onChange: (role: Role | "") => void;
  errors?: string[];
  disabled?: boolean;
  placeholder?: string;
}) {
  return (
    <div>
      <label htmlFor={id} className="field-label">Role</label>
      <select
        id={id} name="role" value={value} disabled={disabled} className="field-input"
        onChange={(e) => onChange(e.target.value as Role | "")}
        {...describedBy(id, errors, Boolean(value))}
      >
        {placeholder ? <option value="" disabled>{placeholder}</option> : null}
        {ROLES.map((r) => (
          <option key={r} value={r}>{ROLE_LABELS[r]}</option>
        ))}
      </select>
      {value ? <FieldHint id={id}>{ROLE_HINTS[value]}</FieldHint> : null}
      <FieldError id={id} errors={errors} />
    </div>
  );
}
