import { sql } from 'kysely';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '#server/app';
import { CHANGE_FEED_APPLICATION, type ChangeFeed, type ChangeNotice } from '#server/db/change-feed';
import { bankWithRoles, PASSWORD } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import { speciesId } from '../helpers/lots';

// Sessions, memberships and pages of lots are kept in memory between requests (ReadCache) and
// forgotten when they may be out of date. Whatever changes them, and wherever the change comes
// from, the list a member reads must equal the list read afresh from the database by an app that
// keeps nothing: after a write through the same server at once, after a write by another server
// or a hand-written statement once its change notice is in, and while the notices are lost.
/** The real feed with its notices held back until released: a change notice that is late. */
function heldBack(feed: ChangeFeed) {
  const listeners = new Set<(notice: ChangeNotice) => void>();
  const held: ChangeNotice[] = [];
  const tell = (notice: ChangeNotice) => listeners.forEach((listener) => listener(notice));
  feed.subscribe((notice) => (notice.kind === 'reset' ? tell(notice) : held.push(notice)));
  const late: ChangeFeed = {
    get live() {
      return feed.live;
    },
    subscribe(listener) {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
    sync: () => feed.sync(),
    ready: () => feed.ready(),
    close: async () => undefined,
  };
  return { feed: late, release: () => held.splice(0).forEach(tell) };
}

describe('what servers keep between requests', () => {
  let ctx: TestContext;
  let bank: Awaited<ReturnType<typeof bankWithRoles>>;
  let tomato: string;
  let queries = 0;
  /** A second server on the same database, keeping its own memory. */
  let other: ReturnType<typeof createApp>;
  /** An app that keeps nothing: the truth to compare with. */
  let fresh: ReturnType<typeof createApp>;
  beforeAll(async () => {
    ctx = await createTestContext({ now: '2026-12-01T09:00:00Z', onQuery: () => void (queries += 1) });
    bank = await bankWithRoles(ctx.app, ctx.db);
    tomato = await speciesId(ctx.db, 'tomato');
    other = createApp({ ...ctx });
    fresh = createApp({ ...ctx, changeFeed: undefined });
  });
  afterAll(() => ctx.close());
  const lotsPath = () => `/api/banks/${bank.bankId}/lots?limit=50`;
  /** A session of the member's own, signed in on this server, to send to every server. */
  const cookieOf = async (member: { email: string }) => {
    const login = await request(ctx.app)
      .post('/api/auth/login')
      .send({ email: member.email, password: PASSWORD });
    expect(login.status).toBe(200);
    return String(login.headers['set-cookie']).split(';')[0]!;
  };
  let viewerCookie = '';
  const listOn = async (app: ReturnType<typeof createApp>) => {
    if (!viewerCookie) viewerCookie = await cookieOf(bank.viewer);
    const res = await request(app).get(lotsPath()).set('Cookie', viewerCookie);
    expect(res.status).toBe(200);
    return res.body as { items: Array<{ id: string; variety: string | null; seedsOnHand: number }> };
  };
  const newLot = async (variety: string) => {
    const res = await bank.owner.agent
      .post(`/api/banks/${bank.bankId}/lots`)
      .send({ speciesId: tomato, variety, origin: 'saved', harvestDate: '2024-09-01', seedCount: 300 });
    expect(res.status).toBe(201);
    return res.body.lot.id as string;
  };

  it('when the lot list is read again, then it is answered without reading the database', async () => {
    await newLot('Kept');
    await listOn(ctx.app);
    const before = queries;
    const again = await listOn(ctx.app);
    expect(queries - before).toBe(0);
    expect(again).toEqual(await listOn(fresh));
  });

  it('when a grower writes through this server, then the very next list shows it', async () => {
    const lotId = await newLot('Same server');
    expect(await listOn(ctx.app)).toEqual(await listOn(fresh));
    const renamed = await bank.grower.agent
      .patch(`/api/banks/${bank.bankId}/lots/${lotId}`)
      .send({ variety: 'Same server, renamed' });
    expect(renamed.status).toBe(200);
    expect((await listOn(ctx.app)).items.find((l) => l.id === lotId)?.variety).toBe('Same server, renamed');
    const moved = await bank.grower.agent
      .post(`/api/banks/${bank.bankId}/lots/${lotId}/stock`)
      .send({ change: -100, reason: 'sown', date: '2026-11-20', kind: 'sown' });
    expect(moved.status).toBe(201);
    expect((await listOn(ctx.app)).items.find((l) => l.id === lotId)?.seedsOnHand).toBe(200);
    const deleted = await bank.owner.agent.delete(`/api/banks/${bank.bankId}/lots/${lotId}`);
    expect(deleted.status).toBe(204);
    expect((await listOn(ctx.app)).items.some((l) => l.id === lotId)).toBe(false);
    expect(await listOn(ctx.app)).toEqual(await listOn(fresh));
  });

  it('when the change notices are late, then a write still shows on the very next list of the server that made it', async () => {
    const late = heldBack(ctx.changeFeed);
    const slow = createApp({ ...ctx, changeFeed: late.feed });
    const ownerCookie = await cookieOf(bank.owner);
    const list = async (app: ReturnType<typeof createApp>) =>
      (await request(app).get(lotsPath()).set('Cookie', ownerCookie)).body as {
        items: Array<{ variety: string }>;
      };
    await list(slow);
    const created = await request(slow)
      .post(`/api/banks/${bank.bankId}/lots`)
      .set('Cookie', ownerCookie)
      .send({
        speciesId: tomato,
        variety: 'Late notice',
        origin: 'saved',
        harvestDate: '2024-09-01',
        seedCount: 40,
      });
    expect(created.status).toBe(201);
    expect((await list(slow)).items.map((l) => l.variety)).toContain('Late notice');
    // A write by another server reaches it only with the notice: until then the kept page stands.
    await newLot('Elsewhere');
    await ctx.changeFeed.sync();
    expect((await list(slow)).items.map((l) => l.variety)).not.toContain('Elsewhere');
    late.release();
    expect((await list(slow)).items.map((l) => l.variety)).toContain('Elsewhere');
    expect(await list(slow)).toEqual(await list(fresh));
  });

  it('when another server writes, then this one shows it once the change notice is in', async () => {
    await listOn(other);
    const lotId = await newLot('Other server');
    await ctx.changeFeed.sync();
    expect((await listOn(other)).items.some((l) => l.id === lotId)).toBe(true);
    expect(await listOn(other)).toEqual(await listOn(fresh));
  });

  it('when statements change the bank by hand, then every server follows once their notices are in', async () => {
    const lotId = await newLot('By hand');
    await listOn(ctx.app);
    await listOn(other);
    const changes = [
      sql`update lots set variety = 'By hand, renamed' where id = ${lotId}`,
      sql`insert into stock_movements (lot_id, kind, change, date, reason)
          values (${lotId}, 'given', -50, '2026-11-21', 'given away')`,
      // A reference species every bank shares.
      sql`update species set common_name = common_name || ' (renamed)' where id = ${tomato}`,
      sql`update species set common_name = replace(common_name, ' (renamed)', '') where id = ${tomato}`,
      sql`delete from lots where id = ${lotId}`,
    ];
    for (const change of changes) {
      await change.execute(ctx.db);
      await ctx.changeFeed.sync();
      const truth = await listOn(fresh);
      expect(await listOn(ctx.app)).toEqual(truth);
      expect(await listOn(other)).toEqual(truth);
    }
  });

  it('when a member is removed or signed out on one server, then the other refuses them once the notice is in', async () => {
    const owner = bank.owner.agent;
    const growerCookie = await cookieOf(bank.grower);
    const onOther = () => request(other).get(lotsPath()).set('Cookie', growerCookie);
    expect((await onOther()).status).toBe(200);
    const demoted = await owner
      .patch(`/api/banks/${bank.bankId}/members/${bank.grower.user.id}`)
      .send({ role: 'viewer' });
    expect(demoted.status).toBe(200);
    await ctx.changeFeed.sync();
    const write = await request(other)
      .post(`/api/banks/${bank.bankId}/lots`)
      .set('Cookie', growerCookie)
      .set('Origin', ctx.config.appOrigin)
      .send({ speciesId: tomato, variety: 'Not allowed', origin: 'saved', seedCount: 10 });
    expect(write.status).toBe(403);
    const removed = await owner.delete(`/api/banks/${bank.bankId}/members/${bank.grower.user.id}`);
    expect(removed.status).toBe(204);
    await ctx.changeFeed.sync();
    expect((await onOther()).status).toBe(404);

    const outCookie = await cookieOf(bank.outsider);
    expect((await request(other).get('/api/me').set('Cookie', outCookie)).status).toBe(200);
    const out = await request(ctx.app).post('/api/auth/logout-all').set('Cookie', outCookie);
    expect(out.status).toBe(204);
    await ctx.changeFeed.sync();
    expect((await request(other).get('/api/me').set('Cookie', outCookie)).status).toBe(401);
  });

  it('when the change notices are lost, then nothing is kept until they are back, and lists stay true', async () => {
    const lotId = await newLot('Through an outage');
    await listOn(ctx.app);
    await sql`select pg_terminate_backend(pid) from pg_stat_activity
              where datname = current_database() and application_name = ${CHANGE_FEED_APPLICATION}`.execute(
      ctx.db,
    );
    await expect.poll(() => ctx.changeFeed.live, { timeout: 60_000 }).toBe(false);
    await sql`update lots set variety = 'During the outage' where id = ${lotId}`.execute(ctx.db);
    expect((await listOn(ctx.app)).items.find((l) => l.id === lotId)?.variety).toBe('During the outage');
    await ctx.changeFeed.ready();
    await listOn(ctx.app);
    const before = queries;
    await listOn(ctx.app);
    expect(queries - before).toBe(0);
    await sql`update lots set variety = 'After the outage' where id = ${lotId}`.execute(ctx.db);
    await ctx.changeFeed.sync();
    expect((await listOn(ctx.app)).items.find((l) => l.id === lotId)?.variety).toBe('After the outage');
  });
});
