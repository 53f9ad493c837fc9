// One germination, every screen: a test's result is stored once (server/modules/germination/
// assay-results.ts) and the test page, the lot page, the ranking, the viability points, the
// overview, the packet label and the tests CSV all give that same figure. The expected values are
// plain arithmetic on the counts (normal seedlings ÷ seeds sown in the trays that enter the
// figures), rounded to the whole percent as the ISTA Rules (ch. 5) report a result.
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { refreshStaleResults } from '#server/modules/germination/assay-results';
import { bankWithRoles } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import { speciesId } from '../helpers/lots';

describe('one germination figure on every screen', () => {
  let ctx: TestContext;
  let bank: Awaited<ReturnType<typeof bankWithRoles>>;
  let lotId: string;
  const base = () => `/api/banks/${bank.bankId}`;
  const newLot = async (variety: string) => {
    const lot = await bank.grower.agent.post(`${base()}/lots`).send({
      speciesId: await speciesId(ctx.db, 'tomato'),
      variety,
      origin: 'saved',
      harvestDate: '2026-08-20',
      seedCount: 2000,
    });
    return lot.body.lot.id as string;
  };

  beforeAll(async () => {
    ctx = await createTestContext({ now: '2026-12-01T09:00:00Z' });
    bank = await bankWithRoles(ctx.app, ctx.db);
    lotId = await newLot('Every Screen');
  });
  afterAll(() => ctx.close());

  async function startAssay(startDate: string, sown: number[]) {
    const res = await bank.grower.agent
      .post(`${base()}/lots/${lotId}/tests`)
      .send({ startDate, method: 'tray of mix', trays: sown.map((seedsSown) => ({ seedsSown })) });
    expect(res.status).toBe(201);
    return {
      testId: res.body.test.id as string,
      trayIds: res.body.trays.map((t: { id: string }) => t.id) as string[],
    };
  }

  /** Every place a grower reads the lot's latest germination, as whole percents. */
  async function everyScreen(assayId: string) {
    const page = await bank.viewer.agent.get(`${base()}/tests/${assayId}`);
    const lotAssays = await bank.viewer.agent.get(`${base()}/lots/${lotId}/tests`);
    const ranking = await bank.viewer.agent.get(`${base()}/ranking?on=2027-03-01`);
    const csv = await bank.viewer.agent.get(`${base()}/tests.csv`);
    const label = await bank.viewer.agent.get(`${base()}/lots/${lotId}/label.svg`).buffer(true);
    const records = Papa.parse<Record<string, string>>(csv.text.replace(/^\uFEFF/, ''), {
      header: true,
      skipEmptyLines: true,
    }).data;
    const mine = records.filter((r) => r.start_date === page.body.test.startDate);
    const row = ranking.body.items.find((i: { lotId: string }) => i.lotId === lotId);
    return {
      page: page.body.result,
      lotPage: lotAssays.body.items.find((t: { test: { id: string } }) => t.test.id === assayId).result
        .percentRounded as number,
      ranking: Math.round(row.lastPercent as number),
      csv: [...new Set(mine.map((r) => r.germination_percent))],
      label: Buffer.isBuffer(label.body) ? label.body.toString('utf8') : '',
    };
  }

  it('when two of four trays are counted, then every screen gives the germination of those two, and says two are not counted yet', async () => {
    const { testId, trayIds } = await startAssay('2026-11-24', [100, 100, 100, 100]);
    const counted = await bank.grower.agent.post(`${base()}/tests/${testId}/counts`).send({
      date: '2026-11-30',
      trays: [
        { trayId: trayIds[0], cumulative: 80 },
        { trayId: trayIds[1], cumulative: 90 },
      ],
    });
    expect(counted.status).toBe(201);

    const seen = await everyScreen(testId);
    // (80 + 90) / (100 + 100) = 85%; the uncounted trays are left out, not read as 0% (which gave 42.5%).
    expect(seen.page.percent).toBe(85);
    expect(seen.page.percentRounded).toBe(85);
    expect(seen.page.traysCounted).toBe(2);
    expect(seen.page.trayPercents.map((t: { state: string }) => t.state)).toEqual([
      'counted',
      'counted',
      'not-counted',
      'not-counted',
    ]);
    expect(seen.page.summary.join(' ')).toMatch(/Trays 3 and 4 are not counted yet/);
    expect(seen.lotPage).toBe(85);
    expect(seen.ranking).toBe(85);
    expect(seen.csv).toEqual(['85']);
    expect(seen.label).toContain('85%');

    const overview = await bank.viewer.agent.get(`${base()}/overview?on=2026-12-01`);
    const item = overview.body.traysToCount.find((t: { testId: string }) => t.testId === testId);
    expect(item.percentSoFar).toBe(85);
  });

  it('when a tray never counted is to be finished, then it is refused until the tray is counted or set aside', async () => {
    const { testId, trayIds } = await startAssay('2026-11-10', [50, 50, 50]);
    await bank.grower.agent.post(`${base()}/tests/${testId}/counts`).send({
      date: '2026-11-20',
      trays: [
        { trayId: trayIds[0], cumulative: 40 },
        { trayId: trayIds[1], cumulative: 44 },
      ],
    });
    const refused = await bank.grower.agent.post(`${base()}/tests/${testId}/finish`).send({
      date: '2026-11-24',
      trays: trayIds.map((trayId, i) => ({ trayId, abnormal: 0, ungerminated: [10, 6, 50][i] })),
    });
    expect(refused.status).toBe(422);
    expect(refused.body.error.message).toMatch(/Tray 3 has no counts/);
    expect(refused.body.error.fields).toHaveProperty(['trays.2.setAsideReason']);
    const still = await bank.viewer.agent.get(`${base()}/tests/${testId}`);
    expect(still.body.test.status).toBe('running');
    await bank.grower.agent.delete(`${base()}/tests/${testId}`).expect(204);
  });

  it('when a tray is set aside while the test runs, then it leaves the figures and can be taken back; a viewer cannot do it', async () => {
    const { testId, trayIds } = await startAssay('2026-11-12', [40, 40]);
    await bank.grower.agent.post(`${base()}/tests/${testId}/counts`).send({
      date: '2026-11-20',
      trays: [
        { trayId: trayIds[0], cumulative: 30 },
        { trayId: trayIds[1], cumulative: 10 },
      ],
    });
    expect((await bank.viewer.agent.get(`${base()}/tests/${testId}`)).body.result.percent).toBe(50); // 40 / 80
    const aside = await bank.grower.agent
      .patch(`${base()}/tests/${testId}/trays/${trayIds[1]}`)
      .send({ setAsideReason: 'Dried out over the weekend' });
    expect(aside.status).toBe(200);
    expect(aside.body.result.percent).toBe(75); // 30 / 40
    expect(aside.body.trays[1].setAsideReason).toBe('Dried out over the weekend');
    expect(aside.body.result.trayPercents[1].state).toBe('set-aside');
    expect(
      (
        await bank.viewer.agent
          .patch(`${base()}/tests/${testId}/trays/${trayIds[1]}`)
          .send({ setAsideReason: null })
      ).status,
    ).toBe(403);
    expect(
      (
        await bank.grower.agent
          .patch(`${base()}/tests/${testId}/trays/${trayIds[1]}`)
          .send({ setAsideReason: '' })
      ).status,
    ).toBe(400);
    const back = await bank.grower.agent
      .patch(`${base()}/tests/${testId}/trays/${trayIds[1]}`)
      .send({ setAsideReason: null });
    expect(back.body.result.percent).toBe(50);
    await bank.grower.agent.delete(`${base()}/tests/${testId}`).expect(204);
  });

  it('when a test is finished with one tray set aside, then every screen gives the germination of the other trays, in final words', async () => {
    lotId = await newLot('One Tray Spilled');
    const { testId, trayIds } = await startAssay('2026-11-14', [50, 50, 50, 50]);
    await bank.grower.agent.post(`${base()}/tests/${testId}/counts`).send({
      date: '2026-11-28',
      trays: [
        { trayId: trayIds[0], cumulative: 40 },
        { trayId: trayIds[1], cumulative: 45 },
        { trayId: trayIds[2], cumulative: 35 },
      ],
    });
    const finished = await bank.grower.agent.post(`${base()}/tests/${testId}/finish`).send({
      date: '2026-11-28',
      trays: [
        { trayId: trayIds[0], abnormal: 2, ungerminated: 8 },
        { trayId: trayIds[1], abnormal: 1, ungerminated: 4 },
        { trayId: trayIds[2], abnormal: 0, ungerminated: 15 },
        { trayId: trayIds[3], setAsideReason: 'Knocked off the shelf' },
      ],
    });
    expect(finished.status).toBe(200);

    const seen = await everyScreen(testId);
    // (40 + 45 + 35) / 150 = 80%; the spilled tray is left out everywhere.
    expect(seen.page.percent).toBe(80);
    expect(seen.page.traysSetAside).toBe(1);
    expect(seen.page.abnormal).toBe(3);
    expect(seen.page.trayPercents[3]).toMatchObject({
      state: 'set-aside',
      setAsideReason: 'Knocked off the shelf',
    });
    expect(seen.page.summary.join(' ')).not.toMatch(/so far/);
    expect(seen.lotPage).toBe(80);
    expect(seen.ranking).toBe(80);
    expect(seen.csv).toEqual(['80']);
    expect(seen.label).toContain('80%');
    const viability = await bank.viewer.agent.get(`${base()}/lots/${lotId}/viability?on=2027-03-01`);
    const point = viability.body.points.find((p: { testId: string }) => p.testId === testId);
    expect(point).toMatchObject({ germinated: 120, sown: 150, percent: 80 });
  });

  it('when stored results are from an older definition, then the start-up refresh recomputes them to the same figures', async () => {
    const before = await ctx.db
      .selectFrom('germination_tests')
      .select(['id', 'result_percent', 'result_sown'])
      .where('bank_id', '=', bank.bankId)
      .orderBy('id')
      .execute();
    await ctx.db
      .updateTable('germination_tests')
      .set({ result_version: 0, result: null, result_percent: null, result_sown: null })
      .where('bank_id', '=', bank.bankId)
      .execute();
    expect(await refreshStaleResults(ctx.db)).toBe(before.length);
    const after = await ctx.db
      .selectFrom('germination_tests')
      .select(['id', 'result_percent', 'result_sown'])
      .where('bank_id', '=', bank.bankId)
      .orderBy('id')
      .execute();
    expect(after).toEqual(before);
    expect(await refreshStaleResults(ctx.db)).toBe(0);
  });
});
