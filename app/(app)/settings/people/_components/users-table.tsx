"use client";

import { useCallback, useState } from "react";
import { Ban, CheckCircle2, TriangleAlert } from "lucide-react";
import { Badge } from "@/components/ui/badge";
import { DataTable, RowHeader, TBody, Td, Th, THead } from "@/components/ui/data-table";
import { useNotice } from "@/components/ui/notice";
import { SideSheet } from "@/components/ui/side-sheet";
import type { UserSummary } from "@/lib/data/users";
import { ROLE_LABELS } from "@/lib/auth/roles";
import type { KitchenOption } from "./kitchen-choices";
import { UserEditForm } from "./user-edit-form";

export function UsersTable({ users, kitchens, currentUserId }: { users: UserSummary[]; kitchens: KitchenOption[]; currentUserId: string }) {
  const [editingId, setEditingId] = useState<string | null>(null);
  const setNotice = useNotice();
  const editing = users.find((u) => u.id === editingId) ?? null;
  const close = useCallback(() => setEditingId(null), []);
  const saved = useCallback((message: string) => {
    setEditingId(null);
    setNotice(message);
  }, [setNotice]);

  return (
    <>
      <DataTable caption="People">
        <THead>
          <Th>Name</Th>
          <Th>E-mail</Th>
          <Th>Role</Th>
          <Th>Kitchens</Th>
          <Th>Status</Th>
          <Th action />
        </THead>
        <TBody>
          {users.map((u) => (
            <tr key={u.id} className={u.disabled ? "text-brine" : undefined}>
              <RowHeader>
                {u.name}
                {u.id === currentUserId ? <span className="font-normal text-brine"> (you)</span> : null}
              </RowHeader>
              <Td className="break-words">{u.email}</Td>
              <Td className="whitespace-nowrap">{ROLE_LABELS[u.role]}</Td>
              <Td>
                {u.role !== "kitchen_lead" ? (
                  <span className="text-brine">All</span>
                ) : u.kitchens.length ? (
                  <span className="font-semibold">{u.kitchens.map((k) => k.code).join(", ")}</span>
                ) : (
                  <Badge tone="amber" icon={<TriangleAlert />}>None</Badge>
                )}
              </Td>
              <Td>
                {u.disabled ? <Badge icon={<Ban />}>Disabled</Badge> : <Badge tone="herb" icon={<CheckCircle2 />}>Active</Badge>}
              </Td>
              <Td action>
                <button type="button" className="btn-quiet" onClick={() => { setNotice(undefined); setEditingId(u.id); }} aria-label={`Edit ${u.name}`}>
                  Edit
                </button>
              </Td>
            </tr>
          ))}
        </TBody>
      </DataTable>
      <SideSheet open={editing !== null} onClose={close} title={editing ? `Edit ${editing.name}` : "Edit"} description={editing?.email}>
        {editing ? (
          <UserEditForm key={editing.id} user={editing} kitchens={kitchens} isSelf={editing.id === currentUserId} onSaved={saved} onCancel={close} />
        ) : null}
      </SideSheet>
    </>
  );
}
