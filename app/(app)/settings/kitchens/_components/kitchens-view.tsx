"use client";

import { useCallback, useState } from "react";
import { Archive, CheckCircle2, Plus } from "lucide-react";
import { PageHeader } from "@/components/shell/page-header";
import { Badge } from "@/components/ui/badge";
import { DataTable, RowHeader, TBody, Td, Th, THead } from "@/components/ui/data-table";
import { StatusRegion } from "@/components/ui/field";
import { SideSheet } from "@/components/ui/side-sheet";
import type { Kitchen } from "@/lib/data/kitchens";
import { KitchenForm } from "./kitchen-form";

type Editing = { mode: "add" } | { mode: "edit"; id: string } | null;

export function KitchensView({ kitchens, zones, companyTimeZone }: { kitchens: Kitchen[]; zones: string[]; companyTimeZone: string }) {
  const [editing, setEditing] = useState<Editing>(null);
  const [notice, setNotice] = useState<string>();
  const close = useCallback(() => setEditing(null), []);
  const saved = useCallback((message: string) => {
    setEditing(null);
    setNotice(message);
  }, []);
  const current = editing?.mode === "edit" ? kitchens.find((k) => k.id === editing.id) : undefined;

  return (
    <>
      <PageHeader
        title="Kitchens"
        description="The kitchens your company keeps stock in. Archive one that closes; its records stay."
        actions={
          <button type="button" className="btn-primary" onClick={() => { setNotice(undefined); setEditing({ mode: "add" }); }}>
            <Plus aria-hidden className="h-5 w-5" />
            Add kitchen
          </button>
        }
      />
      <StatusRegion className={notice ? "mb-4" : undefined}>{notice}</StatusRegion>
      <DataTable caption="Kitchens">
        <THead>
          <Th>Code</Th>
          <Th>Name</Th>
          <Th>Address</Th>
          <Th>Time zone</Th>
          <Th>Status</Th>
          <Th action />
        </THead>
        <TBody>
          {kitchens.map((k) => (
            <tr key={k.id} className={k.archived ? "text-brine" : undefined}>
              <RowHeader className="whitespace-nowrap">{k.code}</RowHeader>
              <Td>{k.name}</Td>
              <Td className="max-w-[16rem] whitespace-pre-line">{k.address || <span className="text-brine">—</span>}</Td>
              <Td className="whitespace-nowrap">
                {k.timeZone ? k.timeZone.replaceAll("_", " ") : <span className="text-brine">Company&apos;s</span>}
              </Td>
              <Td>{k.archived ? <Badge icon={<Archive />}>Archived</Badge> : <Badge tone="herb" icon={<CheckCircle2 />}>Open</Badge>}</Td>
              <Td action>
                <button type="button" className="btn-quiet" onClick={() => setEditing({ mode: "edit", id: k.id })} aria-label={`Edit ${k.code} ${k.name}`}>
                  Edit
                </button>
              </Td>
            </tr>
          ))}
        </TBody>
      </DataTable>
      <SideSheet
        open={editing !== null}
        onClose={close}
        title={current ? `Edit ${current.code}` : "Add a kitchen"}
        description={current ? current.name : "It appears in the kitchen switcher once added."}
      >
        {editing ? (
          <KitchenForm key={current?.id ?? "new"} kitchen={current} zones={zones} companyTimeZone={companyTimeZone} onSaved={saved} onCancel={close} />
        ) : null}
      </SideSheet>
    </>
  );
}
