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

  type Bank = Awaited<ReturnType<typeof bankWithRoles>>;
  /** Imports the lines as one CSV file, as the bank's grower. */
  const importLines = (b: Bank, lines: string[], eol = '\n') =>
    b.grower.agent
      .post(`/api/banks/${b.bankId}/lots/import`)
      .attach('file', Buffer.from(lines.join(eol)), 'lots.csv');
  const lotsOf = async (b: Bank) =>
    (await b.owner.agent.get(`/api/banks/${b.bankId}/lots`)).body.items as Record<string, unknown>[];

  const comparable = (l: Record<string, unknown>) => {
    const {
      id: _id,
      speciesId: _s,
      createdAt: _c,
      updatedAt: _u,
      thumbUrl: _t,
      parentPlantIds: _p,
      ...rest
    } = l;
    return rest;
  };

  it('when a bank exports its lots and another bank imports the file, then the lots are reproduced', async () => {
    const a = await bankWithRoles(ctx.app, ctx.db);
    const b = await bankWithRoles(ctx.app, ctx.db);
    const tomato = await speciesId(ctx.db, 'tomato');
    const marigold = await speciesId(ctx.db, 'marigold');
    const post = (body: object) => a.grower.agent.post(`/api/banks/${a.bankId}/lots`).send(body);
    await post({
      speciesId: tomato,
      variety: 'Stripey, "Dawn"',
      origin: 'saved',
      harvestDate: '2025-09-14',
      seedCount: 120,
      notes: 'Line one\nline two, with comma',
      storage: { place: 'fridge', temperatureC: 4.5, humidityPct: 35, location: 'Crisper drawer' },
      plantsBulked: 3,
    });
    await post({
      speciesId: marigold,
      variety: '=Orange Flare',
      origin: 'swapped',
      sourceName: 'Spring swap table',
      packedForSeason: 2026,
      seedCount: 0,
    });
    await post({
      speciesId: tomato,
      variety: 'Café Noir',
      origin: 'bought',
      harvestDate: '2024-08-01',
      seedCount: 25,
      code: 'MY-TOM',
    });
    await post({
      speciesId: marigold,
      variety: 'Coated Gold',
      origin: 'bought',
      packedForSeason: 2026,
      seedCount: 50,
      treated: true,
    });

    const exported = await a.viewer.agent.get(`/api/banks/${a.bankId}/lots.csv`);
    expect(exported.status).toBe(200);
    expect(exported.headers['content-type']).toMatch(/text\/csv/);
    const csv = exported.text;

    const preview = await b.grower.agent
      .post(`/api/banks/${b.bankId}/lots/import?dryRun=true`)
      .attach('file', Buffer.from(csv), 'lots.csv');
    expect(preview.status).toBe(200);
    expect(preview.body.preview).toHaveLength(4);
    expect(
      preview.body.preview
        .filter((p: { treated: boolean }) => p.treated)
        .map((p: { variety: string }) => p.variety),
    ).toEqual(['Coated Gold']);
    expect((await b.owner.agent.get(`/api/banks/${b.bankId}/lots`)).body.items).toHaveLength(0);

    const imported = await b.grower.agent
      .post(`/api/banks/${b.bankId}/lots/import`)
      .attach('file', Buffer.from(csv), 'lots.csv');
    expect(imported.status).toBe(200);
    expect(imported.body).toEqual({ imported: 4 });
    const before = (await a.owner.agent.get(`/api/banks/${a.bankId}/lots`)).body.items.map(comparable);
    const after = (await b.owner.agent.get(`/api/banks/${b.bankId}/lots`)).body.items.map(comparable);
    expect(after).toEqual(before);
    expect(
      after.filter((l: { treated: boolean }) => l.treated).map((l: { variety: string }) => l.variety),
    ).toEqual(['Coated Gold']);
  });

  it('when the export holds a treated lot, then its treated cell is yes and the others no', async () => {
    const a = await bankWithRoles(ctx.app, ctx.db);
    const tomato = await speciesId(ctx.db, 'tomato');
    const post = (body: object) => a.grower.agent.post(`/api/banks/${a.bankId}/lots`).send(body);
    await post({
      speciesId: tomato,
      variety: 'Plain',
      origin: 'saved',
      harvestDate: '2025-09-01',
      seedCount: 10,
      code: 'T-PLAIN',
    });
    await post({
      speciesId: tomato,
      variety: 'Dusted',
      origin: 'bought',
      harvestDate: '2025-09-01',
      seedCount: 10,
      code: 'T-DUSTED',
      treated: true,
    });
    const csv = (await a.viewer.agent.get(`/api/banks/${a.bankId}/lots.csv`)).text;
    const [header, ...records] = csv.replace(/^\uFEFF/, '').split('\r\n');
    const cells = (record: string) =>
      Object.fromEntries(header!.split(',').map((name, i) => [name, record.split(',')[i]]));
    expect(records.map(cells).map((r) => [r.code, r.treated])).toEqual([
      ['T-DUSTED', 'yes'],
      ['T-PLAIN', 'no'],
    ]);
  });

  it.each([
    {
      what: 'treated cells spelled true/false, 1/0 or left empty',
      lines: [
        'code,species,variety,origin,harvest_date,seeds_on_hand,Treated',
        'T-1,Tomato,A,saved,2025-09-01,10,TRUE',
        'T-2,Tomato,B,saved,2025-09-01,10,0',
        'T-3,Tomato,C,saved,2025-09-01,10,1',
        'T-4,Tomato,D,saved,2025-09-01,10,',
      ],
      treated: [
        ['T-1', true],
        ['T-2', false],
        ['T-3', true],
        ['T-4', false],
      ],
    },
    {
      what: 'no treated column (an export from before it existed)',
      lines: [
        'code,species,scientific_name,variety,origin,source_name,harvest_date,packed_for_season,seeds_on_hand,quantity_estimated,plants_bulked,storage_place,storage_location,storage_temp_c,storage_humidity_pct,status,notes',
        'OLD-1,Tomato,Solanum lycopersicum,Kept Red,saved,,2024-09-01,,40,no,3,fridge,,4,,active,From an older export',
        '',
      ],
      treated: [['OLD-1', false]],
    },
  ])(
    'when a file has $what, then every lot is imported, treated or not as it says',
    async ({ lines, treated }) => {
      const b = await bankWithRoles(ctx.app, ctx.db);
      const res = await importLines(b, lines, '\r\n');
      expect(res.status).toBe(200);
      expect(res.body).toEqual({ imported: treated.length });
      expect((await lotsOf(b)).map((l) => [l.code, l.treated])).toEqual(treated);
    },
  );

  it.each([
    {
      what: 'a harvest date that does not exist',
      column: 'harvest_date',
      message: /^Use a date that exists/,
      lines: [
        'species,scientific_name,variety,origin,harvest_date,seeds_on_hand',
        'Tomato,Solanum lycopersicum,Good one,saved,2025-09-01,10',
        'Tomato,Solanum lycopersicum,Bad date,saved,2025-02-30,10', // 2025 is not a leap year (Gregorian rule)
        'Lettuce,Lactuca sativa,Good two,bought,2025-07-01,50',
      ],
    },
    {
      what: 'a treated cell that is not a yes or no',
      column: 'treated',
      message: /^Use yes .* or no/,
      lines: [
        'species,variety,origin,harvest_date,seeds_on_hand,treated',
        'Tomato,Good one,saved,2025-09-01,10,yes',
        'Tomato,Unsure,saved,2025-09-01,10,probably',
        'Lettuce,Good two,bought,2025-07-01,50,',
      ],
    },
  ])(
    'when one row of a file has $what, then nothing is imported and the row is named',
    async ({ column, message, lines }) => {
      const b = await bankWithRoles(ctx.app, ctx.db);
      const res = await importLines(b, lines);
      expect(res.status).toBe(400);
      expect(res.body.error.rows).toEqual([
        expect.objectContaining({ line: 3, column, message: expect.stringMatching(message) }),
      ]);
      expect(await lotsOf(b)).toHaveLength(0);
    },
  );

  it('when a code in the file is already used in the bank, then nothing is imported', async () => {
    const b = await bankWithRoles(ctx.app, ctx.db);
    const tomato = await speciesId(ctx.db, 'tomato');
    await b.grower.agent
      .post(`/api/banks/${b.bankId}/lots`)
      .send({ speciesId: tomato, variety: 'Old', origin: 'saved', harvestDate: '2025-09-01', code: 'TOM-1' });
    const csv =
      'code,species,variety,origin,harvest_date,seeds_on_hand\nNEW-1,Tomato,A,saved,2025-09-01,5\ntom-1,Tomato,B,saved,2025-09-01,5\n';
    const res = await b.grower.agent
      .post(`/api/banks/${b.bankId}/lots/import`)
      .attach('file', Buffer.from(csv), 'lots.csv');
    expect(res.status).toBe(400);
    expect(res.body.error.rows).toEqual([expect.objectContaining({ line: 3, column: 'code' })]);
    expect((await b.owner.agent.get(`/api/banks/${b.bankId}/lots`)).body.items).toHaveLength(1);
  });

  it('when a viewer tries to import, then it is 403', async () => {
    const b = await bankWithRoles(ctx.app, ctx.db);
    const res = await b.viewer.agent
      .post(`/api/banks/${b.bankId}/lots/import`)
      .attach('file', Buffer.from('species\n'), 'x.csv');
    expect(res.status).toBe(403);
  });
});
