import type { Page } from 'playwright-core';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '#server/demo/demo-people';
import { browserSuite, chromiumPath, signInAt } from '../helpers/browser';
import { journey } from '../helpers/journey';
import { speciesId } from '../helpers/lots';

// The invented demo people and bank (last spring frost 05-24, a 10-day margin).
const grower = DEMO_ACCOUNTS.find((a) => a.role === 'grower')!;
const owner = DEMO_ACCOUNTS.find((a) => a.role === 'owner')!;
const NOW = '2026-12-01T09:00:00Z';
const DESKTOP = { width: 1280, height: 900 };

describe.skipIf(!chromiumPath)('a plan that follows its inputs, in Chromium', () => {
  const suite = browserSuite({ now: NOW, demo: 'people' });
  let entryId: string;

  beforeAll(async () => {
    const api = request.agent(suite.server.app);
    expect(
      (await api.post('/api/auth/login').send({ email: grower.email, password: DEMO_PASSWORD })).status,
    ).toBe(200);
    const planned = await api.post(`/api/banks/${suite.bankId}/plan`).send({
      season: 2027,
      speciesId: await speciesId(suite.server.db, 'tomato'),
      plantsWanted: 6,
      start: 'indoors',
    });
    expect(planned.status).toBe(201);
    entryId = planned.body.entry.id;
    // Tomato 8–6 weeks before 24 May (reference set, common practice): 29 Mar – 12 Apr.
    expect(planned.body.entry).toMatchObject({ sowFrom: '2027-03-29', sowTo: '2027-04-12' });
  });

  async function open(email: string): Promise<Page> {
    const context = await suite.browser.newContext({ viewport: DESKTOP });
    await context.clock.setFixedTime(new Date(NOW));
    const page = await context.newPage();
    await signInAt(page, suite.server.baseUrl, email, suite.bankId);
    return page;
  }

  it('when the owner moves the last frost a week later, then Settings and the planner say what moved and the card shows the new window', async () => {
    const page = await open(owner.email);
    const steps = journey('plan-follows-frost', page);
    await steps.step('settings', async () => {
      await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/settings`);
      await page.getByLabel('Last spring frost').fill('05-31');
      await page.getByRole('button', { name: 'Save settings' }).click();
      await expect
        .poll(() => page.getByRole('status').filter({ hasText: 'Saved.' }).innerText())
        .toContain(
          'Season 2027: Last frost moved 24 May → 31 May: 1 unsown sowing moved 7 days later; sown ones keep their dates.',
        );
    });
    await steps.step('planner', async () => {
      await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/planner`);
      await expect
        .poll(() => page.locator('[data-plan-moved]').innerText())
        .toContain('Last frost moved 24 May → 31 May: 1 unsown sowing moved 7 days later');
      // 31 May − 56 days = 5 Apr; − 42 days = 19 Apr.
      await expect
        .poll(() => page.locator(`article[data-entry="${entryId}"] [data-fact="sow"] dd`).innerText())
        .toBe('5 Apr – 19 Apr');
    });
    await page.context().close();
  });

  it('when a grower adds lettuce as a succession of 3 sowings 2 weeks apart, then three cards follow each other', async () => {
    const page = await open(grower.email);
    const steps = journey('plan-follows-succession', page);
    await steps.step('add', async () => {
      await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/planner`);
      await page.getByRole('combobox', { name: /Species/ }).fill('lettuce');
      await page.getByRole('option', { name: /Lettuce/ }).click();
      await page.getByRole('radio', { name: 'Direct' }).check();
      await page.getByLabel('Sow more than once, a few weeks apart').check();
      await page.getByRole('spinbutton', { name: 'Number of sowings' }).fill('3');
      await page.getByRole('spinbutton', { name: 'Weeks apart' }).fill('2');
      await page.getByRole('button', { name: 'Add to plan' }).click();
      // Lettuce very hardy (Purdue Extension HO-203): outside 6–4 weeks before 31 May (the frost set
      // above): 19 Apr – 3 May, then every 14 days.
      await expect
        .poll(() => page.getByText(/^Added Lettuce: 3 sowings/).innerText())
        .toBe(
          'Added Lettuce: 3 sowings, the first between 19 Apr and 3 May, the last between 17 May and 31 May.',
        );
      const cards = page.locator('article[data-entry]').filter({ hasText: 'Lettuce' });
      await expect.poll(() => cards.count()).toBe(3);
      expect(await cards.locator('[data-succession]').allInnerTexts()).toEqual([
        'Sowing 1 of 3, every 2 weeks',
        'Sowing 2 of 3, every 2 weeks',
        'Sowing 3 of 3, every 2 weeks',
      ]);
      expect(await cards.locator('[data-fact="sow"] dd').allInnerTexts()).toEqual([
        '19 Apr – 3 May',
        '3 May – 17 May',
        '17 May – 31 May',
      ]);
    });
    await page.context().close();
  });
});
