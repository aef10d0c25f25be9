import { beforeAll, describe, expect, it } from "vitest";
import { DELETE as revokeRoute } from "../../app/api/invitations/[id]/route";
import { POST as acceptRoute } from "../../app/api/invitations/accept/route";
import { GET as listRoute, POST as inviteRoute } from "../../app/api/invitations/route";
import { GET as meRoute } from "../../app/api/me/route";
import { db } from "../../db/client";
import type { Role } from "../../db/types";
import { newLinkToken } from "../../lib/auth/tokens";
import { formatDateTime } from "../../lib/mail/templates";
import { createCompany, tag, uniqueEmail, type TestCompany } from "../support/factory";
import { sessionCookieFor } from "../support/sessions";
import { baseUrl, call, cookieAttributes, cookieFrom } from "../support/http";
import { extractLink, tokenOf, waitForMail } from "../support/mail";

let co: TestCompany;
let adminCookie: string;
beforeAll(async () => {
  co = await createCompany({ kitchens: 2 });
  // the inviting admin lives elsewhere than the company: the invitation must not use the admin's zone
  await db()("app_users").where({ id: co.users.admin.id }).update({ time_zone: "Asia/Tokyo" });
  adminCookie = await sessionCookieFor(co.users.admin.id);
});

const invite = (body: unknown, cookie = adminCookie, idempotencyKey?: string) =>
  call(inviteRoute, { path: "/api/invitations", body, cookie, idempotencyKey });
const accept = (body: unknown) => call(acceptRoute, { path: "/api/invitations/accept", body });
const usersWithEmail = async (email: string) => Number((await db()("app_users").where({ email }).count<{ n: string }[]>("* as n"))[0]!.n);

/** An invitation written straight to the table, so the test holds its token without a mail round trip. */
async function insertInvitation(over: { expiresAt?: Date; role?: Role; kitchenIds?: string[] } = {}) {
  const { token, hash } = newLinkToken();
  const email = uniqueEmail("invitee");
  const [row] = await db()("invitations")
    .insert({
      company_id: co.company.id, email, name: "Direct Invitee", role: over.role ?? "buyer", kitchen_ids: over.kitchenIds ?? [],
      token_hash: hash, invited_by: co.users.admin.id, expires_at: over.expiresAt ?? new Date(Date.now() + 3600_000),
    })
    .returning<{ id: string }[]>("id");
  return { id: row!.id, token, email };
}

describe("inviting and accepting", () => {
  it("mails a single-use link that creates the user with the role and kitchens and signs them in", async () => {
    const email = uniqueEmail("new-lead");
    const k2 = co.kitchens[1]!;
    const sentAfter = new Date();
    const res = await invite({ email: email.toUpperCase(), name: "Nell Lead", role: "kitchen_lead", kitchenIds: [k2.id] });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ email, name: "Nell Lead", role: "kitchen_lead", kitchenIds: [k2.id], status: "pending" });

    // the real worker takes it from the outbox and sends it through the catcher
    const mail = await waitForMail({ to: email, subjectIncludes: co.company.name, after: new Date(sentAfter.getTime() - 1000), timeoutMs: 15_000 });
    expect(mail.to).toEqual([email]);
    expect(mail.companyId).toBe(co.company.id);
    const link = extractLink(mail.text, "/invitation/");
    expect(link.startsWith(`${baseUrl()}/invitation/`)).toBe(true);
    // the invitee has no time zone yet: the expiry is shown in the company's
    const row = await db()("invitations").where({ id: res.body.id }).first();
    expect(mail.text).toContain(formatDateTime(row.expires_at, co.company.timeZone));

    const accepted = await accept({ token: tokenOf(link), password: "a-long-new-password" });
    expect(accepted.status).toBe(201);
    expect(cookieAttributes(accepted.headers).has("httponly")).toBe(true);

    const me = await call(meRoute, { path: "/api/me", cookie: cookieFrom(accepted.headers) });
    expect(me.status).toBe(200);
    expect(me.body).toMatchObject({
      email, name: "Nell Lead", role: "kitchen_lead", company: { id: co.company.id },
      kitchens: [{ id: k2.id, code: k2.code, name: k2.name }],
    });
    const inv = await db()("invitations").where({ id: res.body.id }).first();
    expect(inv.accepted_at).toBeInstanceOf(Date);

    // the same link again: refused, and no second user
    const again = await accept({ token: tokenOf(link), password: "another-long-password" });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe("INVITATION_USED");
    expect(await usersWithEmail(email)).toBe(1);
  });

  it("uses the name the invitee gives when accepting", async () => {
    const inv = await insertInvitation({ role: "accountant" });
    expect((await accept({ token: inv.token, name: "Preferred Name", password: "a-long-new-password" })).status).toBe(201);
    const user = await db()("app_users").where({ email: inv.email }).first();
    expect(user).toMatchObject({ name: "Preferred Name", role: "accountant", company_id: co.company.id });
  });

  it("refuses an expired link with 409 INVITATION_EXPIRED and writes nothing", async () => {
    const inv = await insertInvitation({ expiresAt: new Date(Date.now() - 60_000) });
    const res = await accept({ token: inv.token, password: "a-long-new-password" });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe("INVITATION_EXPIRED");
    expect(res.headers.getSetCookie()).toEqual([]);
    expect(await usersWithEmail(inv.email)).toBe(0);
    expect((await db()("invitations").where({ id: inv.id }).first()).accepted_at).toBeNull();
  });

  it("refuses a revoked link with 409 INVITATION_REVOKED", async () => {
    const inv = await insertInvitation();
    const revoked = await call(revokeRoute, { method: "DELETE", path: `/api/invitations/${inv.id}`, params: { id: inv.id }, cookie: adminCookie });
    expect(revoked.status).toBe(200);
    expect(revoked.body.status).toBe("revoked");
    const res = await accept({ token: inv.token, password: "a-long-new-password" });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe("INVITATION_REVOKED");
    expect(await usersWithEmail(inv.email)).toBe(0);
  });

  it("answers an unknown token with 404", async () => {
    const res = await accept({ token: newLinkToken().token, password: "a-long-new-password" });
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe("NOT_FOUND");
  });

  it("refuses to invite an address that already has an account, in any company", async () => {
    const other = await createCompany({ kitchens: 0 });
    for (const email of [co.users.buyer.email, other.users.buyer.email]) {
      const res = await invite({ email, name: "Someone", role: "buyer" });
      expect(res.status).toBe(409);
      expect(res.body.error.details).toEqual({ fields: { email: [expect.any(String)] } });
    }
    expect(await db()("invitations").whereIn("email", [co.users.buyer.email, other.users.buyer.email]).first()).toBeUndefined();
  });

  it("refuses another company's kitchen as a bad field", async () => {
    const other = await createCompany({ kitchens: 1 });
    const res = await invite({ email: uniqueEmail(), name: "X", role: "kitchen_lead", kitchenIds: [other.kitchens[0]!.id] });
    expect(res.status).toBe(422);
    expect(Object.keys(res.body.error.details.fields)).toEqual(["kitchenIds.0"]);
  });

  it("is admin-only: every other role gets 403 and nothing is written", async () => {
    for (const role of ["manager", "buyer", "kitchen_lead", "accountant"] as const) {
      const email = uniqueEmail(`by-${role}`);
      const cookie = await sessionCookieFor(co.users[role].id);
      const res = await invite({ email, name: "Nope", role: "buyer" }, cookie);
      expect(res.status, role).toBe(403);
      expect(res.body.error.code).toBe("FORBIDDEN");
      expect(await db()("invitations").where({ email }).first()).toBeUndefined();
      expect((await call(listRoute, { path: "/api/invitations", cookie })).status).toBe(403);
    }
  });
});

describe("Idempotency-Key", () => {
  it("replays the original status and body and creates one invitation", async () => {
    const key = `invite-${tag()}`;
    const body = { email: uniqueEmail("idem"), name: "Idem Potent", role: "buyer" };
    const first = await invite(body, adminCookie, key);
    const second = await invite(body, adminCookie, key);
    expect(first.status).toBe(201);
    expect(second.status).toBe(201);
    expect(second.body).toEqual(first.body);
    expect(await db()("invitations").where({ email: body.email })).toHaveLength(1);
    expect(await db()("outbox_emails").whereRaw("? = any(to_addresses)", [body.email])).toHaveLength(1);
  });

  it("replays a refusal as well", async () => {
    const key = `invite-${tag()}`;
    const body = { email: co.users.manager.email, name: "Dup", role: "buyer" };
    const first = await invite(body, adminCookie, key);
    expect(first.status).toBe(409);
    const second = await invite(body, adminCookie, key);
    expect(second).toMatchObject({ status: 409, body: first.body });
  });

  it("answers the same key with a different body with 422", async () => {
    const key = `invite-${tag()}`;
    const email = uniqueEmail("idem-a");
    expect((await invite({ email, name: "A", role: "buyer" }, adminCookie, key)).status).toBe(201);
    const other = uniqueEmail("idem-b");
    const res = await invite({ email: other, name: "B", role: "buyer" }, adminCookie, key);
    expect(res.status).toBe(422);
    expect(res.body.error.details.fields).toHaveProperty("Idempotency-Key");
    expect(await db()("invitations").where({ email: other }).first()).toBeUndefined();
  });

  it("keeps keys apart per user: another admin may use the same key", async () => {
    const key = `invite-${tag()}`;
    const otherAdmin = await sessionCookieFor((await createCompany({ kitchens: 0 })).users.admin.id);
    const a = await invite({ email: uniqueEmail("k1"), name: "A", role: "buyer" }, adminCookie, key);
    const b = await invite({ email: uniqueEmail("k2"), name: "B", role: "buyer" }, otherAdmin, key);
    expect(a.status).toBe(201);
    expect(b.status).toBe(201);
    expect(b.body.id).not.toBe(a.body.id);
  });
});
