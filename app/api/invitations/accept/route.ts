import { isHttps, createSession, serializeCookie, sessionCookie } from "@/lib/auth/session";
import { acceptInvitation } from "@/lib/data/invitations";
import { Reply, route } from "@/lib/http/route";
import { invitationAcceptInput } from "@/lib/validation/auth";

/** Creates the account from a single-use link and signs the new user in. */
export const POST = route({ auth: false, body: invitationAcceptInput }, async ({ req, body }) => {
  const { userId } = await acceptInvitation(body);
  const session = await createSession(userId);
  return new Reply(201, { ok: true }, [serializeCookie(sessionCookie(session, isHttps(req.headers, req.url)))]);
});
