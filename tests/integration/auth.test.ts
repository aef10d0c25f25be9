import { once } from "node:events";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as signInRoute } from "../../app/api/auth/sign-in/route";
import { POST as signOutRoute } from "../../app/api/auth/sign-out/route";
import { GET as meRoute } from "../../app/api/me/route";
import { db } from "../../db/client";
import { redis } from "../../lib/redis";
import { createCompany, createUser, TEST_PASSWORD, uniqueEmail, type TestCompany } from "../support/factory";
import { sessionCookieFor } from "../support/sessions";
import { call, cookieAttributes, cookieFrom } from "../support/http";

const signIn = (email: string, password: string, headers: Record<string, string> = {}) =>
  call(signInRoute, { path: "/api/auth/sign-in", body: { email, password }, headers });
const me = (cookie?: string) => call(meRoute, { path: "/api/me", cookie });

let co: TestCompany;
beforeAll(async () => {
  co = await createCompany({ kitchens: 3 });
});

describe("POST /api/auth/sign-in", () => {
  it("signs in: 200 {user} and an HttpOnly, SameSite=Lax session cookie, not Secure over http", async () => {
    const res = await signIn(co.users.manager.email, TEST_PASSWORD);
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ id: co.users.manager.id, email: co.users.manager.email, role: "manager" });
    const attrs = cookieAttributes(res.headers);
    expect(attrs.has("httponly")).toBe(true);
    expect(attrs.get("samesite")).toBe("Lax");
    expect(attrs.get("path")).toBe("/");
    expect(Number(attrs.get("max-age"))).toBeGreaterThan(29 * 24 * 3600); // 30-day sessions
    expect(attrs.has("secure")).toBe(false);
    // the cookie is a working session
    expect((await me(cookieFrom(res.headers))).status).toBe(200);
  });

  it("marks the cookie Secure when the request came over HTTPS through a proxy", async () => {
    const res = await signIn(co.users.buyer.email, TEST_PASSWORD, { "x-forwarded-proto": "https" });
    expect(res.status).toBe(200);
    expect(cookieAttributes(res.headers).has("secure")).toBe(true);
  });

  it("accepts the e-mail in any case and with spaces", async () => {
    const res = await signIn(`  ${co.users.accountant.email.toUpperCase()} `, TEST_PASSWORD);
    expect(res.status).toBe(200);
    expect(res.body.user.id).toBe(co.users.accountant.id);
  });

  it("answers a wrong password and an unknown e-mail identically with 401", async () => {
    const wrong = await signIn(co.users.admin.email, "not-the-password");
    const unknown = await signIn(uniqueEmail("nobody"), TEST_PASSWORD);
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
    expect(wrong.body).toEqual({ error: { code: "UNAUTHENTICATED", message: expect.any(String) } });
    expect(wrong.headers.getSetCookie()).toEqual([]);
  });

  it("refuses a disabled user with the same 401", async () => {
    const disabled = await createUser(co.company.id, "buyer", { disabled: true });
    const res = await signIn(disabled.email, TEST_PASSWORD);
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe("UNAUTHENTICATED");
    expect(res.headers.getSetCookie()).toEqual([]);
  });

  it("blocks the 11th attempt after 10 failures for an e-mail with 429 and Retry-After", async () => {
    // the web app's Redis client refuses commands until it is connected (no offline queue); wait,
    // so every failure is counted in Redis rather than partly in the per-process fallback
    const client = redis();
    if (client.status !== "ready") await once(client, "ready");
    const user = await createUser(co.company.id, "buyer");
    for (let i = 0; i < 10; i++) expect((await signIn(user.email, `wrong-${i}`)).status).toBe(401);
    // blocked now, even with the right password
    const blocked = await signIn(user.email, TEST_PASSWORD);
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.code).toBe("RATE_LIMITED");
    const retryAfter = Number(blocked.headers.get("retry-after"));
    expect(retryAfter).toBeGreaterThan(14 * 60); // the 15-minute window has just started
    expect(retryAfter).toBeLessThanOrEqual(15 * 60);
    expect(blocked.body.error.details).toEqual({ retryAfterSeconds: retryAfter });
    // another e-mail is not affected
    expect((await signIn(co.users.kitchen_lead.email, TEST_PASSWORD)).status).toBe(200);
  });

  it("a success resets the failure count", async () => {
    const client = redis();
    if (client.status !== "ready") await once(client, "ready");
    const user = await createUser(co.company.id, "manager");
    for (let i = 0; i < 9; i++) await signIn(user.email, "wrong-password");
    expect((await signIn(user.email, TEST_PASSWORD)).status).toBe(200);
    for (let i = 0; i < 9; i++) await signIn(user.email, "wrong-password");
    expect((await signIn(user.email, TEST_PASSWORD)).status).toBe(200);
  });

  it("answers 422 naming the fields when e-mail or password is missing", async () => {
    const res = await call(signInRoute, { path: "/api/auth/sign-in", body: { email: "not-an-email" } });
    expect(res.status).toBe(422);
    expect(Object.keys(res.body.error.details.fields).sort()).toEqual(["email", "password"]);
  });
});

describe("GET /api/me", () => {
  it("returns the user, company and every open kitchen for a company-wide role", async () => {
    const res = await me(await sessionCookieFor(co.users.admin.id));
    expect(res.status).toBe(200);
    const kitchens = [...co.kitchens].sort((a, b) => a.code.localeCompare(b.code));
    expect(res.body).toEqual({
      id: co.users.admin.id,
      email: co.users.admin.email,
      name: co.users.admin.name,
      role: "admin",
      company: { id: co.company.id, name: co.company.name },
      kitchens: kitchens.map((k) => ({ id: k.id, code: k.code, name: k.name })),
    });
  });

  it("shows a kitchen lead only the assigned kitchens", async () => {
    const [k1, , k3] = co.kitchens;
    const lead = await createUser(co.company.id, "kitchen_lead", { kitchenIds: [k1!.id, k3!.id] });
    const res = await me(await sessionCookieFor(lead.id));
    expect(res.status).toBe(200);
    expect(res.body.role).toBe("kitchen_lead");
    expect(res.body.kitchens).toEqual([k1, k3].map((k) => ({ id: k!.id, code: k!.code, name: k!.name })));
  });

  it("hides archived kitchens", async () => {
    const other = await createCompany({ kitchens: 2 });
    await db()("kitchens").where({ id: other.kitchens[1]!.id }).update({ archived_at: new Date() });
    const res = await me(await sessionCookieFor(other.users.manager.id));
    expect(res.body.kitchens.map((k: { id: string }) => k.id)).toEqual([other.kitchens[0]!.id]);
  });

  it("is 401 without a session or with an unknown one", async () => {
    for (const cookie of [undefined, "hl_session=not-a-session"]) {
      const res = await me(cookie);
      expect(res.status).toBe(401);
      expect(res.body).toEqual({ error: { code: "UNAUTHENTICATED", message: expect.any(String) } });
    }
  });

  it("is 401 once the user is disabled", async () => {
    const user = await createUser(co.company.id, "accountant");
    const cookie = await sessionCookieFor(user.id);
    expect((await me(cookie)).status).toBe(200);
    await db()("app_users").where({ id: user.id }).update({ disabled_at: new Date() });
    expect((await me(cookie)).status).toBe(401);
  });
});

describe("POST /api/auth/sign-out", () => {
  it("ends the session: the cookie is cleared and the old session no longer works", async () => {
    const signedIn = await signIn(co.users.buyer.email, TEST_PASSWORD);
    const cookie = cookieFrom(signedIn.headers)!;
    expect((await me(cookie)).status).toBe(200);

    const out = await call(signOutRoute, { method: "POST", path: "/api/auth/sign-out", cookie });
    expect(out.status).toBe(200);
    expect(cookieFrom(out.headers)).toBe("hl_session=");
    expect(cookieAttributes(out.headers).get("max-age")).toBe("0");

    expect((await me(cookie)).status).toBe(401);
    expect(await db()("user_sessions").where({ id: cookie.split("=")[1] }).first()).toBeUndefined();
  });

  it("leaves the user's other sessions alone", async () => {
    const a = await sessionCookieFor(co.users.manager.id);
    const b = await sessionCookieFor(co.users.manager.id);
    await call(signOutRoute, { method: "POST", path: "/api/auth/sign-out", cookie: a });
    expect((await me(a)).status).toBe(401);
    expect((await me(b)).status).toBe(200);
  });
});
