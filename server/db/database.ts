import { Kysely, PostgresDialect, type Transaction } from 'kysely';
import pg from 'pg';
import type { Database } from './schema';

// int8 (count(*), sums) arrives from pg as a string; Hilum's int8 values are seed counts that
// stay far below 2^53, so they are parsed to numbers here, once, on purpose.
pg.types.setTypeParser(pg.types.builtins.INT8, (value) => Number.parseInt(value, 10));
// `date` columns stay ISO strings (YYYY-MM-DD): no time zone shifts a harvest date.
pg.types.setTypeParser(pg.types.builtins.DATE, (value) => value);

export type Db = Kysely<Database>;
export type DbOrTx = Kysely<Database> | Transaction<Database>;

/** `onQuery` sees every query run (tests count them; the app passes nothing). */
export function createDb(
  connectionString: string,
  poolSize = 10,
  onQuery?: (sql: string, parameters: readonly unknown[]) => void,
): Db {
  const pool = new pg.Pool({
    connectionString,
    max: poolSize,
    connectionTimeoutMillis: 5_000,
    idleTimeoutMillis: 30_000,
  });
  // A dropped idle connection must not crash the process; the pool replaces it.
  pool.on('error', () => {});
  const dialect = new PostgresDialect({ pool });
  if (!onQuery) return new Kysely<Database>({ dialect });
  return new Kysely<Database>({
    dialect,
    log: (event) => {
      if (event.level === 'query') onQuery(event.query.sql, event.query.parameters);
    },
  });
}
