// The signed-in person's alert e-mail preferences (app_users.alert_*). Everyone may read and change
// their own; nobody else's. What they mean: lib/alerts/digest.ts and jobs/definitions/deliver-alerts.ts.
import "server-only";
import { db } from "../../db/client";
import { alertKindsFor, defaultAlertKinds, type AlertEmailMode } from "../alerts/digest";
import type { CurrentUser } from "../auth/current-user";
import { canSomewhere } from "../auth/permissions";
import { notFound } from "../http/errors";
import type { AlertPreferences, AlertPreferencesInput } from "../validation/preferences";

interface PrefRow {
  alert_email: AlertEmailMode;
  alert_digest_hour: number;
  alert_kinds: string[] | null;
  alert_last_digest_at: Date | null;
}

export async function getAlertPreferences(user: CurrentUser): Promise<AlertPreferences> {
  const row: PrefRow | undefined = await db()("app_users")
    .where({ id: user.id, company_id: user.companyId })
    .first("alert_email", "alert_digest_hour", "alert_kinds", "alert_last_digest_at");
  if (!row) throw notFound("User");
  return {
    alertEmail: row.alert_email,
    digestHour: row.alert_digest_hour,
    alertKinds: alertKindsFor(user.role, row.alert_kinds),
    kindsAreRoleDefault: row.alert_kinds === null,
    roleDefaultKinds: defaultAlertKinds(user.role),
    timeZone: user.timeZone,
    receivesAlerts: canSomewhere(user, "alerts.read"),
    lastDigestAt: row.alert_last_digest_at?.toISOString() ?? null,
  };
}

/** Replaces the three settings. Choosing a different hour does not send a digest at once: the next one comes at that hour. */
export async function updateAlertPreferences(user: CurrentUser, input: AlertPreferencesInput): Promise<AlertPreferences> {
  await db()("app_users")
    .where({ id: user.id, company_id: user.companyId })
    .update({
      alert_email: input.alertEmail,
      alert_digest_hour: input.digestHour,
      alert_kinds: input.alertKinds,
      // a new digest setting starts from now: alerts already due go at the next hour, not at once
      ...(input.alertEmail === "digest" ? { alert_last_digest_at: db().raw("coalesce(alert_last_digest_at, now())") } : {}),
    });
  return getAlertPreferences(user);
}
