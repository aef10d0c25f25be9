// Daily clean-up. Idempotent by nature: it only deletes what has expired.
import type { Knex } from "knex";

export const IDEMPOTENCY_KEEP_HOURS = 48; // at least the 24 h promised to clients

export async function runHousekeeping(knex: Knex): Promise<{ sessions: number; idempotencyKeys: number }> {
  const sessions = await knex("user_sessions").where("expires_at", "<", knex.fn.now()).delete();
  const idempotencyKeys = await knex("idempotency_keys")
    .where("created_at", "<", knex.raw(`now() - (? * interval '1 hour')`, [IDEMPOTENCY_KEEP_HOURS]))
    .delete();
  return { sessions, idempotencyKeys };
}
