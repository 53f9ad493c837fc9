import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { maxToleratedRange, wilsonInterval, clopperPearsonInterval } from '#server/stats/index';
import { bankWithRoles } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import { speciesId } from '../helpers/lots';

describe('germination tests through the API', () => {
  let ctx: TestContext;
  let bank: Awaited<ReturnType<typeof bankWithRoles>>;
  let tomato: string;
  beforeAll(async () => {
    ctx = await createTestContext({ now: '2026-03-20T12:00:00Z' });
    bank = await bankWithRoles(ctx.app, ctx.db);
    tomato = await speciesId(ctx.db, 'tomato');
  });
  afterAll(() => ctx.close());

  async function lotWith(seeds: number) {
    const res = await bank.grower.agent.post(`/api/banks/${bank.bankId}/lots`).send({
      speciesId: tomato,
      variety: 'Test lot',
      origin: 'saved',
      harvestDate: '2025-09-10',
      seedCount: seeds,
    });
    return res.body.lot.id as string;
  }
  const base = () => `/api/banks/${bank.bankId}`;

  async function fourTrayAssay(lotId: string, startDate = '2026-03-01') {
    const res = await bank.grower.agent.post(`${base()}/lots/${lotId}/tests`).send({
      startDate,
      method: 'paper towel',
      temperatureC: 24,
      lightHours: 0,
      trays: [{ seedsSown: 100 }, { seedsSown: 100 }, { seedsSown: 100 }, { seedsSown: 100 }],
    });
    expect(res.status).toBe(201);
    return res.body as {
      test: { id: string; schedule: { firstCountDate: string; finalCountDate: string } };
      trays: { id: string }[];
    };
  }

  it('when a 4-tray test is started, then its seeds leave the lot through the ledger', async () => {
    const lotId = await lotWith(500);
    const { test: assay, trays } = await fourTrayAssay(lotId);
    expect(trays).toHaveLength(4);
    // Tomato first/final count days 5/14 (REFERENCES.md, from memory) → check dates after a 03-01 start.
    expect(assay.schedule).toEqual({ firstCountDate: '2026-03-06', finalCountDate: '2026-03-15' });
    const ledger = await bank.viewer.agent.get(`${base()}/lots/${lotId}/stock`);
    expect(ledger.body.items.at(-1)).toMatchObject({
      kind: 'test',
      change: -400,
      balance: 100,
      date: '2026-03-01',
    });
    // The test says what it took, which is what deleting it gives back.
    expect((await bank.viewer.agent.get(`${base()}/tests/${assay.id}`)).body.test.seedsTaken).toBe(400);
  });

  it('when a test would start before the lot was harvested, then it is 422 and no seeds leave the stock', async () => {
    const lotId = await lotWith(300); // harvested 2025-09-10
    const res = await bank.grower.agent
      .post(`${base()}/lots/${lotId}/tests`)
      .send({ startDate: '2025-09-01', method: 'paper towel', trays: [{ seedsSown: 50 }] });
    expect(res.status).toBe(422);
    expect(res.body.error.message).toMatch(/before lot .* was harvested \(10 Sep 2025\)/);
    expect(res.body.error.fields).toEqual({ startDate: 'Use a date on or after the harvest.' });
    expect((await bank.viewer.agent.get(`${base()}/lots/${lotId}`)).body.lot.seedsOnHand).toBe(300);
    // The harvest day itself is fine.
    const onHarvest = await bank.grower.agent
      .post(`${base()}/lots/${lotId}/tests`)
      .send({ startDate: '2025-09-10', method: 'paper towel', trays: [{ seedsSown: 50 }] });
    expect(onHarvest.status).toBe(201);
    // Nor can the lot's harvest date be moved past its test afterwards.
    const moved = await bank.grower.agent
      .patch(`${base()}/lots/${lotId}`)
      .send({ harvestDate: '2025-09-20' });
    expect(moved.status).toBe(422);
    expect(moved.body.error.fields.harvestDate).toBe('Use a day on or before 10 Sep 2025.');
    expect((await bank.viewer.agent.get(`${base()}/lots/${lotId}`)).body.lot.harvestDate).toBe('2025-09-10');
  });

  it('when counts are posted over three check days, then the result matches the statistics functions', async () => {
    const lotId = await lotWith(400);
    const { test: assay, trays } = await fourTrayAssay(lotId);
    const ids = trays.map((t) => t.id);
    const post = (date: string, values: number[]) =>
      bank.grower.agent
        .post(`${base()}/tests/${assay.id}/counts`)
        .send({ date, trays: ids.map((trayId, i) => ({ trayId, cumulative: values[i] })) });
    expect((await post('2026-03-05', [40, 35, 45, 38])).status).toBe(201);
    expect((await post('2026-03-08', [80, 76, 85, 80])).status).toBe(201);
    const last = await post('2026-03-12', [90, 85, 92, 88]);
    expect(last.status).toBe(201);

    const { result } = last.body;
    // 90 + 85 + 92 + 88 = 355 of 400 sown.
    expect(result.sown).toBe(400);
    expect(result.germinated).toBe(355);
    expect(result.percent).toBeCloseTo(88.75, 10);
    // ISTA Rules ch. 5: reported as the whole-number mean of the replicates → 89.
    expect(result.percentRounded).toBe(89);
    const w = wilsonInterval(355, 400);
    expect(result.interval).toMatchObject({ method: 'wilson' });
    // API.md: percentages are 0–100, so the interval is too (Wilson 355/400: 85.28–91.49%).
    expect(result.interval.low).toBeCloseTo(w.low * 100, 10);
    expect(result.interval.high).toBeCloseTo(w.high * 100, 10);
    expect(result.summary.join(' ')).toMatch(/between 85% and 91%/);
    // 7 CFR 201.55: four replicates of 100 at a mean of 89% tolerate a range of 12.
    expect(maxToleratedRange(89, 4, 100)).toBe(12);
    expect(result.agreement).toMatchObject({
      method: 'tolerance-table',
      maxRange: 12,
      observedRange: 7,
      ok: true,
    });
    expect(result.trayPercents.map((t: { percent: number }) => t.percent)).toEqual([90, 85, 92, 88]);
    expect(result.meanDays).toBeGreaterThan(4);
    expect(result.summary.join(' ')).toMatch(/About 89% so far/);

    const exact = await bank.viewer.agent.get(`${base()}/tests/${assay.id}?interval=clopper-pearson`);
    const cp = clopperPearsonInterval(355, 400);
    expect(exact.body.result.interval.method).toBe('clopper-pearson');
    expect(exact.body.result.interval.low).toBeCloseTo(cp.low * 100, 10);
  });

  describe('when a count breaks a rule, then it is 422 naming the tray and why, and nothing is saved', () => {
    /** A 4-tray test whose tray 2 was counted 50 on 6 March and 70 on 10 March; `send` posts one more count. */
    async function countedAssay() {
      const lotId = await lotWith(400);
      const { test: assay, trays } = await fourTrayAssay(lotId);
      const url = `${base()}/tests/${assay.id}/counts`;
      const send = (date: string, cumulative: number, trayId = trays[1]!.id) =>
        bank.grower.agent.post(url).send({ date, trays: [{ trayId, cumulative }] });
      expect((await send('2026-03-06', 50)).status).toBe(201);
      expect((await send('2026-03-10', 70)).status).toBe(201);
      const nothingSaved = async () => {
        const { body } = await bank.viewer.agent.get(`${base()}/tests/${assay.id}`);
        expect(body.counts.map((c: { cumulative: number }) => c.cumulative)).toEqual([50, 70]);
      };
      return { send, nothingSaved };
    }

    it('more than the seeds sown', async () => {
      const { send, nothingSaved } = await countedAssay();
      const above = await send('2026-03-11', 101);
      expect(above.status).toBe(422);
      expect(above.body.error.message).toMatch(/Tray 2: 101 .* more than the 100 seeds sown/);
      await nothingSaved();
    });

    it('fewer than an earlier count', async () => {
      const { send, nothingSaved } = await countedAssay();
      const below = await send('2026-03-11', 60);
      expect(below.status).toBe(422);
      expect(below.body.error.message).toMatch(/Tray 2: 60 is fewer than the 70 counted on 10 Mar 2026/);
      await nothingSaved();
    });

    it('more than a later count', async () => {
      const { send, nothingSaved } = await countedAssay();
      const between = await send('2026-03-08', 75);
      expect(between.status).toBe(422);
      expect(between.body.error.message).toMatch(/more than the 70 counted later/);
      await nothingSaved();
    });

    it('dated before the test started', async () => {
      const { send, nothingSaved } = await countedAssay();
      const early = await send('2026-02-27', 1);
      expect(early.status).toBe(422);
      expect(early.body.error.message).toMatch(/before the test started/);
      await nothingSaved();
    });

    it('dated after today in the bank', async () => {
      const { send, nothingSaved } = await countedAssay();
      const future = await send('2026-03-22', 80); // after today in the bank's time zone (UTC, the default)
      expect(future.status).toBe(422);
      await nothingSaved();
    });

    it('for a tray not in the test', async () => {
      const { send, nothingSaved } = await countedAssay();
      const otherTray = await send('2026-03-11', 80, '00000000-0000-4000-8000-000000000000');
      expect(otherTray.status).toBe(422);
      await nothingSaved();
    });
  });

  it('when several trays break a rule in one post, then the 422 names every one of them and saves none', async () => {
    const lotId = await lotWith(400);
    const { test: assay, trays } = await fourTrayAssay(lotId);
    const url = `${base()}/tests/${assay.id}/counts`;
    const post = (date: string, values: number[]) =>
      bank.grower.agent
        .post(url)
        .send({ date, trays: trays.map((t, i) => ({ trayId: t.id, cumulative: values[i] })) });
    expect((await post('2026-03-06', [30, 40, 35, 20])).status).toBe(201);
    expect((await post('2026-03-12', [60, 70, 65, 50])).status).toBe(201);

    // Tray 1 fits; tray 2 is above its 100 sown; tray 3 falls below its 03-06 count; tray 4 rises above its 03-12 count.
    const bad = await post('2026-03-09', [45, 101, 30, 55]);
    expect(bad.status).toBe(422);
    expect(bad.body.error.code).toBe('impossible');
    expect(bad.body.error.message).toMatch(/^Nothing was saved: 3 trays need correcting\./);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual([
      'trays.1.cumulative',
      'trays.2.cumulative',
      'trays.3.cumulative',
    ]);
    expect(bad.body.error.fields['trays.1.cumulative']).toMatch(
      /^Tray 2: 101 seedlings are more than the 100 seeds sown/,
    );
    expect(bad.body.error.fields['trays.2.cumulative']).toMatch(
      /^Tray 3: 30 is fewer than the 35 counted on 6 Mar 2026/,
    );
    expect(bad.body.error.fields['trays.3.cumulative']).toMatch(
      /^Tray 4: 55 is more than the 50 counted later, on 12 Mar 2026/,
    );
    for (const reason of Object.values(bad.body.error.fields))
      expect(bad.body.error.message).toContain(reason);

    const one = await post('2026-03-09', [45, 50, 40, 55]);
    expect(one.status).toBe(422);
    expect(one.body.error.message).toMatch(/^Nothing was saved: 1 tray needs correcting\. Tray 4:/);
    expect(Object.keys(one.body.error.fields)).toEqual(['trays.3.cumulative']);

    // Nothing of either post was saved, not even tray 1's fitting count.
    const { body } = await bank.viewer.agent.get(`${base()}/tests/${assay.id}`);
    expect(body.counts.filter((c: { date: string }) => c.date === '2026-03-09')).toEqual([]);
    expect((await post('2026-03-09', [45, 50, 40, 45])).status).toBe(201);
  });

  it('when a tray is counted above 0 on the day the test started, then it is 422 and the test still opens', async () => {
    const lotId = await lotWith(400);
    const { test: assay, trays } = await fourTrayAssay(lotId);
    const url = `${base()}/tests/${assay.id}/counts`;
    // Nothing sprouts on the day of sowing (day 0; common practice counts from the next day).
    const dayZero = await bank.grower.agent
      .post(url)
      .send({ date: '2026-03-01', trays: [{ trayId: trays[0]!.id, cumulative: 2 }] });
    expect(dayZero.status).toBe(422);
    expect(dayZero.body.error.fields['trays.0.cumulative']).toMatch(
      /^Tray 1: 2 seedlings on the day the test started/,
    );
    const zero = await bank.grower.agent
      .post(url)
      .send({ date: '2026-03-01', trays: [{ trayId: trays[0]!.id, cumulative: 0 }] });
    expect(zero.status).toBe(201);
    expect((await bank.viewer.agent.get(`${base()}/tests/${assay.id}`)).status).toBe(200);
  });

  it('when a count is corrected or deleted, then the result follows', async () => {
    const lotId = await lotWith(400);
    const { test: assay, trays } = await fourTrayAssay(lotId);
    const url = `${base()}/tests/${assay.id}/counts`;
    await bank.grower.agent
      .post(url)
      .send({ date: '2026-03-06', trays: [{ trayId: trays[0]!.id, cumulative: 30 }] });
    const fixed = await bank.grower.agent
      .post(url)
      .send({ date: '2026-03-06', trays: [{ trayId: trays[0]!.id, cumulative: 33 }] });
    expect(fixed.body.result.germinated).toBe(33);
    const gone = await bank.grower.agent.delete(`${url}/2026-03-06`);
    expect(gone.status).toBe(200);
    expect(gone.body.result.germinated).toBeNull();
  });

  it('when a test is finished, then every tray must add up, and afterwards it is read-only until reopened', async () => {
    const lotId = await lotWith(400);
    const { test: assay, trays } = await fourTrayAssay(lotId);
    await bank.grower.agent.post(`${base()}/tests/${assay.id}/counts`).send({
      date: '2026-03-12',
      trays: trays.map((t, i) => ({ trayId: t.id, cumulative: [90, 85, 92, 88][i] })),
    });
    const finishUrl = `${base()}/tests/${assay.id}/finish`;
    const wrong = await bank.grower.agent.post(finishUrl).send({
      date: '2026-03-14',
      trays: trays.map((t) => ({ trayId: t.id, abnormal: 2, ungerminated: 5 })),
    });
    expect(wrong.status).toBe(422);
    expect(wrong.body.error.message).toMatch(
      /Tray 1: 90 normal \+ 2 abnormal \+ 5 ungerminated = 97, but 100/,
    );
    const right = await bank.grower.agent.post(finishUrl).send({
      date: '2026-03-14',
      trays: trays.map((t, i) => ({
        trayId: t.id,
        abnormal: 2,
        ungerminated: 100 - 2 - [90, 85, 92, 88][i]!,
      })),
    });
    expect(right.status).toBe(200);
    expect(right.body.test).toMatchObject({ status: 'finished', finishedOn: '2026-03-14' });
    const locked = await bank.grower.agent
      .post(`${base()}/tests/${assay.id}/counts`)
      .send({ date: '2026-03-14', trays: [{ trayId: trays[0]!.id, cumulative: 91 }] });
    expect(locked.status).toBe(409);
    expect((await bank.grower.agent.post(`${base()}/tests/${assay.id}/reopen`)).body.test.status).toBe(
      'running',
    );
  });

  it('when the lot has too few seeds for the trays, then it is 409 and nothing is written', async () => {
    const lotId = await lotWith(150);
    const res = await bank.grower.agent.post(`${base()}/lots/${lotId}/tests`).send({
      startDate: '2026-03-01',
      method: 'paper towel',
      trays: [{ seedsSown: 100 }, { seedsSown: 100 }],
    });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/need 200 seeds .* 150 on hand/);
    const assays = await ctx.db
      .selectFrom('germination_tests')
      .select('id')
      .where('lot_id', '=', lotId)
      .execute();
    expect(assays).toEqual([]);
    expect((await bank.viewer.agent.get(`${base()}/lots/${lotId}`)).body.lot.seedsOnHand).toBe(150);
  });

  it('when a viewer tries to count, then it is 403', async () => {
    const lotId = await lotWith(400);
    const { test: assay, trays } = await fourTrayAssay(lotId);
    const res = await bank.viewer.agent
      .post(`${base()}/tests/${assay.id}/counts`)
      .send({ date: '2026-03-05', trays: [{ trayId: trays[0]!.id, cumulative: 1 }] });
    expect(res.status).toBe(403);
  });

  it('when a lot with a test is deleted, then it is retired instead and keeps its history', async () => {
    const lotId = await lotWith(400);
    await fourTrayAssay(lotId);
    const res = await bank.grower.agent.delete(`${base()}/lots/${lotId}`);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ retired: true, lot: { status: 'retired' } });
    expect((await bank.viewer.agent.get(`${base()}/lots/${lotId}/tests`)).body.items).toHaveLength(1);
  });

  it('when a test entered by mistake is deleted, then its seeds return to the lot', async () => {
    const lotId = await lotWith(400);
    const { test: assay } = await fourTrayAssay(lotId);
    expect((await bank.grower.agent.delete(`${base()}/tests/${assay.id}`)).status).toBe(204);
    expect((await bank.viewer.agent.get(`${base()}/lots/${lotId}`)).body.lot.seedsOnHand).toBe(400);
  });
});
