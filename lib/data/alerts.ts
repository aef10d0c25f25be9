// The in-app alert list: alerts the scans in jobs/ stored (jobs/definitions/expiry-scan.ts,
// reorder-scan.ts, shortage-scan.ts), as each user sees them. Cleared reorder and shortage alerts
// (the need went away) are left out unless asked for, and never count as unread. Reads PostgreSQL only, so the list works while Redis is down.
//
// Visibility: alerts.read per alert kitchen (kitchen leads: their own kitchens). Another company's
// alert is 404; one of a kitchen the user may not see is 403. Acknowledging and snoozing are per
// user (alert_states) and harmless to repeat.
import "server-only";
import { db } from "../../db/client";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import { can, canSomewhere, kitchensWhere } from "../auth/permissions";
import { CURE_CAUTION } from "../cure/caution";
import { forbidden, notFound, validation } from "../http/errors";
import { isUuid } from "../validation/items";
import type { AlertKind, AlertListQuery, AlertSnoozeInput } from "../validation/alerts";

export interface Alert {
  id: string;
  kind: AlertKind;
  kitchen: { id: string; code: string; name: string };
  subjectType: string;
  subjectId: string;
  thresholdDays: number;
  title: string;
  detail: string;
  data: Record<string, unknown>;
  createdAt: string;
  /** reorder and shortage: when a scan found the condition gone; null while it holds (expiry: always null) */
  clearedAt: string | null;
  acknowledgedAt: string | null;
  snoozedUntil: string | null;
  unread: boolean;
  caution: string | null;
}

interface AlertRow {
  id: string; kind: AlertKind; kitchen_id: string; kitchen_code: string; kitchen_name: string; subject_type: string; subject_id: string;
  threshold_days: number; title: string; detail: string; data: Record<string, unknown>; created_at: Date; cleared_at: Date | null;
  acknowledged_at: Date | null; snoozed_until: Date | null; unread: boolean;
}

/** Expiry and reorder alerts name one item's category; a shortage alert the categories of its lines short. */
const aboutCure = (data: Record<string, unknown>) =>
  data.category === "cure" || (Array.isArray(data.categories) && data.categories.includes("cure"));

function toAlert(r: AlertRow): Alert {
  return {
    id: r.id, kind: r.kind, kitchen: { id: r.kitchen_id, code: r.kitchen_code, name: r.kitchen_name },
    subjectType: r.subject_type, subjectId: r.subject_id, thresholdDays: r.threshold_days, title: r.title, detail: r.detail, data: r.data,
    createdAt: r.created_at.toISOString(), clearedAt: r.cleared_at?.toISOString() ?? null, acknowledgedAt: r.acknowledged_at?.toISOString() ?? null, snoozedUntil: r.snoozed_until?.toISOString() ?? null,
    unread: r.unread, caution: aboutCure(r.data) ? CURE_CAUTION : null,
  };
}

async function visibleKitchenIds(user: CurrentUser): Promise<string[]> {
  const all: { id: string }[] = await db()("kitchens").where({ company_id: user.companyId }).select("id");
  return kitchensWhere(user, "alerts.read", all.map((k) => k.id));
}

function baseQuery(user: CurrentUser, kitchenIds: readonly string[]) {
  const k = db();
  return k("alerts as a")
    .join("kitchens as k", "k.id", "a.kitchen_id")
    .leftJoin("alert_states as s", function () {
      this.on("s.alert_id", "a.id").andOnVal("s.user_id", user.id);
    })
    .where("a.company_id", user.companyId)
    .whereIn("a.kitchen_id", kitchenIds);
}

// a cleared alert (the shortage or reorder need went away) is never unread
const UNREAD = "(a.cleared_at is null and s.acknowledged_at is null and (s.snoozed_until is null or s.snoozed_until <= now()))";

const SELECT = [
  "a.id", "a.kind", "a.kitchen_id", "k.code as kitchen_code", "k.name as kitchen_name", "a.subject_type", "a.subject_id", "a.threshold_days",
  "a.title", "a.detail", "a.data", "a.created_at", "a.cleared_at", "s.acknowledged_at", "s.snoozed_until",
];

/** The user's unread alerts across every kitchen they may see (the shell's badge). 0 without alerts.read. */
export async function unreadAlertCount(user: CurrentUser): Promise<number> {
  if (!canSomewhere(user, "alerts.read")) return 0;
  const kitchenIds = await visibleKitchenIds(user);
  if (!kitchenIds.length) return 0;
  const row = await baseQuery(user, kitchenIds).whereRaw(UNREAD).count<{ n: string }[]>({ n: "*" }).first();
  return Number(row?.n ?? 0);
}

export async function listAlerts(user: CurrentUser, q: AlertListQuery): Promise<{ alerts: Alert[]; unreadCount: number }> {
  if (!canSomewhere(user, "alerts.read")) throw forbidden("Your role does not receive alerts.");
  let kitchenIds = await visibleKitchenIds(user);
  const ref = q.kitchen;
  if (ref) {
    const kitchen = await db()("kitchens")
      .where({ company_id: user.companyId })
      .where((w) => (isUuid(ref) ? w.where("id", ref) : w.whereRaw("upper(code) = upper(?)", [ref])))
      .first<{ id: string } | undefined>("id");
    if (!kitchen) throw notFound("Kitchen");
    assertCan(user, "alerts.read", { kitchenId: kitchen.id });
    kitchenIds = [kitchen.id];
  }
  let query = baseQuery(user, kitchenIds).select([...SELECT, db().raw(`${UNREAD} as unread`)]);
  if (q.kind) query = query.where("a.kind", q.kind);
  if (!q.includeAcknowledged) query = query.whereNull("s.acknowledged_at");
  if (!q.includeCleared) query = query.whereNull("a.cleared_at");
  const rows: AlertRow[] = await query.orderBy([{ column: "a.created_at", order: "desc" }, { column: "a.threshold_days" }, { column: "a.id" }]).limit(q.limit);
  return { alerts: rows.map(toAlert), unreadCount: await unreadAlertCount(user) };
}

async function loadAlert(user: CurrentUser, id: string): Promise<Alert> {
  const row: AlertRow | undefined = await db()("alerts as a")
    .join("kitchens as k", "k.id", "a.kitchen_id")
    .leftJoin("alert_states as s", function () {
      this.on("s.alert_id", "a.id").andOnVal("s.user_id", user.id);
    })
    .where({ "a.company_id": user.companyId, "a.id": id })
    .first([...SELECT, db().raw(`${UNREAD} as unread`)]);
  if (!row) throw notFound("Alert");
  if (!can(user, "alerts.read", { kitchenId: row.kitchen_id })) throw forbidden("This alert is about a kitchen you do not look after.");
  return toAlert(row);
}

/** Marks the alert read for this user; repeating keeps the first time. */
export async function acknowledgeAlert(user: CurrentUser, id: string): Promise<Alert> {
  await loadAlert(user, id);
  await db()
    .raw(
      `insert into alert_states (alert_id, user_id, acknowledged_at) values (?, ?, now())
       on conflict (alert_id, user_id) do update set acknowledged_at = coalesce(alert_states.acknowledged_at, excluded.acknowledged_at)`,
      [id, user.id],
    );
  return loadAlert(user, id);
}

/** Hides the alert from this user's unread count until a time (at most 30 days ahead). */
export async function snoozeAlert(user: CurrentUser, id: string, input: AlertSnoozeInput, now: Date = new Date()): Promise<Alert> {
  await loadAlert(user, id);
  const until = input.until !== undefined ? new Date(input.until) : new Date(now.getTime() + input.hours! * 3600_000);
  if (until.getTime() <= now.getTime()) throw validation({ until: ["Choose a time in the future."] });
  if (until.getTime() > now.getTime() + 30 * 24 * 3600_000) throw validation({ until: ["At most 30 days ahead."] });
  await db().raw(
    `insert into alert_states (alert_id, user_id, snoozed_until) values (?, ?, ?)
     on conflict (alert_id, user_id) do update set snoozed_until = excluded.snoozed_until`,
    [id, user.id, until],
  );
  return loadAlert(user, id);
}

/**
 * When the company's last expiry scan ran, and whether that is late (over 26 h ago: the worker or
 * Redis is down). The page says alerts are delayed; the list itself still answers.
 */
export async function lastExpiryScan(user: CurrentUser, now: Date = new Date()): Promise<{ lastRunAt: string | null; late: boolean }> {
  const row = await db()("job_runs").where({ company_id: user.companyId, job: "expiry-scan" }).first<{ last_run_at: Date } | undefined>("last_run_at");
  const lastRunAt = row?.last_run_at ?? null;
  return { lastRunAt: lastRunAt?.toISOString() ?? null, late: !lastRunAt || now.getTime() - lastRunAt.getTime() > 26 * 3600_000 };
}
