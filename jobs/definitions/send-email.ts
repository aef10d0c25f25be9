// Sends one outbox e-mail. Idempotent: the row is locked while it is sent and marked sent in the
// same transaction, so a second run (a retry, a duplicate job, a second worker) does nothing.
import type { Knex } from "knex";
import type { Transporter } from "nodemailer";
import { UnrecoverableError } from "bullmq";
import { z } from "zod";
import type { OutboxAttachmentRow, OutboxEmailRow } from "../../db/types";

export const sendEmailPayload = z.object({ outboxId: z.uuid() });
export const COMPANY_HEADER = "X-HankLot-Company";

export async function sendOutboxEmail(
  knex: Knex,
  transport: Transporter,
  from: string,
  payload: unknown,
): Promise<"sent" | "already-done"> {
  const parsed = sendEmailPayload.safeParse(payload);
  if (!parsed.success) throw new UnrecoverableError(`bad payload: ${parsed.error.message}`);
  const outcome = await knex.transaction(async (trx) => {
    const row: OutboxEmailRow | undefined = await trx("outbox_emails").where({ id: parsed.data.outboxId }).forUpdate().skipLocked().first();
    if (!row || row.status !== "pending") return "already-done" as const;
    const attachments: OutboxAttachmentRow[] = await trx("outbox_email_attachments").where({ outbox_email_id: row.id }).orderBy("position");
    try {
      await transport.sendMail({
        from,
        to: row.to_addresses,
        subject: row.subject,
        text: row.text_body,
        ...(row.html_body ? { html: row.html_body } : {}),
        ...(attachments.length ? { attachments: attachments.map((a) => ({ filename: a.filename, contentType: a.content_type, content: a.content })) } : {}),
        headers: row.company_id ? { [COMPANY_HEADER]: row.company_id } : {},
      });
    } catch (e) {
      // the failed attempt is recorded and committed in this transaction (it holds the row lock, so
      // another connection could not write the row until it ends), then rethrown for a retry
      await trx("outbox_emails").where({ id: row.id }).update({ attempts: row.attempts + 1, last_error: String((e as Error).message).slice(0, 500) });
      return { failed: e };
    }
    await trx("outbox_emails").where({ id: row.id }).update({ status: "sent", sent_at: trx.fn.now(), attempts: row.attempts + 1, last_error: null });
    return "sent" as const;
  });
  if (typeof outcome === "object") throw outcome.failed;
  return outcome;
}

/** After the last retry: the row is marked failed so the sweep stops offering it. */
export async function markOutboxEmailFailed(knex: Knex, outboxId: string, error: string): Promise<void> {
  await knex("outbox_emails").where({ id: outboxId, status: "pending" }).update({ status: "failed", last_error: error.slice(0, 500) });
}

/** Ids of pending e-mails older than `olderThanMs`, for the worker's sweep. */
export async function pendingOutboxIds(knex: Knex, olderThanMs: number, limit = 500): Promise<string[]> {
  return knex("outbox_emails")
    .where({ status: "pending" })
    .where("created_at", "<", knex.raw(`now() - (? * interval '1 millisecond')`, [olderThanMs]))
    .orderBy("created_at")
    .limit(limit)
    .pluck("id");
}
