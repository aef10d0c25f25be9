// A time zone picker grouped by region. Takes its list from timeZoneOptions() (see there why).
import { describedBy, FieldError, FieldHint } from "./field";

function groups(zones: string[]): [string, string[]][] {
  const map = new Map<string, string[]>();
  for (const z of zones) {
    const region = z.includes("/") ? z.slice(0, z.indexOf("/")) : "Other";
    if (!map.has(region)) map.set(region, []);
    map.get(region)!.push(z);
  }
  return [...map.entries()];
}

export function TimeZoneSelect({ name, id = name, label, zones, defaultValue, emptyLabel, errors, hint }: {
  name: string;
  id?: string;
  label: string;
  zones: string[];
  defaultValue?: string | null;
  /** When given, an empty first option with this label (e.g. "Same as the company"). */
  emptyLabel?: string;
  errors?: string[];
  hint?: string;
}) {
  return (
    <div>
      <label htmlFor={id} className="field-label">{label}</label>
      {/* keyed by its default: React applies a select's defaultValue only on mount, and a form
          reset after a save must land on the value just saved */}
      <select key={defaultValue ?? ""} id={id} name={name} defaultValue={defaultValue ?? ""} className="field-input" {...describedBy(id, errors, Boolean(hint))}>
        {emptyLabel !== undefined ? <option value="">{emptyLabel}</option> : null}
        {groups(zones).map(([region, list]) => (
          <optgroup key={region} label={region}>
            {list.map((z) => (
              <option key={z} value={z}>
                {z.replaceAll("_", " ")}
              </option>
            ))}
          </optgroup>
        ))}
      </select>
      {hint ? <FieldHint id={id}>{hint}</FieldHint> : null}
      <FieldError id={id} errors={errors} />
    </div>
  );
}
