import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bankWithRoles } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import { speciesId } from '../helpers/lots';

describe('CSV export and import of lots', () => {
  let ctx: TestContext;
  beforeAll(async () => {
    ctx = await createTestContext({ now: '2026-03-01T09:00:00Z' });
  });
  afterAll(() => ctx.close());

  const comparable = (l: Record<string, unknown>) => {
    const { id: _id, speciesId: _s, createdAt: _c, updatedAt: _u, thumbUrl: _t, parentPlantIds: _p, ...rest } = l;
    return rest;
  };

  it('when a bank exports its lots and another bank imports the file, then the lots are reproduced', async () => {
    const a = await bankWithRoles(ctx.app, ctx.db);
    const b = await bankWithRoles(ctx.app, ctx.db);
    const tomato = await speciesId(ctx.db, 'tomato');
    const marigold = await speciesId(ctx.db, 'marigold');
    const post = (body: object) => a.grower.agent.post(`/api/banks/${a.bankId}/lots`).send(body);
    await post({ speciesId: tomato, variety: 'Stripey, "Dawn"', origin: 'saved', harvestDate: '2025-09-14', seedCount: 120, notes: 'Line one\nline two, with comma', storage: { place: 'fridge', temperatureC: 4.5, humidityPct: 35, location: 'Crisper drawer' }, plantsBulked: 3 });
    await post({ speciesId: marigold, variety: '=Orange Flare', origin: 'swapped', sourceName: 'Spring swap table', packedForSeason: 2026, seedCount: 0 });
    await post({ speciesId: tomato, variety: 'Café Noir', origin: 'bought', harvestDate: '2024-08-01', seedCount: 25, code: 'MY-TOM' });

    const exported = await a.viewer.agent.get(`/api/banks/${a.bankId}/lots.csv`);
    expect(exported.status).toBe(200);
    expect(exported.headers['content-type']).toMatch(/text\/csv/);
    const csv = exported.text;

    const preview = await b.grower.agent.post(`/api/banks/${b.bankId}/lots/import?dryRun=true`).attach('file', Buffer.from(csv), 'lots.csv');
    expect(preview.status).toBe(200);
    expect(preview.body.preview).toHaveLength(3);
    expect((await b.owner.agent.get(`/api/banks/${b.bankId}/lots`)).body.items).toHaveLength(0);

    const imported = await b.grower.agent.post(`/api/banks/${b.bankId}/lots/import`).attach('file', Buffer.from(csv), 'lots.csv');
    expect(imported.status).toBe(200);
    expect(imported.body).toEqual({ imported: 3 });
    const before = (await a.owner.agent.get(`/api/banks/${a.bankId}/lots`)).body.items.map(comparable);
    const after = (await b.owner.agent.get(`/api/banks/${b.bankId}/lots`)).body.items.map(comparable);
    expect(after).toEqual(before);
  });

  it('when one row of a file is bad, then nothing is imported and the row is named', async () => {
    const b = await bankWithRoles(ctx.app, ctx.db);
    const csv = [
      'species,scientific_name,variety,origin,harvest_date,seeds_on_hand',
      'Tomato,Solanum lycopersicum,Good one,saved,2025-09-01,10',
      'Tomato,Solanum lycopersicum,Bad date,saved,2025-02-30,10',
      'Lettuce,Lactuca sativa,Good two,bought,2025-07-01,50',
    ].join('\n');
    const res = await b.grower.agent.post(`/api/banks/${b.bankId}/lots/import`).attach('file', Buffer.from(csv), 'lots.csv');
    expect(res.status).toBe(400);
    expect(res.body.error.rows).toEqual([expect.objectContaining({ line: 3, column: 'harvest_date' })]);
    expect((await b.owner.agent.get(`/api/banks/${b.bankId}/lots`)).body.items).toHaveLength(0);
  });

  it('when a code in the file is already used in the bank, then nothing is imported', async () => {
    const b = await bankWithRoles(ctx.app, ctx.db);
    const tomato = await speciesId(ctx.db, 'tomato');
    await b.grower.agent.post(`/api/banks/${b.bankId}/lots`).send({ speciesId: tomato, variety: 'Old', origin: 'saved', harvestDate: '2025-09-01', code: 'TOM-1' });
    const csv = 'code,species,variety,origin,harvest_date,seeds_on_hand\nNEW-1,Tomato,A,saved,2025-09-01,5\ntom-1,Tomato,B,saved,2025-09-01,5\n';
    const res = await b.grower.agent.post(`/api/banks/${b.bankId}/lots/import`).attach('file', Buffer.from(csv), 'lots.csv');
    expect(res.status).toBe(400);
    expect(res.body.error.rows).toEqual([expect.objectContaining({ line: 3, column: 'code' })]);
    expect((await b.owner.agent.get(`/api/banks/${b.bankId}/lots`)).body.items).toHaveLength(1);
  });

  it('when a viewer tries to import, then it is 403', async () => {
    const b = await bankWithRoles(ctx.app, ctx.db);
    const res = await b.viewer.agent.post(`/api/banks/${b.bankId}/lots/import`).attach('file', Buffer.from('species\n'), 'x.csv');
    expect(res.status).toBe(403);
  });
});
