import type { BrowserContext, Page } from 'playwright-core';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '#server/demo/demo-people';
import { browserSuite, chromiumPath, signInThroughApi } from '../helpers/browser';
import { journey, seriousViolations } from '../helpers/journey';
import { speciesId } from '../helpers/lots';

// The people and the bank are the invented demo scenario of server/demo/demo-people.ts (last spring
// frost 05-24, a 10-day margin); the plan and the shelf below are invented for this test.
const grower = DEMO_ACCOUNTS.find((a) => a.role === 'grower')!;
const viewer = DEMO_ACCOUNTS.find((a) => a.role === 'viewer')!;

const NOW = '2026-12-01T09:00:00Z';
// 375 CSS pixels wide: a small phone held upright (the brief's phone width).
const PHONE = { width: 375, height: 740 };
const DESKTOP = { width: 1280, height: 900 };

/*
 * By hand. 40 tomato plants from 50 seeds, sown from the window's first day: 24 May 2027 − 56 days =
 * 29 Mar (tomato 8–6 weeks before the frost, the reference set). Seed tray: 50 cells (one a seed)
 * 29 Mar – 18 Apr; potted up 3 weeks on (first true leaves at 2–3 weeks, read; the upper end) on
 * 19 Apr into pots of 4 cells (a 1020 flat holds 18 pots or 72 cells: 72 ÷ 18 = 4): 40 × 4 = 160
 * cells until hardening off on 27 May (frost + 10-day margin − 7 days). The shelf: 2 trays × 72
 * cells = 144. Weeks from Monday: 29 Mar, 5 Apr, 12 Apr 50 cells; 19 Apr to the week of 24 May
 * 160 > 144: six weeks overflow.
 */
const OVERFLOW_WEEKS = ['19 Apr', '26 Apr', '3 May', '10 May', '17 May', '24 May'];
const FIRST_WARNING = 'Week of 19 Apr 2027: 160 cells needed, 144 fit';

describe.skipIf(!chromiumPath)('the room under the lights in Chromium', () => {
  const suite = browserSuite({ now: NOW, demo: 'people' });

  beforeAll(async () => {
    const api = request.agent(suite.server.app);
    expect(
      (await api.post('/api/auth/login').send({ email: grower.email, password: DEMO_PASSWORD })).status,
    ).toBe(200);
    const base = `/api/banks/${suite.bankId}`;
    const entry = await api.post(`${base}/plan`).send({
      season: 2027,
      speciesId: await speciesId(suite.server.db, 'tomato'),
      plantsWanted: 40,
      start: 'indoors',
    });
    expect(entry.status).toBe(201);
    // No tested lot in this bank, so the plan has no seeds to sow of its own: 50, for round cells.
    await suite.server.db
      .updateTable('plan_entries')
      .set({ seeds_to_sow: 50 })
      .where('id', '=', entry.body.entry.id)
      .execute();
    expect(
      (await api.post(`${base}/spaces`).send({ name: 'Shelf by the boiler', capacity: 2, unit: 'trays' }))
        .status,
    ).toBe(201);
  });

  async function open(viewport: { width: number; height: number }, email: string, phone = false) {
    const context: BrowserContext = await suite.browser.newContext({
      viewport,
      hasTouch: phone,
      isMobile: phone,
    });
    await context.clock.setFixedTime(new Date(NOW));
    await signInThroughApi(context, suite.server.baseUrl, email);
    const page = await context.newPage();
    await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/planner`);
    return { context, page };
  }
  const card = (page: Page) => page.locator('#plan-space');
  const warnings = (page: Page) =>
    card(page).getByRole('list', { name: 'Weeks that overflow' }).getByRole('listitem');

  it('when the plan needs more room than the shelf holds, then the planner draws the chart and names the weeks that overflow; a grower adds a space and it fits', async () => {
    const { context, page } = await open(DESKTOP, grower.email);
    const steps = journey('plan-space-grower', page);
    try {
      await steps.step('chart and warning', async () => {
        await card(page).getByRole('heading', { name: 'Room under the lights' }).waitFor();
        await card(page).locator('[data-chart="space"] svg.recharts-surface').first().waitFor();
        await expect.poll(() => warnings(page).allInnerTexts()).toHaveLength(OVERFLOW_WEEKS.length);
        const texts = await warnings(page).allInnerTexts();
        expect(texts[0]).toBe(FIRST_WARNING);
        expect(texts.map((t) => t.replace(/^Week of (\d+ \w+) 2027:.*$/, '$1'))).toEqual(OVERFLOW_WEEKS);
        expect(await card(page).getByText('Not enough room under the lights in 6 weeks').count()).toBe(1);
        // One bar a week, 29 Mar to the week of 24 May: nine.
        await expect
          .poll(() => card(page).locator('[data-chart="space"] .recharts-bar-rectangle').count())
          .toBe(9);
      });

      await steps.step('add a space', async () => {
        await card(page).getByRole('button', { name: 'Add a space' }).click();
        const form = card(page).getByRole('form', { name: 'New growing space' });
        await form.getByLabel('Name').fill('Lit box on the landing');
        await form.getByLabel('How many fit').fill('20');
        await form.getByLabel('Counted in').selectOption('cells');
        await form.getByRole('button', { name: 'Add space' }).click();
        // 144 + 20 = 164 cells ≥ 160 in the busiest weeks.
        await card(page).getByText('Everything fits under the lights').waitFor();
        expect(await card(page).getByText('needs 160 of 164 cells').count()).toBe(1);
        expect(await warnings(page).count()).toBe(0);
        expect(await card(page).getByRole('list', { name: 'Growing spaces' }).innerText()).toContain(
          'Lit box on the landing',
        );
      });

      await steps.step('remove it again', async () => {
        await card(page).getByRole('button', { name: 'Remove Lit box on the landing' }).click();
        await page.getByRole('dialog').getByRole('button', { name: 'Remove' }).click();
        await expect.poll(() => warnings(page).count()).toBe(OVERFLOW_WEEKS.length);
      });

      // With no space at all the card says what the season needs (160 cells in the busiest week,
      // as above), not that every week overflows; the shelf goes back for the next test.
      await steps.step('no space at all', async () => {
        await card(page).getByRole('button', { name: 'Remove Shelf by the boiler' }).click();
        await page.getByRole('dialog').getByRole('button', { name: 'Remove' }).click();
        await card(page).getByText('Room the season needs').waitFor();
        expect(
          await card(page)
            .getByText(/needs 160 cells/)
            .count(),
        ).toBe(1);
        expect(await warnings(page).count()).toBe(0);
        // …and no bar is drawn as too many (the clay of space-chart.tsx).
        const bars = card(page).locator('[data-chart="space"] .recharts-bar-rectangle path');
        await expect.poll(() => bars.count()).toBe(9);
        expect(await bars.evaluateAll((ps) => ps.map((p) => p.getAttribute('fill')))).not.toContain(
          '#a2462a',
        );
        const api = request.agent(suite.server.app);
        await api.post('/api/auth/login').send({ email: grower.email, password: DEMO_PASSWORD });
        const shelf = { name: 'Shelf by the boiler', capacity: 2, unit: 'trays' };
        expect((await api.post(`/api/banks/${suite.bankId}/spaces`).send(shelf)).status).toBe(201);
      });
    } finally {
      await context.close();
    }
  });

  it('when a viewer opens the planner on a 375 px phone, then the chart and the warning fit the screen and nothing can be changed', async () => {
    const { context, page } = await open(PHONE, viewer.email, true);
    const steps = journey('plan-space-phone', page);
    try {
      await steps.step('phone', async () => {
        await card(page).locator('[data-chart="space"] svg.recharts-surface').first().waitFor();
        await expect.poll(() => warnings(page).count()).toBe(OVERFLOW_WEEKS.length);
        expect(await warnings(page).first().innerText()).toBe(FIRST_WARNING);
        expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
          PHONE.width,
        );
        const box = await card(page).locator('[data-chart="space"]').boundingBox();
        expect(box!.width).toBeLessThanOrEqual(PHONE.width);
        expect(
          await card(page)
            .getByRole('button', { name: /Add a space|Change|Remove/ })
            .count(),
        ).toBe(0);
        expect(await card(page).getByText('Shelf by the boiler', { exact: true }).count()).toBe(1);
        expect(await seriousViolations(page)).toEqual([]);
      });
    } finally {
      await context.close();
    }
  });
});
