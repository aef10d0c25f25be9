// Alert e-mail: who receives which alerts (role, kitchen, preference), when (immediate, digest
// hour, run now), and never twice (the send record per alert and recipient). Real PostgreSQL; the
// worker and SMTP catcher started by db/test.sh for the end-to-end cases, read back from the catcher.
import { Queue } from "bullmq";
import { Redis } from "ioredis";
import { addDays, formatISO } from "date-fns";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as getPrefs, PUT as putPrefs } from "../../app/api/me/preferences/route";
import { db } from "../../db/client";
import { deliverAlerts, deliverPayload } from "../../jobs/definitions/deliver-alerts";
import { EXPIRY_SCAN_JOB, runExpiryScan } from "../../jobs/definitions/expiry-scan";
import { enqueueScanNow } from "../../jobs/definitions/scans";
import { SCANS_QUEUE } from "../../jobs/queues";
import { CURE_CAUTION } from "../../lib/cure/caution";
import { postMovement } from "../../lib/data/ledger";
import { createCompany, tag, type TestCompany } from "../support/factory";
import { call } from "../support/http";
import { listMail, waitForMails } from "../support/mail";
import { currentUser, sessionCookieFor } from "../support/sessions";
import { createItem } from "../support/stock";
import { UnrecoverableError } from "bullmq";

const APP = "http://app.test";
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function receiveLot(co: TestCompany, kitchenIndex: number, category: "cure" | "spice", daysOut: number) {
  const item = await createItem(co.company.id, { category, trackLots: true, trackDates: true });
  const [m] = await postMovement(await currentUser(co.users.manager.id), {
    kind: "receipt", kitchen: co.kitchens[kitchenIndex]!.code, item: item.sku, quantity: "100", unit: "g",
    lot: { code: `L-${tag()}`, date: formatISO(addDays(new Date(), daysOut), { representation: "date" }), dateKind: "use_by", unitCost: "0.01" },
  } as never);
  return m!.lot.id as string;
}

async function setPrefs(userId: string, p: { alert_email?: string; alert_digest_hour?: number; alert_kinds?: string[] | null; alert_last_digest_at?: Date | null }) {
  await db()("app_users").where({ id: userId }).update(p);
}

const delivered = async (userId: string) =>
  (await db()("alert_deliveries").where({ user_id: userId }).select("alert_id")).map((r: { alert_id: string }) => r.alert_id).sort();

describe("deliverAlerts", () => {
  let co: TestCompany;
  let yardAlerts: string[];
  let laneAlerts: string[];
  beforeAll(async () => {
    co = await createCompany({ kitchens: 2 });
    // everyone off while the alerts are made, so nothing else (a digest tick of the test worker) delivers them first
    await db()("app_users").where({ company_id: co.company.id }).update({ alert_email: "off" });
    await receiveLot(co, 0, "cure", 20); // cure 60/30/7: 2 alerts in kitchen 1 (two scans, below)
    await receiveLot(co, 1, "spice", 20); // spice 90/30: 2 alerts in kitchen 2
    // a scan 15 days ago (35 days left: cure 60, spice 90), then today's (20 left: 30 for both)
    await runExpiryScan(db(), { companyId: co.company.id }, new Date(Date.now() - 15 * 24 * 3600_000));
    await runExpiryScan(db(), { companyId: co.company.id });
    const rows = await db()("alerts").where({ company_id: co.company.id }).select("id", "kitchen_id");
    yardAlerts = rows.filter((r) => r.kitchen_id === co.kitchens[0]!.id).map((r) => r.id).sort();
    laneAlerts = rows.filter((r) => r.kitchen_id === co.kitchens[1]!.id).map((r) => r.id).sort();
    expect(yardAlerts).toHaveLength(2);
    expect(laneAlerts).toHaveLength(2);
  });

  it("immediate: each person gets the alerts of the kitchens they see, once; the accountant nothing", async () => {
    for (const role of ["manager", "kitchen_lead", "accountant"] as const) await setPrefs(co.users[role].id, { alert_email: "immediate" });
    const first = await deliverAlerts(db(), { companyId: co.company.id }, APP);
    expect(first).toMatchObject({ status: "done", emails: 2, alerts: 6 }); // manager 4, kitchen lead 2 (own kitchen)
    expect(await delivered(co.users.manager.id)).toEqual([...yardAlerts, ...laneAlerts].sort());
    expect(await delivered(co.users.kitchen_lead.id)).toEqual(yardAlerts);
    expect(await delivered(co.users.accountant.id)).toEqual([]);
    // the same run again, and two at once: nothing new
    expect(await deliverAlerts(db(), { companyId: co.company.id }, APP)).toMatchObject({ emails: 0, alerts: 0 });
    const both = await Promise.all([deliverAlerts(db(), { companyId: co.company.id }, APP), deliverAlerts(db(), { companyId: co.company.id }, APP)]);
    expect(both.map((b) => (b.status === "done" ? b.emails : -1))).toEqual([0, 0]);
    const outbox = await db()("outbox_emails").where({ company_id: co.company.id }).whereRaw("? = any(to_addresses)", [co.users.manager.email]);
    expect(outbox).toHaveLength(1);
    expect(outbox[0].text_body).toContain(CURE_CAUTION);
    expect(outbox[0].text_body).toContain(`${APP}/alerts`);
  });

  it("two deliveries at once for a person with new alerts make one e-mail, not two", async () => {
    await setPrefs(co.users.buyer.id, { alert_email: "immediate" });
    const both = await Promise.all([deliverAlerts(db(), { companyId: co.company.id }, APP), deliverAlerts(db(), { companyId: co.company.id }, APP)]);
    expect(both.reduce((n, b) => n + (b.status === "done" ? b.emails : 0), 0)).toBe(1);
    expect(await delivered(co.users.buyer.id)).toEqual([...yardAlerts, ...laneAlerts].sort());
  });

  it("digest: nothing before the person's hour, everything at it (in their zone), once; run-now forces it", async () => {
    const admin = co.users.admin.id;
    // the admin reads 07:00 in Chicago (CST, UTC-6: 13:00Z); last digest yesterday after the slot
    const now = new Date(`${new Date().toISOString().slice(0, 10)}T12:30:00Z`); // 06:30 in Chicago
    await db()("app_users").where({ id: admin }).update({ time_zone: "America/Chicago" });
    await setPrefs(admin, { alert_email: "digest", alert_digest_hour: 7, alert_last_digest_at: new Date(now.getTime() - 20 * 3600_000) });
    expect(await deliverAlerts(db(), { companyId: co.company.id }, APP, now)).toMatchObject({ emails: 0 });
    expect(await delivered(admin)).toEqual([]);
    const at7 = new Date(now.getTime() + 31 * 60_000); // 07:01 in Chicago
    expect(await deliverAlerts(db(), { companyId: co.company.id }, APP, at7)).toMatchObject({ emails: 1, alerts: 4 });
    expect(await deliverAlerts(db(), { companyId: co.company.id }, APP, new Date(at7.getTime() + 15 * 60_000))).toMatchObject({ emails: 0 });
    // a new alert later that day waits for tomorrow's digest, unless an admin runs the scan now
    await receiveLot(co, 0, "cure", 5); // 60/30/7, first seen 5 days out: one alert (7)
    await runExpiryScan(db(), { companyId: co.company.id });
    const later = new Date(at7.getTime() + 60 * 60_000);
    // the immediate people who see kitchen 1 get it: manager, kitchen lead, buyer
    expect(await deliverAlerts(db(), { companyId: co.company.id }, APP, later)).toMatchObject({ emails: 3, alerts: 3 });
    expect(await delivered(admin)).toHaveLength(4);
    expect(await deliverAlerts(db(), { companyId: co.company.id, force: true }, APP, later)).toMatchObject({ emails: 1, alerts: 1 });
    expect(await delivered(admin)).toHaveLength(5);
  });

  it("leaves out acknowledged, snoozed and other kinds than the person's; off means nothing", async () => {
    const p = await createCompany({ kitchens: 1 });
    await db()("app_users").where({ company_id: p.company.id }).update({ alert_email: "off" });
    await receiveLot(p, 0, "cure", 20);
    await runExpiryScan(db(), { companyId: p.company.id }, new Date(Date.now() - 15 * 24 * 3600_000)); // 35 days left: 60
    await runExpiryScan(db(), { companyId: p.company.id }); // 20 left: 30
    const [a60, a30] = await db()("alerts").where({ company_id: p.company.id }).orderBy("threshold_days", "desc").pluck("id");
    const m = p.users.manager.id;
    await db()("alert_states").insert({ alert_id: a60, user_id: m, acknowledged_at: new Date() });
    await db()("alert_states").insert({ alert_id: a30, user_id: m, snoozed_until: new Date(Date.now() + 3600_000) });
    await setPrefs(m, { alert_email: "immediate" });
    await setPrefs(p.users.buyer.id, { alert_email: "immediate", alert_kinds: ["reorder"] });
    expect(await deliverAlerts(db(), { companyId: p.company.id }, APP)).toMatchObject({ emails: 0 });
    // the snooze ends: now it goes
    expect(await deliverAlerts(db(), { companyId: p.company.id }, APP, new Date(Date.now() + 2 * 3600_000))).toMatchObject({ emails: 1, alerts: 1 });
    expect(await delivered(m)).toEqual([a30]);
  });

  it("finishes without retrying for a deleted company and refuses a bad payload", async () => {
    expect(await deliverAlerts(db(), { companyId: crypto.randomUUID() }, APP)).toEqual({ status: "company-gone" });
    await expect(deliverAlerts(db(), { companyId: "x" }, APP)).rejects.toBeInstanceOf(UnrecoverableError);
    expect(() => deliverPayload(null)).toThrow(UnrecoverableError);
  });
});

describe("through the worker and the mail catcher", () => {
  let queue: Queue;
  beforeAll(() => {
    queue = new Queue(SCANS_QUEUE, { connection: new Redis(process.env.REDIS_URL!, { maxRetriesPerRequest: null }) });
  });
  afterAll(async () => {
    await queue.close();
  });

  it("run now: the scan and the digest at once; run twice, the catcher holds one e-mail per person", async () => {
    const co = await createCompany({ kitchens: 1 });
    const start = new Date();
    await receiveLot(co, 0, "cure", 3);
    // a scan a month ago saw it 33 days out (the 60-day alert); run now adds the 7-day one: two alerts, one lot
    await runExpiryScan(db(), { companyId: co.company.id }, new Date(Date.now() - 30 * 24 * 3600_000));
    // digest people not yet due (last digest just now): only run-now may send
    await db()("app_users").where({ company_id: co.company.id }).update({ alert_email: "digest", alert_last_digest_at: new Date() });
    await enqueueScanNow(queue, EXPIRY_SCAN_JOB, co.company.id);
    const to = co.users.manager.email;
    const [mail] = await waitForMails({ to, after: start, count: 1, timeoutMs: 15_000 });
    // two alerts (60 and 7 days) about one lot: one line, at its most urgent warning
    expect(mail!.subject).toBe(`${co.company.name}: 1 alert in today's digest`);
    expect(mail!.text).toContain("(7-day warning)");
    expect(mail!.text).not.toContain("(60-day warning)");
    expect(mail!.text).toContain(CURE_CAUTION);
    expect(mail!.text).toContain(`${process.env.APP_URL}/alerts`);
    expect(mail!.html).toContain("Lots nearing their date (1)");
    expect(await db()("alert_deliveries").where({ user_id: co.users.manager.id })).toHaveLength(2); // both recorded as sent
    expect(mail!.companyId).toBe(co.company.id);
    // the admin, the buyer and the kitchen lead get theirs; the accountant nothing
    await waitForMails({ to: co.users.admin.email, after: start, count: 1, timeoutMs: 10_000 });
    await waitForMails({ to: co.users.kitchen_lead.email, after: start, count: 1, timeoutMs: 10_000 });
    await enqueueScanNow(queue, EXPIRY_SCAN_JOB, co.company.id, new Date(Date.now() + 1));
    for (let i = 0; i < 60; i++) {
      const runs = await db()("job_runs").where({ company_id: co.company.id, job: EXPIRY_SCAN_JOB }).first();
      if (runs && new Date(runs.last_run_at) > new Date(Date.now() - 1500)) break;
      await sleep(100);
    }
    await sleep(2500); // time for a second delivery and send, if there were one
    expect(await listMail({ to, after: start })).toHaveLength(1);
    expect(await listMail({ to: co.users.accountant.email, after: start })).toHaveLength(0);
    expect((await listMail({ after: start })).filter((m) => m.companyId === co.company.id)).toHaveLength(4); // admin, manager, buyer, kitchen lead
  });
});

describe("GET/PUT /api/me/preferences", () => {
  it("reads your own, replaces them, and names the field that is wrong", async () => {
    const co = await createCompany({ kitchens: 1 });
    const cookie = await sessionCookieFor(co.users.buyer.id);
    const got = await call(getPrefs, { path: "/api/me/preferences", cookie });
    expect(got.status).toBe(200);
    expect(got.body).toMatchObject({ alertEmail: "digest", digestHour: 7, alertKinds: ["expiry", "reorder"], kindsAreRoleDefault: true, timeZone: "Europe/London", receivesAlerts: true });
    const put = await call(putPrefs, { path: "/api/me/preferences", method: "PUT", cookie, body: { alertEmail: "immediate", digestHour: 6, alertKinds: ["shortage", "expiry"] } });
    expect(put.status).toBe(200);
    expect(put.body).toMatchObject({ alertEmail: "immediate", digestHour: 6, alertKinds: ["expiry", "shortage"], kindsAreRoleDefault: false });
    const row = await db()("app_users").where({ id: co.users.buyer.id }).first();
    expect([row.alert_email, row.alert_digest_hour, [...row.alert_kinds].sort()]).toEqual(["immediate", 6, ["expiry", "shortage"]]);
    const bad = await call(putPrefs, { path: "/api/me/preferences", method: "PUT", cookie, body: { alertEmail: "hourly", digestHour: 24, alertKinds: ["expiry", "expiry"] } });
    expect(bad.status).toBe(422);
    expect(Object.keys(bad.body.error.details.fields).sort()).toEqual(["alertEmail", "alertKinds", "digestHour"]);
    // the accountant may set theirs but is told nothing is sent
    const acc = await call(getPrefs, { path: "/api/me/preferences", cookie: await sessionCookieFor(co.users.accountant.id) });
    expect(acc.body).toMatchObject({ receivesAlerts: false, alertKinds: [] });
  });
});
