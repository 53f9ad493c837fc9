import type { Locator, Page } from 'playwright-core';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '#server/demo/demo-people';
import { browserSuite, chromiumPath, signInAt } from '../helpers/browser';
import { testedTomatoLot } from '../helpers/lots';

// The people and the bank are the invented demo scenario of server/demo/demo-people.ts; the lots are
// invented here.
const grower = DEMO_ACCOUNTS.find((a) => a.role === 'grower')!;
// 390 × 844 CSS pixels: a common phone held upright (from memory; the project's other phone tests use it).
const PHONE = { width: 390, height: 844 };
// A variety name with no space to break at, as long as a lot allows (120 characters: lot schema).
const LONG_VARIETY = 'Ribbedoxheartpasteheirloom'.repeat(4).slice(0, 120);

describe.skipIf(!chromiumPath)('at the bench on a phone in Chromium', () => {
  const suite = browserSuite({ now: '2026-02-20T09:00:00Z', demo: 'people' });
  let page: Page;
  let lot: { lotId: string; lotCode: string };
  let longLot: { lotId: string; lotCode: string };

  beforeAll(async () => {
    const api = request.agent(suite.server.app);
    expect(
      (await api.post('/api/auth/login').send({ email: grower.email, password: DEMO_PASSWORD })).status,
    ).toBe(200);
    lot = await testedTomatoLot(api, suite.server.db, suite.bankId, {
      variety: 'Bench Early',
      seedCount: 400,
      testDate: '2026-01-10',
    });
    longLot = await testedTomatoLot(api, suite.server.db, suite.bankId, {
      variety: LONG_VARIETY,
      seedCount: 400,
      testDate: '2026-01-12',
    });
    const context = await suite.browser.newContext({ viewport: PHONE, hasTouch: true, isMobile: true });
    page = await context.newPage();
    await signInAt(page, suite.server.baseUrl, grower.email, suite.bankId);
  }, 120_000);
  afterAll(async () => {
    await page?.context().close();
  });

  /** The first screen: below the top bar's start and above the phone's bottom navigation. */
  async function firstScreenBottom() {
    // The bank's navigation sits fixed along the bottom of a phone's screen (app-shell.tsx).
    const navs = await page.getByRole('navigation', { name: 'Bank' }).all();
    let bottom = PHONE.height;
    for (const nav of navs) {
      const box = await nav.boundingBox();
      if (box && box.y > PHONE.height / 2) bottom = Math.min(bottom, box.y);
    }
    return bottom;
  }
  async function inFirstScreen(locator: Locator) {
    await locator.waitFor();
    const box = (await locator.boundingBox())!;
    expect(box.y).toBeGreaterThanOrEqual(0);
    expect(box.y + box.height).toBeLessThanOrEqual(await firstScreenBottom());
  }
  const noSideways = async () =>
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(PHONE.width);

  it('when a lot page opens, then its decision, projected germination and seeds to sow are in the first screen', async () => {
    await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/${lot.lotId}`);
    await page.getByRole('heading', { name: lot.lotCode }).waitFor();
    const advice = page.locator('#lot-advice');
    await inFirstScreen(advice.getByTestId('advice-decision'));
    await inFirstScreen(advice.getByTestId('advice-reason'));
    await inFirstScreen(advice.getByTestId('projected-band'));
    await expect.poll(() => page.getByTestId('seeds-to-sow').textContent()).toMatch(/sow \d+ seeds/);
    await inFirstScreen(page.getByTestId('seeds-to-sow'));
    expect(await page.evaluate(() => window.scrollY)).toBe(0);
  });

  it('when the lots list opens, then the first lot is in the first screen and the filters open from one button', async () => {
    await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots`);
    await inFirstScreen(page.getByRole('link', { name: lot.lotCode }).first());
    const filters = page.getByRole('button', { name: /Filters and sowing date/ });
    expect(await page.getByLabel('Species').isVisible()).toBe(false);
    await filters.tap();
    await page.getByLabel('Species').waitFor();
    expect(await filters.getAttribute('aria-expanded')).toBe('true');
  });

  it('when a variety is one 120-character word, then the lot page, the lots list and the test page wrap it and never scroll sideways', async () => {
    await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/${longLot.lotId}`);
    await page.getByRole('heading', { name: longLot.lotCode }).waitFor();
    await noSideways();
    await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots?q=Ribbedoxheart`);
    await page.getByRole('link', { name: longLot.lotCode }).first().waitFor();
    await noSideways();
    await page.getByRole('link', { name: longLot.lotCode }).first().tap();
    await page.getByRole('heading', { name: longLot.lotCode }).waitFor();
    await page
      .locator('#lot-tests')
      .getByRole('link', { name: /Started/ })
      .tap();
    await page.getByRole('heading', { name: /Tomato · Ribbedoxheart/ }).waitFor();
    await noSideways();
  });
});
