// A germination test's result is one stored fact: computed by summarizeTest (server/stats) from the
// test's trays and counts, and stored on the test in the same transaction as every write that
// changes them. Every reader — test page, lot page, ranking, viability model, overview, labels,
// reminders, CSV export — reads the stored result; nothing re-aggregates counts by its own rules.
import { daysBetween } from '#shared/dates';
import type { Selectable } from 'kysely';
import type { DbOrTx } from '#server/db/database';
import type { TestTrayTable } from '#server/db/schema';
import { summarizeTest, type AssaySummary, type RoughScore } from '#server/stats/index';
import * as repo from './germination.repository';

/**
 * The definition of the stored result. Raise it whenever summarizeTest or its inputs change
 * meaning: every test stored under an older version is recomputed by refreshStaleResults.
 */
export const RESULT_VERSION = 3;

/** The summaries of the given tests, computed from their trays and counts as they stand in `on`. */
async function computeResults(on: DbOrTx, assayIds: string[]): Promise<Map<string, AssaySummary>> {
  const out = new Map<string, AssaySummary>();
  if (assayIds.length === 0) return out;
  const assays = await repo.assayStartDates(on, assayIds);
  const trays = await repo.traysOfAssays(on, assayIds);
  const trayIds = trays.map((t) => t.id);
  const counts = trays.length ? await repo.countsOfTrays(on, trayIds) : [];
  const countsByTray = new Map<string, typeof counts>();
  for (const c of counts) countsByTray.set(c.tray_id, [...(countsByTray.get(c.tray_id) ?? []), c]);
  // A scored tray enters the result by its latest score (scores come by date).
  const latestScore = new Map<string, RoughScore>();
  if (trays.length)
    for (const sc of await repo.scoresOfTrays(on, trayIds)) latestScore.set(sc.tray_id, sc.score);
  for (const assay of assays) {
    const mine = trays.filter((t) => t.test_id === assay.id);
    out.set(
      assay.id,
      summarizeTest(
        mine.map((tr) => ({
          id: tr.id,
          ...sownOf(tr),
          score: latestScore.get(tr.id) ?? null,
          checks: (countsByTray.get(tr.id) ?? []).map((c) => ({
            day: daysBetween(assay.start_date, c.check_date),
            cumulative: c.cumulative,
          })),
          setAsideReason: tr.set_aside_reason,
          abnormal: tr.abnormal,
          ungerminated: tr.ungerminated,
          fresh: tr.fresh,
          dead: tr.dead,
          hard: tr.hard,
        })),
      ),
    );
  }
  return out;
}

/** A tray's seeds sown as the statistics take them: the count, or the estimate made at creation. */
function sownOf(tr: Selectable<TestTrayTable>): { seedsSown: number; sownSd: number } {
  if (tr.seeds_sown !== null) return { seedsSown: tr.seeds_sown, sownSd: 0 };
  return { seedsSown: tr.sown_mean ?? Number.NaN, sownSd: tr.sown_sd ?? 0 };
}

/** The last check date of the trays that enter the figures (set-aside trays are left out). */
async function lastCountDates(on: DbOrTx, assayIds: string[]): Promise<Map<string, string>> {
  if (assayIds.length === 0) return new Map();
  const rows = await repo.lastCountRows(on, assayIds);
  return new Map(rows.map((r) => [r.test_id, r.last]));
}

/**
 * Recomputes and stores the results of the given tests. Call it inside the transaction that changed
 * their trays or counts, after the change; it returns the new summaries by test id.
 */
export async function storeResults(on: DbOrTx, assayIds: string[]): Promise<Map<string, AssaySummary>> {
  const ids = [...new Set(assayIds)];
  const results = await computeResults(on, ids);
  const last = await lastCountDates(on, ids);
  if (results.size === 0) return results;
  // One statement for the batch: the start-up refresh may recompute thousands of tests.
  const rows = [...results].map(([testId, r]) => ({ testId, r }));
  await repo.writeResults(on, rows, last, RESULT_VERSION);
  return results;
}

/** Stores one test's result (see storeResults). */
export async function storeResult(on: DbOrTx, assayId: string): Promise<AssaySummary> {
  const r = (await storeResults(on, [assayId])).get(assayId);
  if (!r) throw new Error(`no germination test ${assayId}`);
  return r;
}

/**
 * Computes the result of every test stored under an older definition (or never), in batches.
 * Run at start after the migrations, and after writes that bypass the services (the benchmark's
 * bulk seeding). Returns how many tests were recomputed.
 */
export async function refreshStaleResults(db: DbOrTx, batchSize = 500): Promise<number> {
  let done = 0;
  for (;;) {
    const stale = await repo.staleAssayIds(db, RESULT_VERSION, batchSize);
    if (stale.length === 0) return done;
    await storeResults(
      db,
      stale.map((s) => s.id),
    );
    done += stale.length;
  }
}
