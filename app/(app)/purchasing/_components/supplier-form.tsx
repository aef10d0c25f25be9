"use client";

import { useActionState, useEffect } from "react";
import { SheetForm } from "@/components/ui/sheet-form";
import { describedBy, FieldError, FieldHint, FormMessage, StatusCheckbox, TextField } from "@/components/ui/field";
import { SideSheetFooter } from "@/components/ui/side-sheet";
import type { Supplier } from "@/lib/data/suppliers";
import { saveSupplierAction, type SupplierFormState } from "../actions";

/** Add (no supplier given) or edit a supplier. Money is in the company's one currency. */
export function SupplierForm({ supplier, currency, onSaved, onCancel }: {
  supplier?: Supplier;
  currency: string;
  onSaved: (message: string, id: string) => void;
  onCancel: () => void;
}) {
  const [state, action, pending] = useActionState<SupplierFormState, FormData>(saveSupplierAction, {});
  useEffect(() => {
    if (state.ok && state.id) onSaved(state.message ?? "Saved.", state.id);
  }, [state, onSaved]);
  const e = state.fieldErrors;
  const v = state.values as Record<string, string | boolean | undefined> | undefined;
  const val = (k: string, fallback?: string | null) => (v && typeof v[k] === "string" ? (v[k] as string) : (fallback ?? undefined));
  const numberProps = { autoComplete: "off", spellCheck: false } as const;

  return (
    <SheetForm action={action}>
      {supplier ? <input type="hidden" name="id" value={supplier.id} /> : null}
      <FormMessage tone="error">{state.message}</FormMessage>
      <TextField
        name="name" id="supplier-name" label="Name" required defaultValue={val("name", supplier?.name)} errors={e?.name} initialFocus
        autoComplete="organization" maxLength={120}
      />
      <div className="grid grid-cols-2 gap-3">
        <TextField
          name="leadTimeDays" id="supplier-lead-time" label="Lead time, days" required defaultValue={val("leadTimeDays", supplier ? String(supplier.leadTimeDays) : undefined)}
          errors={e?.leadTimeDays} inputMode="numeric" placeholder="3" hint="From order to delivery." {...numberProps}
        />
        <TextField
          name="minOrderValue" id="supplier-min-order" label={`Minimum order, ${currency}`} defaultValue={val("minOrderValue", supplier?.minOrderValue)}
          errors={e?.minOrderValue} inputMode="decimal" placeholder="none" hint="Empty: no minimum." {...numberProps}
        />
      </div>
      <TextField
        name="orderEmail" id="supplier-order-email" label="Order e-mail" type="email" defaultValue={val("orderEmail", supplier?.orderEmail)}
        errors={e?.orderEmail} autoComplete="off" spellCheck={false} hint="Where purchase orders are sent."
      />
      <div className="grid grid-cols-2 gap-3">
        <TextField name="contactName" id="supplier-contact" label="Contact" defaultValue={val("contactName", supplier?.contactName)} errors={e?.contactName} autoComplete="off" maxLength={120} />
        <TextField name="phone" id="supplier-phone" label="Phone" type="tel" defaultValue={val("phone", supplier?.phone)} errors={e?.phone} autoComplete="off" maxLength={40} />
      </div>
      <div>
        <label htmlFor="supplier-notes" className="field-label">Notes <span className="font-normal text-brine">(optional)</span></label>
        <textarea
          id="supplier-notes" name="notes" rows={3} defaultValue={val("notes", supplier?.notes)} maxLength={2000}
          className="field-input py-2" {...describedBy("supplier-notes", e?.notes, true)}
        />
        <FieldHint id="supplier-notes">Order cut-off times, delivery days, account number…</FieldHint>
        <FieldError id="supplier-notes" errors={e?.notes} />
      </div>
      {supplier ? (
        <StatusCheckbox id="supplier-active" name="active" label="Buying from them" defaultChecked={supplier.active} errors={e?.active}
          hint={supplier.active ? "Untick when you stop buying here: the supplier leaves the buying lists; its items and history stay." : "Tick to buy from this supplier again."} />
      ) : null}
      <SideSheetFooter>
        <button type="button" className="btn-quiet" onClick={onCancel}>Cancel</button>
        <button type="submit" className="btn-primary" disabled={pending}>
          {pending ? "Saving…" : supplier ? "Save changes" : "Add supplier"}
        </button>
      </SideSheetFooter>
    </SheetForm>
  );
}
