// Writing an e-mail to the outbox, in the caller's transaction. No server-only guard: the web app
// (lib/data/outbox.ts) and the worker (jobs/definitions/deliver-alerts.ts) both write here.
import type { Knex } from "knex";

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

/** Writes the e-mail in the caller's transaction; returns its id, to be queued after commit. */
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
