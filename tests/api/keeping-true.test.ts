import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { KeepingTrueResponse, SeedSavingWarning } from '#shared/schemas/seed-saving';
import { bankWithRoles } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import { finishedAssay, speciesId } from '../helpers/lots';

// Expected values are the reference's as read in published seed-saving sources
// (shared/species-seed-saving.ts): tomato is self-pollinated, 10 plants (garden Seed Saving Chart
// [read]); cucumber is insect-pollinated, ½ mile = 804.672 m apart, 10 plants (the same chart [read];
// 1 mile = 1609.344 m by definition); onion is a biennial (vegetable life-cycle table [read]).

describe('keeping a variety true', () => {
  let ctx: TestContext;
  let bank: Awaited<ReturnType<typeof bankWithRoles>>;
  let tomato: string;
  let cucumber: string;
  beforeAll(async () => {
    ctx = await createTestContext({ now: '2026-12-01T09:00:00Z' });
    bank = await bankWithRoles(ctx.app, ctx.db); // last frost 05-20
    tomato = await speciesId(ctx.db, 'tomato');
    cucumber = await speciesId(ctx.db, 'cucumber');
  });
  afterAll(() => ctx.close());

  const api = () => bank.grower.agent;
  const plant = async (body: Record<string, unknown>) => {
    const res = await api().post(`/api/banks/${bank.bankId}/plants`).send(body);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body.plant as { id: string; warnings: SeedSavingWarning[]; isolation: unknown };
  };
  const readPlant = async (id: string) => {
    const res = await bank.viewer.agent.get(`/api/banks/${bank.bankId}/plants/${id}`);
    expect(res.status).toBe(200);
    return res.body.plant as { warnings: SeedSavingWarning[]; isolation: unknown };
  };
  const lot = async (body: Record<string, unknown>) => {
    const res = await api()
      .post(`/api/banks/${bank.bankId}/lots`)
      .send({ origin: 'saved', harvestDate: '2026-09-01', seedCount: 400, ...body });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body.lot.id as string;
  };
  const keepingTrue = async (lotId: string) => {
    const res = await bank.viewer.agent.get(`/api/banks/${bank.bankId}/lots/${lotId}/keeping-true`);
    expect(res.status).toBe(200);
    return res.body as KeepingTrueResponse;
  };
  const kinds = (w: SeedSavingWarning[]) => w.map((x) => x.kind);

  describe('the population warning', () => {
    it('when a tomato lot was saved from 3 plants, then the lot and its parents warn, naming 3 and the 10 needed', async () => {
      const parents = [];
      for (const label of ['Bed A, first', 'Bed A, second', 'Bed A, third'])
        parents.push(await plant({ speciesId: tomato, label, variety: 'Amber Pear', season: 2026 }));
      const lotId = await lot({
        speciesId: tomato,
        variety: 'Amber Pear',
        parentPlantIds: parents.map((p) => p.id),
      });
      const k = await keepingTrue(lotId);
      expect(k).toMatchObject({
        pollination: 'self',
        minPlantsForSeed: 10,
        plantsSavedFrom: 3,
        parentPlants: 3,
      });
      expect(kinds(k.warnings)).toEqual(['population']);
      expect(k.warnings[0]!.message).toMatch(/Seed saved from 3 plants: Tomato needs at least 10 plants/);
      // The parent plant's own read says the same: its lot was saved from 3.
      const read = await readPlant(parents[0]!.id);
      expect(kinds(read.warnings)).toEqual(['population']);
      expect(read.warnings[0]!.message).toContain('3 plants');
    });

    it('when the lot records 12 plants bulked, then there is no population warning', async () => {
      const p = await plant({
        speciesId: tomato,
        label: 'Row of twelve',
        variety: 'Long Keeper',
        season: 2026,
      });
      const lotId = await lot({
        speciesId: tomato,
        variety: 'Long Keeper',
        parentPlantIds: [p.id],
        plantsBulked: 12,
      });
      const k = await keepingTrue(lotId);
      expect(k.plantsSavedFrom).toBe(12);
      expect(k.warnings).toEqual([]);
      expect((await readPlant(p.id)).warnings).toEqual([]);
    });

    it('when a parent plant is in no lot yet, then its variety’s plants that season count, and two are too few', async () => {
      const a = await plant({ speciesId: tomato, label: 'Pot 1', variety: 'Patio Gold', season: 2025 });
      expect(a.warnings[0]!.message).toMatch(/Seed saved from 1 plant: Tomato needs at least 10/);
      await plant({ speciesId: tomato, label: 'Pot 2', variety: 'Patio Gold', season: 2025 });
      expect((await readPlant(a.id)).warnings[0]!.message).toMatch(/from 2 plants/);
    });

    it('when two tomato varieties grew side by side with no isolation, then there is no isolation warning (self-pollinated)', async () => {
      const a = await plant({ speciesId: tomato, label: 'Red row', variety: 'Red One', season: 2024 });
      await plant({ speciesId: tomato, label: 'Yellow row', variety: 'Yellow One', season: 2024 });
      expect(kinds((await readPlant(a.id)).warnings)).not.toContain('isolation');
    });
  });

  describe('the isolation warning', () => {
    let green: { id: string };
    let white: { id: string };
    let lotId: string;
    beforeAll(async () => {
      green = await plant({ speciesId: cucumber, label: 'Trellis', variety: 'Green Ladder', season: 2026 });
      white = await plant({ speciesId: cucumber, label: 'Fence', variety: 'White Lantern', season: 2026 });
      lotId = await lot({
        speciesId: cucumber,
        variety: 'Green Ladder',
        parentPlantIds: [green.id],
        plantsBulked: 10,
      });
    });

    it('when two cucumber varieties grew the same season with no isolation recorded, then both plants and the lot warn', async () => {
      for (const id of [green.id, white.id]) {
        const read = await readPlant(id);
        expect(read.isolation).toBeNull();
        expect(kinds(read.warnings)).toContain('isolation');
      }
      const k = await keepingTrue(lotId);
      expect(k).toMatchObject({ pollination: 'insect', plantsSavedFrom: 10 });
      expect(k.isolationMeters).toBeCloseTo(804.672, 6);
      expect(kinds(k.warnings)).toEqual(['isolation']);
      const words = k.warnings[0]!.message;
      expect(words).toContain('“Green Ladder”');
      expect(words).toContain('“White Lantern”');
      expect(words).toContain('2026');
      expect(words).toContain('no isolation recorded');
      expect(words).toContain('about 805 m');
      expect(words).toMatch(/local seed-saving or extension advice/);
    });

    it('when the distance recorded is under the species’ isolation, then the warning names both distances', async () => {
      const res = await api()
        .patch(`/api/banks/${bank.bankId}/plants/${green.id}`)
        .send({ isolation: { method: 'distance', meters: 100 } });
      expect(res.status).toBe(200);
      expect(res.body.plant.isolation).toEqual({ method: 'distance', meters: 100 });
      const k = await keepingTrue(lotId);
      expect(k.warnings).toHaveLength(1);
      expect(k.warnings[0]!.message).toMatch(/only 100 m apart: .*needs about 805 m between varieties/);
      // A distance is the same seen from the other side.
      const whiteWarnings = (await readPlant(white.id)).warnings.filter((w) => w.kind === 'isolation');
      expect(whiteWarnings[0]!.message).toContain('only 100 m apart');
    });

    it('when the distance recorded reaches the species’ isolation, then neither warns', async () => {
      await api()
        .patch(`/api/banks/${bank.bankId}/plants/${green.id}`)
        .send({ isolation: { method: 'distance', meters: 900 } })
        .expect(200);
      expect((await keepingTrue(lotId)).warnings).toEqual([]);
      expect(kinds((await readPlant(white.id)).warnings)).not.toContain('isolation');
    });

    it('when the other variety’s flowers were bagged (or flowering staggered), then the pair is kept apart', async () => {
      await api()
        .patch(`/api/banks/${bank.bankId}/plants/${green.id}`)
        .send({ isolation: { method: 'none' } })
        .expect(200);
      expect(kinds((await keepingTrue(lotId)).warnings)).toEqual(['isolation']);
      await api()
        .patch(`/api/banks/${bank.bankId}/plants/${white.id}`)
        .send({ isolation: { method: 'bagging' } })
        .expect(200);
      expect((await keepingTrue(lotId)).warnings).toEqual([]);
      await api()
        .patch(`/api/banks/${bank.bankId}/plants/${white.id}`)
        .send({ isolation: { method: 'time' } })
        .expect(200);
      expect((await keepingTrue(lotId)).warnings).toEqual([]);
      // Cleared again: not said is no isolation.
      await api().patch(`/api/banks/${bank.bankId}/plants/${white.id}`).send({ isolation: null }).expect(200);
      expect(kinds((await keepingTrue(lotId)).warnings)).toEqual(['isolation']);
    });

    it('when the other variety grew in another season, then there is nothing to warn of', async () => {
      const a = await plant({
        speciesId: cucumber,
        label: 'Old trellis',
        variety: 'Green Ladder',
        season: 2023,
      });
      await plant({ speciesId: cucumber, label: 'Old fence', variety: 'White Lantern', season: 2022 });
      expect(kinds((await readPlant(a.id)).warnings)).not.toContain('isolation');
    });

    it('when the isolation is malformed, then 400 names the field and nothing changes', async () => {
      const cases = [
        { isolation: { method: 'distance' } },
        { isolation: { method: 'distance', meters: -5 } },
        { isolation: { method: 'far away' } },
        { isolation: 'bagged' },
      ];
      for (const body of cases) {
        const res = await api().patch(`/api/banks/${bank.bankId}/plants/${white.id}`).send(body);
        expect(res.status, JSON.stringify(body)).toBe(400);
        expect(res.body.error.code).toBe('invalid_input');
        expect(Object.keys(res.body.error.fields ?? {}).join(' ')).toMatch(/isolation/);
      }
      expect((await readPlant(white.id)).isolation).toBeNull();
    });

    it('when the lot is not in the bank, then 404; a non-member gets 404 too', async () => {
      const missing = '00000000-0000-4000-8000-000000000000';
      expect((await api().get(`/api/banks/${bank.bankId}/lots/${missing}/keeping-true`)).status).toBe(404);
      expect(
        (await bank.outsider.agent.get(`/api/banks/${bank.bankId}/lots/${lotId}/keeping-true`)).status,
      ).toBe(404);
    });
  });

  describe('a bank’s own species traits', () => {
    it('when a bank overrides a reference species’ seed-saving traits, then they are taken, and bad values are 400', async () => {
      const url = `/api/banks/${bank.bankId}/species/${tomato}`;
      const set = await api()
        .patch(url)
        .send({ traits: { pollination: 'insect', minPlantsForSeed: 40, isolationMeters: 50 } });
      expect(set.status, JSON.stringify(set.body)).toBe(200);
      expect(set.body.species.traits).toMatchObject({
        pollination: 'insect',
        outcrossing: 'cross',
        minPlantsForSeed: 40,
        isolationMeters: 50,
      });
      expect(set.body.species.overridden).toEqual(
        expect.arrayContaining(['pollination', 'minPlantsForSeed', 'isolationMeters']),
      );
      const bad = await api()
        .patch(url)
        .send({ traits: { pollination: 'bees', minPlantsForSeed: 0 } });
      expect(bad.status).toBe(400);
      expect(Object.keys(bad.body.error.fields)).toEqual(
        expect.arrayContaining(['traits.pollination', 'traits.minPlantsForSeed']),
      );
      await api().delete(`${url}/overrides`).expect(200);
    });
  });

  describe('biennials over two seasons', () => {
    it('when an onion sowing is for seed, then it is kept through the winter and seeds the next season', async () => {
      await bank.owner.agent.patch(`/api/banks/${bank.bankId}`).send({ firstFrost: '09-25' }).expect(200);
      const onion = await speciesId(ctx.db, 'onion');
      const res = await api()
        .post(`/api/banks/${bank.bankId}/plan`)
        .send({ season: 2027, speciesId: onion, plantsWanted: 30, start: 'indoors', forSeed: true });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      const e = res.body.entry;
      // Grown in 2027, kept from the bank's first autumn frost (25 Sep 2027) to its last spring
      // frost of the next year (20 May 2028), seed in 2028.
      expect(e).toMatchObject({
        forSeed: true,
        seedSeason: 2028,
        overwinterFrom: '2027-09-25',
        overwinterTo: '2028-05-20',
      });
      expect(e.notes.join(' ')).toMatch(/over two seasons: a biennial grows in 2027.*sets seed in 2028/);
      // The season's list (plan-live.ts, the one place for dates) says the same.
      const list = await bank.viewer.agent.get(`/api/banks/${bank.bankId}/plan?season=2027`);
      expect(list.body.items.find((x: { id: string }) => x.id === e.id)).toMatchObject({ seedSeason: 2028 });
    });

    it('when an annual is for seed, its seed is this season; a sowing not for seed has none', async () => {
      const forSeed = await api()
        .post(`/api/banks/${bank.bankId}/plan`)
        .send({ season: 2027, speciesId: cucumber, plantsWanted: 10, start: 'indoors', forSeed: true });
      expect(forSeed.body.entry).toMatchObject({
        seedSeason: 2027,
        overwinterFrom: null,
        overwinterTo: null,
      });
      const plain = await api()
        .post(`/api/banks/${bank.bankId}/plan`)
        .send({ season: 2027, speciesId: cucumber, plantsWanted: 10, start: 'indoors' });
      expect(plain.body.entry).toMatchObject({ forSeed: false, seedSeason: null, overwinterFrom: null });
      const bad = await api()
        .post(`/api/banks/${bank.bankId}/plan`)
        .send({ season: 2027, speciesId: cucumber, plantsWanted: 10, start: 'indoors', forSeed: 'yes' });
      expect(bad.status).toBe(400);
      expect(bad.body.error.fields).toHaveProperty('forSeed');
    });
  });

  describe('the grow-out list', () => {
    it('when the decision calls a lot grow-out, then it is listed with the plants a seed crop needs; other lots are not', async () => {
      // A tomato lot tested well (91%) with few seeds left, and a plan that needs more than it
      // holds: short for the plan with no younger lot of the variety → grow-out (docs/decisions.md).
      const shortLot = await lot({
        speciesId: tomato,
        variety: 'Last Packet',
        harvestDate: '2025-09-01',
        seedCount: 130,
      });
      await finishedAssay(api(), bank.bankId, shortLot, '2026-11-01', [
        { sown: 50, germinated: 46 },
        { sown: 50, germinated: 45 },
      ]);
      const plenty = await lot({
        speciesId: tomato,
        variety: 'Plenty',
        harvestDate: '2025-09-01',
        seedCount: 900,
      });
      await finishedAssay(api(), bank.bankId, plenty, '2026-11-01', [
        { sown: 50, germinated: 46 },
        { sown: 50, germinated: 45 },
      ]);
      await api()
        .post(`/api/banks/${bank.bankId}/plan`)
        .send({ season: 2027, speciesId: tomato, plantsWanted: 60, start: 'indoors', lotId: shortLot })
        .expect(201);
      const ranking = await bank.viewer.agent.get(`/api/banks/${bank.bankId}/ranking`);
      const row = (id: string) => ranking.body.items.find((r: { lotId: string }) => r.lotId === id);
      expect(row(shortLot).recommendation).toBe('grow-out');
      expect(row(plenty).recommendation).not.toBe('grow-out');

      const res = await bank.viewer.agent.get(`/api/banks/${bank.bankId}/grow-out`);
      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({ on: '2026-12-01', season: 2027 });
      const ids = res.body.items.map((i: { lotId: string }) => i.lotId);
      expect(ids).toContain(shortLot);
      expect(ids).not.toContain(plenty);
      // Every listed lot is one the ranking calls grow-out, with the ranking's own reason.
      for (const item of res.body.items) {
        expect(row(item.lotId).recommendation).toBe('grow-out');
        expect(item.reason).toBe(row(item.lotId).reason);
      }
      const item = res.body.items.find((i: { lotId: string }) => i.lotId === shortLot);
      // Tomato: 10 plants for seed (Seed Saving Chart [read]); an annual, so seed in 2027.
      expect(item).toMatchObject({
        variety: 'Last Packet',
        plantsForSeed: 10,
        pollination: 'self',
        biennial: false,
        seedSeason: 2027,
      });
      expect(item.reason).toMatch(/short of the \d+ the plan needs/);
    });

    it('when the date is malformed, then 400; a non-member gets 404', async () => {
      const bad = await bank.viewer.agent.get(`/api/banks/${bank.bankId}/grow-out?on=2026-13-01`);
      expect(bad.status).toBe(400);
      expect(bad.body.error.fields).toHaveProperty('on');
      expect((await bank.outsider.agent.get(`/api/banks/${bank.bankId}/grow-out`)).status).toBe(404);
    });
  });
});
