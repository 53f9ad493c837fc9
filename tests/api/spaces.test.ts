import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bankWithRoles } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import { speciesId } from '../helpers/lots';

type Bank = Awaited<ReturnType<typeof bankWithRoles>>;

describe('growing spaces', () => {
  let ctx: TestContext;
  let bank: Bank;
  let other: Bank;
  beforeAll(async () => {
    ctx = await createTestContext({ now: '2027-04-01T09:00:00Z' });
    bank = await bankWithRoles(ctx.app, ctx.db);
    other = await bankWithRoles(ctx.app, ctx.db);
  });
  afterAll(() => ctx.close());
  const url = (b: Bank = bank) => `/api/banks/${b.bankId}/spaces`;

  it('when a grower adds, changes and removes a space, then members read it and the list follows', async () => {
    const made = await bank.grower.agent
      .post(url())
      .send({ name: 'Garage rack', capacity: 3, unit: 'trays' });
    expect(made.status).toBe(201);
    // A tray is 72 cells: a 72-cell insert fills a standard 1020 flat (a supplier's plug-flat table).
    expect(made.body.space).toMatchObject({ name: 'Garage rack', capacity: 3, unit: 'trays', cells: 216 });
    const id = made.body.space.id as string;

    const read = await bank.viewer.agent.get(url());
    expect(read.status).toBe(200);
    expect(read.body.items.map((s: { id: string }) => s.id)).toContain(id);

    const changed = await bank.grower.agent.patch(`${url()}/${id}`).send({ capacity: 150, unit: 'cells' });
    expect(changed.status).toBe(200);
    expect(changed.body.space).toMatchObject({
      name: 'Garage rack',
      capacity: 150,
      unit: 'cells',
      cells: 150,
    });

    expect((await bank.owner.agent.delete(`${url()}/${id}`)).status).toBe(204);
    expect((await bank.owner.agent.delete(`${url()}/${id}`)).status).toBe(404);
    const after = await bank.viewer.agent.get(url());
    expect(after.body.items.map((s: { id: string }) => s.id)).not.toContain(id);
  });

  it('when the input is bad, then the answer is a 400 naming the field', async () => {
    const bad = async (body: object, field: string) => {
      const res = await bank.grower.agent.post(url()).send(body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.code).toBe('invalid_input');
      expect(Object.keys(res.body.error.fields)).toContain(field);
    };
    await bad({ capacity: 2, unit: 'trays' }, 'name');
    await bad({ name: '   ', capacity: 2, unit: 'trays' }, 'name');
    await bad({ name: 'x'.repeat(81), capacity: 2, unit: 'trays' }, 'name');
    await bad({ name: 'Shelf', capacity: 0, unit: 'trays' }, 'capacity');
    await bad({ name: 'Shelf', capacity: 1.5, unit: 'trays' }, 'capacity');
    await bad({ name: 'Shelf', capacity: '4', unit: 'trays' }, 'capacity');
    await bad({ name: 'Shelf', capacity: 4, unit: 'pots' }, 'unit');
    const none = await bank.grower.agent.post(url()).set('Content-Type', 'text/plain').send('shelf');
    expect(none.status).toBe(400);

    const made = await bank.grower.agent
      .post(url())
      .send({ name: 'Window ledge', capacity: 40, unit: 'cells' });
    const id = made.body.space.id as string;
    const empty = await bank.grower.agent.patch(`${url()}/${id}`).send({});
    expect(empty.status).toBe(400);
    expect(empty.body.error.message).toMatch(/Nothing to change/);
    const negative = await bank.grower.agent.patch(`${url()}/${id}`).send({ capacity: -3 });
    expect(negative.status).toBe(400);
    expect(negative.body.error.fields).toHaveProperty('capacity');

    // Names are unique in a bank, whatever their case; another bank may use the same name.
    const twin = await bank.grower.agent
      .post(url())
      .send({ name: 'WINDOW LEDGE', capacity: 1, unit: 'trays' });
    expect(twin.status).toBe(409);
    expect(twin.body.error.code).toBe('duplicate_space');
    const elsewhere = await other.grower.agent
      .post(url(other))
      .send({ name: 'Window ledge', capacity: 1, unit: 'trays' });
    expect(elsewhere.status).toBe(201);
    const renamed = await bank.grower.agent
      .post(url())
      .send({ name: 'Hall shelf', capacity: 1, unit: 'trays' });
    const clash = await bank.grower.agent
      .patch(`${url()}/${renamed.body.space.id}`)
      .send({ name: 'window ledge' });
    expect(clash.status).toBe(409);
  });

  it('when a viewer tries to write, then 403; the viewer still reads', async () => {
    const made = await bank.grower.agent.post(url()).send({ name: 'Spare room', capacity: 2, unit: 'trays' });
    const id = made.body.space.id as string;
    const post = await bank.viewer.agent
      .post(url())
      .send({ name: 'Viewer shelf', capacity: 2, unit: 'trays' });
    expect(post.status).toBe(403);
    expect((await bank.viewer.agent.patch(`${url()}/${id}`).send({ capacity: 9 })).status).toBe(403);
    expect((await bank.viewer.agent.delete(`${url()}/${id}`)).status).toBe(403);
    expect((await bank.viewer.agent.get(url())).status).toBe(200);
    expect((await bank.viewer.agent.get(`/api/banks/${bank.bankId}/plan/space?season=2027`)).status).toBe(
      200,
    );
    const still = await bank.viewer.agent.get(url());
    expect(still.body.items.find((s: { id: string }) => s.id === id)).toMatchObject({ capacity: 2 });
  });

  it('when a space of another bank is named, then 404, and outsiders see nothing', async () => {
    const theirs = await other.grower.agent
      .post(url(other))
      .send({ name: 'Their loft', capacity: 5, unit: 'trays' });
    const id = theirs.body.space.id as string;
    // The grower of the first bank, through their own bank's path: no such space there.
    expect((await bank.grower.agent.patch(`${url()}/${id}`).send({ capacity: 1 })).status).toBe(404);
    expect((await bank.grower.agent.delete(`${url()}/${id}`)).status).toBe(404);
    // Through the other bank's path: not a member, so 404 (the bank's existence is not revealed).
    expect((await bank.grower.agent.patch(`${url(other)}/${id}`).send({ capacity: 1 })).status).toBe(404);
    expect((await bank.outsider.agent.get(url())).status).toBe(404);
    expect((await bank.outsider.agent.get(`/api/banks/${bank.bankId}/plan/space`)).status).toBe(404);
    expect((await bank.grower.agent.delete(`${url()}/not-an-id`)).status).toBe(404);
    const mine = await other.viewer.agent.get(url(other));
    expect(mine.body.items.find((s: { id: string }) => s.id === id)).toMatchObject({ capacity: 5 });
  });

  it('when the season is not a year, then 400', async () => {
    for (const season of ['abc', '1800', '2027.5']) {
      const res = await bank.viewer.agent.get(`/api/banks/${bank.bankId}/plan/space?season=${season}`);
      expect(res.status, season).toBe(400);
      expect(res.body.error.fields).toHaveProperty('season');
    }
  });
});

describe('the season’s room under the lights', () => {
  let ctx: TestContext;
  let bank: Bank;
  let box: string;
  beforeAll(async () => {
    // Today 1 Apr 2027 (the bank's time zone); the bank's last frost 20 May, margin 7 days.
    ctx = await createTestContext({ now: '2027-04-01T09:00:00Z' });
    bank = await bankWithRoles(ctx.app, ctx.db);
  });
  afterAll(() => ctx.close());
  const base = () => `/api/banks/${bank.bankId}`;

  it('when a small plan is laid out, then the weekly cells match the arithmetic by hand', async () => {
    const tomato = await speciesId(ctx.db, 'tomato');
    const cucumber = await speciesId(ctx.db, 'cucumber');
    const bean = await speciesId(ctx.db, 'bean');
    const g = bank.grower.agent;
    const plan = (body: object) => g.post(`${base()}/plan`).send({ season: 2027, ...body });
    // The arithmetic below has cucumber go out with the tomatoes (tender); the reference set has it
    // very tender (a week later), so this bank says tender for it.
    expect(
      (await g.patch(`${base()}/species/${cucumber}`).send({ traits: { hardiness: 'tender' } })).status,
    ).toBe(200);
    const lot = await g.post(`${base()}/lots`).send({
      speciesId: tomato,
      variety: 'Spaced',
      origin: 'saved',
      harvestDate: '2026-09-01',
      seedCount: 100,
    });
    const a = (await plan({ speciesId: tomato, plantsWanted: 10, start: 'indoors' })).body.entry;
    const c = (await plan({ speciesId: tomato, plantsWanted: 5, start: 'indoors', lotId: lot.body.lot.id }))
      .body.entry;
    const b = (await plan({ speciesId: cucumber, plantsWanted: 6, start: 'indoors' })).body.entry;
    const d = await plan({ speciesId: bean, plantsWanted: 30, start: 'direct' });
    expect(d.status).toBe(201);
    // Round seeds to sow, so the seed-tray cells are easy to follow (the lots are untested, so
    // the plan has none of its own).
    await ctx.db.updateTable('plan_entries').set({ seeds_to_sow: 12 }).where('id', '=', a.id).execute();
    await ctx.db.updateTable('plan_entries').set({ seeds_to_sow: 8 }).where('id', '=', c.id).execute();
    await ctx.changeFeed.sync();
    const sown = await g.post(`${base()}/plan/${c.id}/sown`).send({ date: '2027-03-29' });
    expect(sown.status).toBe(200);

    // The inputs, as the plan lists them (its rules: tomato sown 8–6 weeks and cucumber 4–2 weeks
    // before the 20 May frost, hardened off from the frost date + 7-day margin − 7 days).
    const listed = (await bank.viewer.agent.get(`${base()}/plan?season=2027`)).body.items as {
      id: string;
      sowFrom: string;
      hardenFrom: string;
      sownOn: string | null;
    }[];
    const byId = new Map(listed.map((e) => [e.id, e]));
    expect(byId.get(a.id)).toMatchObject({ sowFrom: '2027-03-25', hardenFrom: '2027-05-20', sownOn: null });
    expect(byId.get(c.id)).toMatchObject({ hardenFrom: '2027-05-20', sownOn: '2027-03-29' });
    expect(byId.get(b.id)).toMatchObject({ sowFrom: '2027-04-22', hardenFrom: '2027-05-20' });

    await g.post(`${base()}/spaces`).send({ name: 'Shelf', capacity: 1, unit: 'trays' });
    box = (await g.post(`${base()}/spaces`).send({ name: 'Box', capacity: 10, unit: 'cells' })).body.space.id;

    const res = await bank.viewer.agent.get(`${base()}/plan/space?season=2027`);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ season: 2027, unit: 'cells', cellsPerTray: 72, weekStartsOn: 'monday' });
    expect(res.body.spaces.map((s: { name: string; cells: number }) => [s.name, s.cells])).toEqual([
      ['Shelf', 72],
      ['Box', 10],
    ]);

    /*
     * By hand. Units: cells of a 72-cell tray (a 72-cell insert fills a 1020 flat: a supplier's
     * plug-flat table). Capacity: 1 tray = 72 cells + 10 cells = 82.
     * Tomato: potted up 3 weeks after sowing (first true leaves at 2–3 weeks, read on a gardening
     * page; Hilum takes the upper end) into a pot of 4 cells (a flat holds 18 pots: 72 ÷ 18 = 4).
     * Cucumber: sown straight into its pot (vine crops go into peat pots, Penn State Extension
     * 2012), 4 cells a plant. Beans sown direct take no room indoors.
     *   A tomato, 12 seeds, 10 plants, sown 25 Mar (not yet: its window's first day):
     *     seed tray 12 cells 25 Mar – 14 Apr; pots 10 × 4 = 40 cells 15 Apr (25 Mar + 21) – 19 May.
     *   C tomato, 8 seeds, 5 plants, sown on 29 Mar (its sown date, not the window's 25 Mar):
     *     seed tray 8 cells 29 Mar – 18 Apr; pots 5 × 4 = 20 cells 19 Apr (29 Mar + 21) – 19 May.
     *   B cucumber, 6 plants, sown 22 Apr: pots 6 × 4 = 24 cells 22 Apr – 19 May.
     * All go out to harden off on 20 May. Weeks start on Monday; a week's use is its busiest day:
     *   22 Mar: A 12 from the 25th                    = 12
     *   29 Mar: A 12 + C 8                            = 20
     *    5 Apr: A 12 + C 8                            = 20
     *   12 Apr: 12–14th 12 + 8; 15–18th A 40 + C 8    = 48
     *   19 Apr: 19–21st 40 + C 20; 22nd on + B 24     = 84  > 82: overflow
     *   26 Apr, 3 May, 10 May: 40 + 20 + 24           = 84  overflow
     *   17 May: 17–19th the same; all out on the 20th = 84  overflow
     */
    const weeks = [
      ['2027-03-22', 12],
      ['2027-03-29', 20],
      ['2027-04-05', 20],
      ['2027-04-12', 48],
      ['2027-04-19', 84],
      ['2027-04-26', 84],
      ['2027-05-03', 84],
      ['2027-05-10', 84],
      ['2027-05-17', 84],
    ] as const;
    expect(res.body.weeks).toEqual(
      weeks.map(([weekStart, used]) => ({ weekStart, used, capacity: 82, overflow: used > 82 })),
    );
    expect(res.body.entries.find((e: { entryId: string }) => e.entryId === a.id)).toMatchObject({
      sowOn: '2027-03-25',
      potUpOn: '2027-04-15',
      freeOn: '2027-05-20',
      trayCells: 12,
      potCells: 40,
    });
    expect(res.body.entries.map((e: { entryId: string }) => e.entryId)).not.toContain(d.body.entry.id);
  });

  it('when the room just fits, then no week overflows (overflow is used > capacity)', async () => {
    const g = bank.grower.agent;
    await g.patch(`${base()}/spaces/${box}`).send({ capacity: 12 });
    const res = await bank.viewer.agent.get(`${base()}/plan/space?season=2027`);
    // 72 + 12 = 84 cells, the busiest weeks' 84 exactly.
    expect(res.body.weeks.map((w: { capacity: number }) => w.capacity)).toEqual(new Array(9).fill(84));
    expect(res.body.weeks.some((w: { overflow: boolean }) => w.overflow)).toBe(false);
  });

  it('when the season has no indoor sowings, then there are no weeks, and the spaces are still listed', async () => {
    const res = await bank.viewer.agent.get(`${base()}/plan/space?season=2031`);
    expect(res.status).toBe(200);
    expect(res.body.weeks).toEqual([]);
    expect(res.body.spaces).toHaveLength(2);
  });
});
