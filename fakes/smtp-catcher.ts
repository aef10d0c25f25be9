// Local SMTP catcher: the mail fake for `npm start` and the tests. Stores each accepted message as
// JSON in MAIL_DIR; the admin's captured-mail page and the tests read them from there.
// env: MAIL_DIR (.mail), SMTP_PORT (2526), SMTP_DELAY_MS (0: delays the reply, for tests that kill
// a sender mid-send; a message is stored only if its sender is still connected when the reply goes
// out, which is exactly when a real server would have accepted it).
import { SMTPServer } from "smtp-server";
import { simpleParser } from "mailparser";
import { mkdirSync, renameSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { createHash, randomUUID } from "node:crypto";

export const COMPANY_HEADER = "x-hanklot-company";

const dir = process.env.MAIL_DIR ?? join(process.cwd(), ".mail");
const port = Number(process.env.SMTP_PORT ?? 2526);
const delayMs = Number(process.env.SMTP_DELAY_MS ?? 0);
const closed = new Set<string>();
mkdirSync(dir, { recursive: true });

const server = new SMTPServer({
  authOptional: true,
  disabledCommands: ["STARTTLS"],
  logger: false,
  size: 10 * 1024 * 1024,
  onClose(session) {
    closed.add(session.id);
  },
  onData(stream, session, callback) {
    simpleParser(stream).then(async (m) => {
      if (delayMs) await new Promise((r) => setTimeout(r, delayMs));
      if (closed.has(session.id)) return callback(new Error("sender went away"));
      const name = `${Date.now()}-${randomUUID()}.json`;
      const company = m.headers.get(COMPANY_HEADER);
      // attachments beside the message: <name>.files/<n>-<filename>, listed with their size and sha256
      const files = m.attachments.map((a, i) => {
        const folder = `${name.replace(/\.json$/, "")}.files`;
        mkdirSync(join(dir, folder), { recursive: true });
        const file = join(folder, `${i + 1}-${(a.filename ?? "attachment").replace(/[^\w.-]+/g, "_")}`);
        writeFileSync(join(dir, file), a.content);
        return { filename: a.filename ?? null, contentType: a.contentType, size: a.content.length, sha256: createHash("sha256").update(a.content).digest("hex"), file };
      });
      // write then rename, so a reader never sees half a file
      writeFileSync(join(dir, `.${name}.tmp`), JSON.stringify({
        from: m.from?.text,
        to: session.envelope.rcptTo.map((r) => r.address),
        subject: m.subject,
        text: m.text,
        html: m.html || null,
        attachments: files,
        companyId: typeof company === "string" ? company : null,
        receivedAt: new Date().toISOString(),
      }, null, 2));
      renameSync(join(dir, `.${name}.tmp`), join(dir, name));
      callback();
    }, callback);
  },
});
server.listen(port, "127.0.0.1", () => console.log(`smtp catcher on 127.0.0.1:${port} -> ${dir}`));
for (const signal of ["SIGTERM", "SIGINT"] as const) process.on(signal, () => server.close(() => process.exit(0)));
