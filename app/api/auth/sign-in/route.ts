import { isHttps, serializeCookie, sessionCookie } from "@/lib/auth/session";
import { signIn } from "@/lib/auth/sign-in";
import { Reply, route } from "@/lib/http/route";
import { signInInput } from "@/lib/validation/auth";
import { meBody } from "../../me/me-body";

export const POST = route({ auth: false, body: signInInput }, async ({ req, body }) => {
  const { user, session } = await signIn(body);
  return new Reply(200, { user: meBody(user) }, [serializeCookie(sessionCookie(session, isHttps(req.headers, req.url)))]);
});
