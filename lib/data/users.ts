import "server-only";
import type { Knex } from "knex";
import { db } from "../../db/client";
import type { KitchenRow, Role, UserRow } from "../../db/types";
import type { CurrentUser, KitchenRef } from "../auth/current-user";
import { assertCan } from "../auth/assert";
import { conflict, notFound, validation } from "../http/errors";
import { z } from "zod";
import { profileUpdateInput, userUpdateInput } from "../validation/company";

export interface UserSummary {
  id: string;
  email: string;
  name: string;
  role: Role;
  timeZone: string | null;
  disabled: boolean;
  kitchens: KitchenRef[];
  createdAt: string;
}

/** For sign-in only: the row with its password hash. Not scoped: the caller has no user yet. */
export async function findUserForSignIn(email: string): Promise<Pick<UserRow, "id" | "password_hash" | "disabled_at"> | undefined> {
  return db()("app_users").where({ email: email.toLowerCase() }).first("id", "password_hash", "disabled_at");
}

/** Loads the session's user with company and kitchens; undefined when disabled or gone. */
export async function loadCurrentUser(userId: string): Promise<CurrentUser | undefined> {
  const row = await db()("app_users as u")
    .join("companies as c", "c.id", "u.company_id")
    .where("u.id", userId)
    .whereNull("u.disabled_at")
    .first<{
      id: string; email: string; name: string; role: Role; company_id: string; time_zone: string | null;
      unit_system: "metric" | "us"; company_name: string; company_time_zone: string; currency: string;
    }>("u.id", "u.email", "u.name", "u.role", "u.company_id", "u.time_zone", "u.unit_system",
      "c.name as company_name", "c.time_zone as company_time_zone", "c.currency");
  if (!row) return undefined;
  const assigned = await db()("user_kitchens").where({ user_id: userId }).pluck<string[]>("kitchen_id");
  const open: KitchenRow[] = await db()("kitchens").where({ company_id: row.company_id }).whereNull("archived_at").orderBy("code");
  const kitchens = row.role === "kitchen_lead" ? open.filter((k) => assigned.includes(k.id)) : open;
  return {
    id: row.id,
    companyId: row.company_id,
    role: row.role,
    assignedKitchenIds: assigned,
    email: row.email,
    name: row.name,
    companyName: row.company_name,
    currency: row.currency,
    timeZone: row.time_zone ?? row.company_time_zone,
    ownTimeZone: row.time_zone,
    unitSystem: row.unit_system,
    kitchens: kitchens.map(kitchenRef),
  };
}

export function kitchenRef(k: Pick<KitchenRow, "id" | "code" | "name">): KitchenRef {
  return { id: k.id, code: k.code, name: k.name };
}

export async function listUsers(actor: CurrentUser): Promise<UserSummary[]> {
  assertCan(actor, "users.manage");
  const users: UserRow[] = await db()("app_users").where({ company_id: actor.companyId }).orderBy("name");
  return withKitchens(actor.companyId, users);
}

export async function getUser(actor: CurrentUser, id: string): Promise<UserSummary> {
  assertCan(actor, "users.manage");
  const row: UserRow | undefined = await db()("app_users").where({ company_id: actor.companyId, id }).first();
  if (!row) throw notFound("User");
  return (await withKitchens(actor.companyId, [row]))[0]!;
}

async function withKitchens(companyId: string, users: UserRow[]): Promise<UserSummary[]> {
  const links = await db()("user_kitchens as uk")
    .join("kitchens as k", "k.id", "uk.kitchen_id")
    .where("uk.company_id", companyId)
    .whereIn("uk.user_id", users.map((u) => u.id))
    .orderBy("k.code")
    .select<{ user_id: string; id: string; code: string; name: string }[]>("uk.user_id", "k.id", "k.code", "k.name");
  return users.map((u) => ({
    id: u.id,
    email: u.email,
    name: u.name,
    role: u.role,
    timeZone: u.time_zone,
    disabled: u.disabled_at !== null,
    kitchens: links.filter((l) => l.user_id === u.id).map(kitchenRef),
    createdAt: u.created_at.toISOString(),
  }));
}

/** Kitchens must belong to the company; any other id is reported as a bad field, never revealed. */
export async function assertCompanyKitchens(trx: Knex | Knex.Transaction, companyId: string, kitchenIds: readonly string[], field = "kitchenIds") {
  if (kitchenIds.length === 0) return;
  const found = await trx("kitchens").where({ company_id: companyId }).whereIn("id", kitchenIds).pluck<string[]>("id");
  const missing = kitchenIds.findIndex((id) => !found.includes(id));
  if (missing >= 0) throw validation({ [`${field}.${missing}`]: ["No such kitchen in your company."] });
}

export async function updateUser(actor: CurrentUser, id: string, input: z.infer<typeof userUpdateInput>): Promise<UserSummary> {
  assertCan(actor, "users.manage");
  await db().transaction(async (trx) => {
    const row: UserRow | undefined = await trx("app_users").where({ company_id: actor.companyId, id }).forUpdate().first();
    if (!row) throw notFound("User");
    const nextRole = input.role ?? row.role;
    if (id === actor.id && (nextRole !== "admin" || input.disabled)) {
      throw conflict("You cannot remove your own admin role or disable yourself; ask another admin.");
    }
    if (row.role === "admin" && (nextRole !== "admin" || input.disabled)) {
      const admins = await trx("app_users").where({ company_id: actor.companyId, role: "admin" }).whereNull("disabled_at").count<{ count: string }[]>("* as count");
      if (Number(admins[0]!.count) <= 1) throw conflict("A company needs at least one active admin.");
    }
    const patch: Partial<UserRow> = {};
    if (input.name !== undefined) patch.name = input.name;
    if (input.role !== undefined) patch.role = input.role;
    if (input.disabled !== undefined) patch.disabled_at = input.disabled ? (row.disabled_at ?? new Date()) : null;
    if (Object.keys(patch).length) await trx("app_users").where({ id }).update(patch);
    if (input.kitchenIds !== undefined) {
      await assertCompanyKitchens(trx, actor.companyId, input.kitchenIds);
      await trx("user_kitchens").where({ user_id: id }).delete();
      if (input.kitchenIds.length) {
        await trx("user_kitchens").insert(input.kitchenIds.map((kitchen_id) => ({ company_id: actor.companyId, user_id: id, kitchen_id })));
      }
    }
    if (nextRole === "kitchen_lead") {
      const n = await trx("user_kitchens").where({ user_id: id }).count<{ count: string }[]>("* as count");
      if (Number(n[0]!.count) === 0) throw validation({ kitchenIds: ["A kitchen lead needs at least one kitchen."] });
    }
    if (input.disabled) await trx("user_sessions").where({ user_id: id }).delete();
  });
  return getUser(actor, id);
}

export async function updateProfile(actor: CurrentUser, input: z.infer<typeof profileUpdateInput>): Promise<void> {
  await db()("app_users").where({ company_id: actor.companyId, id: actor.id }).update({
    name: input.name,
    time_zone: input.timeZone,
    unit_system: input.unitSystem,
  });
}

