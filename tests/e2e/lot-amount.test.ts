import type { Page } from 'playwright-core';
import { describe, expect } from 'vitest';
import { DEMO_ACCOUNTS } from '#server/demo/demo-people';
import { SPECIES_REFERENCE } from '#shared/species-reference';
import { browserSuite, chromiumPath, signInAt } from '../helpers/browser';
import { journeyOfTests, seriousViolations } from '../helpers/journey';

// The people and the bank are the invented demo scenario of server/demo/demo-people.ts.
const grower = DEMO_ACCOUNTS.find((a) => a.role === 'grower')!;

// 390 × 844 CSS pixels: the viewport of a common mid-size phone held upright (from memory).
const PHONE = { width: 390, height: 844 };

// Tomato's typical seeds per gram in the reference set (shared/species-reference.ts, read).
const TOMATO_PER_GRAM = SPECIES_REFERENCE.find((s) => s.commonName === 'Tomato')!.seedsPerGram?.typical ?? 0;

describe.skipIf(!chromiumPath)('a lot’s amount and seed weight in Chromium', () => {
  const suite = browserSuite({ now: new Date().toISOString(), demo: 'people' });
  const scrollWidth = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth);
  // The tray is sown a week before today (the server's and the browser's real clock).
  const WEEK_AGO = new Date(Date.now() - 7 * 86_400_000).toISOString().slice(0, 10);
  const TODAY = new Date().toISOString().slice(0, 10);
  let lotUrl = '';

  describe('when a grower on a phone logs chaffy seed by weight, weighs a sample, sprinkles a tray by weight and counts it a week later, then the estimate and the lot’s advice follow', () => {
    const j = journeyOfTests(
      'lot-weigh-a-sample-phone',
      () => suite.browser.newContext({ viewport: PHONE, hasTouch: true, isMobile: true }),
      {
        first: {
          title: 'sign in as grower',
          run: (page) => signInAt(page, suite.server.baseUrl, grower.email, suite.bankId),
        },
      },
    );

    j.step('log the lot by weight: the harvest date starts empty', async (page) => {
      await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/new`);
      const species = page.getByRole('combobox', { name: /Species/ });
      await species.fill('lycopers');
      await page.getByRole('option', { name: /Tomato/ }).click();
      await page.getByLabel('Variety').fill('Stem Threshed');
      const harvest = page.getByLabel('Harvest date', { exact: true });
      expect(await harvest.inputValue()).toBe('');
      await harvest.fill('2025-09-14');
      await page.getByRole('radio', { name: /Weight in grams/ }).check();
      await page.getByLabel('Grams', { exact: true }).fill('4');
      await page.getByRole('button', { name: 'Save lot' }).click();
      await page.waitForURL(new RegExp(`/banks/${suite.bankId}/lots/[0-9a-f-]{36}$`));
      // 4 g × 390 seeds per gram (the species' figure) = 1,560 seeds.
      expect(TOMATO_PER_GRAM).toBe(390);
      await expect
        .poll(() => page.getByTestId('amount-words').innerText())
        .toBe(`≈ 1,560 seeds on hand, from 4.0 g at the species' typical 390 seeds/g`);
    });

    j.step('weigh a sample of 100 seeds, with its chaff and clean', async (page) => {
      await page.getByRole('button', { name: 'Weigh a sample' }).click();
      expect(await page.getByLabel('Seeds counted').inputValue()).toBe('100');
      await page.getByLabel(/Their weight/).fill('0.32');
      await page.getByText('I picked out the chaff and weighed the clean seed').click();
      await page.getByLabel('Clean seed weight (g)').fill('0.25');
      expect(await scrollWidth(page)).toBeLessThanOrEqual(PHONE.width);
      await page.getByRole('button', { name: 'Save the sample' }).click();
      // 100 seeds in 0.25 g of clean seed = 400 seeds per gram; 0.25 / 0.32 = 78% clean; so
      // 4 g × 0.78125 × 400 = 1,250 seeds [computed; seedsFromGrams, server/stats].
      await expect
        .poll(() => page.getByRole('status').filter({ hasText: 'Sample saved' }).innerText())
        .toContain('this lot’s 400 seeds per gram and 78% clean seed');
      await expect
        .poll(() => page.getByTestId('amount-words').innerText())
        .toBe(`≈ 1,250 seeds on hand, from 4.0 g at this lot's 400 seeds/g`);
      const figures = await page.getByTestId('seed-weight').innerText();
      expect(figures).toContain('this lot’s own');
      expect(figures).toContain('One sample');
      expect(figures).toMatch(/Clean seed: 78%/);
      // Ready for the next replicate: 100 seeds again, the weights blank, the chaff tick kept.
      expect(await page.getByLabel('Seeds counted').inputValue()).toBe('100');
      expect(await page.getByLabel('Sample weight (g), with chaff').inputValue()).toBe('');
      // The open form and the figures pass axe-core's serious and critical checks.
      expect(await seriousViolations(page)).toEqual([]);
      expect(await scrollWidth(page)).toBeLessThanOrEqual(PHONE.width);
    });

    let adviceBefore = '';
    let bandBefore = '';
    j.step('untested, the lot’s advice is the species’ guess', async (page) => {
      await page.reload();
      await expect.poll(() => page.locator('#lot-advice').innerText()).toContain('Test first');
      adviceBefore = await page.getByTestId('advice-reason').innerText();
      bandBefore = await page.getByTestId('projected-band').innerText();
      expect(bandBefore).toContain('a guess');
    });

    j.step('a week ago, sprinkle 0.2 g of the chaffy seed into a tray', async (page) => {
      lotUrl = page.url();
      await page.goto(`${lotUrl}/tests/new`);
      await page.getByLabel('Start date').fill(WEEK_AGO);
      await page.getByRole('radio', { name: /By weight/ }).check();
      await page.getByLabel('Number of trays').selectOption('1');
      await page.getByLabel('Tray 1, grams').fill('0.2');
      await page.getByRole('button', { name: 'Start the test' }).tap();
      await page.waitForURL(/\/tests\/[^/]+$/);
      // 0.2 g × 78.125% clean × 400 seeds per gram = 62.5 seeds [computed; seedsFromGrams], taken
      // from stock as a whole number.
      await expect
        .poll(() =>
          page
            .getByRole('status')
            .filter({ hasText: /Test started: about 6[23] seeds taken/ })
            .count(),
        )
        .toBe(1);
    });

    j.step('count 40 seedlings today: an estimate, said to be one', async (page) => {
      await page.getByRole('textbox', { name: 'Tray 1 · 0.2 g sown' }).fill('40');
      await page.getByRole('button', { name: /^Save counts for/ }).tap();
      // 40 ÷ 62.5 = 64% [computed].
      await expect.poll(() => page.locator('[data-result="percent"]').innerText()).toBe('about 64%');
      expect(await page.locator('[data-result="interval"]').innerText()).toContain(
        'wider because the seeds sown were estimated',
      );
      expect(await scrollWidth(page)).toBeLessThanOrEqual(PHONE.width);
    });

    j.step('while it runs, the lot waits for it; finished, the advice rests on the tray', async (page) => {
      const testUrl = page.url();
      await page.goto(lotUrl);
      await expect
        .poll(() => page.getByTestId('advice-reason').innerText())
        .toContain('A test of this lot is running');
      await page.goto(testUrl);
      await page.getByRole('button', { name: 'Finish the test…' }).tap();
      const dialog = page.getByRole('dialog', { name: 'Finish the test' });
      await dialog.getByLabel('Finished on').fill(TODAY);
      await dialog.getByRole('button', { name: 'Finish the test' }).tap();
      await expect
        .poll(() => page.getByRole('heading', { name: 'Result: normal seedlings' }).count())
        .toBe(1);
      await page.goto(lotUrl);
      await expect.poll(() => page.getByTestId('advice-reason').innerText()).not.toBe(adviceBefore);
      await expect
        .poll(() => page.getByTestId('advice-reason').innerText())
        .not.toContain('A test of this lot is running');
      expect(await page.locator('#lot-advice').innerText()).not.toContain('Test first');
      const band = await page.getByTestId('projected-band').innerText();
      expect(band).not.toContain('a guess');
      expect(band).not.toBe(bandBefore);
      expect(await scrollWidth(page)).toBeLessThanOrEqual(PHONE.width);
      await page.screenshot({ path: '/tmp/i16/chaffy-lot-after-tray-phone.png', fullPage: true });
    });
  });

  describe('when a grower saves a lot whose amount is not known, then it says so and never reads as zero', () => {
    const j = journeyOfTests(
      'lot-amount-not-known-phone',
      () => suite.browser.newContext({ viewport: PHONE, hasTouch: true, isMobile: true }),
      {
        first: {
          title: 'sign in as grower',
          run: (page) => signInAt(page, suite.server.baseUrl, grower.email, suite.bankId),
        },
      },
    );

    j.step('fill the new-lot form with “Not known”', async (page) => {
      await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/new`);
      const species = page.getByRole('combobox', { name: /Species/ });
      await species.fill('lycopers');
      await page.getByRole('option', { name: /Tomato/ }).click();
      await page.getByLabel('Variety').fill('Jar Behind The Door');
      await page.getByLabel('Harvest date', { exact: true }).fill('2024-08-30');
      await page.getByRole('radio', { name: /Not known/ }).check();
      await expect
        .poll(() => page.getByText('Saved as “amount not known” — not as zero.', { exact: false }).count())
        .toBe(1);
      expect(await scrollWidth(page)).toBeLessThanOrEqual(PHONE.width);
      expect(await seriousViolations(page)).toEqual([]);
    });

    j.step('save: the lot page says the amount is not known', async (page) => {
      await page.getByRole('button', { name: 'Save lot' }).click();
      await page.waitForURL(new RegExp(`/banks/${suite.bankId}/lots/[0-9a-f-]{36}$`));
      await expect.poll(() => page.getByTestId('lot-amount').innerText()).toBe('Amount not known');
      expect(await page.locator('main').innerText()).not.toMatch(/\b0 seeds on hand/);
    });

    j.step('set a counted amount later', async (page) => {
      await page.getByRole('button', { name: 'Set the amount' }).click();
      await page.getByLabel('Seeds on hand').fill('250');
      await page.getByRole('button', { name: 'Save the amount' }).click();
      await expect.poll(() => page.getByTestId('lot-amount').innerText()).toBe('250 seeds on hand');
    });
  });
});
