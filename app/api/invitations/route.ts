import { createInvitation, listInvitations } from "@/lib/data/invitations";
import { Reply, route } from "@/lib/http/route";
import { invitationCreateInput } from "@/lib/validation/company";

export const GET = route({}, async ({ user }) => ({ invitations: await listInvitations(user) }));

export const POST = route({ body: invitationCreateInput, idempotent: true }, async ({ user, body }) =>
  new Reply(201, await createInvitation(user, body)));
