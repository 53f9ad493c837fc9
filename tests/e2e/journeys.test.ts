import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Page } from 'playwright-core';
import jStat from 'jstat';
import sharp from 'sharp';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '#server/demo/demo-people';
import { browserSuite, chromiumPath, signInAt } from '../helpers/browser';
import { enterCounts } from '../helpers/count-entry';
import { journeyOfTests, seriousViolations } from '../helpers/journey';
import { DAY_MS } from '#shared/dates';

// 390 × 844 CSS pixels: a common phone held upright (from memory).
const PHONE = { width: 390, height: 844 };
const DESKTOP = { width: 1280, height: 900 };

describe.skipIf(!chromiumPath)('the three growers’ journeys, on the demo season', () => {
  // The server's clock at the real time, since the pages' default dates come from the browser.
  const suite = browserSuite({ now: new Date().toISOString(), demo: 'season', timeoutMs: 180_000 });
  let tmp: string;
  let lotCode = '';
  let lotId = '';

  beforeAll(() => {
    tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'hilum-journeys-'));
  });
  afterAll(async () => {
    if (tmp) fs.rmSync(tmp, { recursive: true, force: true });
  });

  const signIn = (page: Page, email: string) => signInAt(page, suite.server.baseUrl, email, suite.bankId);

  describe('journey 1: when a grower logs a harvested packet on a phone, then the lot is listed as needing a test', () => {
    const j = journeyOfTests(
      '1-log-a-packet',
      () => suite.browser.newContext({ viewport: PHONE, hasTouch: true, isMobile: true }),
      {
        first: { title: 'sign in as grower', run: (page) => signIn(page, 'grower@example.org') },
      },
    );
    j.step('open the new-lot form', async (page) => {
      await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/new`);
      await expect.poll(() => page.getByRole('heading', { level: 1 }).innerText()).toBe('New lot');
    });
    j.step('fill in the packet', async (page) => {
      const species = page.getByRole('combobox', { name: /Species/ });
      await species.fill('Kale');
      await page.getByRole('option', { name: /Kale/ }).first().click();
      await page.getByLabel('Variety').fill('Journey Blue');
      await page
        .getByLabel('Harvest date', { exact: true })
        .fill(new Date(Date.now() - 20 * DAY_MS).toISOString().slice(0, 10));
      // The demo circle saved kale from one of its parent plants: tick it.
      const parents = page.getByRole('group', { name: 'Parent plants' }).getByRole('checkbox');
      await parents.first().check();
      await page.getByLabel('Number of seeds').fill('400');
      const jpeg = await sharp({ create: { width: 900, height: 1200, channels: 3, background: '#7d8f5a' } })
        .jpeg()
        .toBuffer();
      const photo = path.join(tmp, 'kale-packet.jpg');
      fs.writeFileSync(photo, jpeg);
      await page.getByLabel('Packet photo').setInputFiles(photo);
    });
    j.step('save and see the lot page with its photo', async (page) => {
      await page.getByRole('button', { name: 'Save lot' }).click();
      await page.waitForURL(new RegExp(`/banks/${suite.bankId}/lots/[0-9a-f-]{36}$`));
      lotId = page.url().split('/').pop()!;
      await expect.poll(() => page.getByRole('heading', { level: 1 }).innerText()).toMatch(/^KAL-/);
      lotCode = (await page.getByRole('heading', { level: 1 }).innerText()).trim().split(/\s/)[0]!;
      const thumb = page.locator('img[src*="size=thumb"]').first();
      await thumb.waitFor();
      await expect
        .poll(() => thumb.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth))
        .toBeGreaterThan(0);
    });
    j.step('see it in the lots table, to be tested first', async (page) => {
      await page.goto(
        `${suite.server.baseUrl}/banks/${suite.bankId}/lots?q=${encodeURIComponent('Journey Blue')}`,
      );
      // A lot never tested is to be tested first (docs/decisions.md), on its own row or card.
      const lot = page.locator(`[data-lot="${lotCode}"]`);
      await expect.poll(() => lot.count()).toBe(1);
      await expect.poll(() => lot.innerText()).toContain('Test first');
    });
    it('the server holds the lot with the parent plant that was ticked', async () => {
      const saved = await suite.server.db
        .selectFrom('lot_parents')
        .select('parent_plant_id')
        .where('lot_id', '=', lotId)
        .execute();
      expect(saved).toHaveLength(1);
    });
  });

  describe('journey 2: when a grower records a 4-tray trial over three check days, then the result and curve show', () => {
    const start = new Date(Date.now() - 10 * DAY_MS).toISOString().slice(0, 10);
    const day = (n: number) => new Date(Date.parse(start) + n * DAY_MS).toISOString().slice(0, 10);
    const j = journeyOfTests(
      '2-tray-trial',
      () => suite.browser.newContext({ viewport: PHONE, hasTouch: true, isMobile: true }),
      {
        first: { title: 'sign in as grower', run: (page) => signIn(page, 'grower@example.org') },
      },
    );
    j.step('start a 4-tray test', async (page) => {
      // The lot logged in journey 1.
      expect(lotId).not.toBe('');
      await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/${lotId}/tests/new`);
      await page.getByLabel('Start date').fill(start);
      await page.getByLabel('Method').selectOption('paper towel');
      await page.getByLabel('Number of trays').selectOption('4');
      await page.getByLabel('Seeds in each tray').fill('25');
      await page.getByRole('button', { name: /Start the test/ }).click();
      await page.waitForURL(new RegExp(`/banks/${suite.bankId}/tests/[0-9a-f-]{36}`));
    });
    const counts: [number, number[]][] = [
      [4, [8, 6, 9, 7]],
      [7, [18, 16, 19, 17]],
      [10, [21, 19, 22, 20]],
    ];
    for (const [d, values] of counts) {
      j.step(`count on day ${d}`, async (page) => {
        // The server's clock moves to the check day, as the grower's days pass.
        suite.server.clock.set(`${day(d)}T10:00:00Z`);
        const label = await enterCounts(page, day(d), values, (n) => `Tray ${n} · 25 sown`);
        await page.getByRole('button', { name: `Save counts for ${label}` }).tap();
        await expect
          .poll(() =>
            page
              .getByRole('status')
              .filter({ hasText: `Saved the counts of ${label}` })
              .count(),
          )
          .toBe(1);
        if (d === 10) {
          await page.evaluate(() => window.scrollTo(0, 0));
          await j.readmeShot('test-page.png');
        }
      });
    }
    j.step('finish the test', async (page) => {
      await page.getByRole('button', { name: 'Finish the test…' }).click();
      const dialog = page.getByRole('dialog', { name: 'Finish the test' });
      await dialog.getByLabel('Finished on').fill(day(10));
      for (const [i, v] of [21, 19, 22, 20].entries()) {
        const tray = dialog.getByRole('listitem').filter({ hasText: `Tray ${i + 1} · 25 sown` });
        await tray.getByLabel('Abnormal').fill('1');
        await tray.getByLabel('Ungerminated').fill(String(25 - v - 1));
      }
      await dialog.getByRole('button', { name: 'Finish the test' }).click();
      await expect.poll(() => page.getByRole('status').filter({ hasText: 'Finished on' }).count()).toBe(1);
    });
    j.step('read percent, interval, agreement and curve', async (page) => {
      // 21 + 19 + 22 + 20 = 82 of 100 sown: 82%, as the seed-testing rules report a whole percent.
      await expect.poll(() => page.locator('[data-result="percent"]').innerText()).toContain('82');
      await expect.poll(() => page.locator('[data-result="interval"]').innerText()).toMatch(/\d+%.*\d+%/);
      expect(await page.locator('[data-agreement]').getAttribute('data-agreement')).toBe('ok');
      expect(
        await page.locator('[data-chart="germination-curve"] path.recharts-line-curve').count(),
      ).toBeGreaterThanOrEqual(4);
    });
  });

  describe('journey 3: when the keeper decides what to sow for the coming spring, then the chosen lot is planned with its seeds and its label prints', () => {
    const chosen = { code: '', lotId: '', seeds: 0 };
    let sowingDate = '';
    let keeperApi: ReturnType<typeof request.agent>;
    beforeAll(async () => {
      const bank = await suite.server.db
        .selectFrom('banks')
        .select(['last_frost'])
        .where('id', '=', suite.bankId)
        .executeTakeFirstOrThrow();
      const today = new Date().toISOString().slice(0, 10);
      // Indoor starts are counted back from the last spring frost; eight weeks before it is the usual
      // first guess for bedding plants and tomatoes (common practice). The next such day still ahead:
      sowingDate = [0, 1, 2]
        .map(
          (k) =>
            new Date(
              Date.UTC(
                Number(today.slice(0, 4)) + k,
                Number(bank.last_frost!.slice(0, 2)) - 1,
                Number(bank.last_frost!.slice(3)) - 56,
              ),
            ),
        )
        .map((d) => d.toISOString().slice(0, 10))
        .find((d) => d >= today)!;
      keeperApi = request.agent(suite.server.app);
      expect(
        (
          await keeperApi
            .post('/api/auth/login')
            .send({ email: 'keeper@example.org', password: DEMO_PASSWORD })
        ).status,
      ).toBe(200);
    });
    const j = journeyOfTests('3-decide-what-to-sow', () => suite.browser.newContext({ viewport: DESKTOP }), {
      first: { title: 'sign in as keeper', run: (page) => signIn(page, 'keeper@example.org') },
    });
    j.step('open the ranking for the coming sowing date', async (page) => {
      await page.getByRole('navigation', { name: 'Bank' }).getByRole('link', { name: 'Lots' }).click();
      await page.waitForURL(`${suite.server.baseUrl}/banks/${suite.bankId}/lots`);
      await expect.poll(() => page.getByLabel('Sowing date').inputValue()).toBe(sowingDate);
      await expect.poll(() => page.locator('tbody tr[data-lot]').count()).toBeGreaterThan(10);
      await j.readmeShot('ranking.png');
    });
    j.step('keep what is worth sowing', async (page) => {
      await page.getByRole('combobox', { name: 'Advice' }).selectOption('sow');
      await expect.poll(() => new URL(page.url()).searchParams.get('rec')).toBe('sow');
      const rows = page.locator('tbody tr[data-lot]');
      await expect.poll(() => rows.count()).toBeGreaterThan(0);
      // Every row left is one the server advises sowing on that date.
      const ranking = await keeperApi.get(`/api/banks/${suite.bankId}/ranking?on=${sowingDate}`);
      expect(ranking.status).toBe(200);
      const worthSowing = (ranking.body.items as { code: string; recommendation: string }[])
        .filter((i) => i.recommendation === 'sow')
        .map((i) => i.code);
      const shown = await rows.evaluateAll((trs) => trs.map((tr) => tr.getAttribute('data-lot')!));
      expect(worthSowing).toEqual(expect.arrayContaining(shown));
      const first = rows.first();
      chosen.code = (await first.getAttribute('data-lot'))!;
    });
    j.step('open the lot and work out the seeds for 12 plants', async (page) => {
      await page.getByRole('link', { name: chosen.code, exact: true }).click();
      await page.waitForURL(new RegExp(`/banks/${suite.bankId}/lots/[0-9a-f-]{36}`));
      chosen.lotId = new URL(page.url()).pathname.split('/').pop()!;
      await page.getByLabel('Plants wanted').fill('12');
      await expect.poll(() => page.getByText(/for 12 plants/).count()).toBeGreaterThan(0);
      await expect.poll(() => page.getByTestId('seeds-to-sow').innerText()).toMatch(/^sow \d+ seeds$/);
      chosen.seeds = Number((await page.getByTestId('seeds-to-sow').innerText()).replace(/\D/g, ''));
      // The calculator shows the server's answer. The answer holds its assurance over the whole band
      // of germination (the predictive distribution, checked against an exact beta-binomial in
      // tests/unit/stats/seeds-to-sow-predictive.test.ts), so it is never below the point-estimate
      // answer: the least n for which 12 or more of n seeds come up with probability ≥ 0.9 at the
      // projected germination (jStat's binomial distribution).
      const api = await keeperApi.get(
        `/api/banks/${suite.bankId}/lots/${chosen.lotId}/seeds-to-sow?plants=12&assurance=0.9&on=${sowingDate}`,
      );
      expect(api.status).toBe(200);
      expect(chosen.seeds).toBe(api.body.seeds);
      const atLeast12 = (n: number) => 1 - jStat.binomial.cdf(11, n, api.body.germinationUsed);
      let pointEstimate = 12;
      while (atLeast12(pointEstimate) < 0.9) pointEstimate += 1;
      expect(chosen.seeds).toBeGreaterThanOrEqual(pointEstimate);
    });
    j.step('add it to the plan', async (page) => {
      const add = page.getByRole('button', { name: /^Add to the \d{4} plan$/ });
      const season = Number((await add.innerText()).replace(/\D/g, ''));
      // The lot may already be the suggested lot of another sowing: count its entries before.
      const planned = async () =>
        (
          (await keeperApi.get(`/api/banks/${suite.bankId}/plan?season=${season}`)).body.items as {
            lotId: string | null;
            plantsWanted: number;
          }[]
        ).filter((e) => e.lotId === chosen.lotId);
      const before = (await planned()).length;
      await add.click();
      await expect
        .poll(() =>
          page
            .getByRole('status')
            .filter({ hasText: `Added to the ${season} plan` })
            .count(),
        )
        .toBe(1);
      expect((await planned()).filter((e) => e.plantsWanted === 12).length).toBeGreaterThan(0);
      await page.getByRole('link', { name: 'Open the planner' }).click();
      await page.waitForURL(new RegExp(`/banks/${suite.bankId}/planner`));
      const entries = page
        .locator('article[data-entry]')
        .filter({ has: page.getByRole('link', { name: chosen.code }) });
      await expect.poll(() => entries.count()).toBe(before + 1);
    });
    j.step('print the labels of the planned lots', async (page) => {
      await page.getByRole('link', { name: /^Print (label|\d+ labels)$/ }).click();
      await page.waitForURL(new RegExp(`/banks/${suite.bankId}/labels\\?lots=`));
      expect(new URL(page.url()).searchParams.get('lots')!.split(',')).toContain(chosen.lotId);
      const label = page.getByRole('img', { name: new RegExp(`^Label for lot ${chosen.code}:`) });
      await expect
        .poll(() => label.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth > 0))
        .toBe(true);
      // The browser's print dialog cannot be driven headless: count the calls instead.
      await page.evaluate(() => {
        (window as unknown as { printed: number }).printed = 0;
        window.print = () => void ((window as unknown as { printed: number }).printed += 1);
      });
      await page.getByRole('button', { name: 'Print', exact: true }).click();
      expect(await page.evaluate(() => (window as unknown as { printed: number }).printed)).toBe(1);
      // On paper only the sheets come out: no header, no buttons.
      await page.emulateMedia({ media: 'print' });
      expect(await page.getByRole('button', { name: 'Print', exact: true }).isVisible()).toBe(false);
      expect(await label.isVisible()).toBe(true);
    });
    it('the server holds the plan entry for 12 plants', async () => {
      const planned = await suite.server.db
        .selectFrom('plan_entries')
        .select(['plants_wanted', 'seeds_to_sow'])
        .where('lot_id', '=', chosen.lotId)
        .execute();
      expect(planned).toContainEqual(expect.objectContaining({ plants_wanted: 12 }));
    });
  });

  // One account per block and one page per test: each check has the whole test timeout, and the
  // account signs in once for all its pages.
  describe('when each demo account signs in, then its pages offer what its role allows and nothing more', () => {
    let lot: { id: string; code: string };
    let running: { id: string };
    beforeAll(async () => {
      // A lot with a finished test, so that its calculator has a germination to work from (a lot whose
      // only test still runs offers no seed count and no "Add to the plan").
      lot = await suite.server.db
        .selectFrom('lots')
        .innerJoin('germination_tests', 'germination_tests.lot_id', 'lots.id')
        .select(['lots.id', 'lots.code'])
        .where('lots.bank_id', '=', suite.bankId)
        .where('lots.status', '=', 'active')
        .where('germination_tests.status', '=', 'finished')
        .orderBy('lots.code')
        .limit(1)
        .executeTakeFirstOrThrow();
      running = await suite.server.db
        .selectFrom('germination_tests')
        .select('id')
        .where('bank_id', '=', suite.bankId)
        .where('status', '=', 'running')
        .orderBy('start_date', 'desc')
        .limit(1)
        .executeTakeFirstOrThrow();
    });
    const count = (page: Page, role: 'link' | 'button', name: string | RegExp) =>
      page.getByRole(role, { name, exact: typeof name === 'string' }).count();

    // What each role may do (DESIGN.md): an owner everything; a grower lots, tests, counts and
    // plans but not members or settings; a viewer reads and changes nothing.
    describe.each([
      { email: 'keeper@example.org', role: 'owner' },
      { email: 'grower@example.org', role: 'grower' },
      { email: 'grower2@example.org', role: 'grower' },
      { email: 'viewer@example.org', role: 'viewer' },
    ] as const)('$email, $role', ({ email, role }) => {
      const writes = role === 'viewer' ? 0 : 1;
      const owns = role === 'owner' ? 1 : 0;
      const j = journeyOfTests(
        `roles-${email.split('@')[0]}`,
        () => suite.browser.newContext({ viewport: DESKTOP }),
        {
          first: { title: 'sign in', run: (page) => signIn(page, email) },
          chained: false,
        },
      );
      j.step('lots: New lot and Import CSV', async (page) => {
        await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots`);
        await page.getByRole('link', { name: 'Export lots CSV' }).waitFor();
        expect([await count(page, 'link', 'New lot'), await count(page, 'link', 'Import CSV')]).toEqual([
          writes,
          writes,
        ]);
      });
      j.step('a lot: photo, test, plan and delete', async (page) => {
        await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/${lot.id}`);
        await page.getByRole('link', { name: 'Print label' }).waitFor();
        // Each part of the page loads its own data: wait for the tests, the photos and the calculator.
        await page.getByRole('list', { name: 'Germination tests of this lot' }).waitFor();
        await page
          .getByRole('list', { name: 'Photos' })
          .or(page.getByText('No photos yet.'))
          .first()
          .waitFor();
        await page.getByTestId('seeds-to-sow').waitFor();
        expect({
          photo: await page.getByLabel('Add a photo').count(),
          test: await count(page, 'link', 'Start a test'),
          plan: await count(page, 'button', /^Add to the \d{4} plan$/),
          remove: await count(page, 'button', `Delete lot ${lot.code}`),
        }).toEqual({ photo: writes, test: writes, plan: writes, remove: writes });
      });
      j.step('the running test: count entry', async (page) => {
        await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/tests/${running.id}`);
        await page.locator('main h1').waitFor();
        await page.waitForLoadState('networkidle');
        expect(await count(page, 'button', /^Save counts for/)).toBe(writes);
      });
      j.step('planner: add and mark sown', async (page) => {
        await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/planner`);
        await page.locator('article[data-entry]').first().waitFor();
        expect(await count(page, 'button', 'Add to plan')).toBe(writes);
        expect((await count(page, 'button', /^Mark sown/)) > 0 ? 1 : 0).toBe(writes);
      });
      j.step('members: invitations', async (page) => {
        await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/members`);
        await page.getByRole('list', { name: 'Members of this bank' }).waitFor();
        expect(await count(page, 'button', 'Send invitation')).toBe(owns);
      });
      j.step('settings: save', async (page) => {
        await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/settings`);
        await page.locator('main h1').waitFor();
        await page.waitForLoadState('networkidle');
        expect(await count(page, 'button', 'Save settings')).toBe(owns);
      });
    });
  });

  // One page per test, on one page signed in once as the keeper.
  describe('when the main pages are checked with axe-core, then there are no serious or critical violations', () => {
    const ids = { lot: '', test: '' };
    beforeAll(async () => {
      ids.lot = (
        await suite.server.db
          .selectFrom('lots')
          .select('id')
          .where('bank_id', '=', suite.bankId)
          .orderBy('code')
          .limit(1)
          .executeTakeFirstOrThrow()
      ).id;
      ids.test = (
        await suite.server.db
          .selectFrom('germination_tests')
          .select('id')
          .where('bank_id', '=', suite.bankId)
          .orderBy('start_date')
          .limit(1)
          .executeTakeFirstOrThrow()
      ).id;
    });

    it('sign-in', async () => {
      const context = await suite.browser.newContext({ viewport: DESKTOP });
      const page = await context.newPage();
      await page.goto(`${suite.server.baseUrl}/sign-in`);
      await page.getByRole('button', { name: 'Sign in' }).waitFor();
      const found = await seriousViolations(page);
      await context.close();
      expect(found).toEqual([]);
    });

    const j = journeyOfTests('axe-keeper', () => suite.browser.newContext({ viewport: DESKTOP }), {
      first: { title: 'sign in', run: (page) => signIn(page, 'keeper@example.org') },
      chained: false,
    });
    const pages: [string, () => string][] = [
      ['overview', () => `/banks/${suite.bankId}/overview`],
      ['lots', () => `/banks/${suite.bankId}/lots`],
      ['lot', () => `/banks/${suite.bankId}/lots/${ids.lot}`],
      ['new lot', () => `/banks/${suite.bankId}/lots/new`],
      ['test', () => `/banks/${suite.bankId}/tests/${ids.test}`],
      ['planner', () => `/banks/${suite.bankId}/planner`],
      ['members', () => `/banks/${suite.bankId}/members`],
      ['settings', () => `/banks/${suite.bankId}/settings`],
      ['import', () => `/banks/${suite.bankId}/lots/import?holds=tests`],
      ['labels', () => `/banks/${suite.bankId}/labels?lots=${ids.lot}`],
    ];
    for (const [name, url] of pages) {
      j.step(name, async (page) => {
        await page.goto(`${suite.server.baseUrl}${url()}`);
        await page.locator('main h1').first().waitFor();
        await page.waitForLoadState('networkidle');
        expect(await seriousViolations(page)).toEqual([]);
      });
    }
  });
});
