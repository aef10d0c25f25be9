"use client";

// One supplier: its details (editable in a side sheet) and the items it sells us, each with the
// supplier's SKU, the pack as they sell it, that pack in our stock unit, the GTIN and our item.
import Link from "next/link";
import { useCallback, useState } from "react";
import { ArrowLeft, CirclePause, Pencil, Plus } from "lucide-react";
import { CureCaution } from "@/components/cure/cure-caution";
import { CureMarker } from "@/components/cure/cure-marker";
import { PageHeader } from "@/components/shell/page-header";
import { Badge } from "@/components/ui/badge";
import { DataTable, RowHeader, TBody, Td, Th, THead } from "@/components/ui/data-table";
import { EmptyState } from "@/components/ui/empty-state";
import { StatusRegion } from "@/components/ui/field";
import { SideSheet } from "@/components/ui/side-sheet";
import type { Supplier, SupplierItem } from "@/lib/data/suppliers";
import type { UnitSystem } from "@/lib/units";
import { leadTimeText, moneyText, packLengthText, packStockText } from "../../../_components/format";
import { SupplierForm } from "../../../_components/supplier-form";
import { SupplierItemForm, type CatalogueItem } from "./supplier-item-form";

type Editing = { what: "details" } | { what: "item"; id: string | null } | null;

function Detail({ term, children }: { term: string; children: React.ReactNode }) {
  return (
    <div>
      <dt className="text-sm text-brine">{term}</dt>
      <dd className="mt-0.5 break-words">{children}</dd>
    </div>
  );
}

export function SupplierView({ supplier, supplierItems, catalogue, canManage, unitSystem }: {
  supplier: Supplier;
  supplierItems: SupplierItem[];
  /** every item of the catalogue (archived ones too, for items already listed) */
  catalogue: CatalogueItem[];
  canManage: boolean;
  unitSystem: UnitSystem;
}) {
  const [editing, setEditing] = useState<Editing>(null);
  const [notice, setNotice] = useState<string>();
  const close = useCallback(() => setEditing(null), []);
  const saved = useCallback((message: string) => {
    setEditing(null);
    setNotice(message);
  }, []);
  const open = (next: Editing) => {
    setNotice(undefined);
    setEditing(next);
  };
  const unitsOf = new Map(catalogue.map((i) => [i.id, i.itemUnits]));
  const currentItem = editing?.what === "item" && editing.id ? supplierItems.find((s) => s.id === editing.id) : undefined;
  const pickable = catalogue.filter((i) => !i.archived || i.id === currentItem?.item.id);
  const hasCure = supplierItems.some((s) => s.item.category === "cure");
  const facts = [`Lead time ${leadTimeText(supplier.leadTimeDays)}`, supplier.minOrderValue ? `minimum order ${moneyText(supplier.minOrderValue, supplier.currency)}` : "no minimum order"];

  return (
    <>
      <Link href="/purchasing" className="mb-3 inline-flex min-h-touch items-center gap-1 text-sm font-semibold text-brine hover:text-pepper">
        <ArrowLeft aria-hidden className="h-4 w-4" /> All suppliers
      </Link>
      <PageHeader
        title={supplier.name}
        description={`${facts.join(", ")}.`}
        actions={canManage ? (
          <button type="button" className="btn-quiet" onClick={() => open({ what: "details" })}>
            <Pencil aria-hidden className="h-4 w-4" /> Edit details
          </button>
        ) : null}
      />
      <StatusRegion className={notice ? "mb-4" : undefined}>{notice}</StatusRegion>

      <section aria-label="Supplier details" className="panel mb-6 px-5 py-4">
        {supplier.active ? null : <p className="mb-3"><Badge icon={<CirclePause />}>Inactive: not on the buying lists</Badge></p>}
        <dl className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
          <Detail term="Contact">{supplier.contactName || <span className="text-brine">—</span>}</Detail>
          <Detail term="Order e-mail">
            {supplier.orderEmail ? <a href={`mailto:${supplier.orderEmail}`} className="underline decoration-brine-line underline-offset-4 hover:decoration-paprika">{supplier.orderEmail}</a> : <span className="text-brine">none</span>}
          </Detail>
          <Detail term="Phone">{supplier.phone ? <a href={`tel:${supplier.phone.replace(/[^0-9+]/g, "")}`} className="num">{supplier.phone}</a> : <span className="text-brine">—</span>}</Detail>
          <Detail term="Lead time · minimum order">
            <span className="num">{leadTimeText(supplier.leadTimeDays)} · {supplier.minOrderValue ? moneyText(supplier.minOrderValue, supplier.currency) : "none"}</span>
          </Detail>
          {supplier.notes ? <div className="sm:col-span-2 lg:col-span-4"><Detail term="Notes"><span className="whitespace-pre-line">{supplier.notes}</span></Detail></div> : null}
        </dl>
      </section>

      <section aria-labelledby="supplier-items-heading" className="space-y-3">
        <div className="flex flex-wrap items-end justify-between gap-3">
          <div>
            <h2 id="supplier-items-heading" className="text-xl font-semibold">What they sell us</h2>
            <p className="text-sm text-brine">Each of their SKUs, the pack it comes in, and that pack in our stock unit.</p>
          </div>
          {canManage ? (
            <button type="button" className="btn-primary" onClick={() => open({ what: "item", id: null })}>
              <Plus aria-hidden className="h-5 w-5" /> Add item
            </button>
          ) : null}
        </div>
        {hasCure ? <CureCaution /> : null}
        {supplierItems.length ? (
          <DataTable caption={`Items sold by ${supplier.name}`}>
            <THead>
              <Th>Their SKU</Th>
              <Th>Pack</Th>
              <Th numeric>In our stock unit</Th>
              <Th>GTIN</Th>
              <Th>Our item</Th>
              {canManage ? <Th action /> : null}
            </THead>
            <TBody>
              {supplierItems.map((si) => {
                const units = unitsOf.get(si.item.id);
                const length = packLengthText(si.packSizeStock, units, unitSystem);
                const entered = `${si.packQuantity} ${si.packUnit}`;
                return (
                  <tr key={si.id} className={si.active ? undefined : "text-brine"}>
                    <RowHeader className="min-w-[9rem]">
                      <span className="whitespace-nowrap">{si.sku}</span>
                      {si.description ? <span className="block text-sm font-normal text-brine">{si.description}</span> : null}
                      {si.active ? null : <span className="mt-1 block"><Badge icon={<CirclePause />}>Not sold now</Badge></span>}
                    </RowHeader>
                    <Td>
                      {si.packLabel}
                      {si.packLabel !== entered ? <span className="num block whitespace-nowrap text-sm text-brine">{entered}</span> : null}
                    </Td>
                    <Td numeric className="whitespace-nowrap">
                      <span className="font-semibold">{packStockText(si.packSizeStock, si.stockUnit, units, unitSystem)}</span>
                      {length ? <span className="block text-sm text-brine">{length}</span> : null}
                    </Td>
                    <Td className="num whitespace-nowrap">{si.gtin ?? <span className="text-brine">—</span>}</Td>
                    <Td>
                      <span className="flex flex-wrap items-center gap-2">
                        <span className="whitespace-nowrap font-semibold">{si.item.sku}</span>
                        {si.item.category === "cure" ? <CureMarker /> : null}
                      </span>
                      <span className="block text-sm text-brine">{si.item.name}{si.item.archived ? " (archived)" : ""}</span>
                      <Link
                        href={`/purchasing/prices/${si.item.id}`} aria-label={`Prices of ${si.item.sku} from every supplier`}
                        className="text-sm font-semibold text-brine underline decoration-brine-line underline-offset-4 hover:text-pepper"
                      >
                        Prices from every supplier
                      </Link>
                    </Td>
                    {canManage ? (
                      <Td action>
                        <button type="button" className="btn-quiet" onClick={() => open({ what: "item", id: si.id })} aria-label={`Edit ${si.sku}`}>
                          Edit
                        </button>
                      </Td>
                    ) : null}
                  </tr>
                );
              })}
            </TBody>
          </DataTable>
        ) : (
          <EmptyState title="No items yet">
            <p>
              {canManage
                ? "Add what this supplier sells you: their SKU, which of our items it is, and the pack it comes in (for example a bundle of 5 hanks). The pack is worked out in our stock unit, so orders and deliveries can count in whole packs."
                : "A buyer, manager or admin adds what this supplier sells us."}
            </p>
          </EmptyState>
        )}
      </section>

      {canManage ? (
        <>
          <SideSheet open={editing?.what === "details"} onClose={close} title={`Edit ${supplier.name}`} description={`Minimum orders are in ${supplier.currency}, the company's currency.`}>
            {editing?.what === "details" ? <SupplierForm supplier={supplier} currency={supplier.currency} onSaved={saved} onCancel={close} /> : null}
          </SideSheet>
          <SideSheet
            open={editing?.what === "item"}
            onClose={close}
            title={currentItem ? `Edit ${currentItem.sku}` : "Add an item"}
            description={currentItem ? currentItem.description || currentItem.item.name : `Something ${supplier.name} sells us.`}
          >
            {editing?.what === "item" ? (
              <SupplierItemForm
                key={currentItem?.id ?? "new"} supplierId={supplier.id} supplierItem={currentItem} items={pickable} unitSystem={unitSystem}
                onSaved={saved} onCancel={close}
              />
            ) : null}
          </SideSheet>
        </>
      ) : null}
    </>
  );
}
