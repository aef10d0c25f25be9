import type { Knex } from "knex";

// Closing a period (issue 7): calendar months in the company's time zone. A month is closed while
// its row is in accounting_periods (reopening deletes the row); accounting_period_events is the
// audit trail of every close and reopen, append-only like the ledger (a trigger refuses UPDATE and
// DELETE). Months close in order and reopen from the latest back (lib/data/periods.ts), so the
// closed months always run up to one month, the company's "closed through" month; a movement dated
// in or before it is refused (409 PERIOD_CLOSED).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("accounting_periods", (t) => {
    t.uuid("company_id").notNullable().references("companies.id").onDelete("CASCADE");
    t.date("month").notNullable(); // the first day of the month
    t.timestamp("closed_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.uuid("closed_by");
    t.primary(["company_id", "month"]);
  });
  // who closed it: a user of the same company; a deleted user leaves the close on record (PostgreSQL 15+)
  await knex.raw(`alter table accounting_periods
    add constraint accounting_periods_first_day check (extract(day from month) = 1),
    add constraint accounting_periods_closed_by foreign key (company_id, closed_by)
      references app_users (company_id, id) on delete set null (closed_by)`);

  await knex.schema.createTable("accounting_period_events", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("company_id").notNullable().references("companies.id").onDelete("CASCADE");
    t.date("month").notNullable();
    t.text("action").notNullable();
    t.text("reason");
    t.uuid("user_id");
    t.timestamp("at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(["company_id", "at"]);
  });
  await knex.raw(`alter table accounting_period_events
    add constraint accounting_period_events_action check (action in ('close','reopen')),
    add constraint accounting_period_events_first_day check (extract(day from month) = 1),
    add constraint accounting_period_events_reason check (action <> 'reopen' or coalesce(btrim(reason), '') <> ''),
    add constraint accounting_period_events_user foreign key (company_id, user_id)
      references app_users (company_id, id) on delete set null (user_id)`);
  // The audit trail is append-only: no UPDATE, no DELETE. Only the cascade of a company's own
  // deletion gets through (the company row is already gone when the cascade reaches its events);
  // a user's deletion only clears user_id, which the trigger lets through as well.
  await knex.raw(`create function accounting_period_events_append_only() returns trigger language plpgsql as $$
    begin
      if tg_op = 'DELETE' and not exists (select 1 from companies where id = old.company_id) then return old; end if;
      if tg_op = 'UPDATE' and old.user_id is not null and new.user_id is null
         and (new.id, new.company_id, new.month, new.action, new.reason, new.at)
             is not distinct from (old.id, old.company_id, old.month, old.action, old.reason, old.at) then
        return new;
      end if;
      raise exception 'accounting period events are append-only';
    end $$`);
  await knex.raw(`create trigger accounting_period_events_no_change before update or delete on accounting_period_events
    for each row execute function accounting_period_events_append_only()`);

  // the first close asks for the company's earliest movement
  await knex.raw(`create index if not exists stock_movements_company_occurred on stock_movements (company_id, occurred_at)`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`drop index if exists stock_movements_company_occurred`);
  await knex.schema.dropTable("accounting_period_events");
  await knex.raw("drop function if exists accounting_period_events_append_only()");
  await knex.schema.dropTable("accounting_periods");
}
