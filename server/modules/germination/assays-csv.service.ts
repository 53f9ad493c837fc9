/**
 * A bank's germination tests as a CSV file (format and checks: assays.csv.ts). The import writes
 * every test of the file in one short transaction of multi-row inserts, or none.
 *
 * Imported tests are history: their seeds are NOT withdrawn from the lot's stock ledger, because
 * a lot's seeds on hand (logged or imported with the lot) already reflect the seeds those tests
 * used. Deleting an imported test later gives no seeds back for the same reason.
 */
import { storedResultSchema, type AssaysImportPreview } from '#shared/schemas/germination';
import { bankToday, type Clock } from '#server/clock';
import crypto from 'node:crypto';
import type { Insertable } from 'kysely';
import { inBatches } from '#server/db/batches';
import type { Db } from '#server/db/database';
import type { GerminationTestTable, TestTrayTable } from '#server/db/schema';
import { invalidCsv } from '#server/http/errors';
import * as repo from './germination.repository';
import { assayFields, trayFields } from './germination.service';
import { RESULT_VERSION, storeResults } from './assay-results';
import { parseAssaysCsv, assaysToCsv, type ParsedAssayCsvAssay, type AssayCsvAssay } from './assays.csv';

export function createAssaysCsvService({ db, clock }: { db: Db; clock: Clock }) {
  async function bankLots(bankId: string) {
    const rows = await repo.lotsForImport(db, bankId);
    return new Map(rows.map((r) => [r.code.toLowerCase(), r]));
  }

  /** The rows a file's tests write, their ids made here so trays and counts can name them. */
  function assayRows(bankId: string, userId: string, assays: ParsedAssayCsvAssay[]) {
    // One millisecond apart, so a lot's tests started the same day keep the file's order (the
    // export sorts them by when they were logged).
    const now = clock.now().getTime();
    const tests: Insertable<GerminationTestTable>[] = [];
    const trays: Insertable<TestTrayTable>[] = [];
    const counts: { tray_id: string; check_date: string; cumulative: number; created_by: string }[] = [];
    for (const [i, t] of assays.entries()) {
      const id = crypto.randomUUID();
      tests.push({
        id,
        bank_id: bankId,
        lot_id: t.lotId,
        start_date: t.startDate,
        method: t.method,
        medium: t.medium,
        temperature_c: t.temperatureC,
        light_hours: t.lightHours,
        pretreatment: t.pretreatment,
        pretreatment_days: t.pretreatmentDays,
        notes: t.notes,
        status: t.finishedOn === null ? 'running' : 'finished',
        finished_on: t.finishedOn,
        created_by: userId,
        created_at: new Date(now + i),
      });
      for (const tray of t.trays) {
        const trayId = crypto.randomUUID();
        trays.push({
          id: trayId,
          test_id: id,
          position: tray.position,
          seeds_sown: tray.seedsSown,
          abnormal: tray.abnormal,
          ungerminated: tray.ungerminated,
          fresh: tray.fresh,
          dead: tray.dead,
          hard: tray.hard,
          set_aside_reason: tray.setAsideReason,
        });
        for (const c of tray.counts) {
          counts.push({ tray_id: trayId, check_date: c.date, cumulative: c.cumulative, created_by: userId });
        }
      }
    }
    return { tests, trays, counts, ids: tests.map((t) => t.id!) };
  }

  return {
    /** Every test of the bank, by lot code, start date and the order they were logged. */
    async exportCsv(bankId: string): Promise<string> {
      const assays = await repo.assaysWithLotByCode(db, bankId);
      const { trays, counts, scores } = await repo.traysAndCounts(
        db,
        assays.map((t) => t.id),
      );
      // The stored result every screen shows; one stored under an older definition is brought up
      // to date first, as the test page does.
      const stale = assays
        .filter((t) => t.result_version !== RESULT_VERSION || t.result === null)
        .map((t) => t.id);
      const fresh = await storeResults(db, stale);
      const resultOf = (t: (typeof assays)[number]) => storedResultSchema.parse(fresh.get(t.id) ?? t.result);
      const rows: AssayCsvAssay[] = assays.map((t) => ({
        ...assayFields(t),
        germinationPercent: resultOf(t).percentRounded,
        seedsSownEstimated: resultOf(t).seedsSownEstimated,
        trays: trays
          .filter((tr) => tr.test_id === t.id)
          .map((tr) => ({
            ...trayFields(tr),
            counts: counts
              .filter((c) => c.tray_id === tr.id)
              .map((c) => ({ date: c.check_date, cumulative: c.cumulative })),
            scores: scores
              .filter((c) => c.tray_id === tr.id)
              .map((c) => ({ date: c.check_date, score: c.score })),
          })),
      }));
      return assaysToCsv(rows);
    },

    /**
     * Checks the whole file against the bank's lots and today; refuses it with every problem, or
     * (dry run) says what it would add, or adds every test in one transaction.
     */
    async importCsv(bankId: string, userId: string, text: string, options: { dryRun: boolean }) {
      const lots = await bankLots(bankId);
      const today = await bankToday(db, clock, bankId);
      const harvests = new Map([...lots.values()].map((l) => [l.id, l.harvest_date]));
      const parsed = parseAssaysCsv(text, {
        today,
        resolveLot: (code) => lots.get(code.toLowerCase())?.id ?? null,
        harvestDateOf: (lotId) => harvests.get(lotId) ?? null,
      });
      if (!parsed.ok) throw invalidCsv(parsed.errors);
      if (options.dryRun) {
        const byId = new Map([...lots.values()].map((l) => [l.id, l]));
        const preview: AssaysImportPreview = parsed.assays.map((t) => {
          const lot = byId.get(t.lotId)!;
          return {
            line: t.line,
            test: t.ref,
            lotCode: lot.code,
            species: lot.common_name,
            variety: lot.variety,
            startDate: t.startDate,
            trays: t.trays.length,
            seedsSown: t.trays.reduce((s, tr) => s + tr.seedsSown, 0),
            checkDays: new Set(t.trays.flatMap((tr) => tr.counts.map((c) => c.date))).size,
            finishedOn: t.finishedOn,
          };
        });
        return { preview };
      }
      // Prepared before the transaction, written in multi-row batches inside it: a file of
      // thousands of tests holds a connection only for those statements.
      const rows = assayRows(bankId, userId, parsed.assays);
      const imported = await db.transaction().execute(async (trx) => {
        await inBatches(rows.tests, 500, (batch) => repo.insertAssays(trx, batch));
        await inBatches(rows.trays, 1000, (batch) => repo.insertTrays(trx, batch));
        await inBatches(rows.counts, 2000, (batch) => repo.insertCounts(trx, batch));
        await inBatches(rows.ids, 1000, (batch) => storeResults(trx, batch));
        return parsed.assays.length;
      });
      return { imported };
    },
  };
}

export type AssaysCsvService = ReturnType<typeof createAssaysCsvService>;
