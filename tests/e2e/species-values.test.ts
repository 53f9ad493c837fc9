// A bank's own values for a species, set on the lot page: hardiness and days to come up (the
// planner's dates) and how the variety is kept true. The people and bank are the invented demo
// scenario of server/demo/demo-people.ts; the lot is invented for this test.
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '#server/demo/demo-people';
import { browserSuite, chromiumPath, signInThroughApi } from '../helpers/browser';
import { speciesId, testedTomatoLot } from '../helpers/lots';

const grower = DEMO_ACCOUNTS.find((a) => a.role === 'grower')!;

describe.skipIf(!chromiumPath)('a bank’s own species values in Chromium', () => {
  const suite = browserSuite({ now: '2026-12-01T09:00:00Z', demo: 'people' });
  let lotId: string;

  beforeAll(async () => {
    const api = request.agent(suite.server.app);
    await api.post('/api/auth/login').send({ email: grower.email, password: DEMO_PASSWORD });
    ({ lotId } = await testedTomatoLot(api, suite.server.db, suite.bankId, {
      variety: 'Values Trial Red',
      seedCount: 200,
      testDate: '2026-11-01',
    }));
  });

  it('when a grower sets tomato as very tender, 5–9 days to come up and 25 plants for seed, then the lot page and the server keep them as the bank’s own', async () => {
    const context = await suite.browser.newContext({ viewport: { width: 390, height: 844 }, isMobile: true });
    await context.clock.setFixedTime(new Date('2026-12-01T09:00:00Z'));
    await signInThroughApi(context, suite.server.baseUrl, grower.email);
    const page = await context.newPage();
    try {
      await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/${lotId}`);
      await page.getByRole('button', { name: 'Set this bank’s values' }).click();
      await page.getByLabel('Hardiness').selectOption('very-tender');
      await page.getByLabel('Fewest days to come up').fill('5');
      await page.getByLabel('Most days to come up').fill('9');
      await page.getByLabel('Plants to save seed from').fill('25');
      await page.getByRole('button', { name: 'Save this bank’s values' }).click();
      // Very tender plants go out 1–2 weeks after the last frost (Purdue Extension HO-203, as
      // shared/plan-dates.ts reads it), after the bank's margin like every tender kind.
      await expect
        .poll(() => page.getByText('Very tender: out 1–2 weeks after the last frost').count())
        .toBe(1);
      expect(await page.getByText('5–9 days', { exact: true }).count()).toBe(1);

      const api = request.agent(suite.server.app);
      await api.post('/api/auth/login').send({ email: grower.email, password: DEMO_PASSWORD });
      const tomato = await speciesId(suite.server.db, 'tomato');
      const read = await api.get(`/api/banks/${suite.bankId}/species?limit=500`);
      const sp = read.body.items.find((s: { id: string }) => s.id === tomato);
      expect(sp.traits).toMatchObject({
        hardiness: 'very-tender',
        emergeDaysMin: 5,
        emergeDaysMax: 9,
        minPlantsForSeed: 25,
      });
      // Only what was changed became the bank's own; the rest still follows the reference.
      expect([...sp.overridden].sort()).toEqual([
        'emergeDaysMax',
        'emergeDaysMin',
        'hardiness',
        'minPlantsForSeed',
      ]);
    } finally {
      await context.close();
    }
  });
});
