import crypto from 'node:crypto';
import ical from 'node-ical';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '#server/app';
import { redactUrl } from '#server/http/request-log';
import { bankWithRoles } from '../helpers/accounts';
import { capturedLogger } from '../helpers/captured-log';
import { createTestContext, type TestContext } from '../helpers/context';
import { speciesId, startedAssay } from '../helpers/lots';

/** The feed's events, by UID. */
function eventsOf(text: string): Map<string, ical.VEvent> {
  const events = Object.values(ical.sync.parseICS(text)).filter((e) => e?.type === 'VEVENT') as ical.VEvent[];
  return new Map(events.map((e) => [String(e.uid), e]));
}

const dayOf = (e: ical.VEvent | undefined) => {
  const d = e!.start as Date;
  return `${d.getUTCFullYear()}-${String(d.getUTCMonth() + 1).padStart(2, '0')}-${String(d.getUTCDate()).padStart(2, '0')}`;
};

/** The path part of a feed address, to ask the app under test. */
const pathOf = (url: string) => new URL(url).pathname;

describe('the live calendar feed', () => {
  let ctx: TestContext;
  let bank: Awaited<ReturnType<typeof bankWithRoles>>;
  let entryId: string;
  let sowFrom: string;
  let testId: string;
  let schedule: { firstCountDate: string; finalCountDate: string };
  beforeAll(async () => {
    ctx = await createTestContext({ now: '2026-12-01T09:00:00Z' });
    bank = await bankWithRoles(ctx.app, ctx.db); // last frost 05-20
    const tomato = await speciesId(ctx.db, 'tomato');
    const lot = await bank.grower.agent.post(`/api/banks/${bank.bankId}/lots`).send({
      speciesId: tomato,
      variety: 'Feed',
      origin: 'saved',
      harvestDate: '2025-09-01',
      seedCount: 400,
    });
    expect(lot.status).toBe(201);
    const entry = await bank.grower.agent
      .post(`/api/banks/${bank.bankId}/plan`)
      .send({ season: 2027, speciesId: tomato, plantsWanted: 8, start: 'indoors', lotId: lot.body.lot.id });
    expect(entry.status).toBe(201);
    entryId = entry.body.entry.id;
    sowFrom = entry.body.entry.sowFrom;
    ({ testId } = await startedAssay(
      bank.grower.agent,
      bank.bankId,
      lot.body.lot.id,
      '2026-11-28',
      [50, 50],
    ));
    const detail = await bank.viewer.agent.get(`/api/banks/${bank.bankId}/tests/${testId}`);
    expect(detail.status).toBe(200);
    schedule = detail.body.test.schedule;
  });
  afterAll(() => ctx.close());

  const feedUrl = async (agent: typeof bank.viewer.agent) => {
    const res = await agent.get(`/api/banks/${bank.bankId}/calendar-feed`);
    expect(res.status).toBe(200);
    return res.body.url as string;
  };

  it('when a viewer asks for the feed, then the same private address comes back each time, and it answers without a cookie with the plan and the check days', async () => {
    const url = await feedUrl(bank.viewer.agent);
    expect(url).toMatch(new RegExp(`^${ctx.config.appOrigin}/api/calendar/[A-Za-z0-9_-]{43}\\.ics$`));
    expect(await feedUrl(bank.viewer.agent)).toBe(url);
    // Each member has a feed of their own.
    expect(await feedUrl(bank.owner.agent)).not.toBe(url);

    const res = await request(ctx.app).get(pathOf(url));
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/calendar/);
    expect(res.headers['cache-control']).toMatch(/no-cache/);
    expect(res.headers['set-cookie']).toBeUndefined();
    const events = eventsOf(res.text);
    // The plan's sowing window, on the planner's own dates (tomato indoors 8–6 weeks before the
    // 20 May frost: 2027-03-25, as tests/api/plan.test.ts works out by hand).
    expect(sowFrom).toBe('2027-03-25');
    expect(dayOf(events.get(`${entryId}-sow@hilum`))).toBe(sowFrom);
    expect(events.get(`${entryId}-sow@hilum`)?.summary).toMatch(/^Sow Tomato/);
    expect(events.has(`${entryId}-plant@hilum`)).toBe(true);
    // The test's check days: its first and final count days as the test itself gives them, and the
    // one between (common practice, server/modules/reminders checkDays). Tomato first count day 5,
    // final 14 (ISTA Rules table 5A; [memory], checked against the test's own schedule here).
    expect(schedule).toEqual({ firstCountDate: '2026-12-03', finalCountDate: '2026-12-12' });
    expect(dayOf(events.get(`${testId}-check-5@hilum`))).toBe(schedule.firstCountDate);
    expect(dayOf(events.get(`${testId}-check-10@hilum`))).toBe('2026-12-08');
    expect(dayOf(events.get(`${testId}-check-14@hilum`))).toBe(schedule.finalCountDate);

    // Polled again after a change, the same events keep their UIDs: a calendar app replaces them.
    const moved = await bank.grower.agent
      .patch(`/api/banks/${bank.bankId}/plan/${entryId}`)
      .send({ plantsWanted: 10 });
    expect(moved.status).toBe(200);
    const again = eventsOf((await request(ctx.app).get(pathOf(url))).text);
    expect([...again.keys()].sort()).toEqual([...events.keys()].sort());
    expect(String(again.get(`${entryId}-sow@hilum`)?.description)).toMatch(/10 plants/);
  });

  it('when the member makes a new link, then the old address answers 404 in the error shape and the new one works', async () => {
    const old = await feedUrl(bank.grower.agent);
    expect((await request(ctx.app).get(pathOf(old))).status).toBe(200);
    const rotated = await bank.grower.agent.post(`/api/banks/${bank.bankId}/calendar-feed/rotate`);
    expect(rotated.status).toBe(200);
    const fresh = rotated.body.url as string;
    expect(fresh).not.toBe(old);
    const gone = await request(ctx.app).get(pathOf(old));
    expect(gone.status).toBe(404);
    expect(gone.body.error).toMatchObject({ code: 'not_found' });
    expect((await request(ctx.app).get(pathOf(fresh))).status).toBe(200);
    expect(await feedUrl(bank.grower.agent)).toBe(fresh);
  });

  it('when a token is unknown or malformed, then 404 in the error shape', async () => {
    for (const path of [
      `/api/calendar/${crypto.randomBytes(32).toString('base64url')}.ics`,
      '/api/calendar/short.ics',
      `/api/calendar/${'%00'.repeat(3)}.ics`,
    ]) {
      const res = await request(ctx.app).get(path);
      expect(res.status, path).toBe(404);
      expect(res.body.error?.code, path).toBe('not_found');
    }
  });

  it('when an outsider or nobody asks for a bank feed address, then 404 and 401', async () => {
    expect((await bank.outsider.agent.get(`/api/banks/${bank.bankId}/calendar-feed`)).status).toBe(404);
    expect((await request(ctx.app).get(`/api/banks/${bank.bankId}/calendar-feed`)).status).toBe(401);
  });

  it('when a member is removed from the bank, then their feed answers 404', async () => {
    const extra = await bankWithRoles(ctx.app, ctx.db);
    const url = await (async () => {
      const res = await extra.viewer.agent.get(`/api/banks/${extra.bankId}/calendar-feed`);
      expect(res.status).toBe(200);
      return res.body.url as string;
    })();
    expect((await request(ctx.app).get(pathOf(url))).status).toBe(200);
    const removed = await extra.owner.agent.delete(
      `/api/banks/${extra.bankId}/members/${extra.viewer.user.id}`,
    );
    expect(removed.status).toBe(204);
    const res = await request(ctx.app).get(pathOf(url));
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });

  it('when the feed is fetched on a production server, then the token is not in the log and the request is', async () => {
    const log = capturedLogger('info');
    const app = createApp({ ...ctx, config: { ...ctx.config, env: 'production' }, logger: log.logger });
    const url = await feedUrl(bank.viewer.agent);
    const token = /\/api\/calendar\/([^/]+)\.ics$/.exec(url)![1]!;
    expect((await request(app).get(pathOf(url))).status).toBe(200);
    expect(
      (
        await request(app)
          .get(`${pathOf(url)}?v=2`)
          .set('Referer', url)
      ).status,
    ).toBe(200);
    const marker = crypto.randomBytes(6).toString('hex');
    expect((await request(app).get(`/api/health?last=${marker}`)).status).toBe(200);
    await expect.poll(() => log.text().includes(marker), { timeout: 10_000 }).toBe(true);
    const text = log.text();
    expect(text).not.toContain(token);
    expect(text).toContain('"url":"/api/calendar/[redacted].ics"');
    expect(text).toContain('"url":"/api/calendar/[redacted].ics?v=2"');
    expect(text).toContain(`"referer":"${ctx.config.appOrigin}/api/calendar/[redacted].ics"`);
  });

  it('when a calendar address is logged, then its token segment is replaced, other paths are not', () => {
    expect(redactUrl('/api/calendar/abc_DEF-123.ics')).toBe('/api/calendar/[redacted].ics');
    expect(redactUrl('/API/Calendar/abc/x?token=t')).toBe('/API/Calendar/[redacted]/x?token=[redacted]');
    expect(redactUrl('https://hilum.example/api/calendar/abc.ics')).toBe(
      'https://hilum.example/api/calendar/[redacted].ics',
    );
    expect(redactUrl('/api/banks/b1/calendar-feed')).toBe('/api/banks/b1/calendar-feed');
  });
});
