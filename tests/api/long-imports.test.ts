// Long CSV imports (5,000 lots; 5,000 germination tests) write in multi-row batches inside one
// short transaction: still every row or none (API.md), but a handful of statements instead of one
// connection held for thousands of single-row writes (a 5,000-lot file used to hold one for 28 s).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bankWithRoles } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import { speciesId } from '../helpers/lots';

const ROWS = 5000;

describe('long imports', () => {
  let ctx: TestContext;
  let bank: Awaited<ReturnType<typeof bankWithRoles>>;
  const statements: string[] = [];

  beforeAll(async () => {
    ctx = await createTestContext({ onQuery: (sql) => statements.push(sql) });
    bank = await bankWithRoles(ctx.app, ctx.db);
  });
  afterAll(() => ctx.close());

  const upload = (path: string, lines: string[]) =>
    bank.grower.agent
      .post(`/api/banks/${bank.bankId}/${path}`)
      .attach('file', Buffer.from(lines.join('\r\n')), 'file.csv');
  const count = async (table: 'lots' | 'germination_tests') =>
    Number(
      (
        await ctx.db
          .selectFrom(table)
          .select((eb) => eb.fn.countAll<string>().as('n'))
          .where('bank_id', '=', bank.bankId)
          .executeTakeFirstOrThrow()
      ).n,
    );
  /** The statements run while `act` runs that insert into `table`. */
  async function insertsDuring(table: string, act: () => Promise<unknown>) {
    const from = statements.length;
    await act();
    return statements.slice(from).filter((s) => s.startsWith(`insert into "${table}"`)).length;
  }

  const lotLines = (lastCode: string) => [
    'code,species,variety,origin,harvest_date,seeds_on_hand',
    ...Array.from({ length: ROWS - 1 }, (_, i) =>
      i % 5 === 0
        ? `G-${String(i).padStart(4, '0')},Lettuce,Given ${i},bought,2025-07-01,${100 + i}`
        : `,Tomato,Kept ${i},saved,2025-08-01,${10 + (i % 90)}`,
    ),
    `${lastCode},Tomato,Last one,saved,2025-08-01,5`,
  ];

  it('when a 5,000-lot file has one code the bank already uses, on its last line, then nothing is imported', async () => {
    const tomato = await speciesId(ctx.db, 'tomato');
    const first = await bank.grower.agent.post(`/api/banks/${bank.bankId}/lots`).send({
      speciesId: tomato,
      variety: 'Logged by hand',
      origin: 'saved',
      harvestDate: '2025-08-01',
      seedCount: 30,
    });
    expect(first.body.lot.code).toBe('TOM-25-01');
    const res = await upload('lots/import', lotLines('TOM-25-01'));
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_csv');
    expect(res.body.error.rows).toEqual([
      { line: ROWS + 1, column: 'code', message: 'The code TOM-25-01 is already used in this bank.' },
    ]);
    expect(await count('lots')).toBe(1);
  });

  it('when a 5,000-lot file is imported, then every lot is written in a few multi-row statements, with codes after those in use', async () => {
    let res!: Awaited<ReturnType<typeof upload>>;
    const lotInserts = await insertsDuring('lots', async () => {
      res = await upload('lots/import', lotLines('LAST-1'));
    });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ imported: ROWS });
    // 5,000 rows in batches of 500: 10 statements, where one per row made 5,000.
    expect(lotInserts).toBe(10);
    expect(await count('lots')).toBe(ROWS + 1);
    const lots = await ctx.db
      .selectFrom('lots')
      .select(['code', 'seeds_on_hand', 'variety'])
      .where('bank_id', '=', bank.bankId)
      .execute();
    expect(new Set(lots.map((l) => l.code.toLowerCase())).size).toBe(ROWS + 1);
    const tomatoCodes = lots.filter((l) => l.code.startsWith('TOM-25-')).map((l) => l.code);
    // The hand-logged TOM-25-01, then 3,999 generated from TOM-25-02 on.
    expect(tomatoCodes.length).toBe(4000);
    expect(tomatoCodes).toContain('TOM-25-02');
    expect(tomatoCodes).toContain('TOM-25-4000');
    // Seeds on hand come from each lot's first stock movement, written in batches too.
    expect(lots.find((l) => l.variety === 'Given 5')?.seeds_on_hand).toBe(105);
    expect(lots.find((l) => l.variety === 'Kept 1')?.seeds_on_hand).toBe(11);
  });

  it('when a 5,000-test file is imported, then every test is written in a few multi-row statements', async () => {
    const codes = (
      await ctx.db
        .selectFrom('lots')
        .select('code')
        .where('bank_id', '=', bank.bankId)
        .where('code', 'like', 'TOM-25-%')
        .orderBy('code')
        .execute()
    ).map((r) => r.code);
    const lines = [
      'test,lot_code,start_date,method,tray,seeds_sown,check_date,cumulative',
      ...Array.from(
        { length: ROWS },
        (_, i) =>
          `T${i},${codes[i % codes.length]},2026-01-${String(10 + (i % 10))},paper towel,1,10,2026-01-25,${i % 11}`,
      ),
    ];
    let res!: Awaited<ReturnType<typeof upload>>;
    const assayInserts = await insertsDuring('germination_tests', async () => {
      res = await upload('tests/import', lines);
    });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ imported: ROWS });
    expect(assayInserts).toBe(10);
    expect(await count('germination_tests')).toBe(ROWS);
    // Each test's result is stored with it, as when tests are logged one by one.
    const unstored = await ctx.db
      .selectFrom('germination_tests')
      .select('id')
      .where('bank_id', '=', bank.bankId)
      .where('result', 'is', null)
      .execute();
    expect(unstored).toEqual([]);
  });
});
