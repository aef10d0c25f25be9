// Closing a period (issue 7): calendar months in the company's time zone (companies.time_zone).
// - A month is closed while its row is in accounting_periods; reopening deletes the row. Every close
//   and reopen is recorded in accounting_period_events (append-only), a reopen with its reason.
// - Months close in order, as accounts close: the next month to close is the one after the latest
//   closed month; before any month is closed, any ended month up to the one of the company's first
//   movement (closing it locks the empty months before it too). Closing another month is 409
//   EARLIER_PERIOD_OPEN naming the month to close first. Reopening goes the other way: only the
//   latest closed month (409 LATER_PERIOD_CLOSED naming it), so the closed months never have a gap.
// - A month that has not ended in the company's time zone cannot be closed (422 on month).
// - Closing a closed month is 409 PERIOD_ALREADY_CLOSED (no second audit event); reopening an open
//   one is 409 PERIOD_NOT_CLOSED.
// - Who: period.close (admins, managers, accountants) closes, period.reopen (admins) reopens, with a
//   reason. The list is for whoever may close or read reports.
// - The ledger's guard and the lock that keeps postings in flight out of a month being closed:
//   lib/data/period-guard.ts.
import "server-only";
import type { Knex } from "knex";
import { db } from "../../db/client";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import { can } from "../auth/permissions";
import { conflict, forbidden, validation } from "../http/errors";
import { addMonths, firstDay, monthLabel, monthsBetween } from "../periods/months";
import { inTransaction } from "./ledger";
import { lockPeriodsExclusive } from "./period-guard";

export interface PeriodUser {
  id: string;
  name: string;
}

export interface Period {
  /** YYYY-MM */
  month: string;
  status: "open" | "closed";
  /** false for the current month (and later ones): they cannot be closed yet. */
  ended: boolean;
  closedAt: string | null;
  closedBy: PeriodUser | null;
  /** A month before the first closed month is closed with it (no row of its own): that month. */
  closedWith: string | null;
}

export interface PeriodEvent {
  id: string;
  month: string;
  action: "close" | "reopen";
  reason: string | null;
  user: PeriodUser | null;
  at: string;
}

export interface PeriodList {
  timeZone: string;
  /** The company's current month, in its time zone. */
  currentMonth: string;
  /** The latest closed month; every month up to it is closed. null: none. */
  closedThrough: string | null;
  /** The month that may be closed next; null when it has not ended yet. */
  nextToClose: string | null;
  /** Newest first. */
  periods: Period[];
  /** The audit trail of the months listed, newest first. */
  events: PeriodEvent[];
}

const MAX_MONTHS = 120;

interface ClosedRow {
  month: string;
  closed_at: Date;
  closed_by: string | null;
  closed_by_name: string | null;
}

interface PeriodState {
  timeZone: string;
  currentMonth: string;
  closedThrough: string | null;
  firstClosed: string | null;
  /** The month of the company's earliest movement (any kind), in its zone; null: no movements. */
  firstMovementMonth: string | null;
}

async function periodState(k: Knex | Knex.Transaction, companyId: string): Promise<PeriodState> {
  const r = await k.raw<{ rows: { time_zone: string; current_month: string; through: string | null; first_closed: string | null; first_movement: string | null }[] }>(
    `select c.time_zone,
            to_char(now() at time zone c.time_zone, 'YYYY-MM') as current_month,
            (select to_char(max(month), 'YYYY-MM') from accounting_periods where company_id = c.id) as through,
            (select to_char(min(month), 'YYYY-MM') from accounting_periods where company_id = c.id) as first_closed,
            to_char((select min(occurred_at) from stock_movements where company_id = c.id) at time zone c.time_zone, 'YYYY-MM') as first_movement
       from companies c where c.id = ?`,
    [companyId],
  );
  const row = r.rows[0]!;
  return { timeZone: row.time_zone, currentMonth: row.current_month, closedThrough: row.through, firstClosed: row.first_closed, firstMovementMonth: row.first_movement };
}

/** The month that may be closed next (it may not have ended yet). */
function nextMonthToClose(s: PeriodState): string {
  if (s.closedThrough) return addMonths(s.closedThrough, 1);
  const lastEnded = addMonths(s.currentMonth, -1);
  return s.firstMovementMonth && s.firstMovementMonth < lastEnded ? s.firstMovementMonth : lastEnded;
}

async function closedRows(k: Knex | Knex.Transaction, companyId: string, from: string, to: string): Promise<Map<string, ClosedRow>> {
  const rows = await k("accounting_periods as p")
    .leftJoin("app_users as u", function () {
      this.on("u.id", "=", "p.closed_by").andOn("u.company_id", "=", "p.company_id");
    })
    .where("p.company_id", companyId)
    .whereBetween("p.month", [firstDay(from), firstDay(to)])
    .select<ClosedRow[]>(k.raw("to_char(p.month, 'YYYY-MM') as month"), "p.closed_at", "p.closed_by", "u.name as closed_by_name");
  return new Map(rows.map((r) => [r.month, r]));
}

function describePeriod(s: PeriodState, month: string, row: ClosedRow | undefined): Period {
  const closed = Boolean(s.closedThrough && month <= s.closedThrough);
  return {
    month,
    status: closed ? "closed" : "open",
    ended: month < s.currentMonth,
    closedAt: row ? new Date(row.closed_at).toISOString() : null,
    closedBy: row?.closed_by ? { id: row.closed_by, name: row.closed_by_name ?? "" } : null,
    closedWith: closed && !row && s.firstClosed && month < s.firstClosed ? s.firstClosed : null,
  };
}

function assertMayRead(user: CurrentUser) {
  if (!can(user, "period.close") && !can(user, "reports.read")) throw forbidden();
}

/**
 * The months from `from` to `to` (default: the current month and the eleven before it, and back to
 * the next month to close if that is older), newest first, with the audit trail of those months.
 */
export async function listPeriods(user: CurrentUser, range: { from?: string; to?: string } = {}): Promise<PeriodList> {
  assertMayRead(user);
  const s = await periodState(db(), user.companyId);
  const next = nextMonthToClose(s);
  const to = range.to ?? s.currentMonth;
  let from = range.from ?? addMonths(to, -11);
  if (!range.from && next < from && next < s.currentMonth) from = next;
  if (from > to) throw validation({ from: ["The first month comes after the last."] });
  if (monthsBetween(from, to).length > MAX_MONTHS) throw validation({ from: [`At most ${MAX_MONTHS} months at a time.`] });
  const rows = await closedRows(db(), user.companyId, from, to);
  const events = await db()("accounting_period_events as e")
    .leftJoin("app_users as u", function () {
      this.on("u.id", "=", "e.user_id").andOn("u.company_id", "=", "e.company_id");
    })
    .where("e.company_id", user.companyId)
    .whereBetween("e.month", [firstDay(from), firstDay(to)])
    .orderBy([{ column: "e.at", order: "desc" }, { column: "e.id", order: "desc" }])
    .limit(500)
    .select<{ id: string; month: string; action: "close" | "reopen"; reason: string | null; user_id: string | null; user_name: string | null; at: Date }[]>(
      "e.id", db().raw("to_char(e.month, 'YYYY-MM') as month"), "e.action", "e.reason", "e.user_id", "u.name as user_name", "e.at",
    );
  return {
    timeZone: s.timeZone,
    currentMonth: s.currentMonth,
    closedThrough: s.closedThrough,
    nextToClose: next < s.currentMonth ? next : null,
    periods: monthsBetween(from, to).reverse().map((m) => describePeriod(s, m, rows.get(m))),
    events: events.map((e) => ({
      id: e.id,
      month: e.month,
      action: e.action,
      reason: e.reason,
      user: e.user_id ? { id: e.user_id, name: e.user_name ?? "" } : null,
      at: new Date(e.at).toISOString(),
    })),
  };
}

/**
 * Closes a month that has ended (period.close). From then on movements dated in it, or before it,
 * are refused; postings in flight when the close starts commit first (lib/data/period-guard.ts).
 */
export async function closePeriod(user: CurrentUser, month: string): Promise<Period> {
  assertCan(user, "period.close");
  return inTransaction(async (trx) => {
    await lockPeriodsExclusive(trx, user.companyId);
    const s = await periodState(trx, user.companyId);
    if (month >= s.currentMonth) {
      const msg = month === s.currentMonth
        ? `${monthLabel(month)} has not ended yet (time zone ${s.timeZone}): a month can be closed once it is over.`
        : `${monthLabel(month)} is still to come: only a month that is over can be closed.`;
      throw validation({ month: [msg] }, msg);
    }
    if (s.closedThrough && month <= s.closedThrough) {
      const row = (await closedRows(trx, user.companyId, month, month)).get(month);
      throw conflict(
        row ? `${monthLabel(month)} is already closed.` : `${monthLabel(month)} is already closed: it comes before ${monthLabel(s.firstClosed!)}, the first closed month.`,
        "PERIOD_ALREADY_CLOSED",
        { month, closedAt: row ? new Date(row.closed_at).toISOString() : null, closedThrough: s.closedThrough },
      );
    }
    const next = nextMonthToClose(s);
    const inOrder = s.closedThrough ? month === next : !s.firstMovementMonth || month <= s.firstMovementMonth;
    if (!inOrder) {
      throw conflict(`Months close in order: close ${monthLabel(next)} first.`, "EARLIER_PERIOD_OPEN", { month: next });
    }
    // the moment the lock was granted (not the transaction's start): every movement the month keeps
    // was recorded before it
    const at = trx.raw("clock_timestamp()");
    await trx("accounting_periods").insert({ company_id: user.companyId, month: firstDay(month), closed_by: user.id, closed_at: at });
    await trx("accounting_period_events").insert({ company_id: user.companyId, month: firstDay(month), action: "close", user_id: user.id, at });
    const after = { ...s, closedThrough: month, firstClosed: s.firstClosed ?? month };
    return describePeriod(after, month, (await closedRows(trx, user.companyId, month, month)).get(month));
  });
}

/** Reopens the latest closed month (period.reopen: admins), with the reason on the audit trail. */
export async function reopenPeriod(user: CurrentUser, month: string, reason: string): Promise<Period> {
  assertCan(user, "period.reopen");
  const why = reason.trim();
  if (!why) throw validation({ reason: ["Say why the month is reopened; it goes on the audit trail."] });
  return inTransaction(async (trx) => {
    await lockPeriodsExclusive(trx, user.companyId);
    const s = await periodState(trx, user.companyId);
    if (!s.closedThrough || month > s.closedThrough) {
      throw conflict(`${monthLabel(month)} is not closed.`, "PERIOD_NOT_CLOSED", { month });
    }
    if (month < s.closedThrough) {
      throw conflict(
        `Months reopen from the latest back: reopen ${monthLabel(s.closedThrough)} first.`,
        "LATER_PERIOD_CLOSED",
        { month: s.closedThrough },
      );
    }
    await trx("accounting_periods").where({ company_id: user.companyId, month: firstDay(month) }).delete();
    await trx("accounting_period_events").insert({ company_id: user.companyId, month: firstDay(month), action: "reopen", reason: why, user_id: user.id, at: trx.raw("clock_timestamp()") });
    const after = await periodState(trx, user.companyId);
    return describePeriod(after, month, undefined);
  });
}
