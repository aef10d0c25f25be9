// The worker killed (SIGKILL) in the middle of sending alert e-mail, while the SMTP catcher holds
// its reply (SMTP_DELAY_MS), then started again: every alert reaches every recipient, none twice.
// Then Redis loses everything (as a restart without persistence does): the worker sets its
// schedules up again (WORKER_SYNC_MS) and the scan it missed runs.
//
// This test runs its own world so the suite's worker cannot help: a database of its own (migrated
// here), a Redis database index of its own, its own catcher and its own worker process, with short
// lock and stalled-check intervals (WORKER_LOCK_MS, WORKER_STALLED_MS). The catcher stores a message
// only if its sender is still connected when the reply goes out, as a real server accepts it only then.
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { mkdtempSync, readdirSync, readFileSync, rmSync } from "node:fs";
import { createServer } from "node:net";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { addDays, formatISO } from "date-fns";
import pg from "pg";
import { Queue } from "bullmq";
import { Redis } from "ioredis";
import { afterAll, beforeAll, expect, it } from "vitest";

const SMTP_DELAY_MS = 2500;
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const baseUrl = new URL(process.env.DATABASE_URL!);
const dbName = `hl_test_kill_${Date.now().toString(36)}`;
const superUrl = (name: string) => { const u = new URL(baseUrl); u.username = "postgres"; u.password = ""; u.pathname = `/${name}`; return u.toString(); };
const appUrl = (() => { const u = new URL(baseUrl); u.pathname = `/${dbName}`; return u.toString(); })();
const redisUrl = `${process.env.REDIS_URL!.replace(/\/\d+$/, "")}/7`;
const mailDir = mkdtempSync(join(tmpdir(), "hl-kill-mail-"));
let smtpPort = 0;
let catcher: ChildProcess | undefined;
let worker: ChildProcess | undefined;
const logs: string[] = [];

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer().listen(0, "127.0.0.1", () => {
      const port = (s.address() as { port: number }).port;
      s.close(() => resolve(port));
    }).on("error", reject);
  });
}

function start(script: string, extra: Record<string, string>): ChildProcess {
  const child = spawn(process.execPath, ["--import", "tsx", script], {
    env: { ...process.env, DATABASE_URL: appUrl, REDIS_URL: redisUrl, SMTP_HOST: "127.0.0.1", SMTP_PORT: String(smtpPort), MAIL_DIR: mailDir, ...extra },
    stdio: ["ignore", "pipe", "pipe"],
  });
  child.stdout!.on("data", (d) => logs.push(`${script}: ${d}`));
  child.stderr!.on("data", (d) => logs.push(`${script} (err): ${d}`));
  return child;
}

async function waitFor<T>(what: string, probe: () => Promise<T | undefined | false>, timeoutMs = 20_000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const v = await probe();
    if (v) return v;
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}\n${logs.join("").slice(-3000)}`);
    await sleep(100);
  }
}

const startWorker = () =>
  start("jobs/worker.ts", { OUTBOX_SWEEP_MS: "500", WORKER_LOCK_MS: "3000", WORKER_STALLED_MS: "1000", WORKER_SYNC_MS: "1000", APP_URL: "http://app.test" });
const stored = () =>
  readdirSync(mailDir).filter((f) => f.endsWith(".json") && !f.startsWith(".")).map((f) => JSON.parse(readFileSync(join(mailDir, f), "utf8")) as { to: string[]; text: string; subject: string });

beforeAll(async () => {
  const admin = new pg.Client({ connectionString: superUrl("postgres") });
  await admin.connect();
  await admin.query(`create database "${dbName}" owner "${baseUrl.username}"`);
  await admin.end();
  const migrated = spawnSync(process.execPath, ["--import", "tsx", "node_modules/knex/bin/cli.js", "--knexfile", "knexfile.ts", "migrate:latest"], {
    env: { ...process.env, DATABASE_URL: appUrl }, encoding: "utf8",
  });
  if (migrated.status !== 0) throw new Error(`migrations failed: ${migrated.stderr}`);
  // from here this file's own db() and factories use the new database (db/client reads it on first use)
  process.env.DATABASE_URL = appUrl;
  process.env.REDIS_URL = redisUrl;
  smtpPort = await freePort();
  catcher = start("fakes/smtp-catcher.ts", { SMTP_DELAY_MS: String(SMTP_DELAY_MS) });
  await waitFor("the catcher", async () => logs.some((l) => l.includes("smtp catcher on")));
}, 60_000);

afterAll(async () => {
  for (const p of [worker, catcher]) p?.kill("SIGKILL");
  const { closeDb } = await import("../../db/client");
  await closeDb();
  const admin = new pg.Client({ connectionString: superUrl("postgres") });
  await admin.connect();
  await admin.query(`drop database if exists "${dbName}" with (force)`);
  await admin.end();
  rmSync(mailDir, { recursive: true, force: true });
});

let companyId = "";
let managerEmail = "";

it("a worker killed mid-send and started again delivers every alert to every recipient, none twice", async () => {
  const { db } = await import("../../db/client");
  const { createCompany, createUser, tag } = await import("../support/factory");
  const { createItem } = await import("../support/stock");
  const { currentUser } = await import("../support/sessions");
  const { postMovement } = await import("../../lib/data/ledger");
  const { enqueueScanNow } = await import("../../jobs/definitions/scans");
  const { EXPIRY_SCAN_JOB } = await import("../../jobs/definitions/expiry-scan");
  const { MAIL_QUEUE, SCANS_QUEUE } = await import("../../jobs/queues");

  const co = await createCompany({ kitchens: 2 });
  companyId = co.company.id;
  managerEmail = co.users.manager.email;
  const lead2 = await createUser(co.company.id, "kitchen_lead", { kitchenIds: [co.kitchens[1]!.id] });
  // four cure lots: kitchen 1 at 5 and 20 days, kitchen 2 at 40 and 3 days (60/30/7 windows)
  const manager = await currentUser(co.users.manager.id);
  for (const [k, days] of [[0, 5], [0, 20], [1, 40], [1, 3]] as const) {
    const item = await createItem(co.company.id, { category: "cure", trackLots: true, trackDates: true });
    await postMovement(manager, {
      kind: "receipt", kitchen: co.kitchens[k]!.code, item: item.sku, quantity: "250", unit: "g",
      lot: { code: `K-${tag()}`, date: formatISO(addDays(new Date(), days), { representation: "date" }), dateKind: "use_by", unitCost: "0.02" },
    } as never);
  }
  await db()("app_users").where({ company_id: co.company.id }).update({ alert_email: "immediate" });

  worker = startWorker();
  await waitFor("the worker", async () => logs.some((l) => l.includes("[worker] running")));
  const queue = new Queue(SCANS_QUEUE, { connection: new Redis(redisUrl, { maxRetriesPerRequest: null }) });
  await enqueueScanNow(queue, EXPIRY_SCAN_JOB, co.company.id);

  // the scan stores the alerts and the delivery writes one outbox e-mail per recipient
  // the most urgent warning of each: kitchen 1: 5 days (7) + 20 days (30); kitchen 2: 40 days (60) + 3 days (7)
  const alerts: { id: string; kitchen_id: string; title: string }[] = await waitFor("alerts", async () => {
    const rows = await db()("alerts").where({ company_id: co.company.id });
    return rows.length === 4 && rows;
  });
  const recipients = [co.users.admin, co.users.manager, co.users.buyer, co.users.kitchen_lead, lead2];
  const seen = (u: (typeof recipients)[number]) => alerts.filter((a) => u.role !== "kitchen_lead" || u.kitchenIds.includes(a.kitchen_id));
  // the e-mail names each lot once (its alerts share a title): one line per distinct title
  const expected = new Map(recipients.map((u) => [u.email, [...new Set(seen(u).map((a) => a.title))].sort()]));
  const expectedDeliveries = recipients.reduce((n, u) => n + seen(u).length, 0);
  await waitFor("the outbox rows", async () => (await db()("outbox_emails").where({ company_id: co.company.id })).length === recipients.length);
  // the sends are under way (mail jobs active, the catcher holding every reply for SMTP_DELAY_MS)
  const mailQueue = new Queue(MAIL_QUEUE, { connection: new Redis(redisUrl, { maxRetriesPerRequest: null }) });
  await waitFor("sends under way", async () => (await mailQueue.getActiveCount()) >= 4);
  await sleep(300);
  expect(stored()).toHaveLength(0);
  worker.kill("SIGKILL");
  await new Promise((r) => worker!.once("exit", r));
  await sleep(SMTP_DELAY_MS + 500);
  // nothing was accepted, and nothing is lost: the rows are still waiting
  expect(stored()).toHaveLength(0);
  expect((await db()("outbox_emails").where({ company_id: co.company.id, status: "pending" })).length).toBe(recipients.length);

  worker = startWorker();
  await waitFor("every e-mail", async () => stored().length >= recipients.length, 30_000);
  await sleep(3000); // a sweep, a stalled check and a retry later: still no second copy
  const mails = stored();
  expect(mails.map((m) => m.to[0]).sort()).toEqual([...expected.keys()].sort());
  for (const m of mails) {
    const titles = expected.get(m.to[0]!)!;
    expect(titles.length).toBeGreaterThan(0);
    for (const t of titles) expect(m.text).toContain(t);
    expect(m.subject).toBe(`${co.company.name}: ${titles.length} new ${titles.length === 1 ? "alert" : "alerts"}`);
  }
  expect((await db()("alert_deliveries").whereIn("alert_id", alerts.map((a) => a.id))).length).toBe(expectedDeliveries);
  expect((await db()("outbox_emails").where({ company_id: co.company.id, status: "sent" })).length).toBe(recipients.length);
  await Promise.all([queue.close(), mailQueue.close()]);
}, 90_000);

it("a Redis that comes back empty: the worker sets its schedules up again and runs the scans it missed", async () => {
  const { db } = await import("../../db/client");
  const { createItem } = await import("../support/stock");
  const { tag } = await import("../support/factory");
  const { currentUser } = await import("../support/sessions");
  const { postMovement } = await import("../../lib/data/ledger");
  const { EXPIRY_SCAN_JOB } = await import("../../jobs/definitions/expiry-scan");
  const { SCANS_QUEUE, DIGESTS_QUEUE } = await import("../../jobs/queues");
  expect(worker?.exitCode).toBeNull(); // the restarted worker of the test above is running

  // the last expiry scan two days ago, and a new lot it has not seen
  await db()("job_runs").where({ company_id: companyId, job: EXPIRY_SCAN_JOB }).update({ last_run_at: new Date(Date.now() - 2 * 24 * 3600_000) });
  const manager = (await db()("app_users").where({ company_id: companyId, role: "manager" }).first()) as { id: string };
  const item = await createItem(companyId, { category: "cure", trackLots: true, trackDates: true });
  const kitchen = (await db()("kitchens").where({ company_id: companyId }).orderBy("code").first()) as { code: string };
  const lot = `R-${tag()}`;
  await postMovement(await currentUser(manager.id), {
    kind: "receipt", kitchen: kitchen.code, item: item.sku, quantity: "80", unit: "g",
    lot: { code: lot, date: formatISO(addDays(new Date(), 50), { representation: "date" }), dateKind: "use_by", unitCost: "0.02" },
  } as never);

  const redis = new Redis(redisUrl);
  await redis.flushdb(); // what a restarted Redis without persistence holds: nothing
  const scans = new Queue(SCANS_QUEUE, { connection: new Redis(redisUrl, { maxRetriesPerRequest: null }) });
  const digests = new Queue(DIGESTS_QUEUE, { connection: new Redis(redisUrl, { maxRetriesPerRequest: null }) });
  expect(await scans.getJobScheduler(`${EXPIRY_SCAN_JOB}:${companyId}`)).toBeUndefined();

  await waitFor("the schedules", async () => (await scans.getJobScheduler(`${EXPIRY_SCAN_JOB}:${companyId}`)) && (await digests.getJobScheduler("digest-tick")));
  await waitFor("the missed scan", async () => {
    const run = await db()("job_runs").where({ company_id: companyId, job: EXPIRY_SCAN_JOB }).first();
    return run && Date.now() - new Date(run.last_run_at).getTime() < 60_000;
  });
  const alert = await waitFor("the new lot's alert", async () => db()("alerts").where({ company_id: companyId }).whereRaw("data->>'lotCode' = ?", [lot]).first());
  expect(alert.threshold_days).toBe(60);
  // and the people who want alerts at once get it
  await waitFor("its e-mail", async () => stored().some((m) => m.to[0] === managerEmail && m.text.includes(lot)), 20_000);
  await Promise.all([redis.quit(), scans.close(), digests.close()]);
}, 60_000);
