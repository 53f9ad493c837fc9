/**
 * A bank's germination tests as a CSV file (format and checks: assays.csv.ts). The import writes
 * every test of the file in one transaction, or none.
 *
 * Imported tests are history: their seeds are NOT withdrawn from the lot's stock ledger, because
 * a lot's seeds on hand (logged or imported with the lot) already reflect the seeds those tests
 * used. Deleting an imported test later gives no seeds back for the same reason.
 */
import { storedResultSchema, type AssaysImportPreview } from '#shared/schemas/germination';
import { bankToday, type Clock } from '#server/clock';
import type { Db, DbOrTx } from '#server/db/database';
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

  async function insertAssay(
    trx: DbOrTx,
    bankId: string,
    userId: string,
    t: ParsedAssayCsvAssay,
    createdAt: Date,
  ) {
    const assay = await repo.insertAssay(trx, {
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
      created_at: createdAt,
    });
    for (const tray of t.trays) {
      const row = await repo.insertTray(trx, {
        test_id: assay.id,
        position: tray.position,
        seeds_sown: tray.seedsSown,
        abnormal: tray.abnormal,
        ungerminated: tray.ungerminated,
        fresh: tray.fresh,
        dead: tray.dead,
        hard: tray.hard,
        set_aside_reason: tray.setAsideReason,
      });
      if (tray.counts.length > 0) {
        await repo.insertCounts(
          trx,
          tray.counts.map((c) => ({
            tray_id: row.id,
            check_date: c.date,
            cumulative: c.cumulative,
            created_by: userId,
          })),
        );
      }
    }
    return assay.id;
  }

  return {
    /** Every test of the bank, by lot code, start date and the order they were logged. */
    async exportCsv(bankId: string): Promise<string> {
      const assays = await repo.assaysWithLotByCode(db, bankId);
      const { trays, counts } = await repo.traysAndCounts(
        db,
        assays.map((t) => t.id),
      );
      // The stored result every screen shows; one stored under an older definition is brought up
      // to date first, as the test page does.
      const stale = assays
        .filter((t) => t.result_version !== RESULT_VERSION || t.result === null)
        .map((t) => t.id);
      const fresh = await storeResults(db, stale);
      const percentOf = (t: (typeof assays)[number]) =>
        storedResultSchema.parse(fresh.get(t.id) ?? t.result).percentRounded;
      const rows: AssayCsvAssay[] = assays.map((t) => ({
        ...assayFields(t),
        germinationPercent: percentOf(t),
        trays: trays
          .filter((tr) => tr.test_id === t.id)
          .map((tr) => ({
            ...trayFields(tr),
            counts: counts
              .filter((c) => c.tray_id === tr.id)
              .map((c) => ({ date: c.check_date, cumulative: c.cumulative })),
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
      const imported = await db.transaction().execute(async (trx) => {
        // One millisecond apart, so a lot's tests started the same day keep the file's order (the
        // export sorts them by when they were logged).
        const now = clock.now().getTime();
        const ids: string[] = [];
        for (const [i, t] of parsed.assays.entries())
          ids.push(await insertAssay(trx, bankId, userId, t, new Date(now + i)));
        await storeResults(trx, ids);
        return parsed.assays.length;
      });
      return { imported };
    },
  };
}

export type AssaysCsvService = ReturnType<typeof createAssaysCsvService>;
