import type { CreateAssayBody } from '#shared/schemas/germination';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bankWithRoles } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import { speciesId } from '../helpers/lots';

// Every lot, test and count below is invented.
describe('CSV export and import of germination tests', () => {
  let ctx: TestContext;
  let tomato: string;
  let marigold: string;
  beforeAll(async () => {
    ctx = await createTestContext({ now: '2026-03-01T09:00:00Z' });
    tomato = await speciesId(ctx.db, 'tomato');
    marigold = await speciesId(ctx.db, 'marigold');
  });
  afterAll(() => ctx.close());

  type Bank = Awaited<ReturnType<typeof bankWithRoles>>;
  const base = (b: Bank) => `/api/banks/${b.bankId}`;
  const importFile = (b: Bank, csv: string, dryRun = false) =>
    b.grower.agent
      .post(`${base(b)}/tests/import${dryRun ? '?dryRun=true' : ''}`)
      .attach('file', Buffer.from(csv), 'tests.csv');

  async function lot(b: Bank, code: string, species = tomato, seedCount = 500) {
    const res = await b.grower.agent.post(`${base(b)}/lots`).send({
      speciesId: species,
      variety: `Variety of ${code.toUpperCase()}`,
      origin: 'saved',
      harvestDate: '2025-09-01',
      seedCount,
      code,
    });
    expect(res.status).toBe(201);
    return res.body.lot.id as string;
  }

  /**
   * A test through the API: trays, counts per date (one number per tray, from tray 1; trays beyond
   * the numbers given are not counted that day), finished if asked.
   */
  async function assay(
    b: Bank,
    lotId: string,
    body: CreateAssayBody,
    counts: [string, number[]][],
    finish?: {
      date: string;
      trays: (
        | { abnormal: number; ungerminated: number; fresh?: number; dead?: number; hard?: number }
        | { setAsideReason: string }
      )[];
    },
  ) {
    const created = await b.grower.agent.post(`${base(b)}/lots/${lotId}/tests`).send(body);
    expect(created.status).toBe(201);
    const assayId = created.body.test.id as string;
    const trayIds = (created.body.trays as { id: string }[]).map((t) => t.id);
    for (const [date, values] of counts) {
      const res = await b.grower.agent
        .post(`${base(b)}/tests/${assayId}/counts`)
        .send({ date, trays: values.map((cumulative, i) => ({ trayId: trayIds[i], cumulative })) });
      expect(res.status).toBe(201);
    }
    if (finish) {
      const res = await b.grower.agent
        .post(`${base(b)}/tests/${assayId}/finish`)
        .send({ date: finish.date, trays: finish.trays.map((t, i) => ({ trayId: trayIds[i], ...t })) });
      expect(res.status).toBe(200);
    }
    return assayId;
  }

  const assaysOf = async (b: Bank) =>
    await ctx.db
      .selectFrom('germination_tests')
      .selectAll()
      .where('bank_id', '=', b.bankId)
      .orderBy('start_date')
      .orderBy('created_at')
      .execute();
  const stockOf = async (b: Bank, lotId: string) =>
    (await b.viewer.agent.get(`${base(b)}/lots/${lotId}`)).body.lot.seedsOnHand as number;

  /** The export's records as header name → cell. */
  function records(csv: string) {
    expect(csv.startsWith('\uFEFF')).toBe(true);
    const [header, ...rest] = csv.slice(1).split('\r\n');
    const names = header!.split(',');
    return rest.map((line) => Object.fromEntries(line.split(',').map((cell, i) => [names[i], cell])));
  }

  it('when a viewer exports, then every tray gets one record per check day and an uncounted tray one with an empty date', async () => {
    const b = await bankWithRoles(ctx.app, ctx.db);
    const tom = await lot(b, 'TOM-A');
    await assay(
      b,
      tom,
      {
        startDate: '2026-02-01',
        method: 'paper towel',
        temperatureC: 24,
        lightHours: 0,
        trays: [{ seedsSown: 10 }, { seedsSown: 10 }],
      },
      [
        ['2026-02-05', [3, 4]],
        ['2026-02-09', [7, 8]],
      ],
      {
        date: '2026-02-10',
        trays: [
          { abnormal: 1, ungerminated: 2 },
          { abnormal: 0, ungerminated: 2, fresh: 1, dead: 1, hard: 0 },
        ],
      },
    );
    // Two tests of the same lot the same day; the second is still running and not yet counted.
    await assay(b, tom, { startDate: '2026-02-20', method: 'tray of mix', trays: [{ seedsSown: 5 }] }, [
      ['2026-02-25', [2]],
    ]);
    await assay(
      b,
      tom,
      {
        startDate: '2026-02-20',
        method: 'rag doll',
        pretreatment: 'soak',
        pretreatmentDays: 1,
        trays: [{ seedsSown: 6 }],
      },
      [],
    );

    const res = await b.viewer.agent.get(`${base(b)}/tests.csv`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toMatch(/hilum-tests\.csv/);
    const rows = records(res.text);
    expect(
      rows.map((r) => [
        r.test,
        r.tray,
        r.seeds_sown,
        r.check_date,
        r.cumulative,
        r.finished_on,
        r.abnormal,
        r.ungerminated,
        r.fresh,
      ]),
    ).toEqual([
      ['TOM-A 2026-02-01', '1', '10', '2026-02-05', '3', '2026-02-10', '1', '2', ''],
      ['TOM-A 2026-02-01', '1', '10', '2026-02-09', '7', '2026-02-10', '1', '2', ''],
      ['TOM-A 2026-02-01', '2', '10', '2026-02-05', '4', '2026-02-10', '0', '2', '1'],
      ['TOM-A 2026-02-01', '2', '10', '2026-02-09', '8', '2026-02-10', '0', '2', '1'],
      ['TOM-A 2026-02-20', '1', '5', '2026-02-25', '2', '', '', '', ''],
      ['TOM-A 2026-02-20 #2', '1', '6', '', '', '', '', '', ''],
    ]);
    expect(rows[0]).toMatchObject({
      lot_code: 'TOM-A',
      species: 'Tomato',
      variety: 'Variety of TOM-A',
      method: 'paper towel',
      temperature_c: '24',
      light_hours: '0',
      pretreatment: 'none',
    });
    expect(rows[5]).toMatchObject({ method: 'rag doll', pretreatment: 'soak', pretreatment_days: '1' });
  });

  it('when a bank with no tests exports, then the file is just the header and imports as 0 tests', async () => {
    const b = await bankWithRoles(ctx.app, ctx.db);
    const res = await b.viewer.agent.get(`${base(b)}/tests.csv`);
    expect(res.text.slice(1).split('\r\n').filter(Boolean)).toEqual([
      expect.stringMatching(/^test,lot_code,/),
    ]);
    const again = await importFile(b, res.text);
    expect(again.status).toBe(200);
    expect(again.body).toEqual({ imported: 0 });
  });

  it('when an export is imported into another bank with the same lot codes, then every test has the same result and no seeds leave the stock', async () => {
    const a = await bankWithRoles(ctx.app, ctx.db);
    const b = await bankWithRoles(ctx.app, ctx.db);
    const aTom = await lot(a, 'TOM-RT');
    const aMar = await lot(a, 'MAR-RT', marigold);
    const bTom = await lot(b, 'tom-rt', tomato, 300); // codes match in any letter case
    await lot(b, 'MAR-RT', marigold, 200);
    await assay(
      a,
      aTom,
      {
        startDate: '2026-01-10',
        method: 'paper towel',
        medium: 'Kitchen paper, "unbleached", folded',
        temperatureC: 22.5,
        lightHours: 12,
        notes: '=on the fridge top',
        trays: [{ seedsSown: 25 }, { seedsSown: 25 }, { seedsSown: 25 }, { seedsSown: 25 }],
      },
      [
        ['2026-01-14', [5, 8, 3, 6]],
        ['2026-01-17', [15, 17, 14, 16]],
        ['2026-01-24', [20, 22, 19, 21]],
      ],
      {
        date: '2026-01-24',
        trays: [
          { abnormal: 1, ungerminated: 4 },
          { abnormal: 0, ungerminated: 3 },
          { abnormal: 2, ungerminated: 4 },
          { abnormal: 1, ungerminated: 3 },
        ],
      },
    );
    await assay(
      a,
      aMar,
      {
        startDate: '2026-02-15',
        method: 'soil block',
        pretreatment: 'cold-stratification',
        pretreatmentDays: 14,
        trays: [{ seedsSown: 20 }, { seedsSown: 20 }],
      },
      [['2026-02-22', [9, 0]]],
    );
    await assay(a, aMar, { startDate: '2026-02-15', method: 'petri dish', trays: [{ seedsSown: 8 }] }, []);

    const csv = (await a.viewer.agent.get(`${base(a)}/tests.csv`)).text;
    const preview = await importFile(b, csv, true);
    expect(preview.status).toBe(200);
    expect(preview.body.preview).toEqual([
      expect.objectContaining({
        line: 2,
        test: 'MAR-RT 2026-02-15',
        lotCode: 'MAR-RT',
        trays: 2,
        seedsSown: 40,
        checkDays: 1,
        finishedOn: null,
      }),
      expect.objectContaining({ test: 'MAR-RT 2026-02-15 #2', trays: 1, seedsSown: 8, checkDays: 0 }),
      expect.objectContaining({
        test: 'TOM-RT 2026-01-10',
        lotCode: 'tom-rt',
        species: 'Tomato',
        trays: 4,
        seedsSown: 100,
        checkDays: 3,
        finishedOn: '2026-01-24',
      }),
    ]);
    expect(await assaysOf(b)).toHaveLength(0);

    const imported = await importFile(b, csv);
    expect(imported.status).toBe(200);
    expect(imported.body).toEqual({ imported: 3 });
    expect(await stockOf(b, bTom)).toBe(300);

    const detailsOf = async (bank: Bank) => {
      const details = [];
      for (const t of await assaysOf(bank))
        details.push((await bank.viewer.agent.get(`${base(bank)}/tests/${t.id}`)).body);
      return details.map((d) => {
        // What each test took from its lot's stock differs on purpose: see seedsTaken below. The
        // imported copies are run by the member who imported them (another account of the same name).
        const {
          id: _i,
          lotId: _l,
          lotCode: _c,
          createdAt: _ca,
          seedsTaken: _s,
          runnerId: _r,
          ...assay
        } = d.test;
        const trayIds: string[] = d.trays.map((t: { id: string }) => t.id);
        return {
          test: assay,
          trays: d.trays.map(({ id: _id, ...t }: { id: string }) => t),
          // Counts of one day come in no particular tray order.
          counts: d.counts
            .map((c: { trayId: string; date: string }) => ({ ...c, trayId: trayIds.indexOf(c.trayId) }))
            .sort(
              (x: { date: string; trayId: number }, y: { date: string; trayId: number }) =>
                x.date.localeCompare(y.date) || x.trayId - y.trayId,
            ),
          result: {
            ...d.result,
            trayPercents: d.result.trayPercents.map(({ id: _id, ...t }: { id: string }) => t),
          },
        };
      });
    };
    const before = await detailsOf(a);
    const after = await detailsOf(b);
    expect(after).toEqual(before);
    // Whoever imports the tests runs them: their check-day reminders go to the importer.
    for (const t of await assaysOf(b))
      expect((await b.viewer.agent.get(`${base(b)}/tests/${t.id}`)).body.test.runnerId).toBe(
        b.grower.user.id,
      );
    // Tests started in bank A took their seeds from the ledger; the imported copies took none, and
    // say so, so deleting one gives nothing back.
    const taken = async (bank: Bank) => {
      const out = [];
      for (const t of await assaysOf(bank))
        out.push((await bank.viewer.agent.get(`${base(bank)}/tests/${t.id}`)).body.test.seedsTaken as number);
      return out.sort((x, y) => x - y);
    };
    expect(await taken(a)).toEqual([8, 40, 100]);
    expect(await taken(b)).toEqual([0, 0, 0]);
    expect(after[0]!.result.percent).toBeCloseTo(82, 10); // (20+22+19+21)/100 normal seedlings
    // The second bank's export is the first's, but for the lot code it was given in that bank.
    const again = (await b.viewer.agent.get(`${base(b)}/tests.csv`)).text;
    expect(again.replaceAll('tom-rt', 'TOM-RT')).toEqual(csv);
  });

  it('when a running test is counted in 2 of 4 trays and a finished one has a tray set aside, then germination_percent is the test page’s and the ranking’s figure, and an import into another bank keeps it and the reason', async () => {
    const a = await bankWithRoles(ctx.app, ctx.db);
    const b = await bankWithRoles(ctx.app, ctx.db);
    const runLot = await lot(a, 'RUN-P');
    const finLot = await lot(a, 'FIN-S');
    await lot(b, 'RUN-P');
    await lot(b, 'FIN-S');

    const fourTrays = (seedsSown: number) => [{ seedsSown }, { seedsSown }, { seedsSown }, { seedsSown }];
    // Running: 4 trays of 100, only trays 1 and 2 counted so far (80 and 90 normal seedlings).
    const runId = await assay(
      a,
      runLot,
      { startDate: '2026-02-01', method: 'paper towel', trays: fourTrays(100) },
      [['2026-02-08', [80, 90]]],
    );
    // Finished: 4 trays of 25; tray 4 was counted once, then spilled and set aside at the finish.
    const finId = await assay(
      a,
      finLot,
      { startDate: '2026-01-10', method: 'paper towel', trays: fourTrays(25) },
      [
        ['2026-01-14', [5, 8, 3, 6]],
        ['2026-01-24', [20, 22, 19]],
      ],
      {
        date: '2026-01-24',
        trays: [
          { abnormal: 1, ungerminated: 4 },
          { abnormal: 0, ungerminated: 3 },
          { abnormal: 2, ungerminated: 4 },
          { setAsideReason: 'Spilled' },
        ],
      },
    );

    const csv = (await a.viewer.agent.get(`${base(a)}/tests.csv`)).text;
    const rows = records(csv);
    const percentOf = (code: string) => [
      ...new Set(rows.filter((r) => r.lot_code === code).map((r) => r.germination_percent)),
    ];
    // Pooled over the trays in the figures, rounded to the nearest whole percent as the seed-testing
    // rules report a result (ISTA Rules, ch. 5, read; see ../shared/REFERENCES.md), by hand:
    // (80 + 90) / 200 = 85%; (20 + 22 + 19) / 75 = 81.3% → 81%, tray 4 left out.
    expect(percentOf('RUN-P')).toEqual(['85']);
    expect(percentOf('FIN-S')).toEqual(['81']);
    expect(
      rows
        .filter((r) => r.lot_code === 'FIN-S' && r.tray === '4')
        .map((r) => [r.check_date, r.cumulative, r.set_aside_reason, r.abnormal, r.ungerminated]),
    ).toEqual([['2026-01-14', '6', 'Spilled', '', '']]);
    expect(
      rows.filter((r) => r.lot_code === 'RUN-P').map((r) => [r.tray, r.cumulative, r.set_aside_reason]),
    ).toEqual([
      ['1', '80', ''],
      ['2', '90', ''],
      ['3', '', ''],
      ['4', '', ''],
    ]);

    // The same figure as the test page and the ranking.
    const page = async (bank: Bank, assayId: string) =>
      (await bank.viewer.agent.get(`${base(bank)}/tests/${assayId}`)).body;
    const ranking = (await a.viewer.agent.get(`${base(a)}/ranking?on=2026-03-01`)).body.items as {
      lotId: string;
      lastPercent: number | null;
    }[];
    const lastPercent = (lotId: string) => ranking.find((i) => i.lotId === lotId)!.lastPercent!;
    for (const [code, testId, lotId] of [
      ['RUN-P', runId, runLot],
      ['FIN-S', finId, finLot],
    ] as const) {
      const percentRounded = (await page(a, testId)).result.percentRounded as number;
      expect(percentOf(code)).toEqual([String(percentRounded)]);
      expect(Math.round(lastPercent(lotId))).toBe(percentRounded);
    }

    // Round trip: the other bank's copies keep the reason and the same stored percent.
    const imported = await importFile(b, csv);
    expect(imported.status).toBe(200);
    expect(imported.body).toEqual({ imported: 2 });
    const copies = await assaysOf(b);
    const originals = await assaysOf(a);
    expect(copies.map((t) => [t.start_date, t.status, t.result_percent])).toEqual(
      originals.map((t) => [t.start_date, t.status, t.result_percent]),
    );
    const copyOfFin = copies.find((t) => t.start_date === '2026-01-10')!;
    const copyPage = await page(b, copyOfFin.id);
    expect(copyPage.result.percentRounded).toBe(81);
    expect(copyPage.trays.map((t: { setAsideReason: string | null }) => t.setAsideReason)).toEqual([
      null,
      null,
      null,
      'Spilled',
    ]);
    expect((await b.viewer.agent.get(`${base(b)}/tests.csv`)).text).toEqual(csv);
  });

  it('when a file has several different mistakes, then each line is reported and nothing is written', async () => {
    const b = await bankWithRoles(ctx.app, ctx.db);
    await lot(b, 'TOM-E');
    await lot(b, 'LET-E');
    const other = await bankWithRoles(ctx.app, ctx.db);
    await lot(other, 'ELSE-1'); // another bank's lot is not found
    const csv = [
      'test,lot_code,start_date,method,tray,seeds_sown,check_date,cumulative,finished_on,abnormal,ungerminated',
      'good,TOM-E,2026-02-01,paper towel,1,10,2026-02-05,4,,,', // 2: fine
      'fall,TOM-E,2026-02-01,paper towel,1,10,2026-02-05,6,,,', // 3
      'fall,TOM-E,2026-02-01,paper towel,1,10,2026-02-09,5,,,', // 4: fewer than before
      'over,LET-E,2026-02-01,paper towel,1,10,2026-02-05,11,,,', // 5: more than sown
      'gap,LET-E,2026-02-01,paper towel,1,10,,,,,', // 6
      'gap,LET-E,2026-02-01,paper towel,3,10,,,,,', // 7: tray 2 missing
      'elsewhere,ELSE-1,2026-02-01,paper towel,1,10,,,,,', // 8: not this bank's lot
      'early,TOM-E,2026-02-01,paper towel,1,10,2026-01-30,0,,,', // 9: before the start
      'future,TOM-E,2026-03-02,paper towel,1,10,,,,,', // 10: after today
      'sum,TOM-E,2026-02-01,paper towel,1,10,2026-02-09,7,2026-02-10,1,1', // 11: 7+1+1 ≠ 10
      'mixed,TOM-E,2026-02-01,paper towel,1,10,,,,,', // 12
      'mixed,TOM-E,2026-02-02,tray of mix,2,10,,,,,', // 13: another start and method
    ].join('\r\n');
    const res = await importFile(b, csv);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_csv');
    const rows = res.body.error.rows as { line: number; column?: string; message: string }[];
    expect(rows.map((r) => [r.line, r.column])).toEqual([
      [4, 'cumulative'],
      [5, 'cumulative'],
      [6, 'tray'],
      [8, 'lot_code'],
      [9, 'check_date'],
      [10, 'start_date'],
      [11, 'ungerminated'],
      [13, 'start_date'],
      [13, 'method'],
    ]);
    expect(rows[0]!.message).toMatch(/fewer than the 6 counted on 5 Feb 2026/);
    expect(rows[1]!.message).toMatch(/more than the 10 seeds sown/);
    expect(rows[2]!.message).toMatch(/tray 2 is missing/);
    expect(rows[3]!.message).toMatch(/no lot with the code "ELSE-1"/);
    expect(rows[5]!.message).toMatch(/after today \(1 Mar 2026/);
    expect(await assaysOf(b)).toHaveLength(0);
    const trays = await ctx.db
      .selectFrom('test_trays')
      .innerJoin('germination_tests', 'germination_tests.id', 'test_trays.test_id')
      .select('test_trays.id')
      .where('bank_id', '=', b.bankId)
      .execute();
    expect(trays).toHaveLength(0);
  });

  it('when a viewer tries to import, then it is 403 and nothing is written', async () => {
    const b = await bankWithRoles(ctx.app, ctx.db);
    await lot(b, 'TOM-V');
    const res = await b.viewer.agent
      .post(`${base(b)}/tests/import`)
      .attach(
        'file',
        Buffer.from('test,lot_code,start_date,method,tray,seeds_sown\nv,TOM-V,2026-02-01,paper towel,1,10\n'),
        'tests.csv',
      );
    expect(res.status).toBe(403);
    expect(await assaysOf(b)).toHaveLength(0);
  });

  it('when an owner imports a hand-written file, then its tests are saved running or finished as it says', async () => {
    const b = await bankWithRoles(ctx.app, ctx.db);
    const tom = await lot(b, 'TOM-H', tomato, 40);
    const csv = [
      'Test,Lot code,Start date,Method,Tray,Seeds sown,Check date,Cumulative,Finished on,Abnormal,Ungerminated',
      'spring check,TOM-H,2026-02-01,paper towel,1,20,2026-02-06,12,2026-02-12,1,',
      'spring check,TOM-H,2026-02-01,paper towel,1,20,2026-02-12,18,2026-02-12,1,1',
      'spring check,TOM-H,2026-02-01,paper towel,2,20,2026-02-12,16,2026-02-12,2,2',
      'running,TOM-H,2026-02-25,petri dish,1,30,,,,,',
    ].join('\n');
    const res = await b.owner.agent
      .post(`${base(b)}/tests/import`)
      .attach('file', Buffer.from(csv), 'tests.csv');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ imported: 2 });
    const saved = await assaysOf(b);
    expect(saved.map((t) => [t.start_date, t.status, t.finished_on])).toEqual([
      ['2026-02-01', 'finished', '2026-02-12'],
      ['2026-02-25', 'running', null],
    ]);
    const detail = (await b.viewer.agent.get(`${base(b)}/tests/${saved[0]!.id}`)).body;
    expect(detail.result.germinated).toBe(34);
    expect(detail.result.percent).toBeCloseTo(85, 10); // 34 of 40 seeds
    expect(
      detail.trays.map((t: { abnormal: number; ungerminated: number }) => [t.abnormal, t.ungerminated]),
    ).toEqual([
      [1, 1],
      [2, 2],
    ]);
    // History: the lot's 40 seeds stay on hand although the file's tests sowed 70.
    expect(await stockOf(b, tom)).toBe(40);
    const lotAssays = (await b.viewer.agent.get(`${base(b)}/lots/${tom}/tests`)).body.items;
    expect(lotAssays).toHaveLength(2);
  });
});
