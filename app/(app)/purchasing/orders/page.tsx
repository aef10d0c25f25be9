// Purchase orders: every order of the company, newest first, by status; "New order" drafts one.
import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { ClipboardList } from "lucide-react";
import { amountText } from "@/components/purchasing/order-format";
import { OrderStatusBadge } from "@/components/purchasing/order-status-badge";
import { PageHeader } from "@/components/shell/page-header";
import { DataTable, RowHeader, TBody, Td, Th, THead } from "@/components/ui/data-table";
import { EmptyState } from "@/components/ui/empty-state";
import { can, canSomewhere } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { getCurrentKitchen } from "@/lib/data/current-kitchen";
import { listKitchens } from "@/lib/data/kitchens";
import { listPurchaseOrders, orderCatalogue } from "@/lib/data/purchase-orders";
import { ORDER_STATUSES, ORDER_STATUS_LABELS, type OrderStatus } from "@/lib/purchasing/order-status";
import { NewOrder } from "./_components/new-order";

export const metadata: Metadata = { title: "Purchase orders" };
export const dynamic = "force-dynamic";

const PER_PAGE = 25;
const one = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v);

export default async function OrdersPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requireUser();
  if (!canSomewhere(user, "purchasing.read")) notFound();
  const sp = await searchParams;
  const status = (ORDER_STATUSES as readonly string[]).includes(one(sp.status) ?? "") ? (one(sp.status) as OrderStatus) : undefined;
  const requested = Number(one(sp.page) ?? "1");
  const pageNo = Number.isInteger(requested) && requested >= 1 ? requested : 1;
  const canManage = can(user, "purchasing.manage");
  const [page, kitchen] = await Promise.all([listPurchaseOrders(user, { status, page: pageNo, perPage: PER_PAGE }), getCurrentKitchen(user)]);
  const [catalogue, kitchens] = canManage ? await Promise.all([orderCatalogue(user), listKitchens(user)]) : [null, []];
  const pages = Math.max(1, Math.ceil(page.total / PER_PAGE));
  const when = new Intl.DateTimeFormat("en-GB", { timeZone: user.timeZone, dateStyle: "medium" });
  const href = (s: OrderStatus | undefined, p = 1) => {
    const q = new URLSearchParams();
    if (s) q.set("status", s);
    if (p > 1) q.set("page", String(p));
    const text = q.toString();
    return text ? `/purchasing/orders?${text}` : "/purchasing/orders";
  };

  return (
    <>
      <PageHeader
        title="Purchase orders"
        description="What the company has ordered from its suppliers, where each order is delivered, and how far it has come."
        actions={
          <>
            <Link href="/purchasing" className="btn-quiet">Suppliers</Link>
            {catalogue ? (
              <NewOrder
                catalogue={catalogue}
                kitchens={kitchens.map((k) => ({ id: k.id, code: k.code, name: k.name }))}
                defaultKitchenId={kitchen?.id ?? null}
                unitSystem={user.unitSystem}
              />
            ) : null}
          </>
        }
      />
      <nav aria-label="Filter by status" className="mb-4">
        <ul className="flex flex-wrap gap-2">
          {[undefined, ...ORDER_STATUSES].map((s) => {
            const current = s === status;
            return (
              <li key={s ?? "all"}>
                <Link
                  href={href(s)}
                  aria-current={current ? "page" : undefined}
                  className={`inline-flex min-h-touch items-center rounded-full border px-4 text-sm font-semibold ${
                    current ? "border-paprika bg-paprika-soft text-pepper" : "border-brine-line bg-white text-brine hover:text-pepper"
                  }`}
                >
                  {s ? ORDER_STATUS_LABELS[s] : "All"}
                </Link>
              </li>
            );
          })}
        </ul>
      </nav>

      {page.orders.length === 0 ? (
        <EmptyState title={status ? `No orders ${ORDER_STATUS_LABELS[status].toLowerCase()}` : "No purchase orders yet"} icon={<ClipboardList aria-hidden className="h-8 w-8" />}>
          <p>
            {status
              ? "Choose another status above, or All."
              : canManage
                ? "Use “New order” to draft one: pick a supplier, the kitchen it goes to, and the packs you need."
                : "Orders appear here once a buyer or manager drafts one."}
          </p>
        </EmptyState>
      ) : (
        <>
          <DataTable caption="Purchase orders">
            <THead>
              <Th>Order</Th>
              <Th>Supplier</Th>
              <Th>Deliver to</Th>
              <Th>Needed by</Th>
              <Th numeric>Lines</Th>
              <Th numeric>Total</Th>
              <Th>Status</Th>
              <Th>Drafted</Th>
            </THead>
            <TBody>
              {page.orders.map((o) => (
                <tr key={o.id}>
                  <RowHeader>
                    <Link href={`/purchasing/orders/${o.id}`} className="whitespace-nowrap text-paprika underline-offset-2 hover:underline">{o.number}</Link>
                  </RowHeader>
                  <Td>{o.supplier.name}</Td>
                  <Td>{o.kitchen.name}</Td>
                  <Td className="num whitespace-nowrap tabular-nums">{o.deliverBy ?? <span className="text-brine">—</span>}</Td>
                  <Td numeric>{o.lineCount}</Td>
                  <Td numeric>{amountText(o.total, o.currency)}</Td>
                  <Td><OrderStatusBadge status={o.status} /></Td>
                  <Td className="whitespace-nowrap text-sm">
                    <time dateTime={o.createdAt}>{when.format(new Date(o.createdAt))}</time>
                    {o.createdBy ? <span className="block text-brine">{o.createdBy}</span> : null}
                  </Td>
                </tr>
              ))}
            </TBody>
          </DataTable>
          {pages > 1 ? (
            <nav aria-label="Pages" className="mt-4 flex items-center justify-between gap-3">
              {pageNo > 1 ? <Link href={href(status, pageNo - 1)} className="btn-quiet">Newer orders</Link> : <span />}
              <span className="text-sm text-brine">Page {pageNo} of {pages} · {page.total} orders</span>
              {pageNo < pages ? <Link href={href(status, pageNo + 1)} className="btn-quiet">Older orders</Link> : <span />}
            </nav>
          ) : null}
        </>
      )}
    </>
  );
}
