import type { Selectable, Updateable } from 'kysely';
import type { z } from 'zod';
import {
  storedResultSchema,
  type CountsBody,
  type CreateTestBody,
  type FinishBody,
  type TestDetail,
  type updateTestBodySchema,
} from '#shared/schemas/germination';
import { addDays, daysBetween } from '#shared/dates';
import { bankToday, type Clock } from '#server/clock';
import type { Db, DbOrTx } from '#server/db/database';
import type { GerminationTestTable, TestTrayTable } from '#server/db/schema';
import { AppError, conflict, notFound, unprocessable } from '#server/http/errors';
import { clopperPearsonInterval, type IntervalMethod } from '#server/stats/index';
import { findSpecies } from '../species/species.service';
import { insertMovement, lockLot, stockOf, updateLot } from '../lots/lots.repository';
import * as repo from './germination.repository';
import { countProblems, finishProblem, startBeforeHarvest, uncountedAtFinish } from './count-rules';
import { resultWords } from './result-words';
import { RESULT_VERSION, storeResult } from './test-results';

const num = (v: string | null) => (v === null ? null : Number(v));

/** The exact interval of a stored result's pooled counts, on request instead of Wilson's. */
function cpInterval(germinated: number, sown: number, confidence: number) {
  const b = clopperPearsonInterval(germinated, sown, confidence);
  return { low: 100 * b.low, high: 100 * b.high, method: 'clopper-pearson' as const, confidence };
}

export interface GerminationDeps {
  db: Db;
  clock: Clock;
  removeSubjectPhotos: (
    db: DbOrTx,
    bankId: string,
    subject: 'tray',
    subjectId: string,
  ) => Promise<() => Promise<void>>;
}

/** What a test is, in the API's names (the detail and the CSV export both give it). */
export function testFields(t: repo.TestWithLot) {
  return {
    lotCode: t.lot_code,
    speciesName: t.common_name,
    variety: t.variety,
    startDate: t.start_date,
    method: t.method,
    medium: t.medium,
    temperatureC: num(t.temperature_c),
    lightHours: num(t.light_hours),
    pretreatment: t.pretreatment,
    pretreatmentDays: t.pretreatment_days,
    notes: t.notes,
    finishedOn: t.finished_on,
  };
}

/** What a tray is, in the API's names. */
export function trayFields(tr: Selectable<TestTrayTable>) {
  return {
    position: tr.position,
    seedsSown: tr.seeds_sown,
    abnormal: tr.abnormal,
    ungerminated: tr.ungerminated,
    fresh: tr.fresh,
    dead: tr.dead,
    hard: tr.hard,
    setAsideReason: tr.set_aside_reason,
  };
}

export { lotHasTests } from './germination.repository';

export function createGerminationService({ db, clock, removeSubjectPhotos }: GerminationDeps) {
  const today = (on: DbOrTx, bankId: string) => bankToday(on, clock, bankId);

  async function loadTest(on: DbOrTx, bankId: string, testId: string, lock = false) {
    const row = await repo.findTest(on, bankId, testId, lock);
    if (!row) throw notFound('No such germination test in this bank.');
    return row;
  }

  async function detail(
    bankId: string,
    testId: string,
    intervalMethod: IntervalMethod = 'wilson',
    on: DbOrTx = db,
  ): Promise<TestDetail> {
    const t = await loadTest(on, bankId, testId);
    const { trays, counts } = await repo.traysAndCounts(on, [testId]);
    const species = await findSpecies(on, bankId, t.species_id);
    const first = species?.traits.firstCountDay ?? null;
    const final = species?.traits.finalCountDay ?? null;
    const schedule = {
      firstCountDate: first !== null ? addDays(t.start_date, first) : null,
      finalCountDate: final !== null ? addDays(t.start_date, final) : null,
    };
    // What the test took from the lot's ledger (none for a test imported as history): what its
    // deletion gives back.
    const seedsTaken = await repo.seedsTakenBy(on, testId);
    // The stored result (test-results.ts); one stored under an older definition is brought up to date.
    const stored = storedResultSchema.parse(
      t.result_version === RESULT_VERSION && t.result !== null ? t.result : await storeResult(on, testId),
    );
    const summary =
      intervalMethod === 'clopper-pearson' &&
      stored.interval &&
      stored.sown !== null &&
      stored.germinated !== null
        ? { ...stored, interval: cpInterval(stored.germinated, stored.sown, stored.interval.confidence) }
        : stored;
    return {
      test: {
        id: t.id,
        lotId: t.lot_id,
        ...testFields(t),
        status: t.status,
        setAsideReason: t.set_aside_reason,
        seedsTaken,
        schedule,
        createdAt: t.created_at.toISOString(),
      },
      trays: trays.map((tr) => ({ id: tr.id, ...trayFields(tr) })),
      counts: counts.map((c) => ({
        trayId: c.tray_id,
        date: c.check_date,
        day: daysBetween(t.start_date, c.check_date),
        cumulative: c.cumulative,
      })),
      result: { ...summary, summary: resultWords(summary, schedule.firstCountDate, t.status === 'finished') },
    };
  }

  function assertRunning(t: { status: string }) {
    if (t.status !== 'running') {
      throw conflict('This test is finished and read-only. Reopen it to change its counts.', 'test_finished');
    }
  }

  return {
    detail,

    async create(bankId: string, lotId: string, userId: string, body: CreateTestBody) {
      if (body.startDate > (await today(db, bankId))) {
        throw unprocessable('A test cannot start in the future.', {
          startDate: 'Use today or an earlier date.',
        });
      }
      const testId = await db.transaction().execute(async (trx) => {
        const lot = await lockLot(trx, bankId, lotId);
        if (!lot) throw notFound('No such lot in this bank.');
        const early = startBeforeHarvest(body.startDate, lot.harvest_date, lot.code);
        if (early) throw unprocessable(early, { startDate: 'Use a date on or after the harvest.' });
        const needed = body.trays.reduce((s, t) => s + t.seedsSown, 0);
        const onHand = await stockOf(trx, lotId);
        if (onHand < needed) {
          throw new AppError(
            409,
            'stock_short',
            `The trays need ${needed} seeds but the ledger shows ${onHand} on hand. If you have more than that, record a correction in the stock ledger first.`,
          );
        }
        const test = await repo.insertTest(trx, {
          bank_id: bankId,
          lot_id: lotId,
          start_date: body.startDate,
          method: body.method,
          medium: body.medium ?? null,
          temperature_c: body.temperatureC ?? null,
          light_hours: body.lightHours ?? null,
          pretreatment: body.pretreatment ?? 'none',
          pretreatment_days: body.pretreatmentDays ?? null,
          notes: body.notes ?? null,
          created_by: userId,
        });
        await repo.insertTrays(
          trx,
          body.trays.map((t, i) => ({ test_id: test.id, position: i + 1, seeds_sown: t.seedsSown })),
        );
        await insertMovement(trx, {
          lot_id: lotId,
          kind: 'test',
          change: -needed,
          date: body.startDate,
          reason: `Germination test: ${needed} seeds in ${body.trays.length} ${body.trays.length === 1 ? 'tray' : 'trays'}`,
          created_by: userId,
          test_id: test.id,
        });
        if (onHand === needed && lot.status === 'active') {
          await updateLot(trx, lotId, { status: 'depleted' });
        }
        await storeResult(trx, test.id);
        return test.id;
      });
      return detail(bankId, testId);
    },

    async listForLot(bankId: string, lotId: string) {
      const ids = await repo.testIdsOfLot(db, bankId, lotId);
      return Promise.all(ids.map((id) => detail(bankId, id)));
    },

    async update(bankId: string, testId: string, body: z.infer<typeof updateTestBodySchema>) {
      await db.transaction().execute(async (trx) => {
        const t = await loadTest(trx, bankId, testId, true);
        assertRunning(t);
        const changes: Updateable<GerminationTestTable> = { updated_at: clock.now() };
        if (body.method !== undefined) changes.method = body.method;
        if (body.medium !== undefined) changes.medium = body.medium;
        if (body.temperatureC !== undefined) changes.temperature_c = body.temperatureC;
        if (body.lightHours !== undefined) changes.light_hours = body.lightHours;
        if (body.pretreatment !== undefined) changes.pretreatment = body.pretreatment;
        if (body.pretreatmentDays !== undefined) changes.pretreatment_days = body.pretreatmentDays;
        if (body.notes !== undefined) changes.notes = body.notes;
        await repo.updateTest(trx, testId, changes);
      });
      return detail(bankId, testId);
    },

    /** Records (or corrects) the cumulative counts of one check date; every rule is checked first. */
    async recordCounts(bankId: string, testId: string, userId: string, body: CountsBody) {
      await db.transaction().execute(async (trx) => {
        const t = await loadTest(trx, bankId, testId, true);
        assertRunning(t);
        if (body.date < t.start_date) {
          throw unprocessable(`A count cannot be dated before the test started (${t.start_date}).`, {
            date: 'Use a date on or after the start.',
          });
        }
        if (body.date > (await today(trx, bankId)))
          throw unprocessable('A count cannot be dated in the future.', {
            date: 'Use today or an earlier date.',
          });
        const trays = await repo.traysOf(trx, testId);
        const saved = trays.length
          ? await repo.countsOtherThan(
              trx,
              trays.map((tr) => tr.id),
              body.date,
            )
          : [];
        const problems = countProblems(body, t.start_date, trays, saved);
        if (problems.length > 0) {
          const n = problems.length;
          throw unprocessable(
            `Nothing was saved: ${n} ${n === 1 ? 'tray needs' : 'trays need'} correcting. ${problems.map((p) => p.message).join(' ')}`,
            Object.fromEntries(problems.map((p) => [p.field, p.message])),
          );
        }
        for (const entry of body.trays) {
          await repo.upsertCount(trx, entry.trayId, body.date, entry.cumulative, userId);
        }
        await storeResult(trx, testId);
      });
      return detail(bankId, testId);
    },

    /** Removes one check date's counts; cumulative order cannot break by removing a point. */
    async deleteCounts(bankId: string, testId: string, date: string) {
      await db.transaction().execute(async (trx) => {
        const t = await loadTest(trx, bankId, testId, true);
        assertRunning(t);
        const trayIds = await repo.trayIdsOf(trx, testId);
        const res = await repo.deleteCountsOn(trx, trayIds, date);
        if (!res.numDeletedRows) throw notFound(`No counts on ${date}.`);
        await storeResult(trx, testId);
      });
      return detail(bankId, testId);
    },

    async finish(bankId: string, testId: string, body: FinishBody) {
      await db.transaction().execute(async (trx) => {
        const t = await loadTest(trx, bankId, testId, true);
        assertRunning(t);
        const trays = await repo.traysInOrder(trx, testId);
        const counts = await repo.countsOfTrays(
          trx,
          trays.map((tr) => tr.id),
        );
        const lastDate = counts.at(-1)?.check_date ?? t.start_date;
        if (body.date < lastDate)
          throw unprocessable(`The test cannot finish before its last count (${lastDate}).`, {
            date: `On or after ${lastDate}.`,
          });
        if (body.date > (await today(trx, bankId)))
          throw unprocessable('A test cannot finish in the future.', {
            date: 'Use today or an earlier date.',
          });
        if (body.trays.some((e) => !trays.some((tr) => tr.id === e.trayId)))
          throw unprocessable('A tray listed is not part of this test.');
        const given = new Map(body.trays.map((e, i) => [e.trayId, { ...e, index: i }]));
        let inFigures = 0;
        for (const tray of trays) {
          const entry = given.get(tray.id);
          if (!entry) {
            // A tray set aside while the test ran stays aside; any other needs its figures.
            if (tray.set_aside_reason !== null) continue;
            throw unprocessable(
              `Give the abnormal and ungerminated seeds of tray ${tray.position}, or a reason to set it aside.`,
            );
          }
          if (entry.setAsideReason !== undefined) {
            await repo.updateTray(trx, tray.id, {
              set_aside_reason: entry.setAsideReason,
              abnormal: null,
              ungerminated: null,
              fresh: null,
              dead: null,
              hard: null,
            });
            continue;
          }
          const mine = counts.filter((c) => c.tray_id === tray.id);
          if (mine.length === 0)
            throw unprocessable(uncountedAtFinish(tray.position), {
              [`trays.${entry.index}.setAsideReason`]: 'Count this tray first, or set it aside.',
            });
          const figures = {
            abnormal: entry.abnormal ?? 0,
            ungerminated: entry.ungerminated ?? 0,
            fresh: entry.fresh,
            dead: entry.dead,
            hard: entry.hard,
          };
          const problem = finishProblem(tray, mine.at(-1)!.cumulative, figures);
          if (problem)
            throw unprocessable(problem.message, { [`trays.${entry.index}.${problem.field}`]: problem.hint });
          await repo.updateTray(trx, tray.id, {
            ...figures,
            fresh: figures.fresh ?? null,
            dead: figures.dead ?? null,
            hard: figures.hard ?? null,
            set_aside_reason: null,
          });
          inFigures += 1;
        }
        if (inFigures === 0) {
          throw unprocessable(
            'Every tray is set aside, so the test has no result. Keep at least one counted tray, or delete the test if it failed.',
          );
        }
        await repo.updateTest(trx, testId, {
          status: 'finished',
          finished_on: body.date,
          updated_at: clock.now(),
        });
        await storeResult(trx, testId);
      });
      return detail(bankId, testId);
    },

    /** Sets the whole test aside with a reason (running or finished), or takes it back. */
    async setTestAside(bankId: string, testId: string, reason: string | null) {
      await db.transaction().execute(async (trx) => {
        await loadTest(trx, bankId, testId, true);
        await repo.updateTest(trx, testId, { set_aside_reason: reason, updated_at: clock.now() });
      });
      return detail(bankId, testId);
    },

    /** Sets a tray aside with a reason (spilled, dried out), or takes it back, while the test runs. */
    async setTrayAside(bankId: string, testId: string, trayId: string, reason: string | null) {
      await db.transaction().execute(async (trx) => {
        const t = await loadTest(trx, bankId, testId, true);
        assertRunning(t);
        const res = await repo.setTrayAsideReason(trx, testId, trayId, reason);
        if (!res.numUpdatedRows) throw notFound('No such tray in this test.');
        await storeResult(trx, testId);
      });
      return detail(bankId, testId);
    },

    async reopen(bankId: string, testId: string) {
      await db.transaction().execute(async (trx) => {
        const t = await loadTest(trx, bankId, testId, true);
        if (t.status === 'running') throw conflict('This test is still running.', 'test_running');
        await repo.updateTest(trx, testId, { status: 'running', finished_on: null, updated_at: clock.now() });
      });
      return detail(bankId, testId);
    },

    /** Deletes a test entered by mistake; its seeds go back to the lot with its ledger line. */
    async remove(bankId: string, testId: string) {
      const cleanups = await db.transaction().execute(async (trx) => {
        await loadTest(trx, bankId, testId, true);
        const trayIds = await repo.trayIdsOf(trx, testId);
        const done = [];
        for (const trayId of trayIds) done.push(await removeSubjectPhotos(trx, bankId, 'tray', trayId));
        await repo.deleteTest(trx, testId);
        return done;
      });
      for (const cleanup of cleanups) await cleanup();
    },
  };
}

export type GerminationService = ReturnType<typeof createGerminationService>;
