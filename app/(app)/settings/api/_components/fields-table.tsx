// Name, type, required and constraints of a body's or a schema's fields.
import type { FieldView } from "./reference-model";

export function TypeName({ type, schema }: { type: string; schema?: string }) {
  if (!schema) return <code className="font-mono text-[13px] text-pepper-soft">{type}</code>;
  const [before, after] = type.split(schema) as [string, string | undefined];
  return (
    <code className="font-mono text-[13px] text-pepper-soft">
      {before}
      <a href={`#schema-${schema}`} className="font-semibold text-paprika underline-offset-2 hover:underline">{schema}</a>
      {after}
    </code>
  );
}

export function FieldsTable({ fields, location, caption }: { fields: (FieldView & { in?: string })[]; location?: boolean; caption: string }) {
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-left text-sm">
        <caption className="sr-only">{caption}</caption>
        <thead>
          <tr className="border-b border-salt-edge text-xs uppercase tracking-wide text-brine">
            <th scope="col" className="py-2 pr-3 font-semibold">{location ? "Parameter" : "Field"}</th>
            <th scope="col" className="py-2 pr-3 font-semibold">Type</th>
            <th scope="col" className="py-2 pr-3 font-semibold">Required</th>
            <th scope="col" className="py-2 font-semibold">Constraints and notes</th>
          </tr>
        </thead>
        <tbody>
          {fields.map((f) => (
            <tr key={`${f.in ?? ""}${f.name}`} className="border-b border-salt-edge align-top last:border-b-0">
              <th scope="row" className="py-2 pr-3 text-left font-normal">
                <code className="font-mono text-[13px] font-semibold text-pepper">{f.name}</code>
                {location && f.in ? <span className="ml-1.5 text-xs text-brine">in {f.in}</span> : null}
              </th>
              <td className="py-2 pr-3"><TypeName type={f.type} schema={f.ref} /></td>
              <td className="whitespace-nowrap py-2 pr-3">
                {f.required ? <span className="font-semibold text-pepper">Required</span> : <span className="text-brine">Optional</span>}
              </td>
              <td className="py-2 text-pepper-soft">
                {f.constraints.length ? (
                  <ul className="space-y-0.5">
                    {f.constraints.map((c) => (
                      <li key={c} className="break-words">
                        {c.startsWith("matches ") ? <>matches <code className="font-mono text-[13px]">{c.slice(8)}</code></> : c}
                      </li>
                    ))}
                  </ul>
                ) : null}
                {f.description ? <p className={f.constraints.length ? "mt-1 text-brine" : "text-brine"}>{f.description}</p> : null}
                {!f.constraints.length && !f.description ? <span className="text-brine" aria-label="none">–</span> : null}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
