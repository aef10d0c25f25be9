// Shared zod pieces. No database or server imports: client forms use these too.
import { z } from "zod";
import { ROLES } from "../../db/types";

export const email = z
  .string({ error: "Enter an e-mail address." })
  .trim()
  .toLowerCase()
  .max(254, "At most 254 characters.")
  .pipe(z.email({ error: "Enter a valid e-mail address." }));

export const newPassword = z
  .string({ error: "Enter a password." })
  .min(10, "Use at least 10 characters.")
  .max(200, "Use at most 200 characters.");

export const timeZone = z.string().trim().refine(isTimeZone, { error: "Unknown time zone (use an IANA name such as Europe/Vienna)." });

export function isTimeZone(tz: string): boolean {
  try {
    new Intl.DateTimeFormat("en", { timeZone: tz });
    return tz.length > 0;
  } catch {
    return false;
  }
}

export const role = z.enum(ROLES, { error: "Choose a role: admin, manager, buyer, kitchen lead or accountant." });

export const uuid = z.uuid({ error: "Not a valid id." });

/**
 * An exact decimal sent as a string ("12.5"). JSON numbers are refused: they pass through binary
 * floating point in most clients. No exponent, at most `scale` decimals.
 */
export function decimalString(opts: { scale?: number; signed?: boolean } = {}) {
  const scale = opts.scale ?? 12;
  const pattern = new RegExp(`^${opts.signed ? "-?" : ""}\\d{1,18}(\\.\\d{1,${scale}})?$`);
  return z
    .string({ error: "Send the quantity as a decimal string, e.g. \"12.5\"." })
    .trim()
    .regex(pattern, { error: `Use a plain decimal with at most ${scale} decimals, e.g. "12.5".` });
}
