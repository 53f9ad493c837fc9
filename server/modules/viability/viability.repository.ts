import { sql } from 'kysely';
import type { DbOrTx } from '#server/db/database';

/** A test as the model and the ranking read it: its stored result (germination/assay-results.ts). */
export interface AssayAggregate {
  id: string;
  lot_id: string;
  start_date: string;
  status: 'running' | 'finished';
  /** Null while no tray of the test has been counted. */
  sown: number | null;
  germinated: number | null;
  percent: number | null;
  last_count_date: string | null;
  mean_days: number | null;
  /** Fresh (dormant but alive) seeds recorded at the finish, pooled; null when not recorded. */
  fresh: number | null;
  /** SD of the true number sown in the counted trays: above 0 when they were sown by weight or guess. */
  sown_sd: number | null;
  /** The stored result's 95% interval, percent (Wilson, or widened when seeds sown were estimated). */
  interval_low: number | null;
  interval_high: number | null;
  /** The stored result's trays (JSON): the rough scores of trays scored instead of counted. */
  tray_percents: unknown;
  /** Why the grower set the whole test aside (mouldy towel, too cold); it then leaves the model. */
  set_aside_reason: string | null;
}

/**
 * The stored result's figures the model reads, of a test row under the alias `t`: a test of the
 * bank's (germination_tests) or a test copied from a giver's lot (received_tests).
 */
const storedFigures = [
  sql<number | null>`t.result_sown`.as('sown'),
  sql<number | null>`t.result_germinated`.as('germinated'),
  sql<number | null>`t.result_percent`.as('percent'),
  sql<string | null>`t.result_last_count_date`.as('last_count_date'),
  sql<number | null>`t.result_mean_days`.as('mean_days'),
  sql<number | null>`(t.result->>'fresh')::int`.as('fresh'),
  sql<number | null>`(t.result->>'sownSd')::float8`.as('sown_sd'),
  sql<number | null>`(t.result->'interval'->>'low')::float8`.as('interval_low'),
  sql<number | null>`(t.result->'interval'->>'high')::float8`.as('interval_high'),
  sql<unknown>`t.result->'trayPercents'`.as('tray_percents'),
];

/**
 * The tests of the bank's lots of the given species, with their stored results, oldest first. A lot
 * received from another bank by an offer carries the giver's finished tests as its own evidence
 * (read-only: they are copies in received_tests, never set aside, always finished).
 */
export async function assayAggregates(
  db: DbOrTx,
  bankId: string,
  speciesIds: string[],
): Promise<AssayAggregate[]> {
  if (speciesIds.length === 0) return [];
  const received = db
    .selectFrom('received_tests as t')
    .innerJoin('lots as l', 'l.id', 't.lot_id')
    .select(['t.id', 't.lot_id', 't.start_date'])
    .select([
      sql<'finished'>`'finished'`.as('status'),
      sql<string | null>`null::text`.as('set_aside_reason'),
      // Before the bank's own tests of the same day.
      sql<Date>`'-infinity'::timestamptz`.as('created_at'),
    ])
    .select(storedFigures)
    .where('t.bank_id', '=', bankId)
    .where('l.species_id', 'in', speciesIds);
  return db
    .selectFrom('germination_tests as t')
    .innerJoin('lots as l', 'l.id', 't.lot_id')
    .select(['t.id', 't.lot_id', 't.start_date', 't.status', 't.set_aside_reason', 't.created_at'])
    .select(storedFigures)
    .where('t.bank_id', '=', bankId)
    .where('l.species_id', 'in', speciesIds)
    .unionAll(received)
    .orderBy('start_date')
    .orderBy('created_at')
    .execute();
}

/** Each species' viability stamp in the bank: it moves whenever an input of its fits changes. */
export async function viabilityStamps(db: DbOrTx, bankId: string): Promise<Map<string, string>> {
  const rows = await db
    .selectFrom('viability_stamps')
    .select(['species_id', 'stamp'])
    .where('bank_id', '=', bankId)
    .execute();
  return new Map(rows.map((r) => [r.species_id, String(r.stamp)]));
}

/** The bank's settings the decisions read. */
export const viabilitySettings = (db: DbOrTx, bankId: string) =>
  db
    .selectFrom('banks')
    .select(['sow_threshold_percent', 'establishment_factor', 'sowing_assurance', 'time_zone'])
    .where('id', '=', bankId)
    .executeTakeFirstOrThrow();

/** Seeds the bank's unsown plan entries need, summed by lot. */
export const unsownSeedsByLot = (db: DbOrTx, bankId: string) =>
  db
    .selectFrom('plan_entries')
    .select(['lot_id', sql<number>`sum(seeds_to_sow)::int`.as('seeds')])
    .where('bank_id', '=', bankId)
    .where('sown_on', 'is', null)
    .where('lot_id', 'is not', null)
    .groupBy('lot_id')
    .execute();

/** The lot's species, when the lot is in the bank. */
export const lotSpecies = (db: DbOrTx, bankId: string, lotId: string) =>
  db
    .selectFrom('lots')
    .select('species_id')
    .where('id', '=', lotId)
    .where('bank_id', '=', bankId)
    .executeTakeFirst();
