// A seeded fuzz test of the ranking: hundreds of random lots of every awkward kind (one test, close
// tests, equal tests, 0% and 100%, rising results, tiny trays, every storage, untested, a running
// test) through the real API. Whatever the lots, the ranking answers 200 and every figure it promises
// is a number within 0–100. The data are random, not real; what is checked is that nothing breaks.
import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { refreshStaleResults } from '#server/modules/germination/assay-results';
import { bankWithRoles } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import { mulberry32 } from '../unit/stats/seeded-random';
import { DAY_MS } from '#shared/dates';

const LOTS = 300;

describe('the ranking under random lots', () => {
  let ctx: TestContext;
  let bank: Awaited<ReturnType<typeof bankWithRoles>>;
  beforeAll(async () => {
    ctx = await createTestContext({ now: '2026-12-01T09:00:00Z' });
    bank = await bankWithRoles(ctx.app, ctx.db);
    const rand = mulberry32(1302);
    const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rand() * xs.length)]!;
    const species = await ctx.db
      .selectFrom('species')
      .select('id')
      .where('bank_id', 'is', null)
      .orderBy('ref_key')
      .execute();
    const addDays = (date: string, n: number) =>
      new Date(Date.parse(date) + n * DAY_MS).toISOString().slice(0, 10);
    await ctx.db.transaction().execute(async (trx) => {
      for (let i = 0; i < LOTS; i++) {
        const harvest = addDays('2016-08-01', Math.floor(rand() * 3500));
        const lot = await trx
          .insertInto('lots')
          .values({
            bank_id: bank.bankId,
            species_id: pick(species.slice(0, 6)).id,
            code: `F-${String(i).padStart(4, '0')}`,
            variety: pick(['Red', 'Gold', 'Tall', 'Early']),
            origin: 'saved',
            harvest_date: harvest,
            storage_place: pick(['room', 'fridge', 'freezer', 'other', null]),
            storage_temp_c: rand() < 0.2 ? Math.round(rand() * 50 - 25) : null,
          })
          .returning('id')
          .executeTakeFirstOrThrow();
        const stock = pick([0, 5, 100, 2000]);
        if (stock > 0)
          await trx
            .insertInto('stock_movements')
            .values({ lot_id: lot.id, kind: 'initial', change: stock, date: harvest, reason: 'fuzz' })
            .execute();
        const kind = pick(['none', 'one', 'close', 'equal', 'all', 'none-up', 'rising', 'random', 'running']);
        const nAssays =
          kind === 'none'
            ? 0
            : kind === 'one' || kind === 'running'
              ? 1
              : kind === 'random'
                ? 1 + Math.floor(rand() * 5)
                : 2;
        let start = addDays(harvest, 20 + Math.floor(rand() * 200));
        for (let k = 0; k < nAssays && start < '2026-11-20'; k++) {
          const sown = pick([1, 5, 10, 25, 50, 100]);
          const share =
            kind === 'all'
              ? 1
              : kind === 'none-up'
                ? 0
                : kind === 'equal'
                  ? 0.9
                  : kind === 'close'
                    ? 0.96 - 0.01 * k
                    : kind === 'rising'
                      ? k === 0
                        ? 0.3
                        : 0.95
                      : rand();
          const running = kind === 'running';
          const assay = await trx
            .insertInto('germination_tests')
            .values({
              bank_id: bank.bankId,
              lot_id: lot.id,
              start_date: start,
              method: 'paper towel',
              status: running ? 'running' : 'finished',
              finished_on: running ? null : addDays(start, 14),
            })
            .returning('id')
            .executeTakeFirstOrThrow();
          const tray = await trx
            .insertInto('test_trays')
            .values({ test_id: assay.id, position: 1, seeds_sown: sown })
            .returning('id')
            .executeTakeFirstOrThrow();
          const up = Math.round(sown * share);
          await trx
            .insertInto('tray_counts')
            .values({ tray_id: tray.id, check_date: addDays(start, 7), cumulative: up })
            .execute();
          if (!running)
            await trx
              .updateTable('test_trays')
              .set({ abnormal: 0, ungerminated: sown - up })
              .where('id', '=', tray.id)
              .execute();
          start = addDays(start, kind === 'close' ? 240 : 120 + Math.floor(rand() * 700));
        }
      }
      await refreshStaleResults(trx);
    });
    await sql`analyze`.execute(ctx.db);
  });
  afterAll(() => ctx.close());

  it('when hundreds of random lots are ranked, then it is 200 and every promised figure is a percent', async () => {
    const res = await bank.viewer.agent.get(`/api/banks/${bank.bankId}/ranking?on=2027-03-01`);
    expect(res.status).toBe(200);
    expect(res.body.items).toHaveLength(LOTS);
    for (const item of res.body.items) {
      for (const key of ['projectedPercent', 'projectedLow', 'projectedHigh'] as const) {
        expect(item[key], `${item.code} ${key}`).not.toBeNull();
        expect(item[key]).toBeGreaterThanOrEqual(0);
        expect(item[key]).toBeLessThanOrEqual(100);
      }
      expect(item.projectedLow).toBeLessThanOrEqual(item.projectedPercent);
      expect(item.projectedHigh).toBeGreaterThanOrEqual(item.projectedPercent);
      if (item.lastPercent !== null) {
        expect(item.lastPercent).toBeGreaterThanOrEqual(0);
        expect(item.lastPercent).toBeLessThanOrEqual(100);
      }
      expect(['test-first', 'sow', 'sow-thick', 'retest', 'grow-out', 'retire']).toContain(
        item.recommendation,
      );
      expect(item.reason.length).toBeGreaterThan(10);
      // A lot whose amount is not known (null) is never "no seeds left".
      if (item.seedsOnHand !== null && item.seedsOnHand <= 0) expect(item.recommendation).toBe('retire');
      if (item.lastTestDate === null)
        expect(item.recommendation === 'test-first' || item.recommendation === 'retire').toBe(true);
    }
  });

  it('when the lot pages of random lots are opened, then each answers 200 with its decision and a finite band', async () => {
    const ranking = await bank.viewer.agent.get(`/api/banks/${bank.bankId}/ranking?on=2027-03-01`);
    for (const item of ranking.body.items.slice(0, 40)) {
      const res = await bank.viewer.agent.get(
        `/api/banks/${bank.bankId}/lots/${item.lotId}/viability?on=2027-03-01`,
      );
      expect(res.status).toBe(200);
      expect(res.body.recommendation).toBe(item.recommendation);
      expect(res.body.projected.percent).toBeCloseTo(item.projectedPercent, 9);
      for (const p of res.body.curve) expect(p.percent >= 0 && p.percent <= 100).toBe(true);
    }
  });
});
