import type { Selectable, Updateable } from 'kysely';
import type { z } from 'zod';
import {
  storedResultSchema,
  traySownOf,
  type CountsBody,
  type CreateAssayBody,
  type FinishBody,
  type AssayDetail,
  type TraySownRead,
  type updateAssayBodySchema,
} from '#shared/schemas/germination';
import { addDays, daysBetween } from '#shared/dates';
import { roleAtLeast } from '#server/auth/bank-access';
import { bankToday, type Clock } from '#server/clock';
import type { Db, DbOrTx } from '#server/db/database';
import type { GerminationTestTable, TestTrayTable } from '#server/db/schema';
import { AppError, conflict, notFound, unprocessable } from '#server/http/errors';
import { clopperPearsonInterval, type IntervalMethod } from '#server/stats/index';
import { findSpecies } from '../species/species.shared.repository';
import {
  insertMovement,
  lockLot,
  seedWeightSourcesForLot,
  stockOf,
  updateLot,
} from '../lots/lots.shared.repository';
import * as repo from './germination.repository';
import { countProblems, finishProblem, startBeforeHarvest, uncountedAtFinish } from './count-rules';
import { resultWords } from './result-words';
import { estimateSown } from './tray-sown';
import { RESULT_VERSION, storeResult } from './assay-results';
import { dayInWords } from '#shared/day-words';

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
export function assayFields(t: repo.AssayWithLot) {
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

/** How a tray was sown, in the API's names: with the estimate made at creation when not counted. */
export function traySown(tr: Selectable<TestTrayTable>): TraySownRead {
  return {
    by: tr.sown_by,
    seeds: tr.seeds_sown,
    grams: tr.sown_grams,
    about: tr.sown_guess,
    estimate:
      tr.sown_mean === null
        ? null
        : {
            mean: tr.sown_mean,
            sd: tr.sown_sd ?? 0,
            low: tr.sown_low ?? tr.sown_mean,
            high: tr.sown_high ?? tr.sown_mean,
            basis: tr.sown_basis,
            purityAssumed: tr.sown_purity_assumed,
          },
  };
}

/** What a tray is, in the API's names. */
export function trayFields(tr: Selectable<TestTrayTable>) {
  return {
    position: tr.position,
    seedsSown: tr.seeds_sown,
    sown: traySown(tr),
    abnormal: tr.abnormal,
    ungerminated: tr.ungerminated,
    fresh: tr.fresh,
    dead: tr.dead,
    hard: tr.hard,
    setAsideReason: tr.set_aside_reason,
  };
}

export { lotHasAssays } from './germination.repository';

export function createGerminationService({ db, clock, removeSubjectPhotos }: GerminationDeps) {
  const today = (on: DbOrTx, bankId: string) => bankToday(on, clock, bankId);

  async function loadAssay(on: DbOrTx, bankId: string, assayId: string, lock = false) {
    const row = await repo.findAssay(on, bankId, assayId, lock);
    if (!row) throw notFound('No such germination test in this bank.');
    return row;
  }

  async function detail(
    bankId: string,
    assayId: string,
    intervalMethod: IntervalMethod = 'wilson',
    on: DbOrTx = db,
  ): Promise<AssayDetail> {
    const t = await loadAssay(on, bankId, assayId);
    const { trays, counts, scores } = await repo.traysAndCounts(on, [assayId]);
    const species = await findSpecies(on, bankId, t.species_id);
    const first = species?.traits.firstCountDay ?? null;
    const final = species?.traits.finalCountDay ?? null;
    const schedule = {
      firstCountDate: first !== null ? addDays(t.start_date, first) : null,
      finalCountDate: final !== null ? addDays(t.start_date, final) : null,
    };
    // What the test took from the lot's ledger (none for a test imported as history): what its
    // deletion gives back.
    const seedsTaken = await repo.seedsTakenBy(on, assayId);
    // The stored result (assay-results.ts); one stored under an older definition is brought up to date.
    const stored = storedResultSchema.parse(
      t.result_version === RESULT_VERSION && t.result !== null ? t.result : await storeResult(on, assayId),
    );
    // The exact interval is for counted seeds; an estimated number sown keeps its widened interval.
    const summary =
      intervalMethod === 'clopper-pearson' &&
      !stored.seedsSownEstimated &&
      stored.interval &&
      stored.sown !== null &&
      stored.germinated !== null
        ? { ...stored, interval: cpInterval(stored.germinated, stored.sown, stored.interval.confidence) }
        : stored;
    return {
      test: {
        id: t.id,
        lotId: t.lot_id,
        ...assayFields(t),
        status: t.status,
        setAsideReason: t.set_aside_reason,
        seedsTaken,
        runnerId: t.run_by,
        runnerName: t.runner_name,
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
      scores: scores.map((c) => ({
        trayId: c.tray_id,
        date: c.check_date,
        day: daysBetween(t.start_date, c.check_date),
        score: c.score,
      })),
      result: {
        ...summary,
        summary: resultWords(
          summary,
          schedule.firstCountDate,
          t.status === 'finished',
          new Map(trays.map((tr) => [tr.id, traySown(tr)])),
        ),
      },
    };
  }

  /** A test is run by someone who may count it: an owner or grower of the bank. */
  async function assertRunner(on: DbOrTx, bankId: string, userId: string) {
    const member = await repo.memberRole(on, bankId, userId);
    if (!member || !roleAtLeast(member.role, 'grower')) {
      throw unprocessable(
        member
          ? 'A viewer cannot run a test: choose an owner or grower of this bank.'
          : 'That person is not a member of this bank: choose an owner or grower of this bank.',
        { runnerId: 'Choose an owner or grower of this bank.' },
      );
    }
  }

  function assertRunning(t: { status: string }) {
    if (t.status !== 'running') {
      throw conflict('This test is finished and read-only. Reopen it to change its counts.', 'test_finished');
    }
  }

  return {
    detail,

    async create(bankId: string, lotId: string, userId: string, body: CreateAssayBody) {
      if (body.startDate > (await today(db, bankId))) {
        throw unprocessable('A test cannot start in the future.', {
          startDate: 'Use today or an earlier date.',
        });
      }
      const assayId = await db.transaction().execute(async (trx) => {
        const lot = await lockLot(trx, bankId, lotId);
        if (!lot) throw notFound('No such lot in this bank.');
        const early = startBeforeHarvest(body.startDate, lot.harvest_date, lot.code);
        if (early) throw unprocessable(early, { startDate: 'Use a date on or after the harvest.' });
        const ways = body.trays.map(traySownOf);
        const sources = ways.some((w) => w.by === 'weight')
          ? await seedWeightSourcesForLot(trx, bankId, lotId)
          : null;
        const sown = ways.map((w, i) => estimateSown(w, sources, i));
        const counted = sown.reduce((s, t) => s + (t.seeds ?? 0), 0);
        const onHand = await stockOf(trx, lotId);
        // null: the lot's amount is not known, so the trays are recorded and nothing is refused.
        if (onHand !== null && onHand < counted) {
          throw new AppError(
            409,
            'stock_short',
            `The trays need ${counted} seeds but the ledger shows ${onHand} on hand. If you have more than that, record a correction in the stock ledger first.`,
          );
        }
        // Seeds weighed or guessed leave the ledger as their expected number, never below zero:
        // the ledger cannot know them better than the estimate.
        const estimated = sown.reduce((s, t) => s + (t.seeds === null ? t.estimate.mean : 0), 0);
        const needed =
          counted +
          (onHand === null ? Math.round(estimated) : Math.min(Math.round(estimated), onHand - counted));
        const assay = await repo.insertAssay(trx, {
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
          sown.map((t, i) => ({ test_id: assay.id, position: i + 1, ...t.columns })),
        );
        const trayWord = body.trays.length === 1 ? 'tray' : 'trays';
        if (needed > 0) {
          await insertMovement(trx, {
            lot_id: lotId,
            kind: 'test',
            change: -needed,
            date: body.startDate,
            reason:
              estimated > 0
                ? `Germination test: about ${needed} seeds in ${body.trays.length} ${trayWord} (not all counted)`
                : `Germination test: ${needed} seeds in ${body.trays.length} ${trayWord}`,
            created_by: userId,
            test_id: assay.id,
          });
        }
        if (estimated === 0 && onHand !== null && onHand === needed && lot.status === 'active') {
          await updateLot(trx, lotId, { status: 'depleted' });
        }
        await storeResult(trx, assay.id);
        return assay.id;
      });
      return detail(bankId, assayId);
    },

    async listForLot(bankId: string, lotId: string) {
      const ids = await repo.assayIdsOfLot(db, bankId, lotId);
      if (ids === null) throw notFound('No such lot in this bank.');
      return Promise.all(ids.map((id) => detail(bankId, id)));
    },

    async update(bankId: string, assayId: string, body: z.infer<typeof updateAssayBodySchema>) {
      await db.transaction().execute(async (trx) => {
        const t = await loadAssay(trx, bankId, assayId, true);
        assertRunning(t);
        const changes: Updateable<GerminationTestTable> = { updated_at: clock.now() };
        if (body.method !== undefined) changes.method = body.method;
        if (body.medium !== undefined) changes.medium = body.medium;
        if (body.temperatureC !== undefined) changes.temperature_c = body.temperatureC;
        if (body.lightHours !== undefined) changes.light_hours = body.lightHours;
        if (body.pretreatment !== undefined) changes.pretreatment = body.pretreatment;
        if (body.pretreatmentDays !== undefined) changes.pretreatment_days = body.pretreatmentDays;
        if (body.notes !== undefined) changes.notes = body.notes;
        if (body.runnerId !== undefined) {
          await assertRunner(trx, bankId, body.runnerId);
          changes.run_by = body.runnerId;
        }
        await repo.updateAssay(trx, assayId, changes);
      });
      return detail(bankId, assayId);
    },

    /** Records (or corrects) the cumulative counts of one check date; every rule is checked first. */
    async recordCounts(bankId: string, assayId: string, userId: string, body: CountsBody) {
      await db.transaction().execute(async (trx) => {
        const t = await loadAssay(trx, bankId, assayId, true);
        assertRunning(t);
        if (body.date < t.start_date) {
          throw unprocessable(
            `A count cannot be dated before the test started (${dayInWords(t.start_date)}).`,
            {
              date: 'Use a date on or after the start.',
            },
          );
        }
        if (body.date > (await today(trx, bankId)))
          throw unprocessable('A count cannot be dated in the future.', {
            date: 'Use today or an earlier date.',
          });
        const trays = await repo.traysOf(trx, assayId);
        const trayIds = trays.map((tr) => tr.id);
        const saved = trays.length ? await repo.countsOtherThan(trx, trayIds, body.date) : [];
        const savedScores = trays.length ? await repo.scoresOtherThan(trx, trayIds, body.date) : [];
        const problems = countProblems(body, t.start_date, trays, saved, savedScores);
        if (problems.length > 0) {
          const n = problems.length;
          throw unprocessable(
            `Nothing was saved: ${n} ${n === 1 ? 'tray needs' : 'trays need'} correcting. ${problems.map((p) => p.message).join(' ')}`,
            Object.fromEntries(problems.map((p) => [p.field, p.message])),
          );
        }
        for (const entry of body.trays) {
          // A day's entry is a count or a rough score: the new one replaces the other kind.
          await repo.deleteCountsOn(trx, [entry.trayId], body.date);
          if (entry.score !== undefined)
            await repo.upsertScore(trx, entry.trayId, body.date, entry.score, userId);
          else await repo.upsertCount(trx, entry.trayId, body.date, entry.cumulative ?? 0, userId);
        }
        await storeResult(trx, assayId);
      });
      return detail(bankId, assayId);
    },

    /** Removes one check date's counts; cumulative order cannot break by removing a point. */
    async deleteCounts(bankId: string, assayId: string, date: string) {
      await db.transaction().execute(async (trx) => {
        const t = await loadAssay(trx, bankId, assayId, true);
        assertRunning(t);
        const trayIds = await repo.trayIdsOf(trx, assayId);
        const removed = await repo.deleteCountsOn(trx, trayIds, date);
        if (removed === 0) throw notFound(`No counts on ${dayInWords(date)}.`);
        await storeResult(trx, assayId);
      });
      return detail(bankId, assayId);
    },

    async finish(bankId: string, assayId: string, body: FinishBody) {
      await db.transaction().execute(async (trx) => {
        const t = await loadAssay(trx, bankId, assayId, true);
        assertRunning(t);
        const trays = await repo.traysInOrder(trx, assayId);
        const trayIds = trays.map((tr) => tr.id);
        const counts = await repo.countsOfTrays(trx, trayIds);
        const scores = trayIds.length ? await repo.scoresOfTrays(trx, trayIds) : [];
        const lastDate =
          [...counts, ...scores]
            .map((c) => c.check_date)
            .sort()
            .at(-1) ?? t.start_date;
        if (body.date < lastDate)
          throw unprocessable(`The test cannot finish before its last count (${dayInWords(lastDate)}).`, {
            date: `On or after ${dayInWords(lastDate)}.`,
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
          const scored = scores.some((c) => c.tray_id === tray.id);
          if (mine.length === 0 && !scored)
            throw unprocessable(uncountedAtFinish(tray.position), {
              [`trays.${entry.index}.setAsideReason`]: 'Count this tray first, or set it aside.',
            });
          // Seeds counted and seedlings counted: the tray adds up, so its figures are required.
          const exact = tray.seeds_sown !== null && !scored;
          if (exact && (entry.abnormal === undefined || entry.ungerminated === undefined))
            throw unprocessable(
              `Give the abnormal and ungerminated seeds of tray ${tray.position}, or a reason to set it aside.`,
              { [`trays.${entry.index}.ungerminated`]: 'Give the abnormal and ungerminated seeds.' },
            );
          const figures = {
            abnormal: entry.abnormal ?? null,
            ungerminated: entry.ungerminated ?? null,
            fresh: entry.fresh,
            dead: entry.dead,
            hard: entry.hard,
          };
          const problem = finishProblem(
            { position: tray.position, seeds_sown: exact ? tray.seeds_sown : null },
            mine.at(-1)?.cumulative ?? 0,
            { ...figures, abnormal: figures.abnormal ?? 0, ungerminated: figures.ungerminated ?? 0 },
          );
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
        await repo.updateAssay(trx, assayId, {
          status: 'finished',
          finished_on: body.date,
          updated_at: clock.now(),
        });
        await storeResult(trx, assayId);
      });
      return detail(bankId, assayId);
    },

    /** Sets the whole test aside with a reason (running or finished), or takes it back. */
    async setAssayAside(bankId: string, assayId: string, reason: string | null) {
      await db.transaction().execute(async (trx) => {
        await loadAssay(trx, bankId, assayId, true);
        await repo.updateAssay(trx, assayId, { set_aside_reason: reason, updated_at: clock.now() });
      });
      return detail(bankId, assayId);
    },

    /** Sets a tray aside with a reason (spilled, dried out), or takes it back, while the test runs. */
    async setTrayAside(bankId: string, assayId: string, trayId: string, reason: string | null) {
      await db.transaction().execute(async (trx) => {
        const t = await loadAssay(trx, bankId, assayId, true);
        assertRunning(t);
        const res = await repo.setTrayAsideReason(trx, assayId, trayId, reason);
        if (!res.numUpdatedRows) throw notFound('No such tray in this test.');
        await storeResult(trx, assayId);
      });
      return detail(bankId, assayId);
    },

    async reopen(bankId: string, assayId: string) {
      await db.transaction().execute(async (trx) => {
        const t = await loadAssay(trx, bankId, assayId, true);
        if (t.status === 'running') throw conflict('This test is still running.', 'test_running');
        await repo.updateAssay(trx, assayId, {
          status: 'running',
          finished_on: null,
          updated_at: clock.now(),
        });
      });
      return detail(bankId, assayId);
    },

    /** Deletes a test entered by mistake; its seeds go back to the lot with its ledger line. */
    async remove(bankId: string, assayId: string) {
      const cleanups = await db.transaction().execute(async (trx) => {
        await loadAssay(trx, bankId, assayId, true);
        const trayIds = await repo.trayIdsOf(trx, assayId);
        const done = [];
        for (const trayId of trayIds) done.push(await removeSubjectPhotos(trx, bankId, 'tray', trayId));
        await repo.deleteAssay(trx, assayId);
        return done;
      });
      for (const cleanup of cleanups) await cleanup();
    },
  };
}

export type GerminationService = ReturnType<typeof createGerminationService>;
