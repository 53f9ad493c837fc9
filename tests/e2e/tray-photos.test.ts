import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Page } from 'playwright-core';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '#server/demo/demo-people';
import { browserSuite, chromiumPath, signInAt } from '../helpers/browser';
import { jpeg } from '../helpers/images';
import { journeyOfTests } from '../helpers/journey';
import { speciesId } from '../helpers/lots';

// The people and the bank are the invented demo scenario of server/demo/demo-people.ts; the lot and its
// test are invented here.
const grower = DEMO_ACCOUNTS.find((a) => a.role === 'grower')!;
const viewer = DEMO_ACCOUNTS.find((a) => a.role === 'viewer')!;
// 390 × 844 CSS pixels: a common phone held upright (from memory).
const PHONE = { width: 390, height: 844 };

describe.skipIf(!chromiumPath)('tray photos on the test page in Chromium', () => {
  const suite = browserSuite({ now: '2026-03-10T09:00:00Z', demo: 'people' });
  let assayId: string;
  let trayIds: string[];
  let tmp: string;

  beforeAll(async () => {
    const api = request.agent(suite.server.app);
    expect(
      (await api.post('/api/auth/login').send({ email: grower.email, password: DEMO_PASSWORD })).status,
    ).toBe(200);
    const lot = await api.post(`/api/banks/${suite.bankId}/lots`).send({
      speciesId: await speciesId(suite.server.db, 'pepper'),
      variety: 'Tray Snap',
      origin: 'saved',
      harvestDate: '2025-09-10',
      seedCount: 200,
    });
    expect(lot.status).toBe(201);
    const assay = await api.post(`/api/banks/${suite.bankId}/lots/${lot.body.lot.id}/tests`).send({
      startDate: '2026-03-05',
      method: 'paper towel',
      trays: [{ seedsSown: 20 }, { seedsSown: 20 }, { seedsSown: 20 }],
    });
    expect(assay.status).toBe(201);
    assayId = assay.body.test.id;
    trayIds = (assay.body.trays as { id: string }[]).map((t) => t.id);
    tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'hilum-tray-photos-'));
  });
  afterAll(async () => {
    if (tmp) fs.rmSync(tmp, { recursive: true, force: true });
  });

  const signIn = (page: Page, email: string) => signInAt(page, suite.server.baseUrl, email, suite.bankId);

  // The grower's steps are tests of their own on one page, and the viewer's look another: one test
  // for all of it ran near the 60 s timeout on a busy machine.
  describe('when a grower photographs tray 2 on a phone, then the photo belongs to tray 2 alone and a viewer sees it without an upload', () => {
    const trayPhotos = (page: Page) =>
      page.locator('section').filter({ has: page.getByRole('heading', { name: 'Tray photos' }) });
    const j = journeyOfTests(
      'tray-photos',
      () => suite.browser.newContext({ viewport: PHONE, hasTouch: true, isMobile: true }),
      {
        first: { title: 'sign in as grower', run: (page) => signIn(page, grower.email) },
      },
    );
    j.step('photograph tray 2', async (page) => {
      await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/tests/${assayId}`);
      const card = trayPhotos(page);
      await card.getByRole('button', { name: 'Tray 2', exact: true }).tap();
      expect(
        await card.getByRole('button', { name: 'Tray 2', exact: true }).getAttribute('aria-pressed'),
      ).toBe('true');
      const file = path.join(tmp, 'tray-2.jpg');
      fs.writeFileSync(file, await jpeg({ width: 800, height: 600 }));
      await card.getByLabel('Add a photo').setInputFiles(file);
      await card.getByRole('button', { name: 'Upload photo' }).tap();
      const thumb = card.getByRole('img', { name: /^Tray 2 of the PEP-/ });
      await thumb.waitFor();
      await expect
        .poll(() => thumb.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth))
        .toBeGreaterThan(0);
    });
    it('the server stores it against tray 2 of this test, and no other tray', async () => {
      const rows = await suite.server.db
        .selectFrom('photos')
        .select(['subject', 'subject_id'])
        .where('bank_id', '=', suite.bankId)
        .where('subject', '=', 'tray')
        .execute();
      expect(rows).toEqual([{ subject: 'tray', subject_id: trayIds[1] }]);
    });
    j.step('tray 1 has none', async (page) => {
      const card = trayPhotos(page);
      await card.getByRole('button', { name: 'Tray 1', exact: true }).tap();
      await expect.poll(() => card.getByText('No photos yet.').count()).toBe(1);
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
        PHONE.width,
      );
    });
    it('a viewer sees the photo of tray 2 and is offered no upload', async () => {
      const viewerContext = await suite.browser.newContext({
        viewport: PHONE,
        hasTouch: true,
        isMobile: true,
      });
      const viewerPage = await viewerContext.newPage();
      await signIn(viewerPage, viewer.email);
      await viewerPage.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/tests/${assayId}`);
      const card = trayPhotos(viewerPage);
      await card.getByRole('button', { name: 'Tray 2', exact: true }).tap();
      // The tap chose tray 2: a tap once landed elsewhere when the chart above arrived and pushed the
      // buttons down (the chart's place is now kept while it loads).
      expect(
        await card.getByRole('button', { name: 'Tray 2', exact: true }).getAttribute('aria-pressed'),
      ).toBe('true');
      await card.getByRole('img', { name: /^Tray 2 of the PEP-/ }).waitFor();
      expect(await card.getByLabel('Add a photo').count()).toBe(0);
      await viewerContext.close();
    });
  });
});
