import type { BrowserContext, Page } from 'playwright-core';
import request from 'supertest';
import { beforeAll, describe, expect } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '#server/demo/demo-people';
import { browserSuite, chromiumPath, signInAt } from '../helpers/browser';
import { journeyOfTests, seriousViolations } from '../helpers/journey';
import { speciesId, testedTomatoLot } from '../helpers/lots';

// The people and the bank are the invented demo scenario of server/demo/demo-people.ts; the lot
// and its sowing below are invented for this test.
const grower = DEMO_ACCOUNTS.find((a) => a.role === 'grower')!;
const viewer = DEMO_ACCOUNTS.find((a) => a.role === 'viewer')!;

// Mid-April: the tomatoes sown on 28 March are up.
const NOW = '2027-04-20T09:00:00Z';
// 390 × 844 CSS pixels: the viewport of a common mid-size phone held upright (from memory).
const PHONE = { width: 390, height: 844 };

describe.skipIf(!chromiumPath)('what came up from a sowing, in Chromium on a phone', () => {
  const suite = browserSuite({ now: NOW, demo: 'people' });
  let lotId: string;
  let lotCode: string;
  let seeds: number;

  beforeAll(async () => {
    // A tested tomato lot, planned and sown on 28 Mar through the API as the grower (a day before
    // its window opens, 29 Mar, so the sowing is confirmed).
    const api = request.agent(suite.server.app);
    expect(
      (await api.post('/api/auth/login').send({ email: grower.email, password: DEMO_PASSWORD })).status,
    ).toBe(200);
    const tomato = await speciesId(suite.server.db, 'tomato');
    ({ lotId, lotCode } = await testedTomatoLot(api, suite.server.db, suite.bankId, {
      variety: 'Came Up Trial',
      seedCount: 400,
      testDate: '2026-11-01',
    }));
    const entry = await api
      .post(`/api/banks/${suite.bankId}/plan`)
      .send({ season: 2027, speciesId: tomato, plantsWanted: 12, start: 'indoors', lotId });
    expect(entry.status).toBe(201);
    seeds = entry.body.entry.seedsToSow;
    const sown = await api
      .post(`/api/banks/${suite.bankId}/plan/${entry.body.entry.id}/sown`)
      .send({ date: '2027-03-28', confirm: true });
    expect(sown.status).toBe(200);
  });

  async function phone(): Promise<BrowserContext> {
    const context = await suite.browser.newContext({ viewport: PHONE, hasTouch: true, isMobile: true });
    await context.clock.setFixedTime(new Date(NOW));
    return context;
  }
  const signIn = (page: Page, email: string) => signInAt(page, suite.server.baseUrl, email, suite.bankId);
  const scrollWidth = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth);
  const card = (page: Page) => page.locator('article[data-entry]').filter({ hasText: 'Tomato' }).first();
  const cameUp = (page: Page) => card(page).locator('[data-came-up]');

  describe('when a grower counts the seedlings, then looks again with a rough score, then the planner and the lot page show it as field emergence', () => {
    const steps = journeyOfTests('plan-emergence-phone', phone, {
      first: { title: 'sign in as grower', run: (page) => signIn(page, grower.email) },
    });

    steps.step('planner', async (page) => {
      await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/planner?season=2027`);
      await cameUp(page).waitFor();
      expect(await cameUp(page).innerText()).toContain('Nothing recorded yet');
      await cameUp(page).getByRole('button', { name: 'Record what came up' }).click();
      // The date defaults to today (the demo bank's time zone is UTC); counting is the default.
      expect(await cameUp(page).getByLabel('Looked on').inputValue()).toBe('2027-04-20');
      expect(await cameUp(page).getByRole('radio', { name: 'Counted' }).isChecked()).toBe(true);
      expect(await scrollWidth(page)).toBeLessThanOrEqual(PHONE.width);
    });

    steps.step('too-many', async (page) => {
      await cameUp(page)
        .getByLabel('Seedlings up')
        .fill(String(seeds + 1));
      await cameUp(page).getByRole('button', { name: 'Save what came up' }).click();
      await expect.poll(() => cameUp(page).innerText()).toContain(`At most the ${seeds} seeds sown.`);
    });

    steps.step('counted', async (page) => {
      await cameUp(page).getByLabel('Looked on').fill('2027-04-08');
      await cameUp(page).getByLabel('Seedlings up').fill('3');
      await cameUp(page).getByRole('button', { name: 'Save what came up' }).click();
      const latest = cameUp(page).locator('[data-emergence="latest"]');
      const percent = Math.round((100 * 3) / seeds);
      await expect
        .poll(() => latest.innerText())
        .toContain(`Sown ${seeds} on 28 Mar 2027; 3 came up by 8 Apr (${percent}%)`);
      expect(await latest.innerText()).toContain('latest — what came up');
      expect(await seriousViolations(page)).toEqual([]);
    });

    steps.step('rough-look', async (page) => {
      await cameUp(page).getByRole('button', { name: 'Look again' }).click();
      await cameUp(page).getByRole('radio', { name: 'Rough look' }).check();
      await cameUp(page).getByRole('radio', { name: /^Most/ }).check();
      await cameUp(page).getByRole('button', { name: 'Save: most came up' }).click();
      await expect
        .poll(() => cameUp(page).locator('[data-emergence="latest"]').innerText())
        .toContain('most came up by 20 Apr');
      expect(await cameUp(page).locator('[data-emergence="earlier"]').innerText()).toContain(
        '3 came up by 8 Apr',
      );
      // Undoing the sowing would take these records with it, and says so.
      expect(await card(page).innerText()).toContain('also removes what was recorded as coming up');
      expect(await scrollWidth(page)).toBeLessThanOrEqual(PHONE.width);
    });

    steps.step('lot-page', async (page) => {
      await card(page).getByRole('link', { name: lotCode }).click();
      await page.waitForURL(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/${lotId}`);
      const history = page.getByRole('list', { name: 'What came up from sowings of this lot' });
      await expect.poll(() => history.innerText()).toMatch(/from a sowing/i);
      const text = await history.innerText();
      expect(text).toContain(`Sown ${seeds} on 28 Mar 2027; most came up by 20 Apr`);
      expect(text).toContain('field emergence');
      expect(text).toContain('Earlier look: 3 came up by 8 Apr');
      // The tests stay a list of their own: the sowing is not one of them.
      const tests = page.getByRole('list', { name: 'Germination tests of this lot' });
      await expect.poll(() => tests.getByRole('listitem').count()).toBe(1);
      expect(await tests.innerText()).not.toMatch(/came up/);
      expect(await scrollWidth(page)).toBeLessThanOrEqual(PHONE.width);
      expect(await seriousViolations(page)).toEqual([]);
    });
  });

  describe('when a viewer opens the planner, then what came up shows without a way to change it', () => {
    const steps = journeyOfTests('plan-emergence-viewer', phone, {
      first: { title: 'sign in as viewer', run: (page) => signIn(page, viewer.email) },
    });
    steps.step('planner', async (page) => {
      await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/planner?season=2027`);
      await expect.poll(() => cameUp(page).innerText()).toContain('most came up by 20 Apr');
      expect(await cameUp(page).getByRole('button').count()).toBe(0);
    });
  });
});
