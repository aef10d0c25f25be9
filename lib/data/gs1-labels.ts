// Reading a GS1 case label for POST /api/gs1/parse: who may, which "today" sets the century of
// two-digit years, which stand-in separator applies (the request's, else the company's
// companies.scan_separator), and the parser's errors as 422s naming what is wrong. Writes nothing.
import "server-only";
import { db } from "../../db/client";
import type { CurrentUser } from "../auth/current-user";
import { can } from "../auth/permissions";
import { parseGs1, Gs1ParseError, type Gs1Label } from "../gs1/parse";
import { AppError, forbidden } from "../http/errors";
import type { Gs1ParseInput } from "../validation/gs1";

/**
 * Anyone who buys or receives: purchasing.read (admin, manager, buyer, accountant) or stock.receive
 * (admin, manager, buyer). Both reach every kitchen of the company, so no kitchen is asked for.
 */
export function canReadLabels(actor: CurrentUser): boolean {
  return can(actor, "purchasing.read") || can(actor, "stock.receive");
}

/** Today's date in the user's time zone (their own, else the company's), "YYYY-MM-DD". */
function todayIn(timeZone: string, now: Date): string {
  const parts = new Intl.DateTimeFormat("en-CA", { timeZone, year: "numeric", month: "2-digit", day: "2-digit" }).formatToParts(now);
  const get = (type: string) => parts.find((p) => p.type === type)!.value;
  return `${get("year")}-${get("month")}-${get("day")}`;
}

/** The stand-in the company's scanners type for GS (Settings > Company), or undefined for none. */
async function companySeparator(companyId: string): Promise<string | undefined> {
  const row: { scan_separator: string | null } | undefined = await db()("companies").where({ id: companyId }).first("scan_separator");
  return row?.scan_separator ?? undefined;
}

export async function parseLabel(actor: CurrentUser, input: Gs1ParseInput, now = new Date()): Promise<Gs1Label> {
  if (!canReadLabels(actor)) throw forbidden("Your role does not buy or receive stock (purchasing.read or stock.receive).");
  // the request's own stand-in wins; the company's applies only when none is sent
  const separator = input.separator ?? (await companySeparator(actor.companyId));
  try {
    return parseGs1(input.data, { separator, today: todayIn(actor.timeZone, now) });
  } catch (e) {
    if (e instanceof Gs1ParseError) {
      const field = e.code === "BAD_SEPARATOR" ? "separator" : "data";
      throw new AppError(422, "VALIDATION", e.message, {
        fields: { [field]: [e.message] },
        gs1: { reason: e.code, ai: e.ai, position: e.position },
      });
    }
    throw e;
  }
}
