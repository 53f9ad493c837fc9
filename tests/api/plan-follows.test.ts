import ical from 'node-ical';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createRemindersService } from '#server/modules/reminders/reminders.service';
import { createViabilityService } from '#server/modules/viability/viability.service';
import { bankWithRoles } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import { finishedAssay, speciesId } from '../helpers/lots';

// The plan follows its inputs: a moved frost date, a changed species, each sowing's own day.
// Dates by hand. Tomato indoors 8–6 weeks before the last frost (reference set, common practice);
// tender, so out after the frost plus the bank's 7-day margin (Purdue Extension HO-203: tender
// "on or after the average frost-free date"); days to emerge 6 at 77 °F and 8 at 68 °F
// (Harrington & Minges 1954, in Knott's Handbook).

type Entry = {
  id: string;
  sowFrom: string;
  sowTo: string;
  expectFrom: string | null;
  expectBy: string | null;
  hardenFrom: string | null;
  transplantOn: string | null;
  sownOn: string | null;
  seedsToSow: number | null;
  hardiness: string | null;
  succession: { id: string; number: number; of: number; everyWeeks: number } | null;
};

const sowEventDay = (text: string, entryId: string) => {
  const events = Object.values(ical.sync.parseICS(text)).filter((e) => e?.type === 'VEVENT') as ical.VEvent[];
  const d = events.find((e) => e.uid === `${entryId}-sow@hilum`)!.start as Date;
  return d.toISOString().slice(0, 10);
};

describe('a plan that follows its inputs', () => {
  let ctx: TestContext;
  beforeAll(async () => {
    // 1 April 2027 in the bank (UTC): the 2027 season's indoor sowings are under way.
    ctx = await createTestContext({ now: '2027-04-01T09:00:00Z' });
  });
  afterAll(() => ctx.close());

  async function testedLot(bank: Awaited<ReturnType<typeof bankWithRoles>>, key: string, seeds = 2000) {
    const lot = await bank.grower.agent.post(`/api/banks/${bank.bankId}/lots`).send({
      speciesId: await speciesId(ctx.db, key),
      variety: `Plan ${key}`,
      origin: 'saved',
      harvestDate: '2026-08-01',
      seedCount: seeds,
    });
    expect(lot.status).toBe(201);
    await finishedAssay(bank.grower.agent, bank.bankId, lot.body.lot.id, '2026-09-01', [
      { sown: 50, germinated: 45 },
      { sown: 50, germinated: 44 },
    ]);
    return lot.body.lot.id as string;
  }

  describe('when the last frost moves', () => {
    let bank: Awaited<ReturnType<typeof bankWithRoles>>;
    let unsown: Entry;
    let sown: Entry;
    let moveBody: { planMoved: { season: number; days: number; entries: number; message: string }[] };
    const plan = () => `/api/banks/${bank.bankId}/plan`;
    const entries = async () =>
      new Map(
        ((await bank.viewer.agent.get(`${plan()}?season=2027`)).body.items as Entry[]).map((e) => [e.id, e]),
      );

    beforeAll(async () => {
      bank = await bankWithRoles(ctx.app, ctx.db); // last frost 05-20, margin 7
      const tomato = await speciesId(ctx.db, 'tomato');
      const lotId = await testedLot(bank, 'tomato');
      const make = async () =>
        (
          await bank.grower.agent
            .post(plan())
            .send({ season: 2027, speciesId: tomato, plantsWanted: 6, start: 'indoors', lotId })
        ).body.entry as Entry;
      unsown = await make();
      sown = await make();
      // 20 May − 56 days = 25 Mar; − 42 days = 8 Apr; out 27 May; hardened off from 20 May.
      expect(unsown).toMatchObject({
        sowFrom: '2027-03-25',
        sowTo: '2027-04-08',
        transplantOn: '2027-05-27',
        hardenFrom: '2027-05-20',
        hardiness: 'tender',
      });
      // Seedlings from 25 Mar + 6 = 31 Mar to 8 Apr + 8 = 16 Apr: after sowing starts, not before the window ends.
      expect(unsown).toMatchObject({ expectFrom: '2027-03-31', expectBy: '2027-04-16' });
      const marked = await bank.grower.agent.post(`${plan()}/${sown.id}/sown`).send({ date: '2027-03-30' });
      expect(marked.status).toBe(200);
      // Sown on 30 Mar: seedlings from 30 Mar + 6 = 5 Apr to 30 Mar + 8 = 7 Apr.
      expect(marked.body.entry).toMatchObject({
        sownOn: '2027-03-30',
        expectFrom: '2027-04-05',
        expectBy: '2027-04-07',
      });
      const moved = await bank.owner.agent.patch(`/api/banks/${bank.bankId}`).send({ lastFrost: '05-27' });
      expect(moved.status).toBe(200);
      moveBody = moved.body;
    });

    it('then the settings answer says how many unsown sowings moved and by how much', () => {
      expect(moveBody.planMoved).toEqual([
        expect.objectContaining({
          season: 2027,
          days: 7,
          entries: 1,
          message:
            'Last frost moved 20 May → 27 May: 1 unsown sowing moved 7 days later; sown ones keep their dates.',
        }),
      ]);
    });

    it('then every unsown entry moves by those days and the sown one keeps its dates', async () => {
      const now = await entries();
      // 27 May − 56 = 1 Apr, − 42 = 15 Apr; out 27 May + 7 = 3 Jun, hardened off from 27 May.
      expect(now.get(unsown.id)).toMatchObject({
        sowFrom: '2027-04-01',
        sowTo: '2027-04-15',
        transplantOn: '2027-06-03',
        hardenFrom: '2027-05-27',
        expectFrom: '2027-04-07',
        expectBy: '2027-04-23',
      });
      expect(now.get(sown.id)).toMatchObject({
        sownOn: '2027-03-30',
        sowFrom: '2027-03-25',
        sowTo: '2027-04-08',
        transplantOn: '2027-05-27',
        expectFrom: '2027-04-05',
      });
      const list = await bank.viewer.agent.get(`${plan()}?season=2027`);
      expect(list.body.moved).toMatchObject({ days: 7, entries: 1, message: moveBody.planMoved[0]!.message });
      expect((await bank.viewer.agent.get(`${plan()}/${unsown.id}`)).body.entry.sowFrom).toBe('2027-04-01');
    });

    it('then the .ics download, the calendar feed and the overview read the moved dates', async () => {
      const ics = await bank.viewer.agent.get(`/api/banks/${bank.bankId}/plan.ics?season=2027`);
      expect(sowEventDay(ics.text, unsown.id)).toBe('2027-04-01');
      expect(sowEventDay(ics.text, sown.id)).toBe('2027-03-25');
      const feed = await bank.viewer.agent.get(`/api/banks/${bank.bankId}/calendar-feed`);
      const polled = await request(ctx.app).get(new URL(feed.body.url).pathname);
      expect(sowEventDay(polled.text, unsown.id)).toBe('2027-04-01');
      // On 31 Mar the moved sowing is not open yet (it opens 1 Apr); on 1 Apr it is.
      const before = await bank.viewer.agent.get(`/api/banks/${bank.bankId}/overview?on=2027-03-31`);
      expect(before.body.sowingsDue.find((s: { entryId: string }) => s.entryId === unsown.id)).toMatchObject({
        sowFrom: '2027-04-01',
        open: false,
      });
    });

    it('when the species’ own window is changed for the bank, then unsown entries follow and sown ones stay', async () => {
      const tomato = await speciesId(ctx.db, 'tomato');
      const set = await bank.grower.agent
        .patch(`/api/banks/${bank.bankId}/species/${tomato}`)
        .send({ traits: { startWeeksFrom: 9, startWeeksTo: 7 } });
      expect(set.status).toBe(200);
      let now = await entries();
      // 27 May − 63 = 25 Mar; − 49 = 8 Apr.
      expect(now.get(unsown.id)).toMatchObject({ sowFrom: '2027-03-25', sowTo: '2027-04-08' });
      expect(now.get(sown.id)).toMatchObject({ sowFrom: '2027-03-25', sownOn: '2027-03-30' });
      await bank.grower.agent.delete(`/api/banks/${bank.bankId}/species/${tomato}/overrides`);
      now = await entries();
      expect(now.get(unsown.id)).toMatchObject({ sowFrom: '2027-04-01' });
    });
  });

  it('when lettuce and tomato are planned, then the hardy crop goes out and is sown outside before the tender one', async () => {
    const bank = await bankWithRoles(ctx.app, ctx.db); // last frost 05-20, margin 7
    const plan = (key: string, start: 'indoors' | 'direct') =>
      speciesId(ctx.db, key).then(async (id) => {
        const res = await bank.grower.agent
          .post(`/api/banks/${bank.bankId}/plan`)
          .send({ season: 2027, speciesId: id, plantsWanted: 4, start });
        expect(res.status).toBe(201);
        return res.body.entry as Entry;
      });
    // Purdue Extension HO-203 (after University of Illinois VC-14): lettuce very hardy, 4–6 weeks
    // before the average frost-free date; tomato and snap bean tender, on or after it.
    const lettuce = await plan('lettuce', 'indoors');
    const tomato = await plan('tomato', 'indoors');
    expect(lettuce.hardiness).toBe('hardy');
    expect(tomato.hardiness).toBe('tender');
    // Lettuce sown 6–4 weeks before 20 May (8–22 Apr), out no sooner than 21 days after its last
    // sowing day (Hilum's rule): 13 May. Tomato out 20 May + 7 = 27 May.
    expect(lettuce.transplantOn).toBe('2027-05-13');
    expect(tomato.transplantOn).toBe('2027-05-27');
    expect(lettuce.transplantOn! < tomato.transplantOn!).toBe(true);
    // Sown outside: lettuce from 6 weeks before the frost (8 Apr), snap bean after it plus margin (27 May).
    const lettuceOut = await plan('lettuce', 'direct');
    const bean = await plan('bean', 'direct');
    expect(lettuceOut).toMatchObject({ sowFrom: '2027-04-08', sowTo: '2027-04-22' });
    expect(bean).toMatchObject({ sowFrom: '2027-05-27', sowTo: '2027-06-17' });
  });

  describe('when a sowing is marked', () => {
    let bank: Awaited<ReturnType<typeof bankWithRoles>>;
    let entry: Entry;
    let lotId: string;
    const sown = () => `/api/banks/${bank.bankId}/plan/${entry.id}/sown`;
    const onHand = async () =>
      (await bank.viewer.agent.get(`/api/banks/${bank.bankId}/lots/${lotId}`)).body.lot.seedsOnHand as number;
    beforeAll(async () => {
      bank = await bankWithRoles(ctx.app, ctx.db);
      lotId = await testedLot(bank, 'tomato');
      entry = (
        await bank.grower.agent.post(`/api/banks/${bank.bankId}/plan`).send({
          season: 2027,
          speciesId: await speciesId(ctx.db, 'tomato'),
          plantsWanted: 6,
          start: 'indoors',
          lotId,
        })
      ).body.entry;
      expect(entry).toMatchObject({ sowFrom: '2027-03-25', sowTo: '2027-04-08' });
    });

    it('without a date, then it is 400 naming the date, and no seeds move', async () => {
      const before = await onHand();
      const res = await bank.grower.agent.post(sown()).send({});
      expect(res.status).toBe(400);
      expect(res.body.error.fields).toEqual({ date: 'Choose the day it was sown.' });
      const noBody = await bank.grower.agent.post(sown());
      expect(noBody.status).toBe(400);
      expect(await onHand()).toBe(before);
    });

    it('on a day after the bank’s today, then it is 422', async () => {
      const res = await bank.grower.agent.post(sown()).send({ date: '2027-04-02', confirm: true });
      expect(res.status).toBe(422);
      expect(res.body.error.fields.date).toMatch(/today or an earlier date/);
    });

    it('on a day outside the window, then it asks first (409 with the window in words), and confirmed it is recorded', async () => {
      const before = await onHand();
      const asked = await bank.grower.agent.post(sown()).send({ date: '2027-03-01' });
      expect(asked.status).toBe(409);
      expect(asked.body.error.code).toBe('outside_window');
      expect(asked.body.error.message).toMatch(
        /1 Mar 2027 is before this sowing window \(25 Mar 2027 – 8 Apr 2027\)/,
      );
      expect(asked.body.error.fields.date).toBe('Outside the sowing window, 25 Mar 2027 – 8 Apr 2027.');
      expect(await onHand()).toBe(before);
      expect((await bank.grower.agent.post(sown()).send({ date: '2027-03-01', confirm: 'yes' })).status).toBe(
        400,
      );
      const confirmed = await bank.grower.agent.post(sown()).send({ date: '2027-03-01', confirm: true });
      expect(confirmed.status).toBe(200);
      expect(confirmed.body.entry.sownOn).toBe('2027-03-01');
      expect(before - (await onHand())).toBe(entry.seedsToSow);
    });
  });

  describe('when a crop is sown in succession', () => {
    let bank: Awaited<ReturnType<typeof bankWithRoles>>;
    let made: Entry[];
    const plan = () => `/api/banks/${bank.bankId}/plan`;
    beforeAll(async () => {
      bank = await bankWithRoles(ctx.app, ctx.db);
      // A bank with an early last frost, 25 Apr, so the first lettuce sowings fall before 1 Apr.
      expect(
        (await bank.owner.agent.patch(`/api/banks/${bank.bankId}`).send({ lastFrost: '04-25' })).status,
      ).toBe(200);
      const lotId = await testedLot(bank, 'lettuce');
      const res = await bank.grower.agent.post(plan()).send({
        season: 2027,
        speciesId: await speciesId(ctx.db, 'lettuce'),
        plantsWanted: 10,
        start: 'direct',
        lotId,
        succession: { sowings: 4, everyWeeks: 2 },
      });
      expect(res.status).toBe(201);
      made = res.body.entries;
      expect(res.body.entry.id).toBe(made[0]!.id);
    });

    it('then each sowing is an entry with its own dates and seeds, two weeks after the one before', () => {
      // Lettuce very hardy (Purdue HO-203): outside 6–4 weeks before 25 Apr, 14–28 Mar; then every 14 days.
      expect(made.map((e) => [e.sowFrom, e.sowTo])).toEqual([
        ['2027-03-14', '2027-03-28'],
        ['2027-03-28', '2027-04-11'],
        ['2027-04-11', '2027-04-25'],
        ['2027-04-25', '2027-05-09'],
      ]);
      expect(made.map((e) => e.succession?.number)).toEqual([1, 2, 3, 4]);
      expect(made.every((e) => e.succession?.of === 4 && e.succession.everyWeeks === 2)).toBe(true);
      expect(new Set(made.map((e) => e.succession?.id)).size).toBe(1);
      expect(made.every((e) => (e.seedsToSow ?? 0) > 0)).toBe(true);
    });

    it('then a sowing is marked sown on its own, and one taken out leaves the others', async () => {
      const second = made[1]!;
      const res = await bank.grower.agent.post(`${plan()}/${second.id}/sown`).send({ date: '2027-03-30' });
      expect(res.status).toBe(200);
      expect((await bank.grower.agent.delete(`${plan()}/${made[3]!.id}`)).status).toBe(204);
      const items = (await bank.viewer.agent.get(`${plan()}?season=2027`)).body.items as Entry[];
      expect(items.map((e) => [e.succession?.number, e.succession?.of, e.sownOn])).toEqual([
        [1, 3, null],
        [2, 3, '2027-03-30'],
        [3, 3, null],
      ]);
    });

    it('when the succession is not a sensible one, then it is 400 naming the field', async () => {
      const res = await bank.grower.agent.post(plan()).send({
        season: 2027,
        speciesId: await speciesId(ctx.db, 'lettuce'),
        plantsWanted: 10,
        start: 'direct',
        succession: { sowings: 1, everyWeeks: 0 },
      });
      expect(res.status).toBe(400);
      expect(res.body.error.fields).toMatchObject({
        'succession.sowings': 'A succession is at least 2 sowings.',
        'succession.everyWeeks': 'At least 1 week apart.',
      });
    });
  });

  it('when the frost moved before the sowing day, then the sowing reminder comes on the moved day, not the old one', async () => {
    const bank = await bankWithRoles(ctx.app, ctx.db); // last frost 05-20
    const entry = (
      await bank.grower.agent.post(`/api/banks/${bank.bankId}/plan`).send({
        season: 2027,
        speciesId: await speciesId(ctx.db, 'petunia'),
        plantsWanted: 10,
        start: 'indoors',
      })
    ).body.entry as Entry;
    // Petunia indoors 12–10 weeks before the frost (reference set, common practice): 20 May − 84 = 25 Feb.
    expect(entry.sowFrom).toBe('2027-02-25');
    expect(
      (await bank.owner.agent.patch(`/api/banks/${bank.bankId}`).send({ lastFrost: '05-27' })).status,
    ).toBe(200);
    const reminders = createRemindersService({
      db: ctx.db,
      mailer: ctx.mailer,
      clock: ctx.clock,
      appOrigin: ctx.config.appOrigin,
      viability: createViabilityService({ db: ctx.db }),
    });
    const rows = () =>
      ctx.db
        .selectFrom('reminders')
        .select(['due_on', 'user_id'])
        .where('dedupe_key', 'like', `sowing:${entry.id}:%`)
        .execute();
    try {
      // The old first sowing day: nothing is due for this sowing any more.
      ctx.clock.set('2027-02-25T09:00:00Z');
      await reminders.queueDue(async () => undefined);
      expect(await rows()).toEqual([]);
      // 27 May − 84 = 4 Mar: the moved day, for the owner and the grower (sowing reminders default on).
      ctx.clock.set('2027-03-04T09:00:00Z');
      await reminders.queueDue(async () => undefined);
      const due = await rows();
      expect(due.map((r) => r.due_on)).toEqual(['2027-03-04', '2027-03-04']);
    } finally {
      ctx.clock.set('2027-04-01T09:00:00Z');
    }
  });
});
