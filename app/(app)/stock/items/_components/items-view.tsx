"use client";

import { useCallback, useState, type ReactNode } from "react";
import { Plus } from "lucide-react";
import { CureCaution } from "@/components/cure/cure-caution";
import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { StatusRegion } from "@/components/ui/field";
import { SideSheet } from "@/components/ui/side-sheet";
import type { Item } from "@/lib/data/items";
import { ItemForm } from "./item-form";
import { ItemsTable } from "./items-table";

type Editing = { mode: "add" } | { mode: "edit"; id: string } | null;

const DESCRIPTION = "Casings, cures, spices and other ingredients, with the packs suppliers sell them in.";

export function ItemsView({ items, canManage, filters, filtered }: {
  items: Item[];
  canManage: boolean;
  /** the category tabs and search (server-rendered) */
  filters: ReactNode;
  /** a category or search narrows the list */
  filtered: boolean;
}) {
  const [editing, setEditing] = useState<Editing>(null);
  const [notice, setNotice] = useState<string>();
  const close = useCallback(() => setEditing(null), []);
  const saved = useCallback((message: string) => {
    setEditing(null);
    setNotice(message);
  }, []);
  const current = editing?.mode === "edit" ? items.find((i) => i.id === editing.id) : undefined;

  return (
    <>
      <PageHeader
        title="Items"
        description={DESCRIPTION}
        actions={
          canManage ? (
            <button type="button" className="btn-primary" onClick={() => { setNotice(undefined); setEditing({ mode: "add" }); }}>
              <Plus aria-hidden className="h-5 w-5" />
              Add item
            </button>
          ) : null
        }
      />
      <StatusRegion className={notice ? "mb-4" : undefined}>{notice}</StatusRegion>
      {filters}
      {items.some((i) => i.cure) ? <CureCaution className="mb-4" /> : null}
      {items.length ? (
        <ItemsTable
          items={items}
          editButton={
            canManage
              ? (item) => (
                  <button type="button" className="btn-quiet" onClick={() => { setNotice(undefined); setEditing({ mode: "edit", id: item.id }); }} aria-label={`Edit ${item.sku} ${item.name}`}>
                    Edit
                  </button>
                )
              : undefined
          }
        />
      ) : filtered ? (
        <EmptyState title="No items match">
          <p>Try another category or search, or clear the filters.</p>
        </EmptyState>
      ) : (
        <EmptyState title="No items yet">
          <p>
            {canManage
              ? "Add the casings, cures and spices your kitchens use: each with its stock unit and the packs suppliers sell it in. Deliveries and stock counts start from here."
              : "A buyer, manager or admin adds the catalogue; stock and deliveries start from it."}
          </p>
        </EmptyState>
      )}
      {canManage ? (
        <SideSheet
          open={editing !== null}
          onClose={close}
          title={current ? `Edit ${current.sku}` : "Add an item"}
          description={current ? current.name : "The fields follow the category."}
        >
          {editing ? <ItemForm key={current?.id ?? "new"} item={current} onSaved={saved} onCancel={close} /> : null}
        </SideSheet>
      ) : null}
    </>
  );
}
