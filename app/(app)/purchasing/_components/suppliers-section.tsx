"use client";

// The buying home's list of suppliers: who we buy from, how long they take, the least they take an
// order for, how many of our items they sell, where orders go. "Add supplier" for those who may.
import Link from "next/link";
import { useCallback, useState } from "react";
import { CirclePause, Plus } from "lucide-react";
import { Badge } from "@/components/ui/badge";
import { DataTable, RowHeader, TBody, Td, Th, THead } from "@/components/ui/data-table";
import { EmptyState } from "@/components/ui/empty-state";
import { StatusRegion } from "@/components/ui/field";
import { SideSheet } from "@/components/ui/side-sheet";
import type { Supplier } from "@/lib/data/suppliers";
import { leadTimeText, moneyText } from "./format";
import { SupplierForm } from "./supplier-form";

export function SuppliersSection({ suppliers, currency, canManage, showingInactive }: {
  suppliers: Supplier[];
  currency: string;
  canManage: boolean;
  /** inactive suppliers are in the list too */
  showingInactive: boolean;
}) {
  const [adding, setAdding] = useState(false);
  const [notice, setNotice] = useState<string>();
  const close = useCallback(() => setAdding(false), []);
  const saved = useCallback((message: string) => {
    setAdding(false);
    setNotice(message);
  }, []);

  return (
    <section aria-labelledby="suppliers-heading" className="space-y-3">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h2 id="suppliers-heading" className="text-xl font-semibold">Suppliers</h2>
          <p className="text-sm text-brine">Open a supplier for its contacts and the items it sells us, pack by pack.</p>
        </div>
        <div className="flex flex-wrap items-center gap-2">
          <Link href={showingInactive ? "/purchasing" : "/purchasing?inactive=1"} className="btn-quiet" prefetch={false}>
            {showingInactive ? "Hide inactive" : "Show inactive"}
          </Link>
          {canManage ? (
            <button type="button" className="btn-primary" onClick={() => { setNotice(undefined); setAdding(true); }}>
              <Plus aria-hidden className="h-5 w-5" />
              Add supplier
            </button>
          ) : null}
        </div>
      </div>
      <StatusRegion>{notice}</StatusRegion>
      {suppliers.length ? (
        <DataTable caption="Suppliers">
          <THead>
            <Th>Supplier</Th>
            <Th numeric>Lead time</Th>
            <Th numeric>Minimum order</Th>
            <Th numeric>Items</Th>
            <Th>Order e-mail</Th>
          </THead>
          <TBody>
            {suppliers.map((s) => (
              <tr key={s.id} className={s.active ? undefined : "text-brine"}>
                <RowHeader className="min-w-[12rem]">
                  <Link href={`/purchasing/suppliers/${s.id}`} className="text-pepper underline decoration-brine-line underline-offset-4 hover:decoration-paprika">
                    {s.name}
                  </Link>
                  {s.contactName ? <span className="block text-sm font-normal text-brine">{s.contactName}</span> : null}
                  {s.active ? null : <span className="mt-1 block"><Badge icon={<CirclePause />}>Inactive</Badge></span>}
                </RowHeader>
                <Td numeric className="whitespace-nowrap">{leadTimeText(s.leadTimeDays)}</Td>
                <Td numeric className="whitespace-nowrap">{s.minOrderValue ? moneyText(s.minOrderValue, s.currency) : <span className="text-brine">none</span>}</Td>
                <Td numeric>{s.itemCount}</Td>
                <Td className="max-w-[16rem] truncate">
                  {s.orderEmail ? <a href={`mailto:${s.orderEmail}`} className="underline decoration-brine-line underline-offset-4 hover:decoration-paprika">{s.orderEmail}</a> : <span className="text-brine">—</span>}
                </Td>
              </tr>
            ))}
          </TBody>
        </DataTable>
      ) : (
        <EmptyState title={showingInactive ? "No suppliers yet" : "No active suppliers"}>
          <p>
            {canManage
              ? "Add the suppliers you buy casings, cures and spices from: their order e-mail, lead time and minimum order, then the items each sells you and in which pack."
              : "A buyer, manager or admin adds the suppliers; their lead times and minimum orders then show here."}
          </p>
        </EmptyState>
      )}
      {canManage ? (
        <SideSheet open={adding} onClose={close} title="Add a supplier" description={`Prices and minimum orders are in ${currency}, the company's currency.`}>
          {adding ? <SupplierForm currency={currency} onSaved={saved} onCancel={close} /> : null}
        </SideSheet>
      ) : null}
    </section>
  );
}
