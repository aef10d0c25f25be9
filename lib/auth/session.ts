// Sessions. The session library stays behind this module (its v3 is no longer developed), so it can
// be swapped without touching callers.
import "server-only";
import { cache } from "react";
import { cookies, headers } from "next/headers";
import { redirect } from "next/navigation";
import { Lucia, TimeSpan } from "lucia";
import { NodePostgresAdapter } from "@lucia-auth/adapter-postgresql";
import { pgPool } from "../../db/client";
import { loadCurrentUser } from "../data/users";
import type { CurrentUser } from "./current-user";

export const SESSION_COOKIE = "hl_session";
const SESSION_DAYS = 30;

const globalForLucia = globalThis as unknown as { __hlLucia?: Lucia };

function lucia(): Lucia {
  globalForLucia.__hlLucia ??= new Lucia(new NodePostgresAdapter(pgPool(), { user: "app_users", session: "user_sessions" }), {
    sessionExpiresIn: new TimeSpan(SESSION_DAYS, "d"),
    sessionCookie: { name: SESSION_COOKIE, attributes: { sameSite: "lax" } },
  });
  return globalForLucia.__hlLucia;
}

export interface SessionCookie {
  name: string;
  value: string;
  attributes: { httpOnly: true; sameSite: "lax"; path: "/"; secure: boolean; maxAge: number };
}

/** Secure whenever the request came over HTTPS (directly or through a proxy), not by NODE_ENV. */
export function isHttps(h: Headers, url?: string): boolean {
  const forwarded = h.get("x-forwarded-proto")?.split(",")[0]?.trim();
  if (forwarded) return forwarded === "https";
  return url ? new URL(url).protocol === "https:" : false;
}

export async function createSession(userId: string): Promise<{ id: string; expiresAt: Date }> {
  const session = await lucia().createSession(userId, {});
  return { id: session.id, expiresAt: session.expiresAt };
}

export function sessionCookie(session: { id: string; expiresAt: Date } | null, secure: boolean): SessionCookie {
  const maxAge = session ? Math.max(0, Math.floor((session.expiresAt.getTime() - Date.now()) / 1000)) : 0;
  return {
    name: SESSION_COOKIE,
    value: session?.id ?? "",
    attributes: { httpOnly: true, sameSite: "lax", path: "/", secure, maxAge },
  };
}

export function serializeCookie(c: SessionCookie): string {
  const a = c.attributes;
  return [`${c.name}=${c.value}`, `Path=${a.path}`, `Max-Age=${a.maxAge}`, "HttpOnly", "SameSite=Lax", ...(a.secure ? ["Secure"] : [])].join("; ");
}

/**
 * Validates a session id. `refreshed` is set when the session's expiry moved forward and the
 * cookie should be sent again.
 */
export async function validateSession(sessionId: string): Promise<{ user: CurrentUser; session: { id: string; expiresAt: Date }; refreshed: boolean } | null> {
  const { session, user } = await lucia().validateSession(sessionId);
  if (!session || !user) return null;
  const current = await loadCurrentUser(user.id);
  if (!current) {
    await lucia().invalidateSession(session.id);
    return null;
  }
  return { user: current, session: { id: session.id, expiresAt: session.expiresAt }, refreshed: session.fresh };
}

export async function invalidateSession(sessionId: string): Promise<void> {
  await lucia().invalidateSession(sessionId);
}

export async function invalidateUserSessions(userId: string): Promise<void> {
  await lucia().invalidateUserSessions(userId);
}

export async function deleteExpiredSessions(): Promise<void> {
  await lucia().deleteExpiredSessions();
}

/** The signed-in user for server components and actions, once per request. */
export const getCurrentUser = cache(async (): Promise<CurrentUser | null> => {
  const id = (await cookies()).get(SESSION_COOKIE)?.value;
  if (!id) return null;
  const result = await validateSession(id);
  if (!result) return null;
  if (result.refreshed) {
    // Server components cannot set cookies; actions and route handlers can.
    try {
      const c = sessionCookie(result.session, isHttps(await headers()));
      (await cookies()).set(c.name, c.value, c.attributes);
    } catch {
      /* rendering a page: the next action or API call refreshes the cookie */
    }
  }
  return result.user;
});

/** For pages: the user, or a redirect to the sign-in page. */
export async function requireUser(): Promise<CurrentUser> {
  const user = await getCurrentUser();
  if (!user) redirect("/sign-in");
  return user;
}
