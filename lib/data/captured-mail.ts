import "server-only";
import { readdir, readFile } from "node:fs/promises";
import { join } from "node:path";
import { db } from "../../db/client";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import { env } from "../env";
import { notFound } from "../http/errors";

export interface CapturedMail {
  id: string;
  to: string[];
  subject: string;
  receivedAt: string;
  text: string;
}

interface StoredMessage {
  to: string[];
  subject?: string;
  text?: string;
  receivedAt: string;
  companyId?: string | null;
}

/** True while e-mail goes to the local catcher (fakes/smtp-catcher.ts), not to a real server. */
export function mailFakeInUse(): boolean {
  return Boolean(env().MAIL_DIR);
}

/**
 * The catcher's messages that belong to the admin's company: stamped with its id when sent AND
 * addressed only to its users and invitees. Another company's invitation or reset never shows.
 */
export async function listCapturedMail(actor: CurrentUser, limit = 200): Promise<CapturedMail[]> {
  assertCan(actor, "mail.readCaptured");
  const dir = env().MAIL_DIR;
  if (!dir) throw notFound("Captured mail (the local mail catcher is not in use)");
  const [users, invitees] = await Promise.all([
    db()("app_users").where({ company_id: actor.companyId }).pluck<string[]>("email"),
    db()("invitations").where({ company_id: actor.companyId }).pluck<string[]>("email"),
  ]);
  const ours = new Set([...users, ...invitees]);
  const files = (await readdir(dir).catch(() => [] as string[])).filter((f) => f.endsWith(".json")).sort().reverse();
  const out: CapturedMail[] = [];
  for (const file of files) {
    if (out.length >= limit) break;
    const m = JSON.parse(await readFile(join(dir, file), "utf8")) as StoredMessage;
    const to = m.to.map((a) => a.toLowerCase());
    if (m.companyId !== actor.companyId || to.length === 0 || !to.every((a) => ours.has(a))) continue;
    out.push({ id: file.replace(/\.json$/, ""), to, subject: m.subject ?? "", receivedAt: m.receivedAt, text: m.text ?? "" });
  }
  return out;
}
