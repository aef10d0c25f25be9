// The closed-period guard of the stock ledger. Every writer of stock_movements calls
// assertPeriodOpen inside its transaction before it writes (lib/data/ledger.ts: postInTransaction,
// which receipts, use, waste, transfers, adjustments, counts, deliveries, production and transfer
// requests all go through, and reverseMovement).
//
// Months close in order and reopen from the latest back (lib/data/periods.ts), so the closed months
// always run up to the company's "closed through" month: a movement dated in it or in any month
// before it is refused (409 PERIOD_CLOSED). Months before the first closed month count as closed
// too: a movement back-dated into them would change the stock a closed month began with.
//
// The race with a close: writers hold a SHARED transaction-scoped advisory lock on the company's
// periods from the check until they commit; closing and reopening take the same lock EXCLUSIVELY.
// A close therefore waits for the postings already past the check (they commit first, and the
// closed month keeps exactly them), and a posting that arrives during a close waits for it and then
// sees the closed month. The lock is per company, not per month, because closing one month locks
// every month before it. Writers do not block each other (shared).
import "server-only";
import type { Knex } from "knex";
import { AppError } from "../http/errors";
import { addMonths, monthLabel } from "../periods/months";

/** The first key of the two-key advisory lock ("PRD1"); the second is hashtext(company id). */
export const PERIOD_LOCK_CLASS = 0x50524431;

/** Writers: held until the transaction ends; compatible with every other writer. */
export async function lockPeriodsShared(trx: Knex.Transaction, companyId: string): Promise<void> {
  await trx.raw("select pg_advisory_xact_lock_shared(?::int, hashtext(?::text))", [PERIOD_LOCK_CLASS, companyId]);
}

/** Closing and reopening: waits for every posting in flight of the company, then holds them off. */
export async function lockPeriodsExclusive(trx: Knex.Transaction, companyId: string): Promise<void> {
  await trx.raw("select pg_advisory_xact_lock(?::int, hashtext(?::text))", [PERIOD_LOCK_CLASS, companyId]);
}

/** 409 PERIOD_CLOSED for a movement dated in `month` while the books are closed through `through`. */
export function periodClosed(month: string, through: string): AppError {
  const open = addMonths(through, 1);
  return new AppError(
    409,
    "PERIOD_CLOSED",
    `${monthLabel(month)} is closed: stock movements dated in it are refused. Date the movement, or the correction, in ${monthLabel(open)} or later (the open months).`,
    { month, closedThrough: through, firstOpenMonth: open },
  );
}

/**
 * Refuses (409 PERIOD_CLOSED, details.month) when any of the instants falls in a closed month of
 * the company, months taken in the company's time zone. Call it inside the writing transaction,
 * before the movements are written: it takes the shared period lock for the rest of the transaction.
 */
export async function assertPeriodOpen(trx: Knex.Transaction, companyId: string, occurredAt: Date | readonly Date[]): Promise<void> {
  const instants = ([] as Date[]).concat(occurredAt as Date | Date[]);
  if (instants.length === 0) return;
  await lockPeriodsShared(trx, companyId);
  // A statement of its own, after the lock: under READ COMMITTED it takes a fresh snapshot, so it
  // sees a close that committed while this transaction waited for the lock.
  const r = await trx.raw<{ rows: { month: string; through: string }[] }>(
    `select min(to_char(x at time zone c.time_zone, 'YYYY-MM')) as month, to_char(p.through, 'YYYY-MM') as through
       from companies c
       cross join lateral (select max(month) as through from accounting_periods where company_id = c.id) p
       cross join unnest(array[${instants.map(() => "?::timestamptz").join(", ")}]) as x
      where c.id = ? and p.through is not null and (x at time zone c.time_zone) < p.through + interval '1 month'
      group by p.through`,
    [...instants.map((d) => d.toISOString()), companyId],
  );
  const hit = r.rows[0];
  if (hit) throw periodClosed(hit.month, hit.through);
}
