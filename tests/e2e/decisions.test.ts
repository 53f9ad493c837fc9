import type { Page } from 'playwright-core';
import request from 'supertest';
import { beforeAll, describe, expect } from 'vitest';
import type {
  RankingItem,
  RecommendationValue,
  SeedsToSowResponse,
  ViabilityResponse,
} from '#shared/schemas/viability';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '#server/demo/demo-people';
import { browserSuite, chromiumPath, signInAt } from '../helpers/browser';
import { journeyOfTests, seriousViolations } from '../helpers/journey';
import { finishedAssay, speciesId } from '../helpers/lots';

// The circle, its people, lots and tests are the invented demo season of server/demo/demo-scenario.ts,
// seeded as of the server's fake "now" below; the advice is the server's own (docs/decisions.md).
const NOW = '2026-12-01T09:00:00Z';
// The demo bank's last frost is 24 May (demo-people.ts); Hilum's default sowing date is eight weeks
// (56 days) before the next one: 24 May 2027 − 56 days = 29 March 2027 (calendar arithmetic).
const ON = '2027-03-29';

// 390 × 844 CSS pixels: the viewport of a common mid-size phone held upright (from memory).
const PHONE = { width: 390, height: 844 };
const DESKTOP = { width: 1280, height: 900 };

// The six pieces of advice and the words their badges carry (docs/decisions.md, "The rules").
const LABELS: Record<RecommendationValue, string> = {
  sow: 'Sow',
  'sow-thick': 'Sow thick',
  retest: 'Retest',
  'grow-out': 'Grow out',
  retire: 'Retire',
  'test-first': 'Test first',
};

const grower = DEMO_ACCOUNTS.find((a) => a.role === 'grower')!;

describe.skipIf(!chromiumPath)('the advice for every lot, in Chromium', () => {
  const suite = browserSuite({ now: NOW, demo: 'season' });
  let api: ReturnType<typeof request.agent>;
  let ranking: RankingItem[];
  const pick: Partial<Record<'sow' | 'retire' | 'guess', RankingItem>> = {};
  let heldBackLot: string;

  beforeAll(async () => {
    api = request.agent(suite.server.app);
    expect(
      (await api.post('/api/auth/login').send({ email: grower.email, password: DEMO_PASSWORD })).status,
    ).toBe(200);
    // One lot more, of a species the demo season does not hold (so no demo lot's fit moves): fresh
    // from harvest it came up 30 of 100, a year later 95 of 100 — the earlier test was held back
    // (dormancy, or conditions), the case the issue names (invented figures).
    const lot = await api.post(`/api/banks/${suite.bankId}/lots`).send({
      speciesId: await speciesId(suite.server.db, 'squash'),
      variety: 'Late Riser',
      origin: 'saved',
      harvestDate: '2024-09-01',
      seedCount: 600,
      code: 'DEC-HELD',
    });
    expect(lot.status).toBe(201);
    heldBackLot = lot.body.lot.id as string;
    await finishedAssay(api, suite.bankId, heldBackLot, '2024-10-01', [{ sown: 100, germinated: 30 }]);
    await finishedAssay(api, suite.bankId, heldBackLot, '2025-10-01', [{ sown: 100, germinated: 95 }]);
    const res = await api.get(`/api/banks/${suite.bankId}/ranking?on=${ON}`);
    expect(res.status).toBe(200);
    ranking = res.body.items as RankingItem[];
    // Lots to open: a tested lot to sow with seed on hand and two tests or more (one is set aside
    // below), a lot to retire for its low germination (not for an empty ledger), and a lot never tested.
    const assayCounts = new Map(
      (
        await suite.server.db
          .selectFrom('germination_tests')
          .select(['lot_id', suite.server.db.fn.countAll<string>().as('n')])
          .where('bank_id', '=', suite.bankId)
          .where('status', '=', 'finished')
          .groupBy('lot_id')
          .execute()
      ).map((r) => [r.lot_id, Number(r.n)]),
    );
    pick.sow = ranking.find(
      (i) => i.recommendation === 'sow' && (i.seedsOnHand ?? 0) > 100 && (assayCounts.get(i.lotId) ?? 0) >= 2,
    );
    pick.retire = ranking.find(
      (i) => i.recommendation === 'retire' && (i.seedsOnHand ?? 0) > 0 && i.projectedHigh !== null,
    );
    pick.guess = ranking.find((i) => i.recommendation === 'test-first' && i.lastTestDate === null);
    expect(pick.sow && pick.retire && pick.guess).toBeTruthy();
  });

  const viability = async (lotId: string) => {
    const res = await api.get(`/api/banks/${suite.bankId}/lots/${lotId}/viability?on=${ON}`);
    expect(res.status).toBe(200);
    return res.body as ViabilityResponse;
  };
  const rowCodes = (page: Page) =>
    page.locator('tbody tr[data-lot]').evaluateAll((rows) => rows.map((r) => r.getAttribute('data-lot')));
  const scrollWidth = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth);
  const newContext =
    (viewport: { width: number; height: number }, phone = false) =>
    async () => {
      const context = await suite.browser.newContext({
        viewport,
        ...(phone ? { hasTouch: true, isMobile: true } : {}),
      });
      await context.clock.setFixedTime(new Date(NOW));
      return context;
    };
  const signIn = (page: Page) => signInAt(page, suite.server.baseUrl, grower.email, suite.bankId);

  /** The lot page's advice, band, seeds to sow and storage advice, read against the server's answers. */
  async function checkLotPage(page: Page, item: RankingItem, width: number) {
    await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/${item.lotId}`);
    const v = await viability(item.lotId);
    // The lot page and the ranking give one decision with one reason.
    expect(v.recommendation).toBe(item.recommendation);
    expect(v.reason).toBe(item.reason);
    const advice = page.locator('#lot-advice');
    await expect.poll(() => advice.innerText()).toContain(LABELS[item.recommendation]);
    expect(await page.getByTestId('advice-reason').innerText()).toBe(v.reason);
    // The band in words: whole percentages, as seed-testing rules report germination.
    const band = await page.getByTestId('projected-band').innerText();
    expect(band).toContain(`${Math.round(v.projected!.low)}%`);
    expect(band).toContain(`${Math.round(v.projected!.high)}%`);
    expect(band).toContain(v.estimateOnly ? 'a guess' : 'Projected germination on 29 Mar 2027');

    // Storage advice: the three places, each within half a year of the server's estimate.
    const storage = page.locator('#lot-storage');
    await expect.poll(() => storage.innerText()).toContain('viability equation');
    expect(v.storageAdvice.map((a) => a.place)).toEqual(['room', 'fridge', 'freezer']);
    for (const a of v.storageAdvice) {
      // Each line starts with a capital; compared in lower case.
      const line = (
        await storage.locator(`[data-place="${a.current ? 'current' : a.place}"]`).innerText()
      ).toLowerCase();
      expect(line).toContain(a.label.toLowerCase());
      if (a.yearsToThreshold === null) expect(line).toContain('more than 100 years');
      else if (a.yearsToThreshold === 0)
        expect(line).toContain(`already at or below ${Math.round(v.threshold)}%`);
      else {
        expect(line).toContain(`until it falls to ${Math.round(v.threshold)}%`);
        const [, figure, unit] = /about ([\d.]+) (years?|months?)/.exec(line) ?? [];
        const years = Number(figure) / (unit?.startsWith('month') ? 12 : 1);
        expect(Math.abs(years - a.yearsToThreshold)).toBeLessThanOrEqual(0.5);
      }
    }
    expect(await scrollWidth(page)).toBeLessThanOrEqual(width);
    return v;
  }

  /** Seeds to sow on the page equal the server's count for 12 plants at the bank's assurance (90%). */
  async function checkSeedsToSow(page: Page, item: RankingItem) {
    await expect.poll(() => page.getByTestId('seeds-to-sow').innerText()).toMatch(/^sow \d+ seeds$/);
    const res = await api.get(
      `/api/banks/${suite.bankId}/lots/${item.lotId}/seeds-to-sow?plants=12&assurance=0.9&on=${ON}`,
    );
    expect(res.status).toBe(200);
    const s = res.body as SeedsToSowResponse;
    expect(Number((await page.getByTestId('seeds-to-sow').innerText()).replace(/\D/g, ''))).toBe(s.seeds);
    expect(await page.getByTestId('seeds-explanation').innerText()).toBe(s.explanation);
    return s;
  }

  describe('on a desktop, as a grower', () => {
    const j = journeyOfTests('decisions-desktop', newContext(DESKTOP), {
      first: { title: 'sign in', run: signIn },
    });

    j.step('the ranking shows all six decisions', async (page) => {
      // The demo season holds every decision (the server's own ranking says so)…
      expect(new Set(ranking.map((i) => i.recommendation))).toEqual(new Set(Object.keys(LABELS)));
      await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots`);
      // …and the table shows each: filtered to one piece of advice, the rows are that advice's lots.
      for (const value of Object.keys(LABELS) as RecommendationValue[]) {
        const codes = ranking.filter((i) => i.recommendation === value).map((i) => i.code);
        await page.getByRole('combobox', { name: 'Advice' }).selectOption(value);
        await expect
          .poll(() => page.getByText(/projected to/).innerText())
          .toContain(`${codes.length} of ${ranking.length} lots`);
        const shown = await rowCodes(page);
        expect(shown.length).toBeGreaterThan(0);
        expect(codes).toEqual(expect.arrayContaining(shown));
        const firstBadge = page
          .locator(`tr[data-lot="${shown[0]}"]`)
          .getByRole('button', { name: new RegExp(`^${LABELS[value]}`) });
        expect(await firstBadge.count()).toBe(1);
      }
      await page.getByRole('combobox', { name: 'Advice' }).selectOption('');
      expect(await scrollWidth(page)).toBeLessThanOrEqual(DESKTOP.width);
    });

    j.step('a lot to sow: its decision, band, seeds to sow and storage advice', async (page) => {
      const item = pick.sow!;
      await checkLotPage(page, item, DESKTOP.width);
      const s = await checkSeedsToSow(page, item);
      expect(s.estimateOnly).toBe(false);
      expect(s.projectedLow).toBeLessThanOrEqual(s.projectedPercent);
      expect(await page.getByRole('button', { name: /^Add to the 2027 plan/ }).count()).toBe(1);
      // The decline chart: this lot's tests as dots, with the key beside it.
      const chart = page.locator('figure[data-chart="decline"] svg.recharts-surface');
      await chart.waitFor();
      expect(await page.getByRole('list', { name: 'Key to the chart' }).innerText()).toContain(
        'Test, with its 95% interval',
      );
      expect(await seriousViolations(page)).toEqual([]);
    });

    j.step('a lot never tested: a guess in plain words', async (page) => {
      const item = pick.guess!;
      const v = await checkLotPage(page, item, DESKTOP.width);
      expect(v.estimateOnly).toBe(true);
      const s = await checkSeedsToSow(page, item);
      expect(s.estimateOnly).toBe(true);
      expect(s.explanation).toMatch(/^Not tested — this is a guess/);
      expect(await page.locator('#lot-storage').innerText()).toContain(
        'a guess, as the lot is not tested yet',
      );
    });

    j.step('a lot to retire: no seeds to sow and no plan entry, and why', async (page) => {
      const item = pick.retire!;
      await checkLotPage(page, item, DESKTOP.width);
      await expect.poll(() => page.getByTestId('retire-reason').innerText()).toBe(item.reason);
      expect(await page.getByText('No seeds to sow: this lot is to retire').count()).toBe(1);
      expect(await page.getByTestId('seeds-to-sow').count()).toBe(0);
      expect(await page.getByRole('button', { name: /Add to the/ }).count()).toBe(0);
      // The server agrees: a lot to retire has no seeds to sow (422).
      expect(
        (await api.get(`/api/banks/${suite.bankId}/lots/${item.lotId}/seeds-to-sow?plants=12&on=${ON}`))
          .status,
      ).toBe(422);
    });

    j.step('a lot whose first test was held back: marked apart on the chart, with its key', async (page) => {
      const v = await viability(heldBackLot);
      expect(v.points.map((p) => p.heldBack)).toEqual([true, false]);
      await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/${heldBackLot}`);
      await expect
        .poll(() => page.getByRole('list', { name: 'Key to the chart' }).innerText())
        .toContain('Held back');
      const assays = page.getByRole('list', { name: 'Tests in the chart' });
      expect(await assays.locator('li[data-held-back]').innerText()).toContain('30% (30 of 100');
      expect(await assays.locator('li[data-held-back]').innerText()).toContain(
        'held back by dormancy or conditions',
      );
      // Two marks in the chart: the held-back test (a hollow diamond) and the later one (a dot).
      const chart = page.locator('figure[data-chart="decline"] svg.recharts-surface');
      await expect.poll(() => chart.locator('.recharts-scatter-symbol').count()).toBe(2);
      expect(await page.locator('#lot-viability').innerText()).toContain(
        'held back by dormancy or by conditions',
      );
    });

    j.step('set a test aside from its page', async (page) => {
      const item = pick.sow!;
      const before = await viability(item.lotId);
      const assayId = before.points.at(-1)!.testId;
      await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/tests/${assayId}`);
      await page.getByRole('button', { name: 'Set the whole test aside…' }).click();
      const dialog = page.getByRole('dialog', { name: 'Set the whole test aside' });
      // An empty reason is refused in words, before anything is sent.
      await dialog.getByRole('button', { name: 'Set the test aside' }).click();
      await expect.poll(() => dialog.innerText()).toContain('Say why the test is set aside');
      await dialog.getByRole('button', { name: 'Mouldy towel' }).click();
      await dialog.getByRole('button', { name: 'Set the test aside' }).click();
      await expect
        .poll(() => page.getByTestId('test-set-aside').innerText())
        .toContain('Set aside: Mouldy towel');
      expect(await page.getByTestId('test-set-aside-status').innerText()).toContain(
        'left out of the lot’s decline',
      );
      const after = await viability(item.lotId);
      expect(after.setAside).toEqual([expect.objectContaining({ testId: assayId, reason: 'Mouldy towel' })]);
      expect(after.points.map((p) => p.testId)).not.toContain(assayId);
    });

    j.step('the lot page shows the test set aside, apart from the decline', async (page) => {
      const item = pick.sow!;
      await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/${item.lotId}`);
      await expect
        .poll(() => page.getByRole('list', { name: 'Tests set aside' }).innerText())
        .toContain('Mouldy towel');
      await expect
        .poll(() => page.getByRole('list', { name: 'Key to the chart' }).innerText())
        .toContain('Set aside: left out of the decline');
      // The set-aside test is drawn as its own mark (a cross) beside the tests in the model.
      const chart = page.locator('figure[data-chart="decline"] svg.recharts-surface');
      await expect
        .poll(() => chart.locator('.recharts-scatter-symbol').count())
        .toBe((await viability(item.lotId)).points.length + 1);
    });

    j.step('take the test back', async (page) => {
      const item = pick.sow!;
      const assayId = (await viability(item.lotId)).setAside[0]!.testId;
      await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/tests/${assayId}`);
      await page.getByRole('button', { name: 'Take it back into the decline' }).click();
      await expect.poll(() => page.getByText('Taken back').count()).toBe(1);
      expect(await page.getByTestId('test-set-aside').count()).toBe(0);
      const after = await viability(item.lotId);
      expect(after.setAside).toEqual([]);
      expect(after.points.map((p) => p.testId)).toContain(assayId);
      expect(after.recommendation).toBe(item.recommendation);
    });
  });

  describe('on a phone', () => {
    const j = journeyOfTests('decisions-phone', newContext(PHONE, true), {
      first: { title: 'sign in', run: signIn },
    });

    j.step('the ranking cards show all six decisions', async (page) => {
      for (const value of Object.keys(LABELS) as RecommendationValue[]) {
        await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots?rec=${value}`);
        const cards = page.getByRole('list', { name: /Lots ranked/ }).locator('li[data-lot]');
        await expect.poll(() => cards.count()).toBeGreaterThan(0);
        const codes = ranking.filter((i) => i.recommendation === value).map((i) => i.code);
        expect(codes).toContain(await cards.first().getAttribute('data-lot'));
        expect(
          await cards
            .first()
            .getByRole('button', { name: new RegExp(`^${LABELS[value]}`) })
            .count(),
        ).toBe(1);
      }
      expect(await scrollWidth(page)).toBeLessThanOrEqual(PHONE.width);
    });

    j.step('a lot to sow on a phone', async (page) => {
      await checkLotPage(page, pick.sow!, PHONE.width);
      await checkSeedsToSow(page, pick.sow!);
    });

    j.step('a lot to retire on a phone', async (page) => {
      await checkLotPage(page, pick.retire!, PHONE.width);
      await expect.poll(() => page.getByTestId('retire-reason').innerText()).toBe(pick.retire!.reason);
      expect(await page.getByRole('button', { name: /Add to the/ }).count()).toBe(0);
    });
  });
});
