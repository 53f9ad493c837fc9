import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { addDays } from '#shared/dates';
import { browserSuite, chromiumPath } from '../helpers/browser';

// The circle, its people, lots and running test are the invented demo scenario of
// server/demo/demo-scenario.ts, seeded as of the server's fake "now" below.
const NOW = '2026-12-01T09:00:00Z';
const TODAY = NOW.slice(0, 10);

// 390 × 844 CSS pixels: the viewport of a common mid-size phone held upright (from memory).
const PHONE = { width: 390, height: 844 };

// Tomato's first count day in a germination test: day 5 (REFERENCES.md, count days "tomato 5/14",
// from memory), so a tomato test started five days ago has a check day today.
const TOMATO_FIRST_COUNT_DAY = 5;

describe.skipIf(!chromiumPath)('the bank overview and lot cautions in Chromium', () => {
  const suite = browserSuite({ now: NOW, demo: 'season' });

  /** Signs in with one tap on the sign-in page's demo panel, and waits for the bank's overview. */
  async function signInFromDemoPanel(page: Page, email: string) {
    await page.goto(`${suite.server.baseUrl}/sign-in`);
    const panel = page.getByRole('region', { name: 'Try the demo circle' });
    await expect.poll(() => panel.innerText()).toContain('invented seed circle');
    await panel.getByRole('button', { name: email }).tap();
    await page.waitForURL(`${suite.server.baseUrl}/banks/${suite.bankId}/overview`);
  }

  it('when the keeper signs in from the demo panel on a phone, then the overview shows the tray count due today and links to its test', async () => {
    // The running test, read from the database rather than from the page.
    const running = await suite.server.db
      .selectFrom('germination_tests')
      .innerJoin('lots', 'lots.id', 'germination_tests.lot_id')
      .innerJoin('species', 'species.id', 'lots.species_id')
      .select([
        'germination_tests.id',
        'germination_tests.start_date',
        'lots.code',
        'lots.variety',
        'species.common_name',
      ])
      .where('germination_tests.bank_id', '=', suite.bankId)
      .where('germination_tests.status', '=', 'running')
      .execute();
    expect(running).toHaveLength(1);
    const assay = running[0]!;
    expect(assay.common_name).toBe('Tomato');
    expect(addDays(assay.start_date, TOMATO_FIRST_COUNT_DAY)).toBe(TODAY);

    const context = await suite.browser.newContext({ viewport: PHONE, hasTouch: true, isMobile: true });
    const page = await context.newPage();
    await signInFromDemoPanel(page, 'keeper@example.org');

    await expect.poll(() => page.getByRole('heading', { level: 1 }).innerText()).toBe('This week');
    const trays = page.getByRole('list', { name: 'Trays to count' });
    const row = trays.getByRole('link').filter({ hasText: assay.code });
    await expect.poll(() => row.count()).toBe(1);
    const rowText = await row.innerText();
    expect(rowText).toContain('Due today');
    expect(rowText).toContain(`Day ${TOMATO_FIRST_COUNT_DAY} count`);
    // Nothing on the page is wider than the phone.
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(PHONE.width);

    await row.tap();
    await page.waitForURL(`${suite.server.baseUrl}/banks/${suite.bankId}/tests/${assay.id}`);
    await expect
      .poll(() => page.getByRole('heading', { level: 1 }).innerText())
      .toBe(`Tomato · ${assay.variety}`);
    await expect
      .poll(() => page.getByRole('heading', { name: 'Count the normal seedlings' }).count())
      .toBe(1);
    await expect.poll(() => page.getByRole('note').filter({ hasText: 'damping-off' }).count()).toBe(1);
    await context.close();
  });

  it('when a grower marks a lot as treated seed, then its page shows the treated-seed caution', async () => {
    // A lot the demo saved from its own plants, untreated, of a species without a poison flag.
    const lot = await suite.server.db
      .selectFrom('lots')
      .innerJoin('species', 'species.id', 'lots.species_id')
      .select(['lots.id', 'lots.code'])
      .where('lots.bank_id', '=', suite.bankId)
      .where('lots.treated', '=', false)
      .where('lots.origin', '=', 'saved')
      .where('species.ref_key', '=', 'lettuce')
      .orderBy('lots.code')
      .executeTakeFirstOrThrow();

    const context = await suite.browser.newContext({ viewport: PHONE, hasTouch: true, isMobile: true });
    const page = await context.newPage();
    await signInFromDemoPanel(page, 'grower@example.org');
    await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/${lot.id}`);
    await expect.poll(() => page.getByRole('heading', { level: 1 }).innerText()).toContain(lot.code);
    const treatedNote = page.getByRole('note').filter({ hasText: 'Treated seed: handle with care' });
    expect(await treatedNote.count()).toBe(0);

    await page.getByRole('button', { name: 'Edit details' }).tap();
    await page
      .getByRole('checkbox', { name: /Treated seed \(coated with fungicide or another treatment\)/ })
      .check();
    // The form shows the caution as soon as the box is ticked.
    await expect.poll(() => treatedNote.count()).toBe(1);
    await page.getByRole('button', { name: 'Save changes' }).tap();
    await expect.poll(() => page.getByRole('button', { name: 'Edit details' }).count()).toBe(1);

    // Saved on the server…
    const saved = await suite.server.db
      .selectFrom('lots')
      .select('treated')
      .where('id', '=', lot.id)
      .executeTakeFirstOrThrow();
    expect(saved.treated).toBe(true);
    // …and the page's caution says the usual things, in plain words (common practice for treated seed).
    await expect.poll(() => treatedNote.count()).toBe(1);
    // On a phone the top of the lot page shows the caution's title and opens its text with a tap.
    expect((await treatedNote.innerText()).toLowerCase()).not.toContain('gloves');
    await treatedNote.getByRole('button', { name: 'More' }).tap();
    const words = (await treatedNote.innerText()).toLowerCase();
    for (const phrase of ['gloves', 'children, pets and food', 'sprouts', 'wash your hands', 'local rules']) {
      expect(words).toContain(phrase);
    }
    // It sits above the photos, where a phone shows it first.
    const noteTop = (await treatedNote.boundingBox())!.y;
    const photosTop = (await page.getByRole('heading', { name: 'Photos' }).boundingBox())!.y;
    expect(noteTop).toBeLessThan(photosTop);

    // Starting a test means counting that seed by hand: the caution comes along.
    await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/${lot.id}/tests/new`);
    await expect
      .poll(() => page.getByRole('note').filter({ hasText: 'Treated seed: handle with care' }).count())
      .toBe(1);
    await context.close();
  });
});
