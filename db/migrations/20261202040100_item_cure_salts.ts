import type { Knex } from "knex";

// Which salt a cure carries: sodium or potassium nitrite, sodium or potassium nitrate, as printed
// on the label. Potassium nitrite converts differently (1.2335 x the sodium figure, trade-facts §2),
// so lib/cure needs it per cure. Every cure has both (existing cures become sodium, the common
// salt); other items have neither. A cure inserted without them gets sodium from the trigger
// (a column default cannot depend on the category), so a plain insert of a spice still leaves them null.
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`alter table items add column nitrite_salt text, add column nitrate_salt text`);
  await knex.raw(`update items set nitrite_salt = 'sodium', nitrate_salt = 'sodium' where category = 'cure'`);
  await knex.raw(`alter table items
    add constraint items_nitrite_salt check (nitrite_salt is null or nitrite_salt in ('sodium','potassium')),
    add constraint items_nitrate_salt check (nitrate_salt is null or nitrate_salt in ('sodium','potassium')),
    add constraint items_cure_salts check (case when category = 'cure' then nitrite_salt is not null and nitrate_salt is not null
      else nitrite_salt is null and nitrate_salt is null end)`);
  await knex.raw(`create function items_cure_salt_default() returns trigger language plpgsql as $$
    begin
      if new.category = 'cure' then
        new.nitrite_salt := coalesce(new.nitrite_salt, 'sodium');
        new.nitrate_salt := coalesce(new.nitrate_salt, 'sodium');
      end if;
      return new;
    end $$`);
  await knex.raw(`create trigger items_cure_salt_default before insert on items for each row execute function items_cure_salt_default()`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw("drop trigger items_cure_salt_default on items");
  await knex.raw("drop function items_cure_salt_default()");
  await knex.raw(`alter table items
    drop constraint items_cure_salts,
    drop constraint items_nitrate_salt,
    drop constraint items_nitrite_salt,
    drop column nitrate_salt,
    drop column nitrite_salt`);
}
