import { invalidateSession, isHttps, serializeCookie, sessionCookie, SESSION_COOKIE } from "@/lib/auth/session";
import { Reply, route } from "@/lib/http/route";

export const POST = route({ auth: false }, async ({ req }) => {
  const id = req.cookies.get(SESSION_COOKIE)?.value;
  if (id) await invalidateSession(id);
  return new Reply(200, { ok: true }, [serializeCookie(sessionCookie(null, isHttps(req.headers, req.url)))]);
});
