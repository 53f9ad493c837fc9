import jStat from 'jstat';
import type { Page } from 'playwright-core';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '#server/demo/demo-people';
import { browserSuite, chromiumPath, signInAt } from '../helpers/browser';
import { journeyOfTests } from '../helpers/journey';

// The people and the bank are the invented demo scenario of server/demo/demo-people.ts; the lot below is
// invented for this test.
const grower = DEMO_ACCOUNTS.find((a) => a.role === 'grower')!;
const viewer = DEMO_ACCOUNTS.find((a) => a.role === 'viewer')!;

// 390 × 844 CSS pixels: the viewport of a common mid-size phone held upright (from memory).
const PHONE = { width: 390, height: 844 };

/**
 * The 95% Wilson score interval in percent, by its published formula (Wilson 1927, J. Am. Stat.
 * Assoc. 22:209–212; formula from memory), with z = Φ⁻¹(0.975) from jstat, a reference library.
 */
function wilsonPercent(x: number, n: number): { low: number; high: number } {
  const z = jStat.normal.inv(0.975, 0, 1);
  const p = x / n;
  const denominator = 1 + (z * z) / n;
  const centre = (p + (z * z) / (2 * n)) / denominator;
  const half = (z * Math.sqrt((p * (1 - p)) / n + (z * z) / (4 * n * n))) / denominator;
  return { low: 100 * (centre - half), high: 100 * (centre + half) };
}

describe.skipIf(!chromiumPath)('the germination test page in Chromium', () => {
  const suite = browserSuite({ now: '2026-03-10T09:00:00Z', demo: 'people' });
  let assayId: string;
  let trayIds: string[];

  beforeAll(async () => {
    // The lot and a 4-tray test, through the API as the grower.
    const api = request.agent(suite.server.app);
    expect(
      (await api.post('/api/auth/login').send({ email: grower.email, password: DEMO_PASSWORD })).status,
    ).toBe(200);
    const species = await api.get(`/api/banks/${suite.bankId}/species`);
    const tomato = (species.body.items as { id: string; commonName: string }[]).find((s) =>
      /^tomato$/i.test(s.commonName),
    );
    expect(tomato).toBeDefined();
    const lot = await api.post(`/api/banks/${suite.bankId}/lots`).send({
      speciesId: tomato!.id,
      variety: 'Bench Test Red',
      origin: 'saved',
      harvestDate: '2025-09-10',
      seedCount: 300,
    });
    expect(lot.status).toBe(201);
    const assay = await api.post(`/api/banks/${suite.bankId}/lots/${lot.body.lot.id}/tests`).send({
      startDate: '2026-03-05',
      method: 'paper towel',
      temperatureC: 24,
      trays: [{ seedsSown: 25 }, { seedsSown: 25 }, { seedsSown: 25 }, { seedsSown: 25 }],
    });
    expect(assay.status).toBe(201);
    assayId = assay.body.test.id;
    trayIds = (assay.body.trays as { id: string }[]).map((t) => t.id);
  });

  const signIn = (page: Page, email: string) => signInAt(page, suite.server.baseUrl, email, suite.bankId);

  const percentText = (page: Page) => page.locator('[data-result="percent"]').innerText();
  const curvePaths = (page: Page) =>
    page.locator('[data-chart="germination-curve"] path.recharts-line-curve').count();
  const trayField = (page: Page, n: number) => page.getByRole('textbox', { name: `Tray ${n} · 25 sown` });

  /** Sets the check date, waits for the rows of that date to replace the old ones, types the counts. */
  async function enterCounts(page: Page, date: string, dayLabel: string, values: number[]) {
    await page.getByLabel('Check date').fill(date);
    await page.getByRole('button', { name: `Save counts for ${dayLabel}` }).waitFor();
    for (const [i, value] of values.entries()) await trayField(page, i + 1).fill(String(value));
    for (const [i, value] of values.entries())
      expect(await trayField(page, i + 1).inputValue()).toBe(String(value));
  }

  // One test per step on a page shared by the block: the whole journey in one test ran near the 60 s
  // timeout on a busy machine.
  describe('when a grower enters two check days on a phone, then the result panel and the curve follow the counts', () => {
    const j = journeyOfTests(
      'germination-phone',
      () => suite.browser.newContext({ viewport: PHONE, hasTouch: true }),
      {
        first: { title: 'sign in as a grower', run: (page) => signIn(page, grower.email) },
      },
    );
    // The pooled curve after the first check day, for the second to change.
    let firstCurve: string | null = null;

    j.step('the first check day', async (page) => {
      await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/tests/${assayId}`);
      await trayField(page, 4).waitFor();
      expect(await percentText(page)).toBe('–');
      // Day 5 of a test started 03-05; tomato's first/final count days are 5/14 (REFERENCES.md, from
      // memory), so the schedule names 10 and 19 March.
      await expect.poll(() => page.locator('main').innerText()).toContain('First count around 10 Mar 2026');

      // First check day (the browser's own clock is real, so the date is set by hand).
      await enterCounts(page, '2026-03-10', 'Tue 10 Mar', [7, 12, 9, 11]);
      const plus = page.getByRole('button', { name: 'One more in tray 1' });
      const box = await plus.boundingBox();
      // Tap targets at the bench are at least 56 px (our own rule, above WCAG's 44 px minimum, from memory).
      expect(box!.width).toBeGreaterThanOrEqual(56);
      expect(box!.height).toBeGreaterThanOrEqual(56);
      for (let i = 0; i < 3; i += 1) await plus.tap();
      expect(await trayField(page, 1).inputValue()).toBe('10');
      await page.getByRole('button', { name: 'Save counts for Tue 10 Mar' }).tap();
      await expect
        .poll(() => page.getByRole('status').filter({ hasText: 'Saved the counts of' }).count())
        .toBe(1);
      // 10 + 12 + 9 + 11 = 42 of 100 sown → 42%, reported as a whole number (ISTA Rules ch. 5).
      await expect.poll(() => percentText(page)).toBe('42%');
      // Four trays and the pooled line.
      await expect.poll(() => curvePaths(page)).toBe(5);
      firstCurve = await page
        .locator('[data-chart="germination-curve"] path.recharts-line-curve')
        .last()
        .getAttribute('d');
    });

    j.step('counts below earlier ones refused by their trays', async (page) => {
      // Second check day, four days later. Counts below earlier ones are refused, each next to its own tray.
      await suite.server.clock.set('2026-03-14T09:00:00Z');
      await enterCounts(page, '2026-03-14', 'Sat 14 Mar', [20, 10, 8, 21]);
      await page.getByRole('button', { name: /^Save counts for/ }).tap();
      const tray2 = page.locator('li[data-tray="2"]');
      const tray3 = page.locator('li[data-tray="3"]');
      await expect
        .poll(() => tray2.getByRole('alert').innerText())
        .toMatch(/^Tray 2: 10 is fewer than the 12 counted on 10 Mar 2026/);
      expect(await tray3.getByRole('alert').innerText()).toMatch(
        /^Tray 3: 8 is fewer than the 9 counted on 10 Mar 2026/,
      );
      expect(await tray2.getByRole('alert').innerText()).not.toContain('Tray 3');
      for (const n of [1, 4])
        expect(await page.locator(`li[data-tray="${n}"]`).getByRole('alert').count()).toBe(0);
      expect(
        await page
          .getByRole('alert')
          .filter({ hasText: 'Not saved: check the 2 trays marked below.' })
          .count(),
      ).toBe(1);
    });

    j.step('typed numbers survive a reload', async (page) => {
      await trayField(page, 3).fill('19');
      await trayField(page, 2).fill('22');
      await page.reload();
      await trayField(page, 2).waitFor();
      for (const [i, value] of ['20', '22', '19', '21'].entries())
        expect(await trayField(page, i + 1).inputValue()).toBe(value);
      await expect.poll(() => page.getByRole('status').filter({ hasText: 'not saved yet' }).count()).toBe(1);
    });

    j.step('and a dropped connection', async (page) => {
      // The request fails as it does with the network gone: the counts wait on the device to be sent.
      const countsUrl = `**/api/banks/${suite.bankId}/tests/${assayId}/counts`;
      await page.route(countsUrl, (route) => route.abort('internetdisconnected'));
      await page.getByRole('button', { name: /^Save counts for/ }).tap();
      const waiting = page.locator('[data-queued-writes] [data-waiting]');
      await expect.poll(() => waiting.count()).toBe(1);
      expect(await waiting.innerText()).toContain('Waiting to send: counts of Sat 14 Mar');
      expect(await trayField(page, 2).inputValue()).toBe('22');
      await page.unroute(countsUrl);
      await waiting.getByRole('button', { name: 'Send now' }).tap();
      await expect.poll(() => waiting.count()).toBe(0);
    });

    j.step('the result and the curve follow', async (page) => {
      // 20 + 22 + 19 + 21 = 82 of 100 → 82%.
      await expect.poll(() => percentText(page)).toBe('82%');
      const wilson = wilsonPercent(82, 100);
      await expect
        .poll(() => page.locator('[data-result="interval"]').innerText())
        .toContain(`Likely between ${Math.round(wilson.low)}% and ${Math.round(wilson.high)}%`);
      // Trays at 80, 88, 76 and 84% differ by 12 points; for 25-seed replicates at a mean of 82% the
      // tolerated range is about 3.98·√(82·18/25) ≈ 31 points (Miles 1963 via da Silva 2020, REFERENCES.md).
      expect(await page.locator('[data-agreement]').getAttribute('data-agreement')).toBe('ok');
      await expect
        .poll(() => page.getByRole('list', { name: 'What the result means' }).innerText())
        .toContain('About 82% so far — 82 normal seedlings');
      await expect.poll(() => curvePaths(page)).toBe(5);
      expect(
        await page
          .locator('[data-chart="germination-curve"] path.recharts-line-curve')
          .last()
          .getAttribute('d'),
      ).not.toBe(firstCurve);
      await expect.poll(() => page.locator('tr[data-count-date]').count()).toBe(2);

      // The server holds what the page shows.
      const saved = await suite.server.db
        .selectFrom('tray_counts')
        .select(['tray_id', 'cumulative'])
        .where('check_date', '=', '2026-03-14')
        .where('tray_id', 'in', trayIds)
        .execute();
      expect(trayIds.map((id) => saved.find((r) => r.tray_id === id)?.cumulative)).toEqual([20, 22, 19, 21]);
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
        PHONE.width,
      );
    });
  });

  it('when a viewer opens the test, then they see the result and curve with no count entry or actions', async () => {
    const page = await suite.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, viewer.email);
    await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/tests/${assayId}`);
    await expect.poll(() => percentText(page)).toBe('82%');
    await expect.poll(() => curvePaths(page)).toBe(5);
    expect(await page.getByLabel('Check date').count()).toBe(0);
    expect(await page.getByRole('button', { name: /^Save counts/ }).count()).toBe(0);
    expect(await page.getByRole('button', { name: /^Delete/ }).count()).toBe(0);
    expect(await page.getByRole('button', { name: /^Finish/ }).count()).toBe(0);
    await page.close();
  });

  it('when a grower finishes the test, then each tray adds up as it is typed and the page turns read-only', async () => {
    const page = await suite.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, grower.email);
    await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/tests/${assayId}`);
    await page.getByRole('button', { name: 'Finish the test…' }).click();
    const dialog = page.getByRole('dialog', { name: 'Finish the test' });
    await dialog.getByLabel('Finished on').fill('2026-03-14');
    const tray1 = dialog.getByRole('listitem').filter({ hasText: 'Tray 1 · 25 sown' });
    await tray1.getByLabel('Abnormal').fill('2');
    // Normal + abnormal + ungerminated = seeds sown (REFERENCES.md: the fractions make 100%, from memory).
    await expect
      .poll(() => tray1.locator('[data-tray-sum]').innerText())
      .toBe('20 normal + 2 abnormal + 3 ungerminated = 25 ✓ matches the 25 sown');
    await tray1.getByLabel('Ungerminated').fill('4');
    await expect.poll(() => tray1.locator('[data-tray-sum]').innerText()).toContain('= 26 — should be 25');
    await tray1.getByLabel('Ungerminated').fill('3');
    await dialog.getByRole('button', { name: 'Finish the test' }).click();
    await expect
      .poll(() => page.getByRole('status').filter({ hasText: 'Finished on 14 Mar 2026' }).count())
      .toBe(1);
    expect(await page.getByLabel('Check date').count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Reopen to change counts' }).count()).toBe(1);

    const row = await suite.server.db
      .selectFrom('germination_tests')
      .select(['status', 'finished_on'])
      .where('id', '=', assayId)
      .executeTakeFirstOrThrow();
    expect(row).toEqual({ status: 'finished', finished_on: '2026-03-14' });
    const tray = await suite.server.db
      .selectFrom('test_trays')
      .select(['abnormal', 'ungerminated'])
      .where('id', '=', trayIds[0]!)
      .executeTakeFirstOrThrow();
    expect(tray).toEqual({ abnormal: 2, ungerminated: 3 });
    await page.close();
  });

  it('when a grower starts a test from the lot page, then its seeds leave the stock and the test page opens', async () => {
    const page = await suite.browser.newPage({ viewport: PHONE, hasTouch: true });
    await signIn(page, grower.email);
    const lotId = (
      await suite.server.db
        .selectFrom('germination_tests')
        .select('lot_id')
        .where('id', '=', assayId)
        .executeTakeFirstOrThrow()
    ).lot_id;
    await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/${lotId}`);
    const assays = page.locator('#lot-tests');
    await expect.poll(() => assays.getByRole('listitem').count()).toBe(1);
    await expect.poll(() => assays.getByRole('listitem').innerText()).toContain('Finished');
    await assays.getByRole('link', { name: 'Start a test' }).tap();
    await page.getByLabel('Start date').fill('2026-03-14');
    await page.getByLabel('Method').selectOption('tray of mix');
    // A tray of mix may be moistened with boiling water: the scald caution shows (common practice).
    await expect.poll(() => page.locator('[data-caution="scald"]').count()).toBe(1);
    await page.getByLabel('Number of trays').selectOption('2');
    await page.getByLabel('Seeds in each tray').fill('20');
    await expect
      .poll(() => page.getByText(/seeds will be taken from the lot/).innerText())
      .toMatch(/^40 seeds will be taken/);
    await page.getByRole('button', { name: 'Start the test' }).tap();
    await page.waitForURL(/\/tests\/[0-9a-f-]+$/);
    await expect
      .poll(() => page.getByRole('status').filter({ hasText: 'Test started: 40 seeds taken' }).count())
      .toBe(1);
    await page.getByRole('textbox', { name: 'Tray 2 · 20 sown' }).waitFor();
    // 300 logged − 100 in the first test − 40 now = 160 on hand.
    const stock = await suite.server.db
      .selectFrom('stock_movements')
      .select((eb) => eb.fn.sum<string>('change').as('total'))
      .where('lot_id', '=', lotId)
      .executeTakeFirstOrThrow();
    expect(Number(stock.total)).toBe(160);
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(PHONE.width);
    await page.close();
  });
});
