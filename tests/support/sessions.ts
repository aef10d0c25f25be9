// Sessions and loaded users for the vitest suites (these modules are server-only in the app).
import type { CurrentUser } from "../../lib/auth/current-user";
import { createSession, SESSION_COOKIE } from "../../lib/auth/session";
import { loadCurrentUser } from "../../lib/data/users";

/** The user as the app sees it after sign-in. */
export async function currentUser(userId: string): Promise<CurrentUser> {
  const u = await loadCurrentUser(userId);
  if (!u) throw new Error(`No active user ${userId}`);
  return u;
}

/** A Cookie header value for a fresh session of the user (skips the sign-in route and its rate limit). */
export async function sessionCookieFor(userId: string): Promise<string> {
  const session = await createSession(userId);
  return `${SESSION_COOKIE}=${session.id}`;
}
