import jStat from 'jstat';
import ical from 'node-ical';
import type { BrowserContext, Page } from 'playwright-core';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '#server/demo/demo-people';
import { browserSuite, chromiumPath, signInAt } from '../helpers/browser';
import { journey, journeyOfTests, seriousViolations } from '../helpers/journey';
import { speciesId, testedTomatoLot } from '../helpers/lots';

// The people and the bank are the invented demo scenario of server/demo/demo-people.ts (last spring
// frost 05-24, a 10-day margin); the lot below is invented for this test.
const grower = DEMO_ACCOUNTS.find((a) => a.role === 'grower')!;
const viewer = DEMO_ACCOUNTS.find((a) => a.role === 'viewer')!;
const owner = DEMO_ACCOUNTS.find((a) => a.role === 'owner')!;

const NOW = '2026-12-01T09:00:00Z';
// 390 × 844 CSS pixels: the viewport of a common mid-size phone held upright (from memory).
const PHONE = { width: 390, height: 844 };
const DESKTOP = { width: 1280, height: 900 };

/*
 * The tomato sowing of the coming spring (season 2027), worked by hand from the demo frost date:
 * tomato is started 8–6 weeks before the last frost (Hilum's reference set; 5–7 weeks from sowing to
 * transplant in ISU's Seed Germination Guide 2017, REFERENCES.md [read], the 8–6 weeks before frost
 * is common practice). 2027-05-24 − 56 days = 29 Mar; − 42 days = 12 Apr.
 * Plant out after the frost date plus the bank's 10-day margin: 3 Jun; harden off the week before
 * (about a week, common practice): 27 May. Seedlings from the first sowing day plus tomato's fewest
 * days to emerge, 6 (at 77 °F), to the last sowing day plus its most, 8 (at 68 °F) (Harrington &
 * Minges 1954, in Knott's Handbook, REFERENCES.md [read]): 4 Apr – 20 Apr.
 */
const SOW = '29 Mar – 12 Apr';
const EXPECT = '4 Apr – 20 Apr';
const HARDEN = '27 May';
const PLANT_OUT = '3 Jun';
const SOW_FROM = '2027-03-29';

/**
 * Seeds to sow so that at least `plants` come up with probability `assurance`: the smallest n with
 * P(X ≥ plants) ≥ assurance for X ~ Binomial(n, p) (the binomial quantile of DESIGN.md), computed
 * with jstat, a reference library from the npm registry.
 */
function seedsFor(plants: number, p: number, assurance: number): number {
  for (let n = plants; n < 100_000; n += 1) {
    if (1 - jStat.binomial.cdf(plants - 1, n, p) >= assurance) return n;
  }
  throw new Error('no n found');
}

describe.skipIf(!chromiumPath)('the planner in Chromium', () => {
  const suite = browserSuite({ now: NOW, demo: 'people' });
  let lotId: string;
  let lotCode: string;
  let stockBefore: number;
  let expectedSeeds: number;

  beforeAll(async () => {
    // A tomato lot of 400 seeds with a finished two-tray test, through the API as the grower.
    const api = request.agent(suite.server.app);
    expect(
      (await api.post('/api/auth/login').send({ email: grower.email, password: DEMO_PASSWORD })).status,
    ).toBe(200);
    ({ lotId, lotCode } = await testedTomatoLot(api, suite.server.db, suite.bankId, {
      variety: 'Planner Trial Red',
      seedCount: 400,
      testDate: '2026-11-01',
    }));
    // 400 logged − 2 × 50 counted into the test's trays (the stock is a ledger, DESIGN.md).
    stockBefore = (await api.get(`/api/banks/${suite.bankId}/lots/${lotId}`)).body.lot.seedsOnHand;
    expect(stockBefore).toBe(300);

    // The lot's germination projected to the first sowing day (the server's viability fit), then the
    // seeds for 12 plants worked out independently: × 0.9 establishment and 0.9 assurance, the
    // bank's defaults (migrations/2026_12_01_000400_bank_decision_settings.ts).
    const ranking = await api.get(`/api/banks/${suite.bankId}/ranking?on=${SOW_FROM}`);
    const item = (ranking.body.items as { lotId: string; projectedPercent: number }[]).find(
      (r) => r.lotId === lotId,
    )!;
    expectedSeeds = seedsFor(12, (item.projectedPercent / 100) * 0.9, 0.9);
  });

  /** A browser context whose clock reads the same day as the server's. */
  async function newContext(
    viewport: { width: number; height: number },
    phone = false,
  ): Promise<BrowserContext> {
    const context = await suite.browser.newContext({ viewport, hasTouch: phone, isMobile: phone });
    await context.clock.setFixedTime(new Date(NOW));
    return context;
  }
  async function open(
    viewport: { width: number; height: number },
    phone = false,
  ): Promise<{ context: BrowserContext; page: Page }> {
    const context = await newContext(viewport, phone);
    return { context, page: await context.newPage() };
  }

  const signIn = (page: Page, email: string) => signInAt(page, suite.server.baseUrl, email, suite.bankId);

  const scrollWidth = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth);
  const fact = (page: Page, name: string) =>
    page.locator(`article[data-entry] [data-fact="${name}"] dd`).first().innerText();

  // One test per step on one page: the whole journey in one test ran near the 60 s timeout.
  describe('when a grower plans 12 tomato plants indoors and marks them sown, then the window, the suggested lot and the stock withdrawn follow', () => {
    const steps = journeyOfTests('planner-grower', () => newContext(DESKTOP), {
      first: { title: 'sign in as grower', run: (page) => signIn(page, grower.email) },
    });

    steps.step('planner', async (page) => {
      await page
        .getByRole('navigation', { name: 'Bank' })
        .getByRole('link', { name: 'Planner' })
        .first()
        .click();
      await page.waitForURL(`${suite.server.baseUrl}/banks/${suite.bankId}/planner`);
      // In December the coming spring is next year's.
      expect(await page.getByRole('combobox', { name: 'Season' }).inputValue()).toBe('2027');
      await expect.poll(() => page.locator('[data-frost]').innerText()).toContain('24 May');
    });

    steps.step('add-form', async (page) => {
      const species = page.getByRole('combobox', { name: /Species/ });
      await species.fill('tomato');
      await page.getByRole('option', { name: /Tomato/ }).click();
      // Tomato is usually started indoors (reference set): the choice follows the species.
      expect(await page.getByRole('radio', { name: 'Indoors' }).isChecked()).toBe(true);
      await page.getByLabel('Plants wanted').fill('12');
      expect(await page.getByRole('combobox', { name: 'Lot' }).inputValue()).toBe('');
      // The lot is offered with its projection and stock.
      await expect
        .poll(() => page.getByRole('combobox', { name: 'Lot' }).innerText())
        .toContain(`${lotCode} · Planner Trial Red`);
      await expect
        .poll(() => page.getByRole('status').filter({ hasText: 'Sow between' }).innerText())
        .toContain('Sow between 29 Mar and 12 Apr');
    });

    steps.step('entry', async (page) => {
      await page.getByRole('button', { name: 'Add to plan' }).click();
      await page.locator('article[data-entry]').waitFor();
      expect(await page.locator('article[data-entry] h3').innerText()).toBe('Tomato');
      expect(await fact(page, 'sow')).toBe(SOW);
      expect(await fact(page, 'expect')).toBe(EXPECT);
      expect(await fact(page, 'harden')).toBe(HARDEN);
      expect(await fact(page, 'plant-out')).toBe(PLANT_OUT);
      expect(await page.locator('[data-fact="lot"] dt').innerText()).toBe('Lot (suggested)');
      expect(await fact(page, 'lot')).toBe(lotCode);
      expect(await fact(page, 'seeds')).toBe(String(expectedSeeds));
      await expect
        .poll(() => page.locator('article[data-entry]').getByRole('list', { name: 'Notes' }).innerText())
        .toContain(`Suggested lot ${lotCode}`);
      expect(await seriousViolations(page)).toEqual([]);
    });

    steps.step('sown', async (page) => {
      // No day is filled in for the grower: marking sown without one asks for it.
      expect(await page.getByLabel('Sown on').inputValue()).toBe('');
      const markSown = page.getByRole('button', { name: `Mark sown (−${expectedSeeds} seeds)` });
      await markSown.click();
      await expect.poll(() => page.getByText('Choose the day it was sown.').isVisible()).toBe(true);
      // 1 Dec (today in the bank, UTC in the demo) is long before the window: the planner asks first,
      // and nothing is taken from the lot until the grower says yes.
      await page.getByLabel('Sown on').fill('2026-12-01');
      await markSown.click();
      const question = page.getByRole('alertdialog', { name: 'Sown outside the window?' });
      await expect
        .poll(() => question.innerText())
        .toContain('1 Dec is before this sowing window (29 Mar – 12 Apr). Was it really sown then?');
      const api = request.agent(suite.server.app);
      await api.post('/api/auth/login').send({ email: grower.email, password: DEMO_PASSWORD });
      expect((await api.get(`/api/banks/${suite.bankId}/lots/${lotId}`)).body.lot.seedsOnHand).toBe(
        stockBefore,
      );
      await question.getByRole('button', { name: 'Yes, sown on 1 Dec' }).click();
      await expect
        .poll(() => page.getByRole('status').filter({ hasText: 'Sown on' }).innerText())
        .toBe(`Sown on 1 Dec: ${expectedSeeds} seeds taken from the stock of lot ${lotCode}.`);
      expect(await page.getByRole('button', { name: 'Undo sowing' }).isVisible()).toBe(true);
    });

    steps.step('lot-page', async (page) => {
      await page.locator('article[data-entry]').getByRole('link', { name: lotCode }).click();
      await page.waitForURL(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/${lotId}`);
      await expect
        .poll(() =>
          page
            .getByText(/seeds on hand$/)
            .first()
            .innerText(),
        )
        .toBe(`${stockBefore - expectedSeeds} seeds on hand`);
    });

    // Undo puts the seeds back, so the lot is whole again for the next test.
    steps.step('undo', async (page) => {
      await page.goBack();
      await page.getByRole('button', { name: 'Undo sowing' }).click();
      await expect
        .poll(() => page.getByRole('status').filter({ hasText: 'Sowing undone' }).innerText())
        .toContain(`${expectedSeeds} seeds went back into lot ${lotCode}`);
      const api = request.agent(suite.server.app);
      await api.post('/api/auth/login').send({ email: grower.email, password: DEMO_PASSWORD });
      expect((await api.get(`/api/banks/${suite.bankId}/lots/${lotId}`)).body.lot.seedsOnHand).toBe(
        stockBefore,
      );
    });
  });

  describe('when a viewer opens the season calendar on a phone, then it reads as a day list without sideways scrolling and offers no changes', () => {
    const steps = journeyOfTests('planner-viewer-phone', () => newContext(PHONE, true), {
      first: { title: 'sign in as viewer', run: (page) => signIn(page, viewer.email) },
    });

    steps.step('sowings', async (page) => {
      await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/planner`);
      await page.locator('article[data-entry]').waitFor();
      expect(await page.getByRole('button', { name: /Mark sown/ }).count()).toBe(0);
      expect(await page.getByRole('button', { name: 'Add to plan' }).count()).toBe(0);
      expect(await page.getByRole('button', { name: 'Delete' }).count()).toBe(0);
      expect(await scrollWidth(page)).toBeLessThanOrEqual(PHONE.width);
    });

    steps.step('calendar', async (page) => {
      await page.getByRole('button', { name: 'Calendar' }).click();
      // Today (1 Dec 2026) is outside the season, so the calendar opens on its first sowing month.
      await expect.poll(() => page.getByRole('heading', { name: 'March 2027' }).count()).toBe(1);
      const agenda = page.locator('[data-calendar="agenda"]');
      await expect.poll(() => agenda.innerText()).toContain('Mon 29 Mar');
      expect(await agenda.innerText()).toContain(`Sow Tomato · ${SOW}`);
      expect(await page.locator('[data-calendar="month"]').isVisible()).toBe(false);
      expect(await scrollWidth(page)).toBeLessThanOrEqual(PHONE.width);
    });

    steps.step('calendar-june', async (page) => {
      // Three quick taps, all before the address has changed (one task, as a fast thumb can): each
      // moves one month on, March → June.
      await page.getByRole('button', { name: /next month/ }).evaluate((button: HTMLElement) => {
        for (let i = 0; i < 3; i += 1) button.click();
      });
      await expect.poll(() => page.getByRole('heading', { name: 'June 2027' }).count()).toBe(1);
      await expect
        .poll(() => page.locator('[data-calendar="agenda"]').innerText())
        .toContain('Plant out Tomato');
      expect(await scrollWidth(page)).toBeLessThanOrEqual(PHONE.width);
    });

    // "Add to my calendar" is the season's iCalendar file, which a real parser reads.
    steps.step('add-to-calendar', async (page) => {
      const href = await page.getByRole('link', { name: 'Add to my calendar' }).getAttribute('href');
      const ics = await page.request.get(`${suite.server.baseUrl}${href}`);
      expect(ics.headers()['content-type']).toMatch(/text\/calendar/);
      const events = Object.values(ical.sync.parseICS(await ics.text())).filter(
        (e) => e?.type === 'VEVENT',
      ) as ical.VEvent[];
      expect(events.some((e) => String(e.summary).startsWith('Sow Tomato'))).toBe(true);
    });
  });

  describe('when the month grid is open on a wide screen, then today is marked and the sowing window runs across its days', () => {
    const steps = journeyOfTests('planner-month', () => newContext(DESKTOP), {
      first: { title: 'sign in as grower', run: (page) => signIn(page, grower.email) },
    });
    steps.step('december', async (page) => {
      await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/planner?view=calendar&month=2026-12`);
      const today = page.locator('[data-calendar="month"] td[aria-current="date"]');
      await expect.poll(() => today.getAttribute('data-day')).toBe('2026-12-01');
    });
    steps.step('april', async (page) => {
      await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/planner?view=calendar&month=2027-04`);
      // 1–12 April lie in the sowing window, 13 April does not.
      const sowOn = (day: string) => page.locator(`td[data-day="${day}"] li[data-kind="sow"]`).count();
      await expect.poll(() => sowOn('2027-04-01')).toBe(1);
      expect(await sowOn('2027-04-12')).toBe(1);
      expect(await sowOn('2027-04-13')).toBe(0);
      // Seedlings expected 4–20 April (EXPECT above): from after sowing starts to after the window ends.
      const sproutOn = (day: string) => page.locator(`td[data-day="${day}"] li[data-kind="sprout"]`).count();
      expect(await sproutOn('2027-04-03')).toBe(0);
      expect(await sproutOn('2027-04-04')).toBe(1);
      expect(await sproutOn('2027-04-20')).toBe(1);
      expect(await seriousViolations(page)).toEqual([]);
    });
  });

  it('when a viewer turns on sowing reminders under Account → Reminders, then the choice is kept', async () => {
    const { context, page } = await open(PHONE, true);
    const steps = journey('reminders', page);
    await signIn(page, viewer.email);
    await steps.step('reminders', async () => {
      await page.getByRole('button', { name: 'Account' }).click();
      await page.getByRole('link', { name: 'Reminders' }).click();
      await page.waitForURL(`${suite.server.baseUrl}/banks/${suite.bankId}/reminders`);
      const sowing = page.getByRole('switch', { name: 'Sowing days' });
      // Off by default for a viewer (server/jobs/reminders.ts: on for owner and grower).
      expect(await sowing.getAttribute('aria-checked')).toBe('false');
      expect(await page.getByText('The day a sowing window of the season plan opens.').isVisible()).toBe(
        true,
      );
      await sowing.click();
      await expect
        .poll(() => page.getByRole('status').filter({ hasText: 'Saved' }).innerText())
        .toBe('Saved: sowing days on.');
      expect(await scrollWidth(page)).toBeLessThanOrEqual(PHONE.width);
    });
    await page.reload();
    await expect
      .poll(() => page.getByRole('switch', { name: 'Sowing days' }).getAttribute('aria-checked'))
      .toBe('true');
    expect(await page.getByRole('switch', { name: 'Weekly summary' }).getAttribute('aria-checked')).toBe(
      'false',
    );
    await context.close();
  });

  it('when an owner sets the sowing assurance in Settings, then the bank keeps it and the frost dates are explained, not guessed', async () => {
    const { context, page } = await open(PHONE, true);
    const steps = journey('settings-decisions', page);
    await signIn(page, owner.email);
    await steps.step('settings', async () => {
      await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/settings`);
      const main = page.locator('main');
      await expect.poll(() => main.innerText()).toContain('Frost dates are local averages');
      expect(await main.innerText()).toContain('Hilum never guesses them from a location');
      // The decision settings show the bank's defaults (migrations/2026_12_01_000400_bank_decision_settings.ts).
      expect(await page.getByLabel('Sow threshold (%)').inputValue()).toBe('70');
      expect(await page.getByLabel('Seedling establishment').inputValue()).toBe('0.9');
      expect(await page.getByLabel('Sowing assurance').inputValue()).toBe('0.9');
      // Out of range: the shared schema's message shows beside the field, and nothing is sent.
      await page.getByLabel('Sowing assurance').fill('1.5');
      await page.getByRole('button', { name: 'Save settings' }).click();
      await expect.poll(() => main.innerText()).toContain('Between 0.5 and 0.99.');
      await page.getByLabel('Sowing assurance').fill('0.95');
      await page.getByRole('button', { name: 'Save settings' }).click();
      await expect.poll(() => page.getByRole('status').filter({ hasText: 'Saved.' }).count()).toBe(1);
      expect(await scrollWidth(page)).toBeLessThanOrEqual(PHONE.width);
    });
    const saved = await suite.server.db
      .selectFrom('banks')
      .select('sowing_assurance')
      .where('id', '=', suite.bankId)
      .executeTakeFirstOrThrow();
    expect(Number(saved.sowing_assurance)).toBe(0.95);
    await suite.server.db
      .updateTable('banks')
      .set({ sowing_assurance: 0.9 })
      .where('id', '=', suite.bankId)
      .execute();
    await context.close();
  });
  it('when a planned sowing needs more seed than its lot holds, then the planner says so instead of offering Mark sown', async () => {
    const api = request.agent(suite.server.app);
    await api.post('/api/auth/login').send({ email: grower.email, password: DEMO_PASSWORD });
    const tomato = await speciesId(suite.server.db, 'tomato');
    const created = await api
      .post(`/api/banks/${suite.bankId}/plan`)
      .send({ season: 2027, speciesId: tomato, plantsWanted: 1000, start: 'indoors', lotId });
    expect(created.status).toBe(201);
    const { context, page } = await open(DESKTOP);
    await signIn(page, grower.email);
    await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/planner`);
    const card = page.locator('article[data-entry]').filter({ hasText: '1,000 plants' });
    await expect
      .poll(() => card.locator('[data-short-of-seed]').innerText())
      .toContain(`Lot ${lotCode} has ${stockBefore} seeds left`);
    expect(await card.getByRole('button', { name: /Mark sown/ }).count()).toBe(0);
    await context.close();
    expect((await api.delete(`/api/banks/${suite.bankId}/plan/${created.body.entry.id}`)).status).toBe(204);
  });
});
