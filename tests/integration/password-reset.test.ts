import { beforeAll, describe, expect, it } from "vitest";
import { POST as confirmRoute } from "../../app/api/auth/password-reset/confirm/route";
import { POST as requestRoute } from "../../app/api/auth/password-reset/route";
import { POST as signInRoute } from "../../app/api/auth/sign-in/route";
import { GET as meRoute } from "../../app/api/me/route";
import { db } from "../../db/client";
import { newLinkToken } from "../../lib/auth/tokens";
import { RESET_REQUEST_MAX } from "../../lib/auth/rate-limit";
import { checkPasswordResetToken } from "../../lib/data/password-resets";
import { formatDateTime } from "../../lib/mail/templates";
import { createCompany, createUser, TEST_PASSWORD, uniqueEmail, type TestCompany } from "../support/factory";
import { sessionCookieFor } from "../support/sessions";
import { call } from "../support/http";
import { extractLink, tokenOf, waitForMail } from "../support/mail";

const requestReset = (email: string) => call(requestRoute, { path: "/api/auth/password-reset", body: { email } });
const confirm = (token: string, password: string) => call(confirmRoute, { path: "/api/auth/password-reset/confirm", body: { token, password } });
const signIn = (email: string, password: string) => call(signInRoute, { path: "/api/auth/sign-in", body: { email, password } });
const outboxTo = (email: string) => db()("outbox_emails").whereRaw("? = any(to_addresses)", [email]);

let co: TestCompany;
beforeAll(async () => {
  co = await createCompany({ kitchens: 1, timeZone: "Europe/London" });
});

/** A reset written straight to the table, so the test holds its token. */
async function insertReset(userId: string, expiresAt: Date) {
  const { token, hash } = newLinkToken();
  await db()("password_resets").insert({ company_id: co.company.id, user_id: userId, token_hash: hash, expires_at: expiresAt });
  return token;
}

describe("password reset", () => {
  it("limits requests per e-mail (known or not, so the limit reveals nothing) to 5 an hour", async () => {
    expect(RESET_REQUEST_MAX).toBe(5);
    const user = await createUser(co.company.id, "accountant");
    for (const email of [user.email, uniqueEmail("nobody")]) {
      for (let i = 0; i < RESET_REQUEST_MAX; i++) expect((await requestReset(email)).status).toBe(202);
      const blocked = await requestReset(email);
      expect(blocked.status).toBe(429);
      expect(blocked.body.error.code).toBe("RATE_LIMITED");
    }
    expect(await outboxTo(user.email)).toHaveLength(RESET_REQUEST_MAX);
  });

  it("tells whether a link still works before a new password is typed", async () => {
    const user = await createUser(co.company.id, "buyer");
    const live = await insertReset(user.id, new Date(Date.now() + 3600_000));
    const expired = await insertReset(user.id, new Date(Date.now() - 1000));
    await expect(checkPasswordResetToken(live)).resolves.toBeUndefined();
    await expect(checkPasswordResetToken(expired)).rejects.toMatchObject({ status: 409, code: "RESET_EXPIRED" });
    await expect(checkPasswordResetToken(newLinkToken().token)).rejects.toMatchObject({ status: 404 });
    expect((await confirm(live, "another-long-password")).status).toBe(200);
    await expect(checkPasswordResetToken(live)).rejects.toMatchObject({ status: 409, code: "RESET_USED" });
  });

  it("answers a known and an unknown e-mail with the same 202, and mails only the known one", async () => {
    const user = await createUser(co.company.id, "buyer");
    const unknown = uniqueEmail("nobody");
    const known = await requestReset(user.email);
    const notKnown = await requestReset(unknown);
    expect(known.status).toBe(202);
    expect(notKnown.status).toBe(202);
    expect(notKnown.body).toEqual(known.body);
    expect(await outboxTo(user.email)).toHaveLength(1);
    expect(await outboxTo(unknown)).toHaveLength(0);
  });

  it("mails a link in the user's time zone that sets the password once and signs every session out", async () => {
    const user = await createUser(co.company.id, "manager", { timeZone: "America/Chicago" });
    const oldSession = await sessionCookieFor(user.id);
    expect((await call(meRoute, { path: "/api/me", cookie: oldSession })).status).toBe(200);

    expect((await requestReset(user.email.toUpperCase())).status).toBe(202);
    const mail = await waitForMail({ to: user.email, subjectIncludes: "Reset your Hank & Lot password", timeoutMs: 15_000 });
    expect(mail.companyId).toBe(co.company.id);
    const link = extractLink(mail.text, "/reset-password/");
    const reset = await db()("password_resets").where({ user_id: user.id }).first();
    // the expiry is shown in the user's own zone, not the company's (Europe/London)
    expect(mail.text).toContain(formatDateTime(reset.expires_at, "America/Chicago"));

    const newPassword = "a-fresh-smoked-password";
    const res = await confirm(tokenOf(link), newPassword);
    expect(res).toMatchObject({ status: 200, body: { ok: true } });

    expect((await signIn(user.email, TEST_PASSWORD)).status).toBe(401);
    expect((await signIn(user.email, newPassword)).status).toBe(200);
    expect((await call(meRoute, { path: "/api/me", cookie: oldSession })).status).toBe(401);

    const again = await confirm(tokenOf(link), "yet-another-password");
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe("RESET_USED");
    expect((await signIn(user.email, newPassword)).status).toBe(200);
  });

  it("spends every open link of the user when one is used", async () => {
    const user = await createUser(co.company.id, "accountant");
    const first = await insertReset(user.id, new Date(Date.now() + 3600_000));
    const second = await insertReset(user.id, new Date(Date.now() + 3600_000));
    expect((await confirm(second, "the-second-password")).status).toBe(200);
    const res = await confirm(first, "the-first-password");
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe("RESET_USED");
  });

  it("refuses an expired link with 409 RESET_EXPIRED and keeps the password", async () => {
    const user = await createUser(co.company.id, "buyer");
    const token = await insertReset(user.id, new Date(Date.now() - 60_000));
    const before = (await db()("app_users").where({ id: user.id }).first()).password_hash;
    const res = await confirm(token, "a-password-too-late");
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe("RESET_EXPIRED");
    expect((await db()("app_users").where({ id: user.id }).first()).password_hash).toBe(before);
    expect((await signIn(user.email, TEST_PASSWORD)).status).toBe(200);
  });

  it("answers an unknown token with 404 and a short password with 422", async () => {
    const unknown = await confirm(newLinkToken().token, "a-long-enough-password");
    expect(unknown.status).toBe(404);
    const short = await confirm(newLinkToken().token, "short");
    expect(short.status).toBe(422);
    expect(short.body.error.details.fields).toHaveProperty("password");
  });

  it("sends nothing to a disabled account", async () => {
    const user = await createUser(co.company.id, "buyer", { disabled: true });
    expect((await requestReset(user.email)).status).toBe(202);
    expect(await outboxTo(user.email)).toHaveLength(0);
  });
});
