import "server-only";
import { addDays } from "date-fns";
import type { z } from "zod";
import { db } from "../../db/client";
import type { InvitationRow, Role } from "../../db/types";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import { hashPassword } from "../auth/password";
import { hashToken, newLinkToken } from "../auth/tokens";
import { env } from "../env";
import { AppError, conflict, notFound } from "../http/errors";
import { invitationEmail } from "../mail/templates";
import type { invitationAcceptInput } from "../validation/auth";
import type { invitationCreateInput } from "../validation/company";
import { addToOutbox, dispatchOutbox } from "./outbox";
import { assertCompanyKitchens } from "./users";

export const INVITATION_DAYS = 7;

export interface InvitationSummary {
  id: string;
  email: string;
  name: string;
  role: Role;
  kitchenIds: string[];
  status: "pending" | "accepted" | "revoked" | "expired";
  expiresAt: string;
  createdAt: string;
}

function summary(r: InvitationRow, now = new Date()): InvitationSummary {
  const status = r.accepted_at ? "accepted" : r.revoked_at ? "revoked" : r.expires_at <= now ? "expired" : "pending";
  return {
    id: r.id, email: r.email, name: r.name, role: r.role, kitchenIds: r.kitchen_ids, status,
    expiresAt: r.expires_at.toISOString(), createdAt: r.created_at.toISOString(),
  };
}

export async function listInvitations(actor: CurrentUser): Promise<InvitationSummary[]> {
  assertCan(actor, "users.manage");
  const rows: InvitationRow[] = await db()("invitations").where({ company_id: actor.companyId }).orderBy("created_at", "desc").limit(200);
  return rows.map((r) => summary(r));
}

/** Creates the invitation and its e-mail in one transaction; an earlier open invitation to the same address is revoked. */
export async function createInvitation(actor: CurrentUser, input: z.infer<typeof invitationCreateInput>): Promise<InvitationSummary> {
  assertCan(actor, "users.manage");
  const { token, hash } = newLinkToken();
  const expiresAt = addDays(new Date(), INVITATION_DAYS);
  const { row, outboxId } = await db().transaction(async (trx) => {
    const existing = await trx("app_users").where({ email: input.email }).first("id");
    if (existing) throw conflict("This e-mail already has a Hank & Lot account.", "CONFLICT", { fields: { email: ["Already a user."] } });
    await assertCompanyKitchens(trx, actor.companyId, input.kitchenIds);
    await trx("invitations")
      .where({ company_id: actor.companyId, email: input.email })
      .whereNull("accepted_at").whereNull("revoked_at")
      .update({ revoked_at: trx.fn.now() });
    const [row] = await trx("invitations")
      .insert({
        company_id: actor.companyId, email: input.email, name: input.name, role: input.role,
        kitchen_ids: input.kitchenIds, token_hash: hash, invited_by: actor.id, expires_at: expiresAt,
      })
      .returning<InvitationRow[]>("*");
    // the invitee has no time zone of their own yet: the company's is the best guess
    const { time_zone: companyTimeZone } = await trx("companies").where({ id: actor.companyId }).first("time_zone");
    const mail = invitationEmail({
      name: input.name, companyName: actor.companyName, inviterName: actor.name, role: input.role,
      link: `${env().APP_URL}/invitation/${token}`, expiresAt, timeZone: companyTimeZone,
    });
    const outboxId = await addToOutbox(trx, { companyId: actor.companyId, to: [input.email], ...mail });
    return { row: row!, outboxId };
  });
  dispatchOutbox([outboxId]);
  return summary(row);
}

export async function revokeInvitation(actor: CurrentUser, id: string): Promise<InvitationSummary> {
  assertCan(actor, "users.manage");
  const [row] = await db()("invitations")
    .where({ company_id: actor.companyId, id })
    .update({ revoked_at: db().raw("coalesce(revoked_at, now())") })
    .returning<InvitationRow[]>("*");
  if (!row) throw notFound("Invitation");
  return summary(row);
}

function assertUsable(r: InvitationRow | undefined): asserts r is InvitationRow {
  if (!r) throw notFound("Invitation");
  if (r.accepted_at) throw new AppError(409, "INVITATION_USED", "This invitation link has already been used. Sign in, or ask your admin for a new one.");
  if (r.revoked_at) throw new AppError(409, "INVITATION_REVOKED", "This invitation was withdrawn. Ask your admin for a new one.");
  if (r.expires_at <= new Date()) throw new AppError(409, "INVITATION_EXPIRED", "This invitation link has expired. Ask your admin for a new one.");
}

/** What the invitation page shows before the person sets a password. */
export async function getInvitationByToken(token: string): Promise<{ email: string; name: string; companyName: string; role: Role }> {
  const r = await db()("invitations as i")
    .join("companies as c", "c.id", "i.company_id")
    .where("i.token_hash", hashToken(token))
    .first<(InvitationRow & { company_name: string }) | undefined>("i.*", "c.name as company_name");
  assertUsable(r);
  return { email: r.email, name: r.name, companyName: r.company_name, role: r.role };
}

/** Single use: the row is locked, checked and marked accepted in the same transaction as the new user. */
export async function acceptInvitation(input: z.infer<typeof invitationAcceptInput>): Promise<{ userId: string }> {
  const passwordHash = await hashPassword(input.password);
  return db().transaction(async (trx) => {
    const r: InvitationRow | undefined = await trx("invitations").where({ token_hash: hashToken(input.token) }).forUpdate().first();
    assertUsable(r);
    const taken = await trx("app_users").where({ email: r.email }).first("id");
    if (taken) throw conflict("This e-mail already has a Hank & Lot account. Sign in instead.");
    const [user] = await trx("app_users")
      .insert({ company_id: r.company_id, email: r.email, name: input.name ?? r.name, role: r.role, password_hash: passwordHash })
      .returning<{ id: string }[]>("id");
    const kitchens = await trx("kitchens").where({ company_id: r.company_id }).whereIn("id", r.kitchen_ids).pluck<string[]>("id");
    if (kitchens.length) {
      await trx("user_kitchens").insert(kitchens.map((kitchen_id) => ({ company_id: r.company_id, user_id: user!.id, kitchen_id })));
    }
    await trx("invitations").where({ id: r.id }).update({ accepted_at: trx.fn.now() });
    return { userId: user!.id };
  });
}
