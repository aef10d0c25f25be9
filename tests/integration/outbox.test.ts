import nodemailer from "nodemailer";
import { UnrecoverableError } from "bullmq";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { db } from "../../db/client";
import type { OutboxEmailRow } from "../../db/types";
import { COMPANY_HEADER, pendingOutboxIds, sendOutboxEmail } from "../../jobs/definitions/send-email";
import { createCompany, tag, uniqueEmail, type TestCompany } from "../support/factory";
import { listMail, waitForMail } from "../support/mail";
import { addToOutbox } from "../../lib/data/outbox";
import { createHash } from "node:crypto";
import { readFile } from "node:fs/promises";
import { join } from "node:path";

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const FROM = "Hank & Lot <no-reply@hankandlot.test>";

let co: TestCompany;
// the real catcher started by db/test.sh, the way the worker reaches it
const transport = nodemailer.createTransport({ host: process.env.SMTP_HOST ?? "127.0.0.1", port: Number(process.env.SMTP_PORT), secure: false, ignoreTLS: true });
beforeAll(async () => {
  co = await createCompany({ kitchens: 0 });
});
afterAll(() => transport.close());

/**
 * Writes an outbox row without enqueuing it. `hiddenFromSweep` dates it an hour ahead: the worker's
 * sweep only offers rows older than 2 s, so such a row is ours alone to send.
 */
async function outboxRow(opts: { hiddenFromSweep?: boolean } = {}) {
  const to = uniqueEmail("outbox");
  const subject = `Outbox check ${tag()}`;
  const [row] = await db()("outbox_emails")
    .insert({
      company_id: co.company.id, to_addresses: [to], subject, text_body: `Hello ${to}`, html_body: `<p>Hello</p>`,
      ...(opts.hiddenFromSweep ? { created_at: db().raw("now() + interval '1 hour'") } : {}),
    })
    .returning<{ id: string }[]>("id");
  return { id: row!.id, to, subject };
}
const rowOf = (id: string): Promise<OutboxEmailRow> => db()("outbox_emails").where({ id }).first();

describe("the worker's outbox sweep", () => {
  it("sends an e-mail that was written but never enqueued, exactly once", async () => {
    const m = await outboxRow();
    // the worker sweeps every OUTBOX_SWEEP_MS (1 s under db/test.sh) for rows older than 2 s
    const mail = await waitForMail({ to: m.to, subjectIncludes: m.subject, timeoutMs: 15_000 });
    expect(mail.text.trim()).toBe(`Hello ${m.to}`);
    expect(mail.companyId).toBe(co.company.id);

    // more sweeps go by: still one message, and the row says sent
    await sleep(3000);
    expect(await listMail({ to: m.to, subjectIncludes: m.subject })).toHaveLength(1);
    const row = await rowOf(m.id);
    expect(row.status).toBe("sent");
    expect(row.sent_at).toBeInstanceOf(Date);
    expect(row.attempts).toBe(1);
    expect(row.last_error).toBeNull();
  });
});

describe("sendOutboxEmail", () => {
  it("run twice for the same id, sends once and marks the row sent", async () => {
    const m = await outboxRow({ hiddenFromSweep: true });
    const send = vi.spyOn(transport, "sendMail");
    try {
      expect(await sendOutboxEmail(db(), transport, FROM, { outboxId: m.id })).toBe("sent");
      expect(await sendOutboxEmail(db(), transport, FROM, { outboxId: m.id })).toBe("already-done");
      expect(send).toHaveBeenCalledTimes(1);
      expect(send.mock.calls[0]![0]).toMatchObject({ to: [m.to], subject: m.subject, headers: { [COMPANY_HEADER]: co.company.id } });
    } finally {
      send.mockRestore();
    }
    const row = await rowOf(m.id);
    expect(row).toMatchObject({ status: "sent", attempts: 1 });
    expect(row.sent_at).toBeInstanceOf(Date);
    const caught = await waitForMail({ to: m.to, subjectIncludes: m.subject });
    expect(caught.companyId).toBe(co.company.id);
    expect(await listMail({ to: m.to })).toHaveLength(1);
  });

  it("run twice at the same time, sends once (the row lock skips the second)", async () => {
    const m = await outboxRow({ hiddenFromSweep: true });
    const results = await Promise.all([
      sendOutboxEmail(db(), transport, FROM, { outboxId: m.id }),
      sendOutboxEmail(db(), transport, FROM, { outboxId: m.id }),
    ]);
    expect(results.sort()).toEqual(["already-done", "sent"]);
    await waitForMail({ to: m.to, subjectIncludes: m.subject });
    await sleep(300); // a second message, if any, would be stored by now
    expect(await listMail({ to: m.to })).toHaveLength(1);
  });

  it("counts a failed attempt, keeps the row pending and rethrows, so BullMQ retries", async () => {
    const m = await outboxRow({ hiddenFromSweep: true });
    const failing = nodemailer.createTransport({ jsonTransport: true });
    vi.spyOn(failing, "sendMail").mockRejectedValue(new Error("452 mailbox full"));
    await expect(sendOutboxEmail(db(), failing, FROM, { outboxId: m.id })).rejects.toThrow("452 mailbox full");
    expect(await rowOf(m.id)).toMatchObject({ status: "pending", attempts: 1, last_error: "452 mailbox full" });
    // the retry goes through
    const json = nodemailer.createTransport({ jsonTransport: true });
    expect(await sendOutboxEmail(db(), json, FROM, { outboxId: m.id })).toBe("sent");
    expect(await rowOf(m.id)).toMatchObject({ status: "sent", attempts: 2, last_error: null });
  });

  it("refuses a bad payload as unrecoverable", async () => {
    await expect(sendOutboxEmail(db(), transport, FROM, { outboxId: "nope" })).rejects.toBeInstanceOf(UnrecoverableError);
    await expect(sendOutboxEmail(db(), transport, FROM, {})).rejects.toBeInstanceOf(UnrecoverableError);
  });

  it("an unknown id is already done", async () => {
    expect(await sendOutboxEmail(db(), transport, FROM, { outboxId: crypto.randomUUID() })).toBe("already-done");
  });
});

describe("attachments", () => {
  it("are written with the e-mail and arrive at the catcher byte for byte, in order", async () => {
    const to = uniqueEmail("attach");
    const subject = `Order with files ${tag()}`;
    const pdf = Uint8Array.from([0x25, 0x50, 0x44, 0x46, 0x2d, 0x31, 0x2e, 0x37, 0x0a, 0x00, 0xff, 0x80]); // "%PDF-1.7\n" and bytes that are not text
    const csv = new TextEncoder().encode("order_number,line\r\nPO-1,1\r\n");
    const id = await db().transaction(async (trx) => {
      const id = await addToOutbox(trx, { companyId: co.company.id, to: [to], subject, text: "Attached.", attachments: [
        { filename: "PO-1.pdf", contentType: "application/pdf", content: pdf },
        { filename: "PO-1.csv", contentType: "text/csv", content: csv },
      ] });
      await trx("outbox_emails").where({ id }).update({ created_at: trx.raw("now() + interval '1 hour'") }); // ours to send, not the sweep's
      return id;
    });
    expect(await sendOutboxEmail(db(), transport, FROM, { outboxId: id })).toBe("sent");
    const mail = await waitForMail({ to, subjectIncludes: subject });
    expect(mail.attachments.map((a) => [a.filename, a.contentType, a.size])).toEqual([["PO-1.pdf", "application/pdf", pdf.length], ["PO-1.csv", "text/csv", csv.length]]);
    const sha = (b: Uint8Array) => createHash("sha256").update(b).digest("hex");
    expect(mail.attachments[0]!.sha256).toBe(sha(pdf));
    expect(Buffer.from(await readFile(join(process.env.MAIL_DIR!, mail.attachments[0]!.file))).equals(Buffer.from(pdf))).toBe(true);
    expect(mail.attachments[1]!.sha256).toBe(sha(csv));
  });
});

describe("pendingOutboxIds", () => {
  it("offers pending rows older than the given age, not fresh or sent ones", async () => {
    const old = await outboxRow({ hiddenFromSweep: true });
    await db()("outbox_emails").where({ id: old.id }).update({ created_at: db().raw("now() - interval '1 minute'"), status: "failed" });
    const fresh = await outboxRow({ hiddenFromSweep: true });
    const ids = await pendingOutboxIds(db(), 2000, 100_000);
    expect(ids).not.toContain(old.id); // failed rows are never offered again
    expect(ids).not.toContain(fresh.id); // not yet old enough
    // with the age bound moved two hours ahead, the same row qualifies (and stays hidden from the worker)
    const later = await pendingOutboxIds(db(), -2 * 3600_000, 100_000);
    expect(later).toContain(fresh.id);
    expect(later).not.toContain(old.id);
  });
});
