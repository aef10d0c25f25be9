// One supplier: its details and the items it sells us (their SKU, the pack, that pack in our stock
// unit, GTIN, our item), with add and edit for those who manage buying.
import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { can, canSomewhere } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { listItems } from "@/lib/data/items";
import { getSupplier, listSupplierItems } from "@/lib/data/suppliers";
import { AppError } from "@/lib/http/errors";
import { SupplierView } from "./_components/supplier-view";

export const metadata: Metadata = { title: "Supplier" };
export const dynamic = "force-dynamic";

export default async function SupplierPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requireUser();
  if (!canSomewhere(user, "purchasing.read")) notFound();
  const { id } = await params;
  let supplier;
  try {
    supplier = await getSupplier(user, id);
  } catch (e) {
    if (e instanceof AppError && e.status === 404) notFound();
    throw e;
  }
  const [supplierItems, items] = await Promise.all([listSupplierItems(user, supplier.id, { includeInactive: true }), listItems(user, { includeArchived: true })]);
  // only what the form and the table need from the catalogue
  const catalogue = items.map((i) => ({ id: i.id, sku: i.sku, name: i.name, category: i.category, archived: i.archived, itemUnits: i.itemUnits }));
  return (
    <SupplierView
      supplier={supplier} supplierItems={supplierItems} catalogue={catalogue} canManage={can(user, "purchasing.manage")} unitSystem={user.unitSystem}
    />
  );
}
