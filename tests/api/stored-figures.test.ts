import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { z } from 'zod';
import { rankingItemSchema, rankingResponseSchema } from '#shared/schemas/viability';
import { createViabilityService } from '#server/modules/viability/viability.service';
import { bankWithRoles } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import { finishedAssay, speciesId, startedAssay } from '../helpers/lots';

// Figures kept on the lot row by the database (seeds on hand, parent plants, first photo) must equal
// what their source rows say after any write, and the ranking's fitted models, kept in memory
// between requests, must never be staler than the data: after each kind of change, the app's warm
// ranking equals the ranking of a service that fits everything afresh.
describe('figures stored for the lists, and fitted models kept between requests', () => {
  let ctx: TestContext;
  let bank: Awaited<ReturnType<typeof bankWithRoles>>;
  let tomato: string;
  let lettuce: string;
  beforeAll(async () => {
    ctx = await createTestContext({ now: '2026-12-01T09:00:00Z' });
    bank = await bankWithRoles(ctx.app, ctx.db);
    tomato = await speciesId(ctx.db, 'tomato');
    lettuce = await speciesId(ctx.db, 'lettuce');
  });
  afterAll(() => ctx.close());
  const base = () => `/api/banks/${bank.bankId}`;
  const newLot = async (species: string, variety: string, seeds = 1000, harvestDate = '2023-09-01') => {
    const res = await bank.grower.agent
      .post(`${base()}/lots`)
      .send({ speciesId: species, variety, origin: 'saved', harvestDate, seedCount: seeds });
    expect(res.status).toBe(201);
    return res.body.lot.id as string;
  };
  const ledger = async (lotId: string) =>
    Number(
      (
        await sql<{
          s: number;
        }>`select coalesce(sum(change), 0)::int as s from stock_movements where lot_id = ${lotId}`.execute(
          ctx.db,
        )
      ).rows[0]!.s,
    );
  const stored = async (lotId: string) =>
    ctx.db
      .selectFrom('lots')
      .select(['seeds_on_hand', 'parent_plant_ids', 'first_photo_id'])
      .where('id', '=', lotId)
      .executeTakeFirstOrThrow();

  it('when stock moves through the API or straight in the database, then seeds on hand stays the sum of the ledger', async () => {
    const lotId = await newLot(tomato, 'Ledger', 500);
    expect((await stored(lotId)).seeds_on_hand).toBe(500);
    const moved = await bank.grower.agent
      .post(`${base()}/lots/${lotId}/stock`)
      .send({ change: -120, reason: 'given to a neighbour', date: '2026-11-01', kind: 'given' });
    expect(moved.status).toBe(201);
    const lot = (await bank.viewer.agent.get(`${base()}/lots/${lotId}`)).body.lot;
    expect(lot.seedsOnHand).toBe(380);
    expect(lot.seedsOnHand).toBe(await ledger(lotId));
    // A germination test takes its seeds from the lot.
    await startedAssay(bank.grower.agent, bank.bankId, lotId, '2026-11-20', [25, 25]);
    expect((await stored(lotId)).seeds_on_hand).toBe(await ledger(lotId));
    expect(await ledger(lotId)).toBe(330);
    // Writes that bypass the services (a repair by hand) are followed too: update, move, delete.
    const other = await newLot(tomato, 'Other', 10);
    const row = await ctx.db
      .selectFrom('stock_movements')
      .select('id')
      .where('lot_id', '=', lotId)
      .where('kind', '=', 'given')
      .executeTakeFirstOrThrow();
    await ctx.db.updateTable('stock_movements').set({ change: -100 }).where('id', '=', row.id).execute();
    expect((await stored(lotId)).seeds_on_hand).toBe(350);
    await ctx.db
      .updateTable('stock_movements')
      .set({ lot_id: other, change: 7 })
      .where('id', '=', row.id)
      .execute();
    expect([(await stored(lotId)).seeds_on_hand, (await stored(other)).seeds_on_hand]).toEqual([450, 17]);
    await ctx.db.deleteFrom('stock_movements').where('id', '=', row.id).execute();
    expect([(await stored(lotId)).seeds_on_hand, (await stored(other)).seeds_on_hand]).toEqual([
      await ledger(lotId),
      10,
    ]);
  });

  it('when parent plants and packet photos change, then the lot row names them as their tables do', async () => {
    const plant = async (label: string) =>
      (await bank.grower.agent.post(`${base()}/plants`).send({ speciesId: tomato, label })).body.plant
        .id as string;
    const [p1, p2] = [await plant('Row 1, tallest'), await plant('Row 2, earliest')];
    const lotId = await newLot(tomato, 'Parents');
    const set = await bank.grower.agent.patch(`${base()}/lots/${lotId}`).send({ parentPlantIds: [p1, p2] });
    expect(set.status).toBe(200);
    expect([...set.body.lot.parentPlantIds].sort()).toEqual([p1, p2].sort());
    expect(
      (await bank.grower.agent.patch(`${base()}/lots/${lotId}`).send({ parentPlantIds: [p2] })).body.lot
        .parentPlantIds,
    ).toEqual([p2]);
    expect((await stored(lotId)).parent_plant_ids).toEqual([p2]);

    // Photo rows written directly (the photo routes, with the object store, have tests of their own).
    const photo = async (id: string, at: string) =>
      sql`insert into photos (id, bank_id, subject, subject_id, full_key, thumb_key, width, height, bytes, created_at)
          values (${id}, ${bank.bankId}, 'lot', ${lotId}, ${`t/${id}`}, ${`t/${id}-thumb`}, 10, 10, 10, ${at})`.execute(
        ctx.db,
      );
    const first = '00000000-0000-4000-8000-000000000001';
    const second = '00000000-0000-4000-8000-000000000002';
    await photo(second, '2026-11-02T00:00:00Z');
    expect((await stored(lotId)).first_photo_id).toBe(second);
    await photo(first, '2026-11-01T00:00:00Z');
    const lot = (await bank.viewer.agent.get(`${base()}/lots/${lotId}`)).body.lot;
    expect(lot.thumbUrl).toBe(`/api/photos/${first}?size=thumb`);
    await ctx.db.deleteFrom('photos').where('id', '=', first).execute();
    expect((await stored(lotId)).first_photo_id).toBe(second);
    await ctx.db.deleteFrom('photos').where('id', '=', second).execute();
    expect((await stored(lotId)).first_photo_id).toBeNull();
  });

  describe('the warm ranking against a fresh fit after each kind of change', () => {
    const on = '2027-03-01';
    /** The figures of a ranking row that come from the fits. */
    const figures = (items: Record<string, unknown>[]) =>
      Object.fromEntries(
        items.map((i) => [
          i.lotId,
          [
            i.projectedPercent,
            i.projectedLow,
            i.projectedHigh,
            i.recommendation,
            i.lastPercent,
            i.lastTestDate,
            i.basis,
            i.retestBy,
          ],
        ]),
      );
    const agree = async () => {
      const res = await bank.viewer.agent.get(`${base()}/ranking?on=${on}`);
      expect(res.status).toBe(200);
      const fresh = await createViabilityService({ db: ctx.db, clock: ctx.clock }).ranking(bank.bankId, on);
      expect(figures(res.body.items)).toEqual(figures(fresh));
      return Object.fromEntries(res.body.items.map((i: { lotId: string }) => [i.lotId, i])) as Record<
        string,
        Record<string, unknown>
      >;
    };
    let a: string;
    let b: string;
    let running: { testId: string; trayIds: string[] };

    it('when lots of two species are tested, then the warm and fresh rankings agree', async () => {
      a = await newLot(tomato, 'Warm A', 1000, '2022-09-01');
      b = await newLot(tomato, 'Warm B', 1000, '2023-09-01');
      await newLot(lettuce, 'Warm C', 1000, '2024-07-01');
      await finishedAssay(bank.grower.agent, bank.bankId, a, '2023-03-01', [{ sown: 50, germinated: 46 }]);
      await finishedAssay(bank.grower.agent, bank.bankId, a, '2025-03-01', [{ sown: 50, germinated: 35 }]);
      await finishedAssay(bank.grower.agent, bank.bankId, b, '2024-03-01', [{ sown: 50, germinated: 44 }]);
      await agree();
      await agree();
    });

    it('when a running test is counted, then the ranking follows at once', async () => {
      running = await startedAssay(bank.grower.agent, bank.bankId, b, '2026-11-20', [50]);
      const before = (await agree())[b]!;
      const counted = await bank.grower.agent
        .post(`${base()}/tests/${running.testId}/counts`)
        .send({ date: '2026-11-27', trays: [{ trayId: running.trayIds[0], cumulative: 10 }] });
      expect(counted.status).toBe(201);
      const after = (await agree())[b]!;
      expect(after.lastPercent).toBe(20);
      expect(before.lastPercent).not.toBe(20);
    });

    it('when the test is finished and then set aside, then the ranking follows at once', async () => {
      const finished = await bank.grower.agent
        .post(`${base()}/tests/${running.testId}/finish`)
        .send({ date: '2026-11-28', trays: [{ trayId: running.trayIds[0], abnormal: 0, ungerminated: 40 }] });
      expect(finished.status).toBe(200);
      const withLow = (await agree())[b]!;
      const aside = await bank.grower.agent
        .post(`${base()}/tests/${running.testId}/set-aside`)
        .send({ reason: 'the towel went mouldy' });
      expect(aside.status).toBe(200);
      const without = (await agree())[b]!;
      expect(without.projectedPercent).not.toBe(withLow.projectedPercent);
    });

    it("when a lot's harvest date or storage changes, then the ranking follows at once", async () => {
      const before = (await agree())[a]!;
      expect(
        (await bank.grower.agent.patch(`${base()}/lots/${a}`).send({ harvestDate: '2021-09-01' })).status,
      ).toBe(200);
      const older = (await agree())[a]!;
      expect(older.projectedPercent).not.toBe(before.projectedPercent);
      expect(
        (await bank.grower.agent.patch(`${base()}/lots/${a}`).send({ storage: { place: 'freezer' } })).status,
      ).toBe(200);
      const frozen = (await agree())[a]!;
      expect(frozen.projectedPercent).not.toBe(older.projectedPercent);
    });

    it("when the species' typical seed life is overridden, then the ranking follows at once", async () => {
      const before = (await agree())[b]!;
      const set = await bank.grower.agent
        .patch(`${base()}/species/${tomato}`)
        .send({ traits: { storageLifeYears: 10 } });
      expect(set.status).toBe(200);
      const after = (await agree())[b]!;
      expect(after.projectedPercent).not.toBe(before.projectedPercent);
    });

    it("when a lot's name, stock or status changes, then its ranking row shows it at once, and only the schema's fields", async () => {
      await agree();
      expect(
        (await bank.grower.agent.patch(`${base()}/lots/${b}`).send({ variety: 'Renamed B', code: 'REN-B' }))
          .status,
      ).toBe(200);
      expect(
        (
          await bank.grower.agent
            .post(`${base()}/lots/${b}/stock`)
            .send({ change: -300, reason: 'sown', date: '2026-11-30', kind: 'sown' })
        ).status,
      ).toBe(201);
      const row = (await agree())[b]!;
      expect(row).toMatchObject({
        variety: 'Renamed B',
        code: 'REN-B',
        seedsOnHand: (await stored(b)).seeds_on_hand,
      });
      const res = await bank.viewer.agent.get(`${base()}/ranking?on=${on}`);
      expect(res.headers['content-type']).toMatch(/^application\/json/);
      // Strict: a field the schema does not list would fail here.
      rankingResponseSchema
        .extend({ items: z.array(rankingItemSchema.strict()) })
        .strict()
        .parse(res.body);
      expect((await bank.grower.agent.patch(`${base()}/lots/${b}`).send({ status: 'retired' })).status).toBe(
        200,
      );
      expect((await agree())[b]).toBeUndefined();
      expect((await bank.grower.agent.patch(`${base()}/lots/${b}`).send({ status: 'active' })).status).toBe(
        200,
      );
      expect((await agree())[b]).toBeDefined();
    });

    it('when a tested lot is deleted or a test is removed, then the ranking follows at once', async () => {
      const extra = await newLot(tomato, 'Short-lived', 1000, '2020-09-01');
      const assayId = await finishedAssay(bank.grower.agent, bank.bankId, extra, '2021-03-01', [
        { sown: 50, germinated: 10 },
      ]);
      const withExtra = await agree();
      expect(withExtra[extra]).toBeDefined();
      // The test is removed straight in the database; the lot then goes through the API.
      await ctx.db.deleteFrom('germination_tests').where('id', '=', assayId).execute();
      await agree();
      expect((await bank.grower.agent.delete(`${base()}/lots/${extra}`)).status).toBeLessThan(300);
      const without = await agree();
      expect(without[extra]).toBeUndefined();
    });
  });
});
