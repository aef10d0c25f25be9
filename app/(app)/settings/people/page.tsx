import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { MailPlus } from "lucide-react";
import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { NoticeProvider, NoticeRegion } from "@/components/ui/notice";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { listInvitations } from "@/lib/data/invitations";
import { listKitchens } from "@/lib/data/kitchens";
import { listUsers } from "@/lib/data/users";
import { InvitationsTable } from "./_components/invitations-table";
import { InvitePerson } from "./_components/invite-person";
import type { KitchenOption } from "./_components/kitchen-choices";
import { UsersTable } from "./_components/users-table";

export const metadata: Metadata = { title: "People" };
export const dynamic = "force-dynamic";

export default async function PeoplePage() {
  const user = await requireUser();
  if (!can(user, "users.manage")) notFound();
  const [users, allKitchens, invitations] = await Promise.all([
    listUsers(user),
    listKitchens(user, { includeArchived: true }),
    listInvitations(user),
  ]);
  const kitchens: KitchenOption[] = allKitchens.map(({ id, code, name, archived }) => ({ id, code, name, archived }));
  return (
    <NoticeProvider>
      <PageHeader
        title="People"
        description="Who can sign in, in which role, and for kitchen leads, in which kitchens."
        actions={<InvitePerson kitchens={kitchens} companyName={user.companyName} />}
      />
      <NoticeRegion className="mb-4" />
      <UsersTable users={users} kitchens={kitchens} currentUserId={user.id} />
      <section aria-labelledby="invitations-heading" className="mt-10">
        <h2 id="invitations-heading" className="mb-3 text-xl font-semibold">Invitations</h2>
        {invitations.length ? (
          <InvitationsTable invitations={invitations} kitchens={kitchens} timeZone={user.timeZone} />
        ) : (
          <EmptyState title="No invitations yet" icon={<MailPlus aria-hidden className="h-8 w-8" />}>
            <p>Use “Invite someone” to send a colleague a link to join.</p>
          </EmptyState>
        )}
      </section>
    </NoticeProvider>
  );
}
