// One purchase order: where it goes, its lines and totals, what has happened to it (who and when),
// and the steps this user may take now; the PDF and CSV the supplier gets, to download.
import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { CureCaution } from "@/components/cure/cure-caution";
import { CureMarker } from "@/components/cure/cure-marker";
import { amountText, stockText } from "@/components/purchasing/order-format";
import { OrderStatusBadge } from "@/components/purchasing/order-status-badge";
import { PageHeader } from "@/components/shell/page-header";
import { DataTable, RowHeader, TBody, Td, Th, THead } from "@/components/ui/data-table";
import { can, canSomewhere } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { listKitchens } from "@/lib/data/kitchens";
import { getPurchaseOrder, orderCatalogue, type OrderHistoryStep, type PurchaseOrder } from "@/lib/data/purchase-orders";
import { AppError } from "@/lib/http/errors";
import { toMinor } from "@/lib/purchasing/order-money";
import { OPEN_FOR_RECEIPT } from "@/lib/purchasing/order-status";
import { OrderActions } from "./_components/order-actions";

export const metadata: Metadata = { title: "Purchase order" };
export const dynamic = "force-dynamic";

const STEP_WORDS: Record<OrderHistoryStep, string> = {
  created: "Drafted",
  approved: "Approved",
  sent: "Sent to supplier",
  closed_short: "Closed short",
  cancelled: "Cancelled",
};

export default async function OrderPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requireUser();
  if (!canSomewhere(user, "purchasing.read")) notFound();
  const { id } = await params;
  let order: PurchaseOrder;
  try {
    order = await getPurchaseOrder(user, id);
  } catch (e) {
    if (e instanceof AppError && e.status === 404) notFound();
    throw e;
  }
  const canManage = can(user, "purchasing.manage");
  const [catalogue, kitchens] = order.allowed.edit ? await Promise.all([orderCatalogue(user), listKitchens(user)]) : [null, []];
  const when = new Intl.DateTimeFormat("en-GB", { timeZone: user.timeZone, dateStyle: "medium", timeStyle: "short" });
  const showReceipts = OPEN_FOR_RECEIPT.includes(order.status) || order.status === "received" || order.status === "closed_short";
  const belowMinimum = order.supplier.minOrderValue !== null && toMinor(order.total, order.currency) < toMinor(order.supplier.minOrderValue, order.currency);
  const money = (v: string) => amountText(v, order.currency);

  return (
    <>
      <PageHeader
        title={`Purchase order ${order.number}`}
        description={`To ${order.supplier.name}, delivered to ${order.kitchen.name}.`}
        actions={<Link href="/purchasing/orders" className="btn-quiet">All orders</Link>}
      />
      <div className="space-y-6">
        <div className="flex flex-wrap items-center gap-3">
          <OrderStatusBadge status={order.status} />
          <span className="num text-xl font-semibold tabular-nums">{money(order.total)}</span>
          {belowMinimum ? (
            <span className="text-sm text-amber">Below {order.supplier.name}&apos;s minimum order of {money(order.supplier.minOrderValue!)}.</span>
          ) : null}
        </div>

        <OrderActions
          order={order}
          catalogue={catalogue}
          kitchens={kitchens.map((k) => ({ id: k.id, code: k.code, name: k.name }))}
          unitSystem={user.unitSystem}
          canManage={canManage}
        />

        <section aria-label="Order details" className="panel grid gap-6 px-6 py-5 sm:grid-cols-3">
          <div>
            <h2 className="text-sm font-semibold text-brine">Supplier</h2>
            <p className="font-semibold">{order.supplier.name}</p>
            {order.supplier.contactName ? <p>{order.supplier.contactName}</p> : null}
            <p className="text-sm text-brine">{order.supplier.orderEmail ?? "No order e-mail address"}</p>
          </div>
          <div>
            <h2 className="text-sm font-semibold text-brine">Deliver to</h2>
            <p className="font-semibold">{order.kitchen.name}</p>
            {order.kitchen.address ? <p className="whitespace-pre-line text-sm">{order.kitchen.address}</p> : null}
            <p className="mt-1 text-sm">{order.deliverBy ? <>Needed by <span className="num tabular-nums">{order.deliverBy}</span></> : <span className="text-brine">No delivery date asked</span>}</p>
          </div>
          <div>
            <h2 className="text-sm font-semibold text-brine">Notes for the supplier</h2>
            <p className="whitespace-pre-line text-sm">{order.notes || <span className="text-brine">None</span>}</p>
          </div>
        </section>

        {order.cureCaution ? <CureCaution /> : null}

        <DataTable caption={`Lines of ${order.number}`}>
          <THead>
            <Th numeric>#</Th>
            <Th>Supplier SKU and pack</Th>
            <Th>Our item</Th>
            <Th numeric>Packs</Th>
            <Th numeric>Ordered</Th>
            {showReceipts ? <Th numeric>Received</Th> : null}
            {showReceipts ? <Th numeric>To come</Th> : null}
            <Th numeric>Pack price</Th>
            <Th numeric>Line total</Th>
          </THead>
          <TBody>
            {order.lines.map((l) => (
              <tr key={l.id}>
                <Td numeric>{l.lineNo}</Td>
                <RowHeader>
                  {l.supplierSku}
                  <span className="block text-sm font-normal text-brine">{l.description}</span>
                  <span className="block text-sm font-normal">{l.packLabel}</span>
                </RowHeader>
                <Td>
                  <span className="flex flex-wrap items-center gap-2">{l.item.sku}{l.item.category === "cure" ? <CureMarker /> : null}</span>
                  <span className="block text-sm text-brine">{l.item.name}</span>
                </Td>
                <Td numeric>{l.packs}</Td>
                <Td numeric className="whitespace-nowrap">{stockText(l.orderedStock, l.item, user.unitSystem)}</Td>
                {showReceipts ? <Td numeric className="whitespace-nowrap">{stockText(l.receivedStock, l.item, user.unitSystem)}</Td> : null}
                {showReceipts ? <Td numeric className="whitespace-nowrap">{stockText(l.outstandingStock, l.item, user.unitSystem)}</Td> : null}
                <Td numeric className="whitespace-nowrap">{money(l.packPrice)}</Td>
                <Td numeric className="whitespace-nowrap">{money(l.lineTotal)}</Td>
              </tr>
            ))}
          </TBody>
          <tfoot className="border-t border-salt-edge">
            <tr>
              <th scope="row" colSpan={showReceipts ? 8 : 6} className="px-4 py-2.5 text-right font-semibold">Order total</th>
              <Td numeric className="font-semibold">{money(order.total)}</Td>
            </tr>
          </tfoot>
        </DataTable>

        <section aria-labelledby="order-history" className="space-y-2">
          <h2 id="order-history" className="text-xl font-semibold">History</h2>
          <ol className="panel divide-y divide-salt-edge">
            {order.history.map((h) => (
              <li key={h.step} className="flex flex-wrap items-baseline gap-x-3 gap-y-1 px-4 py-3">
                <span className="font-semibold">{STEP_WORDS[h.step]}</span>
                <time dateTime={h.at} className="text-sm">{when.format(new Date(h.at))}</time>
                <span className="text-sm text-brine">by {h.by ?? "a former user"}</span>
                {h.note ? <span className="w-full text-sm">{h.step === "sent" ? h.note : `Reason: ${h.note}`}</span> : null}
              </li>
            ))}
          </ol>
          <p className="text-sm text-brine">
            Approval: buyers approve orders up to {money(order.approvalThreshold)}{order.needsManager ? "; this one needs a manager or an admin" : ""}.
          </p>
        </section>
      </div>
    </>
  );
}
