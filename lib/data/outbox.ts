import "server-only";
import { enqueueOutboxEmails, mailQueue } from "../../jobs/queues";

export { addToOutbox, type OutgoingAttachment, type OutgoingEmail } from "../mail/outbox";

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
