// Reads what the real SMTP catcher (fakes/smtp-catcher.ts) stored: one JSON file per message in
// MAIL_DIR, written by the real worker sending the outbox. Tests never ask the app "is this a test".
// env: MAIL_DIR (set by db/test.sh)
import { readdir, readFile } from "node:fs/promises";
import { join } from "node:path";

export interface CaughtMail {
  file: string;
  from?: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
  companyId: string | null;
  receivedAt: string;
  /** files sent with the message; `file` is relative to MAIL_DIR */
  attachments: { filename: string | null; contentType: string; size: number; sha256: string; file: string }[];
}

export interface MailFilter {
  to?: string;
  subjectIncludes?: string;
  /** Only messages received at or after this instant. */
  after?: Date;
}

function mailDir(): string {
  const dir = process.env.MAIL_DIR;
  if (!dir) throw new Error("MAIL_DIR is not set: run the tests through db/test.sh");
  return dir;
}

/** Every stored message matching the filter, oldest first. */
export async function listMail(filter: MailFilter = {}): Promise<CaughtMail[]> {
  const dir = mailDir();
  // the catcher writes ".<name>.tmp" then renames, so finished messages are the visible *.json
  const files = (await readdir(dir).catch(() => [] as string[])).filter((f) => f.endsWith(".json") && !f.startsWith(".")).sort();
  const out: CaughtMail[] = [];
  for (const file of files) {
    const m = JSON.parse(await readFile(join(dir, file), "utf8")) as Omit<CaughtMail, "file">;
    const to = m.to.map((a) => a.toLowerCase());
    if (filter.to && !to.includes(filter.to.toLowerCase())) continue;
    if (filter.subjectIncludes && !(m.subject ?? "").includes(filter.subjectIncludes)) continue;
    if (filter.after && new Date(m.receivedAt) < filter.after) continue;
    out.push({ ...m, file, to, subject: m.subject ?? "", text: m.text ?? "" });
  }
  return out;
}

/** Polls MAIL_DIR until at least `count` matching messages are stored; throws after timeoutMs. */
export async function waitForMails(filter: MailFilter & { count: number; timeoutMs?: number }): Promise<CaughtMail[]> {
  const timeoutMs = filter.timeoutMs ?? 10_000;
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const found = await listMail(filter);
    if (found.length >= filter.count) return found;
    if (Date.now() > deadline) throw new Error(`${found.length} of ${filter.count} mails matching ${JSON.stringify(filter)} within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** Polls MAIL_DIR until a matching message arrives; throws after timeoutMs. */
export async function waitForMail(filter: MailFilter & { timeoutMs?: number }): Promise<CaughtMail> {
  return (await waitForMails({ ...filter, count: 1 }))[0]!;
}

/** The first absolute URL in the text whose path starts with pathPrefix (e.g. "/invitation/"). */
export function extractLink(text: string, pathPrefix: string): string {
  for (const m of text.matchAll(/https?:\/\/[^\s<>"']+/g)) {
    if (new URL(m[0]).pathname.startsWith(pathPrefix)) return m[0];
  }
  throw new Error(`No link to ${pathPrefix} in:\n${text}`);
}

/** The last path segment of a link: the token of an invitation or reset link. */
export const tokenOf = (link: string) => new URL(link).pathname.split("/").pop()!;
