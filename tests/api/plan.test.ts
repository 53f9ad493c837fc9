import ical from 'node-ical';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bankWithRoles } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import { finishedAssay, speciesId } from '../helpers/lots';

describe('the season plan', () => {
  let ctx: TestContext;
  let bank: Awaited<ReturnType<typeof bankWithRoles>>;
  let tomato: string;
  let goodLot: string;
  let smallLot: string;
  beforeAll(async () => {
    ctx = await createTestContext({ now: '2026-12-01T09:00:00Z' });
    bank = await bankWithRoles(ctx.app, ctx.db); // last frost 05-20, margin 7 days (the default)
    tomato = await speciesId(ctx.db, 'tomato');
    const lot = (variety: string, seeds: number) =>
      bank.grower.agent
        .post(`/api/banks/${bank.bankId}/lots`)
        .send({ speciesId: tomato, variety, origin: 'saved', harvestDate: '2025-09-01', seedCount: seeds });
    goodLot = (await lot('Good', 500)).body.lot.id;
    smallLot = (await lot('Small but fine', 110)).body.lot.id;
    await finishedAssay(bank.grower.agent, bank.bankId, goodLot, '2026-02-01', [
      { sown: 50, germinated: 46 },
      { sown: 50, germinated: 45 },
    ]);
    await finishedAssay(bank.grower.agent, bank.bankId, smallLot, '2026-02-01', [
      { sown: 50, germinated: 40 },
    ]);
  });
  afterAll(() => ctx.close());
  const url = () => `/api/banks/${bank.bankId}/plan`;

  it('when an indoor tomato sowing is planned, then the dates count back from the frost date and the best lot is suggested', async () => {
    const res = await bank.grower.agent
      .post(url())
      .send({ season: 2027, speciesId: tomato, plantsWanted: 12, start: 'indoors' });
    expect(res.status).toBe(201);
    const e = res.body.entry;
    // Tomato indoor window 8–6 weeks before the last frost (reference set, common practice):
    // 2027-05-20 − 56 days = 2027-03-25; − 42 days = 2027-04-08.
    expect(e).toMatchObject({ sowFrom: '2027-03-25', sowTo: '2027-04-08', lotId: goodLot, lotChosen: false });
    // Plant out after the frost date + 7-day margin, harden off the week before.
    expect(e).toMatchObject({ transplantOn: '2027-05-27', hardenFrom: '2027-05-20' });
    // Seedlings expected from 6 days after the first sowing to 8 days after the last (tomato days
    // to emerge at 77 °F and 68 °F, Harrington & Minges 1954 in Knott's Handbook): 03-31 to 04-16.
    expect(e).toMatchObject({ expectFrom: '2027-03-31', expectBy: '2027-04-16' });
    const sow = await bank.viewer.agent.get(
      `/api/banks/${bank.bankId}/lots/${goodLot}/seeds-to-sow?plants=12&on=2027-03-25`,
    );
    expect(e.seedsToSow).toBe(sow.body.seeds);
    expect(e.notes.join(' ')).toMatch(/Suggested lot/);
  });

  it('when an entry is marked sown, then the seeds leave the lot once; twice is 409; undo puts them back', async () => {
    const { body } = await bank.grower.agent
      .post(url())
      .send({ season: 2027, speciesId: tomato, plantsWanted: 6, start: 'indoors', lotId: smallLot });
    const entry = body.entry;
    expect(entry.lotId).toBe(smallLot);
    const before = (await bank.viewer.agent.get(`/api/banks/${bank.bankId}/lots/${smallLot}`)).body.lot
      .seedsOnHand;
    // 30 Nov 2026 is before the 2027 window: confirmed.
    const sown = await bank.grower.agent
      .post(`${url()}/${entry.id}/sown`)
      .send({ date: '2026-11-30', confirm: true });
    expect(sown.status).toBe(200);
    expect(sown.body.entry.sownOn).toBe('2026-11-30');
    const after = (await bank.viewer.agent.get(`/api/banks/${bank.bankId}/lots/${smallLot}`)).body.lot
      .seedsOnHand;
    expect(before - after).toBe(entry.seedsToSow);
    // The entry carries the lot's stock, before and after the sowing.
    expect(entry.seedsOnHand).toBe(before);
    expect(sown.body.entry.seedsOnHand).toBe(after);
    const again = await bank.grower.agent
      .post(`${url()}/${entry.id}/sown`)
      .send({ date: '2026-11-30', confirm: true });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('already_sown');
    expect(
      (await bank.viewer.agent.get(`/api/banks/${bank.bankId}/lots/${smallLot}`)).body.lot.seedsOnHand,
    ).toBe(after);
    const undone = await bank.grower.agent.delete(`${url()}/${entry.id}/sown`);
    expect(undone.body.entry.sownOn).toBeNull();
    expect(
      (await bank.viewer.agent.get(`/api/banks/${bank.bankId}/lots/${smallLot}`)).body.lot.seedsOnHand,
    ).toBe(before);
  });

  it('when no lot has enough seed, then the entry warns', async () => {
    const res = await bank.grower.agent
      .post(url())
      .send({ season: 2027, speciesId: tomato, plantsWanted: 2000, start: 'indoors' });
    expect(res.status).toBe(201);
    expect(res.body.entry.notes.join(' ')).toMatch(/No lot has enough seed/);
    // The stock it falls short of is on the entry, so the planner can say so before marking it sown.
    expect(res.body.entry.seedsOnHand).toBeLessThan(res.body.entry.seedsToSow);
    const short = await bank.grower.agent
      .post(`${url()}/${res.body.entry.id}/sown`)
      .send({ date: '2026-11-30', confirm: true });
    expect(short.status).toBe(409);
    expect(short.body.error.code).toBe('stock_below_zero');
  });

  it('when the plan is read without a season, then it is the coming spring’s on the bank’s calendar', async () => {
    // The test clock reads 1 Dec 2026: from September on, the season planned is next year’s.
    const res = await bank.viewer.agent.get(url());
    expect(res.status).toBe(200);
    expect(res.body.season).toBe(2027);
  });

  it('when the bank has no frost date, then planning is 422 saying where to set it', async () => {
    const other = await bankWithRoles(ctx.app, ctx.db);
    await other.owner.agent.patch(`/api/banks/${other.bankId}`).send({ lastFrost: null });
    const res = await other.grower.agent
      .post(`/api/banks/${other.bankId}/plan`)
      .send({ season: 2027, speciesId: tomato, plantsWanted: 4, start: 'indoors' });
    expect(res.status).toBe(422);
    expect(res.body.error.message).toMatch(/frost date in Settings/);
  });

  it('when the season calendar is downloaded, then a real iCalendar parser reads its events', async () => {
    const res = await bank.viewer.agent.get(`/api/banks/${bank.bankId}/plan.ics?season=2027`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/text\/calendar/);
    const events = Object.values(ical.sync.parseICS(res.text)).filter(
      (e) => e?.type === 'VEVENT',
    ) as ical.VEvent[];
    const sow = events.find((e) => String(e.summary).startsWith('Sow Tomato'));
    expect(sow).toBeDefined();
    const start = sow!.start as Date;
    expect([start.getUTCFullYear(), start.getUTCMonth() + 1, start.getUTCDate()]).toEqual([2027, 3, 25]);
    expect(events.some((e) => String(e.summary).startsWith('Plant out Tomato'))).toBe(true);
  });
});
