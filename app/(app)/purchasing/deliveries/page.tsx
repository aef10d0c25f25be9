// Deliveries: what has come in from suppliers (drafts being checked and posted notes), and
// "Receive a delivery" to start on the next one.
import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { PackageCheck } from "lucide-react";
import { PageHeader } from "@/components/shell/page-header";
import { Badge } from "@/components/ui/badge";
import { DataTable, RowHeader, TBody, Td, Th, THead } from "@/components/ui/data-table";
import { EmptyState } from "@/components/ui/empty-state";
import { canSomewhere } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { getCurrentKitchen } from "@/lib/data/current-kitchen";
import { listDeliveries } from "@/lib/data/deliveries";
import { listKitchens } from "@/lib/data/kitchens";
import { listPurchaseOrders } from "@/lib/data/purchase-orders";
import { listSuppliers } from "@/lib/data/suppliers";
import { ReceiveDelivery } from "./_components/receive-delivery";

export const metadata: Metadata = { title: "Deliveries" };
export const dynamic = "force-dynamic";

export default async function DeliveriesPage() {
  const user = await requireUser();
  if (!canSomewhere(user, "stock.receive")) notFound();
  const [list, suppliers, kitchens, sent, partly, current] = await Promise.all([
    listDeliveries(user),
    listSuppliers(user),
    listKitchens(user),
    listPurchaseOrders(user, { status: "sent", page: 1, perPage: 100 }),
    listPurchaseOrders(user, { status: "partly_received", page: 1, perPage: 100 }),
    getCurrentKitchen(user),
  ]);
  const open = [...sent.orders, ...partly.orders].map((o) => ({ id: o.id, number: o.number, supplierId: o.supplier.id, kitchenId: o.kitchen.id }));
  const when = new Intl.DateTimeFormat("en-GB", { timeZone: user.timeZone, dateStyle: "medium" });
  return (
    <>
      <PageHeader title="Deliveries" description="Check each supplier delivery against what was ordered, settle every line, then book it into stock." />
      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_minmax(0,26rem)]">
        <section aria-labelledby="deliveries-list">
          <h2 id="deliveries-list" className="sr-only">Deliveries so far</h2>
          {list.deliveries.length === 0 ? (
            <EmptyState title="No deliveries yet" icon={<PackageCheck aria-hidden className="h-8 w-8" />}>
              <p>When goods arrive, read the supplier&apos;s note here, or key the lines in, and settle each line before booking it.</p>
            </EmptyState>
          ) : (
            <DataTable caption="Deliveries">
              <THead>
                <Th>Note</Th>
                <Th>Supplier</Th>
                <Th>Kitchen</Th>
                <Th>Order</Th>
                <Th numeric>Lines</Th>
                <Th>State</Th>
                <Th>Started</Th>
              </THead>
              <TBody>
                {list.deliveries.map((d) => (
                  <tr key={d.id}>
                    <RowHeader>
                      <Link href={`/purchasing/deliveries/${d.id}`} className="text-paprika underline-offset-2 hover:underline">{d.noteNumber ?? "No number yet"}</Link>
                    </RowHeader>
                    <Td>{d.supplier.name}</Td>
                    <Td>{d.kitchen.code}</Td>
                    <Td>{d.order?.number ?? <span className="text-brine">Any open</span>}</Td>
                    <Td numeric>{d.lines}</Td>
                    <Td>{d.status === "posted" ? <Badge tone="herb">Booked</Badge> : <Badge tone="amber">Being checked</Badge>}</Td>
                    <Td className="whitespace-nowrap text-sm"><time dateTime={d.createdAt}>{when.format(new Date(d.createdAt))}</time></Td>
                  </tr>
                ))}
              </TBody>
            </DataTable>
          )}
        </section>
        {suppliers.length ? (
          <ReceiveDelivery
            suppliers={suppliers.filter((s) => s.active).map((s) => ({ id: s.id, label: s.name }))}
            kitchens={kitchens.filter((k) => !k.archived).map((k) => ({ id: k.id, code: k.code, label: `${k.name} (${k.code})` }))}
            orders={open}
            defaultKitchenId={current?.id ?? null}
          />
        ) : (
          <p className="text-sm text-brine">Add a supplier under Suppliers first.</p>
        )}
      </div>
    </>
  );
}
