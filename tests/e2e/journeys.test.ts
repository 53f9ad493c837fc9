import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedDemoScenario } from '../../server/db/demo-scenario';
import { DEMO_BANK_NAME, DEMO_PASSWORD } from '../../server/db/seed-demo';
import { chromiumPath, launchBrowser, startTestServer } from '../helpers/browser';
import { journey, seriousViolations } from '../helpers/journey';

// 390 × 844 CSS pixels: a common phone held upright (from memory).
const PHONE = { width: 390, height: 844 };
const DESKTOP = { width: 1280, height: 900 };

describe.skipIf(!chromiumPath)('the three growers’ journeys, on the demo season', () => {
  let server: Awaited<ReturnType<typeof startTestServer>>;
  let browser: Browser & { cleanup(): void };
  let bankId: string;
  let tmp: string;
  let lotCode = '';
  let lotId = '';

  beforeAll(async () => {
    // The server's clock at the real time, since the pages' default dates come from the browser.
    server = await startTestServer({ now: new Date().toISOString() });
    await seedDemoScenario({ db: server.db, storage: server.storage, mailer: server.mailer, clock: server.clock, appOrigin: server.baseUrl });
    bankId = (await server.db.selectFrom('banks').select('id').where('name', '=', DEMO_BANK_NAME).executeTakeFirstOrThrow()).id;
    browser = await launchBrowser();
    tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'hilum-journeys-'));
  }, 180_000);
  afterAll(async () => {
    await browser?.close();
    browser?.cleanup();
    await server?.stop();
    if (tmp) fs.rmSync(tmp, { recursive: true, force: true });
  });

  async function signIn(page: Page, email: string) {
    await page.goto(`${server.baseUrl}/sign-in`);
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(`${server.baseUrl}/banks/${bankId}/overview`);
  }

  it('journey 1: when a grower logs a harvested packet on a phone, then the lot is listed as needing a test', async () => {
    const context = await browser.newContext({ viewport: PHONE, hasTouch: true, isMobile: true });
    const page = await context.newPage();
    const j = journey('1-log-a-packet', page);
    await j.step('sign in as grower', () => signIn(page, 'grower@example.org'));
    await j.step('open the new-lot form', async () => {
      await page.goto(`${server.baseUrl}/banks/${bankId}/lots/new`);
      await expect.poll(() => page.getByRole('heading', { level: 1 }).innerText()).toBe('New lot');
    });
    await j.step('fill in the packet', async () => {
      const species = page.getByRole('combobox', { name: /Species/ });
      await species.fill('Kale');
      await page.getByRole('option', { name: /Kale/ }).first().click();
      await page.getByLabel('Variety').fill('Journey Blue');
      await page.getByLabel('Harvest date', { exact: true }).fill(new Date(Date.now() - 20 * 86_400_000).toISOString().slice(0, 10));
      // The demo circle saved kale from one of its parent plants: tick it.
      const parents = page.getByRole('group', { name: 'Parent plants' }).getByRole('checkbox');
      await parents.first().check();
      await page.getByLabel('Number of seeds').fill('400');
      const jpeg = await sharp({ create: { width: 900, height: 1200, channels: 3, background: '#7d8f5a' } }).jpeg().toBuffer();
      const photo = path.join(tmp, 'kale-packet.jpg');
      fs.writeFileSync(photo, jpeg);
      await page.getByLabel('Packet photo').setInputFiles(photo);
    });
    await j.step('save and see the lot page with its photo', async () => {
      await page.getByRole('button', { name: 'Save lot' }).click();
      await page.waitForURL(new RegExp(`/banks/${bankId}/lots/[0-9a-f-]{36}$`));
      lotId = page.url().split('/').pop()!;
      await expect.poll(() => page.getByRole('heading', { level: 1 }).innerText()).toMatch(/^KAL-/);
      lotCode = (await page.getByRole('heading', { level: 1 }).innerText()).trim().split(/\s/)[0]!;
      const thumb = page.locator('img[src*="size=thumb"]').first();
      await thumb.waitFor();
      await expect.poll(() => thumb.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth)).toBeGreaterThan(0);
    });
    await j.step('see it in the lots table with retest', async () => {
      await page.goto(`${server.baseUrl}/banks/${bankId}/lots?q=${encodeURIComponent('Journey Blue')}`);
      await expect.poll(() => page.locator('main').innerText(), { timeout: 20_000 }).toContain(lotCode);
      await expect.poll(() => page.locator('main').innerText()).toMatch(/Retest/i);
    });
    const saved = await server.db.selectFrom('lot_parents').select('parent_plant_id').where('lot_id', '=', lotId).execute();
    expect(saved).toHaveLength(1);
    await context.close();
  });

  it('journey 2: when a grower records a 4-tray trial over three check days, then the result and curve show', async () => {
    expect(lotId).not.toBe('');
    const context = await browser.newContext({ viewport: PHONE, hasTouch: true, isMobile: true });
    const page = await context.newPage();
    const j = journey('2-tray-trial', page);
    const start = new Date(Date.now() - 10 * 86_400_000).toISOString().slice(0, 10);
    const day = (n: number) => new Date(Date.parse(start) + n * 86_400_000).toISOString().slice(0, 10);
    await j.step('sign in as grower', () => signIn(page, 'grower@example.org'));
    await j.step('start a 4-tray test', async () => {
      await page.goto(`${server.baseUrl}/banks/${bankId}/lots/${lotId}/tests/new`);
      await page.getByLabel('Start date').fill(start);
      await page.getByLabel('Method').selectOption('paper towel');
      await page.getByLabel('Number of trays').selectOption('4');
      await page.getByLabel('Seeds in each tray').fill('25');
      await page.getByRole('button', { name: /Start the test/ }).click();
      await page.waitForURL(new RegExp(`/banks/${bankId}/tests/[0-9a-f-]{36}`));
    });
    const counts: [number, number[]][] = [
      [4, [8, 6, 9, 7]],
      [7, [18, 16, 19, 17]],
      [10, [21, 19, 22, 20]],
    ];
    for (const [d, values] of counts) {
      await j.step(`count on day ${d}`, async () => {
        // The server's clock moves to the check day, as the grower's days pass.
        server.clock.set(`${day(d)}T10:00:00Z`);
        await page.getByLabel('Check date').fill(day(d));
        for (const [i, v] of values.entries()) {
          await page.getByRole('textbox', { name: `Tray ${i + 1} · 25 sown` }).fill(String(v));
        }
        await page.getByRole('button', { name: /^Save counts for/ }).tap();
        await expect.poll(() => page.getByRole('status').filter({ hasText: 'Saved the counts of' }).count()).toBeGreaterThan(0);
      });
    }
    await j.step('finish the test', async () => {
      await page.getByRole('button', { name: 'Finish the test…' }).click();
      const dialog = page.getByRole('dialog', { name: 'Finish the test' });
      await dialog.getByLabel('Finished on').fill(day(10));
      for (const [i, v] of [21, 19, 22, 20].entries()) {
        const tray = dialog.getByRole('listitem').filter({ hasText: `Tray ${i + 1} · 25 sown` });
        await tray.getByLabel('Abnormal').fill('1');
        await tray.getByLabel('Ungerminated').fill(String(25 - v - 1));
      }
      await dialog.getByRole('button', { name: 'Finish the test' }).click();
      await expect.poll(() => page.getByRole('status').filter({ hasText: 'Finished on' }).count()).toBe(1);
    });
    await j.step('read percent, interval, agreement and curve', async () => {
      // 21 + 19 + 22 + 20 = 82 of 100 sown: 82%, as the seed-testing rules report a whole percent.
      await expect.poll(() => page.locator('[data-result="percent"]').innerText()).toContain('82');
      await expect.poll(() => page.locator('[data-result="interval"]').innerText()).toMatch(/\d+%.*\d+%/);
      expect(await page.locator('[data-agreement]').getAttribute('data-agreement')).toBe('ok');
      expect(await page.locator('[data-chart="germination-curve"] path.recharts-line-curve').count()).toBeGreaterThanOrEqual(4);
      await j.readmeShot('test-page.png');
    });
    await context.close();
  });

  it('when the main pages are checked with axe-core, then there are no serious or critical violations', async () => {
    const context = await browser.newContext({ viewport: DESKTOP });
    const page = await context.newPage();
    await page.goto(`${server.baseUrl}/sign-in`);
    const found: Record<string, unknown> = { 'sign-in': await seriousViolations(page) };
    await signIn(page, 'keeper@example.org');
    const lot = await server.db.selectFrom('lots').select('id').where('bank_id', '=', bankId).limit(1).executeTakeFirstOrThrow();
    const test = await server.db.selectFrom('germination_tests').select('id').where('bank_id', '=', bankId).limit(1).executeTakeFirstOrThrow();
    for (const [name, url] of [
      ['overview', `/banks/${bankId}/overview`],
      ['lots', `/banks/${bankId}/lots`],
      ['lot', `/banks/${bankId}/lots/${lot.id}`],
      ['new lot', `/banks/${bankId}/lots/new`],
      ['test', `/banks/${bankId}/tests/${test.id}`],
      ['planner', `/banks/${bankId}/planner`],
      ['members', `/banks/${bankId}/members`],
      ['settings', `/banks/${bankId}/settings`],
    ] as const) {
      await page.goto(`${server.baseUrl}${url}`);
      await page.locator('main h1').first().waitFor();
      await page.waitForLoadState('networkidle');
      found[name] = await seriousViolations(page);
    }
    expect(Object.fromEntries(Object.entries(found).filter(([, v]) => (v as unknown[]).length > 0))).toEqual({});
    await context.close();
  });
});
