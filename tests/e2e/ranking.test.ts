import type { Page } from 'playwright-core';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import type { RankingItem } from '#shared/schemas/viability';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '#server/demo/demo-people';
import { browserSuite, chromiumPath, signInAt, signInThroughApi } from '../helpers/browser';
import { journey, journeyOfTests, seriousViolations } from '../helpers/journey';
import { finishedAssay, speciesId } from '../helpers/lots';

// The people and the bank are the invented demo scenario of server/demo/demo-people.ts; the lots
// below are made here (codes RNK-…), so the test does not lean on whatever else the demo holds.
const grower = DEMO_ACCOUNTS.find((a) => a.role === 'grower')!;
const viewer = DEMO_ACCOUNTS.find((a) => a.role === 'viewer')!;

const NOW = '2026-12-01T09:00:00Z';
// The demo bank's last frost is 24 May (demo-people.ts); Hilum's default sowing date is eight weeks
// (56 days) before the next one: 24 May 2027 − 56 days = 29 March 2027 (calendar arithmetic:
// 24 days back to 30 April, 30 more to 31 March, 2 more to 29 March).
const ON = '2027-03-29';

// 390 × 844 CSS pixels: the viewport of a common mid-size phone held upright (from memory).
const PHONE = { width: 390, height: 844 };
const DESKTOP = { width: 1280, height: 900 };

describe.skipIf(!chromiumPath)('the ranking and the decline chart in Chromium', () => {
  const suite = browserSuite({ now: NOW, demo: 'people' });
  const lots: Record<'good' | 'old' | 'new', string> = { good: '', old: '', new: '' };
  let ranking: RankingItem[];

  beforeAll(async () => {
    const agent = request.agent(suite.server.app);
    expect(
      (await agent.post('/api/auth/login').send({ email: grower.email, password: DEMO_PASSWORD })).status,
    ).toBe(200);
    const newLot = async (
      key: string,
      code: string,
      variety: string,
      harvestDate: string,
      seedCount: number,
    ) => {
      const res = await agent.post(`/api/banks/${suite.bankId}/lots`).send({
        speciesId: await speciesId(suite.server.db, key),
        variety,
        origin: 'saved',
        harvestDate,
        seedCount,
        code,
      });
      if (res.status !== 201) throw new Error(`lot not created: ${JSON.stringify(res.body)}`);
      return res.body.lot.id as string;
    };
    // A fresh tomato lot that came up well, a lettuce lot tested young and again four years on,
    // and a marigold lot nobody has tested yet (invented lots, like all demo data).
    lots.good = await newLot('tomato', 'RNK-GOOD', 'Bench Gold', '2026-08-20', 800);
    await finishedAssay(agent, suite.bankId, lots.good, '2026-09-15', [
      { sown: 50, germinated: 48 },
      { sown: 50, germinated: 47 },
    ]);
    lots.old = await newLot('lettuce', 'RNK-OLD', 'Old Leaf', '2022-07-15', 2000);
    await finishedAssay(agent, suite.bankId, lots.old, '2023-02-01', [
      { sown: 50, germinated: 46 },
      { sown: 50, germinated: 44 },
    ]);
    await finishedAssay(agent, suite.bankId, lots.old, '2026-10-01', [
      { sown: 50, germinated: 22 },
      { sown: 50, germinated: 20 },
    ]);
    lots.new = await newLot('marigold', 'RNK-NEW', 'Untried', '2026-09-01', 300);
    // One more lot outside the RNK- codes, for the search to leave out.
    await newLot('marigold', 'SIDE-1', 'Left Out', '2026-09-01', 300);

    // The server's own ranking for the default sowing date: what the table must show.
    const res = await agent.get(`/api/banks/${suite.bankId}/ranking?on=${ON}`);
    expect(res.status).toBe(200);
    ranking = (res.body.items as RankingItem[]).filter((i) => i.code.startsWith('RNK-'));
    expect(ranking).toHaveLength(3);
  });

  const item = (code: string) => ranking.find((i) => i.code === code)!;

  const signIn = (page: Page, email: string) => signInAt(page, suite.server.baseUrl, email, suite.bankId);
  const scrollWidth = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth);
  const rowCodes = (page: Page) =>
    page.locator('tbody tr[data-lot]').evaluateAll((rows) => rows.map((r) => r.getAttribute('data-lot')));

  // One test per step, on one page: the whole journey in one test ran near the 60 s timeout.
  describe('when a viewer sorts the ranking by projected germination and filters to "sow", then the rows follow the server’s projections and the view survives a reload', () => {
    it('the server’s ranking holds the three lots as made', () => {
      // The tomato lot: 95 of 100 germinated two months after harvest, far above the 75% minimum for
      // tomato seed (7 CFR 201.31), so "sow"; the lot nobody tested gets only the species' guess, so
      // "test first" (docs/decisions.md).
      expect(item('RNK-GOOD')).toMatchObject({ recommendation: 'sow', lastPercent: 95 });
      expect(item('RNK-NEW')).toMatchObject({
        recommendation: 'test-first',
        estimateOnly: true,
        lastPercent: null,
      });
      // Two tests four years apart: the lettuce lot's own decline, projected below its last test.
      expect(item('RNK-OLD').basis).toBe('lot');
      expect(item('RNK-OLD').projectedPercent!).toBeLessThan(42);
    });

    const j = journeyOfTests(
      'ranking-desktop',
      async () => {
        const context = await suite.browser.newContext({ viewport: DESKTOP });
        await context.clock.setFixedTime(new Date(NOW));
        return context;
      },
      { first: { title: 'sign in as viewer', run: (page) => signIn(page, viewer.email) } },
    );

    j.step('open the ranking', async (page) => {
      await page.getByRole('navigation', { name: 'Bank' }).getByRole('link', { name: 'Lots' }).click();
      await page.waitForURL(`${suite.server.baseUrl}/banks/${suite.bankId}/lots`);
      await expect.poll(() => page.getByRole('heading', { level: 1 }).innerText()).toBe('Lots');
      await expect.poll(() => page.getByLabel('Sowing date').inputValue()).toBe(ON);
      await expect.poll(async () => (await rowCodes(page)).includes('SIDE-1')).toBe(true);
      await page.getByRole('searchbox', { name: 'Search' }).fill('RNK-');
      await page.getByRole('searchbox', { name: 'Search' }).press('Enter');
      await expect
        .poll(async () => (await rowCodes(page)).sort())
        .toEqual(['RNK-GOOD', 'RNK-NEW', 'RNK-OLD']);
      expect(await page.getByText(/projected to/).innerText()).toContain('29 Mar 2027');
      expect(await page.getByRole('link', { name: 'New lot' }).count()).toBe(0);
      expect(await scrollWidth(page)).toBeLessThanOrEqual(DESKTOP.width);
    });

    j.step('sort by projected germination', async (page) => {
      await page
        .getByRole('columnheader', { name: /Projected/ })
        .getByRole('button')
        .click();
      await expect
        .poll(() => page.getByRole('columnheader', { name: /Projected/ }).getAttribute('aria-sort'))
        .toBe('descending');
      // Highest projection first: the order of the server's numbers (an untested lot's guess included).
      const expected = [...ranking]
        .sort((a, b) => (b.projectedPercent ?? -1) - (a.projectedPercent ?? -1))
        .map((i) => i.code);
      expect(expected.indexOf('RNK-GOOD')).toBeLessThan(expected.indexOf('RNK-OLD'));
      await expect.poll(() => rowCodes(page)).toEqual(expected);
      // Each bar draws the server's interval and estimate.
      const old = item('RNK-OLD');
      expect(
        await page.locator('tr[data-lot="RNK-OLD"] [data-projection]').getAttribute('data-projection'),
      ).toBe(
        `${Math.round(old.projectedLow!)}-${Math.round(old.projectedPercent!)}-${Math.round(old.projectedHigh!)}`,
      );
      // The untested lot's bar is the species' guess, as wide as the server says.
      const fresh = item('RNK-NEW');
      expect(
        await page.locator('tr[data-lot="RNK-NEW"] [data-projection]').getAttribute('data-projection'),
      ).toBe(
        `${Math.round(fresh.projectedLow!)}-${Math.round(fresh.projectedPercent!)}-${Math.round(fresh.projectedHigh!)}`,
      );
    });

    j.step('filter to sow', async (page) => {
      await page.getByRole('combobox', { name: 'Advice' }).selectOption('sow');
      await expect.poll(() => rowCodes(page)).toEqual(['RNK-GOOD']);
      const url = new URL(page.url());
      expect(url.searchParams.get('rec')).toBe('sow');
      expect(url.searchParams.get('sort')).toBe('projected:desc');
      expect(url.searchParams.get('q')).toBe('RNK-');
      // The reason shows on hover (title) and opens on a press.
      const badge = page.locator('tr[data-lot="RNK-GOOD"]').getByRole('button', { name: /Sow/ });
      expect(await badge.getAttribute('title')).toBe(item('RNK-GOOD').reason);
      await badge.click();
      const popover = page.getByRole('dialog', { name: /RNK-GOOD/ });
      await expect.poll(() => popover.innerText()).toContain(item('RNK-GOOD').reason);
      await page.keyboard.press('Escape');
      await expect.poll(() => popover.isVisible()).toBe(false);
    });

    j.step('reload the shared view', async (page) => {
      await page.reload();
      await expect.poll(() => rowCodes(page)).toEqual(['RNK-GOOD']);
      expect(await page.getByRole('combobox', { name: 'Advice' }).inputValue()).toBe('sow');
      expect(await page.getByRole('columnheader', { name: /Projected/ }).getAttribute('aria-sort')).toBe(
        'descending',
      );
      expect(await seriousViolations(page)).toEqual([]);
    });

    j.step('tick a lot for labels', async (page) => {
      await page.getByRole('checkbox', { name: 'Select RNK-GOOD' }).check();
      // One lot ticked: the labels page's own link, "Print label", for that lot.
      const link = page.getByRole('link', { name: /^Print/ });
      expect(await link.getAttribute('href')).toBe(`/banks/${suite.bankId}/labels?lots=${lots.good}`);
    });

    j.step('hide a column', async (page) => {
      await page.getByRole('button', { name: /Columns/ }).click();
      await page.getByRole('checkbox', { name: 'Mean days' }).uncheck();
      await expect.poll(() => page.getByRole('columnheader', { name: /Mean days/ }).count()).toBe(0);
      expect(new URL(page.url()).searchParams.get('hide')).toBe('meanDays');
      // The panel stays open for the next tick; Escape closes it.
      expect(await page.getByRole('checkbox', { name: 'Age' }).isVisible()).toBe(true);
      await page.keyboard.press('Escape');
      await expect.poll(() => page.getByRole('checkbox', { name: 'Age' }).isVisible()).toBe(false);
    });

    j.step('open the lot and see its decline', async (page) => {
      await page.getByRole('link', { name: 'RNK-GOOD' }).click();
      await page.waitForURL(new RegExp(`/banks/${suite.bankId}/lots/${lots.good}`));
      const chart = page.locator('figure[data-chart="decline"] svg.recharts-surface');
      await chart.waitFor();
      // The fitted curve is drawn as a path, and the one test as one dot.
      // The API sends the curve as 41 points from age 0, so the path has 40 segments after its start.
      const d = (await chart.locator('.recharts-line-curve').getAttribute('d')) ?? '';
      expect(d).toMatch(/^M[\d.]+,[\d.]+/);
      expect(d.match(/[CL]/g)).toHaveLength(40);
      await expect.poll(() => chart.locator('.recharts-scatter-symbol').count()).toBe(1);
    });

    j.step('the declining lot', async (page) => {
      await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/${lots.old}`);
      const chart = page.locator('figure[data-chart="decline"] svg.recharts-surface');
      await chart.waitFor();
      await expect.poll(() => chart.locator('.recharts-scatter-symbol').count()).toBe(2);
      expect(await chart.locator('.recharts-errorBar').count()).toBeGreaterThan(0);
      const viability = page.locator('#lot-viability');
      await expect.poll(() => viability.innerText()).toContain('fitted to this lot’s tests');
      // 90 of 100 and 42 of 100; 95% Wilson intervals computed here and on the page alike.
      const assays = await page.getByRole('list', { name: 'Tests in the chart' }).innerText();
      expect(assays).toContain('90% (90 of 100');
      expect(assays).toContain('42% (42 of 100');

      // The calculator asks the server for 12 plants at the bank's assurance (90% by default).
      await expect.poll(() => page.getByTestId('seeds-to-sow').innerText()).toMatch(/^sow \d+ seeds$/);
      const seeds = Number((await page.getByTestId('seeds-to-sow').innerText()).replace(/\D/g, ''));
      const viewerAgent = request.agent(suite.server.app);
      await viewerAgent.post('/api/auth/login').send({ email: viewer.email, password: DEMO_PASSWORD });
      const api = await viewerAgent.get(
        `/api/banks/${suite.bankId}/lots/${lots.old}/seeds-to-sow?plants=12&assurance=0.9&on=${ON}`,
      );
      expect(api.status).toBe(200);
      expect(seeds).toBe(api.body.seeds);
      // With germination at a third or so, 12 plants need well over 12 seeds.
      expect(seeds).toBeGreaterThan(24);
      // A viewer reads, and plans nothing.
      expect(await page.getByRole('button', { name: /Add to the/ }).count()).toBe(0);
      expect(await scrollWidth(page)).toBeLessThanOrEqual(DESKTOP.width);
    });
  });

  it('when a viewer opens the ranking on a phone, then lots show as cards whose advice opens its reason, with no sideways scroll', async () => {
    const context = await suite.browser.newContext({ viewport: PHONE, hasTouch: true, isMobile: true });
    await context.clock.setFixedTime(new Date(NOW));
    const page = await context.newPage();
    const j = journey('ranking-phone', page);
    await signIn(page, viewer.email);

    await j.step('cards', async () => {
      await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots?q=RNK-`);
      const cards = page.getByRole('list', { name: /Lots ranked/ }).locator('li[data-lot]');
      await expect.poll(() => cards.count()).toBe(3);
      expect(await page.locator('table').count()).toBe(0);
      expect(await scrollWidth(page)).toBeLessThanOrEqual(PHONE.width);
    });

    await j.step('tap the advice', async () => {
      const card = page.locator('li[data-lot="RNK-NEW"]');
      const badge = card.getByRole('button', { name: /Test first/ });
      expect(await badge.getAttribute('aria-expanded')).toBe('false');
      await badge.tap();
      await expect.poll(() => badge.getAttribute('aria-expanded')).toBe('true');
      await expect.poll(() => card.innerText()).toContain(item('RNK-NEW').reason);
      expect(await scrollWidth(page)).toBeLessThanOrEqual(PHONE.width);
    });

    await j.step('the lot page', async () => {
      await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/${lots.old}`);
      await page.locator('figure[data-chart="decline"] svg.recharts-surface').waitFor();
      await expect.poll(() => page.getByTestId('seeds-to-sow').innerText()).toMatch(/^sow \d+ seeds$/);
      expect(await scrollWidth(page)).toBeLessThanOrEqual(PHONE.width);
    });
    await context.close();
  });

  it('when a grower adds the calculated sowing to the plan, then the plan holds an entry for the lot, its species and the plants wanted', async () => {
    const context = await suite.browser.newContext({ viewport: DESKTOP });
    await context.clock.setFixedTime(new Date(NOW));
    const page = await context.newPage();
    await signIn(page, grower.email);
    await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/${lots.good}`);
    await page.getByLabel('Plants wanted').fill('20');
    await expect.poll(() => page.getByTestId('seeds-to-sow').innerText()).toMatch(/^sow \d+ seeds$/);
    await expect.poll(() => page.getByText(/for 20 plants/).count()).toBeGreaterThan(0);
    await page.getByRole('button', { name: 'Add to the 2027 plan' }).click();
    await expect
      .poll(() => page.getByRole('status').filter({ hasText: 'Added to the 2027 plan' }).count())
      .toBe(1);

    const entries = await suite.server.db
      .selectFrom('plan_entries')
      .select(['season', 'lot_id', 'species_id', 'plants_wanted', 'start'])
      .where('lot_id', '=', lots.good)
      .execute();
    // Tomato starts indoors in the reference set (startMethod 'indoor'), so the entry does too.
    expect(entries).toEqual([
      {
        season: 2027,
        lot_id: lots.good,
        species_id: await speciesId(suite.server.db, 'tomato'),
        plants_wanted: 20,
        start: 'indoors',
      },
    ]);
    await context.close();
  });

  it('when a viewer keeps only swapped lots and searches a source, then the treated swap shows, marked as treated seed', async () => {
    const api = request.agent(suite.server.app);
    await api.post('/api/auth/login').send({ email: grower.email, password: DEMO_PASSWORD });
    const swap = await api.post(`/api/banks/${suite.bankId}/lots`).send({
      speciesId: await speciesId(suite.server.db, 'marigold'),
      variety: 'Coated Gift',
      origin: 'swapped',
      sourceName: 'Brookside table',
      treated: true,
      harvestDate: '2026-08-01',
      seedCount: 120,
      code: 'RNK-SWAP',
    });
    expect(swap.status).toBe(201);
    const context = await suite.browser.newContext({ viewport: DESKTOP });
    await context.clock.setFixedTime(new Date(NOW));
    const page = await context.newPage();
    await signIn(page, viewer.email);
    await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots`);
    await page.getByRole('combobox', { name: 'Origin' }).selectOption('swapped');
    await expect.poll(() => new URL(page.url()).searchParams.get('origin')).toBe('swapped');
    // Every lot left came by swap (the server's own origins), and the one made here is among them.
    const swapped = await api.get(`/api/banks/${suite.bankId}/ranking?on=${ON}`);
    const swappedCodes = (swapped.body.items as RankingItem[])
      .filter((i) => i.origin === 'swapped')
      .map((i) => i.code);
    await expect.poll(async () => (await rowCodes(page)).includes('RNK-SWAP')).toBe(true);
    expect(swappedCodes).toEqual(expect.arrayContaining(await rowCodes(page)));
    await page.getByRole('searchbox', { name: 'Search' }).fill('brookside');
    await expect.poll(() => rowCodes(page)).toEqual(['RNK-SWAP']);
    expect(await page.locator('tr[data-lot="RNK-SWAP"]').innerText()).toContain('treated seed');
    await context.close();
  });

  // Runs last: it fills the bank with lots the tests above would otherwise have to look past.
  describe('when the bank holds 5,000 lots, then the table and the phone cards keep only the rows near the screen in the page', () => {
    const BULK = 5000;
    // Signed in through the API, not the sign-in page: that lands on the overview, which in a bank of
    // 5,000 lots took 36 s to answer on a busy 2-core machine (the subject here is the lots table).
    beforeAll(async () => {
      const marigold = await speciesId(suite.server.db, 'marigold');
      const values = Array.from({ length: BULK }, (_, i) => ({
        bank_id: suite.bankId,
        species_id: marigold,
        code: `BULK-${String(i + 1).padStart(4, '0')}`,
        variety: `Bulk ${i + 1}`,
        origin: 'saved' as const,
        harvest_date: '2025-09-01',
      }));
      for (let i = 0; i < values.length; i += 1000)
        await suite.server.db
          .insertInto('lots')
          .values(values.slice(i, i + 1000))
          .execute();
      // The bank's ranking asked for once before the pages open, as a bank's would have been: its
      // first fit of 5,000 lots took ~30 s on a busy 2-core machine (a server cost, which
      // `npm run bench` times), and the subject here is what the pages draw.
      const agent = request.agent(suite.server.app);
      expect(
        (await agent.post('/api/auth/login').send({ email: viewer.email, password: DEMO_PASSWORD })).status,
      ).toBe(200);
      expect((await agent.get(`/api/banks/${suite.bankId}/ranking?on=${ON}`)).status).toBe(200);
    });

    it('the table, scrolled from the first lot to the last', async () => {
      const context = await suite.browser.newContext({ viewport: DESKTOP });
      await context.clock.setFixedTime(new Date(NOW));
      await signInThroughApi(context, suite.server.baseUrl, viewer.email);
      const page = await context.newPage();
      await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots?q=BULK-&sort=code:asc`);
      await expect
        .poll(() => page.getByText(/projected to/).innerText())
        .toContain(`${BULK.toLocaleString('en')} of`);
      await expect.poll(async () => (await rowCodes(page))[0]).toBe('BULK-0001');
      const rendered = (await rowCodes(page)).length;
      expect(rendered).toBeGreaterThan(5);
      expect(rendered).toBeLessThan(60);
      // Scrolled to the end, the last lot is drawn and the first is gone from the page.
      await page.locator('[data-ranking-scroll]').evaluate((el) => el.scrollTo(0, el.scrollHeight));
      await expect.poll(async () => (await rowCodes(page)).at(-1)).toBe(`BULK-${BULK}`);
      expect(await rowCodes(page)).not.toContain('BULK-0001');
      expect((await rowCodes(page)).length).toBeLessThan(60);
      await context.close();
    });

    it('the phone cards', async () => {
      const phone = await suite.browser.newContext({ viewport: PHONE, hasTouch: true, isMobile: true });
      await phone.clock.setFixedTime(new Date(NOW));
      await signInThroughApi(phone, suite.server.baseUrl, viewer.email);
      const phonePage = await phone.newPage();
      await phonePage.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots?q=BULK-`);
      const cards = phonePage.locator('li[data-lot]');
      await expect.poll(() => cards.count()).toBeGreaterThan(2);
      expect(await cards.count()).toBeLessThan(30);
      expect(await scrollWidth(phonePage)).toBeLessThanOrEqual(PHONE.width);
      await phone.close();
    });
  });
});
