import "server-only";
import type { Knex } from "knex";
import { enqueueOutboxEmails, mailQueue } from "../../jobs/queues";

export interface OutgoingEmail {
  companyId: string | null;
  to: string[];
  subject: string;
  text: string;
  html?: string;
  attachments?: OutgoingAttachment[];
}

export interface OutgoingAttachment {
  filename: string;
  contentType: string;
  content: Uint8Array;
}

/** Writes the e-mail in the caller's transaction; returns its id for dispatchOutbox after commit. */
export async function addToOutbox(trx: Knex.Transaction, mail: OutgoingEmail): Promise<string> {
  const [row] = await trx("outbox_emails")
    .insert({ company_id: mail.companyId, to_addresses: mail.to, subject: mail.subject, text_body: mail.text, html_body: mail.html ?? null })
    .returning<{ id: string }[]>("id");
  if (mail.attachments?.length) {
    await trx("outbox_email_attachments").insert(
      mail.attachments.map((a, position) => ({ outbox_email_id: row!.id, position, filename: a.filename, content_type: a.contentType, content: Buffer.from(a.content) })),
    );
  }
  return row!.id;
}

/**
 * After commit: hand the e-mails to the queue without waiting on it. If Redis is down the rows stay
 * pending and the worker's sweep picks them up, so nothing here may fail the request.
 */
export function dispatchOutbox(ids: readonly string[]): void {
  const timeout = new Promise<void>((resolve) => setTimeout(resolve, 2000).unref());
  void Promise.race([enqueueOutboxEmails(mailQueue(), ids), timeout]).catch((e: unknown) => {
    console.warn(`[outbox] could not enqueue ${ids.length} e-mail(s) now; the worker will sweep them:`, (e as Error).message);
  });
}
