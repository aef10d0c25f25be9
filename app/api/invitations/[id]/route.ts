import { revokeInvitation } from "@/lib/data/invitations";
import { notFound } from "@/lib/http/errors";
import { route } from "@/lib/http/route";
import { uuid } from "@/lib/validation/common";

/** Withdraws an open invitation: its link stops working. */
export const DELETE = route({}, async ({ user, params }) => {
  const parsed = uuid.safeParse(params.id);
  if (!parsed.success) throw notFound("Invitation");
  return revokeInvitation(user, parsed.data);
});
