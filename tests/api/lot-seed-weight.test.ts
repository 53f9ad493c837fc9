import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedWeightSourcesForLot } from '#server/modules/lots/lots.shared.repository';
import { seedsFromGrams } from '#server/stats/index';
import { bankWithRoles } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import { speciesId } from '../helpers/lots';

// AOSA Rules Appendix 4 worked example (FRSA tutorial, 2001), the form of ISTA Rules ch. 10's
// thousand-seed weight: eight replicates of 100 seeds weighed in grams [read]. Thousand-seed weight
// 2.132625 g, so 800 / 1.7061 g = 468.906 seeds per gram [computed].
const AOSA_EXAMPLE = [0.2224, 0.2134, 0.213, 0.2116, 0.2145, 0.2071, 0.2116, 0.2125];
const AOSA_SEEDS_PER_GRAM = 800 / 1.7061;

describe('a lot’s seed weight', () => {
  let ctx: TestContext;
  let bank: Awaited<ReturnType<typeof bankWithRoles>>;
  let tomato: string;
  beforeAll(async () => {
    ctx = await createTestContext();
    bank = await bankWithRoles(ctx.app, ctx.db);
    tomato = await speciesId(ctx.db, 'tomato');
  });
  afterAll(() => ctx.close());

  async function newLot(body: Record<string, unknown> = {}) {
    const res = await bank.grower.agent.post(`/api/banks/${bank.bankId}/lots`).send({
      speciesId: tomato,
      variety: 'Weighed Red',
      origin: 'saved',
      harvestDate: '2025-09-01',
      ...body,
    });
    expect(res.status).toBe(201);
    return res.body.lot as { id: string };
  }

  it('when a lot has no samples, then grams → seeds uses the species’ typical seeds per gram', async () => {
    const lot = await newLot({ seedCount: 50 });
    const species = await ctx.db
      .selectFrom('species')
      .select('traits')
      .where('id', '=', tomato)
      .executeTakeFirstOrThrow();
    const typical = (species.traits as { seedsPerGram: number }).seedsPerGram;
    // Tomato ≈ 390 seeds per gram, 280–420 in handbooks (REFERENCES.md, "Seeds per gram").
    expect(typical).toBeGreaterThanOrEqual(280);
    expect(typical).toBeLessThanOrEqual(420);
    const sources = await seedWeightSourcesForLot(ctx.db, bank.bankId, lot.id);
    expect(sources).toEqual({ lot: null, species: { seedsPerGram: typical }, purity: null });
    expect(seedsFromGrams(2, sources).basis).toBe('species');
  });

  it('when eight 100-seed replicates are stored, then the lot’s own figure is used (ISTA ch. 10 / AOSA App. 4)', async () => {
    const lot = await newLot({ seedCount: 900 });
    await ctx.db
      .insertInto('lot_seed_weights')
      .values(AOSA_EXAMPLE.map((grams) => ({ bank_id: bank.bankId, lot_id: lot.id, seeds: 100, grams })))
      .execute();
    const sources = await seedWeightSourcesForLot(ctx.db, bank.bankId, lot.id);
    expect(sources.lot?.seedsPerGram).toBeCloseTo(AOSA_SEEDS_PER_GRAM, 6);
    expect(sources.purity).toBeNull();
    const estimate = seedsFromGrams(4, sources);
    expect(estimate.basis).toBe('lot');
    expect(estimate.mean).toBeCloseTo(4 * AOSA_SEEDS_PER_GRAM, 4);
  });

  it('when a sample was cleaned, then its pure-seed fraction is clean ÷ weighed (as in a purity analysis)', async () => {
    const lot = await newLot({ seedCount: 900 });
    // Made up: a 0.40 g pinch holds 100 seeds weighing 0.30 g once the chaff is picked out.
    await ctx.db
      .insertInto('lot_seed_weights')
      .values({ bank_id: bank.bankId, lot_id: lot.id, seeds: 100, grams: 0.4, clean_grams: 0.3 })
      .execute();
    const sources = await seedWeightSourcesForLot(ctx.db, bank.bankId, lot.id);
    expect(sources.lot?.seedsPerGram).toBeCloseTo(100 / 0.3, 9);
    expect(sources.purity?.fraction).toBeCloseTo(0.75, 12);
    // The pinch itself comes back as its 100 seeds: 0.4 g × 0.75 × 333.3 seeds/g.
    expect(seedsFromGrams(0.4, sources).mean).toBeCloseTo(100, 9);
  });

  it('when the lot is in another bank, then it is not found', async () => {
    const lot = await newLot({ seedCount: 10 });
    const other = await bankWithRoles(ctx.app, ctx.db);
    await expect(seedWeightSourcesForLot(ctx.db, other.bankId, lot.id)).rejects.toMatchObject({
      status: 404,
    });
  });
});
