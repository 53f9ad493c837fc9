import { Kysely, PostgresDialect, type Transaction } from 'kysely';
import pg from 'pg';
import type { Logger } from 'pino';
import type { Database } from './schema';

// int8 (count(*), sums) arrives from pg as a string; Hilum's int8 values are seed counts that
// stay far below 2^53, so they are parsed to numbers here, once, on purpose.
pg.types.setTypeParser(pg.types.builtins.INT8, (value) => Number.parseInt(value, 10));
// `date` columns stay ISO strings (YYYY-MM-DD): no time zone shifts a harvest date.
pg.types.setTypeParser(pg.types.builtins.DATE, (value) => value);

export type Db = Kysely<Database>;
export type DbOrTx = Kysely<Database> | Transaction<Database>;

/**
 * A connection's 'error' event, logged and never thrown. PostgreSQL ends every connection when it
 * shuts down or restarts (57P01); pg emits that as 'error' on the client: through the pool while the
 * client is idle, and on the client itself while it is checked out between two queries (a
 * transaction waiting on our own code). An 'error' event nobody listens to ends the process, so
 * both are listened to; the broken client is dropped when released and the pool connects anew.
 */
function connectionErrorHandler(logger: Pick<Logger, 'warn'> | undefined) {
  return (error: Error) =>
    logger?.warn({ err: error }, 'a database connection was lost; the pool replaces it');
}

/**
 * `onQuery` sees every query run (tests count them; the app passes nothing); `logger` hears of
 * lost connections.
 */
export function createDb(
  connectionString: string,
  poolSize = 10,
  onQuery?: (sql: string, parameters: readonly unknown[]) => void,
  logger?: Pick<Logger, 'warn'>,
): Db {
  const pool = new pg.Pool({
    connectionString,
    max: poolSize,
    connectionTimeoutMillis: 5_000,
    idleTimeoutMillis: 30_000,
  });
  const onError = connectionErrorHandler(logger);
  // Every client gets its own listener (logged once there); the pool repeats an idle client's error.
  pool.on('connect', (client) => client.on('error', onError));
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
