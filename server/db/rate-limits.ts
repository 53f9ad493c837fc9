import { sql } from 'kysely';
import type { DbOrTx } from './database';

/** One counter of a rate limit after an attempt: how many in its window, and when that ends. */
export interface Counted {
  key: string;
  hits: number;
  resetAt: Date;
}

/**
 * Counts one attempt on each key in one statement, every server into the same rows: a key whose
 * window has ended (or that is new) starts a window of `windowMs` from `now` at one. Rows are
 * written in key order, so two servers counting the same keys at once never wait on each other
 * in a circle.
 */
export async function countAttempts(
  db: DbOrTx,
  keys: { key: string; windowMs: number }[],
  now: Date,
): Promise<Counted[]> {
  if (keys.length === 0) return [];
  const rows = [...keys]
    .sort((a, b) => (a.key < b.key ? -1 : a.key > b.key ? 1 : 0))
    .map((k) => ({ key: k.key, hits: 1, reset_at: new Date(now.getTime() + k.windowMs) }));
  const counted = await db
    .insertInto('rate_limits')
    .values(rows)
    .onConflict((oc) =>
      oc.column('key').doUpdateSet({
        // Both read the row as it was before this attempt.
        hits: sql<number>`case when rate_limits.reset_at <= ${now} then 1 else rate_limits.hits + 1 end`,
        reset_at: sql<Date>`case when rate_limits.reset_at <= ${now} then excluded.reset_at else rate_limits.reset_at end`,
      }),
    )
    .returning(['key', 'hits', 'reset_at'])
    .execute();
  return counted.map((row) => ({ key: row.key, hits: row.hits, resetAt: row.reset_at }));
}

/** Takes back one attempt from each counter, if its window is still the one it was counted in. */
export async function uncountAttempts(db: DbOrTx, counted: Counted[]): Promise<void> {
  if (counted.length === 0) return;
  await db
    .updateTable('rate_limits')
    .set({ hits: sql<number>`hits - 1` })
    .where('hits', '>', 0)
    .where((eb) => eb.or(counted.map((c) => eb.and([eb('key', '=', c.key), eb('reset_at', '=', c.resetAt)]))))
    .execute();
}

/** Forgets counters whose window has ended (the next attempt would start them again anyway). */
export async function sweepEndedCounters(db: DbOrTx, now: Date): Promise<void> {
  await db.deleteFrom('rate_limits').where('reset_at', '<=', now).execute();
}
