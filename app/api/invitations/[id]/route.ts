import { revokeInvitation } from "@/lib/data/invitations";
import { idParam, route } from "@/lib/http/route";

/** Withdraws an open invitation: its link stops working. */
export const DELETE = route({}, async ({ user, params }) => revokeInvitation(user, idParam(params, "Invitation")));
