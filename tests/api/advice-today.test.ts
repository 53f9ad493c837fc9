import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signUp } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import { speciesId } from '../helpers/lots';

// Advice asked for without a date (`on`) is for today on the bank's own calendar, in its time
// zone, as every other "today" in Hilum. At 10:00 UTC on 20 March 2026 it is already midnight of
// 21 March on Kiritimati (UTC+14) and still 23:00 on 19 March in Pago Pago (UTC−11): both zones
// keep one offset all year in the IANA time zone database (from memory; the unit test of
// shared/dates.ts checks both offsets against the zone data Node ships).
const NOW = '2026-03-20T10:00:00Z';
const ZONES = [
  { zone: 'Pacific/Kiritimati', today: '2026-03-21', where: 'fourteen hours ahead of UTC' },
  { zone: 'Pacific/Pago_Pago', today: '2026-03-19', where: 'eleven hours behind UTC' },
] as const;

describe.each(ZONES)('the default date of advice in a bank $where ($zone)', ({ zone, today }) => {
  let ctx: TestContext;
  let owner: Awaited<ReturnType<typeof signUp>>;
  let bankId: string;
  let lotId: string;
  beforeAll(async () => {
    ctx = await createTestContext({ now: NOW });
    owner = await signUp(ctx.app, { name: 'Owner' });
    const created = await owner.agent
      .post('/api/banks')
      .send({ name: 'Far circle', lastFrost: '05-20', timeZone: zone });
    expect(created.status).toBe(201);
    bankId = created.body.bank.id as string;
    expect(created.body.bank.timeZone).toBe(zone);
    const lot = await owner.agent.post(`/api/banks/${bankId}/lots`).send({
      speciesId: await speciesId(ctx.db, 'tomato'),
      variety: 'Dateline Red',
      origin: 'saved',
      harvestDate: '2025-09-01',
      seedCount: 200,
    });
    expect(lot.status).toBe(201);
    lotId = lot.body.lot.id as string;
  });
  afterAll(() => ctx.close());

  it('when the ranking is asked without a date, then it is for today in the bank', async () => {
    const ranking = await owner.agent.get(`/api/banks/${bankId}/ranking`);
    expect(ranking.status).toBe(200);
    expect(ranking.body.on).toBe(today);
    // The UTC day at NOW is 2026-03-20, which is neither bank's day.
    expect(ranking.body.on).not.toBe(NOW.slice(0, 10));
  });

  it('when a lot’s viability is asked without a date, then it is for today in the bank', async () => {
    const viability = await owner.agent.get(`/api/banks/${bankId}/lots/${lotId}/viability`);
    expect(viability.status).toBe(200);
    expect(viability.body.on).toBe(today);
  });

  it('when a date is asked for, then that date is kept', async () => {
    const ranking = await owner.agent.get(`/api/banks/${bankId}/ranking?on=2026-04-01`);
    expect(ranking.status).toBe(200);
    expect(ranking.body.on).toBe('2026-04-01');
  });
});
