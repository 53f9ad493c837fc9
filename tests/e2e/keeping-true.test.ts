import type { BrowserContext } from 'playwright-core';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import type { GrowOutResponse } from '#shared/schemas/seed-saving';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '#server/demo/demo-people';
import { browserSuite, chromiumPath, signInThroughApi } from '../helpers/browser';
import { journey, seriousViolations } from '../helpers/journey';
import { speciesId } from '../helpers/lots';

// The circle and its lots are the invented demo season (server/demo/demo-scenario.ts); the
// cucumber plants and lot below are invented for this test. Expected numbers are the reference's as
// read in a garden Seed Saving Chart (shared/species-seed-saving.ts): cucumber insect-pollinated,
// ½ mile (804.672 m, shown as about 805 m) between varieties, 10 plants; lettuce 10 plants.
const NOW = '2026-12-01T09:00:00Z';
const DESKTOP = { width: 1280, height: 900 };
const grower = DEMO_ACCOUNTS.find((a) => a.role === 'grower')!;

describe.skipIf(!chromiumPath)('keeping a variety true, in Chromium', () => {
  const suite = browserSuite({ now: NOW, demo: 'season' });
  let lotId: string;
  let growOut: GrowOutResponse;

  beforeAll(async () => {
    const api = request.agent(suite.server.app);
    expect(
      (await api.post('/api/auth/login').send({ email: grower.email, password: DEMO_PASSWORD })).status,
    ).toBe(200);
    const base = `/api/banks/${suite.bankId}`;
    const cucumber = await speciesId(suite.server.db, 'cucumber');
    const plant = async (label: string, variety: string) => {
      const res = await api
        .post(`${base}/plants`)
        .send({ speciesId: cucumber, label, variety, season: 2026 });
      expect(res.status).toBe(201);
      return res.body.plant.id as string;
    };
    const trellis = await plant('Trellis by the gate', 'Green Ladder');
    await plant('Fence row', 'White Lantern');
    const lot = await api.post(`${base}/lots`).send({
      speciesId: cucumber,
      variety: 'Green Ladder',
      origin: 'saved',
      harvestDate: '2026-09-10',
      seedCount: 150,
      code: 'KT-GL',
      parentPlantIds: [trellis],
      plantsBulked: 4,
    });
    expect(lot.status).toBe(201);
    lotId = lot.body.lot.id;
    growOut = (await api.get(`${base}/grow-out`)).body as GrowOutResponse;
    // The demo's lettuce "Bronze Ripple" is one the advice calls grow-out (tests/api/demo.test.ts).
    expect(growOut.items.map((i) => i.variety)).toContain('Bronze Ripple');
  });

  async function open(path: string) {
    const context: BrowserContext = await suite.browser.newContext({ viewport: DESKTOP });
    await context.clock.setFixedTime(new Date(NOW));
    await signInThroughApi(context, suite.server.baseUrl, grower.email);
    const page = await context.newPage();
    await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}${path}`);
    return { context, page };
  }

  it('when a grower opens the lot, then she sees both warnings with their numbers; once she records the other variety bagged, the crossing warning goes', async () => {
    const { context, page } = await open(`/lots/${lotId}`);
    const steps = journey('keeping-true-lot', page);
    try {
      const card = page.locator('#lot-keeping-true');
      await steps.step('warnings on the lot page', async () => {
        await card.getByRole('heading', { name: 'Keeping the variety true' }).waitFor();
        await expect.poll(() => card.locator('[data-warning]').count()).toBe(2);
        const population = await card.locator('[data-warning="population"]').innerText();
        expect(population).toContain('Seed saved from 4 plants');
        expect(population).toContain('at least 10 plants');
        const crossing = await card.locator('[data-warning="isolation"]').innerText();
        expect(crossing).toContain('“White Lantern”');
        expect(crossing).toContain('no isolation recorded');
        expect(crossing).toContain('about 805 m');
        expect(await seriousViolations(page)).toEqual([]);
      });

      await steps.step('record the other variety bagged', async () => {
        await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/plants`);
        const list = page.getByRole('list', { name: 'Parent plants' });
        await list.getByRole('button', { name: 'Record isolation of Fence row' }).click();
        const form = page.getByRole('form', { name: 'Isolation of Fence row' });
        await form.getByLabel('Kept apart from other varieties').selectOption('bagging');
        await form.getByRole('button', { name: 'Save isolation' }).click();
        await expect.poll(() => list.innerText()).toContain('Flowers bagged or caged');
      });

      await steps.step('only the population warning is left', async () => {
        await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/${lotId}`);
        await card.getByRole('heading', { name: 'Keeping the variety true' }).waitFor();
        await expect.poll(() => card.locator('[data-warning]').count()).toBe(1);
        expect(await card.locator('[data-warning="population"]').count()).toBe(1);
      });
    } finally {
      await context.close();
    }
  });

  it('when a grower opens the overview and the planner, then each lists the varieties to grow out with the plants for seed', async () => {
    const ripple = growOut.items.find((i) => i.variety === 'Bronze Ripple')!;
    for (const path of ['/overview', '/planner']) {
      const { context, page } = await open(path);
      try {
        const card = page.locator('#grow-out');
        // On the overview the list loads once the grower scrolls near it (WhenNear).
        await expect
          .poll(async () => {
            await page.evaluate(() => window.scrollTo(0, document.documentElement.scrollHeight));
            return card.getByRole('heading', { name: 'Grow out for fresh seed' }).count();
          })
          .toBe(1);
        const rows = card.getByRole('list', { name: 'Varieties to grow out' }).getByRole('listitem');
        await expect.poll(() => rows.count()).toBe(growOut.items.length);
        const row = card.locator(`[data-grow-out="${ripple.code}"]`);
        expect(await row.innerText()).toContain('Lettuce · Bronze Ripple');
        // Lettuce: 10 plants for seed (Seed Saving Chart [read]); an annual, seed in 2027.
        expect(await row.locator('[data-plants-for-seed]').innerText()).toBe(
          'Grow at least 10 plants for seed; seed in 2027.',
        );
        expect(await seriousViolations(page)).toEqual([]);
      } finally {
        await context.close();
      }
    }
  });
});
