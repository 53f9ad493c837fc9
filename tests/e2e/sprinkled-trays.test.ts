import type { Page } from 'playwright-core';
import { beforeAll, describe, expect } from 'vitest';
import type { AssayDetail } from '#shared/schemas/germination';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '#server/demo/demo-people';
import { signIn } from '../helpers/accounts';
import { browserSuite, chromiumPath, signInAt } from '../helpers/browser';
import { journeyOfTests } from '../helpers/journey';
import { speciesId } from '../helpers/lots';

// The people and the bank are the invented demo scenario; the lot (code SPRINKLE-1) and its weighed
// sample are invented for this test.
const grower = DEMO_ACCOUNTS.find((a) => a.role === 'grower')!;
const NOW = '2026-03-10T09:00:00Z';
const CODE = 'SPRINKLE-1';
// 390 × 844 CSS pixels: the viewport of a common mid-size phone held upright (from memory).
const PHONE = { width: 390, height: 844 };

describe.skipIf(!chromiumPath)(
  'a sprinkled tray on a phone: sown by weight, counted, then one scored roughly',
  () => {
    const suite = browserSuite({ now: NOW, demo: 'people' });
    let api: Awaited<ReturnType<typeof signIn>>;
    let lotId: string;

    beforeAll(async () => {
      api = await signIn(suite.server.app, grower.email, DEMO_PASSWORD);
      const lot = await api.post(`/api/banks/${suite.bankId}/lots`).send({
        speciesId: await speciesId(suite.server.db, 'tomato'),
        variety: 'Chaffy Red',
        origin: 'saved',
        harvestDate: '2025-09-10',
        seedCount: 500,
        code: CODE,
      });
      expect(lot.status).toBe(201);
      lotId = lot.body.lot.id;
      // Made up: 100 seeds of the lot weigh 0.25 g (400 seeds per gram).
      await suite.server.db
        .insertInto('lot_seed_weights')
        .values({ bank_id: suite.bankId, lot_id: lotId, seeds: 100, grams: 0.25 })
        .execute();
    });

    const newTestUrl = () => `${suite.server.baseUrl}/banks/${suite.bankId}/lots/${lotId}/tests/new`;
    const percentText = (page: Page) => page.locator('[data-result="percent"]').innerText();
    const open = async () => {
      const made = await suite.browser.newContext({ viewport: PHONE, hasTouch: true, isMobile: true });
      await made.clock.setFixedTime(new Date(NOW));
      return made;
    };
    const testIdOf = (page: Page) => /\/tests\/([^/?#]+)$/.exec(new URL(page.url()).pathname)?.[1] ?? '';

    describe('when a grower sprinkles 0.1 g into a tray under a lamp and counts it, then the result is an estimate with a wider interval, said so', () => {
      const j = journeyOfTests('sprinkled-1-weight-phone', open, {
        first: {
          title: 'sign in as a grower',
          run: (page) => signInAt(page, suite.server.baseUrl, grower.email, suite.bankId),
        },
      });

      j.step('start a test sown by weight, with the cautions that apply', async (page) => {
        await page.goto(newTestUrl());
        await page.getByLabel('Start date').fill('2026-03-03');
        await page.getByLabel('Light, hours a day (optional)').fill('14');
        // A tray of mix under a lamp: boiling water and electrics near water, deferring to local rules.
        await expect.poll(() => page.locator('[data-caution="scald"]').count()).toBe(1);
        expect(await page.locator('[data-caution="electrics"]').innerText()).toMatch(/GFCI \/ RCD/);
        await page.getByRole('radio', { name: /By weight/ }).check();
        await page.getByLabel('Number of trays').selectOption('1');
        await page.getByLabel('Tray 1, grams').fill('0');
        await page.getByRole('button', { name: 'Start the test' }).tap();
        await expect.poll(() => page.getByText('Give the weight sown in grams, above 0.').count()).toBe(1);
        await page.getByLabel('Tray 1, grams').fill('0.1');
        await page.getByRole('button', { name: 'Start the test' }).tap();
        await page.waitForURL(/\/tests\/[^/]+$/);
        await expect
          .poll(() =>
            page.getByRole('status').filter({ hasText: 'Test started: about 40 seeds taken' }).count(),
          )
          .toBe(1);
      });

      j.step('count the tray and read the estimate', async (page) => {
        const field = page.getByRole('textbox', { name: 'Tray 1 · 0.1 g sown' });
        await field.fill('25');
        await page.getByRole('button', { name: 'Save counts for Tue 10 Mar' }).tap();
        await expect.poll(() => percentText(page)).toBe('about 63%');
        const detail = (await api.get(`/api/banks/${suite.bankId}/tests/${testIdOf(page)}`))
          .body as AssayDetail;
        expect(detail.result.seedsSownEstimated).toBe(true);
        expect(await page.locator('[data-result="of-sown"]').innerText()).toBe(
          '25 seedlings from about 40 seeds · seeds sown estimated from 0.1\u00a0g',
        );
        const interval = await page.locator('[data-result="interval"]').innerText();
        const low = Math.round(detail.result.interval!.low);
        const high = Math.round(detail.result.interval!.high);
        expect(interval).toContain(`Likely between ${low}% and ${high}%`);
        expect(interval).toContain('wider because the seeds sown were estimated, not counted');
        expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
          PHONE.width,
        );
        await page.screenshot({ path: '/tmp/i16/sprinkled-weight-phone.png', fullPage: true });
      });

      j.step('a pinch not counted, its seedlings scored roughly: words, never a number', async (page) => {
        await page.goto(newTestUrl());
        await page.getByLabel('Start date').fill('2026-03-03');
        await page.getByRole('radio', { name: /Not counted/ }).check();
        await page.getByLabel('Number of trays').selectOption('1');
        await page.getByLabel('Tray 1, about').selectOption('pinch');
        await page.getByRole('button', { name: 'Start the test' }).tap();
        await page.waitForURL(/\/tests\/[^/]+$/);
        await page.getByRole('button', { name: 'a few', exact: true }).tap();
        await page.getByRole('button', { name: 'Save counts for Tue 10 Mar' }).tap();
        await expect.poll(() => percentText(page)).toBe('Seedlings came up: a few');
        const words = await page.getByRole('list', { name: 'What the result means' }).innerText();
        expect(words).toContain('Seedlings came up: a few');
        expect(words).not.toMatch(/\d\s*%/);
        await page.screenshot({ path: '/tmp/i16/sprinkled-score-phone.png', fullPage: true });
      });

      j.step('finish the scored test: nothing to add up, and the words stay words', async (page) => {
        await page.getByRole('button', { name: 'Finish the test…' }).tap();
        const dialog = page.getByRole('dialog', { name: 'Finish the test' });
        const tray1 = dialog.locator('li[data-finish-tray="1"]');
        await expect.poll(() => tray1.innerText()).toContain('seedlings came up: a few (scored roughly)');
        expect(await tray1.getByLabel('Abnormal').count()).toBe(0);
        await dialog.getByLabel('Finished on').fill('2026-03-10');
        await dialog.getByRole('button', { name: 'Finish the test' }).tap();
        await expect
          .poll(() => page.getByRole('heading', { name: 'Result: normal seedlings' }).count())
          .toBe(1);
        expect(await percentText(page)).toBe('Seedlings came up: a few');
        const detail = (await api.get(`/api/banks/${suite.bankId}/tests/${testIdOf(page)}`))
          .body as AssayDetail;
        expect(detail.test.status).toBe('finished');
        expect(detail.result.percent).toBeNull();
      });
    });
  },
);
