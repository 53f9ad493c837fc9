import type { Page } from 'playwright-core';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD, DEMO_TIME_ZONE } from '#server/demo/demo-people';
import { browserSuite, chromiumPath, signInAt } from '../helpers/browser';

// The people and the bank below are the invented demo scenario of server/demo/demo-people.ts.
const owner = DEMO_ACCOUNTS.find((a) => a.role === 'owner')!;
const grower = DEMO_ACCOUNTS.find((a) => a.role === 'grower')!;

// 390 × 844 CSS pixels: the viewport of a common mid-size phone held upright (from memory).
const PHONE = { width: 390, height: 844 };

describe.skipIf(!chromiumPath)('reminders that fit, in Chromium', () => {
  const suite = browserSuite({ now: '2026-03-10T09:00:00Z', demo: 'people' });
  let assayId: string;

  beforeAll(async () => {
    // A lot and a test started by the grower, through the API.
    const api = request.agent(suite.server.app);
    expect(
      (await api.post('/api/auth/login').send({ email: grower.email, password: DEMO_PASSWORD })).status,
    ).toBe(200);
    const species = await api.get(`/api/banks/${suite.bankId}/species?limit=500`);
    const tomato = (species.body.items as { id: string; commonName: string }[]).find(
      (s) => s.commonName === 'Tomato',
    )!;
    const lot = await api.post(`/api/banks/${suite.bankId}/lots`).send({
      speciesId: tomato.id,
      variety: 'Runner Red',
      origin: 'saved',
      harvestDate: '2025-09-10',
      seedCount: 300,
    });
    expect(lot.status).toBe(201);
    const assay = await api.post(`/api/banks/${suite.bankId}/lots/${lot.body.lot.id}/tests`).send({
      startDate: '2026-03-05',
      method: 'paper towel',
      trays: [{ seedsSown: 25 }, { seedsSown: 25 }],
    });
    expect(assay.status).toBe(201);
    assayId = assay.body.test.id;
  });

  const signIn = (page: Page, email: string) => signInAt(page, suite.server.baseUrl, email, suite.bankId);

  it('when a grower picks 6 p.m. under Account → Reminders, then the server keeps it and the page says it in the bank’s zone', async () => {
    const page = await suite.browser.newPage({ viewport: PHONE });
    await signIn(page, grower.email);
    await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/reminders`);
    const hour = page.getByLabel('Send my reminders at');
    await expect.poll(() => hour.inputValue()).toBe('7');
    // The demo bank keeps a real IANA time zone, not UTC.
    expect(await page.locator('main').innerText()).toContain(DEMO_TIME_ZONE);
    await hour.selectOption({ label: '6 p.m.' });
    await expect
      .poll(() => page.getByRole('status').filter({ hasText: 'Saved' }).innerText())
      .toBe('Saved: reminders at 6 p.m.');
    const row = await suite.server.db
      .selectFrom('memberships')
      .innerJoin('users', 'users.id', 'memberships.user_id')
      .select('memberships.remind_hour')
      .where('users.email', '=', grower.email)
      .executeTakeFirstOrThrow();
    expect(row.remind_hour).toBe(18);
    await page.reload();
    await expect.poll(() => page.getByLabel('Send my reminders at').inputValue()).toBe('18');
    expect(await page.locator('main').innerText()).toContain('from 6 p.m. on the bank’s clock');
    await page.close();
  });

  it('when the owner hands a running test to themself, then the test page and the server name the new runner', async () => {
    const page = await suite.browser.newPage({ viewport: PHONE });
    await signIn(page, owner.email);
    await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/tests/${assayId}`);
    const runner = page.getByTestId('assay-runner');
    await expect.poll(() => runner.innerText()).toContain(`Run by ${grower.name}`);
    await page.getByLabel('Hand the test to').selectOption({ label: owner.name });
    await expect
      .poll(() => page.getByRole('status').filter({ hasText: 'runs this test now' }).innerText())
      .toBe(`Saved: ${owner.name} runs this test now.`);
    await expect.poll(() => runner.innerText()).toContain(`Run by ${owner.name}`);
    const test = await suite.server.db
      .selectFrom('germination_tests')
      .innerJoin('users', 'users.id', 'germination_tests.run_by')
      .select('users.email')
      .where('germination_tests.id', '=', assayId)
      .executeTakeFirstOrThrow();
    expect(test.email).toBe(owner.email);
    await page.close();
  });
});
