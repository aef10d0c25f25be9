// Alert e-mail: turns the alerts the scans stored into one e-mail per person, by role, kitchen and
// preference (lib/alerts/digest.ts), through the outbox.
//
// The send record is alert_deliveries, one row per (alert, recipient), written in the same
// transaction as the outbox e-mail that carries those alerts, with the person's row locked. So a
// re-run, a retry or two deliveries at once never put an alert in a second e-mail to the same
// person. The outbox row is then sent at least once (send-email.ts: marked sent in the transaction
// that sent it): only a crash between the SMTP server's acceptance and that commit repeats one
// message, and a committed outbox row is never lost (the worker's sweep queues what is pending).
//
// Jobs on the digests queue (payloads are ids):
// - deliver-alerts {companyId, force?}: after each scan, and per company at each digest tick.
//   `force` (an admin's "run now") treats every digest person as due.
// - digest-tick: every 15 minutes; queues deliver-alerts for every company.
import { UnrecoverableError, type Queue } from "bullmq";
import type { Knex } from "knex";
import type { Role } from "../../db/types";
import { alertKindsFor, digestDue, type AlertEmailMode } from "../../lib/alerts/digest";
import { kitchensWhere } from "../../lib/auth/permissions";
import { alertDigestEmail, alertPath, type DigestAlert } from "../../lib/mail/alert-digest";
import { addToOutbox } from "../../lib/mail/outbox";
import { SCAN_JOB_OPTIONS } from "../queues";

export const DELIVER_ALERTS_JOB = "deliver-alerts";
export const DIGEST_TICK_JOB = "digest-tick";
export const DIGEST_TICK_EVERY_MS = 15 * 60 * 1000;
/** Alerts older than this are not e-mailed to someone who has not had them (a new person, a changed preference). */
export const EMAIL_LOOKBACK_DAYS = 7;
/** At most this many alerts in one e-mail; the rest go in the next one. */
const MAX_PER_EMAIL = 200;

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export function deliverPayload(data: unknown): { companyId: string; force: boolean } {
  const d = (data ?? {}) as { companyId?: unknown; force?: unknown };
  if (typeof d.companyId !== "string" || !UUID.test(d.companyId)) throw new UnrecoverableError(`${DELIVER_ALERTS_JOB}: the payload needs a companyId (uuid).`);
  return { companyId: d.companyId, force: d.force === true };
}

interface Recipient {
  id: string;
  email: string;
  name: string;
  role: Role;
  time_zone: string | null;
  disabled_at: Date | null;
  created_at: Date;
  alert_email: AlertEmailMode;
  alert_digest_hour: number;
  alert_kinds: string[] | null;
  alert_last_digest_at: Date | null;
}

export type DeliverResult =
  | { status: "done"; recipients: number; emails: number; alerts: number; outboxIds: string[] }
  | { status: "company-gone" };

/** One company's delivery as of `now`. Returns the outbox ids written, for the caller to queue. */
export async function deliverAlerts(knex: Knex, data: unknown, appUrl: string, now: Date = new Date()): Promise<DeliverResult> {
  const { companyId, force } = deliverPayload(data);
  const company = await knex("companies").where({ id: companyId }).first<{ name: string; time_zone: string } | undefined>("name", "time_zone");
  if (!company) return { status: "company-gone" };
  const kitchenIds: string[] = await knex("kitchens").where({ company_id: companyId }).pluck("id");
  const people: Recipient[] = await knex("app_users").where({ company_id: companyId }).whereNull("disabled_at").whereNot("alert_email", "off").orderBy("id");
  const assigned = await knex("user_kitchens").where({ company_id: companyId }).select<{ user_id: string; kitchen_id: string }[]>("user_id", "kitchen_id");

  const outboxIds: string[] = [];
  let alerts = 0;
  let recipients = 0;
  for (const listed of people) {
    const visible = kitchensWhere(
      { id: listed.id, companyId, role: listed.role, assignedKitchenIds: assigned.filter((a) => a.user_id === listed.id).map((a) => a.kitchen_id) },
      "alerts.read",
      kitchenIds,
    );
    if (!visible.length || !alertKindsFor(listed.role, listed.alert_kinds).length) continue;
    const sent = await knex.transaction(async (trx) => {
      // the person's row is the lock: two deliveries for one person run one after the other
      const p: Recipient | undefined = await trx("app_users").where({ id: listed.id, company_id: companyId }).forUpdate().first();
      if (!p || p.disabled_at || p.alert_email === "off") return null;
      const kinds = alertKindsFor(p.role, p.alert_kinds);
      const digest = p.alert_email === "digest";
      if (digest && !force && !digestDue(now, p.time_zone ?? company.time_zone, p.alert_digest_hour, p.alert_last_digest_at, p.created_at)) return null;
      const rows: { id: string; kind: DigestAlert["kind"]; title: string; detail: string; subject_type: string; subject_id: string; kitchen_id: string; threshold_days: number; data: Record<string, unknown>; kitchen_name: string }[] =
        await trx("alerts as a")
          .join("kitchens as k", "k.id", "a.kitchen_id")
          .leftJoin("alert_states as s", function () {
            this.on("s.alert_id", "a.id").andOnVal("s.user_id", p.id);
          })
          .where("a.company_id", companyId)
          .whereIn("a.kitchen_id", visible)
          .whereIn("a.kind", kinds)
          .whereNull("a.cleared_at")
          .where("a.created_at", ">", new Date(now.getTime() - EMAIL_LOOKBACK_DAYS * 24 * 3600_000))
          .whereNull("s.acknowledged_at")
          .where((w) => w.whereNull("s.snoozed_until").orWhere("s.snoozed_until", "<=", now))
          .whereNotExists(trx("alert_deliveries as d").whereRaw("d.alert_id = a.id").andWhere("d.user_id", p.id))
          .orderBy([{ column: "a.created_at" }, { column: "a.threshold_days", order: "desc" }, { column: "a.id" }])
          .limit(MAX_PER_EMAIL)
          .select("a.id", "a.kind", "a.title", "a.detail", "a.subject_type", "a.subject_id", "a.kitchen_id", "a.threshold_days", "a.data", "k.name as kitchen_name");
      if (digest) await trx("app_users").where({ id: p.id }).update({ alert_last_digest_at: now });
      if (!rows.length) return null;
      // one line per lot (or item, or batch) and kitchen: a lot first seen past two warnings has two
      // alerts, both recorded as sent, but the e-mail names it once, at its most urgent warning
      const lines = new Map<string, (typeof rows)[number]>();
      for (const r of rows) {
        const key = `${r.kind}:${r.subject_id}:${r.kitchen_id}`;
        const seen = lines.get(key);
        if (!seen || r.threshold_days < seen.threshold_days) lines.set(key, r);
      }
      const mail = alertDigestEmail({
        name: p.name,
        companyName: company.name,
        mode: digest ? "digest" : "immediate",
        appUrl,
        alerts: [...lines.values()].map((r) => ({
          id: r.id, kind: r.kind, title: r.title, detail: r.detail, kitchenName: r.kitchen_name,
          aboutCure: r.data.category === "cure" || (Array.isArray(r.data.categories) && r.data.categories.includes("cure")),
          path: alertPath(r.kind, r.subject_type, r.subject_id),
        })),
      });
      const outboxId = await addToOutbox(trx, { companyId, to: [p.email], ...mail });
      await trx("alert_deliveries").insert(rows.map((r) => ({ alert_id: r.id, user_id: p.id, outbox_email_id: outboxId })));
      return { outboxId, count: rows.length };
    });
    if (sent) {
      outboxIds.push(sent.outboxId);
      alerts += sent.count;
      recipients += 1;
    }
  }
  return { status: "done", recipients, emails: outboxIds.length, alerts, outboxIds };
}

/** The digest tick: a delivery per company, with a job id per company and tick so a repeat adds nothing. */
export async function enqueueDeliveries(knex: Knex, queue: Queue, now: Date = new Date()): Promise<number> {
  const ids: string[] = await knex("companies").orderBy("id").pluck("id");
  const tick = Math.floor(now.getTime() / DIGEST_TICK_EVERY_MS);
  if (ids.length) {
    await queue.addBulk(ids.map((companyId) => ({ name: DELIVER_ALERTS_JOB, data: { companyId }, opts: { ...DELIVER_JOB_OPTIONS, jobId: `${DELIVER_ALERTS_JOB}-${companyId}-tick-${tick}` } })));
  }
  return ids.length;
}

/** Deliveries are idempotent (the send record), so they retry as the scans do. */
export const DELIVER_JOB_OPTIONS = SCAN_JOB_OPTIONS;
