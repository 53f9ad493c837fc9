import { sql } from 'kysely';
import type { DbOrTx } from '#server/db/database';

export interface LastAssayRow {
  start_date: string;
  status: 'running' | 'finished';
  /** The stored result's whole percent, as the seed-testing rules report it. */
  percent: number;
  /** The percent rests on seeds sown estimated by weight or guess: an "about" figure. */
  estimated: boolean;
}

/**
 * The lot's latest test by start date with a result (at least one tray counted), read from the
 * stored result (germination/assay-results.ts), the same figure every screen shows.
 */
export async function lastCountedAssay(
  db: DbOrTx,
  bankId: string,
  lotId: string,
): Promise<LastAssayRow | null> {
  const row = await db
    .selectFrom('germination_tests')
    .select(['start_date', 'status', sql<number | null>`(result->>'percentRounded')::int`.as('percent')])
    .select(sql<boolean>`coalesce((result->>'seedsSownEstimated')::boolean, false)`.as('estimated'))
    .where('bank_id', '=', bankId)
    .where('lot_id', '=', lotId)
    .where('result_sown', 'is not', null)
    .orderBy('start_date', 'desc')
    .orderBy('created_at', 'desc')
    .limit(1)
    .executeTakeFirst();
  return row && row.percent !== null
    ? { start_date: row.start_date, status: row.status, percent: row.percent, estimated: row.estimated }
    : null;
}
