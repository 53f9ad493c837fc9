import type { Page } from 'playwright-core';
import request from 'supertest';
import { beforeAll, describe, expect } from 'vitest';
import type { AssayDetail } from '#shared/schemas/germination';
import type { RankingItem } from '#shared/schemas/viability';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '#server/demo/demo-people';
import { browserSuite, chromiumPath, signInAt } from '../helpers/browser';
import { journeyOfTests } from '../helpers/journey';
import { speciesId, startedAssay } from '../helpers/lots';

// The people and the bank are the invented demo scenario of server/demo/demo-people.ts; the lot below
// (code TRAY-FOUR) is invented for this test, like the demo's own lots.
const grower = DEMO_ACCOUNTS.find((a) => a.role === 'grower')!;

const NOW = '2026-03-10T09:00:00Z';
const LATER = '2026-03-14T09:00:00Z';
const CODE = 'TRAY-FOUR';

// 390 × 844 CSS pixels: the viewport of a common mid-size phone held upright (from memory).
const PHONE = { width: 390, height: 844 };
const DESKTOP = { width: 1280, height: 900 };

describe.skipIf(!chromiumPath)(
  'trays not counted yet and trays set aside, on the test page and the Lots screen',
  () => {
    const suite = browserSuite({ now: NOW, demo: 'people' });
    let api: ReturnType<typeof request.agent>;
    let assayId: string;
    let trayIds: string[];

    beforeAll(async () => {
      // A saved tomato lot like the demo's, and a test of four trays of 50 seeds, through the API.
      api = request.agent(suite.server.app);
      expect(
        (await api.post('/api/auth/login').send({ email: grower.email, password: DEMO_PASSWORD })).status,
      ).toBe(200);
      const lot = await api.post(`/api/banks/${suite.bankId}/lots`).send({
        speciesId: await speciesId(suite.server.db, 'tomato'),
        variety: 'Four Tray Red',
        origin: 'saved',
        harvestDate: '2025-09-10',
        seedCount: 400,
        code: CODE,
      });
      expect(lot.status).toBe(201);
      ({ testId: assayId, trayIds } = await startedAssay(
        api,
        suite.bankId,
        lot.body.lot.id,
        '2026-03-05',
        [50, 50, 50, 50],
      ));
    });

    const assayUrl = () => `${suite.server.baseUrl}/banks/${suite.bankId}/tests/${assayId}`;
    const lotsUrl = () => `${suite.server.baseUrl}/banks/${suite.bankId}/lots?q=${CODE}`;
    const percentText = (page: Page) => page.locator('[data-result="percent"]').innerText();
    const trayField = (page: Page, n: number) => page.getByRole('textbox', { name: `Tray ${n} · 50 sown` });
    const resultTray = (page: Page, n: number) =>
      page.getByTestId('result-panel').locator(`li[data-tray="${n}"]`);
    const card = (page: Page) =>
      page.getByRole('list', { name: /Lots ranked/ }).locator(`li[data-lot="${CODE}"]`);
    const apiResult = async () =>
      ((await api.get(`/api/banks/${suite.bankId}/tests/${assayId}`)).body as AssayDetail).result;
    const apiRanking = async () =>
      ((await api.get(`/api/banks/${suite.bankId}/ranking`)).body.items as RankingItem[]).find(
        (i) => i.code === CODE,
      )!;

    const context = (viewport: typeof PHONE, at: string) => async () => {
      const phone = viewport === PHONE;
      const made = await suite.browser.newContext({
        viewport,
        ...(phone ? { hasTouch: true, isMobile: true } : {}),
      });
      // The page's "today" is the server's day, so the check date and finish date default to it.
      await made.clock.setFixedTime(new Date(at));
      return made;
    };
    const signIn = {
      title: 'sign in as a grower',
      run: (page: Page) => signInAt(page, suite.server.baseUrl, grower.email, suite.bankId),
    };
    const scrollWidth = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth);

    // Steps that build on each other, one test each on a page shared by their block (journeyOfTests).
    describe('when a grower counts two of four trays on a phone, then the test page and the Lots screen give the same percent, and a tray set aside is left out, visibly', () => {
      const j = journeyOfTests('trays-1-running-phone', context(PHONE, NOW), { first: signIn });

      j.step('count two of the four trays', async (page) => {
        await page.goto(assayUrl());
        await trayField(page, 4).waitFor();
        await expect
          .poll(() => page.getByRole('heading', { name: 'Count the normal seedlings' }).count())
          .toBe(1);
        expect(await page.locator('[data-definition="normal-seedling"]').innerText()).toContain(
          'sound root and shoot',
        );
        // A tray never counted starts blank: blank is "not counted today".
        expect(await trayField(page, 3).inputValue()).toBe('');
        await trayField(page, 1).fill('40');
        await trayField(page, 2).fill('45');
        await page.getByRole('button', { name: 'Save counts for Tue 10 Mar' }).tap();
        await expect
          .poll(() => page.getByRole('status').filter({ hasText: 'Saved the counts of Tue 10 Mar' }).count())
          .toBe(1);
        // 40 + 45 normal seedlings of the 100 seeds in the two counted trays: 85%, the trays not
        // counted left out (the rule of issue 12; whole percent as the seed-testing rules report it).
        await expect.poll(() => percentText(page)).toBe('85%');
        expect(await page.locator('[data-result="of-sown"]').innerText()).toBe(
          '85 of 100 seeds sown in the counted trays',
        );
        expect(await page.getByRole('heading', { name: 'Normal seedlings so far' }).count()).toBe(1);
        for (const n of [3, 4]) {
          expect(await resultTray(page, n).getAttribute('data-tray-state')).toBe('not-counted');
          expect(await resultTray(page, n).innerText()).toContain(
            'Not counted yet — left out of the figures',
          );
          expect(await page.locator(`li[data-tray="${n}"] [data-tray-note]`).innerText()).toBe(
            'Not counted yet — left out of the figures',
          );
        }
        expect(await resultTray(page, 1).innerText()).toContain('40 normal · 80%');

        // The page shows the stored result's own figures: its percent, agreement method and timing note.
        const result = await apiResult();
        expect(result.percentRounded).toBe(85);
        expect(result.trayPercents.map((t) => t.state)).toEqual([
          'counted',
          'counted',
          'not-counted',
          'not-counted',
        ]);
        expect(await page.locator('[data-agreement-method]').getAttribute('data-agreement-method')).toBe(
          result.agreement.method,
        );
        // One check day with seedlings and no earlier count of 0: the timing cannot be told yet.
        expect(result.meanDays).toBeNull();
        expect(result.timingNote).not.toBeNull();
        expect(await page.locator('[data-result="timing-note"]').innerText()).toBe(result.timingNote);
        expect(await scrollWidth(page)).toBeLessThanOrEqual(PHONE.width);
      });

      j.step('the Lots screen gives the same percent', async (page) => {
        await page.goto(lotsUrl());
        await expect.poll(() => card(page).innerText()).toContain('· 85% germinated');
        expect(Math.round((await apiRanking()).lastPercent!)).toBe(85);
      });

      j.step('set a tray aside and take it back', async (page) => {
        await page.goto(assayUrl());
        await page.getByRole('button', { name: 'Set tray 4 aside' }).tap();
        const dialog = page.getByRole('dialog', { name: 'Set tray 4 aside' });
        // No reason, no setting aside.
        await dialog.getByRole('button', { name: 'Set tray 4 aside' }).tap();
        await expect
          .poll(() => dialog.getByText('Say why the tray is set aside (spilled, dried out…).').count())
          .toBe(1);
        await dialog.getByRole('button', { name: 'Dried out' }).tap();
        await dialog.getByRole('button', { name: 'Set tray 4 aside' }).tap();
        await expect
          .poll(() => page.getByRole('list', { name: 'Trays set aside' }).innerText())
          .toContain('set aside: Dried out — left out of the figures');
        await expect.poll(() => resultTray(page, 4).getAttribute('data-tray-state')).toBe('set-aside');
        expect(await trayField(page, 4).count()).toBe(0);
        expect(await percentText(page)).toBe('85%');

        await page.getByRole('button', { name: 'Take tray 4 back into the figures' }).tap();
        await expect
          .poll(() => page.getByRole('status').filter({ hasText: 'Tray 4 is back in the count' }).count())
          .toBe(1);
        await expect.poll(() => resultTray(page, 4).getAttribute('data-tray-state')).toBe('not-counted');
        await trayField(page, 4).waitFor();
      });

      j.step('set tray 3 aside for good', async (page) => {
        await page.getByRole('button', { name: 'Set tray 3 aside' }).tap();
        const dialog = page.getByRole('dialog', { name: 'Set tray 3 aside' });
        await dialog.getByLabel('Why is it set aside?').fill('Spilled when watering');
        await dialog.getByRole('button', { name: 'Set tray 3 aside' }).tap();
        await expect
          .poll(() => resultTray(page, 3).innerText())
          .toContain('Set aside: Spilled when watering — left out of the figures');
        expect(await resultTray(page, 4).innerText()).toContain('Not counted yet — left out of the figures');
        expect(await percentText(page)).toBe('85%');
        const row = await suite.server.db
          .selectFrom('test_trays')
          .select('set_aside_reason')
          .where('id', '=', trayIds[2]!)
          .executeTakeFirstOrThrow();
        expect(row.set_aside_reason).toBe('Spilled when watering');
      });

      j.step('the finish offers only setting aside for the tray not counted', async (page) => {
        await page.getByRole('button', { name: 'Finish the test…' }).tap();
        const dialog = page.getByRole('dialog', { name: 'Finish the test' });
        const tray4 = dialog.locator('li[data-finish-tray="4"]');
        await expect.poll(() => tray4.innerText()).toContain('not counted yet');
        expect(await tray4.getByLabel('Why is it set aside?').inputValue()).toBe(
          'Not counted by the end of the test',
        );
        expect(await tray4.getByLabel('Abnormal').count()).toBe(0);
        expect(
          await dialog.locator('li[data-finish-tray="3"]').getByLabel('Why is it set aside?').inputValue(),
        ).toBe('Spilled when watering');
      });
    });

    describe('when the running test is opened on a desktop, then the count entry leaves the tray set aside out and shows it struck through', () => {
      const j = journeyOfTests('trays-2-running-desktop', context(DESKTOP, NOW), { first: signIn });
      j.step('the running test page', async (page) => {
        await page.goto(assayUrl());
        await trayField(page, 4).waitFor();
        expect(
          await page.getByRole('list', { name: 'Trays', exact: true }).first().getByRole('textbox').count(),
        ).toBe(3);
        expect(await page.getByRole('list', { name: 'Trays set aside' }).innerText()).toContain(
          'Tray 3 · 50 sown',
        );
        await expect.poll(() => percentText(page)).toBe('85%');
        expect(await scrollWidth(page)).toBeLessThanOrEqual(DESKTOP.width);
      });
    });

    describe('when the grower counts the last day and finishes with one tray set aside, then the test speaks in final words and the Lots screen gives the same figure', () => {
      beforeAll(() => suite.server.clock.set(LATER));
      const j = journeyOfTests('trays-3-finish-phone', context(PHONE, LATER), { first: signIn });

      j.step('count the last day, tray 4 as well', async (page) => {
        await page.goto(assayUrl());
        await page.getByRole('button', { name: 'Save counts for Sat 14 Mar' }).waitFor();
        expect(await trayField(page, 1).inputValue()).toBe('40');
        await trayField(page, 1).fill('42');
        await trayField(page, 2).fill('46');
        await trayField(page, 4).fill('44');
        await page.getByRole('button', { name: 'Save counts for Sat 14 Mar' }).tap();
        await expect
          .poll(() => page.getByRole('status').filter({ hasText: 'Saved the counts of Sat 14 Mar' }).count())
          .toBe(1);
        // 42 + 46 + 44 = 132 normal seedlings of the 150 seeds in the three trays kept: 88%.
        await expect.poll(() => percentText(page)).toBe('88%');
        expect(
          await page.getByTestId('result-panel').locator('[data-tray-state="not-counted"]').count(),
        ).toBe(0);
      });

      j.step('finish with tray 3 set aside', async (page) => {
        await page.getByRole('button', { name: 'Finish the test…' }).tap();
        const dialog = page.getByRole('dialog', { name: 'Finish the test' });
        await dialog.getByLabel('Finished on').fill('2026-03-14');
        const tray1 = dialog.locator('li[data-finish-tray="1"]');
        await tray1.getByLabel('Abnormal').fill('3');
        // Normal (the last count) + abnormal + ungerminated make the seeds sown.
        await expect
          .poll(() => tray1.locator('[data-tray-sum]').innerText())
          .toBe('42 normal + 3 abnormal + 5 ungerminated = 50 ✓ matches the 50 sown');
        await dialog.getByLabel(/Also sort the ungerminated seeds/).check();
        await tray1.getByLabel('Fresh').fill('2');
        await tray1.getByLabel('Dead').fill('3');
        await expect.poll(() => tray1.innerText()).toContain('fresh + dead + hard = 5 ✓');
        const tray4 = dialog.locator('li[data-finish-tray="4"]');
        await tray4.getByLabel('Abnormal').fill('1');
        await expect
          .poll(() => tray4.locator('[data-tray-sum]').innerText())
          .toBe('44 normal + 1 abnormal + 5 ungerminated = 50 ✓ matches the 50 sown');
        // Tray 3, set aside while the test ran and never counted, stays aside with its reason.
        expect(await dialog.locator('li[data-finish-tray="3"]').getByRole('radio').count()).toBe(0);
        expect(
          await dialog.locator('li[data-finish-tray="3"]').getByLabel('Why is it set aside?').inputValue(),
        ).toBe('Spilled when watering');
        await dialog.getByRole('button', { name: 'Finish the test' }).tap();
        await expect
          .poll(() => page.getByRole('status').filter({ hasText: 'Finished on 14 Mar 2026' }).count())
          .toBe(1);
      });

      j.step('the finished test speaks in final words', async (page) => {
        await expect
          .poll(() => page.getByRole('heading', { name: 'Result: normal seedlings' }).count())
          .toBe(1);
        expect(await percentText(page)).toBe('88%');
        // 132 normal + 4 abnormal + 14 ungerminated = the 150 seeds of the trays kept.
        expect(await page.locator('[data-result="breakdown"]').innerText()).toBe(
          'Of the 150 seeds sown: 132 normal seedlings (88%), 4 abnormal (3%), 14 ungerminated (9%).',
        );
        expect(await resultTray(page, 3).innerText()).toContain(
          'Set aside: Spilled when watering — left out of the figures',
        );
        expect(await page.locator('main').innerText()).not.toMatch(/so far/i);
        const result = await apiResult();
        expect(result.percentRounded).toBe(88);
        expect(result.traysSetAside).toBe(1);
        expect(result.abnormal).toBe(4);
        expect(await scrollWidth(page)).toBeLessThanOrEqual(PHONE.width);
      });

      j.step('the Lots screen gives the same final figure', async (page) => {
        await page.goto(lotsUrl());
        await expect.poll(() => card(page).innerText()).toContain('· 88% germinated');
        expect(Math.round((await apiRanking()).lastPercent!)).toBe(88);
      });
    });

    describe('when the finished test is opened on a desktop, then the tray set aside is struck through beside the final figures, and the ranking row agrees', () => {
      const j = journeyOfTests('trays-4-finished-desktop', context(DESKTOP, LATER), { first: signIn });

      j.step('the test page', async (page) => {
        await page.goto(assayUrl());
        await expect
          .poll(() => page.getByRole('heading', { name: 'Result: normal seedlings' }).count())
          .toBe(1);
        expect(await percentText(page)).toBe('88%');
        expect(await page.locator('th[data-set-aside]').innerText()).toBe('T3');
        expect(await page.getByRole('list', { name: 'Trays left out of the figures' }).innerText()).toBe(
          'T3 set aside: Spilled when watering — left out of the figures.',
        );
        expect(await scrollWidth(page)).toBeLessThanOrEqual(DESKTOP.width);
      });

      j.step('the ranking row', async (page) => {
        await page.goto(lotsUrl());
        await expect.poll(() => page.locator(`tr[data-lot="${CODE}"]`).innerText()).toContain('88%');
      });
    });
  },
);
