import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bankWithRoles } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import { finishedAssay, speciesId } from '../helpers/lots';

// Generations: parent plants grown from a lot of the bank (grownFromLotId), plants kept for seed
// from a sown plan entry (POST …/plants/from-sowing), and a lot's line on its read (lineage).
//
// Expected values. The generation count is the seed saver's own: seed bought or of unknown origin
// starts a line, and each year's seed saved from plants grown from the year before is one
// generation more (common practice; the same counting as "the Nth generation saved here").
// Populations are the plants the seed was bulked from, as given (plantsBulked) or counted from the
// lot's parent plants. The hybrid caution: the offspring of an F1 hybrid segregate, so its seed
// does not come true (Mendel's law of segregation; every seed-saving handbook says so; common
// practice).
describe('generations: a lot knows its line back through the bank’s earlier lots', () => {
  let ctx: TestContext;
  let bank: Awaited<ReturnType<typeof bankWithRoles>>;
  let tomato: string;
  let pepper: string;
  const base = () => `/api/banks/${bank.bankId}`;

  beforeAll(async () => {
    // Autumn of the 2027 season: this summer's plants have been harvested.
    ctx = await createTestContext({ now: '2027-10-01T09:00:00Z' });
    bank = await bankWithRoles(ctx.app, ctx.db);
    tomato = await speciesId(ctx.db, 'tomato');
    pepper = await speciesId(ctx.db, 'pepper');
  });
  afterAll(() => ctx.close());

  async function lot(body: object) {
    const res = await bank.grower.agent.post(`${base()}/lots`).send({
      speciesId: tomato,
      variety: 'Amber Ladder',
      origin: 'saved',
      seedCount: 200,
      ...body,
    });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body.lot as { id: string; code: string; lineage: Lineage };
  }

  async function plant(body: object) {
    const res = await bank.grower.agent
      .post(`${base()}/plants`)
      .send({ speciesId: tomato, label: 'Row', ...body });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body.plant as { id: string; grownFromLotId: string | null; grownFromLotCode: string | null };
  }

  /** A plan entry of `season` sown from `lotId` (tested first: 46 + 45 of 50), as the planner makes it. */
  async function sownEntry(lotId: string, season = 2027) {
    await finishedAssay(bank.grower.agent, bank.bankId, lotId, `${season - 1}-12-01`, [
      { sown: 50, germinated: 46 },
      { sown: 50, germinated: 45 },
    ]);
    const entry = await bank.grower.agent
      .post(`${base()}/plan`)
      .send({ season, speciesId: tomato, plantsWanted: 6, start: 'indoors', lotId });
    expect(entry.status, JSON.stringify(entry.body)).toBe(201);
    const entryId: string = entry.body.entry.id;
    const sown = await bank.grower.agent
      .post(`${base()}/plan/${entryId}/sown`)
      .send({ date: `${season}-03-28`, confirm: true });
    expect(sown.status, JSON.stringify(sown.body)).toBe(200);
    return entryId;
  }

  const read = async (lotId: string) => {
    const res = await bank.viewer.agent.get(`${base()}/lots/${lotId}`);
    expect(res.status).toBe(200);
    return res.body.lot as { id: string; code: string; lineage: Lineage };
  };

  interface Lineage {
    generation: number;
    population: number | null;
    parents: { plantId: string; grownFromLotId: string | null; code: string | null; hybrid: boolean }[];
    ancestors: { lotId: string; code: string; generation: number; population: number | null }[];
    cautions: string[];
  }

  /** lot 1 (bought) → 3 plants → lot 2 → 4 plants kept from a sowing → lot 3. */
  async function threeGenerations() {
    const first = await lot({
      origin: 'bought',
      sourceName: 'A seed fair stall',
      packedForSeason: 2025,
      plantsBulked: 12,
    });
    const grown = [];
    for (const label of ['Bed 1, north', 'Bed 1, middle', 'Bed 1, south']) {
      grown.push(await plant({ label, season: 2026, grownFromLotId: first.id }));
    }
    const second = await lot({ harvestDate: '2026-09-02', parentPlantIds: grown.map((p) => p.id) });
    const entryId = await sownEntry(second.id);
    const kept = await bank.grower.agent
      .post(`${base()}/plants/from-sowing`)
      .send({ entryId, plants: 4, label: 'Bed 3', location: 'Bed 3' });
    expect(kept.status, JSON.stringify(kept.body)).toBe(201);
    const keptPlants = kept.body.items as {
      id: string;
      label: string;
      season: number;
      grownFromLotId: string;
    }[];
    const third = await lot({ harvestDate: '2027-09-10', parentPlantIds: keptPlants.map((p) => p.id) });
    return { first, second, third, grown, keptPlants };
  }

  it('when seed is saved over three generations, then each lot has its generation, its ancestors nearest first and the population of each step', async () => {
    const { first, second, third, keptPlants } = await threeGenerations();

    // The plants kept from the sowing grew from its lot, in its season, numbered.
    expect(keptPlants.map((p) => p.label)).toEqual([
      'Bed 3, plant 1 of 4',
      'Bed 3, plant 2 of 4',
      'Bed 3, plant 3 of 4',
      'Bed 3, plant 4 of 4',
    ]);
    expect(keptPlants.every((p) => p.grownFromLotId === second.id && p.season === 2027)).toBe(true);

    // Bought seed starts a line: generation 1, nothing before it.
    const one = (await read(first.id)).lineage;
    expect(one).toMatchObject({ generation: 1, population: 12, parents: [], ancestors: [], cautions: [] });

    const two = (await read(second.id)).lineage;
    expect(two.generation).toBe(2);
    expect(two.population).toBe(3); // no plantsBulked given: its 3 parent plants counted
    expect(two.parents).toHaveLength(3);
    expect(two.parents.every((p) => p.grownFromLotId === first.id && p.code === first.code)).toBe(true);
    expect(two.ancestors).toEqual([
      expect.objectContaining({ lotId: first.id, code: first.code, generation: 1, population: 12 }),
    ]);

    const three = third.lineage; // the answer to logging it carries the line already
    expect(three.generation).toBe(3);
    expect(three.population).toBe(4);
    expect(three.parents.map((p) => p.code)).toEqual([second.code, second.code, second.code, second.code]);
    expect(three.ancestors.map((a) => [a.code, a.generation, a.population])).toEqual([
      [second.code, 2, 3],
      [first.code, 1, 12],
    ]);
    expect((await read(third.id)).lineage).toEqual(three);

    // Lists stay light: the line is on the read of one lot only.
    const list = await bank.viewer.agent.get(`${base()}/lots?limit=500`);
    expect(list.body.items.find((l: { id: string }) => l.id === third.id).lineage).toBeUndefined();
  });

  it('when a lot’s parent plants grew from lots of different generations, then it is one more than the latest', async () => {
    const { first, second } = await threeGenerations();
    const mixed = await lot({
      harvestDate: '2027-09-12',
      // One plant grown from generation 1, one from generation 2: the latest generation counts.
      parentPlantIds: [
        (await plant({ label: 'Old line', grownFromLotId: first.id })).id,
        (await plant({ label: 'New line', grownFromLotId: second.id })).id,
      ],
    });
    expect(mixed.lineage.generation).toBe(3);
    expect(mixed.lineage.ancestors.map((a) => a.code)).toEqual([second.code, first.code]);
  });

  it('when a parent plant was an F1 hybrid, then the lot is logged with the hybrid caution and keeps it on its read', async () => {
    const bought = await lot({ origin: 'bought', packedForSeason: 2026, variety: 'Sunburst F1' });
    const hybrid = await plant({ label: 'Greenhouse 2', hybrid: true, grownFromLotId: bought.id });
    const saved = await lot({
      harvestDate: '2027-08-30',
      variety: 'Sunburst F2',
      parentPlantIds: [hybrid.id],
    });
    expect(saved.lineage.cautions).toHaveLength(1);
    expect(saved.lineage.cautions[0]).toMatch(/hybrid \(F1\).*will not come true/);
    expect(saved.lineage.parents[0]).toMatchObject({ hybrid: true, grownFromLotId: bought.id });
    expect((await read(saved.id)).lineage.cautions).toEqual(saved.lineage.cautions);
    // The plant's own caution is the same text: one place for it.
    const plants = await bank.viewer.agent.get(`${base()}/plants/${hybrid.id}`);
    expect(plants.body.plant.cautions).toContain(saved.lineage.cautions[0]);
    // No hybrid parent, no caution.
    expect(bought.lineage.cautions).toEqual([]);
  });

  it('when a plant names a lot of another bank, another species or no lot, then it is refused with the field named', async () => {
    const other = await bankWithRoles(ctx.app, ctx.db);
    const foreign = await other.grower.agent.post(`/api/banks/${other.bankId}/lots`).send({
      speciesId: tomato,
      variety: 'Elsewhere',
      origin: 'saved',
      harvestDate: '2026-09-01',
      seedCount: 50,
    });
    expect(foreign.status).toBe(201);
    const refused = await bank.grower.agent
      .post(`${base()}/plants`)
      .send({ speciesId: tomato, label: 'Cross-bank', grownFromLotId: foreign.body.lot.id });
    expect(refused.status).toBe(422);
    expect(refused.body.error.fields).toHaveProperty('grownFromLotId');

    const mine = await plant({ label: 'Will move' });
    const patched = await bank.grower.agent
      .patch(`${base()}/plants/${mine.id}`)
      .send({ grownFromLotId: foreign.body.lot.id });
    expect(patched.status).toBe(422);
    expect(patched.body.error.fields).toHaveProperty('grownFromLotId');
    expect((await bank.viewer.agent.get(`${base()}/plants/${mine.id}`)).body.plant.grownFromLotId).toBeNull();

    const tomatoLot = await lot({ harvestDate: '2026-09-03' });
    const wrongSpecies = await bank.grower.agent
      .post(`${base()}/plants`)
      .send({ speciesId: pepper, label: 'Pepper from a tomato lot', grownFromLotId: tomatoLot.id });
    expect(wrongSpecies.status).toBe(422);
    expect(wrongSpecies.body.error.fields).toHaveProperty('grownFromLotId');

    // Nor can a plant grown from a tomato lot become a pepper.
    const grownTomato = await plant({ label: 'Grown tomato', grownFromLotId: tomatoLot.id });
    const respecies = await bank.grower.agent
      .patch(`${base()}/plants/${grownTomato.id}`)
      .send({ speciesId: pepper });
    expect(respecies.status).toBe(422);
    expect(respecies.body.error.fields).toHaveProperty('grownFromLotId');

    const notAnId = await bank.grower.agent
      .post(`${base()}/plants`)
      .send({ speciesId: tomato, label: 'Bad id', grownFromLotId: 'lot-1' });
    expect(notAnId.status).toBe(400);
    expect(notAnId.body.error.fields).toHaveProperty('grownFromLotId');

    // The other bank's grower cannot keep plants from this bank's sowing.
    const entryId = await sownEntry(tomatoLot.id);
    const outsider = await other.grower.agent
      .post(`/api/banks/${other.bankId}/plants/from-sowing`)
      .send({ entryId, plants: 2 });
    expect(outsider.status).toBe(404);
  });

  it('when an edit would make a lot its own ancestor, then it is refused with 409 and nothing changes', async () => {
    const { first, second, third, grown, keptPlants } = await threeGenerations();
    // A parent plant of lot 2 said to have grown from lot 3 (which descends from lot 2).
    const loop = await bank.grower.agent
      .patch(`${base()}/plants/${grown[0]!.id}`)
      .send({ grownFromLotId: third.id });
    expect(loop.status).toBe(409);
    expect(loop.body.error).toMatchObject({
      code: 'lineage_cycle',
      fields: { grownFromLotId: expect.any(String) },
    });
    // …or from lot 2 itself.
    const self = await bank.grower.agent
      .patch(`${base()}/plants/${grown[0]!.id}`)
      .send({ grownFromLotId: second.id });
    expect(self.status).toBe(409);
    // Lot 1 given a parent plant grown from lot 3.
    const back = await bank.grower.agent
      .patch(`${base()}/lots/${first.id}`)
      .send({ parentPlantIds: [keptPlants[0]!.id] });
    expect(back.status).toBe(409);
    expect(back.body.error).toMatchObject({
      code: 'lineage_cycle',
      fields: { parentPlantIds: expect.any(String) },
    });

    // Nothing changed: the line reads as before.
    expect((await read(first.id)).lineage.generation).toBe(1);
    expect((await read(third.id)).lineage.ancestors.map((a) => a.code)).toEqual([second.code, first.code]);
    // A move that keeps the order is fine: a plant of lot 3 said to have grown from lot 1.
    const fine = await bank.grower.agent
      .patch(`${base()}/plants/${keptPlants[0]!.id}`)
      .send({ grownFromLotId: first.id });
    expect(fine.status).toBe(200);
    expect(fine.body.plant).toMatchObject({ grownFromLotId: first.id, grownFromLotCode: first.code });
  });

  it('when a cycle is written behind the server’s back, then reading the lot still ends', async () => {
    const a = await lot({ harvestDate: '2026-09-05' });
    const pa = await plant({ label: 'Loop A', grownFromLotId: a.id });
    const b = await lot({ harvestDate: '2027-09-05', parentPlantIds: [pa.id] });
    const pb = await plant({ label: 'Loop B', grownFromLotId: b.id });
    // By hand in SQL, past the checks: a is now saved from plants grown from b.
    await ctx.db.insertInto('lot_parents').values({ lot_id: a.id, parent_plant_id: pb.id }).execute();
    await ctx.changeFeed.sync();
    const res = await bank.viewer.agent.get(`${base()}/lots/${a.id}`);
    expect(res.status).toBe(200);
    expect(res.body.lot.lineage.ancestors.map((x: { code: string }) => x.code)).toEqual([b.code]);
  });

  it('when plants are kept from a sowing not yet sown, by a viewer or as none, then it is refused', async () => {
    const source = await lot({ harvestDate: '2026-09-07' });
    const unsown = await bank.grower.agent
      .post(`${base()}/plan`)
      .send({ season: 2028, speciesId: tomato, plantsWanted: 4, start: 'indoors', lotId: source.id });
    expect(unsown.status).toBe(201);
    const notYet = await bank.grower.agent
      .post(`${base()}/plants/from-sowing`)
      .send({ entryId: unsown.body.entry.id, plants: 2 });
    expect(notYet.status).toBe(422);
    expect(notYet.body.error.fields).toHaveProperty('entryId');

    const entryId = await sownEntry(source.id);
    const viewer = await bank.viewer.agent.post(`${base()}/plants/from-sowing`).send({ entryId, plants: 2 });
    expect(viewer.status).toBe(403);
    const none = await bank.grower.agent.post(`${base()}/plants/from-sowing`).send({ entryId, plants: 0 });
    expect(none.status).toBe(400);
    expect(none.body.error.fields).toHaveProperty('plants');
    const one = await bank.grower.agent
      .post(`${base()}/plants/from-sowing`)
      .send({ entryId, plants: 1, hybrid: false });
    expect(one.status).toBe(201);
    expect(one.body.items).toEqual([
      expect.objectContaining({
        label: `From ${source.code}`,
        grownFromLotId: source.id,
        grownFromLotCode: source.code,
      }),
    ]);
  });
});
