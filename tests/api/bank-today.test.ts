import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bankWithRoles } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import { finishedAssay, speciesId } from '../helpers/lots';

// "Today" is the calendar day on the bank's own wall clock (its time zone), not UTC's.
// At 11:00 UTC on 20 March 2026 it is still 19 March twelve hours west of UTC and already 21 March
// fourteen hours east. The zones are fixed offsets with no daylight saving: in the IANA database
// "Etc/GMT+12" is UTC−12 and "Etc/GMT-14" is UTC+14 (the sign is inverted, POSIX style; from memory).
const NOW = '2026-03-20T11:00:00Z';
const ZONES = [
  { zone: 'Etc/GMT+12', today: '2026-03-19', tomorrow: '2026-03-20', where: 'west of UTC, a day behind' },
  { zone: 'Etc/GMT-14', today: '2026-03-21', tomorrow: '2026-03-22', where: 'east of UTC, a day ahead' },
] as const;

describe.each(ZONES)('today in a bank $where ($zone)', ({ zone, today, tomorrow }) => {
  let ctx: TestContext;
  let bank: Awaited<ReturnType<typeof bankWithRoles>>;
  let tomato: string;
  beforeAll(async () => {
    ctx = await createTestContext({ now: NOW });
    bank = await bankWithRoles(ctx.app, ctx.db);
    const patched = await bank.owner.agent.patch(`/api/banks/${bank.bankId}`).send({ timeZone: zone });
    expect(patched.status).toBe(200);
    tomato = await speciesId(ctx.db, 'tomato');
  });
  afterAll(() => ctx.close());

  const base = () => `/api/banks/${bank.bankId}`;
  const newLot = (body: object = {}) =>
    bank.grower.agent.post(`${base()}/lots`).send({
      speciesId: tomato,
      variety: 'Clock Red',
      origin: 'saved',
      harvestDate: '2025-09-01',
      seedCount: 200,
      ...body,
    });

  it('when a harvest date is tomorrow in the bank, then it is 422; today in the bank is accepted', async () => {
    const future = await newLot({ harvestDate: tomorrow });
    expect(future.status).toBe(422);
    expect(future.body.error.fields).toHaveProperty('harvestDate');
    const now = await newLot({ harvestDate: today });
    expect(now.status).toBe(201);
    expect(now.body.lot.harvestDate).toBe(today);
  });

  it('when a lot is logged without a harvest date, then its first ledger line is dated today in the bank', async () => {
    const { body } = await newLot({ harvestDate: undefined, packedForSeason: 2026, seedCount: 40 });
    const ledger = await bank.viewer.agent.get(`${base()}/lots/${body.lot.id}/stock`);
    expect(ledger.body.items).toEqual([
      expect.objectContaining({ kind: 'initial', change: 40, date: today }),
    ]);
  });

  it('when a stock movement is dated tomorrow in the bank, then it is 422 and the stock is unchanged; today is accepted', async () => {
    const lotId = (await newLot()).body.lot.id as string;
    const move = (date: string) =>
      bank.grower.agent
        .post(`${base()}/lots/${lotId}/stock`)
        .send({ change: -10, reason: 'Given to a neighbour', date, kind: 'given' });
    const future = await move(tomorrow);
    expect(future.status).toBe(422);
    expect(future.body.error.fields).toHaveProperty('date');
    expect((await bank.viewer.agent.get(`${base()}/lots/${lotId}`)).body.lot.seedsOnHand).toBe(200);
    expect((await move(today)).status).toBe(201);
    expect((await bank.viewer.agent.get(`${base()}/lots/${lotId}`)).body.lot.seedsOnHand).toBe(190);
  });

  describe('a germination test', () => {
    const start = (lotId: string, startDate: string) =>
      bank.grower.agent
        .post(`${base()}/lots/${lotId}/tests`)
        .send({ startDate, method: 'paper towel', trays: [{ seedsSown: 20 }] });
    /** A one-tray test started a few days before, and a count of it on `date`. */
    const startedBefore = async () => {
      const started = await start((await newLot()).body.lot.id as string, '2026-03-15');
      const assayId = started.body.test.id as string;
      const trayId = started.body.trays[0].id as string;
      const count = (date: string) =>
        bank.grower.agent
          .post(`${base()}/tests/${assayId}/counts`)
          .send({ date, trays: [{ trayId, cumulative: 3 }] });
      return { testId: assayId, trayId, count };
    };

    it('when it starts tomorrow in the bank, then it is 422; today is accepted', async () => {
      const lotId = (await newLot()).body.lot.id as string;
      const futureStart = await start(lotId, tomorrow);
      expect(futureStart.status).toBe(422);
      expect(futureStart.body.error.fields).toHaveProperty('startDate');
      expect((await start(lotId, today)).status).toBe(201);
    });

    it('when it is counted tomorrow in the bank, then it is 422; today is accepted', async () => {
      const { count } = await startedBefore();
      const futureCount = await count(tomorrow);
      expect(futureCount.status).toBe(422);
      expect(futureCount.body.error.fields).toHaveProperty('date');
      expect((await count(today)).status).toBe(201);
    });

    it('when it finishes tomorrow in the bank, then it is 422; today is accepted', async () => {
      const { testId, trayId, count } = await startedBefore();
      expect((await count(today)).status).toBe(201);
      const finish = (date: string) =>
        bank.grower.agent
          .post(`${base()}/tests/${testId}/finish`)
          .send({ date, trays: [{ trayId, abnormal: 0, ungerminated: 17 }] });
      expect((await finish(tomorrow)).status).toBe(422);
      const finished = await finish(today);
      expect(finished.status).toBe(200);
      expect(finished.body.test.finishedOn).toBe(today);
    });
  });

  it('when a planned sowing is marked sown tomorrow in the bank, then it is 422; today in the bank it is sown', async () => {
    const lotId = (await newLot({ seedCount: 400 })).body.lot.id as string;
    await finishedAssay(bank.grower.agent, bank.bankId, lotId, '2026-02-01', [{ sown: 50, germinated: 45 }]);
    const planned = await bank.grower.agent
      .post(`${base()}/plan`)
      .send({ season: 2026, speciesId: tomato, plantsWanted: 4, start: 'indoors', lotId });
    expect(planned.status).toBe(201);
    const entryId = planned.body.entry.id as string;
    const future = await bank.grower.agent.post(`${base()}/plan/${entryId}/sown`).send({ date: tomorrow });
    expect(future.status).toBe(422);
    // No silent today: the day is always sent (the 2026 window is long past, so it is confirmed).
    expect((await bank.grower.agent.post(`${base()}/plan/${entryId}/sown`).send({})).status).toBe(400);
    const sown = await bank.grower.agent
      .post(`${base()}/plan/${entryId}/sown`)
      .send({ date: today, confirm: true });
    expect(sown.status).toBe(200);
    expect(sown.body.entry.sownOn).toBe(today);
  });

  it('when an imported file has a harvest date tomorrow in the bank, then nothing is imported and the row is named', async () => {
    const b = await bankWithRoles(ctx.app, ctx.db);
    await b.owner.agent.patch(`/api/banks/${b.bankId}`).send({ timeZone: zone });
    const file = (date: string) =>
      Buffer.from(
        `species,variety,origin,harvest_date,seeds_on_hand\nTomato,Fine,saved,2025-09-01,10\nTomato,Fresh,saved,${date},10\n`,
      );
    const upload = (date: string) =>
      b.grower.agent.post(`/api/banks/${b.bankId}/lots/import`).attach('file', file(date), 'lots.csv');
    const future = await upload(tomorrow);
    expect(future.status).toBe(400);
    expect(future.body.error.rows).toEqual([expect.objectContaining({ line: 3, column: 'harvest_date' })]);
    expect((await b.owner.agent.get(`/api/banks/${b.bankId}/lots`)).body.items).toHaveLength(0);
    const now = await upload(today);
    expect(now.body).toEqual({ imported: 2 });
  });
});
