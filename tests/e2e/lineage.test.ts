import type { BrowserContext, Page } from 'playwright-core';
import request from 'supertest';
import { beforeAll, describe, expect } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '#server/demo/demo-people';
import { browserSuite, chromiumPath, signInAt } from '../helpers/browser';
import { journeyOfTests, seriousViolations } from '../helpers/journey';
import { speciesId, testedTomatoLot } from '../helpers/lots';

// The people and the bank are the invented demo scenario of server/demo/demo-people.ts; the lot,
// its sowing and the plants kept for seed below are invented for this test.
const grower = DEMO_ACCOUNTS.find((a) => a.role === 'grower')!;

// Late September: this summer's tomatoes, sown on 28 March, have ripened and their seed is saved.
const NOW = '2027-09-20T09:00:00Z';
// 390 × 844 CSS pixels: the viewport of a common mid-size phone held upright (from memory).
const PHONE = { width: 390, height: 844 };

describe.skipIf(!chromiumPath)(
  'generations: plants kept from a sowing, and the line on the new lot, on a phone',
  () => {
    const suite = browserSuite({ now: NOW, demo: 'people' });
    let lotId: string;
    let lotCode: string;

    beforeAll(async () => {
      // A tested tomato lot (harvested 1 Sep 2025), planned and sown on 28 Mar 2027 through the API.
      const api = request.agent(suite.server.app);
      expect(
        (await api.post('/api/auth/login').send({ email: grower.email, password: DEMO_PASSWORD })).status,
      ).toBe(200);
      const tomato = await speciesId(suite.server.db, 'tomato');
      ({ lotId, lotCode } = await testedTomatoLot(api, suite.server.db, suite.bankId, {
        variety: 'Lantern Gold',
        seedCount: 400,
        testDate: '2026-11-01',
      }));
      const entry = await api
        .post(`/api/banks/${suite.bankId}/plan`)
        .send({ season: 2027, speciesId: tomato, plantsWanted: 8, start: 'indoors', lotId });
      expect(entry.status).toBe(201);
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
    const scrollWidth = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth);
    const keep = (page: Page) =>
      page.locator('article[data-entry]').filter({ hasText: lotCode }).locator('[data-keep-for-seed]');

    describe('when a grower keeps three F1 plants from a sowing and logs the seed saved from them, then the new lot’s page shows generation 2 grown from the first lot, with the hybrid caution', () => {
      const steps = journeyOfTests('lineage-phone', phone, {
        first: {
          title: 'sign in as grower',
          run: (page) => signInAt(page, suite.server.baseUrl, grower.email, suite.bankId),
        },
      });

      steps.step('keep-plants', async (page) => {
        await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/planner?season=2027`);
        await keep(page).getByRole('button', { name: 'Keep plants for seed' }).click();
        await keep(page).getByLabel('Plants kept').fill('3');
        await keep(page).getByLabel('Where they grow').fill('Bed 2');
        await keep(page)
          .getByRole('checkbox', { name: /F1 hybrids/ })
          .check();
        // The form says at once that seed of an F1 hybrid does not come true.
        await expect.poll(() => keep(page).getByRole('note').innerText()).toMatch(/will not come true/);
        expect(await scrollWidth(page)).toBeLessThanOrEqual(PHONE.width);
        await keep(page).getByRole('button', { name: 'Save parent plants' }).click();
        await expect
          .poll(() => keep(page).getByRole('status').innerText())
          .toContain(`3 parent plants recorded, grown from ${lotCode}.`);
      });

      steps.step('log-the-seed', async (page) => {
        await keep(page).getByRole('link', { name: 'Log the seed saved from them' }).click();
        await page.waitForURL(/\/lots\/new\?grownFrom=/);
        // The form starts with the plants' species and variety, and the three plants ticked.
        await expect.poll(() => page.getByRole('combobox', { name: /Species/ }).inputValue()).toBe('Tomato');
        expect(await page.getByLabel('Variety').inputValue()).toBe('Lantern Gold');
        const parents = page.getByRole('group', { name: 'Parent plants' }).getByRole('checkbox');
        expect(await parents.count()).toBe(3);
        for (const box of await parents.all()) expect(await box.isChecked()).toBe(true);
        await page.getByLabel('Harvest date', { exact: true }).fill('2027-09-12');
        await page.getByLabel('Number of seeds').fill('300');
        expect(await scrollWidth(page)).toBeLessThanOrEqual(PHONE.width);
      });

      steps.step('the-line', async (page) => {
        await page.getByRole('button', { name: 'Save lot' }).click();
        await page.waitForURL(new RegExp(`/banks/${suite.bankId}/lots/[0-9a-f-]{36}$`));
        // The caution for seed saved from an F1 hybrid, at the top of the page (folded on a phone).
        await expect
          .poll(() => page.getByRole('note').filter({ hasText: 'Saved from an F1 hybrid' }).count())
          .toBe(1);
        const card = page.locator('[data-lineage]');
        await card.scrollIntoViewIfNeeded();
        await expect.poll(() => card.innerText()).toContain('Generation 2 · from 3 plants');
        const first = card.locator(`[data-lineage-step="${lotCode}"]`);
        expect(await first.innerText()).toContain('Generation 1');
        // Dates in words: the first lot was harvested on 1 Sep 2025.
        expect(await first.innerText()).toContain('harvested 1 Sep 2025');
        expect(await scrollWidth(page)).toBeLessThanOrEqual(PHONE.width);
        expect(await seriousViolations(page)).toEqual([]);
      });

      steps.step('to-the-ancestor', async (page) => {
        await page.locator('[data-lineage]').getByRole('link', { name: lotCode }).click();
        await page.waitForURL(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/${lotId}`);
        await expect
          .poll(() => page.locator('[data-lineage]').innerText())
          .toContain('Generation 1: it does not come from an earlier lot of this bank.');
      });
    });
  },
);
