// One delivery: the reconciliation table (each line against its order line, with what was found),
// the buyer's decisions and corrections, freight, the note itself, and booking it into stock.
import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { PageHeader } from "@/components/shell/page-header";
import { canSomewhere } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { getDelivery } from "@/lib/data/deliveries";
import { listSupplierItems } from "@/lib/data/suppliers";
import { AppError } from "@/lib/http/errors";
import { Reconciliation } from "../_components/reconciliation";

export const metadata: Metadata = { title: "Delivery" };
export const dynamic = "force-dynamic";

export default async function DeliveryPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requireUser();
  if (!canSomewhere(user, "stock.receive")) notFound();
  const { id } = await params;
  const delivery = await getDelivery(user, id).catch((e: unknown) => {
    if (e instanceof AppError && (e.status === 404 || e.status === 403)) notFound();
    throw e;
  });
  const items = await listSupplierItems(user, delivery.supplier.id);
  return (
    <>
      <PageHeader
        title={`Delivery ${delivery.noteNumber ?? "(no note number yet)"}`}
        description={`${delivery.supplier.name} to ${delivery.kitchen.name}${delivery.order ? `, against ${delivery.order.number}` : ""}.`}
        actions={<Link href="/purchasing/deliveries" className="btn-quiet">All deliveries</Link>}
      />
      <Reconciliation
        initial={delivery}
        supplierItems={items.filter((i) => i.active).map((i) => ({ id: i.id, label: `${i.sku} · ${i.item.name} · ${i.packLabel}`, gtin: i.gtin }))}
      />
    </>
  );
}
