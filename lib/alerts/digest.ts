// Who gets which alerts by e-mail, and when. Pure: the caller gives "now".
//
// - alert_email "immediate": every new alert the person may see goes out at the next delivery
//   (after each scan, and at each tick of the digest queue).
// - alert_email "digest": one e-mail a day at the person's hour in their own time zone (their
//   profile's, else the company's). The slot is the last time the local clock read that hour; a
//   person is due when their last digest is older than the slot, so a digest hour that passed while
//   the worker was down goes out at the next tick, once.
// - "off": nothing by e-mail; the in-app list still shows everything.
// Kinds default by role (the buyer reorders, the kitchen lead runs the batches); a person may choose.
import { TZDate } from "@date-fns/tz";
import type { Role } from "../../db/types";
import { dateInZone } from "./expiry";

export const ALERT_EMAIL_MODES = ["off", "digest", "immediate"] as const;
export type AlertEmailMode = (typeof ALERT_EMAIL_MODES)[number];
export const EMAIL_ALERT_KINDS = ["expiry", "reorder", "shortage"] as const;
export type EmailAlertKind = (typeof EMAIL_ALERT_KINDS)[number];

const DEFAULT_KINDS: Record<Role, readonly EmailAlertKind[]> = {
  admin: ["expiry", "reorder", "shortage"],
  manager: ["expiry", "reorder", "shortage"],
  buyer: ["expiry", "reorder"],
  kitchen_lead: ["expiry", "shortage"],
  accountant: [],
};

/** The kinds a person receives: their own choice, or their role's default when they never chose. */
export function alertKindsFor(role: Role, chosen: readonly string[] | null): EmailAlertKind[] {
  if (chosen === null) return [...DEFAULT_KINDS[role]];
  return EMAIL_ALERT_KINDS.filter((k) => chosen.includes(k));
}

export function defaultAlertKinds(role: Role): EmailAlertKind[] {
  return [...DEFAULT_KINDS[role]];
}

/**
 * The last instant at or before `now` when the clock in `timeZone` read `hour`:00. On the day a
 * clock springs forward over that hour, the slot is the instant the clock jumped (TZDate's reading
 * of the missing wall time); on the day it falls back, the later of the two (TZDate's reading).
 */
export function lastDigestSlot(now: Date, timeZone: string, hour: number): Date {
  const [y, m, d] = dateInZone(now, timeZone).split("-").map(Number) as [number, number, number];
  const today = new TZDate(y, m - 1, d, hour, 0, 0, timeZone);
  if (today.getTime() <= now.getTime()) return new Date(today.getTime());
  const yesterday = new TZDate(y, m - 1, d - 1, hour, 0, 0, timeZone);
  return new Date(yesterday.getTime());
}

/** Whether a digest person is due: their last digest (or, never having had one, their start) is before the last slot. */
export function digestDue(now: Date, timeZone: string, hour: number, lastDigestAt: Date | null, since: Date): boolean {
  const slot = lastDigestSlot(now, timeZone, hour);
  return (lastDigestAt ?? since).getTime() < slot.getTime();
}
