// The database handle. Only lib/data (and jobs, seeds, tests) import this module.
import knexFactory, { type Knex } from "knex";
import pg from "pg";
import { env } from "../lib/env";

// NUMERIC and BIGINT come back as strings (never floats); DATE stays a plain yyyy-mm-dd string.
pg.types.setTypeParser(pg.types.builtins.DATE, (v: string) => v);

const globalForDb = globalThis as unknown as { __hlKnex?: Knex; __hlPool?: pg.Pool };

export function db(): Knex {
  globalForDb.__hlKnex ??= knexFactory({
    client: "pg",
    connection: env().DATABASE_URL,
    pool: { min: 0, max: 10 },
  });
  return globalForDb.__hlKnex;
}

/** A plain pg pool for libraries that take one (the session adapter). */
export function pgPool(): pg.Pool {
  globalForDb.__hlPool ??= new pg.Pool({ connectionString: env().DATABASE_URL, max: 4 });
  return globalForDb.__hlPool;
}

export async function closeDb(): Promise<void> {
  await globalForDb.__hlKnex?.destroy();
  await globalForDb.__hlPool?.end();
  globalForDb.__hlKnex = undefined;
  globalForDb.__hlPool = undefined;
}
