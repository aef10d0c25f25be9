// One supplier: its details and the items it sells us (their SKU, the pack, that pack in our stock
// unit, GTIN, our item), with add and edit for those who manage buying.
import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { can, canSomewhere } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { listItems } from "@/lib/data/items";
import { listPriceListImports } from "@/lib/data/price-lists";
import { getSupplier, listSupplierItems } from "@/lib/data/suppliers";
import { AppError } from "@/lib/http/errors";
import { PriceListSection } from "./_components/price-list-section";
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
  const [supplierItems, items, priceLists] = await Promise.all([
    listSupplierItems(user, supplier.id, { includeInactive: true }), listItems(user, { includeArchived: true }), listPriceListImports(user, supplier.id, { limit: 50 }),
  ]);
  // only what the form and the table need from the catalogue
  const catalogue = items.map((i) => ({ id: i.id, sku: i.sku, name: i.name, category: i.category, archived: i.archived, itemUnits: i.itemUnits }));
  const canManage = can(user, "purchasing.manage");
  const today = new Intl.DateTimeFormat("en-CA", { timeZone: user.timeZone }).format(new Date()); // yyyy-mm-dd
  return (
    <>
      <SupplierView supplier={supplier} supplierItems={supplierItems} catalogue={catalogue} canManage={canManage} unitSystem={user.unitSystem} />
      <PriceListSection
        supplierId={supplier.id} supplierName={supplier.name} currency={supplier.currency} canManage={canManage} imports={priceLists} today={today} unitSystem={user.unitSystem}
      />
    </>
  );
}
