// A person's alert e-mail preferences: GET/PUT /api/me/preferences and the account page's form.
// The rules live in lib/alerts/digest.ts. Client-safe.
import { z } from "zod";
import { ALERT_EMAIL_MODES, EMAIL_ALERT_KINDS } from "../alerts/digest";

export const alertPreferencesInput = z.object({
  alertEmail: z.enum(ALERT_EMAIL_MODES, { error: "One of off, digest or immediate." }),
  digestHour: z
    .number({ error: "A whole hour from 0 to 23." })
    .int("A whole hour from 0 to 23.")
    .min(0, "A whole hour from 0 to 23.")
    .max(23, "A whole hour from 0 to 23."),
  /** null: the kinds your role gets by default */
  alertKinds: z
    .array(z.enum(EMAIL_ALERT_KINDS, { error: `Each one of ${EMAIL_ALERT_KINDS.join(", ")}.` }))
    .refine((a) => new Set(a).size === a.length, "Name each kind once.")
    .nullable(),
});
export type AlertPreferencesInput = z.infer<typeof alertPreferencesInput>;

export const alertPreferencesResponse = z
  .object({
    alertEmail: z.enum(ALERT_EMAIL_MODES).meta({ description: "off: no e-mail; digest: one e-mail a day at digestHour; immediate: after each check that finds something." }),
    digestHour: z.number().int().meta({ description: "The hour of the daily digest, 0-23, in timeZone." }),
    alertKinds: z.array(z.enum(EMAIL_ALERT_KINDS)).meta({ description: "The kinds you receive by e-mail (your choice, or your role's default)." }),
    kindsAreRoleDefault: z.boolean().meta({ description: "True while you have not chosen kinds yourself." }),
    roleDefaultKinds: z.array(z.enum(EMAIL_ALERT_KINDS)),
    timeZone: z.string().meta({ description: "The time zone the digest hour is read in: yours, else the company's." }),
    receivesAlerts: z.boolean().meta({ description: "False for roles that see no alerts (nothing is e-mailed to them whatever the setting)." }),
    lastDigestAt: z.string().nullable().meta({ description: "When your last digest was made (ISO 8601), or null." }),
  })
  .meta({ id: "AlertPreferences" });
export type AlertPreferences = z.infer<typeof alertPreferencesResponse>;
