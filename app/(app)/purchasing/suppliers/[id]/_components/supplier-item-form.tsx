"use client";

// Add or edit one of a supplier's items: its SKU, our item, the pack as the supplier sells it and
// its GTIN. The pack's size in our stock unit is worked out as it is typed (lib/units, exact; the
// server converts again when it saves, and names both units when they do not convert).
import { useActionState, useEffect, useId, useMemo, useState } from "react";
import { SheetForm } from "@/components/ui/sheet-form";
import { describedBy, FieldError, FieldHint, FormMessage, StatusCheckbox, TextField } from "@/components/ui/field";
import { SideSheetFooter } from "@/components/ui/side-sheet";
import { ITEM_CATEGORIES, type ItemCategory } from "@/db/types";
import type { SupplierItem } from "@/lib/data/suppliers";
import { normalizeGtin } from "@/lib/gs1/gtin";
import { isDecimalString, isUnitError, plain, toStockUnits, unitsFor, type ItemUnits, type UnitSystem } from "@/lib/units";
import { packLengthText, packStockText } from "../../../_components/format";
import { saveSupplierItemAction, type SupplierFormState } from "../../../actions";

export interface CatalogueItem {
  id: string;
  sku: string;
  name: string;
  category: ItemCategory;
  archived: boolean;
  itemUnits: ItemUnits;
}

const CATEGORY_GROUPS: Record<ItemCategory, string> = { casing: "Casings", cure: "Cures", spice: "Spices", ingredient: "Other ingredients" };

export function SupplierItemForm({ supplierId, supplierItem, items, unitSystem, onSaved, onCancel }: {
  supplierId: string;
  supplierItem?: SupplierItem;
  /** the catalogue: items not archived, and the current item even if it is */
  items: CatalogueItem[];
  unitSystem: UnitSystem;
  onSaved: (message: string) => void;
  onCancel: () => void;
}) {
  const [state, action, pending] = useActionState<SupplierFormState, FormData>(saveSupplierItemAction, {});
  useEffect(() => {
    if (state.ok) onSaved(state.message ?? "Saved.");
  }, [state, onSaved]);
  const e = state.fieldErrors;
  const uid = useId();
  const fid = (name: string) => `${uid}-${name}`;

  const [itemId, setItemId] = useState(supplierItem?.item.id ?? "");
  const [quantity, setQuantity] = useState(supplierItem?.packQuantity ?? "");
  const [unit, setUnit] = useState(supplierItem?.packUnit ?? "");
  const [gtin, setGtin] = useState(supplierItem?.gtin ?? "");
  const item = items.find((i) => i.id === itemId);

  const unitChoices = useMemo(() => {
    if (!item) return [];
    try {
      return unitsFor(item.itemUnits);
    } catch {
      return [];
    }
  }, [item]);

  // what one pack is in our stock unit, as typed (display only; the server stores its own)
  const preview = useMemo(() => {
    if (!item || !isDecimalString(quantity.trim()) || !unit.trim()) return null;
    try {
      const exact = plain(toStockUnits(quantity.trim(), unit.trim(), item.itemUnits));
      const length = packLengthText(exact, item.itemUnits, unitSystem);
      return { ok: true as const, text: `One pack = ${packStockText(exact, item.itemUnits.stockUnit, item.itemUnits, unitSystem)}${length ? ` (${length})` : ""}` };
    } catch (err) {
      if (isUnitError(err)) return { ok: false as const, text: err.message };
      throw err;
    }
  }, [item, quantity, unit, unitSystem]);

  const gtin14 = gtin.trim() ? normalizeGtin(gtin) : null;
  const packErrors = [...(e?.packQuantity ?? []), ...(e?.packUnit ?? [])];
  const decimalProps = { inputMode: "decimal" as const, autoComplete: "off", spellCheck: false };

  return (
    <SheetForm action={action}>
      <input type="hidden" name="supplierId" value={supplierId} />
      {supplierItem ? <input type="hidden" name="id" value={supplierItem.id} /> : null}
      <FormMessage tone="error">{state.message}</FormMessage>
      <TextField
        name="sku" id={fid("sku")} label="Supplier's SKU" required defaultValue={supplierItem?.sku} errors={e?.sku} initialFocus maxLength={60}
        autoComplete="off" spellCheck={false} className="max-w-[18rem]" hint="Their code, as on their price list and delivery notes."
      />
      <TextField name="description" id={fid("description")} label="Their description" defaultValue={supplierItem?.description} errors={e?.description} autoComplete="off" maxLength={200} />
      <div>
        <label htmlFor={fid("item")} className="field-label">Our item</label>
        <select
          id={fid("item")} name="item" value={itemId} onChange={(ev) => setItemId(ev.target.value)} className="field-input"
          {...describedBy(fid("item"), e?.item, true)}
        >
          <option value="" disabled>Choose from the catalogue…</option>
          {ITEM_CATEGORIES.map((c) => {
            const group = items.filter((i) => i.category === c);
            return group.length ? (
              <optgroup key={c} label={CATEGORY_GROUPS[c]}>
                {group.map((i) => <option key={i.id} value={i.id}>{i.sku} · {i.name}{i.archived ? " (archived)" : ""}</option>)}
              </optgroup>
            ) : null;
          })}
        </select>
        <FieldHint id={fid("item")}>Other suppliers&apos; items for the same stock item are its alternatives.</FieldHint>
        <FieldError id={fid("item")} errors={e?.item} />
      </div>

      <fieldset className="flex flex-col gap-3">
        <legend className="field-label">Pack</legend>
        <TextField
          name="packLabel" id={fid("packLabel")} label="As the supplier calls it" defaultValue={supplierItem?.packLabel} errors={e?.packLabel}
          placeholder="bundle of 5 hanks" maxLength={80} autoComplete="off" hint="Empty: the size and unit below."
        />
        <div className="grid grid-cols-[7rem_1fr] gap-3">
          <div>
            <label htmlFor={fid("packQuantity")} className="field-label">Size</label>
            <input
              id={fid("packQuantity")} name="packQuantity" value={quantity} onChange={(ev) => setQuantity(ev.target.value)} placeholder="5"
              className="field-input text-right tabular-nums" {...decimalProps} {...describedBy(fid("pack"), packErrors, true)}
            />
          </div>
          <div>
            <label htmlFor={fid("packUnit")} className="field-label">Unit</label>
            <input
              id={fid("packUnit")} name="packUnit" value={unit} onChange={(ev) => setUnit(ev.target.value)} placeholder={unitChoices[0]?.unit ?? "kg"}
              list={fid("pack-units")} className="field-input" maxLength={30} autoComplete="off" spellCheck={false} {...describedBy(fid("pack"), packErrors, true)}
            />
            <datalist id={fid("pack-units")}>
              {unitChoices.map((u) => <option key={u.unit} value={u.unit}>{u.label}</option>)}
            </datalist>
          </div>
        </div>
        <p id={`${fid("pack")}-hint`} className={`text-sm ${preview && !preview.ok ? "text-amber" : "text-brine"}`} aria-live="polite">
          {preview ? preview.text : item ? `Any unit of ${item.sku}: ${unitChoices.slice(0, 6).map((u) => u.label).join(", ")}${unitChoices.length > 6 ? "…" : ""}.` : "Choose our item first: the pack is converted to its stock unit."}
        </p>
        <FieldError id={fid("pack")} errors={packErrors.length ? packErrors : undefined} />
      </fieldset>

      <TextField
        name="gtin" id={fid("gtin")} label="GTIN (barcode number)" value={gtin} onChange={(ev) => setGtin(ev.target.value)} errors={e?.gtin}
        inputMode="numeric" autoComplete="off" spellCheck={false} maxLength={20} className="max-w-[18rem]"
        hint={gtin14 ? `Kept as ${gtin14} (14 digits).` : "Optional: the 8, 12, 13 or 14 digits under the pack's barcode."}
      />

      {supplierItem ? (
        <StatusCheckbox id={fid("active")} name="active" label="Still sold" defaultChecked={supplierItem.active} errors={e?.active}
          hint={supplierItem.active ? "Untick when the supplier stops selling it; it stays on record." : "Tick when they sell it again."} />
      ) : null}

      <SideSheetFooter>
        <button type="button" className="btn-quiet" onClick={onCancel}>Cancel</button>
        <button type="submit" className="btn-primary" disabled={pending}>
          {pending ? "Saving…" : supplierItem ? "Save changes" : "Add item"}
        </button>
      </SideSheetFooter>
    </SheetForm>
  );
}
