import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';
import sharp from 'sharp';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '#server/demo/demo-people';
import { SPECIES_REFERENCE } from '#shared/species-reference';
import { browserSuite, chromiumPath, signInAt } from '../helpers/browser';
import { journeyOfTests } from '../helpers/journey';

// The people and the bank are the invented demo scenario of server/demo/demo-people.ts.
const grower = DEMO_ACCOUNTS.find((a) => a.role === 'grower')!;
const viewer = DEMO_ACCOUNTS.find((a) => a.role === 'viewer')!;

// 390 × 844 CSS pixels: the viewport of a common mid-size phone held upright (from memory).
const PHONE = { width: 390, height: 844 };
const DESKTOP = { width: 1280, height: 900 };

// Tomato's typical seeds per gram in Hilum's reference set (shared/species-reference.ts, source
// "seedCompanyChart", read), so the form's estimate and the server's are checked against it.
const TOMATO = SPECIES_REFERENCE.find((s) => s.commonName === 'Tomato')!;
const TOMATO_PER_GRAM = TOMATO.seedsPerGram?.typical ?? 0;

describe.skipIf(!chromiumPath)('the lots pages in Chromium', () => {
  // The server's clock at the real time: the form's default dates come from the browser's clock.
  const suite = browserSuite({ now: new Date().toISOString(), demo: 'people' });
  let tmpDir: string;

  beforeAll(() => {
    tmpDir = fs.mkdtempSync(path.join(os.tmpdir(), 'hilum-lots-e2e-'));
  });
  afterAll(async () => {
    if (tmpDir) fs.rmSync(tmpDir, { recursive: true, force: true });
  });

  const signIn = (page: Page, email: string) => signInAt(page, suite.server.baseUrl, email, suite.bankId);

  const scrollWidth = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth);

  // One test per step on one page: the whole form in one test ran at 30-40 s of the 60 s timeout.
  describe('when a grower on a phone logs a lot by weight with a packet photo, then its page shows the estimate and the thumbnail', () => {
    let lotId = '';
    const j = journeyOfTests(
      'lot-by-weight-phone',
      () => suite.browser.newContext({ viewport: PHONE, hasTouch: true, isMobile: true }),
      {
        first: { title: 'sign in as grower', run: (page) => signIn(page, grower.email) },
      },
    );

    j.step('open the new-lot form from Lots', async (page) => {
      await page.getByRole('navigation', { name: 'Bank' }).getByRole('link', { name: 'Lots' }).click();
      await page.waitForURL(`${suite.server.baseUrl}/banks/${suite.bankId}/lots`);
      await page.getByRole('link', { name: 'New lot' }).first().click();
      await page.waitForURL(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/new`);
      await expect.poll(() => page.getByRole('heading', { level: 1 }).innerText()).toBe('New lot');
    });

    j.step('choose the species by part of its scientific name: the poison caution shows', async (page) => {
      // Type-to-search over common and scientific names: "lycopers" is part of Solanum lycopersicum.
      const species = page.getByRole('combobox', { name: /Species/ });
      await species.fill('lycopers');
      await page.getByRole('option', { name: /Tomato/ }).click();
      await expect.poll(() => species.inputValue()).toBe('Tomato');
      // Tomato is flagged poisonous in the reference set (leaves and stems), so the caution shows.
      expect(TOMATO.poisonous).toBe(true);
      await expect
        .poll(() => page.getByRole('note').filter({ hasText: 'Poisonous' }).innerText())
        .toMatch(/poison centre/);
    });

    j.step('give the weight: the estimate shows before saving', async (page) => {
      await page.getByLabel('Variety').fill('Bench Trial Cherry');
      // The harvest date starts empty until chosen (issue 16): never today by default.
      const harvest = page.getByLabel('Harvest date', { exact: true });
      expect(await harvest.inputValue()).toBe('');
      await harvest.fill('2025-09-14');

      await page.getByRole('radio', { name: 'Weight in grams' }).check();
      await page.getByLabel('Grams', { exact: true }).fill('2');
      // 2 g × 390 seeds per gram = 780 seeds, shown before saving.
      expect(TOMATO_PER_GRAM).toBe(390);
      expect(2 * TOMATO_PER_GRAM).toBe(780);
      await expect
        .poll(() => page.getByText(/seeds at about/).innerText())
        .toBe(`≈ 780 seeds at about ${TOMATO_PER_GRAM} seeds per gram`);

      const jpeg = await sharp({ create: { width: 800, height: 600, channels: 3, background: '#8a6a3c' } })
        .jpeg()
        .toBuffer();
      const photoPath = path.join(tmpDir, 'packet.jpg');
      fs.writeFileSync(photoPath, jpeg);
      await page.getByLabel('Packet photo').setInputFiles(photoPath);
      expect(await scrollWidth(page)).toBeLessThanOrEqual(PHONE.width);
    });

    j.step('save: the lot page shows the estimate and the thumbnail', async (page) => {
      await page.getByRole('button', { name: 'Save lot' }).click();
      await page.waitForURL(new RegExp(`/banks/${suite.bankId}/lots/[0-9a-f-]{36}$`));
      lotId = page.url().split('/').pop()!;
      await expect.poll(() => page.getByRole('heading', { level: 1 }).innerText()).toMatch(/^TOM/);
      await expect
        .poll(() => page.getByText('seeds on hand', { exact: false }).first().innerText())
        .toContain('≈ 780 seeds on hand');

      const thumb = page.locator('img[src*="size=thumb"]').first();
      await thumb.waitFor();
      // Photos load lazily: the grower scrolls down to them, below the lot's advice.
      await thumb.scrollIntoViewIfNeeded();
      await expect
        .poll(() => thumb.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth))
        .toBeGreaterThan(0);
      expect(await scrollWidth(page)).toBeLessThanOrEqual(PHONE.width);
    });

    it('the page did not just draw it: the server holds the lot, its estimated stock and one photo', async () => {
      const lot = await suite.server.db
        .selectFrom('lots')
        .select(['variety', 'origin', 'quantity_estimated', 'grams_entered'])
        .where('id', '=', lotId)
        .executeTakeFirstOrThrow();
      expect(lot).toMatchObject({ variety: 'Bench Trial Cherry', origin: 'saved', quantity_estimated: true });
      expect(Number(lot.grams_entered)).toBe(2);
      const photos = await suite.server.db
        .selectFrom('photos')
        .select('id')
        .where('subject_id', '=', lotId)
        .execute();
      expect(photos).toHaveLength(1);
    });
  });

  it('when a grower’s seed is of a species Hilum does not list, then they add it from the new-lot form and log the lot under it', async () => {
    const context: BrowserContext = await suite.browser.newContext({
      viewport: PHONE,
      hasTouch: true,
      isMobile: true,
    });
    const page = await context.newPage();
    await signIn(page, grower.email);
    await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/new`);
    await page.getByRole('button', { name: 'Add a species' }).click();
    const dialog = page.getByRole('dialog', { name: 'Add a species' });

    // One already in the reference set is refused, pointing at the one to choose.
    await dialog.getByLabel('Common name').fill('Tomato');
    await dialog.getByLabel('Scientific name').fill('Solanum lycopersicum');
    await dialog.getByRole('button', { name: 'Add species' }).click();
    await expect
      .poll(() => dialog.getByRole('alert').innerText())
      .toContain("is already in Hilum's list of species");

    // Love-in-a-mist (Nigella damascena, Ranunculaceae) is not in the reference set.
    await dialog.getByLabel('Common name').fill('Love-in-a-mist');
    await dialog.getByLabel('Scientific name').fill('Nigella damascena');
    await dialog.getByLabel('Family').fill('Ranunculaceae');
    // An indoor window runs from the larger number of weeks before frost to the smaller.
    await dialog.getByLabel('From (weeks before)').fill('4');
    await dialog.getByLabel('Until (weeks before)').fill('8');
    await dialog.getByRole('button', { name: 'Add species' }).click();
    await expect
      .poll(() =>
        dialog.getByText('Sowing starts earliest at the larger number of weeks before frost.').count(),
      )
      .toBe(1);
    await dialog.getByLabel('Usually started').selectOption('direct');
    expect(await dialog.getByLabel('From (weeks before)').count()).toBe(0);
    await dialog.getByLabel('Typical seed life (years)').fill('2');
    await dialog.getByRole('button', { name: 'Add species' }).click();
    await expect.poll(() => dialog.isVisible()).toBe(false);
    await expect
      .poll(() => page.getByRole('combobox', { name: /Species/ }).inputValue())
      .toBe('Love-in-a-mist');
    expect(await scrollWidth(page)).toBeLessThanOrEqual(PHONE.width);

    await page.getByLabel('Variety').fill('Mixed blues');
    await page.getByLabel('Harvest date', { exact: true }).fill('2025-09-14');
    await page.getByLabel('Number of seeds').fill('500');
    await page.getByRole('button', { name: 'Save lot' }).click();
    await page.waitForURL(new RegExp(`/banks/${suite.bankId}/lots/[0-9a-f-]{36}$`));
    await expect.poll(() => page.locator('main').innerText()).toContain('Nigella damascena');

    const saved = await suite.server.db
      .selectFrom('species')
      .select(['bank_id', 'common_name', 'scientific_name', 'family', 'traits'])
      .where('scientific_name', '=', 'Nigella damascena')
      .executeTakeFirstOrThrow();
    expect(saved).toMatchObject({
      bank_id: suite.bankId,
      common_name: 'Love-in-a-mist',
      family: 'Ranunculaceae',
    });
    expect(saved.traits).toMatchObject({ startMethod: 'direct', storageLifeYears: 2, poisonous: false });
    await context.close();
  });

  it('when a grower gives seed away on a phone, then the swap caution shows, the ledger takes it out, and more than is left is refused', async () => {
    const api = request.agent(suite.server.app);
    await api.post('/api/auth/login').send({ email: grower.email, password: DEMO_PASSWORD });
    const made = await api.post(`/api/banks/${suite.bankId}/lots`).send({
      speciesId: (await api.get(`/api/banks/${suite.bankId}/species`)).body.items.find(
        (x: { commonName: string }) => x.commonName === 'Calendula',
      ).id,
      variety: 'Ledger Gold',
      origin: 'saved',
      harvestDate: '2025-08-01',
      seedCount: 120,
    });
    expect(made.status).toBe(201);
    const lotId = made.body.lot.id as string;

    const context: BrowserContext = await suite.browser.newContext({
      viewport: PHONE,
      hasTouch: true,
      isMobile: true,
    });
    const page = await context.newPage();
    await signIn(page, grower.email);
    await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/${lotId}`);
    const stock = page
      .locator('section')
      .filter({ has: page.getByRole('heading', { name: 'Stock', exact: true }) });
    await page.getByRole('heading', { name: 'Stock', exact: true }).waitFor();
    await stock.getByLabel('What happened').selectOption('given');
    await expect
      .poll(() => stock.getByRole('note').filter({ hasText: 'Swapping across regions or borders' }).count())
      .toBe(1);
    await stock.getByLabel('Seeds taken out').fill('20');
    await stock.getByLabel('Reason').fill('to the seed library table');
    await stock.getByRole('button', { name: 'Record movement' }).click();
    await expect
      .poll(() => stock.getByRole('status').innerText())
      .toContain('Recorded −20 seeds. 100 on hand now.');
    await expect
      .poll(() => stock.getByRole('row').filter({ hasText: 'to the seed library table' }).innerText())
      .toContain('Given away');
    expect(await scrollWidth(page)).toBeLessThanOrEqual(PHONE.width);

    // More than the ledger holds: refused (409), and the stock stays as it was.
    await stock.getByLabel('What happened').selectOption('sown');
    expect(await stock.getByRole('note').filter({ hasText: 'Swapping across regions' }).count()).toBe(0);
    await stock.getByLabel('Seeds taken out').fill('500');
    await stock.getByLabel('Reason').fill('the whole cold frame');
    await stock.getByRole('button', { name: 'Record movement' }).click();
    // The server's 409 shows beside the number it is about.
    await expect
      .poll(() =>
        stock.getByText('Only 100 seeds are on hand; taking 500 would leave the stock below zero.').count(),
      )
      .toBe(1);
    expect(await stock.getByText('Recorded −20 seeds').count()).toBe(0);
    expect((await api.get(`/api/banks/${suite.bankId}/lots/${lotId}`)).body.lot.seedsOnHand).toBe(100);
    await context.close();
  });

  it('when a viewer opens Lots, then the table lists the bank’s lots and offers no New lot button', async () => {
    // A lot logged through the API as the grower, so this test stands on its own (an API agent: a
    // second browser signed in only for this cost a sign-in's time on a busy machine).
    const api = request.agent(suite.server.app);
    expect(
      (await api.post('/api/auth/login').send({ email: grower.email, password: DEMO_PASSWORD })).status,
    ).toBe(200);
    const species = await api.get(`/api/banks/${suite.bankId}/species`);
    const marigold = (species.body.items as { id: string; commonName: string }[]).find(
      (s) => s.commonName === 'Marigold',
    )!;
    const created = await api.post(`/api/banks/${suite.bankId}/lots`).send({
      speciesId: marigold.id,
      variety: 'Ember Edge',
      origin: 'swapped',
      sourceName: 'Hollow Lane seed table',
      harvestDate: '2025-09-14',
      seedCount: 1250,
      code: 'MAR-VIEW-1',
    });
    expect(created.status).toBe(201);

    const context = await suite.browser.newContext({ viewport: DESKTOP });
    const page = await context.newPage();
    await signIn(page, viewer.email);
    await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots`);
    await expect.poll(() => page.getByRole('heading', { level: 1 }).innerText()).toBe('Lots');

    const row = page.getByRole('row').filter({ hasText: 'MAR-VIEW-1' });
    await expect.poll(() => row.count()).toBe(1);
    const text = await row.innerText();
    expect(text).toContain('Marigold');
    expect(text).toContain('Ember Edge');
    expect(text).toContain('1,250');
    // The Lots screen is the ranking: a lot nobody has tested is to be tested first (docs/decisions.md).
    expect(text).toContain('Not tested');
    expect(text).toContain('Test first');

    expect(await page.getByRole('link', { name: 'New lot' }).count()).toBe(0);
    expect(await page.getByRole('link', { name: 'Import CSV' }).count()).toBe(0);
    expect(await page.getByRole('link', { name: 'Export lots CSV' }).count()).toBe(1);

    // Sorting by seeds on hand (numbers sort largest first on the first press) puts the larger lot
    // first, whatever the codes say.
    await page.getByRole('columnheader', { name: /Seeds/ }).getByRole('button').click();
    await expect
      .poll(() => page.getByRole('columnheader', { name: /Seeds/ }).getAttribute('aria-sort'))
      .toBe('descending');
    await expect.poll(() => page.locator('tbody tr[data-lot]').first().innerText()).toContain('MAR-VIEW-1');
    await context.close();
  });

  it('when a grower checks a CSV file with treated seed in it, then the preview marks that lot and shows the caution before importing', async () => {
    const context = await suite.browser.newContext({ viewport: DESKTOP });
    const page = await context.newPage();
    await signIn(page, grower.email);
    await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/import`);
    const csv = [
      'code,species,variety,origin,harvest_date,seeds_on_hand,treated',
      'IMP-PLAIN-1,Tomato,Porch Plain,saved,2025-09-01,30,no',
      'IMP-COAT-1,Tomato,Coated Crimson,bought,2025-09-01,40,yes',
    ].join('\r\n');
    await page
      .getByLabel('CSV file')
      .setInputFiles({ name: 'lots.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });

    const preview = page.getByRole('table', { name: 'Lots the file would add' });
    await expect.poll(() => preview.getByRole('row').count()).toBe(3);
    expect(await preview.getByRole('row').filter({ hasText: 'IMP-COAT-1' }).innerText()).toContain(
      'Treated seed',
    );
    expect(await preview.getByRole('row').filter({ hasText: 'IMP-PLAIN-1' }).innerText()).not.toContain(
      'Treated seed',
    );
    expect(await page.getByText('Treated seed: handle with care').count()).toBe(1);

    await page.getByRole('button', { name: 'Import 2 lots' }).click();
    await expect
      .poll(() => page.getByRole('status').filter({ hasText: '2 lots were added' }).count())
      .toBe(1);
    const treated = await suite.server.db
      .selectFrom('lots')
      .select(['code', 'treated'])
      .where('code', 'like', 'IMP-%')
      .orderBy('code')
      .execute();
    expect(treated).toEqual([
      { code: 'IMP-COAT-1', treated: true },
      { code: 'IMP-PLAIN-1', treated: false },
    ]);
    await context.close();
  });
});
