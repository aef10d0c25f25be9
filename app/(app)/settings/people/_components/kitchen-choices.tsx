// Kitchen checkboxes for a kitchen lead: each row a full-width 44px target.
import { describedBy, FieldError, FieldHint } from "@/components/ui/field";

export interface KitchenOption {
  id: string;
  code: string;
  name: string;
  archived: boolean;
}

export function KitchenChoices({ idPrefix, kitchens, selected, errors }: {
  idPrefix: string;
  kitchens: KitchenOption[];
  selected: readonly string[];
  errors?: string[];
}) {
  const id = `${idPrefix}-kitchens`;
  // archived kitchens only while still assigned, so they can be unticked
  const shown = kitchens.filter((k) => !k.archived || selected.includes(k.id));
  return (
    <fieldset {...describedBy(id, errors, true)}>
      <legend className="field-label">Kitchens</legend>
      <FieldHint id={id}>A kitchen lead works only in the kitchens ticked here.</FieldHint>
      <input type="hidden" name="kitchensShown" value="1" />
      <ul className="mt-2 divide-y divide-salt-edge rounded-md border border-brine-line">
        {shown.map((k) => (
          <li key={k.id}>
            <label className="flex min-h-touch cursor-pointer items-center gap-3 px-3 py-2 hover:bg-salt">
              <input type="checkbox" name="kitchenIds" value={k.id} defaultChecked={selected.includes(k.id)} className="h-5 w-5 accent-paprika" />
              <span className="w-16 font-semibold">{k.code}</span>
              <span className="min-w-0 flex-1">{k.name}</span>
              {k.archived ? <span className="text-sm text-brine">archived</span> : null}
            </label>
          </li>
        ))}
      </ul>
      <FieldError id={id} errors={errors} />
    </fieldset>
  );
}
