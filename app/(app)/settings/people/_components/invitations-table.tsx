import { Ban, CalendarX, CheckCircle2, Clock } from "lucide-react";
import { Badge } from "@/components/ui/badge";
import { DataTable, RowHeader, TBody, Td, Th, THead } from "@/components/ui/data-table";
import type { InvitationSummary } from "@/lib/data/invitations";
import { ROLE_LABELS } from "@/lib/auth/roles";
import type { KitchenOption } from "./kitchen-choices";
import { WithdrawInvitation } from "./withdraw-invitation";

const STATUS = {
  pending: { label: "Pending", tone: "neutral", icon: <Clock /> },
  accepted: { label: "Joined", tone: "herb", icon: <CheckCircle2 /> },
  revoked: { label: "Withdrawn", tone: "neutral", icon: <Ban /> },
  expired: { label: "Expired", tone: "neutral", icon: <CalendarX /> },
} as const;

export function InvitationsTable({ invitations, kitchens, timeZone }: { invitations: InvitationSummary[]; kitchens: KitchenOption[]; timeZone: string }) {
  const date = new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "short", year: "numeric", hour: "2-digit", minute: "2-digit", timeZone });
  const code = (id: string) => kitchens.find((k) => k.id === id)?.code ?? "?";
  return (
    <DataTable caption="Invitations">
      <THead>
        <Th>Person</Th>
        <Th>Role</Th>
        <Th>Status</Th>
        <Th>Sent</Th>
        <Th action />
      </THead>
      <TBody>
        {invitations.map((i) => {
          const s = STATUS[i.status];
          return (
            <tr key={i.id} className={i.status === "pending" ? undefined : "text-brine"}>
              <RowHeader className="font-normal">
                <span className="block font-semibold text-pepper">{i.name}</span>
                <span className="block break-words text-sm text-brine">{i.email}</span>
              </RowHeader>
              <Td>
                <span className="whitespace-nowrap">{ROLE_LABELS[i.role]}</span>
                {i.role === "kitchen_lead" && i.kitchenIds.length ? (
                  <span className="block text-sm text-brine">{i.kitchenIds.map(code).join(", ")}</span>
                ) : null}
              </Td>
              <Td>
                <Badge tone={s.tone} icon={s.icon}>{s.label}</Badge>
                {i.status === "pending" ? (
                  <span className="mt-0.5 block whitespace-nowrap text-sm text-brine">until <time dateTime={i.expiresAt}>{date.format(new Date(i.expiresAt))}</time></span>
                ) : null}
              </Td>
              <Td className="whitespace-nowrap"><time dateTime={i.createdAt}>{date.format(new Date(i.createdAt))}</time></Td>
              <Td action>{i.status === "pending" ? <WithdrawInvitation id={i.id} email={i.email} /> : null}</Td>
            </tr>
          );
        })}
      </TBody>
    </DataTable>
  );
}
