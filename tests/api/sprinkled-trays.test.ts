import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedWeightSourcesForLot } from '#server/modules/lots/lots.shared.repository';
import {
  germinationFromUncertainSown,
  seedsFromGrams,
  sownFromGuess,
  wilsonInterval,
} from '#server/stats/index';
import { bankWithRoles } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import { speciesId } from '../helpers/lots';

// Trays sown without counting (by a rough guess or by weight) and seedlings scored roughly. The
// expected figures come from the statistics' own functions, each checked in tests/unit/stats/
// against its cited reference (Wilson 1927 for the counted interval; the widened score interval by
// seeded simulation in uncertain-sown.test.ts), never re-derived here.
describe('sprinkled trays: sown by weight or guess, seedlings scored roughly', () => {
  let ctx: TestContext;
  let bank: Awaited<ReturnType<typeof bankWithRoles>>;
  let plainSpecies: string;
  beforeAll(async () => {
    ctx = await createTestContext({ now: '2026-03-20T12:00:00Z' });
    bank = await bankWithRoles(ctx.app, ctx.db);
    // A species of the bank's own with count days and a seed life, but no seeds-per-gram figure.
    const added = await bank.grower.agent.post(`/api/banks/${bank.bankId}/species`).send({
      commonName: 'Meadow test flower',
      scientificName: 'Florens probatus',
      traits: { firstCountDay: 5, finalCountDay: 14, storageLifeYears: 3 },
    });
    expect(added.status).toBe(201);
    plainSpecies = added.body.species.id;
  });
  afterAll(() => ctx.close());

  const base = () => `/api/banks/${bank.bankId}`;
  async function lot(speciesId = plainSpecies, variety = 'Sprinkled lot') {
    const res = await bank.grower.agent.post(`${base()}/lots`).send({
      speciesId,
      variety,
      origin: 'saved',
      harvestDate: '2025-09-10',
      seedCount: 2000,
    });
    expect(res.status).toBe(201);
    return res.body.lot.id as string;
  }
  async function startTest(lotId: string, trays: object[]) {
    return bank.grower.agent
      .post(`${base()}/lots/${lotId}/tests`)
      .send({ startDate: '2026-03-01', method: 'tray of mix', trays });
  }

  it('when a tray is sown by a rough guess, then its percentage is estimated and its interval wider than a counted tray with the same numbers', async () => {
    const guess = sownFromGuess('few-dozen');
    const counted = Math.round(guess.mean);
    const lotId = await lot();
    const guessed = await startTest(lotId, [{ sown: { by: 'guess', about: 'few-dozen' } }]);
    expect(guessed.status).toBe(201);
    expect(guessed.body.trays[0]).toMatchObject({
      seedsSown: null,
      sown: { by: 'guess', about: 'few-dozen', seeds: null, grams: null },
    });
    expect(guessed.body.trays[0].sown.estimate.mean).toBeCloseTo(guess.mean, 9);
    expect(guessed.body.trays[0].sown.estimate.sd).toBeCloseTo(guess.sd, 9);
    const plain = await startTest(lotId, [{ seedsSown: counted }]);
    expect(plain.status).toBe(201);

    const seedlings = 20;
    for (const t of [guessed.body, plain.body]) {
      const res = await bank.grower.agent
        .post(`${base()}/tests/${t.test.id}/counts`)
        .send({ date: '2026-03-08', trays: [{ trayId: t.trays[0].id, cumulative: seedlings }] });
      expect(res.status).toBe(201);
    }
    const est = (await bank.viewer.agent.get(`${base()}/tests/${guessed.body.test.id}`)).body.result;
    const exact = (await bank.viewer.agent.get(`${base()}/tests/${plain.body.test.id}`)).body.result;

    const expected = germinationFromUncertainSown(seedlings, { mean: guess.mean, sd: guess.sd });
    if (expected.kind !== 'estimate') throw new Error('the guess should give an estimate');
    expect(est.seedsSownEstimated).toBe(true);
    expect(est.percent).toBeCloseTo(100 * expected.fraction, 9);
    expect(est.interval.low).toBeCloseTo(100 * expected.interval.low, 9);
    expect(est.interval.high).toBeCloseTo(100 * expected.interval.high, 9);
    expect(est.interval.method).toBe('widened-score');

    const wilson = wilsonInterval(seedlings, counted);
    expect(exact.seedsSownEstimated).toBe(false);
    expect(exact.interval.low).toBeCloseTo(100 * wilson.low, 9);
    expect(exact.interval.high).toBeCloseTo(100 * wilson.high, 9);
    expect(est.interval.high - est.interval.low).toBeGreaterThan(exact.interval.high - exact.interval.low);
    expect(est.summary[0]).toBe(
      `About ${String(Math.round(est.percent))}% so far — 20 normal seedlings from about ${String(counted)} seeds sown, estimated from a few dozen in the counted trays.`,
    );
  });

  it('when a tray is sown by weight of a weighed lot, then its estimate uses the lot’s seed weight and its interval is wider than a counted tray’s', async () => {
    const lotId = await lot(await speciesId(ctx.db, 'tomato'), 'Weighed lot');
    // Made up: 100 seeds of this lot weigh 0.25 g, so 400 seeds per gram and 0.1 g holds about 40.
    await ctx.db
      .insertInto('lot_seed_weights')
      .values({ bank_id: bank.bankId, lot_id: lotId, seeds: 100, grams: 0.25 })
      .execute();
    await ctx.changeFeed.sync();
    const estimate = seedsFromGrams(0.1, await seedWeightSourcesForLot(ctx.db, bank.bankId, lotId));
    expect(estimate.basis).toBe('lot');
    expect(estimate.mean).toBeCloseTo(40, 9);
    const weighed = await startTest(lotId, [{ sown: { by: 'weight', grams: 0.1 } }]);
    expect(weighed.status, JSON.stringify(weighed.body)).toBe(201);
    expect(weighed.body.trays[0].sown).toMatchObject({
      by: 'weight',
      grams: 0.1,
      estimate: { basis: 'lot', purityAssumed: true },
    });
    expect(weighed.body.trays[0].sown.estimate.sd).toBeCloseTo(estimate.sd, 9);
    // The ledger gives up the estimate's expected number.
    expect(weighed.body.test.seedsTaken).toBe(40);
    const counted = await startTest(lotId, [{ seedsSown: 40 }]);
    const seedlings = 25;
    for (const t of [weighed.body, counted.body]) {
      const res = await bank.grower.agent
        .post(`${base()}/tests/${t.test.id}/counts`)
        .send({ date: '2026-03-08', trays: [{ trayId: t.trays[0].id, cumulative: seedlings }] });
      expect(res.status).toBe(201);
    }
    const est = (await bank.viewer.agent.get(`${base()}/tests/${weighed.body.test.id}`)).body.result;
    const exact = (await bank.viewer.agent.get(`${base()}/tests/${counted.body.test.id}`)).body.result;
    const expected = germinationFromUncertainSown(seedlings, estimate);
    if (expected.kind !== 'estimate') throw new Error('the weight should give an estimate');
    expect(est).toMatchObject({ seedsSownEstimated: true, percentRounded: 63 });
    expect(est.interval.low).toBeCloseTo(100 * expected.interval.low, 9);
    expect(est.interval.high).toBeCloseTo(100 * expected.interval.high, 9);
    const wilson = wilsonInterval(seedlings, 40);
    expect(exact).toMatchObject({ seedsSownEstimated: false, percentRounded: 63 });
    expect(exact.interval.low).toBeCloseTo(100 * wilson.low, 9);
    expect(est.interval.low).toBeLessThan(exact.interval.low);
    expect(est.interval.high).toBeGreaterThan(exact.interval.high);
    expect(est.summary[0]).toBe(
      'About 63% so far — 25 normal seedlings from about 40 seeds sown, estimated from 0.1 g in the counted trays.',
    );
    expect(est.summary).toContain("Grams became seeds through this lot's own seed weight.");
    // The week's overview says "about" for the same figure, and nothing for the counted tray.
    const overview = (await bank.viewer.agent.get(`${base()}/overview?on=2026-03-08`)).body;
    const card = (id: string) =>
      overview.traysToCount.find((t: { testId: string }) => t.testId === id) as
        { percentSoFar: number; percentSoFarEstimated: boolean } | undefined;
    expect(card(weighed.body.test.id)).toMatchObject({ percentSoFar: 63, percentSoFarEstimated: true });
    expect(card(counted.body.test.id)).toMatchObject({ percentSoFar: 63, percentSoFarEstimated: false });
    // The exact interval is for counted seeds: an estimate keeps its widened one.
    const cp = await bank.viewer.agent.get(
      `${base()}/tests/${weighed.body.test.id}?interval=clopper-pearson`,
    );
    expect(cp.body.result.interval.method).toBe('widened-score');
  });

  it('when a tray is sown by weight of an unweighed lot, then the species’ seeds per gram is used and said', async () => {
    const lotId = await lot(await speciesId(ctx.db, 'tomato'), 'Unweighed lot');
    const res = await startTest(lotId, [{ sown: { by: 'weight', grams: 0.2 } }]);
    expect(res.status).toBe(201);
    expect(res.body.trays[0].sown.estimate.basis).toBe('species');
    const counted = await bank.grower.agent
      .post(`${base()}/tests/${res.body.test.id}/counts`)
      .send({ date: '2026-03-08', trays: [{ trayId: res.body.trays[0].id, cumulative: 30 }] });
    expect(counted.body.result.summary.join(' ')).toMatch(/species' typical seeds per gram/);
    // The packet label says "about", as the screens do.
    const label = await bank.viewer.agent.get(`${base()}/lots/${lotId}/label.svg`).buffer(true);
    expect(label.status).toBe(200);
    expect(Buffer.from(label.body as Buffer).toString('utf8')).toContain(
      `about ${String(counted.body.result.percentRounded)}%`,
    );
  });

  it('when the short form { seedsSown } is sent, then the tray is sown by count', async () => {
    const lotId = await lot();
    const res = await startTest(lotId, [{ seedsSown: 25 }, { sown: { by: 'count', seeds: 25 } }]);
    expect(res.status).toBe(201);
    for (const tray of res.body.trays)
      expect(tray).toMatchObject({ seedsSown: 25, sown: { by: 'count', seeds: 25, estimate: null } });
    expect((await bank.viewer.agent.get(`${base()}/lots/${lotId}`)).body.lot.seedsOnHand).toBe(1950);
  });

  it('when a tray is given bad sowing, then it is 400 naming the field and nothing is saved', async () => {
    const lotId = await lot();
    const cases: [object, string][] = [
      [{ sown: { by: 'weight', grams: 0 } }, 'trays.0.sown.grams'],
      [{ sown: { by: 'weight', grams: -0.5 } }, 'trays.0.sown.grams'],
      [{ sown: { by: 'guess', about: 'handful' } }, 'trays.0.sown.about'],
      [{ sown: { by: 'scoop' } }, 'trays.0.sown.by'],
      [{ seedsSown: 20, sown: { by: 'count', seeds: 20 } }, 'trays.0.sown'],
      [{}, 'trays.0.sown'],
    ];
    for (const [tray, field] of cases) {
      const res = await startTest(lotId, [tray]);
      expect(res.status, JSON.stringify(tray)).toBe(400);
      expect(res.body.error.code).toBe('invalid_input');
      expect(Object.keys(res.body.error.fields ?? {}), JSON.stringify(res.body)).toContain(field);
    }
    expect((await bank.viewer.agent.get(`${base()}/lots/${lotId}/tests`)).body.items).toHaveLength(0);
  });

  it('when a tray is sown by weight of a lot with no seed weight and a species without seeds per gram, then it is 422 asking to weigh a sample or count', async () => {
    const lotId = await lot();
    const res = await startTest(lotId, [{ sown: { by: 'weight', grams: 0.2 } }]);
    expect(res.status).toBe(422);
    expect(res.body.error.message).toMatch(/Weigh a sample/);
    expect(res.body.error.message).toMatch(/count the seeds/);
    expect(res.body.error.fields).toHaveProperty(['trays.0.sown.grams']);
  });

  it('when a day gives a tray both a count and a score, then it is 400', async () => {
    const lotId = await lot();
    const t = (await startTest(lotId, [{ sown: { by: 'guess', about: 'pinch' } }])).body;
    const res = await bank.grower.agent.post(`${base()}/tests/${t.test.id}/counts`).send({
      date: '2026-03-08',
      trays: [{ trayId: t.trays[0].id, cumulative: 3, score: 'few' }],
    });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty(['trays.0.cumulative']);
    const unknown = await bank.grower.agent.post(`${base()}/tests/${t.test.id}/counts`).send({
      date: '2026-03-08',
      trays: [{ trayId: t.trays[0].id, score: 'plenty' }],
    });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.fields).toHaveProperty(['trays.0.score']);
  });

  it('when a tray is scored on one day and counted on another, or scored fewer later, then it is 422', async () => {
    const lotId = await lot();
    const t = (await startTest(lotId, [{ sown: { by: 'guess', about: 'pinch' } }])).body;
    const url = `${base()}/tests/${t.test.id}/counts`;
    const trayId = t.trays[0].id;
    expect(
      (await bank.grower.agent.post(url).send({ date: '2026-03-06', trays: [{ trayId, score: 'half' }] }))
        .status,
    ).toBe(201);
    const fewer = await bank.grower.agent
      .post(url)
      .send({ date: '2026-03-08', trays: [{ trayId, score: 'few' }] });
    expect(fewer.status).toBe(422);
    expect(fewer.body.error.message).toMatch(/"a few" is fewer than the "about half"/);
    const mixed = await bank.grower.agent
      .post(url)
      .send({ date: '2026-03-08', trays: [{ trayId, cumulative: 4 }] });
    expect(mixed.status).toBe(422);
    expect(mixed.body.error.message).toMatch(/scored roughly on other check days/);
  });

  it("when a tray's seedlings are only scored, then the result has no percentage but the lot's viability differs from an untested lot's", async () => {
    const scoredLot = await lot(plainSpecies, 'Scored lot');
    const untestedLot = await lot(plainSpecies, 'Untested lot');
    const before = (await bank.viewer.agent.get(`${base()}/lots/${scoredLot}/viability?on=2026-04-01`)).body;
    const untested = (await bank.viewer.agent.get(`${base()}/lots/${untestedLot}/viability?on=2026-04-01`))
      .body;
    expect(before.projected).toEqual(untested.projected);
    expect(untested.estimateOnly).toBe(true);

    const t = (await startTest(scoredLot, [{ sown: { by: 'guess', about: 'hundreds' } }])).body;
    const trayId = t.trays[0].id;
    const scored = await bank.grower.agent
      .post(`${base()}/tests/${t.test.id}/counts`)
      .send({ date: '2026-03-15', trays: [{ trayId, score: 'few' }] });
    expect(scored.status).toBe(201);
    expect(scored.body.scores).toEqual([{ trayId, date: '2026-03-15', day: 14, score: 'few' }]);
    const finished = await bank.grower.agent
      .post(`${base()}/tests/${t.test.id}/finish`)
      .send({ date: '2026-03-15', trays: [{ trayId }] });
    expect(finished.status, JSON.stringify(finished.body)).toBe(200);
    const result = finished.body.result;
    expect(result).toMatchObject({ percent: null, percentRounded: null, interval: null, sown: null });
    expect(result.trayPercents[0]).toMatchObject({ state: 'scored', score: 'few', percent: null });
    expect(result.summary[0]).toBe(
      'Seedlings came up: a few (tray 1, scored roughly, not counted — no percentage is given for it).',
    );
    // Never a number of percent anywhere in the words.
    expect(result.summary.join(' ')).not.toMatch(/\d\s*%/);

    const after = (await bank.viewer.agent.get(`${base()}/lots/${scoredLot}/viability?on=2026-04-01`)).body;
    const other = (await bank.viewer.agent.get(`${base()}/lots/${untestedLot}/viability?on=2026-04-01`)).body;
    expect(after.estimateOnly).toBe(false);
    // "A few" (5–35% by our convention) pulls the lot well below the species' untested guess.
    expect(after.projected.percent).toBeLessThan(other.projected.percent - 10);
    expect(after.projected.high).toBeLessThan(other.projected.high);
    // No percentage is drawn for a test with only scores.
    expect(after.points).toEqual([]);

    const ranking = (await bank.viewer.agent.get(`${base()}/ranking?on=2026-04-01`)).body.items;
    const row = ranking.find((r: { lotId: string }) => r.lotId === scoredLot);
    expect(row).toMatchObject({ lastPercent: null, lastPercentEstimated: false, lastScore: 'few' });
  });

  it('when more seedlings come up than the guess makes plausible, then no percentage is given', async () => {
    const lotId = await lot();
    const t = (await startTest(lotId, [{ sown: { by: 'guess', about: 'pinch' } }])).body;
    const res = await bank.grower.agent
      .post(`${base()}/tests/${t.test.id}/counts`)
      .send({ date: '2026-03-08', trays: [{ trayId: t.trays[0].id, cumulative: 400 }] });
    expect(res.status).toBe(201);
    expect(res.body.result).toMatchObject({ percent: null, seedlingsExceedSown: true, germinated: 400 });
    expect(res.body.result.summary[0]).toMatch(/no percentage can be given/);
  });

  it('when a test has sprinkled and scored trays, then the CSV export says so in its own columns', async () => {
    const lotId = await lot(plainSpecies, 'Exported lot');
    const t = (
      await startTest(lotId, [
        { sown: { by: 'guess', about: 'few-dozen' } },
        { sown: { by: 'guess', about: 'pinch' } },
      ])
    ).body;
    await bank.grower.agent.post(`${base()}/tests/${t.test.id}/counts`).send({
      date: '2026-03-08',
      trays: [
        { trayId: t.trays[0].id, cumulative: 20 },
        { trayId: t.trays[1].id, score: 'most' },
      ],
    });
    const csv = await bank.viewer.agent.get(`${base()}/tests.csv`);
    expect(csv.status).toBe(200);
    const [head, ...lines] = csv.text
      .replace(/^\uFEFF/, '')
      .trim()
      .split(/\r?\n/);
    const cols = head!.split(',');
    const rows = lines
      .map((l) => Object.fromEntries(l.split(',').map((v, i) => [cols[i], v])))
      .filter((r) => r.variety === 'Exported lot');
    expect(rows).toHaveLength(2);
    expect(rows[0]).toMatchObject({
      seeds_sown: '',
      sown_by: 'guess',
      sown_guess: 'few-dozen',
      seeds_sown_expected: String(Math.round(sownFromGuess('few-dozen').mean)),
      cumulative: '20',
      score: '',
      seeds_sown_estimated: 'yes',
    });
    expect(rows[1]).toMatchObject({ seeds_sown: '', sown_guess: 'pinch', cumulative: '', score: 'most' });
  });
});
