"use client";

// "New order": the order form in a side sheet, so the list stays in view behind it.
import { Plus } from "lucide-react";
import { useState } from "react";
import { OrderForm, type KitchenOption } from "@/components/purchasing/order-form";
import { SideSheet } from "@/components/ui/side-sheet";
import type { OrderCatalogueSupplier } from "@/lib/data/purchase-orders";
import type { UnitSystem } from "@/lib/units";

export function NewOrder({ catalogue, kitchens, defaultKitchenId, unitSystem }: {
  catalogue: { currency: string; today: string; suppliers: OrderCatalogueSupplier[] };
  kitchens: KitchenOption[];
  defaultKitchenId: string | null;
  unitSystem: UnitSystem;
}) {
  const [open, setOpen] = useState(false);
  return (
    <>
      <button type="button" className="btn-primary" onClick={() => setOpen(true)}>
        <Plus aria-hidden className="h-5 w-5" /> New order
      </button>
      <SideSheet open={open} onClose={() => setOpen(false)} title="New purchase order" description="A draft: approve it, then send it to the supplier from its page.">
        <OrderForm catalogue={catalogue} kitchens={kitchens} defaultKitchenId={defaultKitchenId} unitSystem={unitSystem} onCancel={() => setOpen(false)} />
      </SideSheet>
    </>
  );
}
