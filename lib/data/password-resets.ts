import "server-only";
import { addHours } from "date-fns";
import type { z } from "zod";
import { db } from "../../db/client";
import type { PasswordResetRow } from "../../db/types";
import { assertNotLimited, resetRequestLimiter } from "../auth/limiters";
import { hashPassword } from "../auth/password";
import { hashToken, newLinkToken } from "../auth/tokens";
import { env } from "../env";
import { AppError, notFound } from "../http/errors";
import { passwordResetEmail } from "../mail/templates";
import type { passwordResetConfirmInput } from "../validation/auth";
import { addToOutbox, dispatchOutbox } from "./outbox";

export const RESET_HOURS = 1;

/** Same answer whether or not the e-mail is known; mail goes only to an active account. */
export async function requestPasswordReset(email: string): Promise<void> {
  await assertNotLimited(resetRequestLimiter(), email.toLowerCase(), "reset requests");
  await resetRequestLimiter().recordFailure(email.toLowerCase());
  const { token, hash } = newLinkToken();
  const expiresAt = addHours(new Date(), RESET_HOURS);
  const outboxId = await db().transaction(async (trx) => {
    const user = await trx("app_users as u")
      .join("companies as c", "c.id", "u.company_id")
      .where("u.email", email.toLowerCase())
      .whereNull("u.disabled_at")
      .whereNotNull("u.password_hash")
      .first<{ id: string; company_id: string; name: string; time_zone: string } | undefined>(
        "u.id", "u.company_id", "u.name", trx.raw("coalesce(u.time_zone, c.time_zone) as time_zone"));
    if (!user) return null;
    await trx("password_resets").insert({ company_id: user.company_id, user_id: user.id, token_hash: hash, expires_at: expiresAt });
    const mail = passwordResetEmail({ name: user.name, link: `${env().APP_URL}/reset-password/${token}`, expiresAt, timeZone: user.time_zone });
    return addToOutbox(trx, { companyId: user.company_id, to: [email.toLowerCase()], ...mail });
  });
  if (outboxId) dispatchOutbox([outboxId]);
}

function assertUsable(r: PasswordResetRow | undefined): asserts r is PasswordResetRow {
  if (!r) throw notFound("Reset link");
  if (r.used_at) throw new AppError(409, "RESET_USED", "This reset link has already been used. Ask for a new one.");
  if (r.expires_at <= new Date()) throw new AppError(409, "RESET_EXPIRED", "This reset link has expired. Ask for a new one.");
}

/** Whether a link still works, so the page can say so before the person types a new password. */
export async function checkPasswordResetToken(token: string): Promise<void> {
  assertUsable(await db()("password_resets").where({ token_hash: hashToken(token) }).first());
}

/** Sets the new password, spends the link and signs the account out everywhere, in one transaction. */
export async function resetPassword(input: z.infer<typeof passwordResetConfirmInput>): Promise<{ userId: string }> {
  const passwordHash = await hashPassword(input.password);
  return db().transaction(async (trx) => {
    const r: PasswordResetRow | undefined = await trx("password_resets").where({ token_hash: hashToken(input.token) }).forUpdate().first();
    assertUsable(r);
    await trx("app_users").where({ id: r.user_id }).update({ password_hash: passwordHash });
    await trx("password_resets").where({ user_id: r.user_id }).whereNull("used_at").update({ used_at: trx.fn.now() });
    await trx("user_sessions").where({ user_id: r.user_id }).delete();
    return { userId: r.user_id };
  });
}
