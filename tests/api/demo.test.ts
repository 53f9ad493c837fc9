import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedDemoScenario } from '../../server/db/demo-scenario';
import { signIn } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import { waitForMail } from '../helpers/outbox';

describe('the demo season', () => {
  let ctx: TestContext;
  let bankId: string;
  beforeAll(async () => {
    ctx = await createTestContext({ now: '2026-12-01T09:00:00Z' });
    const seeded = await seedDemoScenario({ db: ctx.db, storage: ctx.storage, mailer: ctx.mailer, clock: ctx.clock, appOrigin: ctx.config.appOrigin });
    bankId = seeded!.bankId;
  }, 120_000);
  afterAll(() => ctx.close());

  it('when seeded, then it has about 40 lots, about 60 tests, photos, parent plants and a plan', async () => {
    const count = async (table: 'lots' | 'germination_tests' | 'photos' | 'parent_plants' | 'plan_entries') =>
      Number((await ctx.db.selectFrom(table).select(ctx.db.fn.countAll().as('n')).where('bank_id', '=', bankId).executeTakeFirstOrThrow()).n);
    expect(await count('lots')).toBe(40);
    expect(await count('germination_tests')).toBeGreaterThanOrEqual(45);
    expect(await count('germination_tests')).toBeLessThanOrEqual(80);
    expect(await count('photos')).toBe(12);
    expect(await count('parent_plants')).toBeGreaterThanOrEqual(8);
    expect(await count('plan_entries')).toBeGreaterThanOrEqual(6);
  });

  it('when seeded, then the demo accounts sign in and the ranking shows lots to sow and lots to retest or retire', async () => {
    const keeper = await signIn(ctx.app, 'keeper@example.org', 'hilum-demo-seeds');
    const ranking = await keeper.get(`/api/banks/${bankId}/ranking?on=2027-03-15`);
    const kinds = new Set(ranking.body.items.map((i: { recommendation: string }) => i.recommendation));
    expect(kinds.has('sow')).toBe(true);
    expect(kinds.has('retest') || kinds.has('retire')).toBe(true);
    const second = await signIn(ctx.app, 'grower2@example.org', 'hilum-demo-seeds');
    expect((await second.get(`/api/banks/${bankId}`)).body.role).toBe('grower');
  });

  it('when seeded, then one test is running with a count due today', async () => {
    const running = await ctx.db.selectFrom('germination_tests').select(['start_date']).where('bank_id', '=', bankId).where('status', '=', 'running').execute();
    expect(running).toHaveLength(1);
    // Tomato's first count day is day 5 (from memory): started 5 days before today.
    expect(running[0]!.start_date).toBe('2026-11-26');
  });

  it('when seeded, then an invitation mail was captured', async () => {
    await waitForMail((m) => m.to.includes('new-neighbour@example.org'));
  });

  it('when seeded twice, then nothing is added the second time', async () => {
    expect(await seedDemoScenario({ db: ctx.db, clock: ctx.clock, appOrigin: ctx.config.appOrigin })).toBeNull();
  });
});

describe('the bank overview on the demo season', () => {
  let ctx: TestContext;
  let bankId: string;
  beforeAll(async () => {
    ctx = await createTestContext({ now: '2026-12-01T09:00:00Z' });
    bankId = (await seedDemoScenario({ db: ctx.db, clock: ctx.clock, appOrigin: ctx.config.appOrigin }))!.bankId;
  }, 120_000);
  afterAll(() => ctx.close());

  it('when the keeper opens the overview, then the running test is listed to count today and lots to retest appear', async () => {
    const keeper = await signIn(ctx.app, 'keeper@example.org', 'hilum-demo-seeds');
    const res = await keeper.get(`/api/banks/${bankId}/overview`);
    expect(res.status).toBe(200);
    expect(res.body.today).toBe('2026-12-01');
    expect(res.body.traysToCount).toEqual([expect.objectContaining({ checkDate: '2026-12-01', day: 5, overdue: false })]);
    expect(res.body.lotsToRetest.length).toBeGreaterThan(0);
    expect(res.body.counts.lots).toBeGreaterThan(30);
  });

  it('when the sowing season comes, then the plan entries show as sowings due', async () => {
    const keeper = await signIn(ctx.app, 'keeper@example.org', 'hilum-demo-seeds');
    const { body } = await keeper.get(`/api/banks/${bankId}/plan?season=2027`);
    const first = [...body.items].sort((a: { sowFrom: string }, b: { sowFrom: string }) => a.sowFrom.localeCompare(b.sowFrom))[0];
    const res = await keeper.get(`/api/banks/${bankId}/overview?on=${first.sowFrom}`);
    expect(res.body.sowingsDue.some((s: { entryId: string; open: boolean }) => s.entryId === first.id && s.open)).toBe(true);
  });
});
