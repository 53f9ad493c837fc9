import jStat from 'jstat';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bankWithRoles } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import { finishedAssay, speciesId } from '../helpers/lots';

const probit = (p: number) => jStat.normal.inv(p, 0, 1);
const phi = (z: number) => jStat.normal.cdf(z, 0, 1);

describe('viability, ranking and seeds to sow', () => {
  let ctx: TestContext;
  let bank: Awaited<ReturnType<typeof bankWithRoles>>;
  let tomato: string;
  const queries: string[] = [];
  beforeAll(async () => {
    ctx = await createTestContext({ now: '2026-12-01T09:00:00Z', onQuery: (q) => queries.push(q) });
    bank = await bankWithRoles(ctx.app, ctx.db);
    tomato = await speciesId(ctx.db, 'tomato');
  });
  afterAll(() => ctx.close());
  const base = () => `/api/banks/${bank.bankId}`;
  const newLot = async (variety: string, seeds = 1000, harvestDate = '2023-09-01') =>
    (
      await bank.grower.agent
        .post(`${base()}/lots`)
        .send({ speciesId: tomato, variety, origin: 'saved', harvestDate, seedCount: seeds })
    ).body.lot.id as string;

  it('when a lot was tested twice as it aged, then its own decline is fitted (basis lot) and projected below its last test', async () => {
    const lotId = await newLot('Declining');
    await finishedAssay(bank.grower.agent, bank.bankId, lotId, '2024-03-01', [{ sown: 100, germinated: 92 }]);
    await finishedAssay(bank.grower.agent, bank.bankId, lotId, '2026-03-01', [{ sown: 100, germinated: 60 }]);
    const res = await bank.viewer.agent.get(`${base()}/lots/${lotId}/viability?on=2027-03-01`);
    expect(res.status).toBe(200);
    expect(res.body.basis).toBe('lot');

    // Worked by hand from the viability equation v = Ki − p/σ (Ellis & Roberts 1980), two points,
    // so the maximum-likelihood probit line passes through both exactly:
    const a1 = res.body.points[0].ageYears; // 2023-09-01 → 2024-03-01 ≈ 0.5 years
    const a2 = res.body.points[1].ageYears; // → 2026-03-01 ≈ 2.5 years
    const slope = (probit(0.6) - probit(0.92)) / (a2 - a1); // ≈ (0.2533 − 1.4051)/2 = −0.576 per year
    const ki = probit(0.92) - slope * a1; // ≈ 1.693 probits → initial ≈ 95%
    // The hierarchical model (server/stats/viability-model.ts) shrinks the lot's own rate a little
    // toward its species' and bounds the initial viability, so it lands near, not on, the
    // two-point line; its bands are checked by the seeded simulation (npm run check:coverage).
    // The tomato's typical life (4 years) and this cool-room lot's age give an equivalent age equal
    // to the calendar age (no storage recorded: taken as 15 °C).
    expect(res.body.sigmaYears).toBeGreaterThan(0.7 * (-1 / slope));
    expect(res.body.sigmaYears).toBeLessThan(1.3 * (-1 / slope));
    expect(Math.abs(res.body.initialPercent - phi(ki) * 100)).toBeLessThan(5);
    const age = res.body.ageYears; // ≈ 3.5 years on 2027-03-01
    expect(Math.abs(res.body.projected.percent - phi(ki + slope * age) * 100)).toBeLessThan(10); // two-point line ≈ 37%
    expect(res.body.projected.percent).toBeLessThan(60);
    expect(res.body.projected.low).toBeLessThan(res.body.projected.percent);
    expect(res.body.projected.high).toBeGreaterThan(res.body.projected.percent);
    expect(res.body.retestBy).toMatch(/^\d{4}-\d{2}-\d{2}$/);
  });

  it('when a lot has one test and a sibling lot shows the decline, then it borrows the slope (basis species)', async () => {
    const lotId = await newLot('Tested once', 1000, '2025-09-01');
    await finishedAssay(bank.grower.agent, bank.bankId, lotId, '2026-02-01', [
      { sown: 50, germinated: 45 },
      { sown: 50, germinated: 46 },
    ]);
    const res = await bank.viewer.agent.get(`${base()}/lots/${lotId}/viability?on=2027-03-01`);
    expect(res.body.basis).toBe('species');
  });

  it('when a species has no other lots with a decline, then the typical seed life is used (basis typical)', async () => {
    const lettuce = await speciesId(ctx.db, 'lettuce');
    const res0 = await bank.grower.agent.post(`${base()}/lots`).send({
      speciesId: lettuce,
      variety: 'Lone',
      origin: 'bought',
      packedForSeason: 2026,
      seedCount: 500,
      storage: { place: 'fridge' },
    });
    await finishedAssay(bank.grower.agent, bank.bankId, res0.body.lot.id, '2026-02-01', [
      { sown: 100, germinated: 90 },
    ]);
    const res = await bank.viewer.agent.get(`${base()}/lots/${res0.body.lot.id}/viability?on=2027-03-01`);
    expect(res.body.basis).toBe('typical');
    // Dickie et al. 1990 universal temperature terms: σ(5 °C)/σ(15 °C) = 10^(0.0329·10 + 0.000478·200) ≈ 2.66.
    expect(res.body.notes.join(' ')).toMatch(/Storage at about 5 °C ages seed about 2\.7× slower/);
  });

  it('when the ranking is asked for, then every active lot appears once with a recommendation and a reason', async () => {
    const untested = await newLot('Never tested');
    const res = await bank.viewer.agent.get(`${base()}/ranking?on=2027-03-01`);
    expect(res.status).toBe(200);
    const active = await ctx.db
      .selectFrom('lots')
      .select('id')
      .where('bank_id', '=', bank.bankId)
      .where('status', 'in', ['active', 'depleted'])
      .execute();
    expect(res.body.items.map((i: { lotId: string }) => i.lotId).sort()).toEqual(
      active.map((l) => l.id).sort(),
    );
    for (const item of res.body.items) {
      expect(['test-first', 'sow', 'sow-thick', 'retest', 'grow-out', 'retire']).toContain(
        item.recommendation,
      );
      expect(item.reason.length).toBeGreaterThan(10);
    }
    const fresh = res.body.items.find((i: { lotId: string }) => i.lotId === untested);
    expect(fresh).toMatchObject({ recommendation: 'test-first', estimateOnly: true, lastTestDate: null });
    const declining = res.body.items.find((i: { variety: string }) => i.variety === 'Declining');
    expect(declining.lastPercent).toBe(60);
    expect(declining.recommendation).not.toBe('sow');
  });

  it('when lots are added, then the ranking issues the same number of queries', async () => {
    const count = async () => {
      queries.length = 0;
      await bank.viewer.agent.get(`${base()}/ranking?on=2027-03-01`);
      // The ranking's own queries: the caller's session is kept between requests, but read again
      // after any write (server/db/read-cache.ts), which is not the ranking's doing.
      return queries.filter((q) => !/from "sessions"/.test(q)).length;
    };
    await count();
    // Fits current: no test is read at all.
    const warm = await count();
    expect(queries.some((q) => /from "germination_tests"/.test(q))).toBe(false);
    for (let i = 0; i < 5; i++) {
      const lotId = await newLot(`Extra ${i}`, 300, '2024-09-01');
      await finishedAssay(bank.grower.agent, bank.bankId, lotId, '2025-03-01', [
        { sown: 50, germinated: 40 },
      ]);
    }
    // The changed species' tests in one more select and what came up from its sowings in another,
    // however many lots changed; then current again.
    expect(await count()).toBe(warm + 2);
    expect(await count()).toBe(warm);
  });

  it('when a lot was swapped in as treated seed, then its ranking row says where it came from and that it is treated', async () => {
    const res = await bank.grower.agent.post(`${base()}/lots`).send({
      speciesId: tomato,
      variety: 'Coated Swap',
      origin: 'swapped',
      sourceName: 'Orchard Lane circle',
      treated: true,
      harvestDate: '2025-09-01',
      seedCount: 50,
    });
    expect(res.status).toBe(201);
    const ranking = await bank.viewer.agent.get(`${base()}/ranking?on=2027-03-01`);
    const row = (ranking.body.items as { lotId: string }[]).find((i) => i.lotId === res.body.lot.id);
    expect(row).toMatchObject({ origin: 'swapped', sourceName: 'Orchard Lane circle', treated: true });
  });

  it('when seeds to sow are asked for 12 plants, then the assurance holds over the whole band, so a small test asks for more seed', async () => {
    const seedsFor = async (variety: string, trays: { sown: number; germinated: number }[]) => {
      const lotId = await newLot(variety, 1000, '2025-09-01');
      await finishedAssay(bank.grower.agent, bank.bankId, lotId, '2026-02-01', trays);
      const res = await bank.viewer.agent.get(
        `${base()}/lots/${lotId}/seeds-to-sow?plants=12&assurance=0.9&on=2027-03-01`,
      );
      expect(res.status).toBe(200);
      return res.body;
    };
    const large = await seedsFor('Tested on 200', [
      { sown: 100, germinated: 80 },
      { sown: 100, germinated: 80 },
    ]);
    const small = await seedsFor('Tested on 10', [{ sown: 10, germinated: 8 }]);
    // The point-estimate answer (least n with P(Binomial(n, p) ≥ 12) ≥ 0.9, from jStat's binomial
    // cdf) ignores the uncertainty in p; the predictive answer is never below it.
    const pointEstimate = (p: number) => {
      let n = 12;
      while (1 - jStat.binomial.cdf(11, n, p) < 0.9) n += 1;
      return n;
    };
    expect(large.seeds).toBeGreaterThanOrEqual(pointEstimate(large.germinationUsed));
    expect(small.seeds).toBeGreaterThan(large.seeds);
    expect(large.explanation).toMatch(/Sow \d+ seeds for 12 plants/);
    // The sowing date in words, as every screen writes it.
    expect(large.explanation).toContain('on 1 Mar 2027,');
  });

  it('when a lot has no test, then seeds to sow is a guess from the species, said in words, with a wide band', async () => {
    const lotId = await newLot('Unknown');
    const res = await bank.viewer.agent.get(`${base()}/lots/${lotId}/seeds-to-sow?plants=12`);
    expect(res.status).toBe(200);
    expect(res.body.estimateOnly).toBe(true);
    expect(res.body.explanation).toMatch(/Not tested — this is a guess.*Test 20 seeds first/);
    expect(res.body.projectedHigh - res.body.projectedLow).toBeGreaterThan(30);
  });
});
